/**
 * Response headers that narrow what a browser lets a page do. The content security policy
 * allows scripts, styles, images, fonts and requests from this app's own origin only: no
 * inline script or style (the pages have none; htmx's configuration is a meta tag and its
 * own inline indicator style is switched off in Layout), no plugins, no framing, forms
 * posting only back here. HSTS only over TLS, where a browser heeds it.
 */
import type { MiddlewareHandler } from 'hono';
import { secureHeaders } from 'hono/secure-headers';
type SecureHeadersOptions = NonNullable<Parameters<typeof secureHeaders>[0]>;
import { requestIsSecure, type AccessPolicy } from './access-policy.js';

const SELF = ["'self'"];

export const CONTENT_SECURITY_POLICY = {
  defaultSrc: SELF,
  scriptSrc: SELF,
  styleSrc: SELF,
  imgSrc: [...SELF, 'data:'],
  fontSrc: SELF,
  connectSrc: SELF,
  formAction: SELF,
  frameAncestors: ["'none'"],
  baseUri: ["'none'"],
  objectSrc: ["'none'"],
};

export function securityHeaders(policy: AccessPolicy): MiddlewareHandler {
  const common: SecureHeadersOptions = {
    contentSecurityPolicy: CONTENT_SECURITY_POLICY,
    xFrameOptions: 'DENY',
    // 'same-origin' rather than 'no-referrer': with no-referrer a browser sends `Origin: null` on our own form posts.
    referrerPolicy: 'same-origin',
    permissionsPolicy: { camera: false, microphone: false, geolocation: false },
  };
  const overTls = secureHeaders({ ...common, strictTransportSecurity: 'max-age=31536000' });
  const plain = secureHeaders({ ...common, strictTransportSecurity: false });
  return (c, next) => (requestIsSecure(c, policy) ? overTls(c, next) : plain(c, next));
}
