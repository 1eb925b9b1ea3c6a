/**
 * Answers a refused request in the form its sender understands: JSON for the API, a
 * fragment in the page's #messages area for htmx, a full page otherwise.
 */
import type { Context } from 'hono';
import { html } from 'hono/html';
import { ErrorMessage, ErrorPage } from '../views/error-page.js';
import { isHtmx } from './htmx.js';

export type RefusalStatus = 400 | 401 | 403 | 413 | 415 | 421 | 422 | 429;

export function isApiRequest(c: Context): boolean {
  return c.req.path === '/api' || c.req.path.startsWith('/api/');
}

export function refuse(c: Context, status: RefusalStatus, message: string) {
  if (isApiRequest(c)) return c.json({ errors: [message] }, status);
  if (isHtmx(c)) {
    c.header('HX-Retarget', '#messages');
    c.header('HX-Reswap', 'innerHTML');
    return c.html(<ErrorMessage status={status} message={message} />, status);
  }
  return c.html(html`<!doctype html>${<ErrorPage status={status} message={message} />}`, status);
}
