/**
 * Engine benchmark: fit + every diagnostic + subject estimate (runEstimate, the whole Result)
 * for 1,000, 10,000 and 100,000 generated sales with 6 predictors. Prints the median of
 * repeated runs, the cost per sale (linear cost keeps it flat) and peak memory.
 * Target (issue 2): 100,000 sales in ≤ 150 ms.
 * Two figures per size: the whole Result JSON (runEstimate), and the numbers alone (every
 * statistic, without the per-sale rows and the adjustment grid), since at 100,000 sales most
 * of the time goes into building those two million small objects.
 * Run: npm run bench
 */
import { runEstimate, selectSales } from '../src/domain/estimate.js';
import { influenceMeasures } from '../src/stats/influence.js';
import { pointIntervals } from '../src/stats/intervals.js';
import { pressStatistics } from '../src/stats/press.js';
import { ratioStudy } from '../src/stats/ratio-study.js';
import { breuschPaganKoenker, jarqueBera } from '../src/stats/residual-tests.js';
import { standardizedFit } from '../src/stats/standardized-fit.js';
import { conditionDiagnosticsOfFactor } from '../src/stats/condition-indices.js';
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
/**
 * The numbers alone: sales selection and every statistic of the result (fit, collinearity,
 * influence, PRESS, leave-one-out ratio study, residual tests, the subject's intervals),
 * without building the per-sale rows and the adjustment grid of the Result JSON.
 */
function numbersOnly(sales: Sale[]): void {
  if (!model.ok) return;
  const { used, columns } = selectSales(sales, subject.effectiveDate, model.value);
  const terms = model.value.predictors.map((name, j) => ({ name, values: columns[j] }));
  const y = Float64Array.from(used, (u) => u.salePrice);
  const fit = standardizedFit(terms, y);
  const ls = fit.regression.ls;
  conditionDiagnosticsOfFactor(fit.rawDesignFactor);
  influenceMeasures(ls.residuals, ls.hatValues, ls.sigma, ls.p);
  const press = pressStatistics(ls.residuals, ls.hatValues, fit.regression.tss);
  ratioStudy(y.map((v, i) => v - press.pressResiduals[i]), y);
  breuschPaganKoenker(ls);
  jarqueBera(ls.residuals);
  const at = fit.predictAt([1900, 30, 7, 2, 8000, 2]);
  pointIntervals(at.fit, ls.sigma, at.leverage, ls.dfResidual, 0.95);
}

console.log('whole Result (runEstimate)                      | numbers only (no per-sale rows or grid)');
console.log('sales      runs  median ms  min ms   µs/sale  peak RSS MB | median ms  min ms');
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
    const t0 = performance.now();
    const result = runEstimate(sales, subject, model.value);
    times.push(performance.now() - t0);
    peak = Math.max(peak, process.memoryUsage().rss);
    if (result.n !== n) throw new Error('bench: wrong n');
  }
  times.sort((a, b) => a - b);
  const median = times[Math.floor(times.length / 2)];
  const core: number[] = [];
  for (let r = 0; r < runs; r++) {
    const t0 = performance.now();
    numbersOnly(sales);
    core.push(performance.now() - t0);
  }
  core.sort((a, b) => a - b);
  console.log(
    `${String(n).padStart(7)}  ${String(runs).padStart(6)}  ${median.toFixed(1).padStart(9)}  ${times[0].toFixed(1).padStart(6)}  ${((median * 1000) / n).toFixed(2).padStart(8)}  ${(peak / 1048576).toFixed(0).padStart(11)} | ${core[Math.floor(core.length / 2)].toFixed(1).padStart(9)}  ${core[0].toFixed(1).padStart(6)}`,
  );
}
