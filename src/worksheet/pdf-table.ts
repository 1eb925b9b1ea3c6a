/**
 * Draws a worksheet table: column widths from the content, long text wrapped, a table too
 * wide for the page set in a smaller type, and the header row repeated on every page the
 * table runs onto.
 */
import type { WorksheetTable } from './worksheet-model.js';
import { COLOR, FONT, SIZE, type PdfCursor } from './pdf-page.js';

const PAD = 3;
const MIN_SIZE = 5;
/** A wrapping column never asks for more than this on its own. */
const MAX_WRAP_WIDTH = 230;

interface Layout {
  size: number;
  widths: number[];
  headerLines: string[][];
  headerHeight: number;
  lineHeight: number;
}

function longestWord(c: PdfCursor, text: string): number {
  let w = 0;
  for (const word of text.split(' ')) w = Math.max(w, c.widthOfString(word));
  return w;
}

/** Widths at one type size: natural widths, then wrap columns give way, then shrink the type. */
function layout(c: PdfCursor, t: WorksheetTable, texts: string[][], headings: string[]): Layout {
  let size: number = SIZE.table;
  let widths: number[] = [];
  for (let attempt = 0; attempt < 4; attempt++) {
    c.font(FONT.regular, size);
    const natural = t.columns.map((col, j) => {
      let w = 0;
      for (const row of texts) {
        const cell = row[j];
        if (cell) w = Math.max(w, col.wrap ? Math.min(MAX_WRAP_WIDTH, c.widthOfString(cell)) : c.widthOfString(cell));
      }
      return w;
    });
    const minimum = t.columns.map((col, j) => {
      let w = 0;
      if (col.wrap) for (const row of texts) if (row[j]) w = Math.max(w, Math.min(60, longestWord(c, row[j])));
      return col.wrap ? w : natural[j];
    });
    c.font(FONT.bold, size);
    const headingWidth = headings.map((h) => longestWord(c, h));
    widths = t.columns.map((_, j) => Math.max(natural[j], headingWidth[j]) + 2 * PAD);
    const floor = t.columns.map((_, j) => Math.max(minimum[j], headingWidth[j]) + 2 * PAD);
    let total = widths.reduce((a, b) => a + b, 0);
    const wrapCols = t.columns.map((col, j) => (col.wrap ? j : -1)).filter((j) => j >= 0);
    if (total <= c.width) {
      // Spare room goes to the wrapping columns (fewer lines), otherwise to every column.
      const takers = wrapCols.length > 0 ? wrapCols : t.columns.map((_, j) => j);
      const spare = (c.width - total) / takers.length;
      for (const j of takers) widths[j] += spare;
      break;
    }
    // Too wide: wrapping columns give up room down to their longest word.
    const give = wrapCols.reduce((s, j) => s + (widths[j] - floor[j]), 0);
    const excess = total - c.width;
    if (give >= excess) {
      const share = excess / give;
      for (const j of wrapCols) widths[j] -= (widths[j] - floor[j]) * share;
      break;
    }
    for (const j of wrapCols) widths[j] = floor[j];
    total = widths.reduce((a, b) => a + b, 0);
    if (size <= MIN_SIZE) {
      const scale = c.width / total;
      widths = widths.map((w) => w * scale);
      break;
    }
    size = Math.max(MIN_SIZE, (size * c.width) / total - 0.05);
  }
  c.font(FONT.bold, size);
  const headerLines = headings.map((h, j) => c.lines(h, widths[j] - 2 * PAD));
  const lineHeight = size * 1.25;
  const headerHeight = Math.max(...headerLines.map((l) => l.length)) * lineHeight + 2 * PAD;
  return { size, widths, headerLines, headerHeight, lineHeight };
}

function drawHeader(c: PdfCursor, t: WorksheetTable, l: Layout): void {
  const doc = c.doc;
  doc.save().rect(c.left, c.y, c.width, l.headerHeight).fill(COLOR.headerFill).restore();
  c.use(FONT.bold, l.size);
  let x = c.left;
  t.columns.forEach((col, j) => {
    l.headerLines[j].forEach((line, i) => c.line(line, x + PAD, c.y + PAD + i * l.lineHeight, l.widths[j] - 2 * PAD, col.align));
    x += l.widths[j];
  });
  c.y += l.headerHeight;
  c.rule(c.y, COLOR.rule, 0.5);
}

/** Draws the table's heading (unless the section already says it), the table and its note. */
export function drawTable(c: PdfCursor, t: WorksheetTable, options: { showHeading: boolean }): void {
  const doc = c.doc;
  const heading = c.clean(t.heading);
  const headingHeight = options.showHeading ? SIZE.subheading * 1.6 : 0;
  const writeHeading = (continued: boolean) => {
    if (!options.showHeading && !continued) return;
    c.use(FONT.bold, SIZE.subheading);
    c.line(continued ? `${heading} (continued)` : heading, c.left, c.y, c.width);
    c.y += SIZE.subheading * 1.6;
  };
  if (t.rows.length === 0) {
    c.ensure(headingHeight + SIZE.body * 2);
    writeHeading(false);
    c.paragraph(t.empty ?? 'None.', FONT.italic, SIZE.body, { color: COLOR.muted });
    return;
  }
  const texts = t.rows.map((row) => row.map((cell) => c.clean(cell.text)));
  const headings = t.columns.map((col) => c.clean(col.heading));
  const l = layout(c, t, texts, headings);
  c.font(FONT.regular, l.size);
  const wrapped = texts.map((row) => row.map((text, j) => (t.columns[j].wrap ? c.lines(text, l.widths[j] - 2 * PAD) : [text])));
  const rowHeight = (i: number) => Math.max(...wrapped[i].map((lines) => lines.length)) * l.lineHeight + PAD;

  c.ensure(headingHeight + l.headerHeight + rowHeight(0) * Math.min(3, t.rows.length));
  writeHeading(false);
  drawHeader(c, t, l);
  for (let i = 0; i < t.rows.length; i++) {
    const h = rowHeight(i);
    if (c.y + h > c.bottom) {
      c.newPage();
      writeHeading(true);
      drawHeader(c, t, l);
    }
    if (i % 2 === 1) doc.save().rect(c.left, c.y, c.width, h).fill(COLOR.stripe).restore();
    c.use(FONT.regular, l.size);
    let x = c.left;
    for (let j = 0; j < t.columns.length; j++) {
      const lines = wrapped[i][j];
      for (let k = 0; k < lines.length; k++) if (lines[k]) c.line(lines[k], x + PAD, c.y + PAD / 2 + k * l.lineHeight, l.widths[j] - 2 * PAD, t.columns[j].align);
      x += l.widths[j];
    }
    c.y += h;
  }
  c.rule(c.y, COLOR.rule, 0.5);
  c.y += 4;
  if (t.note) c.paragraph(t.note, FONT.italic, SIZE.small, { color: COLOR.muted, gapAfter: 6 });
  else c.y += 6;
}
