/**
 * The worksheet model → a PDF (pdfkit, standard Helvetica, A4 portrait): title block and a
 * caution box on page one, the sections in order, tables that run across pages with their
 * header repeated, the pictures as vector graphics, and on every page a footer with the
 * caution and "Page x of y" (written after layout, with buffered pages).
 *
 * Deterministic bytes: the document's creation and modification dates are the estimate's
 * save time, and pdfkit derives the file /ID from the info dictionary (an MD5 of it), so
 * the same saved estimate gives the same file.
 */
import PDFDocument from 'pdfkit';
import { drawChartCell, chartCellHeight, drawInterval } from './pdf-charts.js';
import { COLOR, FONT, PAGE, PdfCursor, SIZE, type Doc } from './pdf-page.js';
import { drawTable } from './pdf-table.js';
import { winAnsiText } from './pdf-text.js';
import type { Block, ChartView, Field, Worksheet, WorksheetSection } from './worksheet-model.js';

const fieldText = (f: Field) => f.cells.map((cell) => cell.text).join(' to ');

function drawTitleBlock(c: PdfCursor, ws: Worksheet): void {
  c.use(FONT.bold, SIZE.title);
  c.line(c.clean(ws.title), c.left, c.y, c.width);
  c.y += SIZE.title * 1.3;
  c.use(FONT.regular, SIZE.subtitle, COLOR.muted);
  c.line(c.clean(ws.subjectAddress), c.left, c.y, c.width);
  c.y += SIZE.subtitle * 1.6;
  c.rule(c.y);
  c.y += 6;
  // Two columns of label and value.
  const colWidth = c.width / 2;
  const labelWidth = 92;
  const rows = Math.ceil(ws.titleFields.length / 2);
  let bottom = c.y;
  for (let col = 0; col < 2; col++) {
    let y = c.y;
    for (const f of ws.titleFields.slice(col * rows, (col + 1) * rows)) {
      const x = c.left + col * colWidth;
      c.use(FONT.bold, SIZE.body - 0.5, COLOR.muted);
      c.line(c.clean(f.label), x, y, labelWidth);
      c.use(FONT.regular, SIZE.body - 0.5);
      const lines = c.lines(c.clean(fieldText(f)), colWidth - labelWidth - 10);
      lines.forEach((l, i) => c.line(l, x + labelWidth, y + i * SIZE.body * 1.25, colWidth - labelWidth - 10));
      y += lines.length * SIZE.body * 1.25 + 2;
    }
    bottom = Math.max(bottom, y);
  }
  c.y = bottom + 4;
}

function drawCautionBox(c: PdfCursor, ws: Worksheet): void {
  const pad = 8;
  c.use(FONT.regular, SIZE.body + 0.5);
  const lines = c.lines(c.clean(ws.caution.text), c.width - 2 * pad);
  const lineHeight = (SIZE.body + 0.5) * 1.3;
  const height = pad + SIZE.subheading * 1.5 + lines.length * lineHeight + pad - 2;
  c.ensure(height + 8);
  c.doc.save().lineWidth(1).rect(c.left, c.y, c.width, height).fillAndStroke(COLOR.cautionFill, COLOR.cautionBorder).restore();
  c.use(FONT.bold, SIZE.subheading);
  c.line(c.clean(ws.caution.title), c.left + pad, c.y + pad, c.width - 2 * pad);
  c.use(FONT.regular, SIZE.body + 0.5);
  lines.forEach((l, i) => c.line(l, c.left + pad, c.y + pad + SIZE.subheading * 1.5 + i * lineHeight, c.width - 2 * pad));
  c.y += height + 12;
}

function drawSectionHeading(c: PdfCursor, heading: string): void {
  c.ensure(SIZE.heading * 2 + 60);
  c.y += 4;
  c.use(FONT.bold, SIZE.heading);
  c.line(c.clean(heading), c.left, c.y, c.width);
  c.y += SIZE.heading * 1.3;
  c.rule(c.y, COLOR.rule, 0.8);
  c.y += 6;
}

function drawFields(c: PdfCursor, fields: Field[], emphasizeFirst: boolean): void {
  const labelWidth = Math.min(250, c.width * 0.45);
  fields.forEach((f, i) => {
    const big = emphasizeFirst && i === 0;
    const size = big ? 13 : SIZE.body;
    const lineHeight = size * 1.3;
    c.use(big ? FONT.bold : FONT.regular, size);
    const lines = c.lines(c.clean(fieldText(f)), c.width - labelWidth);
    c.use(FONT.bold, SIZE.body);
    const labelLines = c.lines(c.clean(f.label), labelWidth - 8);
    const height = Math.max(lines.length * lineHeight, labelLines.length * SIZE.body * 1.3) + 1.5;
    c.ensure(height);
    c.use(FONT.bold, SIZE.body, COLOR.muted);
    labelLines.forEach((l, k) => c.line(l, c.left, c.y + (big ? (size - SIZE.body) * 0.8 : 0) + k * SIZE.body * 1.3, labelWidth - 8));
    c.use(big ? FONT.bold : FONT.regular, size);
    lines.forEach((l, k) => c.line(l, c.left + labelWidth, c.y + k * lineHeight, c.width - labelWidth));
    c.y += height;
  });
  c.y += 6;
}

/** Price scatters with their strips, then any other chart, two to a row. */
function drawCharts(c: PdfCursor, charts: ChartView[]): void {
  const byId = new Map(charts.map((v) => [v.chart.id, v]));
  const cells: { main: ChartView; strip?: ChartView }[] = [];
  for (const v of charts) {
    if (v.chart.id.startsWith('strip-')) continue;
    const strip = v.chart.id.startsWith('price-') ? byId.get(`strip-${v.chart.id.slice('price-'.length)}`) : undefined;
    cells.push({ main: v, ...(strip ? { strip } : {}) });
  }
  const gap = 14;
  const w = (c.width - gap) / 2;
  for (let i = 0; i < cells.length; i += 2) {
    const row = cells.slice(i, i + 2);
    const h = Math.max(...row.map((cell) => chartCellHeight(cell.strip !== undefined)));
    c.ensure(h + 6);
    row.forEach((cell, j) => drawChartCell(c, cell.main, cell.strip, { x: c.left + j * (w + gap), y: c.y, w, h }));
    c.y += h + 10;
  }
  c.paragraph(
    'Points are sales (red: flagged by the diagnostics); the diamond is the subject at its value. Under each scatter, the strip shows every sale\'s value of that predictor with the subject\'s.',
    FONT.italic,
    SIZE.small,
    { color: COLOR.muted },
  );
}

function drawBlock(c: PdfCursor, section: WorksheetSection, block: Block): void {
  switch (block.kind) {
    case 'fields':
      if (block.heading) c.paragraph(block.heading, FONT.bold, SIZE.subheading);
      drawFields(c, block.fields, section.id === 'estimate');
      return;
    case 'table':
      drawTable(c, block.table, { showHeading: block.table.heading !== section.heading });
      return;
    case 'paragraphs':
      for (const p of block.paragraphs) {
        if (p.heading) {
          c.ensure(SIZE.subheading * 1.5 + SIZE.body * 3);
          c.paragraph(p.heading, FONT.bold, SIZE.subheading, { gapAfter: 1 });
        }
        c.paragraph(p.text, FONT.regular, SIZE.body, { gapAfter: 6 });
      }
      return;
    case 'interval':
      drawInterval(c, block.view);
      return;
    case 'charts':
      drawCharts(c, block.charts);
      return;
  }
}

/** Footer on every page (caution and page x of y) and a running header after page one. */
function drawPageFurniture(doc: Doc, c: PdfCursor, ws: Worksheet): void {
  const range = doc.bufferedPageRange();
  const total = range.count;
  for (let i = 0; i < total; i++) {
    doc.switchToPage(range.start + i);
    // Writing below the bottom margin would make pdfkit start a page: lift the margin first.
    const margins = doc.page.margins;
    doc.page.margins = { ...margins, bottom: 0 };
    const footerTop = PAGE.height - PAGE.bottom + 14;
    c.rule(footerTop - 4, COLOR.rule, 0.5);
    const pageText = `Page ${i + 1} of ${total}`;
    c.use(FONT.bold, SIZE.small + 0.5);
    const pageWidth = c.widthOfString(pageText);
    c.use(FONT.regular, SIZE.small, COLOR.muted);
    const lines = c.lines(c.clean(ws.caution.line), c.width - pageWidth - 16);
    lines.forEach((l, k) => c.line(l, c.left, footerTop + k * SIZE.small * 1.3, c.width));
    // On the caution's last line, so text extraction reads the caution whole, then the page.
    c.use(FONT.bold, SIZE.small + 0.5);
    c.line(pageText, c.left + c.width - pageWidth, footerTop + (lines.length - 1) * SIZE.small * 1.3 - 0.5, pageWidth);
    if (i > 0) {
      c.use(FONT.regular, SIZE.small, COLOR.muted);
      c.line(c.clean(`${ws.title} · ${ws.subjectAddress} · estimate ${ws.estimateId}`), c.left, PAGE.top - 20, c.width);
    }
    doc.page.margins = margins;
  }
}

export function worksheetPdf(ws: Worksheet): Promise<Buffer> {
  const created = new Date(ws.createdAt);
  if (Number.isNaN(created.getTime())) throw new RangeError(`worksheetPdf: createdAt "${ws.createdAt}" is not a timestamp`);
  const doc = new PDFDocument({
    size: 'A4',
    layout: 'portrait',
    margins: { top: PAGE.top, bottom: PAGE.bottom, left: PAGE.left, right: PAGE.right },
    bufferPages: true,
    lang: 'en-US',
    displayTitle: true,
    info: {
      Title: `${ws.title}: ${ws.subjectAddress}`,
      Author: ws.createdBy,
      Subject: `Estimate ${ws.estimateId}: a statistical indication from recorded sales, not an appraisal`,
      Creator: `compfit ${ws.appVersion}`,
      Producer: 'compfit worksheet (PDFKit)',
      CreationDate: created,
      ModDate: created,
    },
  });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (chunk: Buffer) => chunks.push(chunk));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  const c = new PdfCursor(doc, winAnsiText(ws.currency));
  drawTitleBlock(c, ws);
  drawCautionBox(c, ws);
  for (const section of ws.sections) {
    drawSectionHeading(c, section.heading);
    for (const block of section.blocks) drawBlock(c, section, block);
  }
  drawPageFurniture(doc, c, ws);
  doc.end();
  return done;
}
