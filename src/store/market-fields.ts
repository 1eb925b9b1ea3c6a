/**
 * Checks the fields of a market (form post or command-line options): a name, an area
 * unit and a currency code. Returns one message per bad field, like validateSale.
 */
import type { FieldErrors, RawFields, Validated } from '../domain/validate-sale.js';

export const AREA_UNITS = ['sqft', 'm2'] as const;
export type AreaUnit = (typeof AREA_UNITS)[number];

/** How each unit is written beside an input or a number (one table, in domain/format.ts). */
export { AREA_UNIT_LABEL as AREA_UNIT_LABELS } from '../domain/format.js';

export interface MarketFields {
  name: string;
  areaUnit: AreaUnit;
  /** ISO 4217 code, upper case. */
  currency: string;
  notes?: string;
}

export const MAX_MARKET_NAME = 120;
export const MAX_MARKET_NOTES = 2000;

function isKnownCurrency(code: string): boolean {
  try {
    new Intl.NumberFormat('en', { style: 'currency', currency: code });
    return true;
  } catch {
    return false;
  }
}

export function validateMarketFields(raw: RawFields): Validated<MarketFields> {
  const errors: FieldErrors = {};
  const name = raw.name?.trim() ?? '';
  if (!name) errors.name = 'name is required';
  else if (name.length > MAX_MARKET_NAME) errors.name = `name is longer than ${MAX_MARKET_NAME} characters`;

  const unitText = (raw.area_unit ?? '').trim().toLowerCase().replace(/\s+/g, '');
  const areaUnit = unitText === 'sqft' || unitText === 'ft2' ? 'sqft' : unitText === 'm2' || unitText === 'm²' ? 'm2' : undefined;
  if (!areaUnit) errors.area_unit = `area_unit must be sqft or m2, got "${raw.area_unit ?? ''}"`;

  const currency = (raw.currency ?? '').trim().toUpperCase();
  if (!/^[A-Z]{3}$/.test(currency) || !isKnownCurrency(currency))
    errors.currency = `currency must be a three-letter ISO 4217 code such as USD or EUR, got "${raw.currency ?? ''}"`;

  const notes = raw.notes?.trim() || undefined;
  if (notes && notes.length > MAX_MARKET_NOTES) errors.notes = `notes is longer than ${MAX_MARKET_NOTES} characters`;

  if (Object.keys(errors).length > 0) return { ok: false, errors };
  return { ok: true, value: { name, areaUnit: areaUnit!, currency, ...(notes ? { notes } : {}) } };
}
