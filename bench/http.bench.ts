/**
 * HTTP load, printed as figures (not asserted): autocannon, 20 connections, against the app
 * served from an embedded file database with a 500-sale market. Measures the sales page,
 * the estimate page (model + subject, the whole result with pictures) and the JSON estimate.
 * Server time is measured inside the app (a middleware around every request), client
 * latency by autocannon. Targets: estimate p95 ≤ 30 ms server time (issue 4); ≥ 300
 * requests/s for an estimate of a 500-sale market with p99 ≤ 100 ms (issue 6).
 *   npm run bench:http [-- --seconds 10]
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { serve } from '@hono/node-server';
import autocannon from 'autocannon';
import { Hono } from 'hono';
import { createApp } from '../src/app.js';
import type { Sale } from '../src/domain/sale.js';
import { closeDatabase, openDatabase } from '../src/store/database.js';
import { migrateDatabase } from '../src/store/migrate.js';
import { createMarket } from '../src/store/markets-repo.js';
import { importSales } from '../src/store/sales-import.js';
import { mulberry32 } from '../seed/demo-sales.js';

const seconds = Number(process.argv[process.argv.indexOf('--seconds') + 1]) || 10;

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

function percentile(sorted: number[], q: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];
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

const subject = { address: '1 Bench Road', effective_date: '2025-01-01', living_area: 1800, year_built: 1990, rooms: 7, bathrooms: 2, garage_spaces: 1 };
const q = new URLSearchParams({ transform: 'none', level: '0.95', run: 'estimate', ...Object.fromEntries(Object.entries(subject).map(([k, v]) => [k, String(v)])) });
for (const p of ['living_area', 'age', 'rooms']) q.append('predictors', p);

const targets: { name: string; opts: autocannon.Options }[] = [
  { name: 'sales page (500 sales, page 1)', opts: { url: `http://127.0.0.1:${port}/markets/${marketId}` } },
  { name: 'estimate page (500 sales)', opts: { url: `http://127.0.0.1:${port}/markets/${marketId}/estimate?${q}` } },
  {
    name: 'JSON estimate (500 sales)',
    opts: {
      url: `http://127.0.0.1:${port}/api/markets/${marketId}/estimate`,
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ subject }),
    },
  },
];

console.log(`compfit HTTP benchmark: autocannon, 20 connections, ${seconds} s each, node ${process.version}`);
console.log('target                            req/s   client p50  p97.5   p99 ms | server p50   p95   p99 ms | non-2xx');
for (const t of targets) {
  await autocannon({ ...t.opts, connections: 4, duration: 1 }); // warm up
  serverTimes = [];
  const r = await autocannon({ ...t.opts, connections: 20, duration: seconds });
  const s = [...serverTimes].sort((a, b) => a - b);
  console.log(
    `${t.name.padEnd(32)} ${r.requests.average.toFixed(0).padStart(6)}   ${String(r.latency.p50).padStart(9)} ${String(r.latency.p97_5).padStart(6)} ${String(r.latency.p99).padStart(6)}    | ${percentile(s, 0.5).toFixed(1).padStart(9)} ${percentile(s, 0.95).toFixed(1).padStart(5)} ${percentile(s, 0.99).toFixed(1).padStart(5)}    | ${r.non2xx}`,
  );
}
server.close();
closeDatabase(db);
rmSync(dir, { recursive: true, force: true });
