import { describe, expect, it } from 'vitest';
import type { WorksheetTable } from '../../src/worksheet/worksheet-model.js';
import { buildWorksheet } from '../../src/worksheet/worksheet-model.js';
import { DEMO_MODEL, savedEstimate } from './demo-snapshot.js';

const saved = savedEstimate();
const ws = buildWorksheet(saved);
const tables = ws.sections.flatMap((s) => s.blocks.flatMap((b) => (b.kind === 'table' ? [b.table] : [])));
const byId = (id: string) => tables.find((t) => t.id === id) as WorksheetTable;

describe('worksheet model of a saved estimate', () => {
  it('has the sections in reading order', () => {
    expect(ws.sections.map((s) => s.id)).toEqual(['estimate', 'warnings', 'subject', 'model', 'coefficients', 'fit', 'pictures', 'adjustment-grid', 'sales', 'method']);
    expect(ws.titleFields.map((f) => f.label)).toEqual([
      'Market',
      'Subject',
      'Effective date',
      'Prepared by',
      'Estimate saved',
      'Generated',
      'App version',
      'Estimate id',
      'Currency and area unit',
    ]);
  });

  it('gives every table row one cell per column', () => {
    expect(tables.length).toBeGreaterThanOrEqual(7);
    for (const t of tables) for (const row of t.rows) expect(row.length, t.id).toBe(t.columns.length);
  });

  it('has a row per sale used in the grid, the sales table and the diagnostics, and the sales left out with reasons', () => {
    const n = saved.result.n;
    expect(n).toBe(56);
    expect(byId('adjustment-grid').rows).toHaveLength(n);
    expect(byId('sales-used').rows).toHaveLength(n);
    expect(byId('diagnostics').rows).toHaveLength(n);
    const left = byId('sales-left-out').rows;
    expect(left.map((r) => r[0].text)).toEqual(['TR-013', 'TR-034', 'TR-059', 'TR-060']);
    expect(left[0][4].text).toBe('missing rooms');
    expect(left[3][4].text).toBe('excluded: Lender-owned sale after foreclosure.');
  });

  it('computes each diagnostics ratio as the leave-one-out prediction over the sale price', () => {
    const diag = byId('diagnostics');
    const ratioCol = diag.columns.findIndex((c) => c.heading === 'Ratio');
    for (const d of saved.result.sales.filter((s) => s.used)) {
      const row = diag.rows.find((r) => r[0].text === d.id)!;
      const price = saved.sales.find((s) => s.id === d.id)!.salePrice;
      expect(row[ratioCol].value).toBe(Math.round((d.looPrediction! / price) * 1000) / 1000);
    }
  });

  it('flags large adjustments in the grid exactly where net or gross passes 15 % or 25 %', () => {
    const grid = byId('adjustment-grid');
    saved.result.grid.forEach((g, i) => {
      expect(grid.rows[i][0].text).toBe(g.id);
      expect(grid.rows[i].at(-1)!.text).toBe(Math.abs(g.netPercent) > 15 || g.grossPercent > 25 ? 'large' : '');
    });
    // No transform: a row's adjustments add up to its adjusted price (to rounding).
    const k = saved.result.predictors.length;
    for (const row of grid.rows) {
      const sum = row.slice(2, 2 + k).reduce((s, c) => s + c.value!, 0);
      expect(Math.abs(row[1].value! + sum - row[2 + k].value!)).toBeLessThanOrEqual(k);
    }
  });

  it('keeps every number a cell shows equal to its text', () => {
    for (const t of tables)
      for (const row of t.rows)
        for (const cell of row) {
          if (cell.value === undefined) continue;
          const digits = cell.text.replace(/[^0-9.e+\-]/g, '');
          expect(Number(digits), `${t.id}: ${cell.text}`).toBe(cell.value);
        }
  });

  it('log model: coefficients on the log scale with their price meaning', () => {
    const log = buildWorksheet(savedEstimate({ model: { ...DEMO_MODEL, transform: 'log' } }));
    const coef = log.sections.find((s) => s.id === 'coefficients')!.blocks[0];
    if (coef.kind !== 'table') throw new Error('coefficients must be a table');
    const area = coef.table.rows.find((r) => r[0].text === 'Living area (sq ft)')!;
    expect(area[1].text).toMatch(/^0\.000\d{4}$/);
    expect(area.at(-1)!.text).toMatch(/^0\.0\d+ % more per sq ft$/);
    const age = coef.table.rows.find((r) => r[0].text === 'Age (years)')!;
    expect(age.at(-1)!.text).toMatch(/% less per year of age$/);
    expect(log.sections.find((s) => s.id === 'method')!.blocks[0]).toMatchObject({ kind: 'paragraphs' });
  });

  it('formats prices in the market currency and areas in its unit', () => {
    const m2 = buildWorksheet(savedEstimate({ market: { currency: 'EUR', areaUnit: 'm2' } }));
    const fields = m2.sections[0].blocks[0];
    if (fields.kind !== 'fields') throw new Error('estimate fields first');
    expect(fields.fields[0].cells[0].text).toBe('€335,750');
    const subject = m2.sections.find((s) => s.id === 'subject')!.blocks[0];
    if (subject.kind !== 'fields') throw new Error('subject fields');
    expect(subject.fields.find((f) => f.label === 'Living area')!.cells[0].text).toBe('1,850 m²');
  });
});
