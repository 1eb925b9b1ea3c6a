/**
 * The demo market: sales in Tansy Row, a neighbourhood of Brindlewick, a town we made up.
 * Generated, not recorded: every number below comes from the price model and a seeded
 * random stream, so the same sales come out on every machine.
 *
 * Price model (USD, areas in sq ft, see seed/README.md):
 *   price = (48,000 + 112·living_area − 820·age + 5,200·rooms + 7,500·bathrooms
 *            + 6,000·garage_spaces + 1.8·lot_area)
 *           × (1 + 0.004·months since 2023-01-01)        market conditions, +0.4 % a month
 *           × exp(ε), ε ~ Normal(0, 0.06)                 noise grows with price
 *   rounded to the nearest 500.
 * Characteristics: living_area log-uniform 900–3,000; year_built uniform 1925–2020;
 * rooms ≈ 2.2 + living_area/400 (so rooms and area are strongly correlated); bedrooms and
 * bathrooms follow rooms and area; lot_area uniform 3,000–12,000; garage 0–2.
 * Planted cases: three outliers (price × 1.36, × 0.70, × 1.30), one influential sale (an
 * unusually large old house priced well below the model), two sales without rooms, two
 * excluded sales with reasons.
 */
import type { Sale } from '../src/domain/sale.js';

export const DEMO_MARKET = {
  name: 'Brindlewick – Tansy Row',
  areaUnit: 'sqft' as const,
  currency: 'USD',
  notes: 'Demo market: invented town and sales generated from a documented price model (seed/README.md). Not real data.',
};

export const DEMO_SEED = 20240611;
const REGULAR_SALES = 57;

/** Mulberry32: a small, fast 32-bit PRNG; enough for reproducible demo data. */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal by Box–Muller from two uniforms. */
function normal(rand: () => number): number {
  const u = 1 - rand();
  const v = rand();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

const STREETS = ['Tansy Row', 'Wicker Lane', 'Ostler Way', 'Brindle Court', 'Marram Close', 'Hobnail Street', 'Fallow Drive', 'Cobble Rise'];
const VERIFICATIONS = ['Deed and buyer interview', 'Deed; seller confirmed price', 'Closing statement seen', 'Deed and listing record'];
const START = Date.UTC(2023, 0, 1);
const DAY_MS = 86_400_000;

function isoDate(ms: number): string {
  return new Date(ms).toISOString().slice(0, 10);
}

function monthsSinceStart(date: string): number {
  return (Date.parse(date) - START) / DAY_MS / 30.4375;
}

/** The model's price before noise (see the header comment). */
export function modelPrice(c: Required<Sale['characteristics']>, saleDate: string): number {
  const age = Number(saleDate.slice(0, 4)) - c.year_built;
  const base =
    48_000 + 112 * c.living_area - 820 * age + 5_200 * c.rooms + 7_500 * c.bathrooms + 6_000 * c.garage_spaces + 1.8 * c.lot_area;
  return base * (1 + 0.004 * monthsSinceStart(saleDate));
}

const roundTo = (x: number, step: number) => Math.round(x / step) * step;

export function generateDemoSales(seed = DEMO_SEED): Sale[] {
  const rand = mulberry32(seed);
  const sales: Sale[] = [];
  const usedAddresses = new Set<string>();
  const address = () => {
    for (;;) {
      const a = `${1 + Math.floor(rand() * 180)} ${STREETS[Math.floor(rand() * STREETS.length)]}`;
      if (!usedAddresses.has(a)) {
        usedAddresses.add(a);
        return a;
      }
    }
  };
  const make = (c: Required<Sale['characteristics']>, saleDate: string, factor: number, extra: Partial<Sale> = {}): Sale => {
    const noise = Math.exp(0.06 * normal(rand));
    const sale: Sale = {
      id: `TR-${String(sales.length + 1).padStart(3, '0')}`,
      address: address(),
      saleDate,
      salePrice: roundTo(modelPrice(c, saleDate) * noise * factor, 500),
      characteristics: { ...c },
      verification: VERIFICATIONS[Math.floor(rand() * VERIFICATIONS.length)],
      included: true,
      ...extra,
    };
    sales.push(sale);
    return sale;
  };

  for (let i = 0; i < REGULAR_SALES; i++) {
    const living_area = roundTo(900 * Math.exp(rand() * Math.log(3000 / 900)), 10);
    const saleDate = isoDate(START + Math.floor(rand() * 700) * DAY_MS);
    const year_built = 1925 + Math.floor(rand() * 96);
    const rooms = Math.max(3, Math.round(2.2 + living_area / 400 + 0.6 * normal(rand)));
    const bedrooms = Math.min(rooms - 2, Math.max(1, Math.round(rooms / 2 - 0.5 + 0.5 * normal(rand))));
    const bathrooms = Math.max(1, roundTo(1 + living_area / 1100 + 0.3 * normal(rand), 0.5));
    const lot_area = roundTo(3000 + rand() * 9000, 50);
    const garage_spaces = Math.floor(rand() * 3);
    make({ living_area, year_built, rooms, bedrooms, bathrooms, lot_area, garage_spaces }, saleDate, 1);
  }

  // Outliers: still included, so the diagnostics have something to find.
  const outliers: [number, number, string][] = [
    [7, 1.36, 'Buyer paid well over asking after a bidding contest.'],
    [19, 0.7, 'Sold quickly; seller relocating.'],
    [41, 1.3, 'Includes a detached studio not in the living area.'],
  ];
  for (const [i, factor, notes] of outliers) {
    const s = sales[i];
    s.salePrice = roundTo(s.salePrice * factor, 500);
    s.notes = notes;
  }
  // Two sales with rooms not recorded: left out of any model that uses rooms.
  for (const i of [12, 33]) {
    delete sales[i].characteristics.rooms;
    sales[i].notes = 'Room count not recorded.';
  }

  // One influential sale: far larger and older than the rest, priced below the model.
  make(
    { living_area: 4300, year_built: 1931, rooms: 10, bedrooms: 5, bathrooms: 3, lot_area: 15_500, garage_spaces: 2 },
    '2024-06-14',
    0.78,
    { notes: 'Large older house needing repairs; condition not captured by the characteristics.' },
  );
  // Two excluded sales, with the reasons a practitioner would record.
  make({ living_area: 1640, year_built: 1978, rooms: 6, bedrooms: 3, bathrooms: 1.5, lot_area: 5200, garage_spaces: 1 }, '2023-09-08', 0.62, {
    included: false,
    excludedReason: 'Sale between family members; not an arm’s-length sale.',
  });
  make({ living_area: 2210, year_built: 1962, rooms: 8, bedrooms: 4, bathrooms: 2, lot_area: 7400, garage_spaces: 2 }, '2024-02-21', 0.8, {
    included: false,
    excludedReason: 'Lender-owned sale after foreclosure.',
  });
  return sales;
}
