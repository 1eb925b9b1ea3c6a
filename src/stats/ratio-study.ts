import { median } from './median.js';

/**
 * Ratio study of estimates Aᵢ against sale prices Sᵢ, as the assessment trade measures
 * accuracy: ratio rᵢ = Aᵢ/Sᵢ; level = median ratio; COD = 100·mean|rᵢ − median|/median;
 * PRD = mean ratio / weighted mean ratio (ΣA/ΣS); PRB = OLS slope of (rᵢ − median)/median
 * on log₂(Vᵢ), Vᵢ = 0.5·Aᵢ/median + 0.5·Sᵢ (the change in ratio when value doubles).
 * Ref: IAAO, Standard on Ratio Studies (2013), Appendix B (formulas; PRB definition as
 * recorded in reference/TRADE-FACTS.md §9).
 * @example ratioStudy([100, 200], [100, 200]).cod // => 0
 */
export interface RatioStudy {
  count: number;
  medianRatio: number;
  meanRatio: number;
  weightedMeanRatio: number;
  cod: number;
  prd: number;
  prb: number;
}

export function ratioStudy(estimates: ArrayLike<number>, prices: ArrayLike<number>): RatioStudy {
  const n = estimates.length;
  if (n === 0 || prices.length !== n) throw new RangeError('ratioStudy: need matching, non-empty estimates and prices');
  const ratios = new Float64Array(n);
  let sumA = 0;
  let sumS = 0;
  let sumR = 0;
  for (let i = 0; i < n; i++) {
    if (!(prices[i] > 0)) throw new RangeError(`ratioStudy: price ${i + 1} must be positive`);
    ratios[i] = estimates[i] / prices[i];
    sumA += estimates[i];
    sumS += prices[i];
    sumR += ratios[i];
  }
  const med = median(ratios);
  let absDev = 0;
  for (let i = 0; i < n; i++) absDev += Math.abs(ratios[i] - med);
  const meanRatio = sumR / n;
  const weightedMeanRatio = sumA / sumS;

  // PRB: simple OLS slope; a closed form is exact for one regressor.
  let mx = 0;
  let my = 0;
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    xs[i] = Math.log2(0.5 * (estimates[i] / med) + 0.5 * prices[i]);
    ys[i] = (ratios[i] - med) / med;
    mx += xs[i];
    my += ys[i];
  }
  mx /= n;
  my /= n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (xs[i] - mx) * (ys[i] - my);
    sxx += (xs[i] - mx) ** 2;
  }
  return {
    count: n,
    medianRatio: med,
    meanRatio,
    weightedMeanRatio,
    cod: (100 * (absDev / n)) / med,
    prd: meanRatio / weightedMeanRatio,
    prb: sxx > 0 ? sxy / sxx : NaN,
  };
}
