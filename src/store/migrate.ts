/**
 * Applies the committed drizzle-kit migrations in db/migrations. Safe to run at every
 * start: drizzle records what it has applied and skips it.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { migrate } from 'drizzle-orm/libsql/migrator';
import type { Database } from './database.js';

/** db/migrations, found relative to this file so it works from any working directory. */
export const MIGRATIONS_FOLDER = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', 'db', 'migrations');

export async function migrateDatabase(db: Database): Promise<void> {
  await migrate(db, { migrationsFolder: MIGRATIONS_FOLDER });
}
