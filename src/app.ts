/**
 * Composition root: builds the web app on a database and mounts one sub-app per
 * resource. No environment, no listening: server.ts does that, tests call app.request().
 */
import { Hono } from 'hono';
import { contextStorage } from 'hono/context-storage';
import type { Database } from './store/database.js';
import type { AppEnv } from './web/app-env.js';
import { LOOPBACK_ONLY, type AccessPolicy } from './web/middleware/access-policy.js';
import { bodySizeLimits } from './web/middleware/body-size.js';
import { csrfProtection } from './web/middleware/csrf.js';
import { handleError, handleNotFound } from './web/middleware/error-handler.js';
import { wellFormedForms } from './web/middleware/form-body.js';
import { loopbackNamesOnly } from './web/middleware/loopback-names-only.js';
import { securityHeaders } from './web/middleware/security-headers.js';
import { signInRequired } from './web/middleware/sign-in-required.js';
import { apiRoutes } from './web/routes/api.js';
import { authRoutes } from './web/routes/auth.js';
import { estimateApiRoutes, marketEstimateRoutes, savedEstimateRoutes } from './web/routes/estimates.js';
import { importRoutes } from './web/routes/imports.js';
import { marketsRoutes } from './web/routes/markets.js';
import { salesRoutes } from './web/routes/sales.js';
import { staticRoutes } from './web/routes/static.js';

export interface AppDeps {
  db: Database;
  /** Sign-in or not, and whether to believe a proxy's headers; this computer only by default. */
  access?: AccessPolicy;
  /** The clock for sessions and sign-in limits (tests move it). */
  now?: () => Date;
}

export function createApp(deps: AppDeps): Hono<AppEnv> {
  const policy = deps.access ?? LOOPBACK_ONLY;
  const now = deps.now ?? (() => new Date());
  const app = new Hono<AppEnv>();

  // Views read the user and the CSRF token of the request they render (views/request-state.ts).
  app.use(contextStorage());
  app.use(securityHeaders(policy));
  app.use(async (c, next) => {
    if (!c.get('actor')) c.set('actor', 'web');
    await next();
    // Pages answer a fragment to htmx and a full page otherwise (middleware/htmx.tsx).
    if (c.res.headers.get('Content-Type')?.startsWith('text/html')) c.res.headers.append('Vary', 'HX-Request');
  });
  // Who may come in, before any body is read; then how large a body may be; then where it came from.
  app.use(policy.signInRequired ? signInRequired({ db: deps.db, policy, now }) : loopbackNamesOnly());
  app.use(bodySizeLimits());
  app.use(csrfProtection(policy));
  app.use(wellFormedForms());

  app.get('/', (c) => c.redirect('/markets'));
  app.route('/static', staticRoutes());
  app.route('/', authRoutes({ db: deps.db, policy, now }));
  app.route('/api', apiRoutes(deps));
  app.route('/api', estimateApiRoutes(deps));
  app.route('/estimates', savedEstimateRoutes(deps));
  app.route('/markets/:marketId', marketEstimateRoutes(deps));
  app.route('/markets/:marketId/sales', salesRoutes(deps));
  app.route('/markets/:marketId/import', importRoutes(deps));
  app.route('/markets', marketsRoutes(deps));

  app.onError(handleError);
  app.notFound(handleNotFound);
  return app;
}
