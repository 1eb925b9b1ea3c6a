/**
 * htmx request helpers. A page route answers the full page normally and only its
 * fragment when htmx asked (HX-Request), except for a history restore, which needs the
 * whole page. Responses that depend on this carry `Vary: HX-Request` (set in app.ts).
 */
import type { Context } from 'hono';
import { html } from 'hono/html';
import type { Child } from 'hono/jsx';

export function isHtmx(c: Context): boolean {
  return c.req.header('HX-Request') === 'true' && c.req.header('HX-History-Restore-Request') !== 'true';
}

type Status = 200 | 201 | 400 | 404 | 409 | 413 | 422 | 500;

export function renderPage(c: Context, page: Child, status: Status = 200) {
  return c.html(html`<!doctype html>${page}`, status);
}

/** The fragment for htmx, the full page otherwise. */
export function renderPageOrFragment(c: Context, page: () => Child, fragment: () => Child, status: Status = 200) {
  return isHtmx(c) ? c.html(<>{fragment()}</>, status) : renderPage(c, page(), status);
}

/** After a successful form post: a full-page load of `url`, by 303 or, for htmx, HX-Redirect. */
export function redirectAfterPost(c: Context, url: string) {
  if (isHtmx(c)) {
    c.header('HX-Redirect', url);
    return c.body(null, 200);
  }
  return c.redirect(url, 303);
}
