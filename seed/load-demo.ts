/**
 * Puts the demo market into a database: on first start when there are no markets, and
 * on `npm run seed`, which rebuilds it (its sales and their history are replaced in one
 * transaction; the market row and any saved estimates stay).
 */
import type { Database } from '../src/store/database.js';
import { createMarket, findMarketByName, listMarkets } from '../src/store/markets-repo.js';
import { importSales } from '../src/store/sales-import.js';
import { DEMO_MARKET, generateDemoSales } from './demo-sales.js';

export const SEED_ACTOR = 'demo seed';

export async function installDemoMarket(db: Database): Promise<{ marketId: number; count: number }> {
  let market = await findMarketByName(db, DEMO_MARKET.name);
  if (!market) {
    const created = await createMarket(db, DEMO_MARKET);
    if (!created.ok) throw new Error(`demo market: ${Object.values(created.errors).join('; ')}`);
    market = created.market;
  }
  const result = await importSales(db, market.id, generateDemoSales(), { by: SEED_ACTOR, fileName: 'demo', replace: true });
  if (!result.ok) throw new Error(`demo market: ${result.errors.map((e) => e.message).join('; ')}`);
  return { marketId: market.id, count: result.count };
}

/** Seeds the demo only into a database without any market; returns whether it did. */
export async function seedDemoIfEmpty(db: Database): Promise<boolean> {
  if ((await listMarkets(db)).length > 0) return false;
  await installDemoMarket(db);
  return true;
}
