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
 * The SVD is taken of a p × p factor F with XᵀX = FᵀF (X = QF shares singular values,
 * right singular vectors and column lengths with F), so from a fit's designFactor it costs
 * O(p³); from raw columns, one O(n·p²) QR first.
 */
export interface ConditionDiagnostics {
  conditionNumber: number;
  /** Ascending: 1 first, the largest last. */
  indices: number[];
  /** proportions[k][j]: share of coefficient j's variance tied to index k. */
  proportions: number[][];
}

export function conditionDiagnostics(columns: readonly Float64Array[]): ConditionDiagnostics {
  return conditionDiagnosticsOfFactor(householderQr(columns.map((c) => c.slice())).r);
}

/** The same diagnostics from a p × p factor F of XᵀX = FᵀF. */
export function conditionDiagnosticsOfFactor(factor: readonly (readonly number[])[]): ConditionDiagnostics {
  const p = factor.length;
  const norms = Array.from({ length: p }, (_, j) => Math.hypot(...factor.map((row) => row[j])));
  if (norms.some((x) => x === 0)) throw new RangeError('conditionDiagnostics: a column is all zeros');
  const scaled = factor.map((row) => row.map((x, j) => x / norms[j]));
  const svd = new SingularValueDecomposition(scaled, { computeLeftSingularVectors: false });
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
