/**
 * The server side of bench/http.bench.ts, in its own process so the load generator does not
 * share its event loop: builds a 500-sale market on an embedded file, serves the app, and
 * reports the server time of every request over IPC when asked.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { serve } from '@hono/node-server';
import { Hono } from 'hono';
import { createApp } from '../src/app.js';
import type { Sale } from '../src/domain/sale.js';
import { closeDatabase, openDatabase } from '../src/store/database.js';
import { migrateDatabase } from '../src/store/migrate.js';
import { createMarket } from '../src/store/markets-repo.js';
import { importSales } from '../src/store/sales-import.js';
import { mulberry32 } from '../seed/demo-sales.js';

function sales(n: number): Sale[] {
  const rand = mulberry32(500);
  return Array.from({ length: n }, (_, i) => {
    const area = Math.round(800 + rand() * 2400);
    const year = 1930 + Math.floor(rand() * 90);
    const rooms = Math.max(3, Math.round(2 + area / 400 + (rand() - 0.5) * 2));
    const month = 1 + Math.floor(rand() * 12);
    const price = Math.round((45000 + 110 * area - 700 * (2024 - year) + 5000 * rooms) * Math.exp((rand() - 0.5) * 0.2) / 100) * 100;
    return {
      id: `H-${i + 1}`,
      address: `${i + 1} Load Street`,
      saleDate: `2024-${String(month).padStart(2, '0')}-12`,
      salePrice: price,
      characteristics: { living_area: area, year_built: year, rooms, bathrooms: 1 + Math.floor(rand() * 4) / 2, garage_spaces: Math.floor(rand() * 3) },
      included: true,
    };
  });
}

const dir = mkdtempSync(path.join(tmpdir(), 'compfit-http-bench-'));
const db = await openDatabase({ url: `file:${path.join(dir, 'bench.db')}` });
await migrateDatabase(db);
const created = await createMarket(db, { name: 'Load test', areaUnit: 'sqft', currency: 'USD' });
if (!created.ok) throw new Error('market');
const marketId = created.market.id;
const imported = await importSales(db, marketId, sales(500), { by: 'bench', fileName: 'bench.csv', replace: false });
if (!imported.ok) throw new Error('import');

let serverTimes: number[] = [];
const outer = new Hono();
outer.use(async (c, next) => {
  const t0 = performance.now();
  await next();
  serverTimes.push(performance.now() - t0);
});
outer.route('/', createApp({ db }));
const server = serve({ fetch: outer.fetch, port: 0, hostname: '127.0.0.1' });
await new Promise((r) => server.once('listening', r));
const port = (server.address() as { port: number }).port;


process.on('message', (m: string) => {
  if (m === 'times') {
    process.send!({ times: serverTimes });
    serverTimes = [];
  } else if (m === 'stop') {
    server.close();
    closeDatabase(db);
    rmSync(dir, { recursive: true, force: true });
    process.exit(0);
  }
});
process.send!({ ready: true, port, marketId });
