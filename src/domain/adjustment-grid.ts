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

export interface GridInput {
  id: string;
  salePrice: number;
  /** The sale's value of each predictor, in model order. */
  values: number[];
}

export function adjustmentGrid(
  predictors: readonly Predictor[],
  unitCoefficients: readonly number[],
  subjectValues: readonly number[],
  sales: readonly GridInput[],
  transform: Transform,
): GridRow[] {
  return sales
    .map((sale) => {
      const adjustments: Record<string, number> = {};
      let sum = 0;
      let gross = 0;
      predictors.forEach((name, j) => {
        const raw = unitCoefficients[j] * (subjectValues[j] - sale.values[j]);
        const amount = transform === 'log' ? sale.salePrice * Math.expm1(raw) : raw;
        adjustments[name] = amount;
        sum += raw;
        gross += Math.abs(amount);
      });
      const adjustedPrice = transform === 'log' ? sale.salePrice * Math.exp(sum) : sale.salePrice + sum;
      return {
        id: sale.id,
        salePrice: sale.salePrice,
        adjustments,
        adjustedPrice,
        netPercent: (100 * (adjustedPrice - sale.salePrice)) / sale.salePrice,
        grossPercent: (100 * gross) / sale.salePrice,
      };
    })
    .sort((a, b) => a.grossPercent - b.grossPercent || a.id.localeCompare(b.id));
}

/** 15 % net / 25 % gross: a former lender guideline, shown as a flag only (TRADE-FACTS.md §10). */
export const LARGE_NET_PERCENT = 15;
export const LARGE_GROSS_PERCENT = 25;

export function isLargeAdjustment(row: GridRow): boolean {
  return Math.abs(row.netPercent) > LARGE_NET_PERCENT || row.grossPercent > LARGE_GROSS_PERCENT;
}
