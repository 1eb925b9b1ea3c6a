import { SingularValueDecomposition } from 'ml-matrix';
import { householderQr } from './householder-qr.js';

/**
 * Belsley–Kuh–Welsch collinearity diagnostics: scale every column of X (intercept included,
 * not centred) to unit length; with singular values μₖ and right singular vectors V,
 * condition index ηₖ = μ_max/μₖ and variance-decomposition proportions
 * πₖⱼ = (vⱼₖ²/μₖ²) / Σₖ (vⱼₖ²/μₖ²). An index ≥ 30 carrying proportions > 0.5 for two or more
 * coefficients marks a damaging near-dependency among them.
 * Ref: Belsley, Kuh & Welsch, Regression Diagnostics, Wiley 1980, ch. 3.
 *
 * The SVD is taken of the p × p factor R of the scaled X (same singular values and V),
 * so the cost is one O(n·p²) QR.
 */
export interface ConditionDiagnostics {
  conditionNumber: number;
  /** Ascending: 1 first, the largest last. */
  indices: number[];
  /** proportions[k][j]: share of coefficient j's variance tied to index k. */
  proportions: number[][];
}

export function conditionDiagnostics(columns: readonly Float64Array[]): ConditionDiagnostics {
  const p = columns.length;
  const scaled = columns.map((c) => {
    let ss = 0;
    for (let i = 0; i < c.length; i++) ss += c[i] * c[i];
    if (ss === 0) throw new RangeError('conditionDiagnostics: a column is all zeros');
    const norm = Math.sqrt(ss);
    return c.map((x) => x / norm);
  });
  const { r } = householderQr(scaled);
  const svd = new SingularValueDecomposition(r, { computeLeftSingularVectors: false });
  const mu = svd.diagonal;
  const v = svd.rightSingularVectors.to2DArray();
  const order = mu.map((_, k) => k).sort((a, b) => mu[b] - mu[a]);
  const muMax = mu[order[0]];
  const phi = order.map((k) => Array.from({ length: p }, (_, j) => (v[j][k] * v[j][k]) / (mu[k] * mu[k])));
  const totals = Array.from({ length: p }, (_, j) => phi.reduce((s, row) => s + row[j], 0));
  return {
    conditionNumber: muMax / mu[order[p - 1]],
    indices: order.map((k) => muMax / mu[k]),
    proportions: phi.map((row) => row.map((x, j) => x / totals[j])),
  };
}
