/**
 * Engine benchmark: fit + every diagnostic + subject estimate (runEstimate, the whole Result)
 * for 1,000, 10,000 and 100,000 generated sales with 6 predictors. Prints the median of
 * repeated runs, the cost per sale (linear cost keeps it flat) and peak memory.
 * Target (issue 2): 100,000 sales in ≤ 150 ms.
 * Run: npm run bench (node --expose-gc, so each run starts from a collected heap)
 */
import { runEstimate } from '../src/domain/estimate.js';
import { validateModel } from '../src/domain/model.js';
import type { Sale } from '../src/domain/sale.js';

function generate(n: number, seed: number): Sale[] {
  let s = seed;
  const rnd = () => ((s = (s * 48271) % 2147483647) / 2147483647);
  const sales: Sale[] = [];
  for (let i = 0; i < n; i++) {
    const area = 700 + rnd() * 2600;
    const yearBuilt = 1920 + Math.floor(rnd() * 100);
    const rooms = Math.max(2, Math.round(area / 330 + rnd() * 2 - 1));
    const baths = 1 + Math.floor(rnd() * 5) / 2;
    const lot = 2500 + rnd() * 20000;
    const garage = Math.floor(rnd() * 4);
    const month = 1 + Math.floor(rnd() * 12);
    const price = 30000 + 105 * area - 650 * (2024 - yearBuilt) + 3500 * rooms + 9000 * baths + 1.5 * lot + 7000 * garage + (rnd() - 0.5) * 40000;
    sales.push({
      id: `B${i}`,
      address: `${i} Bench Road`,
      saleDate: `2024-${String(month).padStart(2, '0')}-10`,
      salePrice: price,
      characteristics: { living_area: area, year_built: yearBuilt, rooms, bathrooms: baths, lot_area: lot, garage_spaces: garage },
      included: true,
    });
  }
  return sales;
}

const model = validateModel({ predictors: ['living_area', 'age', 'rooms', 'bathrooms', 'lot_area', 'garage_spaces'] });
if (!model.ok) throw new Error(model.errors.join('\n'));
const subject = {
  address: '1 Bench Subject',
  effectiveDate: '2025-01-01',
  characteristics: { living_area: 1900, year_built: 1995, rooms: 7, bathrooms: 2, lot_area: 8000, garage_spaces: 2 },
};

console.log('compfit engine benchmark: runEstimate (fit, diagnostics, ratio study, grid, warnings), 6 predictors');
console.log(`node ${process.version}, ${process.arch}`);
console.log('sales      runs  median ms  min ms   µs/sale  peak RSS MB');
for (const [n, runs] of [
  [1_000, 41],
  [10_000, 21],
  [100_000, 11],
] as const) {
  const sales = generate(n, 12345);
  runEstimate(sales, subject, model.value); // warm up the JIT
  const times: number[] = [];
  let peak = process.memoryUsage().rss;
  for (let r = 0; r < runs; r++) {
    // Start each run from a collected heap, so one run's garbage is not billed to the next.
    globalThis.gc?.();
    const t0 = performance.now();
    const result = runEstimate(sales, subject, model.value);
    times.push(performance.now() - t0);
    peak = Math.max(peak, process.memoryUsage().rss);
    if (result.n !== n) throw new Error('bench: wrong n');
  }
  times.sort((a, b) => a - b);
  const median = times[Math.floor(times.length / 2)];
  console.log(
    `${String(n).padStart(7)}  ${String(runs).padStart(6)}  ${median.toFixed(1).padStart(9)}  ${times[0].toFixed(1).padStart(6)}  ${((median * 1000) / n).toFixed(2).padStart(8)}  ${(peak / 1048576).toFixed(0).padStart(11)}`,
  );
}
