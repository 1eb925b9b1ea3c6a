import { fUpperPValue, twoSidedTPValue } from './distributions.js';
import { leastSquaresColumns, type LeastSquaresFit, type LeastSquaresOptions } from './least-squares.js';

/**
 * A fitted linear model with its usual report: coefficients with standard errors, t and
 * two-sided p, R², adjusted R², F with its p value. Works for any design; with no
 * intercept column R² uses the uncorrected total sum of squares Σy², as R's `lm` and the
 * NIST StRD certified values do.
 * Ref: Montgomery, Peck & Vining, Introduction to Linear Regression Analysis, 5th ed., ch. 3.
 */
export interface RegressionFit {
  ls: LeastSquaresFit;
  names: string[];
  coefficients: { name: string; estimate: number; stdError: number; t: number; p: number }[];
  hasIntercept: boolean;
  /** Total sum of squares: Σ(y − ȳ)² with an intercept, Σy² without. */
  tss: number;
  rSquared: number;
  adjRSquared: number;
  fStatistic: number;
  fPValue: number;
  /** Numerator degrees of freedom of F: p − 1 with an intercept, p without. */
  dfModel: number;
}

export function fitRegression(
  columns: readonly Float64Array[],
  y: ArrayLike<number>,
  names: string[],
  options: LeastSquaresOptions = {},
): RegressionFit {
  const ls = leastSquaresColumns(columns, y, { ...options, columnNames: names });
  const n = ls.n;
  const hasIntercept = ls.interceptColumn >= 0;
  let mean = 0;
  if (hasIntercept) {
    for (let i = 0; i < n; i++) mean += y[i];
    mean /= n;
  }
  let tss = 0;
  for (let i = 0; i < n; i++) tss += (y[i] - mean) ** 2;
  const s2 = ls.rss / ls.dfResidual;
  const coefficients = ls.coefficients.map((estimate, j) => {
    const stdError = Math.sqrt(s2 * ls.unscaledCovariance[j][j]);
    const t = estimate / stdError;
    return { name: names[j], estimate, stdError, t, p: twoSidedTPValue(t, ls.dfResidual) };
  });
  const dfModel = hasIntercept ? ls.p - 1 : ls.p;
  const rSquared = 1 - ls.rss / tss;
  const dfTotal = hasIntercept ? n - 1 : n;
  const adjRSquared = 1 - (1 - rSquared) * (dfTotal / ls.dfResidual);
  const fStatistic = dfModel > 0 ? (tss - ls.rss) / dfModel / s2 : NaN;
  return {
    ls,
    names,
    coefficients,
    hasIntercept,
    tss,
    rSquared,
    adjRSquared,
    fStatistic,
    fPValue: dfModel > 0 ? fUpperPValue(fStatistic, dfModel, ls.dfResidual) : NaN,
    dfModel,
  };
}
