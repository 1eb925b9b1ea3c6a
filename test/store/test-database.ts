/** A fresh in-memory database with the committed migrations applied, for one test. */
import { openDatabase, type Database } from '../../src/store/database.js';
import { migrateDatabase } from '../../src/store/migrate.js';
import { createMarket, type Market } from '../../src/store/markets-repo.js';

export async function testDatabase(): Promise<Database> {
  const db = await openDatabase({ url: ':memory:' });
  await migrateDatabase(db);
  return db;
}

export async function testMarket(db: Database, name = 'Test market', areaUnit: 'sqft' | 'm2' = 'sqft', currency = 'USD'): Promise<Market> {
  const r = await createMarket(db, { name, areaUnit, currency });
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.market;
}
