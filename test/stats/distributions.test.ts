import { describe, expect, it } from 'vitest';
import { chiSquareUpperPValue, fUpperPValue, tCritical, twoSidedTPValue } from '../../src/stats/distributions.js';

// Two-sided Student t critical values, NIST/SEMATECH e-Handbook §1.3.6.7.2 (three decimals),
// as recorded in reference/TRADE-FACTS.md §11.
const T_TABLE: [number, number, number, number][] = [
  [2, 2.92, 4.303, 9.925],
  [3, 2.353, 3.182, 5.841],
  [4, 2.132, 2.776, 4.604],
  [5, 2.015, 2.571, 4.032],
  [10, 1.812, 2.228, 3.169],
  [20, 1.725, 2.086, 2.845],
  [30, 1.697, 2.042, 2.75],
  [40, 1.684, 2.021, 2.704],
  [60, 1.671, 2.0, 2.66],
  [100, 1.66, 1.984, 2.626],
];

describe('tCritical against the NIST handbook t table', () => {
  for (const [df, t90, t95, t99] of T_TABLE)
    it(`df ${df}`, () => {
      expect(tCritical(0.9, df)).toBeCloseTo(t90, 3);
      expect(tCritical(0.95, df)).toBeCloseTo(t95, 3);
      expect(tCritical(0.99, df)).toBeCloseTo(t99, 3);
    });
  it('tends to the normal quantile 1.960 for very large df (handbook row "infinity")', () => {
    expect(tCritical(0.95, 1e7)).toBeCloseTo(1.96, 3);
  });
  it('rejects a level outside (0, 1)', () => {
    expect(() => tCritical(1.2, 10)).toThrow(/level/);
  });
});

describe('p values', () => {
  it('two-sided t: R 4.2 `2*pt(-2.5, 20)` = 0.021233545439132393', () => {
    expect(twoSidedTPValue(2.5, 20)).toBeCloseTo(0.021233545439132393, 9);
  });
  it('keeps tiny t p values instead of rounding them to 0', () => {
    expect(twoSidedTPValue(40, 30)).toBeGreaterThan(0);
  });
  it('F upper tail at the handbook 5 % points (NIST §1.3.6.7.3) is 0.05', () => {
    expect(fUpperPValue(3.708, 3, 10)).toBeCloseTo(0.05, 3);
    expect(fUpperPValue(2.866, 4, 20)).toBeCloseTo(0.05, 3);
    expect(fUpperPValue(6.552, 3, 10)).toBeCloseTo(0.01, 3);
  });
  it('chi-square upper tail at the handbook points (NIST §1.3.6.7.4)', () => {
    expect(chiSquareUpperPValue(5.991, 2)).toBeCloseTo(0.05, 3);
    expect(chiSquareUpperPValue(7.815, 3)).toBeCloseTo(0.05, 3);
    expect(chiSquareUpperPValue(9.21, 2)).toBeCloseTo(0.01, 3);
  });
});
