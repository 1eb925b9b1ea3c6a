import { describe, expect, it } from 'vitest';
import { CAUTION_TEXT, CAUTION_TITLE } from '../../src/domain/cautions.js';
import type { SavedEstimate } from '../../src/domain/saved-estimate.js';
import { buildWorksheet, CAUTION_LINE } from '../../src/worksheet/worksheet-model.js';
import { worksheetPdf } from '../../src/worksheet/worksheet-pdf.js';
import { makeSubject, syntheticSales } from '../helpers/sales.js';
import { DEMO_MODEL, savedEstimate } from './demo-snapshot.js';
import { pageObjects, pdfPages, squash } from './pdf-pages.js';

const render = (saved: SavedEstimate) => worksheetPdf(buildWorksheet(saved));
/** The figure as the Result JSON rounds to whole currency units, formatted independently of the worksheet code. */
const money = (x: number, currency = 'USD') =>
  new Intl.NumberFormat('en-US', { style: 'currency', currency, maximumFractionDigits: 0, minimumFractionDigits: 0 }).format(Math.round(x));

describe('worksheet PDF of the demo estimate', async () => {
  const saved = savedEstimate();
  const pdf = await render(saved);
  const pages = pdfPages(pdf);
  const all = pages.join(' ');
  const r = saved.result;

  it('is a PDF of a sane number of A4 pages, each with text', () => {
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    expect(pages.length).toBe(pageObjects(pdf));
    expect(pages.length).toBeGreaterThanOrEqual(5);
    expect(pages.length).toBeLessThanOrEqual(12);
    expect(pdf.toString('latin1')).toContain('/MediaBox [0 0 595.28 841.89]');
    for (const p of pages) expect(p.length).toBeGreaterThan(200);
  });

  it('carries the caution line and "Page x of y" on every page, and the caution box on page one', () => {
    pages.forEach((p, i) => {
      expect(p).toContain(squash(CAUTION_LINE));
      expect(p).toContain(`Page ${i + 1} of ${pages.length}`);
    });
    expect(pages[0]).toContain(CAUTION_TITLE);
    expect(pages[0]).toContain(squash(CAUTION_TEXT));
    expect(CAUTION_LINE).toMatch(/not an appraisal/);
    expect(CAUTION_LINE).toMatch(/licensed or certified appraiser/);
    expect(CAUTION_LINE).toMatch(/USPAP and state licensing law/);
  });

  it('has the title block: market, subject, effective date, prepared by, saved time, version, estimate id', () => {
    const p = pages[0];
    expect(p).toMatch(/^Estimate worksheet 27 Wicker Lane, Brindlewick/);
    for (const s of ['Brindlewick – Tansy Row', '2024-12-16', 'Avery Demo', '2024-12-16 15:04 UTC', 'compfit 0.1.0', 'Estimate id', 'USD; areas in sq ft'])
      expect(p).toContain(s);
    expect(p).toMatch(/Estimate id (\S+ )*17\b/);
  });

  it('states the value and both intervals exactly as rounded from the Result JSON, on page one', () => {
    const e = r.estimate;
    expect(money(e.value)).toBe('$335,750');
    expect(pages[0]).toContain(`Value ${money(e.value)}`);
    expect(pages[0]).toContain(`${money(e.prediction[0])} to ${money(e.prediction[1])}`);
    expect(pages[0]).toContain(`${money(e.confidence[0])} to ${money(e.confidence[1])}`);
    expect(pages[0]).toContain('95 % prediction interval');
    expect(pages[0]).toContain('95 % confidence interval');
  });

  it('puts every warning in words', () => {
    expect(r.warnings.length).toBeGreaterThan(3);
    for (const w of r.warnings) expect(all).toContain(squash(w.message));
  });

  it('has the subject, the model with the sales left out and their reasons, and the coefficients', () => {
    expect(all).toContain('Living area 1,850 sq ft');
    expect(all).toContain('Year built 1994');
    for (const s of r.sales.filter((d) => !d.used)) expect(all).toContain(squash(s.excludedReason!));
    expect(all).toMatch(/Sales used \(n\) (\S+ ){0,12}56/);
    for (const heading of ['Coefficient', 'Standardized', 'VIF', 'Meaning', 'Leave-one-out ratio study', 'COD', 'PRD', 'PRB', 'Predicted R²'])
      expect(all).toContain(heading);
    const area = r.coefficients.find((c) => c.term === 'living_area')!;
    expect(all).toContain(`$${area.estimate.toFixed(2)}`); // four significant digits: $88.71
    expect(all).toContain(area.vif!.toFixed(2));
  });

  it('lists every sale used in the grid, the sales table and the diagnostics, with flags', () => {
    for (const d of r.sales.filter((s) => s.used)) {
      const occurrences = all.split(new RegExp(`\\b${d.id}\\b`)).length - 1;
      expect(occurrences, d.id).toBeGreaterThanOrEqual(3);
    }
    expect(all).toContain('high-leverage, influential, very-influential');
    expect(all).toContain('Adjustment grid (continued)');
    expect(all).toContain('Method and sources');
    expect(all).toContain('y0 ± t·s·sqrt(1 + h0)');
    expect(all).not.toContain('Log price'); // that paragraph is for log models only
  });

  it('draws the pictures as vector graphics with their tick labels (no images)', () => {
    expect(all).toContain('Sale price against living area');
    expect(all).toContain('Residuals against fitted values');
    expect(all).toContain('Estimate with its intervals');
    expect(all).toMatch(/\$300K/);
    expect(pdf.toString('latin1')).not.toContain('/Subtype /Image');
  });
});

describe('worksheet PDF bytes', () => {
  it('are identical for the same saved estimate, also after a round trip through JSON as stored', async () => {
    const saved = savedEstimate();
    const a = await render(saved);
    const b = await render(JSON.parse(JSON.stringify(saved)) as SavedEstimate);
    expect(b.equals(a)).toBe(true);
  });

  it('take their dates and file ID from the save time, not the clock', async () => {
    const saved = savedEstimate();
    const a = (await render(saved)).toString('latin1');
    // The info dictionary's CreationDate and ModDate (indirect objects) hold the save time.
    expect(a.split('(D:20241216150405Z)').length - 1).toBe(2);
    const later = (await render({ ...saved, createdAt: '2025-01-02T03:04:05.000Z' })).toString('latin1');
    expect(later.split('(D:20250102030405Z)').length - 1).toBe(2);
    const id = (s: string) => /\/ID \[<([0-9a-f]+)>/.exec(s)?.[1];
    expect(id(a)).toMatch(/^[0-9a-f]{32}$/);
    expect(id(later)).not.toBe(id(a));
  });

  it('show the saved result, not a recomputation: a snapshot is reproduced as it was saved', async () => {
    const saved = savedEstimate();
    const altered = structuredClone(saved);
    altered.result.estimate.value = 123_456.4;
    const text = pdfPages(await render(altered)).join(' ');
    expect(text).toContain('Value $123,456');
  });
});

describe('worksheet PDF variants', () => {
  it('log model: the median and smearing factor, log-scale notes and the log paragraph', async () => {
    const saved = savedEstimate({ model: { ...DEMO_MODEL, transform: 'log', level: 0.9 } });
    const e = saved.result.estimate;
    const all = pdfPages(await render(saved)).join(' ');
    expect(all).toContain(`Value ${money(e.value)}`);
    expect(all).toContain(`Median (exp of the fit) ${money(e.median)}`);
    expect(all).toContain(e.smearingFactor.toFixed(4));
    expect(all).toContain(`90 % prediction interval (one sale of the subject)`);
    expect(all).toContain(`${money(e.prediction[0])} to ${money(e.prediction[1])}`);
    expect(all).toMatch(/% more per sq ft/);
    expect(all).toContain('Log price');
    expect(all).toContain("Duan's smearing factor");
  });

  it('a market in euros and square metres shows € and m²', async () => {
    const saved = savedEstimate({ market: { currency: 'EUR', areaUnit: 'm2' } });
    const all = pdfPages(await render(saved)).join(' ');
    expect(all).toContain(`Value ${money(saved.result.estimate.value, 'EUR')}`);
    expect(all).toMatch(/€335,750/);
    expect(all).toContain('Living area 1,850 m²');
    expect(all).toContain('per m²');
  });

  it('a currency sign the standard fonts lack is written as its code', async () => {
    const saved = savedEstimate({ market: { currency: 'INR' } });
    const all = pdfPages(await render(saved)).join(' ');
    expect(all).toContain('Value INR 335,750');
    expect(all).not.toContain('₹');
    expect(all).not.toMatch(/\?335,750/);
  });

  it('an estimate without warnings says so', async () => {
    const saved = savedEstimate();
    saved.result.warnings = [];
    const all = pdfPages(await render(saved)).join(' ');
    expect(all).toContain('No warnings: no check on the model, the sales or the subject raised a concern.');
  });

  it('rejects a snapshot whose save time is not a timestamp', async () => {
    const saved = { ...savedEstimate(), createdAt: 'yesterday' };
    expect(() => worksheetPdf(buildWorksheet(saved))).toThrow(/createdAt "yesterday" is not a timestamp/);
  });
});

describe('worksheet PDF of 300 sales', async () => {
  const sales = syntheticSales(300, 5);
  const subject = { ...makeSubject({ living_area: 1800, year_built: 1990, rooms: 6, bathrooms: 2 }), address: '9 Long Table Road' };
  const saved = savedEstimate({ sales, subject, model: { predictors: ['living_area', 'age', 'rooms', 'bathrooms'], transform: 'none', level: 0.95 } });
  const pdf = await render(saved);
  const pages = pdfPages(pdf);

  it('runs the long tables over pages with the header row repeated on each', () => {
    expect(saved.result.n).toBe(300);
    expect(pages.length).toBe(pageObjects(pdf));
    expect(pages.length).toBeGreaterThan(12);
    expect(pages.length).toBeLessThan(40);
    const continued = (heading: string) => pages.filter((p) => p.includes(`${heading} (continued)`));
    expect(continued('Adjustment grid').length).toBeGreaterThanOrEqual(3);
    for (const p of continued('Adjustment grid')) expect(p).toMatch(/\(continued\) Sale Sale price Living area .*Adjusted Net Gross Flag/);
    expect(continued('Diagnostics of the sales used').length).toBeGreaterThanOrEqual(3);
    for (const p of continued('Diagnostics of the sales used')) expect(p).toContain('Leverage Studentized');
    expect(continued('Sales used').length).toBeGreaterThanOrEqual(3);
  });

  it('lists every one of the 300 sales in the grid, the sales table and the diagnostics', () => {
    const all = pages.join(' ');
    // Each id once per table (more for flagged sales, named in warnings and pictures); the
    // generated addresses ("T1 Test Lane") repeat the id, so those are not counted.
    const flagged = new Set(saved.result.sales.filter((d) => d.flags.length > 0).map((d) => d.id));
    for (const s of sales) {
      const count = all.split(new RegExp(`\\b${s.id}\\b(?! Test Lane)`)).length - 1;
      if (flagged.has(s.id)) expect(count, s.id).toBeGreaterThanOrEqual(3);
      else expect(count, s.id).toBe(3);
    }
  });

  it('keeps the caution and page number on every page', () => {
    pages.forEach((p, i) => {
      expect(p).toContain(squash(CAUTION_LINE));
      expect(p).toContain(`Page ${i + 1} of ${pages.length}`);
    });
  });
});
