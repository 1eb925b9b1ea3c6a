import jstat from 'jstat';

// jstat is CommonJS: its default export is the jStat object.
const { jStat } = jstat;

/**
 * Distribution functions the regression report needs, from jstat. jstat's incomplete beta
 * stops its continued fraction at a relative step of 3e-7, so p values carry about 7-9
 * significant digits (t quantiles about 8): enough for any report, and the tests allow it.
 * Ref: NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.6.6 (t, F, chi-square).
 */

/** Two-sided p value of a t statistic with df degrees of freedom: 2·P(T > |t|). */
export function twoSidedTPValue(t: number, df: number): number {
  if (!Number.isFinite(t)) return Number.isNaN(t) ? NaN : 0;
  // Lower tail of −|t|: 1 − cdf(|t|) would cancel to 0 for small p.
  return Math.min(1, 2 * jStat.studentt.cdf(-Math.abs(t), df));
}

/**
 * Critical value t(1 − α/2; df) for a two-sided interval at `level` (e.g. 0.95).
 * @example tCritical(0.95, 10) // => 2.228138851986274 (NIST table: 2.228)
 */
export function tCritical(level: number, df: number): number {
  if (!(level > 0 && level < 1)) throw new RangeError(`tCritical: level must be between 0 and 1, got ${level}`);
  if (!(df > 0)) throw new RangeError(`tCritical: need positive degrees of freedom, got ${df}`);
  return jStat.studentt.inv(1 - (1 - level) / 2, df);
}

/** Upper-tail p value P(F > f) for F(df1, df2). */
export function fUpperPValue(f: number, df1: number, df2: number): number {
  if (f === Infinity) return 0;
  if (!(f > 0)) return 1;
  // P(F > f) = I_x(df2/2, df1/2), x = df2/(df2 + df1·f): the upper tail without cancellation
  // (Abramowitz & Stegun 26.6.2).
  return jStat.ibeta(df2 / (df2 + df1 * f), df2 / 2, df1 / 2);
}

/** Upper-tail p value P(χ² > x) with df degrees of freedom. */
export function chiSquareUpperPValue(x: number, df: number): number {
  if (!(x > 0)) return 1;
  return Math.max(0, 1 - jStat.chisquare.cdf(x, df));
}
