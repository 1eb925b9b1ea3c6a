/**
 * The model a user chooses (DESIGN.md "Vocabulary"): predictors, response transform and
 * interval level; and how each predictor's value is read from a sale or the subject.
 */
import { DEFAULT_PREDICTORS, isPredictor, type Predictor, type Transform } from './estimate-result.js';
import type { Characteristic, Sale, Subject } from './sale.js';

export interface ModelSpec {
  predictors: Predictor[];
  transform: Transform;
  level: number;
}

export const DEFAULT_MODEL: ModelSpec = { predictors: DEFAULT_PREDICTORS, transform: 'none', level: 0.95 };

/** Which recorded characteristic a predictor is computed from (none for months_since_sale). */
export const PREDICTOR_SOURCE: Record<Predictor, Characteristic | null> = {
  living_area: 'living_area',
  age: 'year_built',
  rooms: 'rooms',
  bedrooms: 'bedrooms',
  bathrooms: 'bathrooms',
  lot_area: 'lot_area',
  garage_spaces: 'garage_spaces',
  months_since_sale: null,
  'living_area^2': 'living_area',
};

/** A predictor in plain words for messages and headings: "living area squared", "age". */
export function predictorWords(predictor: string): string {
  return predictor.replace('^2', ' squared').replace(/_/g, ' ');
}

/** Unit words for a coefficient: "per sq ft", "per year of age" … (area unit from the market). */
export function perUnitLabel(predictor: Predictor, areaUnit: string): string {
  switch (predictor) {
    case 'living_area':
    case 'lot_area':
      return `per ${areaUnit}`;
    case 'living_area^2':
      return `per (${areaUnit})²`;
    case 'age':
      return 'per year of age';
    case 'rooms':
      return 'per room';
    case 'bedrooms':
      return 'per bedroom';
    case 'bathrooms':
      return 'per bathroom';
    case 'garage_spaces':
      return 'per garage space';
    case 'months_since_sale':
      return 'per month';
  }
}

/** Days per average month, 365.25 / 12 (DESIGN.md "Statistics"). */
export const DAYS_PER_MONTH = 30.4375;

/** The year of an ISO date, read from its first four digits (hot in selectSales: no slicing). */
export function yearOf(iso: string): number {
  return (iso.charCodeAt(0) - 48) * 1000 + (iso.charCodeAt(1) - 48) * 100 + (iso.charCodeAt(2) - 48) * 10 + (iso.charCodeAt(3) - 48);
}

function daysBetween(fromIso: string, toIso: string): number {
  return (Date.parse(`${toIso}T00:00:00Z`) - Date.parse(`${fromIso}T00:00:00Z`)) / 86_400_000;
}

/**
 * A predictor's value for a sale, or undefined when the characteristic it needs is missing.
 * age = year of sale − year built; months_since_sale = days from sale to the effective
 * date / 30.4375.
 */
export function saleValue(predictor: Predictor, sale: Sale, effectiveDate: string): number | undefined {
  const c = sale.characteristics;
  switch (predictor) {
    case 'age':
      return c.year_built === undefined ? undefined : yearOf(sale.saleDate) - c.year_built;
    case 'months_since_sale':
      return daysBetween(sale.saleDate, effectiveDate) / DAYS_PER_MONTH;
    case 'living_area^2':
      return c.living_area === undefined ? undefined : c.living_area * c.living_area;
    default:
      return c[predictor];
  }
}

/** The subject's value of a predictor: age at the effective date; months_since_sale is 0. */
export function subjectValue(predictor: Predictor, subject: Subject): number | undefined {
  const c = subject.characteristics;
  switch (predictor) {
    case 'age':
      return c.year_built === undefined ? undefined : Number(subject.effectiveDate.slice(0, 4)) - c.year_built;
    case 'months_since_sale':
      return 0;
    case 'living_area^2':
      return c.living_area === undefined ? undefined : c.living_area * c.living_area;
    default:
      return c[predictor];
  }
}

/** Checks a model: known, distinct predictors; squared area only with the area; level in (0, 1). */
export function validateModel(input: { predictors?: readonly string[]; transform?: string; level?: number }): {
  ok: true;
  value: ModelSpec;
} | { ok: false; errors: string[] } {
  const errors: string[] = [];
  const names = input.predictors ?? DEFAULT_MODEL.predictors;
  const predictors: Predictor[] = [];
  if (names.length === 0) errors.push('predictors: choose at least one predictor');
  for (const name of names) {
    if (!isPredictor(name)) errors.push(`predictors: "${name}" is not a predictor (choose from living_area, age, rooms, bedrooms, bathrooms, lot_area, garage_spaces, months_since_sale, living_area^2)`);
    else if (predictors.includes(name)) errors.push(`predictors: "${name}" is listed twice`);
    else predictors.push(name);
  }
  if (predictors.includes('living_area^2') && !predictors.includes('living_area'))
    errors.push('predictors: living_area^2 needs living_area in the model too');
  const transform = input.transform ?? DEFAULT_MODEL.transform;
  if (transform !== 'none' && transform !== 'log') errors.push(`transform: must be none or log, got "${transform}"`);
  const level = input.level ?? DEFAULT_MODEL.level;
  if (!(typeof level === 'number' && level > 0 && level < 1))
    errors.push(`level: must be a number between 0 and 1 such as 0.95, got ${String(level)}`);
  if (errors.length > 0) return { ok: false, errors };
  // The squared term sits right after its base so the grid and tables read naturally.
  const ordered: Predictor[] = predictors.filter((p) => p !== 'living_area^2');
  if (predictors.includes('living_area^2')) ordered.splice(ordered.indexOf('living_area') + 1, 0, 'living_area^2');
  return { ok: true, value: { predictors: ordered, transform: transform as Transform, level } };
}
