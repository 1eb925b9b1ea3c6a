/** The Hono environment shared by the routes: who is acting, for the change history. */
import type { Context } from 'hono';

export type AppEnv = { Variables: { actor: string } };

/** Name written to the change history; 'web' until sign-in sets a user name. */
export function actorOf(c: Context<AppEnv>): string {
  return c.get('actor') ?? 'web';
}
