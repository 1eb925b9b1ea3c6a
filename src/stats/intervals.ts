import { tCritical } from './distributions.js';

/**
 * Confidence interval for the mean response and prediction interval for one new sale at
 * a point with leverage h₀ = x₀ᵀ(XᵀX)⁻¹x₀:
 *   ŷ₀ ± t(1 − α/2; df)·s·√h₀          (mean response)
 *   ŷ₀ ± t(1 − α/2; df)·s·√(1 + h₀)    (one new observation)
 * Ref: Montgomery, Peck & Vining, 5th ed., §3.4-3.5; Kutner et al., 5th ed., §6.7.
 * @example pointIntervals(100, 2, 0.25, 10, 0.95).prediction // => [95.02…, 104.98…]
 */
export interface PointIntervals {
  fit: number;
  fitStdError: number;
  predictionStdError: number;
  tCritical: number;
  confidence: [number, number];
  prediction: [number, number];
}

export function pointIntervals(fit: number, sigma: number, leverage: number, dfResidual: number, level: number): PointIntervals {
  if (!(leverage >= 0)) throw new RangeError(`pointIntervals: leverage must be ≥ 0, got ${leverage}`);
  const t = tCritical(level, dfResidual);
  const fitStdError = sigma * Math.sqrt(leverage);
  const predictionStdError = sigma * Math.sqrt(1 + leverage);
  return {
    fit,
    fitStdError,
    predictionStdError,
    tCritical: t,
    confidence: [fit - t * fitStdError, fit + t * fitStdError],
    prediction: [fit - t * predictionStdError, fit + t * predictionStdError],
  };
}
