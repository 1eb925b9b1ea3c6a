/**
 * Composition root: builds the web app on a database and mounts one sub-app per
 * resource. No environment, no listening: server.ts does that, tests call app.request().
 */
import { Hono } from 'hono';
import type { Database } from './store/database.js';
import type { AppEnv } from './web/app-env.js';
import { handleError, handleNotFound } from './web/middleware/error-handler.js';
import { apiRoutes } from './web/routes/api.js';
import { estimateApiRoutes, marketEstimateRoutes, savedEstimateRoutes } from './web/routes/estimates.js';
import { importRoutes } from './web/routes/imports.js';
import { marketsRoutes } from './web/routes/markets.js';
import { salesRoutes } from './web/routes/sales.js';
import { staticRoutes } from './web/routes/static.js';

/** Largest urlencoded form accepted outside the CSV upload. */
const FORM_LIMIT_BYTES = 256 * 1024;

export function createApp(deps: { db: Database }): Hono<AppEnv> {
  const app = new Hono<AppEnv>();

  app.use(async (c, next) => {
    if (!c.get('actor')) c.set('actor', 'web');
    await next();
    // Pages answer a fragment to htmx and a full page otherwise (middleware/htmx.tsx).
    if (c.res.headers.get('Content-Type')?.startsWith('text/html')) c.res.headers.append('Vary', 'HX-Request');
  });
  app.use(async (c, next) => {
    const length = Number(c.req.header('Content-Length') ?? 0);
    if (c.req.method === 'POST' && !c.req.path.endsWith('/import') && length > FORM_LIMIT_BYTES)
      return c.text(`The form is larger than ${FORM_LIMIT_BYTES / 1024} KB.`, 413);
    await next();
  });

  app.get('/', (c) => c.redirect('/markets'));
  app.route('/static', staticRoutes());
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
