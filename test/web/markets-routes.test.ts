import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { closeDatabase } from '../../src/store/database.js';
import { findMarketByName, listMarkets } from '../../src/store/markets-repo.js';
import { CAUTION_TEXT } from '../../src/web/views/caution.js';
import { HTMX, testApp, testMarket, textOf, type TestApp } from './test-app.js';

let t: TestApp;
beforeEach(async () => {
  t = await testApp();
});
afterEach(() => closeDatabase(t.db));

describe('markets', () => {
  it('lists markets as a full page, or only the table for htmx, and says it varies on HX-Request', async () => {
    await testMarket(t.db, 'Elm Park');
    const page = await t.get('/markets');
    expect(page.status).toBe(200);
    expect(page.headers.get('Vary')).toContain('HX-Request');
    const html = await page.text();
    expect(html.startsWith('<!doctype html>')).toBe(true);
    expect(html).toContain('Elm Park');
    expect(textOf(html)).toContain(CAUTION_TEXT);

    const fragment = await (await t.get('/markets', HTMX)).text();
    expect(fragment).toContain('id="markets-table"');
    expect(fragment).not.toContain('<html');
  });

  it('a history restore gets the full page even though htmx sent HX-Request', async () => {
    const html = await (await t.get('/markets', { ...HTMX, 'HX-History-Restore-Request': 'true' })).text();
    expect(html).toContain('<html');
  });

  it('creates a market and redirects to it (303 without htmx, HX-Redirect with)', async () => {
    const r = await t.post('/markets', { name: 'Elm Park', area_unit: 'm2', currency: 'eur' });
    expect(r.status).toBe(303);
    const m = await findMarketByName(t.db, 'Elm Park');
    expect(m).toMatchObject({ areaUnit: 'm2', currency: 'EUR' });
    expect(r.headers.get('Location')).toBe(`/markets/${m!.id}`);

    const h = await t.post('/markets', { name: 'Birch End', area_unit: 'sqft', currency: 'USD' }, HTMX);
    expect(h.status).toBe(200);
    expect(h.headers.get('HX-Redirect')).toMatch(/^\/markets\/\d+$/);
  });

  it('re-renders the form with 422 and each error beside its field; nothing is written', async () => {
    const r = await t.post('/markets', { name: '', area_unit: 'acres', currency: 'dollars' }, HTMX);
    expect(r.status).toBe(422);
    const html = await r.text();
    expect(html).toContain('id="market-form"');
    expect(html).not.toContain('<html');
    expect(html).toMatch(/id="f-name-error"[^>]*>name is required/);
    expect(html).toMatch(/id="f-area_unit-error"[^>]*>area_unit must be sqft or m2, got &quot;acres&quot;/);
    expect(html).toMatch(/id="f-currency-error"[^>]*>currency must be a three-letter ISO 4217 code/);
    expect(await listMarkets(t.db)).toEqual([]);
  });

  it('refuses a second market of the same name', async () => {
    await testMarket(t.db, 'Elm Park');
    const r = await t.post('/markets', { name: 'Elm Park', area_unit: 'sqft', currency: 'USD' });
    expect(r.status).toBe(422);
    expect(await r.text()).toContain('a market named &quot;Elm Park&quot; already exists');
  });

  it('edits a market', async () => {
    const m = await testMarket(t.db, 'Elm Park');
    const form = await (await t.get(`/markets/${m.id}/edit`)).text();
    expect(form).toContain('value="Elm Park"');
    const r = await t.post(`/markets/${m.id}`, { name: 'Elm Park North', area_unit: 'sqft', currency: 'CAD', notes: 'north of the river' });
    expect(r.status).toBe(303);
    expect(await findMarketByName(t.db, 'Elm Park North')).toMatchObject({ currency: 'CAD', notes: 'north of the river' });
  });

  it('answers 404 with a page for a market that does not exist, and for a malformed id', async () => {
    const r = await t.get('/markets/999');
    expect(r.status).toBe(404);
    expect(await r.text()).toContain('market 999 does not exist');
    expect((await t.get('/markets/abc')).status).toBe(404);
    const h = await t.get('/markets/999', HTMX);
    expect(h.status).toBe(404);
    expect(h.headers.get('HX-Retarget')).toBe('#messages');
  });

  it('GET /api/markets lists id, name and sales count', async () => {
    const a = await testMarket(t.db, 'Birch End');
    await t.post(`/markets/${a.id}/sales`, { address: '1 Low Road', sale_date: '2024-01-01', sale_price: '100000' });
    const b = await testMarket(t.db, 'Alder Green');
    const r = await t.get('/api/markets');
    expect(r.headers.get('Content-Type')).toContain('application/json');
    expect(await r.json()).toEqual([
      { id: b.id, name: 'Alder Green', salesCount: 0 },
      { id: a.id, name: 'Birch End', salesCount: 1 },
    ]);
  });

  it('serves htmx and the stylesheet from the project', async () => {
    const js = await t.get('/static/htmx.min.js');
    expect(js.status).toBe(200);
    expect(js.headers.get('Content-Type')).toContain('javascript');
    expect(await js.text()).toContain('htmx');
    const css = await t.get('/static/app.css');
    expect(css.headers.get('Content-Type')).toContain('text/css');
    expect((await t.get('/static/nothing.js')).status).toBe(404);
  });

  it('redirects / to the markets', async () => {
    const r = await t.get('/');
    expect(r.status).toBe(302);
    expect(r.headers.get('Location')).toBe('/markets');
  });
});
