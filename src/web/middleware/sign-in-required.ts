/**
 * Sessions and the sign-in gate, when the access policy asks for sign-in. The session
 * cookie holds a random token (the database keeps only its hash, store/sessions-repo.ts);
 * it is HttpOnly, SameSite=Lax, and Secure when the browser's connection is TLS. A valid
 * session names the user as the actor, so the change history and saved estimates record
 * who did it. Without one, only the sign-in page and the stylesheet and script are served:
 * a page request is sent to sign in and back, htmx is told to load the sign-in page, and
 * the API answers 401.
 */
import type { Context, MiddlewareHandler } from 'hono';
import { deleteCookie, getCookie, setCookie } from 'hono/cookie';
import type { Database } from '../../store/database.js';
import { findSession, renewSession, SESSION_LIFETIME_MS } from '../../store/sessions-repo.js';
import type { AppEnv } from '../app-env.js';
import { requestIsSecure, type AccessPolicy } from './access-policy.js';
import { isHtmx } from './htmx.js';
import { isApiRequest, refuse } from './refuse.js';

export const SESSION_COOKIE = 'compfit_session';
const TOKEN_SHAPE = /^[A-Za-z0-9_-]{43}$/;

const isPublic = (path: string) => path === '/sign-in' || path.startsWith('/static/');

/** The cookie lives as long as the session (set again whenever the session is extended). */
export function setSessionCookie(c: Context, policy: AccessPolicy, token: string): void {
  setCookie(c, SESSION_COOKIE, token, { httpOnly: true, sameSite: 'Lax', path: '/', secure: requestIsSecure(c, policy), maxAge: SESSION_LIFETIME_MS / 1000 });
}

export function clearSessionCookie(c: Context, policy: AccessPolicy): void {
  deleteCookie(c, SESSION_COOKIE, { path: '/', secure: requestIsSecure(c, policy) });
}

/** A path on this site to come back to after signing in; anything else (another host, `//x`) is the markets page. */
export function safeNext(next: string | undefined): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\') || /[\u0000-\u001f]/.test(next)) return '/markets';
  return next.length > 2000 ? '/markets' : next;
}

export function signInUrl(next: string): string {
  const target = safeNext(next);
  return target === '/markets' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(target)}`;
}

/** Where the person was going: the page itself, or for htmx the page it was on. */
function destination(c: Context): string {
  if (isHtmx(c) || c.req.header('HX-Request') === 'true') {
    const current = c.req.header('HX-Current-URL');
    try {
      if (current) {
        const u = new URL(current);
        return u.pathname + u.search;
      }
    } catch {
      /* not a URL: fall through */
    }
    return '/markets';
  }
  const url = new URL(c.req.url);
  return c.req.method === 'GET' ? url.pathname + url.search : '/markets';
}

export function signInRequired(deps: { db: Database; policy: AccessPolicy; now: () => Date }): MiddlewareHandler<AppEnv> {
  const { db, policy } = deps;
  return async (c, next) => {
    const token = getCookie(c, SESSION_COOKIE);
    if (token && TOKEN_SHAPE.test(token)) {
      const now = deps.now();
      const session = await findSession(db, token, now);
      if (session) {
        c.set('user', { id: session.userId, name: session.userName });
        c.set('actor', session.userName);
        c.set('sessionToken', token);
        const renewed = await renewSession(db, token, session, now);
        if (renewed) setSessionCookie(c, policy, token);
      }
    }
    if (c.get('user') || isPublic(c.req.path)) return next();

    const target = signInUrl(destination(c));
    if (isApiRequest(c)) return refuse(c, 401, 'Sign in first: POST /sign-in with name and password, then send the session cookie.');
    if (c.req.header('HX-Request') === 'true') {
      c.header('HX-Redirect', target);
      return c.body(null, 401);
    }
    if (c.req.method === 'GET' || c.req.method === 'HEAD') return c.redirect(target, 303);
    return refuse(c, 401, 'You are not signed in (or the session ran out), so nothing was saved. Sign in and try again.');
  };
}
