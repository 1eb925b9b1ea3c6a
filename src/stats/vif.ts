/**
 * Variance inflation factors of the slope coefficients: VIFⱼ = 1/(1 − R²ⱼ), the diagonal of
 * the inverse correlation matrix of the predictors. With an intercept,
 * [(XᵀX)⁻¹]ⱼⱼ = 1/(Sⱼⱼ(1 − R²ⱼ)), Sⱼⱼ = Σ(xᵢⱼ − x̄ⱼ)², so VIFⱼ = [(XᵀX)⁻¹]ⱼⱼ·Sⱼⱼ comes from
 * the QR fit with no further factorisation. Large values mean the coefficient's standard
 * error is inflated by collinearity (about √VIF).
 * Ref: Kutner et al., Applied Linear Statistical Models, 5th ed., §10.5; Montgomery, Peck &
 * Vining, 5th ed., §9.4.
 * @example varianceInflationFactors([[0.5, 0], [0, 0.25]], [Float64Array.of(1, 2, 3)]) ...
 */
export function varianceInflationFactors(
  unscaledCovariance: readonly (readonly number[])[],
  columns: readonly Float64Array[],
  interceptColumn: number,
): (number | null)[] {
  if (interceptColumn < 0) throw new RangeError('varianceInflationFactors: need a model with an intercept');
  const slopes = columns.length - 1;
  return columns.map((c, j) => {
    if (j === interceptColumn) return null;
    if (slopes === 1) return 1;
    let mean = 0;
    for (let i = 0; i < c.length; i++) mean += c[i];
    mean /= c.length;
    let sjj = 0;
    for (let i = 0; i < c.length; i++) sjj += (c[i] - mean) ** 2;
    return unscaledCovariance[j][j] * sjj;
  });
}
