import { spawn } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { createClient } from '@libsql/client';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { readSalesCsv } from '../../src/domain/sales-csv.js';
import { closeDatabase, openDatabase } from '../../src/store/database.js';
import { migrateDatabase } from '../../src/store/migrate.js';
import { createMarket } from '../../src/store/markets-repo.js';
import { importSales } from '../../src/store/sales-import.js';
import { REPO_ROOT, startAppProcess } from '../durability/app-process.js';
import { FormClient } from '../durability/form-client.js';
import { salesCsv } from '../durability/sales-file.js';
import { cli } from '../helpers/cli.js';

let dir: string;
let env: Record<string, string>;
beforeEach(() => {
  dir = mkdtempSync(path.join(tmpdir(), 'compfit-backup-'));
  env = { DATABASE_URL: 'file:store.db' };
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

/** A database file with one market of `rows` imported sales; returns the market's id. */
async function databaseWith(file: string, rows: number): Promise<number> {
  const db = await openDatabase({ url: `file:${file}` });
  try {
    await migrateDatabase(db);
    const m = await createMarket(db, { name: 'Backed up', areaUnit: 'sqft', currency: 'USD' });
    if (!m.ok) throw new Error(JSON.stringify(m.errors));
    const parsed = readSalesCsv(salesCsv(rows, { street: 'Copy Close' }));
    if (!parsed.ok) throw new Error('csv');
    const r = await importSales(db, m.market.id, parsed.sales, { by: 'test', fileName: 'base.csv' });
    if (!r.ok) throw new Error('import');
    return m.market.id;
  } finally {
    closeDatabase(db);
  }
}

async function readCopy(file: string, marketId: number) {
  const copy = createClient({ url: `file:${file}` });
  try {
    const one = async (sql: string) => (await copy.execute({ sql, args: [marketId] })).rows[0];
    return {
      integrity: (await copy.execute('PRAGMA integrity_check')).rows.map((r) => String(r.integrity_check)),
      sales: await one('select count(*) as n, min(id) as first, max(id) as last from sales where market_id = ?'),
      changes: await one('select count(*) as n, count(distinct sale_id) as sales, min(id) as first, max(id) as last from sale_changes where market_id = ?'),
      orphans: await one('select count(*) as n from sales s where market_id = ? and not exists (select 1 from sale_changes c where c.sale_id = s.id)'),
      revision: await one('select sales_revision as n from markets where id = ?'),
    };
  } finally {
    copy.close();
  }
}

/** `compfit backup` as a separate process, through the installed program. */
function backupProcess(args: string[], databaseUrl: string): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, [path.join(REPO_ROOT, 'bin', 'compfit.js'), 'backup', ...args], {
      cwd: dir,
      env: { ...process.env, DATABASE_URL: databaseUrl },
    });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    child.on('exit', (code) => resolve({ code, stdout, stderr }));
  });
}

describe('compfit backup', () => {
  it('refuses, with one message and nothing written: no file named, an existing file, the database itself, a libSQL server, no database', async () => {
    expect(await cli(['backup'], { cwd: dir, env })).toMatchObject({ code: 2, stderr: 'compfit backup: name the backup file: compfit backup FILE [--force]\n' });
    expect((await cli(['backup', 'copy.db'], { cwd: dir, env })).stderr).toBe(
      `compfit backup: there is no database at ${path.join(dir, 'store.db')} (DATABASE_URL file:store.db)\n`,
    );
    await databaseWith(path.join(dir, 'store.db'), 3);
    writeFileSync(path.join(dir, 'copy.db'), 'keep me');
    expect(await cli(['backup', 'copy.db'], { cwd: dir, env })).toMatchObject({
      code: 2,
      stderr: `compfit backup: ${path.join(dir, 'copy.db')} already exists; add --force to replace it\n`,
    });
    expect(readFileSync(path.join(dir, 'copy.db'), 'utf8')).toBe('keep me');
    expect((await cli(['backup', 'store.db', '--force'], { cwd: dir, env })).stderr).toBe(
      `compfit backup: ${path.join(dir, 'store.db')} is the database itself; name another file\n`,
    );
    expect((await cli(['backup', 'no-such-folder/copy.db'], { cwd: dir, env })).stderr).toMatch(/the folder .*no-such-folder does not exist/);
    const server = await cli(['backup', 'other.db'], { cwd: dir, env: { DATABASE_URL: 'libsql://office.example.org', DATABASE_AUTH_TOKEN: 'secret' } });
    expect(server.code).toBe(2);
    expect(server.stderr).toMatch(/embedded database file.*libSQL server \(libsql:\/\/office\.example\.org\).*own snapshot or dump tools.*compfit export --market NAME/);
    expect(readdir().filter((f) => !f.startsWith('store.db'))).toEqual(['copy.db']);
  });

  it('writes a checked copy, and with --force replaces an existing file', async () => {
    const marketId = await databaseWith(path.join(dir, 'store.db'), 250);
    const first = await cli(['backup', 'copy.db'], { cwd: dir, env });
    expect(first.code).toBe(0);
    expect(first.stdout).toMatch(new RegExp(`^backed up ${escape(path.join(dir, 'store.db'))} to ${escape(path.join(dir, 'copy.db'))}: 1 market, 250 sales, 0 saved estimates, [\\d.]+ MB; integrity check ok\\n$`));
    writeFileSync(path.join(dir, 'old.db'), 'an older backup');
    const forced = await cli(['backup', 'old.db', '--force'], { cwd: dir, env });
    expect(forced.code).toBe(0);
    const copy = await readCopy(path.join(dir, 'old.db'), marketId);
    expect(copy.integrity).toEqual(['ok']);
    expect(Number(copy.sales.n)).toBe(250);
    // No temporary file is left beside the target.
    expect(readdir().filter((f) => f.includes('.partial-'))).toEqual([]);
  });

  it('copies one point in time while the app writes from another process, and the documented restore starts the app on the copy', { timeout: 90_000 }, async () => {
    const BASE = 20_000;
    const WRITERS = 6;
    const file = path.join(dir, 'live.db');
    const marketId = await databaseWith(file, BASE);
    const app = await startAppProcess({ databaseUrl: `file:${file}` });
    let acked = 0;
    let failures: string[] = [];
    let writing = true;
    const writers = Array.from({ length: WRITERS }, async (_, w) => {
      const client = new FormClient(app.url);
      for (let n = 1; writing; n++) {
        const r = await client.submit(
          `/markets/${marketId}/sales`,
          { address: `${n} Busy Writer ${w} Way`, sale_date: '2024-06-01', sale_price: String(200_000 + n), living_area: '1400', id: '' },
          `/markets/${marketId}/sales/new`,
        );
        if (r.status === 303) acked++;
        else failures.push(`${r.status} ${r.body.slice(0, 200)}`);
      }
    });
    try {
      await new Promise((r) => setTimeout(r, 1000));
      const ackedBefore = acked;
      const backup = await backupProcess(['copy.db'], `file:${file}`);
      const ackedAfter = acked;
      await new Promise((r) => setTimeout(r, 300));
      writing = false;
      await Promise.all(writers);
      expect(backup.stderr).toBe('');
      expect(backup.code).toBe(0);
      expect(failures).toEqual([]);
      // The app kept writing while the copy was made.
      expect(ackedAfter).toBeGreaterThan(ackedBefore);

      const copy = await readCopy(path.join(dir, 'copy.db'), marketId);
      expect(copy.integrity).toEqual(['ok']);
      const n = Number(copy.sales.n);
      // Everything acknowledged before the backup began is in it; at most the writes in flight at its end beyond those.
      expect(n).toBeGreaterThanOrEqual(BASE + ackedBefore);
      expect(n).toBeLessThanOrEqual(BASE + ackedAfter + WRITERS);
      // One point in time: keys are handed out in commit order, so the copy holds an unbroken run of them,
      // each sale with its history row, and the revision counts exactly these inserts.
      expect(Number(copy.sales.last) - Number(copy.sales.first) + 1).toBe(n);
      expect(Number(copy.changes.n)).toBe(n);
      expect(Number(copy.changes.sales)).toBe(n);
      expect(Number(copy.changes.last) - Number(copy.changes.first) + 1).toBe(n);
      expect(Number(copy.orphans.n)).toBe(0);
      expect(Number(copy.revision.n)).toBe(n);
      console.log(`backup while writing: ${ackedBefore} adds acknowledged before the backup began, ${ackedAfter} by its end; the copy holds ${n - BASE}`);
    } finally {
      writing = false;
      await Promise.all(writers);
      await app.stop();
    }
    const live = await readCopy(file, marketId);
    expect(Number(live.sales.n)).toBe(BASE + acked);

    // Restore as README.md says: app stopped; copy the backup to the DATABASE_URL path; no -wal/-shm beside it; start.
    const restoredDir = path.join(dir, 'restored');
    mkdirSync(restoredDir);
    const restored = path.join(restoredDir, 'compfit.db');
    copyFileSync(path.join(dir, 'copy.db'), restored);
    for (const leftover of ['-wal', '-shm']) rmSync(restored + leftover, { force: true });
    const again = await startAppProcess({ databaseUrl: `file:${restored}` });
    try {
      const expected = Number((await readCopy(path.join(dir, 'copy.db'), marketId)).sales.n);
      const markets = (await fetch(`${again.url}/api/markets`).then((r) => r.json())) as { name: string; salesCount: number }[];
      expect(markets).toEqual([{ id: marketId, name: 'Backed up', salesCount: expected }]);
      const client = new FormClient(again.url);
      const add = await client.submit(
        `/markets/${marketId}/sales`,
        { address: '1 After Restore Road', sale_date: '2024-07-01', sale_price: '250000', living_area: '1500', id: '' },
        `/markets/${marketId}/sales/new`,
      );
      expect(add.status).toBe(303);
      expect(again.output()).not.toMatch(/error/i);
    } finally {
      await again.stop();
    }
    expect(statSync(restored).size).toBeGreaterThan(0);
  });
});

function readdir(): string[] {
  return readdirSync(dir).sort();
}

function escape(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
