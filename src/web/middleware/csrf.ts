/**
 * Protection against cross-site request forgery on every request that changes something.
 *
 * 1. The sender's origin: a `Sec-Fetch-Site` other than same-origin (or none, a person's
 *    own action), or an `Origin` other than this app's, is refused.
 * 2. Forms and htmx carry a token: in the `_csrf` hidden field every form gets
 *    (views/csrf-field.tsx) or the `X-CSRF-Token` header htmx sends (hx-headers in Layout).
 *    Signed in, the token is derived from the session's secret token (SHA-256 of it with a
 *    label), so it is per session and needs no storage; without a session (this computer
 *    only, or the sign-in form) it is a random value also kept in an HttpOnly cookie and
 *    the two must match (a double-submit cookie).
 * 3. The JSON API takes only `Content-Type: application/json`, which a page on another
 *    site cannot send here without a CORS preflight this app never grants.
 */
import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Context, MiddlewareHandler } from 'hono';
import { getCookie, setCookie } from 'hono/cookie';
import type { AppEnv } from '../app-env.js';
import { CSRF_FIELD, CSRF_HEADER } from '../views/csrf-field.js';
import { expectedOrigin, requestIsSecure, type AccessPolicy } from './access-policy.js';
import { MalformedFormError, readFormBody } from './form-body.js';
import { isApiRequest, refuse } from './refuse.js';

export const CSRF_COOKIE = 'compfit_csrf';

const SAFE_METHODS = /^(GET|HEAD|OPTIONS)$/;
const TOKEN_SHAPE = /^[A-Za-z0-9_-]{43}$/;
const EXPIRED = 'This form has expired or did not come from compfit, so nothing was saved. Reload the page and try again.';

export function sessionCsrfToken(sessionToken: string): string {
  return createHash('sha256').update(`compfit csrf\0${sessionToken}`).digest('base64url');
}

function sameToken(sent: string, expected: string): boolean {
  const a = Buffer.from(sent);
  const b = Buffer.from(expected);
  return a.length === b.length && timingSafeEqual(a, b);
}

/** Why the request's origin is not acceptable, or undefined when it is. */
function foreignOrigin(c: Context, policy: AccessPolicy): string | undefined {
  const site = c.req.header('Sec-Fetch-Site');
  if (site && site !== 'same-origin' && site !== 'none') return `a request from another site (${site}) was refused`;
  const origin = c.req.header('Origin');
  // "null" is what a browser sends when it will not say (privacy settings); the token still decides.
  if (origin && origin !== 'null' && origin.toLowerCase() !== expectedOrigin(c, policy))
    return `a request from ${origin} was refused; this app is at ${expectedOrigin(c, policy)}${policy.trustProxy ? '' : ' (behind a TLS proxy? set TRUST_PROXY)'}`;
  return undefined;
}

/** The token the request carries: the htmx header, or the form's hidden field. */
async function sentToken(c: Context): Promise<string | undefined> {
  const header = c.req.header(CSRF_HEADER);
  if (header) return header;
  const field = (await readFormBody(c))[CSRF_FIELD];
  return typeof field === 'string' ? field : undefined;
}

export function csrfProtection(policy: AccessPolicy): MiddlewareHandler<AppEnv> {
  return async (c, next) => {
    // The stylesheet and script need no token (and a cacheable file should not set a cookie).
    if (SAFE_METHODS.test(c.req.method) && c.req.path.startsWith('/static/')) return next();
    const session = c.get('sessionToken');
    let token: string;
    if (session) token = sessionCsrfToken(session);
    else {
      const cookie = getCookie(c, CSRF_COOKIE);
      token = cookie && TOKEN_SHAPE.test(cookie) ? cookie : randomBytes(32).toString('base64url');
      if (token !== cookie)
        setCookie(c, CSRF_COOKIE, token, { httpOnly: true, sameSite: 'Lax', path: '/', secure: requestIsSecure(c, policy), maxAge: 400 * 24 * 3600 });
    }
    c.set('csrfToken', token);
    if (SAFE_METHODS.test(c.req.method)) return next();

    const foreign = foreignOrigin(c, policy);
    if (foreign) return refuse(c, 403, `${foreign[0].toUpperCase()}${foreign.slice(1)}. Nothing was saved.`);
    if (isApiRequest(c)) {
      if (!/^application\/json\s*(;|$)/i.test(c.req.header('Content-Type') ?? ''))
        return refuse(c, 415, 'The API takes JSON bodies only: send Content-Type: application/json.');
      return next();
    }
    let sent: string | undefined;
    try {
      sent = await sentToken(c);
    } catch (err) {
      if (!(err instanceof MalformedFormError)) throw err;
      return refuse(c, 400, 'The form could not be read (its body is not a well-formed form); nothing was saved.');
    }
    if (!sent || !sameToken(sent, token)) return refuse(c, 403, EXPIRED);
    return next();
  };
}
