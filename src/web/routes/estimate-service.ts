/**
 * What the estimate routes and the JSON API share: run a market's model on its current
 * sales, and freeze the result as a saved estimate.
 */
import { EstimateError, estimateFor, fitModel, type FittedModel } from '../../domain/estimate.js';
import type { EstimateResult } from '../../domain/estimate-result.js';
import type { ModelSpec } from '../../domain/model.js';
import type { Subject } from '../../domain/sale.js';
import type { AreaUnitCode, SavedEstimate } from '../../domain/saved-estimate.js';
import type { Database } from '../../store/database.js';
import { saveEstimate } from '../../store/estimates-repo.js';
import type { Market } from '../../store/markets-repo.js';
import { allSales, type StoredSale } from '../../store/sales-repo.js';
import { markets } from '../../store/schema.js';
import { eq } from 'drizzle-orm';
import { APP_VERSION } from '../../version.js';

export interface RunOutcome {
  sales: StoredSale[];
  fitted?: FittedModel;
  result?: EstimateResult;
  problems: string[];
}

/**
 * A small least-recently-used map: fitting a model is the costly step of a page, and most
 * requests repeat a fit (the same model while the subject changes, htmx refreshes).
 */
class LruCache<V> {
  private readonly map = new Map<string, V>();
  constructor(private readonly capacity: number) {}
  get(key: string): V | undefined {
    const v = this.map.get(key);
    if (v !== undefined) {
      this.map.delete(key);
      this.map.set(key, v);
    }
    return v;
  }
  set(key: string, value: V): void {
    this.map.delete(key);
    this.map.set(key, value);
    if (this.map.size > this.capacity) this.map.delete(this.map.keys().next().value as string);
  }
}

type FitOutcome = { fitted: FittedModel; problems: [] } | { fitted?: undefined; problems: string[] };

/** Caches are keyed by the market's sales revision, which triggers bump on every sale write. */
const salesCache = new WeakMap<Database, LruCache<StoredSale[]>>();
const fitCache = new WeakMap<Database, LruCache<FitOutcome>>();

function cacheOf<V>(caches: WeakMap<Database, LruCache<V>>, db: Database, capacity: number): LruCache<V> {
  let c = caches.get(db);
  if (!c) caches.set(db, (c = new LruCache<V>(capacity)));
  return c;
}

async function salesRevision(db: Database, marketId: number): Promise<number> {
  const [row] = await db.select({ revision: markets.salesRevision }).from(markets).where(eq(markets.id, marketId)).limit(1);
  return row?.revision ?? -1;
}

/** The market's sales as of one revision; read once per revision per process. */
export async function currentSales(db: Database, marketId: number): Promise<{ revision: number; sales: StoredSale[] }> {
  const revision = await salesRevision(db, marketId);
  const cache = cacheOf(salesCache, db, 8);
  const key = `${marketId}:${revision}`;
  let sales = cache.get(key);
  if (!sales) {
    sales = await allSales(db, marketId);
    // A write between the two reads would label newer sales with the older revision; only cache a consistent pair.
    if ((await salesRevision(db, marketId)) === revision) cache.set(key, sales);
  }
  return { revision, sales };
}

/** Fits the model on the market's sales; with a subject, estimates it too. Refusals become problems. */
export async function runMarketModel(db: Database, market: Market, model: ModelSpec, effectiveDate: string, subject?: Subject): Promise<RunOutcome> {
  const { revision, sales } = await currentSales(db, market.id);
  const date = subject?.effectiveDate ?? effectiveDate;
  // Only months_since_sale depends on the effective date.
  const key = [market.id, revision, model.predictors.join(','), model.transform, model.level, model.predictors.includes('months_since_sale') ? date : ''].join('|');
  const cache = cacheOf(fitCache, db, 32);
  let outcome = cache.get(key);
  if (!outcome) {
    try {
      outcome = { fitted: fitModel(sales, model, date), problems: [] };
    } catch (err) {
      if (!(err instanceof EstimateError)) throw err;
      outcome = { problems: err.problems };
    }
    cache.set(key, outcome);
  }
  if (!outcome.fitted) return { sales, problems: outcome.problems };
  try {
    const fitted = outcome.fitted.effectiveDate === date ? outcome.fitted : { ...outcome.fitted, effectiveDate: date };
    const result = subject ? estimateFor(fitted, subject) : undefined;
    return { sales, fitted, result, problems: [] };
  } catch (err) {
    if (err instanceof EstimateError) return { sales, fitted: outcome.fitted, problems: err.problems };
    throw err;
  }
}

export function marketSnapshot(market: Market): SavedEstimate['market'] {
  return { id: market.id, name: market.name, areaUnit: market.areaUnit as AreaUnitCode, currency: market.currency };
}

/** Saves an immutable snapshot of one estimate and returns its id. */
export async function saveMarketEstimate(
  db: Database,
  market: Market,
  sales: StoredSale[],
  subject: Subject,
  model: ModelSpec,
  result: EstimateResult,
  by: string,
  now = new Date(),
): Promise<number> {
  return saveEstimate(db, {
    market: marketSnapshot(market),
    createdAt: now.toISOString(),
    createdBy: by,
    appVersion: APP_VERSION,
    subject,
    model,
    sales,
    result,
  });
}
