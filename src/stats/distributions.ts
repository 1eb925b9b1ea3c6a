import jstat from 'jstat';
import { regularizedIncompleteBeta } from './incomplete-beta.js';

// jstat is CommonJS: its default export is the jStat object.
const { jStat } = jstat;

/**
 * Distribution functions the regression report needs. Tail probabilities come from the
 * regularized incomplete beta function, computed in the tail itself so small p values keep
 * their digits (Abramowitz & Stegun 26.5.27, 26.6.2):
 *   P(|T| > t) = I_{ν/(ν+t²)}(ν/2, 1/2),   P(F > f) = I_{d₂/(d₂+d₁f)}(d₂/2, d₁/2).
 * The chi-square tail uses jstat. Ref: NIST/SEMATECH e-Handbook §1.3.6.6.
 */

/** Two-sided p value of a t statistic with df degrees of freedom: P(|T| > |t|). */
export function twoSidedTPValue(t: number, df: number): number {
  if (Number.isNaN(t)) return NaN;
  if (!Number.isFinite(t)) return 0;
  return regularizedIncompleteBeta(df / (df + t * t), df / 2, 0.5);
}

/** P(T < t) for Student's t with df degrees of freedom. */
export function tCdf(t: number, df: number): number {
  const tail = 0.5 * regularizedIncompleteBeta(df / (df + t * t), df / 2, 0.5);
  return t < 0 ? tail : 1 - tail;
}

/**
 * Critical value t(1 − α/2; df) for a two-sided interval at `level` (e.g. 0.95): jstat's
 * quantile (about 4e-9) polished by Newton steps on the accurate lower tail.
 * @example tCritical(0.95, 10) // => 2.2281388519862744 (R: qt(0.975, 10) = 2.2281388519862739)
 */
export function tCritical(level: number, df: number): number {
  if (!(level > 0 && level < 1)) throw new RangeError(`tCritical: level must be between 0 and 1, got ${level}`);
  if (!(df > 0)) throw new RangeError(`tCritical: need positive degrees of freedom, got ${df}`);
  const tail = (1 - level) / 2;
  let t = jStat.studentt.inv(1 - tail, df);
  for (let i = 0; i < 3; i++) {
    const step = (tCdf(-t, df) - tail) / jStat.studentt.pdf(t, df);
    if (!Number.isFinite(step)) break;
    t += step;
    if (Math.abs(step) < 1e-15 * t) break;
  }
  return t;
}

/** Upper-tail p value P(F > f) for F(df1, df2). */
export function fUpperPValue(f: number, df1: number, df2: number): number {
  if (f === Infinity) return 0;
  if (Number.isNaN(f)) return NaN;
  if (!(f > 0)) return 1;
  return regularizedIncompleteBeta(df2 / (df2 + df1 * f), df2 / 2, df1 / 2);
}

/** Upper-tail p value P(χ² > x) with df degrees of freedom. */
export function chiSquareUpperPValue(x: number, df: number): number {
  if (!(x > 0)) return 1;
  return Math.max(0, 1 - jStat.chisquare.cdf(x, df));
}
