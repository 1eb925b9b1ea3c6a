/**
 * Who may reach the app and what the app may believe about a request.
 *
 * - Bound to a loopback address (127.0.0.1, ::1, localhost) and not behind a proxy, only
 *   this computer reaches the app: one person, no sign-in.
 * - Any other HOST, or TRUST_PROXY set (a proxy on this computer forwards other machines'
 *   requests to the loopback address), needs a signed-in user for every page and API.
 *
 * With TRUST_PROXY the proxy's X-Forwarded-Proto, X-Forwarded-Host and X-Forwarded-For
 * are believed (the request came over TLS, the name the browser used, the client's
 * address); without it they are ignored, as anyone could send them.
 */
import type { Context } from 'hono';
import { getConnInfo } from '@hono/node-server/conninfo';

export interface AccessPolicy {
  signInRequired: boolean;
  trustProxy: boolean;
}

/** This computer only: what tests and a default `npm start` get. */
export const LOOPBACK_ONLY: AccessPolicy = { signInRequired: false, trustProxy: false };

export function isLoopbackHost(host: string): boolean {
  const h = host.trim().toLowerCase().replace(/^\[(.*)\]$/, '$1');
  return h === 'localhost' || h === '::1' || /^127(\.\d{1,3}){3}$/.test(h);
}

export function accessPolicyFor(host: string, trustProxy: boolean): AccessPolicy {
  return { signInRequired: trustProxy || !isLoopbackHost(host), trustProxy };
}

/** The first value of a comma-separated forwarded header. */
function forwarded(c: Context, name: string): string | undefined {
  return c.req.header(name)?.split(',')[0]?.trim() || undefined;
}

/** True when the browser's connection is TLS: an https URL, or a trusted proxy saying so. */
export function requestIsSecure(c: Context, policy: AccessPolicy): boolean {
  if (new URL(c.req.url).protocol === 'https:') return true;
  return policy.trustProxy && forwarded(c, 'X-Forwarded-Proto')?.toLowerCase() === 'https';
}

/** The origin the browser sees this app at, e.g. `https://compfit.example.org`. */
export function expectedOrigin(c: Context, policy: AccessPolicy): string {
  const url = new URL(c.req.url);
  const host = (policy.trustProxy && forwarded(c, 'X-Forwarded-Host')) || url.host;
  return `${requestIsSecure(c, policy) ? 'https' : 'http'}://${host}`.toLowerCase();
}

/**
 * The client's address for rate limiting: the socket's peer, or behind a trusted proxy the
 * last X-Forwarded-For entry (the one the proxy itself added; earlier ones are the client's word).
 */
export function clientAddress(c: Context, policy: AccessPolicy): string {
  if (policy.trustProxy) {
    const last = c.req.header('X-Forwarded-For')?.split(',').pop()?.trim();
    if (last) return last.slice(0, 64);
  }
  try {
    return getConnInfo(c).remote.address ?? 'unknown';
  } catch {
    return 'unknown'; // no socket: a request made in-process (app.request in tests)
  }
}
