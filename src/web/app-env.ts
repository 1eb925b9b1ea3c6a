/**
 * The Hono environment shared by the routes: who is acting (for the change history and
 * saved estimates), the signed-in user and session when there is one, and the token every
 * form carries against cross-site requests (middleware/csrf.ts).
 */
import type { Context } from 'hono';

export interface SignedInUser {
  id: number;
  name: string;
}

export type AppEnv = {
  Variables: {
    actor: string;
    user?: SignedInUser;
    /** The session cookie's token, when signed in (the CSRF token is derived from it). */
    sessionToken?: string;
    csrfToken?: string;
  };
};

/** Name written to the change history: the signed-in user's name, or 'web' on this computer without sign-in. */
export function actorOf(c: Context<AppEnv>): string {
  return c.get('actor') ?? 'web';
}
