import { SingularValueDecomposition } from 'ml-matrix';
import { compensatedDot } from './double-double.js';
import { householderQr } from './householder-qr.js';

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
  /** Condition number of the centred, column-scaled design the QR worked on. */
  scaledConditionNumber: number;
  /**
   * A p × p matrix F with XᵀX = FᵀF (F = R M for the scaled factor R and the design
   * transform M). X = QF, so X and F share singular values, right singular vectors and
   * column lengths: collinearity diagnostics need only F.
   */
  designFactor: number[][];
  /** Index of the intercept column (a nonzero constant), or −1. */
  interceptColumn: number;
  /** x₀ᵀ(XᵀX)⁻¹x₀ for a new row x₀ (same columns as the design). */
  leverageOf(x0: readonly number[]): number;
  /**
   * Regression sum of squares of another response v on the same design, ‖Q₁ᵀ(v − v̄)‖²
   * (v − v̄ when there is an intercept), from the stored QR factor: O(n·p), no refit.
   */
  explainedSumOfSquares(v: ArrayLike<number>): number;
}

export interface LeastSquaresOptions {
  /** Names used in error messages, one per column. */
  columnNames?: readonly string[];
  /**
   * A column whose part orthogonal to the earlier columns is shorter than this fraction
   * of its (centred) length is taken as an exact linear combination of them.
   */
  collinearityTolerance?: number;
}

/** Default tolerance: far above rounding (≈1e-16), far below any real data's collinearity. */
export const COLLINEARITY_TOLERANCE = 1e-10;

/**
 * Ordinary least squares for any design matrix (rows of values), by Householder QR, never
 * the normal equations: QR works on X itself, so accuracy follows cond(X), not cond(X)².
 *
 * When a column is a nonzero constant (an intercept) the other columns are centred, and
 * every column is scaled to unit length before the QR: X b = X_s z with X_s = X M⁻¹, which
 * changes nothing in exact arithmetic but is far better conditioned (x and x⁵ with an
 * intercept). Then b = M⁻¹z, (XᵀX)⁻¹ = M⁻¹(X_sᵀX_s)⁻¹M⁻ᵀ, and a leverage x₀ᵀ(XᵀX)⁻¹x₀ is
 * ‖R⁻ᵀ M⁻ᵀ... ‖² computed on the transformed row. Iterative refinement with extended
 * precision residuals follows (see refine below).
 *
 * Cost: O(n·p²) time, O(n·p) memory.
 * @throws RangeError when n ≤ p, when a value is not finite, when a column is all zeros or
 *   (with an intercept) constant, or when a column is an exact linear combination of
 *   earlier ones; the message names the columns.
 * @example leastSquares([[1, 0], [1, 1], [1, 2]], [1, 3, 5]).coefficients // => [1, 2]
 */
export function leastSquares(
  design: readonly (readonly number[])[],
  y: ArrayLike<number>,
  options: LeastSquaresOptions = {},
): LeastSquaresFit {
  const n = design.length;
  const p = n > 0 ? design[0].length : 0;
  const columns: Float64Array[] = Array.from({ length: p }, () => new Float64Array(n));
  for (let i = 0; i < n; i++) {
    const row = design[i];
    if (row.length !== p) throw new RangeError(`leastSquares: every design row needs ${p} values (row ${i + 1} has ${row.length})`);
    for (let j = 0; j < p; j++) columns[j][i] = row[j];
  }
  return leastSquaresColumns(columns, y, options);
}

/** leastSquares for a design held as columns (one Float64Array per column); the fast path. */
export function leastSquaresColumns(
  columns: readonly Float64Array[],
  y: ArrayLike<number>,
  options: LeastSquaresOptions = {},
): LeastSquaresFit {
  const p = columns.length;
  const n = p > 0 ? columns[0].length : y.length;
  const names = options.columnNames ?? Array.from({ length: p }, (_, j) => `column ${j + 1}`);
  if (p === 0) throw new RangeError('leastSquares: need at least one column');
  if (y.length !== n) throw new RangeError(`leastSquares: design has ${n} rows but y has ${y.length} values`);
  if (n <= p)
    throw new RangeError(`leastSquares: need more rows (${n}) than coefficients (${p}) to leave residual degrees of freedom`);
  for (let i = 0; i < n; i++)
    if (!Number.isFinite(y[i])) throw new RangeError(`leastSquares: response value ${i + 1} is not a finite number`);
  for (let j = 0; j < p; j++) {
    const c = columns[j];
    if (c.length !== n) throw new RangeError(`leastSquares: ${names[j]} has ${c.length} values, need ${n}`);
    for (let i = 0; i < n; i++)
      if (!Number.isFinite(c[i])) throw new RangeError(`leastSquares: ${names[j]} has a value that is not a finite number`);
  }

  const transform = designTransform(columns, names);
  const scaled = columns.map((c, j) => transform.toScaledColumn(c, j));
  const qr = householderQr(scaled.map((c) => c.slice()));
  const r = qr.r;
  checkRank(r, names, options.collinearityTolerance ?? COLLINEARITY_TOLERANCE);
  const conditionNumber = new SingularValueDecomposition(r, {
    computeLeftSingularVectors: false,
    computeRightSingularVectors: false,
  }).condition;

  const qty = Float64Array.from(y);
  qr.applyQt(qty);
  const coefficients = transform.toOriginal(backSubstitute(r, Array.from(qty.subarray(0, p))));
  const residuals = Float64Array.from(y);
  for (let j = 0; j < p; j++) {
    const c = columns[j];
    const b = coefficients[j];
    for (let i = 0; i < n; i++) residuals[i] -= c[i] * b;
  }
  // Perturbation bound for least squares (Golub & Van Loan, Matrix Computations, Thm 5.3.1):
  // relative error ≈ eps·(2κ + κ²·tan θ), tan θ = ‖r‖/‖ŷ‖. Refine only when that bound says
  // digits are being lost; the corrections solve seminormal equations, safe while κ²·eps ≪ 1.
  let rss0 = 0;
  let fitSs = 0;
  for (let i = 0; i < n; i++) {
    rss0 += residuals[i] * residuals[i];
    fitSs += (y[i] - residuals[i]) ** 2;
  }
  const kappa = conditionNumber;
  const tanTheta = fitSs > 0 ? Math.sqrt(rss0 / fitSs) : Infinity;
  const errorBound = Number.EPSILON * (2 * kappa + kappa * kappa * tanTheta);
  if (errorBound > 1e-13 && kappa * kappa * Number.EPSILON < 1e-3) refine(columns, y, coefficients, residuals, r, scaled, transform);

  const fitted = new Float64Array(n);
  let rss = 0;
  for (let i = 0; i < n; i++) {
    fitted[i] = y[i] - residuals[i];
    rss += residuals[i] * residuals[i];
  }
  const dfResidual = n - p;

  // W = R⁻¹ (upper triangular): (X_sᵀX_s)⁻¹ = W Wᵀ and h(x_s) = ‖Wᵀ x_s‖².
  const w = invertUpperTriangular(r);
  const v = new Float64Array(p);
  const leverageOfScaledRow = (): number => {
    let h = 0;
    for (let k = 0; k < p; k++) {
      let s = 0;
      for (let j = 0; j <= k; j++) s += w[j][k] * v[j];
      h += s * s;
    }
    return h;
  };
  // hᵢᵢ = Σₖ (X_s W)ᵢₖ²: build each column of X_s W by axpy over the columns (fast, contiguous).
  const hatValues = new Float64Array(n);
  const q = new Float64Array(n);
  for (let k = 0; k < p; k++) {
    q.fill(0);
    for (let j = 0; j <= k; j++) {
      const c = scaled[j];
      const wjk = w[j][k];
      for (let i = 0; i < n; i++) q[i] += c[i] * wjk;
    }
    for (let i = 0; i < n; i++) hatValues[i] += q[i] * q[i];
  }

  const scaledCovariance = w.map((_, a) =>
    w.map((__, b) => {
      let s = 0;
      for (let k = Math.max(a, b); k < p; k++) s += w[a][k] * w[b][k];
      return s;
    }),
  );
  // M⁻¹ C M⁻ᵀ: apply toOriginal to the columns, then to the rows.
  const half = scaledCovariance.map((rowValues) => transform.toOriginal(rowValues));
  const unscaledCovariance = half[0].map((_, j) => transform.toOriginal(half.map((rowValues) => rowValues[j])));

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
    unscaledCovariance,
    scaledConditionNumber: conditionNumber,
    designFactor: r.map((row) => transform.fromScaledRow(row)),
    interceptColumn: transform.intercept,
    explainedSumOfSquares: (values) => {
      if (values.length !== n) throw new RangeError(`explainedSumOfSquares: need ${n} values, got ${values.length}`);
      const u = Float64Array.from(values);
      if (transform.intercept >= 0) {
        let mean = 0;
        for (let i = 0; i < n; i++) mean += u[i];
        mean /= n;
        for (let i = 0; i < n; i++) u[i] -= mean;
      }
      qr.applyQt(u);
      let ss = 0;
      for (let j = 0; j < p; j++) ss += u[j] * u[j];
      return ss;
    },
    leverageOf: (x0) => {
      if (x0.length !== p) throw new RangeError(`leverageOf: need ${p} values, got ${x0.length}`);
      transform.toScaledRow(x0, v);
      return leverageOfScaledRow();
    },
  };
}

interface DesignTransform {
  intercept: number;
  toScaledColumn(column: Float64Array, j: number): Float64Array;
  toScaledRow(row: ArrayLike<number>, out: Float64Array): void;
  /** A row vector u of X_s's coordinates → uM (X = X_s M). */
  fromScaledRow(u: readonly number[]): number[];
  /** z (coefficients of X_s) → b = M⁻¹z. */
  toOriginal(z: readonly number[]): number[];
  /** g = Xᵀv → X_sᵀv = M⁻ᵀg. */
  toScaledGradient(g: readonly number[]): number[];
}

/** The centring (when there is an intercept) and unit-length scaling M of the design. */
function designTransform(columns: readonly Float64Array[], names: readonly string[]): DesignTransform {
  const p = columns.length;
  const n = columns[0].length;
  let intercept = -1;
  for (let j = 0; j < p && intercept < 0; j++) {
    const c = columns[j];
    let constant = c[0] !== 0;
    for (let i = 1; i < n && constant; i++) constant = c[i] === c[0];
    if (constant) intercept = j;
  }
  const interceptValue = intercept >= 0 ? columns[intercept][0] : 1;
  const centre = columns.map((c, j) => {
    if (intercept < 0 || j === intercept) return 0;
    let sum = 0;
    for (let i = 0; i < n; i++) sum += c[i];
    return sum / n;
  });
  const scale = columns.map((c, j) => {
    let ss = 0;
    for (let i = 0; i < n; i++) ss += (c[i] - centre[j]) ** 2;
    if (ss === 0)
      throw new RangeError(
        intercept >= 0 && j !== intercept
          ? `leastSquares: ${names[j]} has no variation (every value is ${c[0]})`
          : `leastSquares: ${names[j]} is all zeros`,
      );
    return Math.sqrt(ss);
  });
  return {
    intercept,
    toScaledColumn: (c, j) => {
      const out = new Float64Array(n);
      for (let i = 0; i < n; i++) out[i] = (c[i] - centre[j]) / scale[j];
      return out;
    },
    toScaledRow: (row, out) => {
      for (let j = 0; j < p; j++) out[j] = (row[j] - centre[j]) / scale[j];
    },
    // x_j = scale_j·xs_j + (centre_j/v)·scale_c·xs_c: M = diag(scale) plus the intercept's row.
    fromScaledRow: (u) =>
      u.map((_, b) => u[b] * scale[b] + (intercept >= 0 && b !== intercept ? u[intercept] * ((centre[b] * scale[intercept]) / interceptValue) : 0)),
    toOriginal: (z) => {
      const b = z.map((zj, j) => zj / scale[j]);
      if (intercept >= 0) for (let j = 0; j < p; j++) if (j !== intercept) b[intercept] -= (centre[j] / interceptValue) * b[j];
      return b;
    },
    toScaledGradient: (g) => {
      const cg = [...g];
      if (intercept >= 0) for (let j = 0; j < p; j++) if (j !== intercept) cg[j] -= (centre[j] / interceptValue) * g[intercept];
      return cg.map((x, j) => x / scale[j]);
    },
  };
}

/**
 * Iterative refinement of the augmented system [I X; Xᵀ 0][r; b] = [y; 0] with residuals
 * f = y − r − Xb and g = −Xᵀr computed in extended precision (Björck 1967, "Iterative
 * refinement of linear least squares solutions I", BIT 7:257-278; Björck, Numerical
 * Methods for Least Squares Problems, 1996, §2.9). One QR solve leaves errors of order
 * cond²·eps·‖r‖, large when residuals are large (NIST Wampler4-5); refinement removes
 * them. The correction solves RᵀR Δz = X_sᵀf − M⁻ᵀg. Updates b and r in place.
 */
function refine(
  columns: readonly Float64Array[],
  y: ArrayLike<number>,
  b: number[],
  residual: Float64Array,
  r: number[][],
  scaled: Float64Array[],
  transform: DesignTransform,
): void {
  const n = residual.length;
  const p = b.length;
  const f = new Float64Array(n);
  const row = new Float64Array(p);
  const augmented = new Float64Array(p + 2);
  const weights = new Float64Array(p + 2);
  for (let iteration = 0; iteration < 4; iteration++) {
    // f = y − r − Xb as one compensated dot product of [y, r, x] with [1, −1, −b].
    weights[0] = 1;
    weights[1] = -1;
    for (let j = 0; j < p; j++) weights[j + 2] = -b[j];
    for (let i = 0; i < n; i++) {
      augmented[0] = y[i];
      augmented[1] = residual[i];
      for (let j = 0; j < p; j++) augmented[j + 2] = columns[j][i];
      f[i] = compensatedDot(0, augmented, weights);
    }
    const g = columns.map((c) => -compensatedDot(0, c, residual));
    const rhs = transform.toScaledGradient(g).map((x) => -x);
    for (let j = 0; j < p; j++) {
      const c = scaled[j];
      let s = 0;
      for (let i = 0; i < n; i++) s += c[i] * f[i];
      rhs[j] += s;
    }
    const db = transform.toOriginal(solveSeminormal(r, rhs));
    for (let j = 0; j < p; j++) b[j] += db[j];
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < p; j++) row[j] = columns[j][i];
      let a = 0;
      for (let j = 0; j < p; j++) a += row[j] * db[j];
      residual[i] += f[i] - a;
    }
    const size = Math.max(...b.map(Math.abs));
    const step = Math.max(...db.map(Math.abs));
    if (!(step > size * Number.EPSILON)) break;
  }
}

/**
 * Without pivoting, a tiny |R_kk| means column k lies in the span of columns 0..k−1. The
 * coefficients of that combination (R[0:k,0:k] c = R[0:k,k]) tell which earlier columns
 * take part, so the error names them all.
 */
function checkRank(r: number[][], names: readonly string[], tolerance: number): void {
  const p = r.length;
  for (let k = 0; k < p; k++) {
    if (Math.abs(r[k][k]) > tolerance) continue;
    const c = new Array<number>(k).fill(0);
    for (let i = k - 1; i >= 0; i--) {
      let s = r[i][k];
      for (let j = i + 1; j < k; j++) s -= r[i][j] * c[j];
      c[i] = s / r[i][i];
    }
    const involved = names.slice(0, k).filter((_, i) => Math.abs(c[i]) > 1e-8);
    const partners = involved.length > 0 ? involved.join(', ') : 'the columns before it';
    throw new RangeError(`leastSquares: ${names[k]} is an exact linear combination of ${partners} (collinear)`);
  }
}

function backSubstitute(r: number[][], c: number[]): number[] {
  const p = r.length;
  const z = new Array<number>(p).fill(0);
  for (let i = p - 1; i >= 0; i--) {
    let s = c[i];
    for (let k = i + 1; k < p; k++) s -= r[i][k] * z[k];
    z[i] = s / r[i][i];
  }
  return z;
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
  return backSubstitute(r, u);
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
