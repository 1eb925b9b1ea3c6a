/**
 * NIST StRD linear regression suite (test/fixtures/nist-strd, public domain): every
 * certified coefficient, standard deviation, residual SD and R² against our QR fit, scored
 * by the log relative error (LRE ≈ correct significant digits; absolute error when the
 * certified value is 0). Required: coefficients ≥ 9 and SEs ≥ 8 digits; Filip ≥ 7.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { fitRegression } from '../../src/stats/regression.js';
import { lre, readNist } from '../helpers/nist.js';

const CASES: { name: string; degree?: number; intercept: boolean; minCoef: number; minSe: number }[] = [
  { name: 'Norris', degree: 1, intercept: true, minCoef: 9, minSe: 8 },
  { name: 'Pontius', degree: 2, intercept: true, minCoef: 9, minSe: 8 },
  { name: 'NoInt1', degree: 1, intercept: false, minCoef: 9, minSe: 8 },
  { name: 'NoInt2', degree: 1, intercept: false, minCoef: 9, minSe: 8 },
  { name: 'Filip', degree: 10, intercept: true, minCoef: 7, minSe: 7 },
  { name: 'Longley', intercept: true, minCoef: 9, minSe: 8 },
  { name: 'Wampler1', degree: 5, intercept: true, minCoef: 9, minSe: 8 },
  { name: 'Wampler2', degree: 5, intercept: true, minCoef: 9, minSe: 8 },
  { name: 'Wampler3', degree: 5, intercept: true, minCoef: 9, minSe: 8 },
  { name: 'Wampler4', degree: 5, intercept: true, minCoef: 9, minSe: 8 },
  { name: 'Wampler5', degree: 5, intercept: true, minCoef: 9, minSe: 8 },
];

const table: string[] = [];

describe('NIST StRD certified values', () => {
  for (const c of CASES) {
    it(`${c.name}: coefficients LRE ≥ ${c.minCoef}, standard deviations LRE ≥ ${c.minSe}`, () => {
      const data = readNist(c.name);
      const columns: Float64Array[] = [];
      if (c.intercept) columns.push(new Float64Array(data.y.length).fill(1));
      if (c.degree) for (let k = 1; k <= c.degree; k++) columns.push(Float64Array.from(data.x, (row) => row[0] ** k));
      else for (let j = 0; j < data.x[0].length; j++) columns.push(Float64Array.from(data.x, (row) => row[j]));
      const names = columns.map((_, j) => `B${j}`);
      const fit = fitRegression(columns, data.y, names);

      const coefLre = fit.coefficients.map((b, j) => lre(b.estimate, data.certified.estimates[j]));
      const seLre = fit.coefficients.map((b, j) => lre(b.stdError, data.certified.stdDevs[j]));
      const sdLre = lre(fit.ls.sigma, data.certified.residualSd);
      const r2Lre = lre(fit.rSquared, data.certified.rSquared);
      table.push(
        `${c.name.padEnd(9)} coef ${Math.min(...coefLre).toFixed(1).padStart(5)}  se ${Math.min(...seLre).toFixed(1).padStart(5)}  resid sd ${sdLre.toFixed(1).padStart(5)}  R² ${r2Lre.toFixed(1).padStart(5)}`,
      );
      expect(fit.coefficients).toHaveLength(data.certified.estimates.length);
      expect(Math.min(...coefLre)).toBeGreaterThanOrEqual(c.minCoef);
      expect(Math.min(...seLre)).toBeGreaterThanOrEqual(c.minSe);
      expect(sdLre).toBeGreaterThanOrEqual(c.minSe);
      expect(r2Lre).toBeGreaterThanOrEqual(c.minSe);
    });
  }
  afterAll(() => {
    console.log(`NIST StRD log relative errors (minimum over parameters; 15 = full agreement)\n${table.join('\n')}`);
  });
});
