/**
 * Variance inflation factors of the slope coefficients: VIFⱼ = 1/(1 − R²ⱼ), the diagonal of
 * the inverse correlation matrix of the predictors. With an intercept,
 * [(XᵀX)⁻¹]ⱼⱼ = 1/(Sⱼⱼ(1 − R²ⱼ)), Sⱼⱼ = Σ(xᵢⱼ − x̄ⱼ)², so VIFⱼ = [(XᵀX)⁻¹]ⱼⱼ·Sⱼⱼ comes from
 * the QR fit with no further factorisation. Large values mean the coefficient's standard
 * error is inflated by collinearity (about √VIF).
 * Ref: Kutner et al., Applied Linear Statistical Models, 5th ed., §10.5; Montgomery, Peck &
 * Vining, 5th ed., §9.4.
 * @example varianceInflationFactors([[1, 0, 0], [0, 0.5, 0], [0, 0, 0.25]], [null, 2, 4]) // => [null, 1, 1]
 */
export function varianceInflationFactors(
  unscaledCovariance: readonly (readonly number[])[],
  /** Σ(xᵢⱼ − x̄ⱼ)² per column; null for the intercept. */
  centredSumsOfSquares: readonly (number | null)[],
): (number | null)[] {
  const slopes = centredSumsOfSquares.filter((s) => s !== null).length;
  if (slopes === centredSumsOfSquares.length) throw new RangeError('varianceInflationFactors: need a model with an intercept');
  return centredSumsOfSquares.map((sjj, j) => (sjj === null ? null : slopes === 1 ? 1 : unscaledCovariance[j][j] * sjj));
}
