/**
 * The server side of bench/http.bench.ts, in its own process so the load generator does not
 * share its event loop: builds a 500-sale market on an embedded file and serves the app,
 * in this process or, with `--workers N`, in N cluster workers sharing the port and the
 * file as `WORKERS=N` does (src/server-workers.ts). Every request's server time is measured
 * inside the process that served it (a middleware around the app) and reported over IPC,
 * with the CPU time the serving processes used since the last report.
 */
import cluster from 'node:cluster';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { serve } from '@hono/node-server';
import { Hono } from 'hono';
import { createApp } from '../src/app.js';
import type { Sale } from '../src/domain/sale.js';
import { closeDatabase, openDatabase, type Database } from '../src/store/database.js';
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

/** Serves the app with a timing middleware; resolves with the port once listening. */
async function serveTimed(db: Database, times: number[]): Promise<{ port: number; close: () => void }> {
  const outer = new Hono();
  outer.use(async (c, next) => {
    const t0 = performance.now();
    await next();
    times.push(performance.now() - t0);
  });
  outer.route('/', createApp({ db }));
  const server = serve({ fetch: outer.fetch, port: 0, hostname: '127.0.0.1' });
  await new Promise((r) => server.once('listening', r));
  return { port: (server.address() as { port: number }).port, close: () => server.close() };
}

type Message = 'times' | 'stop';
interface Report {
  times: number[];
  cpuMs: number;
}

/** CPU milliseconds (user + system) this process used since the previous call. */
function cpuMeter(): () => number {
  let last = process.cpuUsage();
  return () => {
    const d = process.cpuUsage(last);
    last = process.cpuUsage();
    return (d.user + d.system) / 1000;
  };
}

if (cluster.isWorker) {
  const db = await openDatabase({ url: process.env.BENCH_DATABASE_URL! });
  const times: number[] = [];
  const { port } = await serveTimed(db, times);
  const cpu = cpuMeter();
  process.on('message', (m: Message) => {
    if (m === 'times') process.send!({ times: times.splice(0), cpuMs: cpu() } satisfies Report);
  });
  process.send!({ port });
} else {
  const workers = Number(process.argv[process.argv.indexOf('--workers') + 1]) || 1;
  const dir = mkdtempSync(path.join(tmpdir(), 'compfit-http-bench-'));
  const url = `file:${path.join(dir, 'bench.db')}`;
  const db = await openDatabase({ url });
  await migrateDatabase(db);
  const created = await createMarket(db, { name: 'Load test', areaUnit: 'sqft', currency: 'USD' });
  if (!created.ok) throw new Error('market');
  const marketId = created.market.id;
  const imported = await importSales(db, marketId, sales(500), { by: 'bench', fileName: 'bench.csv', replace: false });
  if (!imported.ok) throw new Error('import');

  let port: number;
  let collect: () => Promise<Report>;
  let stop: () => void;
  if (workers === 1) {
    const times: number[] = [];
    const served = await serveTimed(db, times);
    const cpu = cpuMeter();
    port = served.port;
    collect = async () => ({ times: times.splice(0), cpuMs: cpu() });
    stop = served.close;
  } else {
    cluster.setupPrimary({ args: [] });
    const forked = Array.from({ length: workers }, () => cluster.fork({ BENCH_DATABASE_URL: url }));
    const ports = await Promise.all(forked.map((w) => new Promise<number>((r) => w.once('message', (m: { port: number }) => r(m.port)))));
    port = ports[0];
    collect = async () => {
      const reports = await Promise.all(
        forked.map(
          (w) =>
            new Promise<Report>((r) => {
              w.once('message', (m: Report) => r(m));
              w.send('times');
            }),
        ),
      );
      return { times: reports.flatMap((r) => r.times), cpuMs: reports.reduce((t, r) => t + r.cpuMs, 0) };
    };
    stop = () => forked.forEach((w) => w.process.kill('SIGTERM'));
  }

  process.on('message', async (m: Message) => {
    if (m === 'times') process.send!(await collect());
    else if (m === 'stop') {
      stop();
      closeDatabase(db);
      rmSync(dir, { recursive: true, force: true });
      process.exit(0);
    }
  });
  process.send!({ ready: true, port, marketId });
}
