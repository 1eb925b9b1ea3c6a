import { describe, expect, it } from 'vitest';
import { CHARACTERISTICS } from '../../src/domain/sale.js';
import { readSalesCsv, writeSalesCsv } from '../../src/domain/sales-csv.js';
import { closeDatabase } from '../../src/store/database.js';
import { listMarkets } from '../../src/store/markets-repo.js';
import { allSales } from '../../src/store/sales-repo.js';
import { generateDemoSales, modelPrice, mulberry32 } from '../../seed/demo-sales.js';
import { readFileSync } from 'node:fs';
import { DEMO_FOLDER, installDemoMarket, readDemoMarket, seedDemoIfEmpty } from '../../src/store/demo-market.js';
import { demoMarketJson, demoSalesCsv } from '../../seed/write-demo-files.js';
import subject from '../../seed/demo-subject.json' with { type: 'json' };
import outside from '../../seed/demo-subject-outside.json' with { type: 'json' };
import { testDatabase } from '../store/test-database.js';

describe('demo sales', () => {
  const sales = generateDemoSales();

  it('are the same on every run (seeded), about 60, all valid', () => {
    expect(generateDemoSales()).toEqual(sales);
    expect(sales).toHaveLength(60);
    const back = readSalesCsv(writeSalesCsv(sales));
    expect(back.ok).toBe(true);
  });

  it('the PRNG gives the usual first values of Mulberry32 for seed 1', () => {
    const r = mulberry32(1);
    // The first two outputs of the common JavaScript Mulberry32 for seed 1, divided by 2^32.
    expect(r()).toBeCloseTo(0.6270739405881613, 12);
    expect(r()).toBeCloseTo(0.002735721180215478, 12);
  });

  it('follow the price model within the noise, apart from the planted cases', () => {
    const planted = new Set(['TR-008', 'TR-020', 'TR-042', 'TR-058', 'TR-059', 'TR-060']);
    for (const s of sales) {
      const c = s.characteristics;
      if (planted.has(s.id) || c.rooms === undefined) continue;
      const ratio = s.salePrice / modelPrice(c as Required<typeof c>, s.saleDate);
      expect(ratio).toBeGreaterThan(Math.exp(-0.06 * 4));
      expect(ratio).toBeLessThan(Math.exp(0.06 * 4));
    }
    const ratioOf = (id: string) => {
      const s = sales.find((x) => x.id === id)!;
      return s.salePrice / modelPrice(s.characteristics as Required<typeof s.characteristics>, s.saleDate);
    };
    expect(ratioOf('TR-058')).toBeLessThan(0.9);
    expect(ratioOf('TR-008')).toBeGreaterThan(1.15);
  });

  it('have two excluded sales with reasons and two without rooms', () => {
    expect(sales.filter((s) => !s.included).map((s) => [s.id, Boolean(s.excludedReason)])).toEqual([
      ['TR-059', true],
      ['TR-060', true],
    ]);
    expect(sales.filter((s) => s.characteristics.rooms === undefined).map((s) => s.id)).toEqual(['TR-013', 'TR-034']);
  });

  it('the outside subject is larger than every sale; the demo subject lies inside every range', () => {
    const range = (c: (typeof CHARACTERISTICS)[number]) => {
      const v = sales.filter((s) => s.included).map((s) => s.characteristics[c]!).filter((x) => x !== undefined);
      return [Math.min(...v), Math.max(...v)];
    };
    expect(outside.living_area).toBeGreaterThan(range('living_area')[1]);
    for (const c of CHARACTERISTICS) {
      const [lo, hi] = range(c);
      expect((subject as Record<string, number | string>)[c]).toBeGreaterThanOrEqual(lo);
      expect((subject as Record<string, number | string>)[c]).toBeLessThanOrEqual(hi);
    }
  });
});

describe('the demo files', () => {
  it('are what the generator writes (run seed/write-demo-files.ts after changing it)', () => {
    expect(readFileSync(`${DEMO_FOLDER}/demo-sales.csv`, 'utf8')).toBe(demoSalesCsv());
    expect(readFileSync(`${DEMO_FOLDER}/demo-market.json`, 'utf8')).toBe(demoMarketJson());
    expect(readDemoMarket().sales).toEqual(generateDemoSales());
  });
});

describe('loading the demo', () => {
  it('seeds only an empty database, and rebuilding replaces the sales', async () => {
    const db = await testDatabase();
    try {
      expect(await seedDemoIfEmpty(db)).toBe(true);
      expect(await seedDemoIfEmpty(db)).toBe(false);
      const [m] = await listMarkets(db);
      expect(m.salesCount).toBe(60);
      await installDemoMarket(db);
      expect((await listMarkets(db))[0]).toEqual({ id: m.id, name: m.name, salesCount: 60 });
      expect((await allSales(db, m.id)).map((s) => s.id).sort()).toEqual(generateDemoSales().map((s) => s.id).sort());
    } finally {
      closeDatabase(db);
    }
  });
});
