/**
 * Regression-derived adjustment grid of the sales comparison approach: each sale's price
 * adjusted toward the subject by the fitted per-unit coefficients.
 *   none: adjustmentⱼ = bⱼ(x₀ⱼ − xᵢⱼ), adjusted = price + Σ adjustmentⱼ
 *   log:  adjusted = price·exp(Σ bⱼ(x₀ⱼ − xᵢⱼ)); each predictor is shown as the change it
 *         makes alone, price·(exp(bⱼ(x₀ⱼ − xᵢⱼ)) − 1) (percentage adjustments multiply, so
 *         these amounts need not add up to the total).
 * net % = 100·(adjusted − price)/price; gross % = 100·Σ|adjustmentⱼ|/price.
 * Ref: reference/TRADE-FACTS.md §10 (adjustment arithmetic; base adjusting, The Appraisal
 * Journal 2004). With no transform, the mean adjusted price over the sales used equals ŷ₀.
 */
import type { GridRow, Predictor, Transform } from './estimate-result.js';

export function adjustmentGrid(
  predictors: readonly Predictor[],
  unitCoefficients: readonly number[],
  subjectValues: readonly number[],
  ids: readonly string[],
  prices: ArrayLike<number>,
  /** One column of sale values per predictor, in model order. */
  values: readonly ArrayLike<number>[],
  transform: Transform,
): GridRow[] {
  const n = ids.length;
  const k = predictors.length;
  const rows: GridRow[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const price = prices[i];
    const adjustments: Record<string, number> = {};
    let sum = 0;
    let grossSum = 0;
    for (let j = 0; j < k; j++) {
      const raw = unitCoefficients[j] * (subjectValues[j] - values[j][i]);
      const amount = transform === 'log' ? price * Math.expm1(raw) : raw;
      adjustments[predictors[j]] = amount;
      sum += raw;
      grossSum += Math.abs(amount);
    }
    const adjustedPrice = transform === 'log' ? price * Math.exp(sum) : price + sum;
    rows[i] = {
      id: ids[i],
      salePrice: price,
      adjustments,
      adjustedPrice,
      netPercent: (100 * (adjustedPrice - price)) / price,
      grossPercent: (100 * grossSum) / price,
    };
  }
  // Smallest gross adjustment first; the sort is stable, so ties keep the sales' order.
  return rows.sort((a, b) => a.grossPercent - b.grossPercent);
}

/** 15 % net / 25 % gross: a former lender guideline, shown as a flag only (TRADE-FACTS.md §10). */
export const LARGE_NET_PERCENT = 15;
export const LARGE_GROSS_PERCENT = 25;

export function isLargeAdjustment(row: GridRow): boolean {
  return Math.abs(row.netPercent) > LARGE_NET_PERCENT || row.grossPercent > LARGE_GROSS_PERCENT;
}
