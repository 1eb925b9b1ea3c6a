/**
 * Properties that must hold for any sales (fast-check): invariance of predictions under
 * rescaling and shifting a predictor, the grid's built-in check, a sale on the fitted plane
 * changing nothing, and the ordering of intervals.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { runEstimate } from '../../src/domain/estimate.js';
import { validateModel, type ModelSpec } from '../../src/domain/model.js';
import type { Sale } from '../../src/domain/sale.js';
import { makeSale, makeSubject } from '../helpers/sales.js';

const model = (predictors: string[], level = 0.95): ModelSpec => {
  const m = validateModel({ predictors, level });
  if (!m.ok) throw new Error(m.errors.join());
  return m.value;
};

/** 12-40 sales with living_area, lot_area and rooms, price linear plus noise. */
const salesArb = fc
  .array(
    fc.record({
      area: fc.integer({ min: 800, max: 3000 }),
      lot: fc.integer({ min: 2000, max: 20000 }),
      rooms: fc.integer({ min: 3, max: 10 }),
      noise: fc.double({ min: -20000, max: 20000, noNaN: true }),
    }),
    { minLength: 12, maxLength: 40 },
  )
  .filter((rows) => new Set(rows.map((r) => r.area)).size > 3 && new Set(rows.map((r) => r.rooms)).size > 2 && new Set(rows.map((r) => r.lot)).size > 3)
  .map((rows) =>
    rows.map((r, i) =>
      makeSale(`P${i}`, 50000 + 100 * r.area + 2 * r.lot + 3000 * r.rooms + r.noise, { living_area: r.area, lot_area: r.lot, rooms: r.rooms }),
    ),
  );

const subject = makeSubject({ living_area: 1700, lot_area: 8000, rooms: 6 });
const relClose = (a: number, b: number, tol = 1e-7) => Math.abs(a - b) <= tol * Math.max(1, Math.abs(a), Math.abs(b));

describe('estimate properties', () => {
  it('rescaling and shifting lot_area leaves the estimate and intervals unchanged', () => {
    fc.assert(
      fc.property(salesArb, fc.double({ min: 0.01, max: 100, noNaN: true }), fc.integer({ min: 1, max: 50000 }), (sales, factor, shift) => {
        const m = model(['living_area', 'lot_area', 'rooms']);
        const a = runEstimate(sales, subject, m);
        const moved = (s: Sale): Sale => ({ ...s, characteristics: { ...s.characteristics, lot_area: s.characteristics.lot_area! * factor + shift } });
        const b = runEstimate(sales.map(moved), makeSubject({ ...subject.characteristics, lot_area: 8000 * factor + shift }), m);
        expect(relClose(a.estimate.value, b.estimate.value)).toBe(true);
        expect(relClose(a.estimate.prediction[0], b.estimate.prediction[0])).toBe(true);
        expect(relClose(a.estimate.leverage, b.estimate.leverage, 1e-6)).toBe(true);
      }),
      { numRuns: 60 },
    );
  });

  it('with no transform, the mean adjusted price over all sales used equals the estimate', () => {
    fc.assert(
      fc.property(salesArb, (sales) => {
        const r = runEstimate(sales, subject, model(['living_area', 'lot_area', 'rooms']));
        const mean = r.grid.reduce((s, g) => s + g.adjustedPrice, 0) / r.grid.length;
        expect(relClose(mean, r.estimate.value, 1e-9)).toBe(true);
      }),
      { numRuns: 60 },
    );
  });

  it('a sale added exactly on the fitted plane leaves the coefficients unchanged', () => {
    fc.assert(
      fc.property(salesArb, fc.integer({ min: 900, max: 2900 }), fc.integer({ min: 3, max: 10 }), (sales, area, rooms) => {
        const m = model(['living_area', 'rooms']);
        const r = runEstimate(sales, subject, m);
        const [b0, b1, b2] = r.coefficients.map((c) => c.estimate);
        const onPlane = makeSale('ON', b0 + b1 * area + b2 * rooms, { living_area: area, rooms });
        const r2 = runEstimate([...sales, onPlane], subject, m);
        r2.coefficients.forEach((c, j) => expect(relClose(c.estimate, r.coefficients[j].estimate, 1e-6)).toBe(true));
      }),
      { numRuns: 60 },
    );
  });

  it('intervals widen with the level, and the prediction interval contains the confidence interval', () => {
    fc.assert(
      fc.property(salesArb, fc.double({ min: 0.5, max: 0.98, noNaN: true }), (sales, level) => {
        const lo = runEstimate(sales, subject, model(['living_area', 'rooms'], level));
        const hi = runEstimate(sales, subject, model(['living_area', 'rooms'], Math.min(0.999, level + 0.01)));
        expect(hi.estimate.prediction[1] - hi.estimate.prediction[0]).toBeGreaterThan(lo.estimate.prediction[1] - lo.estimate.prediction[0]);
        expect(hi.estimate.confidence[1] - hi.estimate.confidence[0]).toBeGreaterThan(lo.estimate.confidence[1] - lo.estimate.confidence[0]);
        expect(lo.estimate.prediction[0]).toBeLessThan(lo.estimate.confidence[0]);
        expect(lo.estimate.prediction[1]).toBeGreaterThan(lo.estimate.confidence[1]);
      }),
      { numRuns: 60 },
    );
  });
});
