/**
 * The valuation layer's own consistency checks and edge cases. Reference numbers against R
 * are in estimate-ames.test.ts; these check identities that must hold for any data.
 */
import { describe, expect, it } from 'vitest';
import { EstimateError, runEstimate } from '../../src/domain/estimate.js';
import { DEFAULT_MODEL, validateModel } from '../../src/domain/model.js';
import { tCritical } from '../../src/stats/distributions.js';
import { makeSale, makeSubject, syntheticSales } from '../helpers/sales.js';

const subject = makeSubject({ living_area: 1800, year_built: 1990, rooms: 6, bathrooms: 2 });

describe('runEstimate', () => {
  const sales = syntheticSales(60, 3);
  const r = runEstimate(sales, subject, DEFAULT_MODEL);

  it('prediction interval matches the hand formula ŷ₀ ± t·s·√(1 + h₀) (TRADE-FACTS.md §1)', () => {
    const t = tCritical(0.95, r.fit.dfResidual);
    const half = t * r.fit.sigma * Math.sqrt(1 + r.estimate.leverage);
    expect(r.estimate.prediction[0]).toBeCloseTo(r.estimate.value - half, 6);
    expect(r.estimate.prediction[1]).toBeCloseTo(r.estimate.value + half, 6);
    const halfCi = t * r.fit.sigma * Math.sqrt(r.estimate.leverage);
    expect(r.estimate.confidence[1] - r.estimate.confidence[0]).toBeCloseTo(2 * halfCi, 6);
  });

  it('mean adjusted price over all sales used equals the estimate (no transform)', () => {
    const mean = r.grid.reduce((s, g) => s + g.adjustedPrice, 0) / r.grid.length;
    expect(mean).toBeCloseTo(r.estimate.value, 6);
  });

  it('age is the year of sale minus year built; the subject age uses the effective date', () => {
    expect(r.estimate.predictorValues.age).toBe(2024 - 1990);
    expect(r.ranges.age.min).toBe(Math.min(...sales.map((s) => 2023 - s.characteristics.year_built!)));
  });

  it('recovers the generating coefficients roughly (110 per sq ft, −700 per year)', () => {
    const area = r.coefficients.find((c) => c.term === 'living_area')!;
    const age = r.coefficients.find((c) => c.term === 'age')!;
    expect(Math.abs(area.estimate - 110)).toBeLessThan(4 * area.stdError);
    expect(Math.abs(age.estimate + 700)).toBeLessThan(4 * age.stdError);
  });

  it('PRESS equals a real leave-one-out refit for one sale', () => {
    const i = 7;
    const without = sales.filter((_, j) => j !== i);
    const row = sales[i];
    const loo = runEstimate(without, makeSubject({ ...row.characteristics }, row.saleDate), DEFAULT_MODEL);
    const diag = r.sales.find((s) => s.id === row.id)!;
    // The subject's age is computed from the effective date's year, the sale's from its sale date: same year here.
    expect(diag.looPrediction).toBeCloseTo(loo.estimate.value, 6);
  });

  it('lists excluded sales and sales missing a predictor with their reasons', () => {
    const extra = [
      { ...makeSale('X1', 300000, { living_area: 1500, year_built: 1980 }), included: true },
      { ...makeSale('X2', 310000, { living_area: 1500, year_built: 1980, rooms: 6 }), included: false, excludedReason: 'family sale' },
    ];
    const r2 = runEstimate([...sales, ...extra], subject, DEFAULT_MODEL);
    expect(r2.n).toBe(60);
    expect(r2.sales.find((s) => s.id === 'X1')).toMatchObject({ used: false, excludedReason: 'missing rooms' });
    expect(r2.sales.find((s) => s.id === 'X2')).toMatchObject({ used: false, excludedReason: 'excluded: family sale' });
    expect(r2.warnings.find((w) => w.code === 'sales-left-out')?.message).toMatch(/2 sales were not used/);
  });
});

describe('warnings', () => {
  const sales = syntheticSales(40, 5);
  it('outside-range names the characteristic, the subject value and the range', () => {
    const r = runEstimate(sales, makeSubject({ living_area: 4000, year_built: 1990, rooms: 8 }), DEFAULT_MODEL);
    const w = r.warnings.find((x) => x.code === 'outside-range');
    expect(w).toMatchObject({ predictor: 'living_area', subjectValue: 4000, severity: 'serious' });
    expect(w!.message).toMatch(/4,000/);
    expect(r.warnings.some((x) => x.code === 'hidden-extrapolation')).toBe(true);
  });
  it('hidden-extrapolation: every value in range, combination unlike any sale', () => {
    const areas = sales.map((s) => s.characteristics.living_area!);
    const rooms = sales.map((s) => s.characteristics.rooms!);
    const r = runEstimate(
      sales,
      makeSubject({ living_area: Math.max(...areas) - 10, year_built: 1990, rooms: Math.min(...rooms) }),
      DEFAULT_MODEL,
    );
    expect(r.warnings.some((x) => x.code === 'outside-range')).toBe(false);
    const w = r.warnings.find((x) => x.code === 'hidden-extrapolation');
    expect(w?.message).toMatch(/within the range/);
    expect(r.estimate.leverage).toBeGreaterThan(r.estimate.maxLeverage);
  });
  it('outlier-sale and influential-sale flag a planted bad sale', () => {
    const bad = [...sales, makeSale('BAD', 900000, { living_area: 1500, year_built: 1980, rooms: 5 }, '2023-06-15')];
    const r = runEstimate(bad, subject, DEFAULT_MODEL);
    expect(r.sales.find((s) => s.id === 'BAD')!.flags).toEqual(expect.arrayContaining(['outlier', 'influential']));
    expect(r.warnings.find((x) => x.code === 'outlier-sale')?.sales).toContain('BAD');
  });
  it('small-sample is serious below 10 sales', () => {
    const r = runEstimate(sales.slice(0, 8), subject, DEFAULT_MODEL);
    expect(r.warnings.find((x) => x.code === 'small-sample')?.severity).toBe('serious');
  });
  it('collinearity: a near copy of living area in lot_area is flagged with its VIF', () => {
    const near = sales.map((s, i) => ({ ...s, characteristics: { ...s.characteristics, lot_area: s.characteristics.living_area! * 2 + (i % 3) } }));
    const model = validateModel({ predictors: ['living_area', 'age', 'lot_area'] });
    if (!model.ok) throw new Error('model');
    const r = runEstimate(near, makeSubject({ living_area: 1800, year_built: 1990, lot_area: 3601 }), model.value);
    const w = r.warnings.filter((x) => x.code === 'collinearity');
    expect(w.some((x) => x.severity === 'serious' && x.predictor === 'lot_area')).toBe(true);
  });
});

describe('models that cannot give a number', () => {
  const sales = syntheticSales(30, 9);
  it('no residual degrees of freedom: names the count and what to do', () => {
    expect(() => runEstimate(sales.slice(0, 4), subject, DEFAULT_MODEL)).toThrow(EstimateError);
    expect(() => runEstimate(sales.slice(0, 4), subject, DEFAULT_MODEL)).toThrow(/only 4 sales .* 4 coefficients .* add sales or drop predictors/);
  });
  it('a single comparable is refused', () => {
    expect(() => runEstimate(sales.slice(0, 1), subject, DEFAULT_MODEL)).toThrow(/only 1 sale can be used/);
  });
  it('a predictor with no variation is named', () => {
    const flat = sales.map((s) => ({ ...s, characteristics: { ...s.characteristics, rooms: 6 } }));
    expect(() => runEstimate(flat, subject, DEFAULT_MODEL)).toThrow(/rooms has no variation .* drop it/);
  });
  it('an exactly collinear pair is named (lot_area = 2 × living_area)', () => {
    const copy = sales.map((s) => ({ ...s, characteristics: { ...s.characteristics, lot_area: s.characteristics.living_area! * 2 } }));
    const model = validateModel({ predictors: ['living_area', 'lot_area'] });
    if (!model.ok) throw new Error('model');
    expect(() => runEstimate(copy, makeSubject({ living_area: 1800, lot_area: 3600 }), model.value)).toThrow(
      /lot_area is an exact linear combination of .*living_area/,
    );
  });
  it('the subject missing a characteristic a predictor needs is named', () => {
    expect(() => runEstimate(sales, makeSubject({ living_area: 1800, rooms: 6 }), DEFAULT_MODEL)).toThrow(/subject has no year_built, which age needs/);
  });
  it('a perfect fit gives zero sigma and a zero-width interval, not a crash', () => {
    const exact = sales.map((s) => ({ ...s, salePrice: 1000 + 100 * s.characteristics.living_area! }));
    const model = validateModel({ predictors: ['living_area', 'rooms'] });
    if (!model.ok) throw new Error('model');
    const r = runEstimate(exact, makeSubject({ living_area: 1800, rooms: 6 }), model.value);
    expect(r.estimate.value).toBeCloseTo(181000, 4);
    expect(r.fit.sigma).toBeLessThan(1e-6);
    expect(r.estimate.prediction[1] - r.estimate.prediction[0]).toBeLessThan(1e-4);
  });
});

describe('validateModel', () => {
  it('rejects unknown and duplicated predictors, a squared term without its base, bad levels', () => {
    const r = validateModel({ predictors: ['living_area', 'pool', 'living_area', 'lot_area'], transform: 'sqrt', level: 1.5 });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors.join('\n')).toMatch(/"pool" is not a predictor/);
    expect(r.errors.join('\n')).toMatch(/"living_area" is listed twice/);
    expect(r.errors.join('\n')).toMatch(/transform: must be none or log/);
    expect(r.errors.join('\n')).toMatch(/level: must be a number between 0 and 1/);
    const sq = validateModel({ predictors: ['living_area^2', 'age'] });
    expect(sq.ok).toBe(false);
  });
  it('orders a squared term right after its base', () => {
    const r = validateModel({ predictors: ['living_area^2', 'age', 'living_area'] });
    expect(r.ok && r.value.predictors).toEqual(['age', 'living_area', 'living_area^2']);
  });
});

describe('estimateCharts', async () => {
  const { estimateCharts, niceAxis } = await import('../../src/domain/estimate-charts.js');
  it('niceAxis covers the data with 1-2-5 steps', () => {
    expect(niceAxis(0.3, 9.2, 5)).toMatchObject({ min: 0, max: 10, ticks: [0, 2, 4, 6, 8, 10] });
    expect(niceAxis(181000, 262000, 4).ticks).toEqual([180000, 200000, 220000, 240000, 260000, 280000]);
  });
  it('draws a strip and a price chart per predictor and one residual chart, subject marked', () => {
    const sales = syntheticSales(30, 4);
    const subject = makeSubject({ living_area: 5000, year_built: 1990, rooms: 6 });
    const r = runEstimate(sales, subject, DEFAULT_MODEL);
    const { charts, interval } = estimateCharts(r, sales, subject, 'sq ft');
    expect(charts.map((c) => c.id)).toEqual(['strip-living_area', 'price-living_area', 'strip-age', 'price-age', 'strip-rooms', 'price-rooms', 'residuals']);
    expect(charts[0].subject).toEqual({ x: 5000, outside: true });
    expect(charts[0].x.max).toBeGreaterThanOrEqual(5000);
    expect(charts[0].description).toMatch(/outside that range/);
    expect(charts[6].points).toHaveLength(30);
    expect(interval.prediction).toEqual(r.estimate.prediction);
  });
});

describe('market-conditions note', () => {
  it('cautions when the sales span more than a year and months_since_sale is not in the model', () => {
    const sales = syntheticSales(30, 21).map((s, i) => ({ ...s, saleDate: i % 2 ? '2022-03-15' : '2023-09-15' }));
    const subject = makeSubject({ living_area: 1800, year_built: 1990, rooms: 6 }, '2023-12-01');
    const r = runEstimate(sales, subject, DEFAULT_MODEL);
    const w = r.warnings.find((x) => x.code === 'market-conditions');
    expect(w).toMatchObject({ severity: 'caution', firstSale: '2022-03-15', lastSale: '2023-09-15' });
    expect(w!.message).toMatch(/span 18 months/);
    const withTime = validateModel({ predictors: ['living_area', 'age', 'rooms', 'months_since_sale'] });
    if (!withTime.ok) throw new Error('model');
    expect(runEstimate(sales, subject, withTime.value).warnings.some((x) => x.code === 'market-conditions')).toBe(false);
    const recent = sales.map((s) => ({ ...s, saleDate: '2023-09-15' }));
    expect(runEstimate(recent, subject, DEFAULT_MODEL).warnings.some((x) => x.code === 'market-conditions')).toBe(false);
  });
});
