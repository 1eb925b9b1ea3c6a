/**
 * What every page needs from the request it answers: the signed-in user (for the header)
 * and the CSRF token (for every form and for htmx). Read from Hono's context storage
 * rather than passed through every page's props, as every form on every page needs it.
 * Outside a request (a view rendered on its own) both are absent.
 */
import { tryGetContext } from 'hono/context-storage';
import type { AppEnv, SignedInUser } from '../app-env.js';

export function requestState(): { user?: SignedInUser; csrfToken?: string } {
  const c = tryGetContext<AppEnv>();
  return { user: c?.var.user, csrfToken: c?.var.csrfToken };
}
