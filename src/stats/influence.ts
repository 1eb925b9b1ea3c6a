/**
 * Outlier and influence measures of each observation, from residuals eᵢ, hat values hᵢᵢ
 * and s (Montgomery, Peck & Vining, 5th ed., §4.2, §6.2-6.4; Cook 1977, Technometrics
 * 19:15-18; Belsley, Kuh & Welsch 1980):
 *   internally studentized rᵢ = eᵢ/(s√(1 − hᵢᵢ))
 *   externally studentized tᵢ = rᵢ√((n − p − 1)/(n − p − rᵢ²))
 *   Cook's Dᵢ = rᵢ²hᵢᵢ/(p(1 − hᵢᵢ)),  DFFITSᵢ = tᵢ√(hᵢᵢ/(1 − hᵢᵢ))
 * A sale with hᵢᵢ = 1 (fitted exactly by itself) gets NaN for the ratios that divide by 1 − hᵢᵢ.
 */
export interface InfluenceMeasures {
  studentized: Float64Array;
  externallyStudentized: Float64Array;
  cooksDistance: Float64Array;
  dffits: Float64Array;
}

export function influenceMeasures(residuals: ArrayLike<number>, hatValues: ArrayLike<number>, sigma: number, p: number): InfluenceMeasures {
  const n = residuals.length;
  const df = n - p;
  const studentized = new Float64Array(n);
  const externallyStudentized = new Float64Array(n);
  const cooksDistance = new Float64Array(n);
  const dffits = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const h = hatValues[i];
    const oneMinusH = 1 - h;
    if (!(oneMinusH > 1e-12) || !(sigma > 0)) {
      studentized[i] = externallyStudentized[i] = cooksDistance[i] = dffits[i] = NaN;
      continue;
    }
    const r = residuals[i] / (sigma * Math.sqrt(oneMinusH));
    studentized[i] = r;
    const t = df > 1 ? r * Math.sqrt((df - 1) / Math.max(df - r * r, Number.MIN_VALUE)) : NaN;
    externallyStudentized[i] = t;
    cooksDistance[i] = (r * r * h) / (p * oneMinusH);
    dffits[i] = t * Math.sqrt(h / oneMinusH);
  }
  return { studentized, externallyStudentized, cooksDistance, dffits };
}
