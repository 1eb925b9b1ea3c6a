/** Invented, valid sales CSV text of any length for durability tests (seeded, so every run is the same). */
import { mulberry32 } from '../../seed/demo-sales.js';

/**
 * `rows` valid sales. Without `refPrefix` the file has no `id` column, so the app
 * generates references and the same file can be imported into a market more than once.
 */
export function salesCsv(rows: number, options: { seed?: number; refPrefix?: string; street?: string } = {}): string {
  const rand = mulberry32(options.seed ?? 6);
  const street = options.street ?? 'Durable Lane';
  const header = `${options.refPrefix ? 'id,' : ''}address,sale_date,sale_price,living_area,year_built,rooms,bathrooms,garage_spaces`;
  const lines = [header];
  for (let i = 1; i <= rows; i++) {
    const area = Math.round(800 + rand() * 2400);
    const year = 1930 + Math.floor(rand() * 90);
    const rooms = Math.max(3, Math.round(2 + area / 400 + (rand() - 0.5) * 2));
    const month = String(1 + Math.floor(rand() * 12)).padStart(2, '0');
    const price = Math.round(((45000 + 110 * area - 700 * (2024 - year) + 5000 * rooms) * Math.exp((rand() - 0.5) * 0.2)) / 100) * 100;
    const bathrooms = 1 + Math.floor(rand() * 4) / 2;
    const garage = Math.floor(rand() * 3);
    const ref = options.refPrefix ? `${options.refPrefix}${i},` : '';
    lines.push(`${ref}${i} ${street},2024-${month}-15,${price},${area},${year},${rooms},${bathrooms},${garage}`);
  }
  return lines.join('\n') + '\n';
}
