/**
 * Signing in and out, when the access policy asks for sign-in. A wrong name and a wrong
 * password get the same answer; too many failures get 429 without the password being
 * checked (middleware/sign-in-limit.ts). On this computer without sign-in the sign-in page
 * just leads to the markets.
 */
import { Hono, type Context } from 'hono';
import { getCookie } from 'hono/cookie';
import { html } from 'hono/html';
import type { Database } from '../../store/database.js';
import { createSession, deleteSession } from '../../store/sessions-repo.js';
import { checkPassword, MAX_NAME_LENGTH, MAX_PASSWORD_LENGTH } from '../../store/users-repo.js';
import type { AppEnv } from '../app-env.js';
import { clientAddress, type AccessPolicy } from '../middleware/access-policy.js';
import { noteSignIn, signInAllowance } from '../middleware/sign-in-limit.js';
import { clearSessionCookie, safeNext, SESSION_COOKIE, setSessionCookie } from '../middleware/sign-in-required.js';
import { SignInPage, type SignInProps } from '../views/sign-in-page.js';
import { formFields } from './params.js';

function page(c: Context, props: SignInProps, status: 200 | 401 | 422 | 429 = 200) {
  return c.html(html`<!doctype html>${<SignInPage {...props} />}`, status);
}

export function authRoutes(deps: { db: Database; policy: AccessPolicy; now: () => Date }) {
  const { db, policy } = deps;
  const app = new Hono<AppEnv>();

  app.get('/sign-in', (c) => {
    const next = safeNext(c.req.query('next'));
    if (!policy.signInRequired || c.get('user')) return c.redirect(next, 303);
    return page(c, { name: '', next });
  });

  app.post('/sign-in', async (c) => {
    if (!policy.signInRequired) return c.redirect('/markets', 303);
    const form = await formFields(c);
    const name = (form.name ?? '').trim();
    const password = form.password ?? '';
    const next = safeNext(form.next);
    if (!name || !password) return page(c, { name, next, error: 'Enter your name and your password.' }, 422);
    if (name.length > MAX_NAME_LENGTH * 4 || password.length > MAX_PASSWORD_LENGTH * 4)
      return page(c, { name: '', next, error: 'That name and password do not match a user.' }, 401);

    const now = deps.now();
    const address = clientAddress(c, policy);
    const allowance = await signInAllowance(db, name, address, now);
    if (!allowance.ok) {
      c.header('Retry-After', String(allowance.retryAfterSeconds));
      return page(c, { name, next, error: allowance.message }, 429);
    }
    const user = await checkPassword(db, name, password);
    await noteSignIn(db, name, address, user !== undefined, now);
    if (!user) return page(c, { name, next, error: 'That name and password do not match a user.' }, 401);

    const session = await createSession(db, user.id, now);
    setSessionCookie(c, policy, session.token);
    return c.redirect(next, 303);
  });

  app.post('/sign-out', async (c) => {
    const token = getCookie(c, SESSION_COOKIE);
    if (token) await deleteSession(db, token);
    clearSessionCookie(c, policy);
    return c.redirect(policy.signInRequired ? '/sign-in' : '/markets', 303);
  });

  return app;
}
