/**
 * The demo market, loaded from the data files in seed/ (demo-market.json and
 * demo-sales.csv, written by seed/write-demo-files.ts from the documented generator).
 * The app adds it to a database without markets; `npm run seed` and `compfit seed`
 * rebuild it: its sales and their history are replaced in one transaction, while the
 * market row and any saved estimates stay.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Sale } from '../domain/sale.js';
import { describeRowError, readSalesCsv } from '../domain/sales-csv.js';
import type { Database } from './database.js';
import { validateMarketFields, type MarketFields } from './market-fields.js';
import { createMarket, findMarketByName, listMarkets } from './markets-repo.js';
import { importSales } from './sales-import.js';

export const DEMO_FOLDER = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', 'seed');
export const DEMO_ACTOR = 'demo seed';

export interface DemoMarket {
  market: MarketFields;
  sales: Sale[];
}

/** Reads and checks the demo files; a broken file is a programming error, so it throws. */
export function readDemoMarket(folder = DEMO_FOLDER): DemoMarket {
  const fields = validateMarketFields(JSON.parse(readFileSync(path.join(folder, 'demo-market.json'), 'utf8')));
  if (!fields.ok) throw new Error(`seed/demo-market.json: ${Object.values(fields.errors).join('; ')}`);
  const csv = readSalesCsv(readFileSync(path.join(folder, 'demo-sales.csv'), 'utf8'));
  if (!csv.ok) throw new Error(`seed/demo-sales.csv: ${csv.errors.map(describeRowError).join('; ')}`);
  return { market: fields.value, sales: csv.sales };
}

export async function installDemoMarket(db: Database, demo: DemoMarket = readDemoMarket()): Promise<{ marketId: number; count: number }> {
  let market = await findMarketByName(db, demo.market.name);
  if (!market) {
    const created = await createMarket(db, demo.market);
    if (!created.ok) throw new Error(`demo market: ${Object.values(created.errors).join('; ')}`);
    market = created.market;
  }
  const result = await importSales(db, market.id, demo.sales, { by: DEMO_ACTOR, fileName: 'demo-sales.csv', replace: true });
  if (!result.ok) throw new Error(`demo market: ${result.errors.map(describeRowError).join('; ')}`);
  return { marketId: market.id, count: result.count };
}

/** Adds the demo only to a database without any market; returns whether it did. */
export async function seedDemoIfEmpty(db: Database): Promise<boolean> {
  if ((await listMarkets(db)).length > 0) return false;
  await installDemoMarket(db);
  return true;
}
