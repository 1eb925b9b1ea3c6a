/**
 * Error-free transformations for residuals computed to about twice double precision
 * (Dekker 1971, "A floating-point technique for extending the available precision",
 * Numer. Math. 18:224-242; Ogita, Rump & Oishi 2005, "Accurate sum and dot product",
 * SIAM J. Sci. Comput. 26:1955-1988). Used only by least-squares refinement.
 */

const SPLITTER = 134217729; // 2^27 + 1

/** a·b = hi + lo exactly (Dekker's TwoProduct via Veltkamp splitting). */
function twoProduct(a: number, b: number, out: [number, number]): void {
  const hi = a * b;
  let t = SPLITTER * a;
  const ah = t - (t - a);
  const al = a - ah;
  t = SPLITTER * b;
  const bh = t - (t - b);
  const bl = b - bh;
  out[0] = hi;
  out[1] = al * bl - (((hi - ah * bh) - al * bh) - ah * bl);
}

/**
 * Compensated dot product c + Σ aᵢbᵢ (Ogita–Rump–Oishi Dot2): as accurate as if computed in
 * twice the working precision, then rounded once.
 * @example compensatedDot(0, [1e16, 1, -1e16], [1, 1, 1]) // => 1
 */
export function compensatedDot(c: number, a: ArrayLike<number>, b: ArrayLike<number>): number {
  let sum = c;
  let err = 0;
  const prod: [number, number] = [0, 0];
  for (let i = 0; i < a.length; i++) {
    twoProduct(a[i], b[i], prod);
    const s = sum + prod[0];
    const z = s - sum;
    err += (sum - (s - z)) + (prod[0] - z) + prod[1];
    sum = s;
  }
  return sum + err;
}
