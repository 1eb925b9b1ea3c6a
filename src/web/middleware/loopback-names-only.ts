/**
 * Without sign-in the app answers only to loopback names (localhost, 127.0.0.1, [::1]).
 * A page on another site cannot then reach it through a DNS name that it points at this
 * computer (DNS rebinding), and a proxy forwarding other machines' requests here is told
 * how to set up sign-in instead of being served.
 */
import type { MiddlewareHandler } from 'hono';
import { isLoopbackHost } from './access-policy.js';
import { refuse } from './refuse.js';

export function loopbackNamesOnly(): MiddlewareHandler {
  return async (c, next) => {
    const host = new URL(c.req.url).hostname;
    if (isLoopbackHost(host)) return next();
    return refuse(
      c,
      403,
      `This compfit serves this computer only and answers to localhost or 127.0.0.1, not "${host}". To serve other machines, add a user (compfit user add NAME) and set HOST, or set TRUST_PROXY behind a proxy.`,
    );
  };
}
