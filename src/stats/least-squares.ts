import { Matrix, QrDecomposition, SingularValueDecomposition } from 'ml-matrix';
import { compensatedDot } from './double-double.js';

/**
 * Ordinary least squares for any design matrix, by Householder QR (ml-matrix), never the
 * normal equations: QR works on X itself, so its accuracy follows cond(X), not cond(X)².
 *
 * Each column is first scaled to unit length (equilibration). Scaling changes nothing in
 * exact arithmetic but keeps columns of very different size (x and x¹⁰) from swamping
 * each other in the Householder reflections.
 *
 * With R the triangular factor of the scaled design, (XᵀX)⁻¹ = D R⁻¹ R⁻ᵀ D, D = diag(1/‖xⱼ‖),
 * and a leverage x₀ᵀ(XᵀX)⁻¹x₀ is ‖R⁻ᵀ D x₀‖², so hat values and subject leverage come
 * from one triangular solve per row (Golub & Van Loan, Matrix Computations, §5.3).
 *
 * Cost: O(n·p²) time, O(n·p) memory.
 * @throws RangeError when n ≤ p, when a column is all zeros, or when a column is (nearly)
 *   a linear combination of earlier ones; the message names the columns.
 * @example leastSquares([[1, 0], [1, 1], [1, 2]], [1, 3, 5]).coefficients // => [1, 2]
 */
export interface LeastSquaresFit {
  n: number;
  p: number;
  coefficients: number[];
  fitted: Float64Array;
  residuals: Float64Array;
  /** Residual sum of squares Σeᵢ². */
  rss: number;
  dfResidual: number;
  /** Residual standard error s = √(RSS / (n − p)). */
  sigma: number;
  /** Diagonal of the hat matrix H = X(XᵀX)⁻¹Xᵀ. */
  hatValues: Float64Array;
  /** (XᵀX)⁻¹: multiply by s² for the coefficient covariance. */
  unscaledCovariance: number[][];
  /** Condition number of the column-scaled design (ratio of extreme singular values). */
  scaledConditionNumber: number;
  /** x₀ᵀ(XᵀX)⁻¹x₀ for a new row x₀ (same columns as the design). */
  leverageOf(x0: readonly number[]): number;
}

export interface LeastSquaresOptions {
  /** Names used in error messages, one per column. */
  columnNames?: readonly string[];
  /**
   * A column whose part orthogonal to the earlier columns is shorter than this fraction
   * of its length is taken as an exact linear combination of them.
   */
  collinearityTolerance?: number;
  /** Refuse designs whose scaled condition number exceeds this (digits would be lost). */
  maxConditionNumber?: number;
}

/** Default tolerance: well above rounding (≈1e-16) and below any real data's collinearity. */
export const COLLINEARITY_TOLERANCE = 1e-10;

export function leastSquares(
  design: readonly (readonly number[])[],
  y: ArrayLike<number>,
  options: LeastSquaresOptions = {},
): LeastSquaresFit {
  const n = design.length;
  const p = n > 0 ? design[0].length : 0;
  const names = options.columnNames ?? Array.from({ length: p }, (_, j) => `column ${j + 1}`);
  if (y.length !== n) throw new RangeError(`leastSquares: design has ${n} rows but y has ${y.length} values`);
  if (p === 0) throw new RangeError('leastSquares: need at least one column');
  if (n <= p)
    throw new RangeError(`leastSquares: need more rows (${n}) than coefficients (${p}) to leave residual degrees of freedom`);

  for (const row of design) {
    if (row.length !== p) throw new RangeError(`leastSquares: every design row needs ${p} values`);
    for (let j = 0; j < p; j++)
      if (!Number.isFinite(row[j])) throw new RangeError(`leastSquares: ${names[j]} has a value that is not a finite number`);
  }

  // With an intercept column, centre the other columns: X b = X_c γ with X_c = X A, so the fit
  // runs on the far better conditioned X_c and b = A γ, (XᵀX)⁻¹ = A (X_cᵀX_c)⁻¹ Aᵀ.
  const intercept = findInterceptColumn(design);
  const centre = new Float64Array(p);
  if (intercept >= 0) {
    for (const row of design) for (let j = 0; j < p; j++) if (j !== intercept) centre[j] += row[j];
    for (let j = 0; j < p; j++) centre[j] /= n;
  }
  const interceptValue = intercept >= 0 ? design[0][intercept] : 1;
  const centred = (row: readonly number[], out: Float64Array | number[]): void => {
    for (let j = 0; j < p; j++) out[j] = j === intercept ? row[j] : row[j] - centre[j];
  };

  const fromCentred = (g: readonly number[]): number[] => {
    if (intercept < 0) return [...g];
    const b = [...g];
    for (let j = 0; j < p; j++) if (j !== intercept) b[intercept] -= (centre[j] / interceptValue) * g[j];
    return b;
  };

  const scale = new Float64Array(p);
  const work = new Float64Array(p);
  for (const row of design) {
    centred(row, work);
    for (let j = 0; j < p; j++) scale[j] += work[j] * work[j];
  }
  for (let j = 0; j < p; j++) {
    if (scale[j] === 0)
      throw new RangeError(
        intercept >= 0 && j !== intercept ? `leastSquares: ${names[j]} has no variation (it is constant)` : `leastSquares: ${names[j]} is all zeros`,
      );
    scale[j] = Math.sqrt(scale[j]);
  }
  const scaled = new Matrix(n, p);
  for (let i = 0; i < n; i++) {
    const target = scaled.data[i];
    centred(design[i], work);
    for (let j = 0; j < p; j++) target[j] = work[j] / scale[j];
  }

  const qr = new QrDecomposition(scaled);
  const r = qr.upperTriangularMatrix.to2DArray();
  checkRank(r, names, options.collinearityTolerance ?? COLLINEARITY_TOLERANCE);
  const conditionNumber = new SingularValueDecomposition(r, { computeLeftSingularVectors: false, computeRightSingularVectors: false }).condition;
  if (options.maxConditionNumber !== undefined && !(conditionNumber <= options.maxConditionNumber))
    throw new RangeError(
      `leastSquares: the design is too ill-conditioned to solve in double precision (scaled condition number ${conditionNumber.toExponential(2)} > ${options.maxConditionNumber.toExponential(0)})`,
    );

  const yColumn = Matrix.columnVector(Array.from(y));
  const scaledCoefficients = qr.solve(yColumn).getColumn(0);
  const gamma = scaledCoefficients.map((c, j) => c / scale[j]);
  const coefficients = fromCentred(gamma);

  const residuals = new Float64Array(n);
  for (let i = 0; i < n; i++) residuals[i] = compensatedDot(y[i], design[i], coefficients.map((b) => -b));
  if (conditionNumber * conditionNumber * Number.EPSILON < 1e-3)
    refine(design, y, coefficients, residuals, {
      r,
      toOriginal: (z) => fromCentred(z.map((zj, j) => zj / scale[j])),
      toScaledGradient: (g) => {
        const cg = [...g];
        if (intercept >= 0) for (let j = 0; j < p; j++) if (j !== intercept) cg[j] -= (centre[j] / interceptValue) * g[intercept];
        return cg.map((v, j) => v / scale[j]);
      },
      scaledRow: (i, out) => {
        centred(design[i], out);
        for (let j = 0; j < p; j++) out[j] /= scale[j];
      },
    });
  const fitted = new Float64Array(n);
  let rss = 0;
  for (let i = 0; i < n; i++) {
    fitted[i] = y[i] - residuals[i];
    rss += residuals[i] * residuals[i];
  }
  const dfResidual = n - p;

  // W = R⁻¹ (upper triangular), so (XᵀX)⁻¹ = D W Wᵀ D and h(x) = ‖Wᵀ D x‖².
  const w = invertUpperTriangular(r);
  const hatValues = new Float64Array(n);
  const v = new Float64Array(p);
  const leverageOfRow = (row: readonly number[]): number => {
    centred(row, v);
    for (let j = 0; j < p; j++) v[j] /= scale[j];
    let h = 0;
    for (let k = 0; k < p; k++) {
      let s = 0;
      const limit = k; // (Wᵀv)_k = Σ_{j ≤ k} W[j][k] v[j]
      for (let j = 0; j <= limit; j++) s += w[j][k] * v[j];
      h += s * s;
    }
    return h;
  };
  for (let i = 0; i < n; i++) hatValues[i] = leverageOfRow(design[i]);

  const centredCovariance: number[][] = [];
  for (let a = 0; a < p; a++) {
    centredCovariance.push(new Array<number>(p).fill(0));
    for (let b = 0; b < p; b++) {
      let s = 0;
      for (let k = Math.max(a, b); k < p; k++) s += w[a][k] * w[b][k];
      centredCovariance[a][b] = s / (scale[a] * scale[b]);
    }
  }
  // A C Aᵀ, where A differs from I only in the intercept's row: b_c = γ_c − Σ_j (m_j / v) γ_j.
  const unscaledCovariance = centredCovariance.map((row) => fromCentred(row));
  const transposed = unscaledCovariance[0].map((_, j) => unscaledCovariance.map((row) => row[j]));
  const covariance = transposed.map((row) => fromCentred(row));

  return {
    n,
    p,
    coefficients,
    fitted,
    residuals,
    rss,
    dfResidual,
    sigma: Math.sqrt(rss / dfResidual),
    hatValues,
    unscaledCovariance: covariance,
    scaledConditionNumber: conditionNumber,
    leverageOf: (x0) => {
      if (x0.length !== p) throw new RangeError(`leverageOf: need ${p} values, got ${x0.length}`);
      return leverageOfRow(x0);
    },
  };
}

/**
 * Without pivoting, a tiny |R_kk| means column k lies in the span of columns 0..k-1.
 * The coefficients of that combination (solve R[0:k,0:k] c = R[0:k,k]) tell which earlier
 * columns take part, so the error can name them all.
 */
function checkRank(r: number[][], names: readonly string[], tolerance: number): void {
  const p = r.length;
  for (let k = 0; k < p; k++) {
    if (Math.abs(r[k][k]) > tolerance) continue;
    const c = new Array<number>(k).fill(0);
    for (let i = k - 1; i >= 0; i--) {
      let s = r[i][k];
      for (let j = i + 1; j < k; j++) s -= r[i][j] * c[j];
      c[i] = Math.abs(r[i][i]) > tolerance ? s / r[i][i] : 0;
    }
    const involved = c.map((ci, i) => (Math.abs(ci) > 1e-8 ? names[i] : undefined)).filter((x): x is string => x !== undefined);
    const partners = involved.length > 0 ? involved.join(', ') : 'the earlier columns';
    throw new RangeError(`leastSquares: ${names[k]} is an exact linear combination of ${partners} (collinear)`);
  }
}

function invertUpperTriangular(r: number[][]): number[][] {
  const p = r.length;
  const w = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let j = 0; j < p; j++) {
    w[j][j] = 1 / r[j][j];
    for (let i = j - 1; i >= 0; i--) {
      let s = 0;
      for (let k = i + 1; k <= j; k++) s += r[i][k] * w[k][j];
      w[i][j] = -s / r[i][i];
    }
  }
  return w;
}

/** Index of the first column that is one nonzero constant (an intercept), or −1. */
function findInterceptColumn(design: readonly (readonly number[])[]): number {
  const first = design[0];
  for (let j = 0; j < first.length; j++) {
    const v = first[j];
    if (v !== 0 && design.every((row) => row[j] === v)) return j;
  }
  return -1;
}

interface ScaledFactor {
  /** R of the scaled, centred design X_s = X M⁻¹. */
  r: number[][];
  /** z (coefficients of X_s) → b (coefficients of X): b = M⁻¹ z. */
  toOriginal: (z: number[]) => number[];
  /** g = Xᵀv → X_sᵀv = M⁻ᵀ g. */
  toScaledGradient: (g: number[]) => number[];
  scaledRow: (i: number, out: Float64Array) => void;
}

/**
 * Iterative refinement of the augmented system [I X; Xᵀ 0][r; b] = [y; 0] with residuals
 * f = y − r − Xb and g = −Xᵀr computed in extended precision (Björck 1967, "Iterative
 * refinement of linear least squares solutions I", BIT 7:257-278; Björck, Numerical
 * Methods for Least Squares Problems, 1996, §2.9). One QR solve leaves errors of order
 * cond²·eps·‖r‖, large when the residuals are large (NIST Wampler4-5); refinement
 * removes them. Corrections solve RᵀR Δz = X_sᵀf − M⁻ᵀg (the seminormal equations, safe here
 * because the caller only refines when cond²·eps is small). Updates b and r in place.
 */
function refine(
  design: readonly (readonly number[])[],
  y: ArrayLike<number>,
  b: number[],
  residual: Float64Array,
  factor: ScaledFactor,
): void {
  const n = design.length;
  const p = b.length;
  const f = new Float64Array(n);
  const row = new Float64Array(p);
  const column = new Float64Array(n);
  for (let iteration = 0; iteration < 4; iteration++) {
    const negB = b.map((v) => -v);
    for (let i = 0; i < n; i++) f[i] = compensatedDot(y[i] - residual[i], design[i], negB) + (y[i] - (y[i] - residual[i]) - residual[i]);
    const g: number[] = [];
    for (let j = 0; j < p; j++) {
      for (let i = 0; i < n; i++) column[i] = design[i][j];
      g.push(-compensatedDot(0, column, residual));
    }
    const rhs = factor.toScaledGradient(g).map((v) => -v);
    for (let i = 0; i < n; i++) {
      factor.scaledRow(i, row);
      for (let j = 0; j < p; j++) rhs[j] += row[j] * f[i];
    }
    const dz = solveSeminormal(factor.r, rhs);
    const db = factor.toOriginal(dz);
    for (let j = 0; j < p; j++) b[j] += db[j];
    for (let i = 0; i < n; i++) {
      let a = 0;
      for (let j = 0; j < p; j++) a += design[i][j] * db[j];
      residual[i] += f[i] - a;
    }
    const size = Math.max(...b.map(Math.abs));
    const step = Math.max(...db.map(Math.abs));
    if (!(step > size * Number.EPSILON)) break;
  }
}

/** Solves RᵀR z = c by two triangular solves. */
function solveSeminormal(r: number[][], c: number[]): number[] {
  const p = r.length;
  const u = new Array<number>(p).fill(0);
  for (let i = 0; i < p; i++) {
    let s = c[i];
    for (let k = 0; k < i; k++) s -= r[k][i] * u[k];
    u[i] = s / r[i][i];
  }
  const z = new Array<number>(p).fill(0);
  for (let i = p - 1; i >= 0; i--) {
    let s = u[i];
    for (let k = i + 1; k < p; k++) s -= r[i][k] * z[k];
    z[i] = s / r[i][i];
  }
  return z;
}
