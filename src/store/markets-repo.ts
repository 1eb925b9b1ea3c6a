/**
 * Markets: create, rename, look up and list with their sales counts. `find…` returns
 * undefined when there is no such market; `get…` throws.
 */
import { asc, count, eq } from 'drizzle-orm';
import type { Database } from './database.js';
import type { MarketFields } from './market-fields.js';
import { markets, sales, type MarketRow } from './schema.js';

export type Market = MarketRow;

export interface MarketSummary {
  id: number;
  name: string;
  salesCount: number;
}

export class NotFoundError extends Error {
  constructor(what: string) {
    super(`${what} not found`);
    this.name = 'NotFoundError';
  }
}

export async function listMarkets(db: Database): Promise<MarketSummary[]> {
  return db
    .select({ id: markets.id, name: markets.name, salesCount: count(sales.id) })
    .from(markets)
    .leftJoin(sales, eq(sales.marketId, markets.id))
    .groupBy(markets.id)
    .orderBy(asc(markets.name));
}

export async function findMarket(db: Database, id: number): Promise<Market | undefined> {
  return db.query.markets.findFirst({ where: eq(markets.id, id) });
}

export async function getMarket(db: Database, id: number): Promise<Market> {
  const m = await findMarket(db, id);
  if (!m) throw new NotFoundError(`market ${id}`);
  return m;
}

export async function findMarketByName(db: Database, name: string): Promise<Market | undefined> {
  return db.query.markets.findFirst({ where: eq(markets.name, name.trim()) });
}

function columns(fields: MarketFields) {
  return { name: fields.name, areaUnit: fields.areaUnit, currency: fields.currency, notes: fields.notes ?? null };
}

/** Creates a market; a taken name comes back as a field error, not an exception. */
export async function createMarket(
  db: Database,
  fields: MarketFields,
): Promise<{ ok: true; market: Market } | { ok: false; errors: Record<string, string> }> {
  if (await findMarketByName(db, fields.name)) return { ok: false, errors: { name: `a market named "${fields.name}" already exists` } };
  const [market] = await db.insert(markets).values(columns(fields)).returning();
  return { ok: true, market };
}

export async function updateMarket(
  db: Database,
  id: number,
  fields: MarketFields,
): Promise<{ ok: true; market: Market } | { ok: false; errors: Record<string, string> }> {
  const other = await findMarketByName(db, fields.name);
  if (other && other.id !== id) return { ok: false, errors: { name: `a market named "${fields.name}" already exists` } };
  const [market] = await db
    .update(markets)
    .set({ ...columns(fields), updatedAt: new Date().toISOString() })
    .where(eq(markets.id, id))
    .returning();
  if (!market) throw new NotFoundError(`market ${id}`);
  return { ok: true, market };
}

export async function countSales(db: Database, marketId: number): Promise<number> {
  const [row] = await db.select({ n: count() }).from(sales).where(eq(sales.marketId, marketId));
  return row.n;
}
