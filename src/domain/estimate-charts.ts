/**
 * The pictures of an estimate as plain geometry: axes with "nice" ticks, points in data
 * units, the subject marked. The web draws them as SVG and the worksheet draws the same
 * geometry with PDF vector graphics, so both show one picture. Pure: no markup here.
 *
 * Charts: per predictor a strip of the sales' values with the subject; price against each
 * predictor with the subject; residuals against fitted values with flagged sales labelled;
 * and the subject's value with both intervals.
 */
import type { EstimateResult, Predictor } from './estimate-result.js';
import { saleValue, subjectValue } from './model.js';
import type { Sale, Subject } from './sale.js';

export interface Axis {
  label: string;
  min: number;
  max: number;
  ticks: number[];
}

export interface ChartPoint {
  x: number;
  y: number;
  /** A sale id when the point should be labelled (flagged sales). */
  label?: string;
  flagged?: boolean;
}

export interface Chart {
  id: string;
  title: string;
  /** Text alternative describing what the picture shows, for screen readers and print. */
  description: string;
  x: Axis;
  /** Absent for a strip (one-dimensional) chart. */
  y?: Axis;
  points: ChartPoint[];
  /** The subject, marked distinctly; absent on the residual chart. */
  subject?: { x: number; y?: number; outside: boolean };
  /** Horizontal reference line (zero residual). */
  referenceY?: number;
}

export interface IntervalPicture {
  title: string;
  description: string;
  axis: Axis;
  value: number;
  confidence: [number, number];
  prediction: [number, number];
  levelPercent: number;
}

/**
 * Ticks at 1, 2 or 5 × 10^k covering [min, max] with about `count` steps
 * (Heckbert, "Nice numbers for graph labels", Graphics Gems, 1990).
 * @example niceAxis(0.3, 9.2, 5) // => { min: 0, max: 10, ticks: [0, 2, 4, 6, 8, 10] }
 */
export function niceAxis(min: number, max: number, count = 5, label = ''): Axis {
  if (!(Number.isFinite(min) && Number.isFinite(max))) throw new RangeError('niceAxis: need finite bounds');
  if (min === max) {
    const pad = Math.abs(min) > 0 ? Math.abs(min) * 0.1 : 1;
    min -= pad;
    max += pad;
  }
  const nice = (x: number, round: boolean) => {
    const exp = Math.floor(Math.log10(x));
    const f = x / 10 ** exp;
    const nf = round ? (f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10) : f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10;
    return nf * 10 ** exp;
  };
  const step = nice(nice(max - min, false) / count, true);
  const lo = Math.floor(min / step) * step;
  const hi = Math.ceil(max / step) * step;
  const ticks: number[] = [];
  // Snap rounding residue (−5.55e-17) to the exact tick value.
  for (let v = lo; v <= hi + step / 2; v += step) ticks.push(Math.abs(v) < step * 1e-9 ? 0 : Number(v.toPrecision(12)));
  return { label, min: lo, max: hi, ticks };
}

const PREDICTOR_LABEL: Record<Predictor, string> = {
  living_area: 'Living area',
  age: 'Age (years)',
  rooms: 'Rooms',
  bedrooms: 'Bedrooms',
  bathrooms: 'Bathrooms',
  lot_area: 'Lot area',
  garage_spaces: 'Garage spaces',
  months_since_sale: 'Months from sale to effective date',
  'living_area^2': 'Living area squared',
};

export function predictorLabel(p: Predictor, areaUnit = 'sq ft'): string {
  const base = PREDICTOR_LABEL[p];
  return p === 'living_area' || p === 'lot_area' ? `${base} (${areaUnit})` : base;
}

/** Predictors worth a picture: the squared term repeats living area, so it is left out. */
function pictured(result: EstimateResult): Predictor[] {
  return result.predictors.filter((p) => p !== 'living_area^2');
}

/**
 * Every picture of one estimate. `sales` must be the sales the estimate was computed from
 * (the saved snapshot's rows), so the points match the result exactly.
 */
export function estimateCharts(
  result: EstimateResult,
  sales: readonly Sale[],
  subject: Subject,
  areaUnit = 'sq ft',
): { charts: Chart[]; interval: IntervalPicture } {
  const usedIds = new Set(result.sales.filter((s) => s.used).map((s) => s.id));
  const used = sales.filter((s) => usedIds.has(s.id));
  const diag = new Map(result.sales.map((s) => [s.id, s]));
  const charts: Chart[] = [];

  for (const predictor of pictured(result)) {
    const values = used.map((s) => saleValue(predictor, s, subject.effectiveDate)!);
    const sv = subjectValue(predictor, subject)!;
    const range = result.ranges[predictor];
    const outside = predictor !== 'months_since_sale' && (sv < range.min || sv > range.max);
    const x = niceAxis(Math.min(...values, sv), Math.max(...values, sv), 5, predictorLabel(predictor, areaUnit));
    charts.push({
      id: `strip-${predictor}`,
      title: `${PREDICTOR_LABEL[predictor]}: sales and subject`,
      description:
        predictor === 'months_since_sale'
          ? `Strip of the ${values.length} sales' months from sale to the effective date, ${fmt(range.min)} to ${fmt(range.max)}; the subject is at 0, the effective date itself.`
          : `Strip of the ${values.length} sales' ${PREDICTOR_LABEL[predictor].toLowerCase()} from ${fmt(range.min)} to ${fmt(range.max)}; the subject's value ${fmt(sv)} is ${outside ? 'outside' : 'inside'} that range.`,
      x,
      points: values.map((v) => ({ x: v, y: 0 })),
      subject: { x: sv, outside },
    });
    const prices = used.map((s) => s.salePrice);
    const y = niceAxis(Math.min(...prices, result.estimate.value), Math.max(...prices, result.estimate.value), 5, 'Sale price');
    charts.push({
      id: `price-${predictor}`,
      title: `Sale price against ${PREDICTOR_LABEL[predictor].toLowerCase()}`,
      description: `Scatter of sale price against ${PREDICTOR_LABEL[predictor].toLowerCase()} for ${values.length} sales; the subject is marked at ${fmt(sv)} with the estimate ${fmt(result.estimate.value)}.`,
      x,
      y,
      points: values.map((v, i) => {
        const d = diag.get(used[i].id);
        return { x: v, y: prices[i], flagged: (d?.flags.length ?? 0) > 0 };
      }),
      subject: { x: sv, y: result.estimate.value, outside },
    });
  }

  const rows = result.sales.filter((s) => s.used && s.fitted !== null && s.residual !== null);
  const logScale = result.transform === 'log';
  const fittedValues = rows.map((s) => s.fitted!);
  const residuals = rows.map((s) => s.residual!);
  const flaggedCount = rows.filter((s) => s.flags.length > 0).length;
  charts.push({
    id: 'residuals',
    title: 'Residuals against fitted values',
    description: `Residual (${logScale ? 'on the log scale' : 'sale price minus fitted price'}) against fitted price for ${rows.length} sales; ${flaggedCount} flagged sale${flaggedCount === 1 ? ' is' : 's are'} labelled. A pattern or a funnel shape suggests the model misses something.`,
    x: niceAxis(Math.min(...fittedValues), Math.max(...fittedValues), 5, 'Fitted price'),
    y: niceAxis(Math.min(...residuals, 0), Math.max(...residuals, 0), 4, logScale ? 'Residual (log price)' : 'Residual'),
    points: rows.map((s) => ({ x: s.fitted!, y: s.residual!, flagged: s.flags.length > 0, ...(s.flags.length > 0 ? { label: s.id } : {}) })),
    referenceY: 0,
  });

  const e = result.estimate;
  const levelPercent = +(result.level * 100).toFixed(2);
  return {
    charts,
    interval: {
      title: 'Estimate with its intervals',
      description: `Estimate ${fmt(e.value)}; ${levelPercent} % confidence interval for the mean price ${fmt(e.confidence[0])} to ${fmt(e.confidence[1])}; ${levelPercent} % prediction interval for one sale ${fmt(e.prediction[0])} to ${fmt(e.prediction[1])}.`,
      axis: niceAxis(e.prediction[0], e.prediction[1], 5, 'Price'),
      value: e.value,
      confidence: e.confidence,
      prediction: e.prediction,
      levelPercent,
    },
  };
}

function fmt(x: number): string {
  return Math.abs(x) >= 1000 ? Math.round(x).toLocaleString('en-US') : Number.isInteger(x) ? String(x) : x.toFixed(1);
}
