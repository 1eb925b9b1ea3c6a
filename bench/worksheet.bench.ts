/**
 * Worksheet benchmark: a saved estimate of 300 generated sales with 7 predictors →
 * worksheet model → PDF (and CSV). Prints the median and slowest of repeated runs, the page
 * count and the file sizes. Target (issue 5): a 300-sale worksheet renders in ≤ 1 s.
 * Run: npm run bench:worksheet
 */
import { runEstimate } from '../src/domain/estimate.js';
import { validateModel } from '../src/domain/model.js';
import type { Sale } from '../src/domain/sale.js';
import type { SavedEstimate } from '../src/domain/saved-estimate.js';
import { worksheetCsv } from '../src/worksheet/worksheet-csv.js';
import { buildWorksheet } from '../src/worksheet/worksheet-model.js';
import { worksheetPdf } from '../src/worksheet/worksheet-pdf.js';

const STREETS = ['Bench Road', 'Trial Lane', 'Sample Court', 'Measure Way'];

function generate(n: number, seed: number): Sale[] {
  let s = seed;
  const rnd = () => ((s = (s * 48271) % 2147483647) / 2147483647);
  const sales: Sale[] = [];
  for (let i = 0; i < n; i++) {
    const area = Math.round(700 + rnd() * 2600);
    const yearBuilt = 1920 + Math.floor(rnd() * 100);
    const rooms = Math.max(2, Math.round(area / 330 + rnd() * 2 - 1));
    const baths = 1 + Math.floor(rnd() * 5) / 2;
    const lot = Math.round(2500 + rnd() * 20000);
    const garage = Math.floor(rnd() * 4);
    const day = Math.floor(rnd() * 700);
    const saleDate = new Date(Date.UTC(2023, 0, 1) + day * 86_400_000).toISOString().slice(0, 10);
    const price = 30000 + 105 * area - 650 * (2024 - yearBuilt) + 3500 * rooms + 9000 * baths + 1.5 * lot + 7000 * garage + 150 * day + (rnd() - 0.5) * 40000;
    sales.push({
      id: `B-${String(i + 1).padStart(3, '0')}`,
      address: `${1 + Math.floor(rnd() * 400)} ${STREETS[i % STREETS.length]}`,
      saleDate,
      salePrice: Math.round(price / 100) * 100,
      characteristics: { living_area: area, year_built: yearBuilt, rooms, bedrooms: Math.max(1, rooms - 3), bathrooms: baths, lot_area: lot, garage_spaces: garage },
      verification: 'Deed and closing statement',
      included: i % 50 !== 7,
      ...(i % 50 === 7 ? { excludedReason: 'Not an arm\'s-length sale.' } : {}),
    });
  }
  return sales;
}

const model = validateModel({ predictors: ['living_area', 'age', 'rooms', 'bathrooms', 'lot_area', 'garage_spaces', 'months_since_sale'] });
if (!model.ok) throw new Error(model.errors.join('\n'));
const subject = {
  address: '1 Bench Subject',
  effectiveDate: '2025-01-01',
  characteristics: { living_area: 1900, year_built: 1995, rooms: 7, bedrooms: 3, bathrooms: 2, lot_area: 8000, garage_spaces: 2 },
};
const sales = generate(300, 4242);
const saved: SavedEstimate = {
  id: 1,
  market: { id: 1, name: 'Bench market', areaUnit: 'sqft', currency: 'USD' },
  createdAt: '2025-01-02T09:30:00.000Z',
  createdBy: 'bench',
  appVersion: '0.0.0-bench',
  subject,
  model: model.value,
  sales,
  result: runEstimate(sales, subject, model.value),
};

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

async function measure(runs: number) {
  const times = { model: [] as number[], pdf: [] as number[], csv: [] as number[], total: [] as number[] };
  let bytes = 0;
  let csvBytes = 0;
  for (let r = 0; r < runs; r++) {
    const t0 = performance.now();
    const ws = buildWorksheet(saved);
    const t1 = performance.now();
    const pdf = await worksheetPdf(ws);
    const t2 = performance.now();
    const csv = worksheetCsv(ws);
    const t3 = performance.now();
    times.model.push(t1 - t0);
    times.pdf.push(t2 - t1);
    times.csv.push(t3 - t2);
    times.total.push(t2 - t0);
    bytes = pdf.length;
    csvBytes = Buffer.byteLength(csv);
  }
  return { times, bytes, csvBytes };
}

await measure(3); // warm up the JIT and the font metrics
const runs = 15;
const { times, bytes, csvBytes } = await measure(runs);
const ws = buildWorksheet(saved);
const pages = ((await worksheetPdf(ws)).toString('latin1').match(/\/Type \/Page\b/g) ?? []).length;

console.log(`compfit worksheet benchmark: ${saved.result.n} sales used of ${sales.length}, ${saved.result.predictors.length} predictors`);
console.log(`node ${process.version}, ${process.arch}`);
console.log(`runs ${runs}`);
console.log(`worksheet model   median ${median(times.model).toFixed(1)} ms`);
console.log(`PDF render        median ${median(times.pdf).toFixed(1)} ms, slowest ${Math.max(...times.pdf).toFixed(1)} ms`);
console.log(`model + PDF       median ${median(times.total).toFixed(1)} ms, slowest ${Math.max(...times.total).toFixed(1)} ms  (target ≤ 1000 ms)`);
console.log(`CSV               median ${median(times.csv).toFixed(1)} ms`);
console.log(`PDF ${pages} pages, ${(bytes / 1024).toFixed(0)} KiB; CSV ${(csvBytes / 1024).toFixed(0)} KiB`);
