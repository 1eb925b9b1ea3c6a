/**
 * Writers of an embedded database file take turns without stopping the event loop.
 *
 * An SQLite file has one writer at a time across all connections and processes, and
 * waiting for it goes wrong in Node in three ways this module avoids:
 * - SQLite's busy handler waits by sleeping the calling thread, the event loop: every
 *   request of the process stops while it waits, and if the transaction holding the lock
 *   belongs to the same process (an import that yields between chunks) it cannot go on, so
 *   the wait ends only in "database is locked".
 * - A statement that fails with SQLITE_BUSY is left active by the libSQL driver (never
 *   reset): its connection can no longer commit, and later autocommit writes on it stay
 *   uncommitted while holding the lock. So no ordinary statement may be let fail busy.
 * - Two writers of one process must not both reach the file lock: the second would
 *   sleep the loop the first needs.
 * So, per client: writes queue behind each other in the process (an async queue; a write
 * transaction keeps its turn until it commits, rolls back or closes); at its turn a write
 * waits for the file's lock by probing it on a connection of its own with no busy timeout
 * (`executeMultiple`: SQLite's exec finalizes its statements even when busy, so the probe
 * leaves nothing behind), pausing asynchronously between probes; then it runs. Another
 * process can still take the lock in the instant between probe and statement; SQLite's own
 * busy timeout on the client's connections covers that rare case.
 *
 * Reads (SELECT, read transactions) never wait: in WAL mode readers do not block the writer.
 */
import type { Client, InStatement, Transaction, TransactionMode } from '@libsql/client';

const FIRST_PAUSE_MS = 1;
const LONGEST_PAUSE_MS = 50;

/** SQLITE_BUSY and its extended codes (BUSY_RECOVERY, BUSY_SNAPSHOT, BUSY_TIMEOUT). */
export function isBusyError(err: unknown): boolean {
  const e = err as { code?: unknown; rawCode?: unknown } | null;
  if (typeof e?.code === 'string' && e.code.startsWith('SQLITE_BUSY')) return true;
  return typeof e?.rawCode === 'number' && (e.rawCode & 0xff) === 5;
}

export class WriteWaitError extends Error {
  constructor(waitedMs: number) {
    super(`waited ${waitedMs} ms for another write of this process to finish`);
    this.name = 'WriteWaitError';
  }
}

/** First come, first served; `acquire` resolves with the function that ends the turn. */
class TurnQueue {
  private busy = false;
  private readonly waiting: (() => void)[] = [];

  acquire(timeoutMs: number): Promise<() => void> {
    if (!this.busy) {
      this.busy = true;
      return Promise.resolve(this.turn());
    }
    return new Promise((resolve, reject) => {
      const wake = () => {
        clearTimeout(timer);
        resolve(this.turn());
      };
      // A write that never ends its turn (a transaction left open) must not hang every other.
      const timer = setTimeout(() => {
        this.waiting.splice(this.waiting.indexOf(wake), 1);
        reject(new WriteWaitError(timeoutMs));
      }, timeoutMs);
      this.waiting.push(wake);
    });
  }

  private turn(): () => void {
    let ended = false;
    return () => {
      if (ended) return;
      ended = true;
      const next = this.waiting.shift();
      if (next) next();
      else this.busy = false;
    };
  }
}

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms * (0.5 + Math.random())));

/** Waits until the file's write lock is free, or rethrows the busy error at the deadline. */
async function waitForFileLock(probe: Client, deadline: number): Promise<void> {
  for (let wait = FIRST_PAUSE_MS; ; wait = Math.min(wait * 2, LONGEST_PAUSE_MS)) {
    try {
      await probe.executeMultiple('BEGIN IMMEDIATE; ROLLBACK');
      return;
    } catch (err) {
      if (!isBusyError(err) || Date.now() >= deadline) throw err;
    }
    // Jitter keeps waiting writers from probing in lockstep.
    await pause(wait);
  }
}

function sqlOf(statement: InStatement): string {
  return typeof statement === 'string' ? statement : statement.sql;
}

const isRead = (sql: string) => /^\s*select\b/i.test(sql);

/** The transaction, ending its writer's turn once it commits, rolls back or closes. */
function endingTurn(tx: Transaction, end: () => void): Transaction {
  return new Proxy(tx, {
    get(target, property) {
      const value: unknown = Reflect.get(target, property, target);
      if (typeof value !== 'function') return value;
      const method = (value as (...args: unknown[]) => unknown).bind(target);
      if (property === 'close')
        return () => {
          try {
            method();
          } finally {
            end();
          }
        };
      if (property === 'commit' || property === 'rollback') return async () => (method() as Promise<void>).finally(end);
      return method;
    },
  });
}

/**
 * The same client, whose writes take turns and wait for the file's lock as described
 * above. `probe` is a client of the same file with one connection and busy timeout 0; it
 * is closed with the client.
 */
export function takingTurnsToWrite(client: Client, probe: Client, waitMs: number): Client {
  const queue = new TurnQueue();
  const startTurn = async () => {
    const deadline = Date.now() + waitMs;
    const end = await queue.acquire(waitMs);
    try {
      await waitForFileLock(probe, deadline);
    } catch (err) {
      end();
      throw err;
    }
    return end;
  };
  const write = async <T>(run: () => Promise<T>): Promise<T> => {
    const end = await startTurn();
    try {
      return await run();
    } finally {
      end();
    }
  };

  const wrapped: Partial<Client> = {
    execute: ((statement: InStatement, args?: unknown) => {
      const run = () => (args === undefined ? client.execute(statement) : client.execute(statement as string, args as never));
      return isRead(sqlOf(statement)) ? run() : write(run);
    }) as Client['execute'],
    batch: ((statements: InStatement[], mode?: TransactionMode) =>
      mode === 'read' ? client.batch(statements, mode) : write(() => client.batch(statements, mode))) as Client['batch'],
    migrate: ((statements: InStatement[]) => write(() => client.migrate(statements))) as Client['migrate'],
    executeMultiple: (sql: string) => write(() => client.executeMultiple(sql)),
    close: () => {
      probe.close();
      client.close();
    },
    transaction: (async (mode?: TransactionMode) => {
      if (mode === 'read') return client.transaction(mode);
      const end = await startTurn();
      try {
        return endingTurn(await client.transaction(mode), end);
      } catch (err) {
        end();
        throw err;
      }
    }) as Client['transaction'],
  };

  return new Proxy(client, {
    get(target, property) {
      if (Object.hasOwn(wrapped, property)) return wrapped[property as keyof Client];
      const value: unknown = Reflect.get(target, property, target);
      // The client keeps private fields, so its own methods must run on the client itself.
      return typeof value === 'function' ? (value as (...args: unknown[]) => unknown).bind(target) : value;
    },
  });
}
