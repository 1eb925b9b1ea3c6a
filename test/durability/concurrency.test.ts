/**
 * Two app processes on one database file, 20 concurrent writers adding, editing and
 * excluding sales through the web forms of both for COMPFIT_CONCURRENCY_SECONDS (30 s by
 * default), while a 100,000-row import into another market commits through one of them
 * (a write that holds the lock for seconds). Every acknowledged write (a 303 to the sale
 * or the market) is logged; at the end the database must hold exactly the logged state:
 * each acknowledged add once, the last acknowledged values of each sale, one history row
 * per acknowledged write, the import whole, and no response may be a 5xx or mention a
 * busy database.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mulberry32 } from '../../seed/demo-sales.js';
import { closeDatabase, openDatabase } from '../../src/store/database.js';
import { migrateDatabase } from '../../src/store/migrate.js';
import { createMarket } from '../../src/store/markets-repo.js';
import { startAppProcess, type AppProcess } from './app-process.js';
import { FormClient, type FormResponse } from './form-client.js';
import { salesCsv } from './sales-file.js';

const SECONDS = Number(process.env.COMPFIT_CONCURRENCY_SECONDS ?? 30);
const WRITERS = 20;
const IMPORT_ROWS = 100_000;
const BUSY_TEXT = /database is locked|SQLITE_BUSY|busy/i;

let dir: string;
let url: string;
let marketId: number;
let importMarketId: number;
let apps: AppProcess[] = [];

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), 'compfit-concurrency-'));
  url = `file:${path.join(dir, 'shared.db')}`;
  const db = await openDatabase({ url });
  await migrateDatabase(db);
  const r = await createMarket(db, { name: 'Shared', areaUnit: 'sqft', currency: 'USD' });
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  marketId = r.market.id;
  const m = await createMarket(db, { name: 'Imported meanwhile', areaUnit: 'sqft', currency: 'USD' });
  if (!m.ok) throw new Error(JSON.stringify(m.errors));
  importMarketId = m.market.id;
  closeDatabase(db);
  apps = await Promise.all([startAppProcess({ databaseUrl: url }), startAppProcess({ databaseUrl: url })]);
});

afterAll(async () => {
  await Promise.all(apps.map((a) => a.stop()));
  rmSync(dir, { recursive: true, force: true });
});

/** What the writers were told happened: the expected final state of each sale. */
interface AckedSale {
  key: number;
  ref?: string;
  address: string;
  price: number;
  notes: string;
  excludedReason?: string;
  /** Acknowledged writes to this sale, each of which must have left one history row. */
  writes: { create: number; update: number; exclude: number };
}

interface Failure {
  writer: number;
  server: number;
  what: string;
  status: number | string;
  body: string;
}

function saleFields(s: AckedSale): Record<string, string> {
  return {
    address: s.address,
    sale_date: '2024-05-10',
    sale_price: String(s.price),
    living_area: String(1000 + (s.price % 1000)),
    year_built: '1975',
    rooms: '6',
    notes: s.notes,
    included: s.excludedReason === undefined ? 'yes' : 'no',
    excluded_reason: s.excludedReason ?? '',
  };
}

async function writer(w: number, deadline: number, acked: AckedSale[], failures: Failure[], latencies: number[], perServer: number[]) {
  const rand = mulberry32(1000 + w);
  const clients = apps.map((a) => new FormClient(a.url));
  const mine: AckedSale[] = [];
  const market = `/markets/${marketId}`;
  let n = 0;

  /** One form post; anything but the expected redirect is a failure to report. */
  const post = async (server: number, what: string, action: string, fields: Record<string, string>, formPage: string): Promise<FormResponse | undefined> => {
    const t0 = performance.now();
    let r: FormResponse;
    try {
      r = await clients[server].submit(action, fields, formPage);
    } catch (err) {
      failures.push({ writer: w, server, what, status: 'no response', body: String(err) });
      return undefined;
    }
    latencies.push(performance.now() - t0);
    perServer[server]++;
    if (r.status !== 303 || BUSY_TEXT.test(r.body)) {
      failures.push({ writer: w, server, what, status: r.status, body: r.body.slice(0, 300) });
      return undefined;
    }
    return r;
  };

  while (Date.now() < deadline) {
    const server = rand() < 0.5 ? 0 : 1;
    const roll = rand();
    if (mine.length < 2 || roll < 0.4) {
      n++;
      // Half the adds name their reference, half leave it to the app (generated under the write lock).
      const ref = rand() < 0.5 ? `W${w}-${n}` : undefined;
      const sale: AckedSale = {
        key: 0,
        ...(ref ? { ref } : {}),
        address: `${n} Writer ${w} Street`,
        price: 150_000 + Math.floor(rand() * 300_000),
        notes: `added by writer ${w}`,
        writes: { create: 1, update: 0, exclude: 0 },
      };
      const r = await post(server, `add ${sale.address}`, `${market}/sales`, { ...saleFields(sale), id: ref ?? '' }, `${market}/sales/new`);
      const key = Number(/\/sales\/(\d+)$/.exec(r?.location ?? '')?.[1]);
      if (r && key > 0) {
        sale.key = key;
        mine.push(sale);
        acked.push(sale);
      } else if (r) failures.push({ writer: w, server, what: `add ${sale.address}`, status: r.status, body: `redirect to ${r.location}` });
    } else if (roll < 0.8) {
      const sale = mine[Math.floor(rand() * mine.length)];
      const next = { ...sale, price: 150_000 + Math.floor(rand() * 300_000), notes: `edit ${sale.writes.update + 1} by writer ${w}` };
      const action = `${market}/sales/${sale.key}`;
      const r = await post(server, `edit ${sale.address}`, action, { ...saleFields(next), id: '' }, `${action}/edit`);
      if (r) {
        sale.price = next.price;
        sale.notes = next.notes;
        sale.writes.update++;
      }
    } else {
      const sale = mine[Math.floor(rand() * mine.length)];
      const reason = `left out by writer ${w} (${sale.writes.exclude + 1})`;
      const action = `${market}/sales/${sale.key}/exclude`;
      const r = await post(server, `exclude ${sale.address}`, action, { excluded_reason: reason }, action);
      if (r) {
        sale.excludedReason = reason;
        sale.writes.exclude++;
      }
    }
  }
}

/** Uploads and commits a large file through the first process a few seconds into the run. */
async function importMeanwhile(failures: Failure[]): Promise<number> {
  await new Promise((r) => setTimeout(r, Math.min(5, SECONDS / 4) * 1000));
  const client = new FormClient(apps[0].url);
  const page = `/markets/${importMarketId}/import`;
  const preview = await client.upload(page, 'file', new File([salesCsv(IMPORT_ROWS, { street: 'Meanwhile Row' })], 'meanwhile.csv', { type: 'text/csv' }), page);
  const action = /action="(\/markets\/\d+\/import\/\d+\/commit)"/.exec(preview.body)?.[1];
  if (preview.status !== 200 || !action) {
    failures.push({ writer: 0, server: 0, what: 'import preview', status: preview.status, body: preview.body.slice(0, 300) });
    return 0;
  }
  const t0 = performance.now();
  const done = await client.submit(action, {});
  if (done.status !== 303) failures.push({ writer: 0, server: 0, what: 'import commit', status: done.status, body: done.body.slice(0, 300) });
  return performance.now() - t0;
}

describe('two app processes on one database file', () => {
  it(`20 writers for ${SECONDS} s through both: no lost or doubled write, no busy error reaches a user`, { timeout: (SECONDS + 90) * 1000 }, async () => {
    const acked: AckedSale[] = [];
    const failures: Failure[] = [];
    const latencies: number[] = [];
    const perServer = [0, 0];
    const deadline = Date.now() + SECONDS * 1000;
    const importing = importMeanwhile(failures);
    await Promise.all(Array.from({ length: WRITERS }, (_, w) => writer(w + 1, deadline, acked, failures, latencies, perServer)));
    const importMs = await importing;
    await Promise.all(apps.map((a) => a.stop()));

    const db = await openDatabase({ url });
    try {
      const rows = async (sql: string, args: (number | string)[] = []) => (await db.$client.execute({ sql, args })).rows;
      const stored = await rows('select id, ref, address, sale_price, notes, included, excluded_reason from sales where market_id = ?', [marketId]);
      const history = await rows('select sale_id, action, count(*) as n from sale_changes where market_id = ? group by sale_id, action', [marketId]);
      const [{ revision }] = await rows('select sales_revision as revision from markets where id = ?', [marketId]);
      const integrity = (await rows('PRAGMA integrity_check')).map((r) => String(r.integrity_check));
      const [{ imported }] = await rows('select count(*) as imported from sales where market_id = ?', [importMarketId]);

      latencies.sort((a, b) => a - b);
      const writes = acked.reduce((t, s) => t + s.writes.create + s.writes.update + s.writes.exclude, 0);
      console.log(
        `concurrency: ${WRITERS} writers, 2 processes, ${SECONDS} s: ${latencies.length} posts (${perServer.join(' + ')} per process), ` +
          `${acked.length} adds, ${acked.reduce((t, s) => t + s.writes.update, 0)} edits, ${acked.reduce((t, s) => t + s.writes.exclude, 0)} excludes acknowledged; ` +
          `${(latencies.length / SECONDS).toFixed(0)} writes/s; latency p50 ${latencies[Math.floor(latencies.length / 2)]?.toFixed(0)} ms, ` +
          `p99 ${latencies[Math.floor(latencies.length * 0.99)]?.toFixed(0)} ms, max ${latencies.at(-1)?.toFixed(0)} ms; ` +
          `${IMPORT_ROWS}-row import committed meanwhile in ${importMs.toFixed(0)} ms; ${failures.length} failures`,
      );

      expect(failures.slice(0, 5)).toEqual([]);
      for (const a of apps) expect(a.output()).not.toMatch(BUSY_TEXT);
      expect(integrity).toEqual(['ok']);
      expect(acked.length).toBeGreaterThan(WRITERS);
      expect(Number(imported)).toBe(IMPORT_ROWS);

      // Every acknowledged add exactly once, and nothing else.
      expect(stored.length).toBe(acked.length);
      const byAddress = new Map<string, (typeof stored)[number][]>();
      for (const r of stored) byAddress.set(String(r.address), [...(byAddress.get(String(r.address)) ?? []), r]);
      const changes = new Map<string, number>();
      for (const h of history) changes.set(`${h.sale_id}:${h.action}`, Number(h.n));
      for (const s of acked) {
        const found = byAddress.get(s.address) ?? [];
        expect(found, s.address).toHaveLength(1);
        const [r] = found;
        expect(Number(r.id)).toBe(s.key);
        if (s.ref) expect(r.ref).toBe(s.ref);
        // The last acknowledged values.
        expect({ price: Number(r.sale_price), notes: r.notes, included: Number(r.included), reason: r.excluded_reason }, s.address).toEqual({
          price: s.price,
          notes: s.notes,
          included: s.excludedReason === undefined ? 1 : 0,
          reason: s.excludedReason ?? null,
        });
        // One history row per acknowledged write, none for anything else.
        expect({ create: changes.get(`${s.key}:create`) ?? 0, update: changes.get(`${s.key}:update`) ?? 0, exclude: changes.get(`${s.key}:exclude`) ?? 0 }, s.address).toEqual(
          s.writes,
        );
      }
      expect(history.reduce((t, h) => t + Number(h.n), 0)).toBe(writes);
      // The triggers bumped the market's sales revision once per write.
      expect(Number(revision)).toBe(writes);
    } finally {
      closeDatabase(db);
    }
  });
});
