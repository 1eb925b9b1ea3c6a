import { readFileSync } from 'node:fs';
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import type { SavedEstimate } from '../../src/domain/saved-estimate.js';
import { guardText, worksheetCsv } from '../../src/worksheet/worksheet-csv.js';
import { buildWorksheet } from '../../src/worksheet/worksheet-model.js';
import { savedEstimate } from './demo-snapshot.js';

const fixture = (name: string) => new URL(`../fixtures/worksheet/${name}`, import.meta.url);
const snapshot = JSON.parse(readFileSync(fixture('demo-snapshot.json'), 'utf8')) as SavedEstimate;
const csv = worksheetCsv(buildWorksheet(snapshot));
const records = parse(csv.slice(1), { relax_column_count: true, skip_empty_lines: false }) as string[][];
/** The tables of the CSV: runs of records between blank lines. */
const tables: string[][][] = [];
for (const r of records) {
  if (r.length === 1 && r[0] === '') tables.push([]);
  else (tables.at(-1) ?? tables[tables.push([]) - 1]).push(r);
}
const table = (section: string) => tables.find((t) => t[1]?.[0] === section)!;
const item = (section: string, name: string) => tables.flat().find((r) => r[0] === section && r[1] === name);

describe('worksheet CSV', () => {
  it('matches the golden file of the frozen demo snapshot byte for byte', () => {
    expect(csv).toBe(readFileSync(fixture('demo-worksheet.csv'), 'utf8'));
  });

  it('opens cleanly: UTF-8 BOM, CRLF line ends only, tables split by one blank line, each with a header', () => {
    expect(csv.charCodeAt(0)).toBe(0xfeff);
    expect(csv.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/);
    expect(csv).not.toMatch(/\r\n\r\n\r\n/);
    expect(tables.length).toBeGreaterThanOrEqual(12);
    for (const t of tables) {
      expect(t[0][0]).toBe('section');
      for (const row of t.slice(1)) {
        expect(row[0]).not.toBe('');
        expect(row.length).toBeLessThanOrEqual(t[0].length);
      }
    }
  });

  it('writes the value and both intervals as whole currency units rounded from the Result JSON', () => {
    const e = snapshot.result.estimate;
    expect(item('Estimate', 'Value')).toEqual(['Estimate', 'Value', String(Math.round(e.value)), 'USD']);
    expect(Math.round(e.value)).toBe(335750);
    expect(item('Estimate', '95 % prediction interval (one sale of the subject) (low)')?.[2]).toBe(String(Math.round(e.prediction[0])));
    expect(item('Estimate', '95 % prediction interval (one sale of the subject) (high)')?.[2]).toBe(String(Math.round(e.prediction[1])));
    expect(item('Estimate', '95 % confidence interval (mean price of such properties) (low)')?.[2]).toBe(String(Math.round(e.confidence[0])));
    expect(item('Estimate', '95 % confidence interval (mean price of such properties) (high)')?.[2]).toBe(String(Math.round(e.confidence[1])));
  });

  it('has the summary, coefficients, warnings, and every sale with adjustments and diagnostics', () => {
    const r = snapshot.result;
    expect(item('Worksheet', 'Estimate id')?.[2]).toBe('17');
    expect(item('Caution', 'A statistical indication, not an appraisal')?.[2]).toMatch(/not an appraisal.*USPAP/);
    const coefficients = table('Coefficients');
    expect(coefficients[0]).toEqual(['section', 'Term', 'Coefficient (USD)', 'Std error (USD)', 't', 'p', 'Standardized (beta)', 'VIF', 'Meaning']);
    expect(coefficients.filter((row) => row[0] === 'Coefficients' && !row[1].startsWith('Note:'))).toHaveLength(r.coefficients.length);
    const area = coefficients.find((row) => row[1] === 'Living area (sq ft)')!;
    expect(Number(area[2])).toBe(Number(r.coefficients[1].estimate.toPrecision(4)));
    expect(Number(area[7])).toBe(Number(r.coefficients[1].vif!.toFixed(2)));
    expect(table('Warnings').slice(1).map((row) => row[2])).toEqual(r.warnings.map((w) => w.code));
    const grid = table('Adjustment grid');
    expect(grid[0].slice(1, 3)).toEqual(['Sale', 'Sale price (USD)']);
    for (const g of r.grid) {
      const row = grid.find((x) => x[1] === g.id)!;
      expect(Number(row[2])).toBe(g.salePrice);
      expect(Number(row.at(-4))).toBe(Math.round(g.adjustedPrice));
      expect(Number(row.at(-2))).toBe(Math.round(g.grossPercent * 10) / 10);
    }
    const diagnostics = table('Diagnostics of the sales used');
    const flagged = r.sales.filter((s) => s.used && s.flags.length > 0);
    for (const s of flagged) expect(diagnostics.find((x) => x[1] === s.id)?.at(-1)).toBe(s.flags.join(', '));
    expect(table('Sales used').filter((x) => x[0] === 'Sales used' && /^TR-/.test(x[1]))).toHaveLength(r.n);
    expect(table('Sales left out').slice(1).map((x) => x[5])).toEqual(r.sales.filter((s) => !s.used).map((s) => s.excludedReason));
  });

  it('reads the snapshot, not the live sales: the same saved estimate gives the same CSV', () => {
    const again = worksheetCsv(buildWorksheet(JSON.parse(JSON.stringify(snapshot)) as SavedEstimate));
    expect(again).toBe(csv);
  });

  it('keeps text a spreadsheet would run as a formula inert', () => {
    expect(guardText('=HYPERLINK("x")')).toBe('\'=HYPERLINK("x")');
    expect(guardText('+1 555')).toBe("'+1 555");
    expect(guardText('@SUM(A1)')).toBe("'@SUM(A1)");
    expect(guardText('12 Oak Street')).toBe('12 Oak Street');
    const saved = savedEstimate();
    saved.sales[0].address = '=cmd|"/c calc"!A1';
    const text = worksheetCsv(buildWorksheet(saved));
    expect(text).toContain(`"'=cmd|""/c calc""!A1"`);
    expect(text).not.toMatch(/,=cmd/);
  });
});
