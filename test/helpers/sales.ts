/** Small builders of sales and subjects for tests (invented values, no real properties). */
import type { Sale, Subject } from '../../src/domain/sale.js';

import { mulberry32 } from '../../seed/demo-sales.js';

/** Seeded uniform [0, 1) generator, the demo's Mulberry32, so tests are repeatable. */
export const seededRandom = mulberry32;

export function makeSale(id: string, price: number, c: Sale['characteristics'], saleDate = '2024-05-15'): Sale {
  return { id, address: `${id} Test Lane`, saleDate, salePrice: price, characteristics: c, included: true };
}

/** n sales from price = 40,000 + 110·area − 700·age + 4,000·rooms + noise. */
export function syntheticSales(n: number, seed = 1, noise = 15000): Sale[] {
  const rnd = seededRandom(seed);
  const sales: Sale[] = [];
  for (let i = 0; i < n; i++) {
    const area = Math.round(900 + rnd() * 1800);
    const yearBuilt = 1940 + Math.floor(rnd() * 80);
    const rooms = Math.max(3, Math.round(area / 320 + rnd() * 3 - 1.5));
    const month = 1 + Math.floor(rnd() * 12);
    const saleDate = `2023-${String(month).padStart(2, '0')}-15`;
    const price = 40000 + 110 * area - 700 * (2023 - yearBuilt) + 4000 * rooms + (rnd() - 0.5) * 2 * noise;
    sales.push(makeSale(`T${i + 1}`, Math.round(price), { living_area: area, year_built: yearBuilt, rooms, bathrooms: 1 + Math.floor(rnd() * 4) / 2 }, saleDate));
  }
  return sales;
}

export function makeSubject(c: Subject['characteristics'], effectiveDate = '2024-01-01'): Subject {
  return { address: '1 Subject Street', effectiveDate, characteristics: c };
}
