/**
 * Number, money, area and time formatting shared by the pages and the worksheet, so every
 * place that shows a figure shows it the same way. Pure: no I/O, no clock.
 */
import type { AreaUnitCode } from './saved-estimate.js';

const LOCALE = 'en-US';

/** How each area unit is written beside a number. */
export const AREA_UNIT_LABEL: Record<AreaUnitCode, string> = { sqft: 'sq ft', m2: 'm²' };

/** Money formats by currency and whole/cents, built once each (a page formats hundreds of prices). */
const moneyFormats = new Map<string, Intl.NumberFormat>();

export function formatMoney(amount: number, currency: string): string {
  const whole = Number.isInteger(amount);
  const key = `${currency}|${whole}`;
  let f = moneyFormats.get(key);
  if (!f) {
    f = new Intl.NumberFormat(LOCALE, { style: 'currency', currency, minimumFractionDigits: whole ? 0 : 2, maximumFractionDigits: whole ? 0 : 2 });
    moneyFormats.set(key, f);
  }
  return f.format(amount);
}

/** The symbol (or code) of a currency, for the label beside a price input. */
export function currencySymbol(currency: string): string {
  const part = new Intl.NumberFormat(LOCALE, { style: 'currency', currency }).formatToParts(0).find((p) => p.type === 'currency');
  return part?.value ?? currency;
}

/** Number formats by digits: building an Intl.NumberFormat costs far more than using one. */
const numberFormats = new Map<number, Intl.NumberFormat>();

export function formatNumber(n: number | undefined, maximumFractionDigits = 2): string {
  if (n === undefined) return '';
  let f = numberFormats.get(maximumFractionDigits);
  if (!f) numberFormats.set(maximumFractionDigits, (f = new Intl.NumberFormat(LOCALE, { maximumFractionDigits })));
  return f.format(n);
}

export function areaLabel(unit: string): string {
  return AREA_UNIT_LABEL[unit as AreaUnitCode] ?? unit;
}

export function formatArea(n: number | undefined, unit: string): string {
  return n === undefined ? '' : `${formatNumber(n, 1)} ${areaLabel(unit)}`;
}

/** An ISO timestamp as `2024-05-01 14:03 UTC`: unambiguous and the same for every reader. */
export function formatTime(iso: string): string {
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}
