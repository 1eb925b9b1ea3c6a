import { describe, expect, it } from 'vitest';
import { estimateFor, fitModel } from '../../src/domain/estimate.js';
import { DEFAULT_MODEL } from '../../src/domain/model.js';
import { estimateJsonBytes } from '../../src/web/routes/estimate-json.js';
import { makeSubject, syntheticSales } from '../helpers/sales.js';
import { testApp, testMarket } from './test-app.js';
import { importSales } from '../../src/store/sales-import.js';

const text = (bytes: Uint8Array) => Buffer.from(bytes).toString('utf8');

describe('estimateJsonBytes', () => {
  it('gives the bytes of JSON.stringify(result), for every subject of one cached fit', () => {
    const sales = syntheticSales(120, 7);
    // Text beyond ASCII in a reference and a reason, as users type them.
    sales[3] = { ...sales[3], id: 'Öland–7 “north”' };
    sales[5] = { ...sales[5], included: false, excludedReason: 'sold to the neighbour’s son' };
    const fitted = fitModel(sales, DEFAULT_MODEL, '2024-01-01');
    for (const area of [1500, 2600, 9000]) {
      const result = estimateFor(fitted, makeSubject({ living_area: area, year_built: 1990, rooms: 7 }));
      expect(result.sales).toBe(fitted.summary.sales);
      expect(text(estimateJsonBytes(result))).toBe(JSON.stringify(result));
    }
    // Fields JSON.stringify leaves out are left out.
    const result = estimateFor(fitted, makeSubject({ living_area: 1800, year_built: 1990, rooms: 7 }));
    expect(text(estimateJsonBytes({ ...result, extra: undefined } as typeof result))).toBe(JSON.stringify(result));
  });

  it('the JSON API answers those bytes with Content-Type application/json and their length', async () => {
    const t = await testApp();
    const market = await testMarket(t.db);
    await importSales(t.db, market.id, syntheticSales(60, 3), { by: 'test', fileName: 't.csv' });
    const body = JSON.stringify({ subject: { address: '1 Subject Street', effective_date: '2024-01-01', living_area: 1700, year_built: 1985, rooms: 6 } });
    const post = () =>
      t.app.request(`/api/markets/${market.id}/estimate`, { method: 'POST', headers: { 'Content-Type': 'application/json', Origin: 'http://localhost' }, body });
    const first = await post();
    expect(first.status).toBe(200);
    expect(first.headers.get('Content-Type')).toBe('application/json');
    const firstText = await first.text();
    const parsed = JSON.parse(firstText);
    expect(parsed.n).toBe(60);
    expect(firstText).toBe(JSON.stringify(parsed));
    // The second answer comes from the cached fit and its kept bytes: the same text.
    expect(await (await post()).text()).toBe(firstText);
  });
});
