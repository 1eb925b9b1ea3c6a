/**
 * Writes the demo market's files from the generator: seed/demo-market.json and
 * seed/demo-sales.csv. The app loads those files (it does not run the generator), and a
 * test checks they match what the generator gives, so run this after changing it:
 *   npx tsx seed/write-demo-files.ts
 */
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { writeSalesCsv } from '../src/domain/sales-csv.js';
import { DEMO_MARKET, generateDemoSales } from './demo-sales.js';

const here = path.dirname(fileURLToPath(import.meta.url));

export function demoMarketJson(): string {
  return `${JSON.stringify({ name: DEMO_MARKET.name, area_unit: DEMO_MARKET.areaUnit, currency: DEMO_MARKET.currency, notes: DEMO_MARKET.notes }, null, 2)}\n`;
}

export function demoSalesCsv(): string {
  return writeSalesCsv(generateDemoSales());
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  writeFileSync(path.join(here, 'demo-market.json'), demoMarketJson());
  writeFileSync(path.join(here, 'demo-sales.csv'), demoSalesCsv());
  console.log('wrote seed/demo-market.json and seed/demo-sales.csv');
}
