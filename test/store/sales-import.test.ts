import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { Sale } from '../../src/domain/sale.js';
import { readSalesCsv, writeSalesCsv } from '../../src/domain/sales-csv.js';
import { closeDatabase, type Database } from '../../src/store/database.js';
import { countSales } from '../../src/store/markets-repo.js';
import { findBatch, savePreview } from '../../src/store/import-batches-repo.js';
import { addSale, allSales, listSaleChanges } from '../../src/store/sales-repo.js';
import { findTakenRefs, importSales } from '../../src/store/sales-import.js';
import { toDomainSale } from '../../src/store/sale-columns.js';
import { testDatabase, testMarket } from './test-database.js';

let db: Database;
let marketId: number;
beforeEach(async () => {
  db = await testDatabase();
  marketId = (await testMarket(db)).id;
});
afterEach(() => closeDatabase(db));

function sale(i: number, over: Partial<Sale> = {}): Sale {
  return {
    id: '',
    address: `${i} Quarry Road`,
    saleDate: '2024-05-01',
    salePrice: 200000 + i,
    characteristics: { living_area: 1000 + i, bathrooms: 1.5 },
    included: true,
    ...over,
  };
}

describe('importSales', () => {
  it('writes every sale with a history row and generated references after existing ones', async () => {
    await addSale(db, marketId, sale(0, { id: 'S-0007' }), 'ann');
    const r = await importSales(db, marketId, [sale(1, { id: 'K1' }), sale(2), sale(3)], { by: 'bob', fileName: 'a.csv' });
    expect(r.ok).toBe(true);
    const all = await allSales(db, marketId);
    expect(all.map((s) => s.id).sort()).toEqual(['K1', 'S-0007', 'S-0008', 'S-0009']);
    const k1 = all.find((s) => s.id === 'K1')!;
    expect(k1.characteristics).toEqual({ living_area: 1001, bathrooms: 1.5 });
    const history = await listSaleChanges(db, marketId, k1.key);
    expect(history).toHaveLength(1);
    expect(history[0]).toMatchObject({ action: 'import', by: 'bob', after: toDomainSale(k1) });
  });

  it('writes nothing when a reference is already in the market, and names the row', async () => {
    await addSale(db, marketId, sale(0, { id: 'K2' }), 'ann');
    const r = await importSales(db, marketId, [sale(1, { id: 'K1' }), sale(2, { id: 'K2' })], { by: 'bob', fileName: 'a.csv' });
    expect(r).toEqual({ ok: false, errors: [{ row: 2, column: 'id', value: 'K2', message: 'id "K2" is already used by a sale in this market' }] });
    expect(await countSales(db, marketId)).toBe(1);
    expect(await findTakenRefs(db, marketId, [sale(5, { id: 'K2' })])).toHaveLength(1);
  });

  it('commits a previewed batch and clears its stored text', async () => {
    const text = writeSalesCsv([sale(1), sale(2)]);
    const batchId = await savePreview(db, { marketId, fileName: 'p.csv', csvText: text, rowCount: 2, by: 'ann' });
    const parsed = readSalesCsv(text);
    if (!parsed.ok) throw new Error('fixture');
    const r = await importSales(db, marketId, parsed.sales, { by: 'ann', fileName: 'p.csv', batchId });
    expect(r).toEqual({ ok: true, count: 2, batchId });
    expect(await findBatch(db, marketId, batchId)).toMatchObject({ status: 'committed', csvText: null, rowCount: 2 });
  });

  it('keeps excluded sales and their reasons', async () => {
    await importSales(db, marketId, [sale(1, { included: false, excludedReason: 'sold to a neighbour' })], { by: 'a', fileName: 'x' });
    const [s] = await allSales(db, marketId);
    expect(s).toMatchObject({ included: false, excludedReason: 'sold to a neighbour' });
  });
});
