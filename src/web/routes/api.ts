/** The JSON API. */
import { Hono } from 'hono';
import type { Database } from '../../store/database.js';
import { listMarkets } from '../../store/markets-repo.js';
import type { AppEnv } from '../app-env.js';

export function apiRoutes(deps: { db: Database }) {
  const app = new Hono<AppEnv>();
  /** [{ id, name, salesCount }], by name. */
  app.get('/markets', async (c) => c.json(await listMarkets(deps.db)));
  return app;
}
