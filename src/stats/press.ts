/**
 * Leave-one-out without refitting: the PRESS residual e₍ᵢ₎ = eᵢ/(1 − hᵢᵢ) is exactly the
 * error of predicting observation i from a fit without it; PRESS = Σe₍ᵢ₎², predicted
 * R² = 1 − PRESS/TSS. Observations with hᵢᵢ = 1 cannot be predicted without themselves
 * and get NaN (they are left out of PRESS and reported).
 * Ref: Allen 1974, Technometrics 16:125-127; Montgomery, Peck & Vining, 5th ed., §4.3.
 * @example pressStatistics([1, -1, 0], [0.5, 0.5, 0.5], 4).press // => 8
 */
export interface PressStatistics {
  pressResiduals: Float64Array;
  press: number;
  predictedRSquared: number;
  /** Observations with hᵢᵢ = 1, left out of PRESS. */
  unpredictable: number;
}

export function pressStatistics(residuals: ArrayLike<number>, hatValues: ArrayLike<number>, tss: number): PressStatistics {
  const n = residuals.length;
  const pressResiduals = new Float64Array(n);
  let press = 0;
  let unpredictable = 0;
  for (let i = 0; i < n; i++) {
    const oneMinusH = 1 - hatValues[i];
    if (!(oneMinusH > 1e-12)) {
      pressResiduals[i] = NaN;
      unpredictable++;
      continue;
    }
    pressResiduals[i] = residuals[i] / oneMinusH;
    press += pressResiduals[i] ** 2;
  }
  return { pressResiduals, press, predictedRSquared: 1 - press / tss, unpredictable };
}
