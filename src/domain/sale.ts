/**
 * A closed comparable sale and its recorded characteristics (DESIGN.md "Vocabulary").
 * Characteristic keys keep the CSV/JSON spelling (`living_area`, …) so one name
 * travels unchanged from a file to the database to the result.
 */

/** Recorded characteristics, in the order they are shown and exported. */
export const CHARACTERISTICS = [
  'living_area',
  'year_built',
  'rooms',
  'bedrooms',
  'bathrooms',
  'lot_area',
  'garage_spaces',
] as const;

export type Characteristic = (typeof CHARACTERISTICS)[number];

/** A sale's characteristics; a missing one is simply absent. */
export type Characteristics = Partial<Record<Characteristic, number>>;

export interface Sale {
  /** The user's own reference, unique within a market (CSV `id`). */
  id: string;
  address: string;
  /** ISO date `YYYY-MM-DD`. */
  saleDate: string;
  salePrice: number;
  characteristics: Characteristics;
  notes?: string;
  /** How the sale was confirmed. */
  verification?: string;
  included: boolean;
  /** Why an excluded sale is left out; present only when `included` is false. */
  excludedReason?: string;
}

/** The property being valued, with its effective date of value. */
export interface Subject {
  address: string;
  /** ISO date `YYYY-MM-DD`. */
  effectiveDate: string;
  characteristics: Characteristics;
}

/** How each characteristic must look, shared by CSV import, forms and the subject JSON. */
export interface CharacteristicRule {
  label: string;
  integer: boolean;
  /** Smallest allowed value and whether it may be equal. */
  min: number;
  minInclusive: boolean;
  /** Values must be multiples of this step (bathrooms: half baths). */
  step?: number;
  /** Unit word for labels; `area` means the market's area unit. */
  unit: 'area' | 'year' | 'count' | 'bath';
}

export const CHARACTERISTIC_RULES: Record<Characteristic, CharacteristicRule> = {
  living_area: { label: 'Living area', integer: false, min: 0, minInclusive: false, unit: 'area' },
  year_built: { label: 'Year built', integer: true, min: 1600, minInclusive: true, unit: 'year' },
  rooms: { label: 'Rooms above grade', integer: true, min: 1, minInclusive: true, unit: 'count' },
  bedrooms: { label: 'Bedrooms', integer: true, min: 0, minInclusive: true, unit: 'count' },
  bathrooms: { label: 'Bathrooms', integer: false, min: 0, minInclusive: true, step: 0.5, unit: 'bath' },
  lot_area: { label: 'Lot area', integer: false, min: 0, minInclusive: false, unit: 'area' },
  garage_spaces: { label: 'Garage spaces', integer: true, min: 0, minInclusive: true, unit: 'count' },
};

export function isCharacteristic(name: string): name is Characteristic {
  return (CHARACTERISTICS as readonly string[]).includes(name);
}
