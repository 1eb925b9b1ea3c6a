/**
 * Store and web speed, printed as figures (not asserted): the sales page of a 5,000-sale
 * market (targets: ≤ 100 ms server time) and importing 100,000 rows (≤ 5 s), on an embedded
 * file database in a temporary folder, as the app runs by default.
 *   npm run bench:store
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { createApp } from '../src/app.js';
import { testApp } from '../test/web/test-app.js';
import type { Sale } from '../src/domain/sale.js';
import { readSalesCsv, writeSalesCsv } from '../src/domain/sales-csv.js';
import { closeDatabase, openDatabase, type Database } from '../src/store/database.js';
import { migrateDatabase } from '../src/store/migrate.js';
import { createMarket } from '../src/store/markets-repo.js';
import { importSales } from '../src/store/sales-import.js';
import { mulberry32 } from '../seed/demo-sales.js';

function syntheticSales(n: number, seed: number): Sale[] {
  const rand = mulberry32(seed);
  const streets = ['Ash Row', 'Beech Lane', 'Cedar Way', 'Damson Court', 'Elder Close'];
  return Array.from({ length: n }, (_, i) => {
    const area = Math.round(800 + rand() * 2600);
    const year = 1920 + Math.floor(rand() * 100);
    const date = new Date(Date.UTC(2021, 0, 1) + Math.floor(rand() * 1400) * 86_400_000).toISOString().slice(0, 10);
    return {
      id: `B-${i + 1}`,
      address: `${1 + Math.floor(rand() * 400)} ${streets[i % streets.length]}`,
      saleDate: date,
      salePrice: Math.round((40_000 + 120 * area - 600 * (2024 - year)) / 100) * 100,
      characteristics: { living_area: area, year_built: Math.min(year, Number(date.slice(0, 4))), rooms: 3 + Math.floor(area / 450), bathrooms: 1 + Math.floor(rand() * 4) / 2 },
      verification: 'Deed',
      ...(i % 7 === 0 ? { notes: 'Corner lot' } : {}),
      included: i % 50 !== 0,
      ...(i % 50 === 0 ? { excludedReason: 'Not an arm’s-length sale' } : {}),
    };
  });
}

async function freshDatabase(dir: string, name: string): Promise<Database> {
  const db = await openDatabase({ url: `file:${path.join(dir, name)}` });
  await migrateDatabase(db);
  return db;
}

async function market(db: Database, name: string): Promise<number> {
  const r = await createMarket(db, { name, areaUnit: 'sqft', currency: 'USD' });
  if (!r.ok) throw new Error('market');
  return r.market.id;
}

function summary(ms: number[]): string {
  const s = [...ms].sort((a, b) => a - b);
  const q = (p: number) => s[Math.min(s.length - 1, Math.floor(p * s.length))];
  return `median ${q(0.5).toFixed(1)} ms, p95 ${q(0.95).toFixed(1)} ms, max ${s[s.length - 1].toFixed(1)} ms (${s.length} runs)`;
}

async function timeRequests(app: ReturnType<typeof createApp>, url: string, headers: Record<string, string>, runs: number): Promise<number[]> {
  const times: number[] = [];
  for (let i = 0; i < runs + 5; i++) {
    const t0 = performance.now();
    const r = await app.request(url, { headers });
    await r.text();
    if (r.status !== 200) throw new Error(`${url}: ${r.status}`);
    if (i >= 5) times.push(performance.now() - t0); // the first few warm up the JIT and the page cache
  }
  return times;
}

async function salesPageBench(dir: string): Promise<void> {
  const db = await freshDatabase(dir, 'page.db');
  const id = await market(db, 'Five thousand');
  const r = await importSales(db, id, syntheticSales(5000, 7), { by: 'bench', fileName: 'bench' });
  if (!r.ok) throw new Error('import');
  const app = createApp({ db });
  console.log('Sales page of a 5,000-sale market (server time through app.request, embedded file):');
  const cases: [string, string, Record<string, string>][] = [
    ['full page, default sort (newest first)', `/markets/${id}`, {}],
    ['full page, sorted by price, page 40', `/markets/${id}?sort=sale_price&dir=asc&page=40`, {}],
    ['htmx fragment, text filter "cedar"', `/markets/${id}?q=cedar`, { 'HX-Request': 'true' }],
    ['htmx fragment, date range + excluded only', `/markets/${id}?from=2022-01-01&to=2023-06-30&status=excluded`, { 'HX-Request': 'true' }],
  ];
  for (const [label, url, headers] of cases) console.log(`  ${label.padEnd(44)} ${summary(await timeRequests(app, url, headers, 100))}`);
  closeDatabase(db);
}

async function importBench(dir: string): Promise<void> {
  const rows = 100_000;
  const text = writeSalesCsv(syntheticSales(rows, 11));
  console.log(`\nImport of ${rows.toLocaleString('en-US')} rows (${(text.length / 1024 / 1024).toFixed(1)} MB CSV):`);

  const db = await freshDatabase(dir, 'import.db');
  const id = await market(db, 'Import');
  let t0 = performance.now();
  const parsed = readSalesCsv(text);
  const parseMs = performance.now() - t0;
  if (!parsed.ok) throw new Error('parse');
  t0 = performance.now();
  const r = await importSales(db, id, parsed.sales, { by: 'bench', fileName: 'bench.csv' });
  const writeMs = performance.now() - t0;
  if (!r.ok) throw new Error('import');
  console.log(`  store: read and check every row ${parseMs.toFixed(0)} ms + write in one transaction ${writeMs.toFixed(0)} ms = ${(parseMs + writeMs).toFixed(0)} ms`);
  closeDatabase(db);

  // The same file through the web app: upload and preview, then commit (which checks again).
  const webDb = await freshDatabase(dir, 'web-import.db');
  const webId = await market(webDb, 'Web import');
  // The browser's flow, CSRF cookie and token included (the test app helper does exactly that).
  const web = await testApp({ db: webDb });
  t0 = performance.now();
  const preview = await web.upload(`/markets/${webId}/import`, 'bench.csv', text);
  const html = await preview.text();
  const previewMs = performance.now() - t0;
  const commitUrl = /action="(\/markets\/\d+\/import\/\d+\/commit)"/.exec(html)?.[1];
  if (!commitUrl) throw new Error(`preview failed: ${preview.status}`);
  t0 = performance.now();
  const commit = await web.post(commitUrl, {});
  const commitMs = performance.now() - t0;
  if (commit.status !== 303) throw new Error(`commit failed: ${commit.status}`);
  console.log(`  web:   upload and preview ${previewMs.toFixed(0)} ms, commit ${commitMs.toFixed(0)} ms`);
  closeDatabase(webDb);
}

const dir = mkdtempSync(path.join(tmpdir(), 'compfit-bench-'));
try {
  await salesPageBench(dir);
  await importBench(dir);
} finally {
  rmSync(dir, { recursive: true, force: true });
}
