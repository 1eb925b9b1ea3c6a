/**
 * The cells of a worksheet: each figure as the text a reader sees and, for the CSV, the
 * same rounded number, so the PDF and the spreadsheet show one figure with one rounding.
 * Prices are rounded to the currency unit; rates keep four significant digits; ratios,
 * leverages and test statistics get the digits their use needs.
 */
import { formatNumber } from '../domain/format.js';

export interface Cell {
  /** What the PDF prints (already formatted, with currency sign and separators). */
  text: string;
  /** The number the text shows, rounded as shown; the CSV writes it instead of the text. */
  value?: number;
  /** Unit of `value` for the CSV (currency code, area unit, %); the text already carries it. */
  unit?: string;
}

const LOCALE = 'en-US';
const EMPTY: Cell = { text: '' };

const moneyFormats = new Map<string, Intl.NumberFormat>();
/** `decimals` at most; trailing zeros are dropped only for rates (`trim`), never for prices. */
function moneyFormat(currency: string, decimals: number, signed: boolean, trim = false): Intl.NumberFormat {
  const key = `${currency}|${decimals}|${signed}|${trim}`;
  let f = moneyFormats.get(key);
  if (!f) {
    f = new Intl.NumberFormat(LOCALE, {
      style: 'currency',
      currency,
      minimumFractionDigits: trim ? 0 : decimals,
      maximumFractionDigits: decimals,
      ...(signed ? { signDisplay: 'exceptZero' as const } : {}),
    });
    moneyFormats.set(key, f);
  }
  return f;
}

const numberFormats = new Map<number, Intl.NumberFormat>();
function fixedFormat(decimals: number): Intl.NumberFormat {
  let f = numberFormats.get(decimals);
  if (!f) {
    f = new Intl.NumberFormat(LOCALE, { minimumFractionDigits: decimals, maximumFractionDigits: decimals });
    numberFormats.set(decimals, f);
  }
  return f;
}

/** Rounds half away from zero to `decimals`, and turns −0 into 0 so no "-$0" appears. */
export function roundTo(x: number, decimals: number): number {
  const f = 10 ** decimals;
  const r = Math.sign(x) * Math.round(Math.abs(x) * f) / f;
  return r === 0 ? 0 : r;
}

function usable(x: number | null | undefined): x is number {
  return typeof x === 'number' && Number.isFinite(x);
}

/** A price rounded to the currency unit: `$312,500`. */
export function priceCell(x: number | null | undefined, currency: string): Cell {
  if (!usable(x)) return EMPTY;
  const v = roundTo(x, 0);
  return { text: moneyFormat(currency, 0, false).format(v), value: v, unit: currency };
}

/** A price change with its sign, rounded to the currency unit: `+$4,500`, `-$2,300`. */
export function signedPriceCell(x: number | null | undefined, currency: string): Cell {
  if (!usable(x)) return EMPTY;
  const v = roundTo(x, 0);
  return { text: moneyFormat(currency, 0, true).format(v), value: v, unit: currency };
}

/** Decimals that keep `digits` significant digits of x (none for large numbers, at most `max`). */
export function significantDecimals(x: number, digits = 4, max = 8): number {
  if (x === 0) return 0;
  return Math.max(0, Math.min(max, digits - 1 - Math.floor(Math.log10(Math.abs(x)))));
}

/** A money rate (a per-unit coefficient, its standard error): four significant digits, `$112.4`, `-$606`. */
export function moneyRateCell(x: number | null | undefined, currency: string): Cell {
  if (!usable(x)) return EMPTY;
  const d = significantDecimals(x, 4, 6);
  const v = roundTo(x, d);
  return { text: moneyFormat(currency, d, false, true).format(v), value: v, unit: currency };
}

/** A plain number with a fixed number of decimals: `0.8123`. */
export function fixedCell(x: number | null | undefined, decimals: number, unit?: string): Cell {
  if (!usable(x)) return EMPTY;
  const v = roundTo(x, decimals);
  return { text: fixedFormat(decimals).format(v), value: v, ...(unit ? { unit } : {}) };
}

/** A plain number with `digits` significant digits (log-scale coefficients): `0.0004123`. */
export function significantCell(x: number | null | undefined, digits = 4): Cell {
  if (!usable(x)) return EMPTY;
  return fixedCell(x, significantDecimals(x, digits, 10));
}

/** A count or a whole number: `1,850`. */
export function integerCell(x: number | null | undefined, unit?: string): Cell {
  if (!usable(x)) return EMPTY;
  const v = Math.round(x);
  return { text: fixedFormat(0).format(v), value: v, ...(unit ? { unit } : {}) };
}

/** A recorded quantity as entered (half baths, areas with a decimal): up to two decimals. */
export function quantityCell(x: number | null | undefined, unit?: string): Cell {
  if (!usable(x)) return EMPTY;
  const v = roundTo(x, 2);
  const text = formatNumber(v, 2);
  return { text: unit ? `${text} ${unit}` : text, value: v, ...(unit ? { unit } : {}) };
}

/** A percentage with one decimal: `12.3 %`. */
export function percentCell(x: number | null | undefined, decimals = 1): Cell {
  if (!usable(x)) return EMPTY;
  const v = roundTo(x, decimals);
  return { text: `${fixedFormat(decimals).format(v)} %`, value: v, unit: '%' };
}

/** A p value: four decimals, or `<0.0001` (text only, as a report would print it). */
export function pValueCell(p: number | null | undefined): Cell {
  if (!usable(p)) return EMPTY;
  if (p < 0.0001) return { text: '<0.0001' };
  return fixedCell(p, 4);
}

export function textCell(text: string | null | undefined): Cell {
  return text ? { text } : EMPTY;
}
