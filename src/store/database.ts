/**
 * Opens the database named by a libSQL URL: an embedded file (`file:data/compfit.db`),
 * `:memory:` for tests, or a libSQL server (`libsql://…`, `http://…`) with the same code.
 * Embedded files get WAL journaling (readers do not block the writer), and their writers
 * take turns without stopping the event loop (write-lock.ts), so several app processes
 * and the command line can use one file at the same time.
 */
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { createClient, type Client } from '@libsql/client';
import { drizzle, type LibSQLDatabase } from 'drizzle-orm/libsql';
import * as schema from './schema.js';
import { takingTurnsToWrite } from './write-lock.js';

export type Database = LibSQLDatabase<typeof schema> & { $client: Client };

export interface DatabaseOptions {
  url: string;
  authToken?: string;
  /**
   * Milliseconds a write waits for the lock held by another write (embedded files).
   * Longer than the longest write: committing a 20 MB import takes about 10 s on a slow
   * two-core machine.
   */
  busyTimeoutMs?: number;
}

export const DEFAULT_BUSY_TIMEOUT_MS = 30_000;

export function isEmbeddedFileUrl(url: string): boolean {
  return url.startsWith('file:');
}

/** The path of an embedded file URL: `file:data/x.db` → `data/x.db`, `file:///srv/x.db` → `/srv/x.db`. */
export function embeddedFilePath(url: string): string {
  let p = url.slice('file:'.length).split('?')[0];
  if (p.startsWith('//')) p = p.slice(2);
  return p;
}

/** Opens (and for an embedded file, creates with its folder) the database. Call migrateDatabase next. */
export async function openDatabase(options: DatabaseOptions): Promise<Database> {
  const embedded = isEmbeddedFileUrl(options.url);
  if (embedded) mkdirSync(path.dirname(path.resolve(embeddedFilePath(options.url))), { recursive: true });
  const waitMs = options.busyTimeoutMs ?? DEFAULT_BUSY_TIMEOUT_MS;
  const opened = createClient({
    url: options.url,
    ...(options.authToken ? { authToken: options.authToken } : {}),
    // The client keeps a pool of connections to a file; `timeout` is set on each of them.
    // It only covers the rare case write-lock.ts cannot wait for asynchronously.
    ...(embedded ? { timeout: waitMs } : {}),
  });
  const client = embedded ? takingTurnsToWrite(opened, createClient({ url: options.url, concurrency: 1, timeout: 0 }), waitMs) : opened;
  // WAL is a property of the file, so setting it once covers every connection.
  if (embedded) await client.execute('PRAGMA journal_mode = WAL');
  return drizzle(client, { schema }) as Database;
}

export function closeDatabase(db: Database): void {
  db.$client.close();
}
