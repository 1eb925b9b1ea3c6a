/**
 * Crash safety of a CSV import: the app (its own process, embedded database file) is
 * killed with SIGKILL while it commits a 50,000-row import through the web route (upload
 * and preview, then commit), ten times at seeded random moments. After every kill the
 * database must pass `PRAGMA integrity_check`, the import must be wholly there or wholly
 * absent (sales, their history, the batch status and the market's sales revision agree),
 * earlier imports must be untouched, and the app must start again on the file.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mulberry32 } from '../../seed/demo-sales.js';
import { closeDatabase, openDatabase } from '../../src/store/database.js';
import { migrateDatabase } from '../../src/store/migrate.js';
import { createMarket } from '../../src/store/markets-repo.js';
import { freePort, startAppProcess, type AppProcess } from './app-process.js';
import { FormClient } from './form-client.js';
import { salesCsv } from './sales-file.js';
import { readWalFrames } from './wal-frames.js';

const ROWS = 50_000;
const KILLS = 10;

let dir: string;
let dbFile: string;
let url: string;
let csv: string;
/** The app comes back on the same port after each crash, as it would for its users. */
let port: string;
const marketIds: number[] = [];

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), 'compfit-crash-'));
  dbFile = path.join(dir, 'crash.db');
  url = `file:${dbFile}`;
  const db = await openDatabase({ url });
  await migrateDatabase(db);
  // One market per import, so each import's presence is read off its own market's count.
  for (const name of ['Calibration', ...Array.from({ length: KILLS }, (_, i) => `Crash ${i + 1}`)]) {
    const r = await createMarket(db, { name, areaUnit: 'sqft', currency: 'USD' });
    if (!r.ok) throw new Error(JSON.stringify(r.errors));
    marketIds.push(r.market.id);
  }
  closeDatabase(db);
  csv = salesCsv(ROWS, { street: 'Crash Court' });
  port = String(await freePort());
});

const start = () => startAppProcess({ databaseUrl: url, env: { PORT: port } });

afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Uploads the file; returns the commit form's action from the preview page. */
async function preview(client: FormClient, marketId: number): Promise<{ action: string; batchId: number }> {
  const page = `/markets/${marketId}/import`;
  const r = await client.upload(page, 'file', new File([csv], 'crash.csv', { type: 'text/csv' }), page);
  expect(r.status, r.body.slice(0, 500)).toBe(200);
  const m = /action="(\/markets\/\d+\/import\/(\d+)\/commit)"/.exec(r.body);
  if (!m) throw new Error('the preview page has no commit form');
  return { action: m[1], batchId: Number(m[2]) };
}

interface ImportState {
  integrity: string[];
  foreignKeyProblems: number;
  sales: number;
  salesOfBatch: number;
  importChanges: number;
  salesWithoutHistory: number;
  revision: number;
  batch: { status: string; rowCount: number; hasText: boolean; committedAt: string | null } | undefined;
  otherMarketsSales: number;
}

async function inspect(marketId: number, batchId: number): Promise<ImportState> {
  const db = await openDatabase({ url });
  try {
    const rows = async (sql: string, args: (number | string)[] = []) => (await db.$client.execute({ sql, args })).rows;
    const one = async (sql: string, args: (number | string)[] = []) => Number((await rows(sql, args))[0].n);
    const [batch] = await rows('select status, row_count, csv_text is not null as has_text, committed_at from import_batches where id = ?', [batchId]);
    return {
      integrity: (await rows('PRAGMA integrity_check')).map((r) => String(r.integrity_check)),
      foreignKeyProblems: (await rows('PRAGMA foreign_key_check')).length,
      sales: await one('select count(*) as n from sales where market_id = ?', [marketId]),
      salesOfBatch: await one('select count(*) as n from sales where import_batch_id = ?', [batchId]),
      importChanges: await one("select count(*) as n from sale_changes where market_id = ? and action = 'import'", [marketId]),
      salesWithoutHistory: await one(
        "select count(*) as n from sales s where s.market_id = ? and not exists (select 1 from sale_changes c where c.sale_id = s.id and c.action = 'import')",
        [marketId],
      ),
      revision: await one('select sales_revision as n from markets where id = ?', [marketId]),
      batch: batch
        ? { status: String(batch.status), rowCount: Number(batch.row_count), hasText: Number(batch.has_text) === 1, committedAt: batch.committed_at as string | null }
        : undefined,
      otherMarketsSales: await one('select count(*) as n from sales where market_id <> ?', [marketId]),
    };
  } finally {
    closeDatabase(db);
  }
}

/** Wholly there: every row, one history row each, the batch committed, one revision bump per row. */
function expectWhollyPresent(s: ImportState): void {
  expect(s.sales).toBe(ROWS);
  expect(s.salesOfBatch).toBe(ROWS);
  expect(s.importChanges).toBe(ROWS);
  expect(s.salesWithoutHistory).toBe(0);
  expect(s.revision).toBe(ROWS);
  expect(s.batch).toMatchObject({ status: 'committed', rowCount: ROWS, hasText: false });
  expect(s.batch?.committedAt).toBeTruthy();
}

/** Wholly absent: no row, no history, the batch still a preview holding its file. */
function expectWhollyAbsent(s: ImportState): void {
  expect(s.sales).toBe(0);
  expect(s.salesOfBatch).toBe(0);
  expect(s.importChanges).toBe(0);
  expect(s.revision).toBe(0);
  expect(s.batch).toMatchObject({ status: 'previewed', rowCount: ROWS, hasText: true, committedAt: null });
}

describe('a 50,000-row import killed with SIGKILL', () => {
  it('leaves an intact database with each import wholly there or wholly absent, ten times over', { timeout: 180_000 }, async () => {
    let app: AppProcess = await start();
    try {
      // An uninterrupted import first: it must land whole, and its duration scales the kill times.
      const calibration = marketIds[0];
      const calClient = new FormClient(app.url);
      const cal = await preview(calClient, calibration);
      const t0 = performance.now();
      const done = await calClient.submit(cal.action, {});
      const commitMs = performance.now() - t0;
      expect(done.status).toBe(303);
      expect(done.location).toBe(`/markets/${calibration}?imported=${ROWS}`);
      const calState = await inspect(calibration, cal.batchId);
      expect(calState.integrity).toEqual(['ok']);
      expectWhollyPresent(calState);

      const rand = mulberry32(0xc0ffee);
      let expectedCommitMs = commitMs;
      const outcomes: { client: FormClient; marketId: number; batchId: number; action: string; delayMs: number; present: boolean; uncommittedFrames: number }[] = [];
      for (let i = 1; i <= KILLS; i++) {
        const marketId = marketIds[i];
        const client = new FormClient(app.url);
        const { action, batchId } = await preview(client, marketId);
        // From just after the request is sent to past the expected commit time.
        const delayMs = Math.round(expectedCommitMs * (0.05 + 1.5 * rand()));
        const commit = client.submit(action, {}).catch(() => undefined);
        await new Promise((r) => setTimeout(r, delayMs));
        app.child.kill('SIGKILL');
        expect((await app.exited).signal).toBe('SIGKILL');
        await commit;

        const wal = readWalFrames(`${dbFile}-wal`);
        const s = await inspect(marketId, batchId);
        expect(s.integrity).toEqual(['ok']);
        expect(s.foreignKeyProblems).toBe(0);
        if (s.sales === 0) expectWhollyAbsent(s);
        else expectWhollyPresent(s);
        // Imports committed before this one are untouched.
        expect(s.otherMarketsSales).toBe(ROWS * (1 + outcomes.filter((o) => o.present).length));
        outcomes.push({ client, marketId, batchId, action, delayMs, present: s.sales === ROWS, uncommittedFrames: wal.uncommitted });
        // A commit that finished before the kill took less than the delay: aim shorter from now on,
        // so a slow first (calibrating) commit does not send every later kill past the commit.
        if (s.sales === ROWS) expectedCommitMs = Math.min(expectedCommitMs, delayMs);

        // The app starts again on the file after every crash.
        app = await start();
      }

      const midTransaction = outcomes.filter((o) => !o.present && o.uncommittedFrames > 0).length;
      console.log(
        `crash safety: calibrated commit ${commitMs.toFixed(0)} ms; ${KILLS} kills: ` +
          `${outcomes.filter((o) => o.present).length} wholly there, ${outcomes.filter((o) => !o.present).length} wholly absent ` +
          `(${midTransaction} with uncommitted frames in the WAL, i.e. killed inside the transaction)\n` +
          outcomes.map((o, k) => `  kill ${k + 1}: after ${o.delayMs} ms → ${o.present ? 'there' : 'absent'}, ${o.uncommittedFrames} uncommitted WAL frames`).join('\n'),
      );
      // The kills must really land inside the import's transaction, or this test proves little.
      expect(midTransaction).toBeGreaterThanOrEqual(3);

      // An import lost to a crash can still be committed from its preview page after the
      // restart, as a user would press the button again (the new process has no cached rows
      // and reads the stored file again).
      const lost = outcomes.find((o) => !o.present)!;
      const retried = await lost.client.submit(lost.action, {});
      expect(retried.status).toBe(303);
      const after = await inspect(lost.marketId, lost.batchId);
      expect(after.integrity).toEqual(['ok']);
      expectWhollyPresent(after);
    } finally {
      await app.stop();
    }
  });
});
