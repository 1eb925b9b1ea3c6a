import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { Sale } from '../../src/domain/sale.js';
import { closeDatabase, type Database } from '../../src/store/database.js';
import {
  addSale,
  allSales,
  deleteSale,
  excludeSale,
  findSale,
  getSale,
  includeSale,
  listSaleChanges,
  listSales,
  restoreSale,
  updateSale,
} from '../../src/store/sales-repo.js';
import { testDatabase, testMarket } from './test-database.js';

function sale(over: Partial<Sale> = {}): Sale {
  return {
    id: '',
    address: '12 Elm Row',
    saleDate: '2024-03-01',
    salePrice: 250000,
    characteristics: { living_area: 1500, year_built: 1990, rooms: 6 },
    included: true,
    ...over,
  };
}

let db: Database;
let marketId: number;
beforeEach(async () => {
  db = await testDatabase();
  marketId = (await testMarket(db)).id;
});
afterEach(() => closeDatabase(db));

describe('sales repository', () => {
  it('adds a sale, generating S-0001, S-0002 for sales without a reference', async () => {
    const a = await addSale(db, marketId, sale(), 'tester');
    const b = await addSale(db, marketId, sale({ address: '14 Elm Row' }), 'tester');
    expect(a.ok && a.sale.id).toBe('S-0001');
    expect(b.ok && b.sale.id).toBe('S-0002');
    const got = await getSale(db, marketId, a.ok ? a.sale.key : -1);
    expect(got).toMatchObject({ address: '12 Elm Row', salePrice: 250000, characteristics: { living_area: 1500, year_built: 1990, rooms: 6 }, included: true });
    expect(got.characteristics).not.toHaveProperty('bedrooms');
  });

  it('refuses a reference already used in the market, as a field error', async () => {
    await addSale(db, marketId, sale({ id: 'A1' }), 'tester');
    const r = await addSale(db, marketId, sale({ id: 'A1' }), 'tester');
    expect(r).toEqual({ ok: false, errors: { id: 'id "A1" is already used by another sale in this market' } });
    expect((await allSales(db, marketId)).length).toBe(1);
  });

  it('the same reference may be used in another market', async () => {
    const other = await testMarket(db, 'Other');
    await addSale(db, marketId, sale({ id: 'A1' }), 'tester');
    expect((await addSale(db, other.id, sale({ id: 'A1' }), 'tester')).ok).toBe(true);
  });

  it('lookups return undefined, getSale throws', async () => {
    expect(await findSale(db, marketId, 999)).toBeUndefined();
    await expect(getSale(db, marketId, 999)).rejects.toThrow('sale 999 of market');
  });

  it('records who changed what, with the sale before and after', async () => {
    const a = await addSale(db, marketId, sale({ id: 'A1' }), 'ann');
    if (!a.ok) throw new Error('add failed');
    await updateSale(db, marketId, a.sale.key, sale({ id: 'A1', salePrice: 260000 }), 'bob');
    await excludeSale(db, marketId, a.sale.key, 'sold between relatives', 'cy');
    const back = await includeSale(db, marketId, a.sale.key, 'dee');
    expect(back.included).toBe(true);
    expect(back.excludedReason).toBeUndefined();
    const changes = await listSaleChanges(db, marketId, a.sale.key);
    expect(changes.map((c) => [c.action, c.by])).toEqual([
      ['include', 'dee'],
      ['exclude', 'cy'],
      ['update', 'bob'],
      ['create', 'ann'],
    ]);
    expect(changes[2].before?.salePrice).toBe(250000);
    expect(changes[2].after?.salePrice).toBe(260000);
    expect(changes[1].after).toMatchObject({ included: false, excludedReason: 'sold between relatives' });
  });

  it('deletes and restores a sale under its old key, reference and creation time', async () => {
    const a = await addSale(db, marketId, sale({ id: 'A1', notes: 'corner lot' }), 'ann');
    if (!a.ok) throw new Error('add failed');
    const { changeId } = await deleteSale(db, marketId, a.sale.key, 'bob');
    expect(await findSale(db, marketId, a.sale.key)).toBeUndefined();
    const r = await restoreSale(db, marketId, changeId, 'bob');
    expect(r.ok).toBe(true);
    const back = await getSale(db, marketId, a.sale.key);
    expect(back).toMatchObject({ id: 'A1', notes: 'corner lot', createdAt: a.sale.createdAt });
    expect((await restoreSale(db, marketId, changeId, 'bob')).ok).toBe(false);
    expect((await listSaleChanges(db, marketId, a.sale.key)).map((c) => c.action)).toEqual(['restore', 'delete', 'create']);
  });

  it('filters by text, date range and status; sorts and pages', async () => {
    for (let i = 0; i < 30; i++)
      await addSale(
        db,
        marketId,
        sale({
          id: `R${String(i).padStart(2, '0')}`,
          address: i % 3 === 0 ? `${i} Mill Lane` : `${i} High Street`,
          saleDate: `2024-01-${String(i + 1).padStart(2, '0')}`,
          salePrice: 100000 + i * 1000,
          included: i % 5 !== 0,
          ...(i % 5 === 0 ? { excludedReason: 'not arm’s length' } : {}),
        }),
        't',
      );
    const mill = await listSales(db, marketId, { text: 'mill' });
    expect(mill.total).toBe(10);
    const range = await listSales(db, marketId, { from: '2024-01-05', to: '2024-01-09' });
    expect(range.total).toBe(5);
    const excluded = await listSales(db, marketId, { status: 'excluded' });
    expect(excluded.sales.map((s) => s.id)).toEqual(['R25', 'R20', 'R15', 'R10', 'R05', 'R00']);
    const cheapest = await listSales(db, marketId, { sort: 'sale_price', direction: 'asc', pageSize: 7, page: 2 });
    expect(cheapest.sales.map((s) => s.salePrice)).toEqual([107000, 108000, 109000, 110000, 111000, 112000, 113000]);
    expect(cheapest.pageCount).toBe(5);
    const beyond = await listSales(db, marketId, { pageSize: 7, page: 99 });
    expect(beyond.page).toBe(5);
    expect(beyond.sales.length).toBe(2);
  });

  it('treats % and _ in the text filter as plain characters', async () => {
    await addSale(db, marketId, sale({ address: '50% Share Court' }), 't');
    await addSale(db, marketId, sale({ address: '500 Long Road' }), 't');
    expect((await listSales(db, marketId, { text: '50%' })).sales.map((s) => s.address)).toEqual(['50% Share Court']);
    expect((await listSales(db, marketId, { text: '_' })).total).toBe(0);
  });
});
