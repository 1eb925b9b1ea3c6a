import { mkdtempSync, rmSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { closeDatabase, embeddedFilePath, openDatabase } from '../../src/store/database.js';
import { migrateDatabase } from '../../src/store/migrate.js';
import { createMarket, listMarkets } from '../../src/store/markets-repo.js';

let dir: string;
beforeEach(() => {
  dir = mkdtempSync(path.join(tmpdir(), 'compfit-db-'));
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

describe('openDatabase', () => {
  it('creates the file and its folder, uses WAL and a busy timeout on every connection', async () => {
    const file = path.join(dir, 'nested', 'app.db');
    const db = await openDatabase({ url: `file:${file}`, busyTimeoutMs: 4321 });
    try {
      expect(existsSync(file)).toBe(true);
      expect((await db.$client.execute('PRAGMA journal_mode')).rows[0].journal_mode).toBe('wal');
      expect((await db.$client.execute('PRAGMA busy_timeout')).rows[0].timeout).toBe(4321);
      // A transaction borrows another connection from the client's pool: it has the timeout too.
      const tx = await db.$client.transaction('read');
      expect((await tx.execute('PRAGMA busy_timeout')).rows[0].timeout).toBe(4321);
      tx.close();
    } finally {
      closeDatabase(db);
    }
  });

  it('applies the migrations once; a second start finds the schema and the data as they were', async () => {
    const url = `file:${path.join(dir, 'app.db')}`;
    const first = await openDatabase({ url });
    await migrateDatabase(first);
    await createMarket(first, { name: 'Kept', areaUnit: 'sqft', currency: 'USD' });
    closeDatabase(first);
    const second = await openDatabase({ url });
    await migrateDatabase(second);
    expect((await listMarkets(second)).map((m) => m.name)).toEqual(['Kept']);
    const tables = await second.$client.execute("select name from sqlite_master where type = 'table' and name not like '\\_%' escape '\\' and name not like 'sqlite%' order by name");
    expect(tables.rows.map((r) => r.name)).toEqual(['estimates', 'import_batches', 'markets', 'sale_changes', 'sales', 'sessions', 'sign_in_attempts', 'users']);
    closeDatabase(second);
  });

  it('reads the path out of file URLs', () => {
    expect(embeddedFilePath('file:data/compfit.db')).toBe('data/compfit.db');
    expect(embeddedFilePath('file:///srv/compfit.db')).toBe('/srv/compfit.db');
    expect(embeddedFilePath('file:/srv/compfit.db?mode=ro')).toBe('/srv/compfit.db');
  });
});
