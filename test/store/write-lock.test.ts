import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { createClient, type Client } from '@libsql/client';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { closeDatabase, openDatabase, type Database } from '../../src/store/database.js';
import { migrateDatabase } from '../../src/store/migrate.js';
import { createMarket } from '../../src/store/markets-repo.js';
import { addSale } from '../../src/store/sales-repo.js';
import { isBusyError, takingTurnsToWrite, WriteWaitError } from '../../src/store/write-lock.js';

let dir: string;
let file: string;
let toClose: (Database | Client)[];
beforeEach(() => {
  dir = mkdtempSync(path.join(tmpdir(), 'compfit-lock-'));
  file = path.join(dir, 'lock.db');
  toClose = [];
});
afterEach(() => {
  for (const c of toClose) 'close' in c ? c.close() : closeDatabase(c);
  rmSync(dir, { recursive: true, force: true });
});

async function open(busyTimeoutMs?: number): Promise<Database> {
  const db = await openDatabase({ url: `file:${file}`, ...(busyTimeoutMs ? { busyTimeoutMs } : {}) });
  toClose.push(db);
  return db;
}

/** A client with one connection, so a later statement surely runs where the busy one did. */
function oneConnection(wrapped: boolean, waitMs = 5000): Client {
  const raw = createClient({ url: `file:${file}`, concurrency: 1 } as Parameters<typeof createClient>[0]);
  toClose.push(raw);
  return wrapped ? takingTurnsToWrite(raw, createClient({ url: `file:${file}`, concurrency: 1, timeout: 0 }), waitMs) : raw;
}

const sale = (address: string) => ({ id: '', address, saleDate: '2024-03-01', salePrice: 250_000, characteristics: { living_area: 1500 }, included: true });
const count = async (c: Client, sql = 'select count(*) as n from t') => Number((await c.execute(sql)).rows[0].n);

describe('writers taking turns', () => {
  it('a write waits for another client’s transaction while the event loop keeps running, then lands once', async () => {
    const holder = await open();
    await migrateDatabase(holder);
    const market = await createMarket(holder, { name: 'Busy', areaUnit: 'sqft', currency: 'USD' });
    if (!market.ok) throw new Error('market');
    const waiter = await open();

    const tx = await holder.$client.transaction('write');
    await tx.execute({ sql: "update markets set notes = 'held' where id = ?", args: [market.market.id] });
    let ticks = 0;
    const ticker = setInterval(() => ticks++, 5);
    const write = addSale(waiter, market.market.id, sale('1 Waiting Way'), 'test');
    await new Promise((r) => setTimeout(r, 150));
    // Still waiting, and the loop was free: timers ran during the wait.
    expect(ticks).toBeGreaterThan(10);
    expect((await holder.$client.execute('select count(*) as n from sales')).rows[0].n).toBe(0);
    await tx.commit();
    const r = await write;
    clearInterval(ticker);
    expect(r.ok).toBe(true);
    expect((await waiter.$client.execute("select count(*) as n from sales where address = '1 Waiting Way'")).rows[0].n).toBe(1);
  });

  it('in one process, a second transaction waits for the first to end instead of failing', async () => {
    const db = await open();
    await migrateDatabase(db);
    const market = await createMarket(db, { name: 'Same process', areaUnit: 'sqft', currency: 'USD' });
    if (!market.ok) throw new Error('market');
    const first = await db.$client.transaction('write');
    const second = addSale(db, market.market.id, sale('2 Queue Road'), 'test');
    // The first transaction goes on across real event-loop turns, as an import does.
    await new Promise((r) => setTimeout(r, 50));
    await first.execute({ sql: "update markets set notes = 'first' where id = ?", args: [market.market.id] });
    await first.commit();
    expect((await second).ok).toBe(true);
    const [m] = (await db.$client.execute({ sql: 'select notes, sales_revision from markets where id = ?', args: [market.market.id] })).rows;
    expect(m).toMatchObject({ notes: 'first', sales_revision: 1 });
  });

  it('a client that waited keeps committing afterwards (without the turns, the driver leaves its connection unable to)', async () => {
    for (const wrapped of [false, true]) {
      rmSync(file, { force: true });
      rmSync(`${file}-wal`, { force: true });
      rmSync(`${file}-shm`, { force: true });
      const holder = createClient({ url: `file:${file}` });
      toClose.push(holder);
      await holder.execute('PRAGMA journal_mode = WAL');
      await holder.execute('create table t (x)');
      const other = oneConnection(wrapped, 5000);
      const tx = await holder.transaction('write');
      await tx.execute('insert into t values (1)');
      const waiting = other.execute('insert into t values (2)').then(
        () => 'written',
        (e: unknown) => (isBusyError(e) ? 'busy' : String(e)),
      );
      await new Promise((r) => setTimeout(r, 30));
      await tx.commit();
      expect(await waiting).toBe(wrapped ? 'written' : 'busy');
      await other.execute('insert into t values (3)');
      // Without the turns the busy statement stays active on the connection: the next
      // write never commits and the other client cannot see it.
      expect(await count(holder)).toBe(wrapped ? 3 : 1);
      holder.close();
      other.close();
    }
  });

  it('gives up with the busy error once the wait is over, and the client still works', async () => {
    const holder = await open();
    await holder.$client.execute('create table t (x)');
    const waiter = await open(200);
    const tx = await holder.$client.transaction('write');
    const t0 = Date.now();
    const err = await waiter.$client.execute('insert into t values (1)').catch((e: unknown) => e);
    expect(isBusyError(err)).toBe(true);
    expect(Date.now() - t0).toBeGreaterThanOrEqual(190);
    expect(Date.now() - t0).toBeLessThan(2000);
    tx.close();
    await waiter.$client.execute('insert into t values (2)');
    expect(await count(holder.$client)).toBe(1);
  });

  it('a transaction left open makes the next write of the process fail after the wait, not hang', async () => {
    const db = await open(150);
    await db.$client.execute('create table t (x)');
    const open1 = await db.$client.transaction('write');
    const err = await db.$client.execute('insert into t values (1)').catch((e: unknown) => e);
    expect(err).toBeInstanceOf(WriteWaitError);
    // Reads do not wait for the turn.
    expect(await count(db.$client)).toBe(0);
    open1.close();
    await db.$client.execute('insert into t values (1)');
    expect(await count(db.$client)).toBe(1);
  });

  it('knows SQLite busy errors by code', () => {
    expect(isBusyError({ code: 'SQLITE_BUSY' })).toBe(true);
    expect(isBusyError({ code: 'SQLITE_BUSY_SNAPSHOT' })).toBe(true);
    expect(isBusyError({ code: 'SQLITE_ERROR', rawCode: 261 })).toBe(true); // 261 = SQLITE_BUSY_RECOVERY
    expect(isBusyError({ code: 'SQLITE_CONSTRAINT', rawCode: 2067 })).toBe(false);
    expect(isBusyError(new Error('database is locked'))).toBe(false);
  });
});
