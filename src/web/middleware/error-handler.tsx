/**
 * One place for failures: deliberate ones (HTTPException, a record not found) get their
 * status and message; anything else is logged and answered with 500. An htmx request
 * gets a small fragment retargeted to the page's #messages area instead of a page.
 */
import type { Context } from 'hono';
import { HTTPException } from 'hono/http-exception';
import { NotFoundError } from '../../store/markets-repo.js';
import { ErrorMessage, ErrorPage } from '../views/error-page.js';
import { isHtmx, renderPage } from './htmx.js';
import { isApiRequest } from './refuse.js';

export function renderError(c: Context, status: 400 | 404 | 413 | 422 | 500, message: string) {
  // The JSON API answers its errors in JSON, like its 422s: { errors: [message] }.
  if (isApiRequest(c)) return c.json({ errors: [message] }, status);
  if (isHtmx(c)) {
    c.header('HX-Retarget', '#messages');
    c.header('HX-Reswap', 'innerHTML');
    return c.html(<ErrorMessage status={status} message={message} />, status);
  }
  return renderPage(c, <ErrorPage status={status} message={message} />, status);
}

export function handleError(err: Error, c: Context) {
  if (err instanceof NotFoundError) return renderError(c, 404, `The ${err.message.replace(/ not found$/, '')} does not exist.`);
  if (err instanceof HTTPException) {
    const status = ([400, 404, 413, 422].includes(err.status) ? err.status : 400) as 400 | 404 | 413 | 422;
    return renderError(c, status, err.message);
  }
  console.error(`compfit: ${c.req.method} ${c.req.path} failed:`, err);
  return renderError(c, 500, 'The server could not finish this request. It has been logged.');
}

export function handleNotFound(c: Context) {
  return renderError(c, 404, `There is no page at ${c.req.path}.`);
}
