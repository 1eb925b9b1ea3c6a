/**
 * The worksheet as CSV for a spreadsheet: one table per block, separated by a blank line;
 * every row starts with the name of its section, every table with its own header row.
 * Figures are written as their rounded numbers (units in the headings or a unit column),
 * so a spreadsheet can compute with them; the pictures appear as their descriptions.
 * UTF-8 with a byte-order mark and CRLF line ends, which spreadsheets open without asking.
 */
import { stringify } from 'csv-stringify/sync';
import type { Cell } from './worksheet-cells.js';
import type { Block, Column, Field, Worksheet, WorksheetTable } from './worksheet-model.js';

type Row = (string | number)[];

/**
 * Text a spreadsheet would run as a formula (=, +, -, @, tab, CR first) gets a leading
 * apostrophe (OWASP "CSV injection"): addresses and notes are typed by users.
 */
export function guardText(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

function cellValue(cell: Cell): string | number {
  return cell.value !== undefined ? cell.value : guardText(cell.text);
}

function heading(c: Column): string {
  return c.unit ? `${c.heading} (${c.unit})` : c.heading;
}

/** A field as rows of `section, item, value, unit`; a range becomes a low and a high row. */
function fieldRows(section: string, f: Field): Row[] {
  const row = (label: string, cell: Cell): Row => [section, label, cellValue(cell), cell.value !== undefined ? (cell.unit ?? '') : ''];
  if (f.cells.length === 2) return [row(`${f.label} (low)`, f.cells[0]), row(`${f.label} (high)`, f.cells[1])];
  return [row(f.label, f.cells[0] ?? { text: '' })];
}

function fieldsTable(section: string, fields: Field[]): Row[] {
  return [['section', 'item', 'value', 'unit'], ...fields.flatMap((f) => fieldRows(section, f))];
}

function tableRows(t: WorksheetTable): Row[] {
  const rows: Row[] = [['section', ...t.columns.map(heading)]];
  if (t.rows.length === 0 && t.empty) rows.push([t.heading, t.empty]);
  for (const r of t.rows) rows.push([t.heading, ...r.map(cellValue)]);
  if (t.note) rows.push([t.heading, `Note: ${t.note}`]);
  return rows;
}

function blockRows(section: string, block: Block): Row[] {
  switch (block.kind) {
    case 'fields':
      return fieldsTable(block.heading ?? section, block.fields);
    case 'table':
      return tableRows(block.table);
    case 'paragraphs':
      return [['section', 'topic', 'text'], ...block.paragraphs.map((p) => [section, guardText(p.heading ?? ''), guardText(p.text)])];
    case 'interval':
      return [['section', 'picture', 'description'], [section, block.view.picture.title, block.view.picture.description]];
    case 'charts':
      return [['section', 'picture', 'description'], ...block.charts.map((c) => [section, c.chart.title, c.chart.description])];
  }
}

const toCsv = (rows: Row[]) => stringify(rows, { record_delimiter: 'windows', quoted_match: /^\s|\s$/ });

export function worksheetCsv(ws: Worksheet): string {
  const head: Row[] = [
    ...fieldsTable('Worksheet', [{ label: 'Title', cells: [{ text: ws.title }] }, ...ws.titleFields]),
    ['Caution', ws.caution.title, ws.caution.text, ''],
  ];
  const tables = [toCsv(head)];
  for (const section of ws.sections) for (const block of section.blocks) tables.push(toCsv(blockRows(section.heading, block)));
  return '\uFEFF' + tables.join('\r\n');
}
