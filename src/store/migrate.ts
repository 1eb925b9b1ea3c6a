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

/**
 * Two processes starting together on a new file can both see "nothing applied" and both
 * apply the first migration; drizzle runs the pending ones as one batch, so the loser's
 * batch rolls back whole. Trying again then finds them applied and skips them.
 */
export async function migrateDatabase(db: Database, attempts = 5): Promise<void> {
  for (let attempt = 1; ; attempt++) {
    try {
      await migrate(db, { migrationsFolder: MIGRATIONS_FOLDER });
      return;
    } catch (err) {
      if (attempt >= attempts) throw err;
      await new Promise((resolve) => setTimeout(resolve, 100 * attempt));
    }
  }
}
