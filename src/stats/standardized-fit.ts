import { inverse, Matrix } from 'ml-matrix';
import { twoSidedTPValue } from './distributions.js';
import { fitRegression, type RegressionFit } from './regression.js';

/**
 * Regression of y on predictors fitted in z-scores and reported in unit terms.
 *
 * Each linear term is z-scored, zⱼ = (xⱼ − x̄ⱼ)/sⱼ (sample SD, n − 1); a squared term is
 * fitted as the square of its base term's z-score, which keeps it far less collinear with
 * the base than x² is with x. The fit y = a + Σ γ w solves by QR. Every fitted column w is a
 * linear combination of the raw columns [1, x, x²]: w = Σ L_wr·raw_r, so the raw
 * coefficients are b = Lᵀγ and Cov(b) = Lᵀ Cov(γ) L — the same numbers R's
 * `lm(y ~ x + I(x^2) + …)` reports. Fitted values, leverages and intervals do not depend on
 * this reparameterisation.
 * Ref: Montgomery, Peck & Vining, 5th ed., §3.9 (standardized coefficients) and §7.2
 * (centring polynomial terms).
 */
export interface Term {
  name: string;
  /** Raw values, one per observation (for a squared term: the squared base values). */
  values: Float64Array;
  /** For a squared term: index of its linear base term in the term list. */
  squareOf?: number;
}

export interface StandardizedFit {
  regression: RegressionFit;
  /** Intercept first, then one per term, in unit (raw) terms. */
  coefficients: { term: string; estimate: number; stdError: number; t: number; p: number; standardized: number | null }[];
  /** Unscaled covariance (XᵀX)⁻¹ of the raw design [1, terms…]. */
  rawUnscaledCovariance: number[][];
  /** Mean and sample SD of each term's raw values. */
  means: number[];
  sds: number[];
  responseSd: number;
  /** F with X_rawᵀX_raw = FᵀF for the raw design [1, terms…] (collinearity diagnostics). */
  rawDesignFactor: number[][];
  /** ŷ and leverage at a new point given by its raw term values. */
  predictAt(rawValues: readonly number[]): { fit: number; leverage: number };
}

export function meanAndSd(values: ArrayLike<number>): { mean: number; sd: number } {
  const n = values.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += values[i];
  mean /= n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (values[i] - mean) ** 2;
  return { mean, sd: n > 1 ? Math.sqrt(ss / (n - 1)) : 0 };
}

export function standardizedFit(terms: readonly Term[], y: ArrayLike<number>): StandardizedFit {
  const n = y.length;
  const k = terms.length;
  const p = k + 1;
  const stats = terms.map((t) => meanAndSd(t.values));
  terms.forEach((t, j) => {
    if (t.values.length !== n) throw new RangeError(`standardizedFit: ${t.name} has ${t.values.length} values, need ${n}`);
    if (!(stats[j].sd > 0)) throw new RangeError(`standardizedFit: ${t.name} has no variation (every value is ${t.values[0]})`);
    if (t.squareOf !== undefined && (terms[t.squareOf] === undefined || terms[t.squareOf].squareOf !== undefined))
      throw new RangeError(`standardizedFit: ${t.name} needs its linear base term in the model`);
  });

  // L: row per fitted column (intercept, then terms), column per raw column (1, then terms).
  const l = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  l[0][0] = 1;
  const fitted: Float64Array[] = [new Float64Array(n).fill(1)];
  terms.forEach((t, j) => {
    const row = l[j + 1];
    if (t.squareOf === undefined) {
      const { mean, sd } = stats[j];
      row[0] = -mean / sd;
      row[j + 1] = 1 / sd;
      fitted.push(t.values.map((x) => (x - mean) / sd));
    } else {
      // z² = (x − m)²/s² = x²/s² − 2m·x/s² + m²/s², with x the base term's raw value.
      const base = t.squareOf;
      const { mean, sd } = stats[base];
      const s2 = sd * sd;
      row[0] = (mean * mean) / s2;
      row[base + 1] = (-2 * mean) / s2;
      row[j + 1] = 1 / s2;
      const baseValues = terms[base].values;
      fitted.push(baseValues.map((x) => ((x - mean) / sd) ** 2));
    }
  });

  const regression = fitRegression(fitted, y, ['(intercept)', ...terms.map((t) => t.name)]);
  const gamma = regression.ls.coefficients;
  const estimates = Array.from({ length: p }, (_, r) => l.reduce((s, row, c) => s + row[r] * gamma[c], 0));
  const cg = regression.ls.unscaledCovariance;
  // Lᵀ C L
  const cl = cg.map((row) => Array.from({ length: p }, (_, r) => row.reduce((s, v, c) => s + v * l[c][r], 0)));
  const rawUnscaledCovariance = Array.from({ length: p }, (_, a) =>
    Array.from({ length: p }, (_, b) => l.reduce((s, row, c) => s + row[a] * cl[c][b], 0)),
  );
  const responseSd = meanAndSd(y).sd;
  const sigma2 = regression.ls.sigma ** 2;
  const df = regression.ls.dfResidual;
  const coefficients = estimates.map((estimate, j) => {
    const stdError = Math.sqrt(sigma2 * rawUnscaledCovariance[j][j]);
    const t = estimate / stdError;
    const term = j === 0 ? '(intercept)' : terms[j - 1].name;
    const standardized = j === 0 ? null : responseSd > 0 ? (estimate * stats[j - 1].sd) / responseSd : NaN;
    return { term, estimate, stdError, t, p: twoSidedTPValue(t, df), standardized };
  });

  return {
    regression,
    coefficients,
    rawUnscaledCovariance,
    means: stats.map((s) => s.mean),
    sds: stats.map((s) => s.sd),
    responseSd,
    // W = X_raw Lᵀ, so X_raw = W L⁻ᵀ and its factor is F_W L⁻ᵀ.
    rawDesignFactor: new Matrix(regression.ls.designFactor).mmul(inverse(new Matrix(l).transpose())).to2DArray(),
    predictAt(rawValues) {
      if (rawValues.length !== k) throw new RangeError(`predictAt: need ${k} values, got ${rawValues.length}`);
      const raw = [1, ...rawValues];
      const w = l.map((row) => row.reduce((s, v, r) => s + v * raw[r], 0));
      const fit = w.reduce((s, v, c) => s + v * gamma[c], 0);
      return { fit, leverage: regression.ls.leverageOf(w) };
    },
  };
}
