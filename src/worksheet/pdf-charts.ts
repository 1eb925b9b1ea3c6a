/**
 * The estimate's pictures as PDF vector graphics, from the same geometry the web draws
 * as SVG (domain/estimate-charts.ts): price scatters with the strip of the same predictor
 * under them on one x axis, the residual chart, and the estimate with both intervals.
 */
import type { Axis } from '../domain/estimate-charts.js';
import type { ChartView, IntervalView } from './worksheet-model.js';
import { COLOR, FONT, SIZE, type PdfCursor } from './pdf-page.js';

const AXIS_SIZE = 6;
const POINT_RADIUS = 1.7;

interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

const scale = (a: Axis, from: number, to: number) => (v: number) => from + ((v - a.min) / (a.max - a.min || 1)) * (to - from);

function gridAndTicks(c: PdfCursor, plot: Box, x: Axis, xTicks: string[] | undefined, y?: Axis, yTicks?: string[]): void {
  const doc = c.doc;
  const sx = scale(x, plot.x, plot.x + plot.w);
  doc.save().lineWidth(0.4).strokeColor(COLOR.grid);
  for (const t of x.ticks) doc.moveTo(sx(t), plot.y).lineTo(sx(t), plot.y + plot.h);
  if (y) {
    const sy = scale(y, plot.y + plot.h, plot.y);
    for (const t of y.ticks) doc.moveTo(plot.x, sy(t)).lineTo(plot.x + plot.w, sy(t));
  }
  doc.stroke().restore();
  doc.save().lineWidth(0.6).strokeColor(COLOR.rule).rect(plot.x, plot.y, plot.w, plot.h).stroke().restore();
  c.use(FONT.regular, AXIS_SIZE, COLOR.muted);
  if (xTicks) x.ticks.forEach((t, i) => c.line(c.clean(xTicks[i]), sx(t) - 20, plot.y + plot.h + 3, 40, 'center'));
  if (y && yTicks) {
    const sy = scale(y, plot.y + plot.h, plot.y);
    y.ticks.forEach((t, i) => c.line(c.clean(yTicks[i]), plot.x - 42, sy(t) - AXIS_SIZE / 2, 39, 'right'));
  }
}

function points(c: PdfCursor, pts: { x: number; y: number }[], color: string): void {
  if (pts.length === 0) return;
  const doc = c.doc;
  // One path for all points, filled once: fast for hundreds of sales.
  doc.save();
  for (const p of pts) doc.circle(p.x, p.y, POINT_RADIUS);
  doc.fillOpacity(0.75).fill(color).restore();
}

function subjectMark(c: PdfCursor, x: number, y: number, outside: boolean): void {
  const d = 4;
  c.doc
    .save()
    .lineWidth(1.2)
    .strokeColor(COLOR.subject)
    .polygon([x, y - d], [x + d, y], [x, y + d], [x - d, y])
    .fillAndStroke('#ffffff', COLOR.subject)
    .restore();
  c.use(FONT.bold, AXIS_SIZE, COLOR.subject);
  c.line(outside ? 'Subject (outside the sales)' : 'Subject', x + d + 2, y - AXIS_SIZE / 2, 120);
}

function title(c: PdfCursor, text: string, box: Box): number {
  c.use(FONT.bold, 7.5);
  const lines = c.lines(c.clean(text), box.w);
  lines.forEach((l, i) => c.line(l, box.x, box.y + i * 9.5, box.w));
  return lines.length * 9.5 + 7;
}

/** A scatter (y axis present) or a strip, inside `box`; returns nothing, draws everything. */
function drawXYChart(c: PdfCursor, view: ChartView, box: Box, options: { title: boolean; xTicks: boolean }): void {
  const { chart } = view;
  const top = options.title ? title(c, chart.title, box) : 0;
  const left = 44;
  const plot: Box = { x: box.x + left, y: box.y + top, w: box.w - left - 6, h: box.h - top - (options.xTicks ? 14 : 2) };
  const y = chart.y;
  gridAndTicks(c, plot, chart.x, options.xTicks ? view.xTicks : undefined, y, view.yTicks);
  const sx = scale(chart.x, plot.x, plot.x + plot.w);
  const sy = y ? scale(y, plot.y + plot.h, plot.y) : () => plot.y + plot.h / 2;
  if (chart.referenceY !== undefined && y) {
    const ry = sy(chart.referenceY);
    c.doc.save().lineWidth(0.8).dash(3, { space: 2 }).strokeColor(COLOR.muted).moveTo(plot.x, ry).lineTo(plot.x + plot.w, ry).stroke().undash().restore();
  }
  // Strips: spread points a little up and down by a fixed pattern so ties stay visible.
  const jitter = (i: number) => (y ? 0 : ((i * 7) % 9) - 4) * (plot.h / 14);
  const plain = chart.points.filter((p) => !p.flagged).map((p, i) => ({ x: sx(p.x), y: sy(p.y) + jitter(i) }));
  const flagged = chart.points.filter((p) => p.flagged).map((p, i) => ({ x: sx(p.x), y: sy(p.y) + jitter(i + plain.length), label: p.label }));
  points(c, plain, COLOR.point);
  points(c, flagged, COLOR.flagged);
  c.use(FONT.regular, 5.5, COLOR.flagged);
  for (const p of flagged) if (p.label) c.line(c.clean(p.label), p.x + 2.5, p.y - 6.5, 60);
  if (chart.subject) {
    const s = chart.subject;
    const x = sx(s.x);
    if (!y) c.doc.save().lineWidth(0.8).strokeColor(COLOR.subject).moveTo(x, plot.y).lineTo(x, plot.y + plot.h).stroke().restore();
    subjectMark(c, x, s.y !== undefined && y ? sy(s.y) : plot.y + plot.h / 2, s.outside);
  }
  // Axis names: x under the ticks, y written along the left edge.
  c.use(FONT.regular, AXIS_SIZE, COLOR.muted);
  if (y) {
    c.doc.save().rotate(-90, { origin: [box.x + 4, plot.y + plot.h / 2] });
    c.line(c.clean(y.label), box.x + 4 - plot.h / 2, plot.y + plot.h / 2 - AXIS_SIZE / 2 - 2, plot.h, 'center');
    c.doc.restore();
  }
}

/** The scatter of a predictor with its strip under it, or any chart on its own. */
export function drawChartCell(c: PdfCursor, scatter: ChartView, strip: ChartView | undefined, box: Box): void {
  const stripHeight = strip ? 42 : 0;
  const axisNameHeight = 10;
  drawXYChart(c, scatter, { ...box, h: box.h - stripHeight - axisNameHeight - (strip ? 4 : 0) }, { title: true, xTicks: !strip });
  const axisName = (strip ?? scatter).chart.x.label;
  if (strip) {
    const sbox = { x: box.x, y: box.y + box.h - stripHeight - axisNameHeight, w: box.w, h: stripHeight };
    c.use(FONT.regular, AXIS_SIZE, COLOR.muted);
    c.line('Sales', sbox.x, sbox.y + (stripHeight - 14) / 2 - AXIS_SIZE / 2, 41, 'right');
    drawXYChart(c, strip, sbox, { title: false, xTicks: true });
  }
  c.use(FONT.regular, AXIS_SIZE, COLOR.muted);
  c.line(c.clean(axisName), box.x + 44, box.y + box.h - 8, box.w - 50, 'center');
}

/** Height a chart cell needs: scatters with a strip are taller. */
export function chartCellHeight(withStrip: boolean): number {
  return withStrip ? 232 : 186;
}

/** The estimate on a price axis: prediction interval as a wide band, confidence inside it. */
export function drawInterval(c: PdfCursor, view: IntervalView): void {
  const p = view.picture;
  const height = 92;
  c.ensure(height);
  const box: Box = { x: c.left, y: c.y, w: c.width, h: height };
  c.use(FONT.bold, 7.5);
  c.line(c.clean(p.title), box.x, box.y, box.w);
  const plot: Box = { x: box.x + 10, y: box.y + 30, w: box.w - 20, h: 22 };
  const sx = scale(p.axis, plot.x, plot.x + plot.w);
  const doc = c.doc;
  doc.save().lineWidth(0.6).strokeColor(COLOR.rule).moveTo(plot.x, plot.y + plot.h + 6).lineTo(plot.x + plot.w, plot.y + plot.h + 6).stroke();
  for (const t of p.axis.ticks) doc.moveTo(sx(t), plot.y + plot.h + 6).lineTo(sx(t), plot.y + plot.h + 9);
  doc.stroke().restore();
  c.use(FONT.regular, AXIS_SIZE, COLOR.muted);
  p.axis.ticks.forEach((t, i) => c.line(c.clean(view.ticks[i]), sx(t) - 22, plot.y + plot.h + 11, 44, 'center'));
  const band = (lo: number, hi: number, y: number, h: number, color: string) =>
    doc.save().rect(sx(lo), y, Math.max(0.5, sx(hi) - sx(lo)), h).fill(color).restore();
  band(p.prediction[0], p.prediction[1], plot.y, plot.h, COLOR.prediction);
  band(p.confidence[0], p.confidence[1], plot.y + plot.h / 4, plot.h / 2, COLOR.confidence);
  const vx = sx(p.value);
  doc.save().lineWidth(1.6).strokeColor(COLOR.subject).moveTo(vx, plot.y - 3).lineTo(vx, plot.y + plot.h + 3).stroke().restore();
  c.use(FONT.bold, 7, COLOR.subject);
  c.line(c.clean(`Value ${view.valueText}`), vx - 60, plot.y - 12, 120, 'center');
  c.use(FONT.regular, 6.5, COLOR.text);
  const legendY = plot.y + plot.h + 22;
  doc.save().rect(box.x + 10, legendY, 10, 6).fill(COLOR.prediction).restore();
  c.line(c.clean(`${p.levelPercent} % prediction interval (one sale): ${view.predictionText[0]} to ${view.predictionText[1]}`), box.x + 24, legendY, 240);
  doc.save().rect(box.x + 270, legendY, 10, 6).fill(COLOR.confidence).restore();
  c.line(c.clean(`${p.levelPercent} % confidence interval (mean price): ${view.confidenceText[0]} to ${view.confidenceText[1]}`), box.x + 284, legendY, 240);
  c.y += height;
}
