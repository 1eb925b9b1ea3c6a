/**
 * Turns raw text fields (a CSV row, a form post) into a Sale, or into one message per
 * bad field. Shared by the CSV reader, the web forms and the command line so that every
 * entry path accepts and rejects exactly the same values (DESIGN.md "CSV of sales").
 */
import {
  CHARACTERISTICS,
  CHARACTERISTIC_RULES,
  type Characteristic,
  type Characteristics,
  type Sale,
} from './sale.js';

export type Validated<T> = { ok: true; value: T } | { ok: false; errors: FieldErrors };
/** Field name → message; the field name is the CSV column name. */
export type FieldErrors = Record<string, string>;

/** Raw input: column name → text (missing or empty means not given). */
export type RawFields = Record<string, string | undefined>;

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const PLAIN_DECIMAL = /^[+-]?(\d+(\.\d*)?|\.\d+)$/;
/** A price may carry a leading currency sign and thousands separators: "$1,250,000.00". */
const PRICE = /^-?[^\d\s.,+-]?\s?-?(\d{1,3}(,\d{3})+|\d+)(\.\d+)?$/;

export const MAX_TEXT_LENGTH = { address: 200, id: 64, notes: 2000, verification: 500, excluded_reason: 500 };

/** Parses an ISO calendar date and checks it exists (no 2023-02-30). */
export function parseIsoDate(text: string): string | undefined {
  const m = ISO_DATE.exec(text);
  if (!m) return undefined;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const date = new Date(Date.UTC(y, mo - 1, d));
  if (date.getUTCFullYear() !== y || date.getUTCMonth() !== mo - 1 || date.getUTCDate() !== d) return undefined;
  return text;
}

export function parsePlainNumber(text: string): number | undefined {
  if (!PLAIN_DECIMAL.test(text)) return undefined;
  const n = Number(text);
  return Number.isFinite(n) ? n : undefined;
}

export function parsePrice(text: string): number | undefined {
  const t = text.trim();
  if (!PRICE.test(t)) return undefined;
  const negative = t.includes('-');
  const n = Number(t.replace(/[^\d.]/g, ''));
  return Number.isFinite(n) ? (negative ? -n : n) : undefined;
}

function clean(v: string | undefined): string | undefined {
  if (v === undefined) return undefined;
  const t = v.trim();
  return t === '' ? undefined : t;
}

/**
 * Checks one characteristic value against its rule. `referenceYear` is the sale year (or
 * the subject's effective year): a house cannot be built after it is sold.
 */
export function checkCharacteristic(
  name: Characteristic,
  text: string,
  referenceYear?: number,
): { value: number } | { error: string } {
  const rule = CHARACTERISTIC_RULES[name];
  const n = parsePlainNumber(text);
  if (n === undefined)
    return { error: `${name} must be a plain number${/\d,\d/.test(text) ? ' without thousands separators' : ''}, got "${text}"` };
  if (rule.integer && !Number.isInteger(n)) return { error: `${name} must be a whole number, got "${text}"` };
  if (rule.minInclusive ? n < rule.min : n <= rule.min)
    return { error: `${name} must be ${rule.minInclusive ? 'at least' : 'greater than'} ${rule.min}, got "${text}"` };
  if (rule.step !== undefined && Math.abs(n / rule.step - Math.round(n / rule.step)) > 1e-9)
    return { error: `${name} must be in steps of ${rule.step}, got "${text}"` };
  if (name === 'year_built' && referenceYear !== undefined && n > referenceYear)
    return { error: `year_built ${n} is after the year of sale ${referenceYear}` };
  return { value: n };
}

function checkText(errors: FieldErrors, field: keyof typeof MAX_TEXT_LENGTH, value: string | undefined): void {
  if (value !== undefined && value.length > MAX_TEXT_LENGTH[field])
    errors[field] = `${field} is longer than ${MAX_TEXT_LENGTH[field]} characters`;
  // SQLite text ends at a NUL, so it would be stored cut short.
  else if (value?.includes('\u0000')) errors[field] = `${field} contains a NUL character (U+0000), which cannot be stored`;
}

/**
 * Validates one sale from raw fields. `included` and `excluded_reason` are optional:
 * a sale is included unless `included` is "false"/"no"/"0", and an excluded sale needs a reason.
 */
export function validateSale(raw: RawFields): Validated<Sale> {
  const errors: FieldErrors = {};
  const address = clean(raw.address);
  if (!address) errors.address = 'address is required';
  checkText(errors, 'address', address);

  const dateText = clean(raw.sale_date);
  let saleDate: string | undefined;
  if (!dateText) errors.sale_date = 'sale_date is required (YYYY-MM-DD)';
  else {
    saleDate = parseIsoDate(dateText);
    if (!saleDate) errors.sale_date = `sale_date must be a real date as YYYY-MM-DD, got "${dateText}"`;
  }

  const priceText = clean(raw.sale_price);
  let salePrice: number | undefined;
  if (!priceText) errors.sale_price = 'sale_price is required';
  else {
    salePrice = parsePrice(priceText);
    if (salePrice === undefined) errors.sale_price = `sale_price must be a number, got "${priceText}"`;
    else if (!(salePrice > 0)) errors.sale_price = `sale_price must be greater than 0, got "${priceText}"`;
  }

  const saleYear = saleDate ? Number(saleDate.slice(0, 4)) : undefined;
  const characteristics: Characteristics = {};
  for (const name of CHARACTERISTICS) {
    const text = clean(raw[name]);
    if (text === undefined) continue;
    const r = checkCharacteristic(name, text, saleYear);
    if ('error' in r) errors[name] = r.error;
    else characteristics[name] = r.value;
  }

  const id = clean(raw.id);
  checkText(errors, 'id', id);
  const notes = clean(raw.notes);
  checkText(errors, 'notes', notes);
  const verification = clean(raw.verification);
  checkText(errors, 'verification', verification);

  const includedText = clean(raw.included)?.toLowerCase();
  let included = true;
  if (includedText !== undefined) {
    if (['true', 'yes', '1'].includes(includedText)) included = true;
    else if (['false', 'no', '0'].includes(includedText)) included = false;
    else errors.included = `included must be yes or no, got "${raw.included}"`;
  }
  const excludedReason = clean(raw.excluded_reason);
  checkText(errors, 'excluded_reason', excludedReason);
  if (!included && !excludedReason) errors.excluded_reason = 'an excluded sale needs a reason';

  if (Object.keys(errors).length > 0) return { ok: false, errors };
  return {
    ok: true,
    value: {
      id: id ?? '',
      address: address!,
      saleDate: saleDate!,
      salePrice: salePrice!,
      characteristics,
      ...(notes ? { notes } : {}),
      ...(verification ? { verification } : {}),
      included,
      ...(!included ? { excludedReason } : {}),
    },
  };
}
