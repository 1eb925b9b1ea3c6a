/**
 * Reads and writes the sales CSV of DESIGN.md "CSV of sales". Reading is all-or-nothing:
 * every row is validated, and if any row is bad the caller gets every error and no sales.
 */
import { parse } from 'csv-parse/sync';
import { stringify } from 'csv-stringify/sync';
import { CHARACTERISTICS, type Sale } from './sale.js';
import { validateSale, type RawFields } from './validate-sale.js';

export interface RowError {
  /** Data row number, 1 = the first row after the header. */
  row: number;
  /** Column name as in the file's header, or '' for a problem with the whole row. */
  column: string;
  value: string;
  message: string;
}

export type CsvReadResult =
  | { ok: true; sales: Sale[]; notices: string[] }
  | { ok: false; errors: RowError[]; notices: string[] };

const REQUIRED = ['address', 'sale_date', 'sale_price'] as const;
const KNOWN = new Set<string>([
  'id',
  ...REQUIRED,
  ...CHARACTERISTICS,
  'notes',
  'verification',
  'included',
  'excluded_reason',
]);

/** Largest file the reader accepts; a bigger upload is refused before parsing. */
export const MAX_CSV_BYTES = 20 * 1024 * 1024;

/** Formats a row error as one line for people: `row 3, column sale_price: …`. */
export function describeRowError(e: RowError): string {
  return e.row === 0 ? e.message : `row ${e.row}${e.column ? `, column ${e.column}` : ''}: ${e.message}`;
}

export function readSalesCsv(text: string): CsvReadResult {
  const notices: string[] = [];
  if (Buffer.byteLength(text, 'utf8') > MAX_CSV_BYTES)
    return { ok: false, errors: [{ row: 0, column: '', value: '', message: `file is larger than ${MAX_CSV_BYTES / 1024 / 1024} MB` }], notices };

  let records: string[][];
  try {
    records = parse(text.replace(/^\uFEFF/, ''), {
      skip_empty_lines: true,
      relax_column_count: true,
      trim: false,
    }) as string[][];
  } catch (err) {
    const e = err as { lines?: number; message: string };
    const line = e.lines ?? 0;
    return {
      ok: false,
      errors: [{ row: Math.max(line - 1, 0), column: '', value: '', message: `the file is not valid CSV (${e.message})` }],
      notices,
    };
  }
  if (records.length === 0)
    return { ok: false, errors: [{ row: 0, column: '', value: '', message: 'the file is empty: a header row is required' }], notices };

  const header = records[0].map((h) => h.trim().toLowerCase());
  const errors: RowError[] = [];
  const seenColumns = new Map<string, number>();
  header.forEach((h, i) => {
    if (seenColumns.has(h)) errors.push({ row: 0, column: h, value: h, message: `column "${h}" appears twice in the header` });
    seenColumns.set(h, i);
  });
  for (const r of REQUIRED)
    if (!seenColumns.has(r)) errors.push({ row: 0, column: r, value: '', message: `required column "${r}" is missing from the header` });
  const unknown = header.filter((h) => !KNOWN.has(h));
  if (unknown.length > 0) notices.push(`columns not used and left out: ${unknown.map((u) => `"${u}"`).join(', ')}`);
  if (errors.length > 0) return { ok: false, errors, notices };

  const sales: Sale[] = [];
  const ids = new Map<string, number>();
  for (let r = 1; r < records.length; r++) {
    const cells = records[r];
    if (cells.length > header.length)
      errors.push({ row: r, column: '', value: '', message: `has ${cells.length} cells but the header has ${header.length}` });
    const raw: RawFields = {};
    header.forEach((h, i) => {
      if (KNOWN.has(h)) raw[h] = cells[i];
    });
    const v = validateSale(raw);
    if (!v.ok) {
      for (const [column, message] of Object.entries(v.errors))
        errors.push({ row: r, column, value: raw[column] ?? '', message });
      continue;
    }
    const sale = v.value;
    if (sale.id) {
      const first = ids.get(sale.id);
      if (first !== undefined) errors.push({ row: r, column: 'id', value: sale.id, message: `id "${sale.id}" is already used by row ${first}` });
      else ids.set(sale.id, r);
    }
    sales.push(sale);
  }
  if (errors.length > 0) return { ok: false, errors, notices };
  if (sales.length === 0)
    return { ok: false, errors: [{ row: 0, column: '', value: '', message: 'the file has a header but no sales' }], notices };
  return { ok: true, sales, notices };
}

/** The header written on export, in a fixed order; it reads back through readSalesCsv. */
export const CSV_COLUMNS = [
  'id',
  'address',
  'sale_date',
  'sale_price',
  ...CHARACTERISTICS,
  'verification',
  'notes',
  'included',
  'excluded_reason',
] as const;

export function writeSalesCsv(sales: readonly Sale[]): string {
  const rows = sales.map((s) => [
    s.id,
    s.address,
    s.saleDate,
    String(s.salePrice),
    ...CHARACTERISTICS.map((c) => (s.characteristics[c] === undefined ? '' : String(s.characteristics[c]))),
    s.verification ?? '',
    s.notes ?? '',
    s.included ? 'yes' : 'no',
    s.excludedReason ?? '',
  ]);
  return stringify([[...CSV_COLUMNS], ...rows]);
}
