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
import { APP_VERSION } from '../../version.js';

export interface RunOutcome {
  sales: StoredSale[];
  fitted?: FittedModel;
  result?: EstimateResult;
  problems: string[];
}

/** Fits the model on the market's sales; with a subject, estimates it too. Refusals become problems. */
export async function runMarketModel(db: Database, market: Market, model: ModelSpec, effectiveDate: string, subject?: Subject): Promise<RunOutcome> {
  const sales = await allSales(db, market.id);
  try {
    const fitted = fitModel(sales, model, subject?.effectiveDate ?? effectiveDate);
    const result = subject ? estimateFor(fitted, subject) : undefined;
    return { sales, fitted, result, problems: [] };
  } catch (err) {
    if (err instanceof EstimateError) return { sales, problems: err.problems };
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
