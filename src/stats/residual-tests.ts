import { chiSquareUpperPValue } from './distributions.js';
import type { LeastSquaresFit } from './least-squares.js';

/**
 * Koenker's studentized Breusch–Pagan test for non-constant variance: LM = n·R² of the
 * squared residuals regressed on the model's own regressors, χ² with k = p − 1 df. Robust
 * to non-normal errors, unlike the original LM = ESS/2.
 * Ref: Breusch & Pagan 1979, Econometrica 47:1287-1294; Koenker 1981, J. Econometrics
 * 17:107-112 (what R's lmtest::bptest computes by default).
 */
export function breuschPaganKoenker(fit: LeastSquaresFit): { statistic: number; df: number; p: number } {
  const n = fit.n;
  const squared = fit.residuals.map((e) => e * e);
  let mean = 0;
  for (let i = 0; i < n; i++) mean += squared[i];
  mean /= n;
  let tss = 0;
  for (let i = 0; i < n; i++) tss += (squared[i] - mean) ** 2;
  const df = fit.interceptColumn >= 0 ? fit.p - 1 : fit.p;
  const statistic = tss > 0 ? (n * fit.explainedSumOfSquares(squared)) / tss : 0;
  return { statistic, df, p: chiSquareUpperPValue(statistic, df) };
}

/**
 * Jarque–Bera test of normal residuals: JB = (n/6)(S² + (K − 3)²/4), S = m₃/m₂^1.5,
 * K = m₄/m₂² (central moments with divisor n), asymptotically χ²(2). Large-sample only:
 * with few sales treat it as advisory.
 * Ref: Jarque & Bera 1980, Economics Letters 6:255-259; 1987, Int. Stat. Review 55:163-172.
 * @example jarqueBera([-1, 1, -1, 1]).kurtosis // => 1
 */
export function jarqueBera(residuals: ArrayLike<number>): { statistic: number; p: number; skewness: number; kurtosis: number } {
  const n = residuals.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += residuals[i];
  mean /= n;
  let m2 = 0;
  let m3 = 0;
  let m4 = 0;
  for (let i = 0; i < n; i++) {
    const d = residuals[i] - mean;
    m2 += d * d;
    m3 += d * d * d;
    m4 += d * d * d * d;
  }
  m2 /= n;
  m3 /= n;
  m4 /= n;
  if (!(m2 > 0)) return { statistic: 0, p: 1, skewness: 0, kurtosis: NaN };
  const skewness = m3 / m2 ** 1.5;
  const kurtosis = m4 / (m2 * m2);
  const statistic = (n / 6) * (skewness ** 2 + (kurtosis - 3) ** 2 / 4);
  return { statistic, p: chiSquareUpperPValue(statistic, 2), skewness, kurtosis };
}
