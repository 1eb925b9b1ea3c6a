import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { closeDatabase } from '../../src/store/database.js';
import type { Market } from '../../src/store/markets-repo.js';
import { allSales, listSaleChanges } from '../../src/store/sales-repo.js';
import { HTMX, testApp, testMarket, textOf, type TestApp } from './test-app.js';

let t: TestApp;
let m: Market;
beforeEach(async () => {
  t = await testApp();
  m = await testMarket(t.db, 'Elm Park', 'm2', 'EUR');
});
afterEach(() => closeDatabase(t.db));

const GOOD = { address: '4 Mill Lane', sale_date: '2024-04-02', sale_price: '€312,500', living_area: '120.5', year_built: '1988', rooms: '5', bathrooms: '1.5' };

async function add(fields: Record<string, string>) {
  return t.post(`/markets/${m.id}/sales`, fields);
}

describe('sale form', () => {
  it('labels inputs with the market unit and currency', async () => {
    const html = await (await t.get(`/markets/${m.id}/sales/new`)).text();
    expect(html).toMatch(/<label for="f-living_area">Living area<\/label>/);
    expect(html).toMatch(/id="f-living_area"[^>]*\/><span class="unit">m²<\/span>/);
    expect(html).toMatch(/id="f-sale_price"[^>]*\/><span class="unit">EUR<\/span>/);
    const fragment = await (await t.get(`/markets/${m.id}/sales/new`, HTMX)).text();
    expect(fragment.startsWith('<form id="sale-form"')).toBe(true);
  });

  it('adds a sale, gives it a reference and records who added it', async () => {
    const r = await add(GOOD);
    expect(r.status).toBe(303);
    const [s] = await allSales(t.db, m.id);
    expect(s).toMatchObject({ id: 'S-0001', address: '4 Mill Lane', salePrice: 312500, characteristics: { living_area: 120.5, year_built: 1988, rooms: 5, bathrooms: 1.5 } });
    expect(r.headers.get('Location')).toBe(`/markets/${m.id}/sales/${s.key}`);
    const page = textOf(await (await t.get(`/markets/${m.id}/sales/${s.key}`)).text());
    expect(page).toContain('€312,500');
    expect(page).toContain('120.5 m²');
    expect(page).toMatch(/History .* web Added/);
  });

  it('shows each error beside its field with 422, keeps what was typed, writes nothing', async () => {
    const r = await t.post(`/markets/${m.id}/sales`, { ...GOOD, sale_price: '-5', living_area: 'big', year_built: '2030' }, HTMX);
    expect(r.status).toBe(422);
    const html = await r.text();
    expect(html.startsWith('<form id="sale-form"')).toBe(true);
    expect(html).toMatch(/id="f-sale_price-error"[^>]*>sale_price must be greater than 0, got &quot;-5&quot;/);
    expect(html).toMatch(/id="f-living_area-error"[^>]*>living_area must be a plain number, got &quot;big&quot;/);
    expect(html).toMatch(/id="f-year_built-error"[^>]*>year_built 2030 is after the year of sale 2024/);
    expect(html).toContain('value="4 Mill Lane"');
    expect(html).toContain('3 fields need attention; nothing was saved.');
    expect(await allSales(t.db, m.id)).toEqual([]);
  });

  it('without htmx, the 422 answer is the whole page', async () => {
    const r = await add({ ...GOOD, sale_date: '02/04/2024' });
    expect(r.status).toBe(422);
    const html = await r.text();
    expect(html).toContain('<html');
    expect(html).toContain('sale_date must be a real date as YYYY-MM-DD, got &quot;02/04/2024&quot;');
  });

  it('edits a sale and keeps the change in its history', async () => {
    await add({ ...GOOD, id: 'EP-1' });
    const [s] = await allSales(t.db, m.id);
    const form = await (await t.get(`/markets/${m.id}/sales/${s.key}/edit`)).text();
    expect(form).toContain('value="312500"');
    const r = await t.post(`/markets/${m.id}/sales/${s.key}`, { ...GOOD, id: 'EP-1', sale_price: '318000' });
    expect(r.status).toBe(303);
    const [after] = await allSales(t.db, m.id);
    expect(after.salePrice).toBe(318000);
    const page = textOf(await (await t.get(`/markets/${m.id}/sales/${s.key}`)).text());
    expect(page).toContain('sale_price : 312500 → 318000');
  });

  it('refuses a reference another sale uses', async () => {
    await add({ ...GOOD, id: 'EP-1' });
    const r = await add({ ...GOOD, id: 'EP-1' });
    expect(r.status).toBe(422);
    expect(await r.text()).toContain('id &quot;EP-1&quot; is already used by another sale in this market');
    expect(await allSales(t.db, m.id)).toHaveLength(1);
  });

  it('escapes markup typed into text fields, and SQL in them is just text', async () => {
    const address = `<script>alert(1)</script> 5 O'Hara St"; DROP TABLE sales; --`;
    expect((await add({ ...GOOD, address, notes: '<img src=x onerror=alert(1)>' })).status).toBe(303);
    const [s] = await allSales(t.db, m.id);
    expect(s.address).toBe(address);
    const html = await (await t.get(`/markets/${m.id}`)).text();
    expect(html).not.toContain('<script>alert(1)</script>');
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    const detail = await (await t.get(`/markets/${m.id}/sales/${s.key}`)).text();
    expect(detail).not.toContain('<img src=x');
  });
});

describe('sales table', () => {
  beforeEach(async () => {
    for (let i = 1; i <= 60; i++)
      await add({
        id: `R${String(i).padStart(2, '0')}`,
        address: i % 10 === 0 ? `${i} Quarry Road` : `${i} High Street`,
        sale_date: `2024-${String(1 + (i % 12)).padStart(2, '0')}-15`,
        sale_price: String(100000 + i * 1000),
      });
  });

  it('pages by 50, newest first, with a link to the next page that keeps the filters', async () => {
    const html = await (await t.get(`/markets/${m.id}?q=street`)).text();
    expect(html).toContain('Sales 1–50 of 54');
    expect(html).toContain(`href="/markets/${m.id}?q=street&amp;page=2"`);
    const page2 = await (await t.get(`/markets/${m.id}?q=street&page=2`, HTMX)).text();
    expect(page2.startsWith('<div id="sales-region">')).toBe(true);
    expect(page2).toContain('Sales 51–54 of 54');
  });

  it('filters by text, date range and status, and sorts', async () => {
    const quarry = textOf(await (await t.get(`/markets/${m.id}?q=quarry&sort=sale_price&dir=asc`, HTMX)).text());
    expect(quarry).toContain('6 sales');
    expect(quarry.indexOf('R10')).toBeLessThan(quarry.indexOf('R60'));
    const desc = textOf(await (await t.get(`/markets/${m.id}?q=quarry&sort=sale_price&dir=desc`, HTMX)).text());
    expect(desc.indexOf('R60')).toBeLessThan(desc.indexOf('R10'));
    const march = textOf(await (await t.get(`/markets/${m.id}?from=2024-03-01&to=2024-03-31`, HTMX)).text());
    expect(march).toContain('5 sales');
    const excluded = textOf(await (await t.get(`/markets/${m.id}?status=excluded`, HTMX)).text());
    expect(excluded).toContain('No sales match.');
  });

  it('reports a malformed date filter beside the field and ignores it', async () => {
    const html = await (await t.get(`/markets/${m.id}?from=March`)).text();
    expect(html).toContain('From must be a date as YYYY-MM-DD, got &quot;March&quot;');
    expect(html).toContain('Sales 1–50 of 60');
  });
});

describe('exclude, include, delete and undo', () => {
  let key: number;
  beforeEach(async () => {
    await add({ ...GOOD, id: 'EP-1' });
    key = (await allSales(t.db, m.id))[0].key;
  });

  it('excludes only with a reason, and includes again', async () => {
    const none = await t.post(`/markets/${m.id}/sales/${key}/exclude`, { excluded_reason: '  ' });
    expect(none.status).toBe(422);
    expect(await none.text()).toContain('Give the reason the sale is left out');
    expect((await allSales(t.db, m.id))[0].included).toBe(true);

    expect((await t.post(`/markets/${m.id}/sales/${key}/exclude`, { excluded_reason: 'sold to a tenant' })).status).toBe(303);
    expect((await allSales(t.db, m.id))[0]).toMatchObject({ included: false, excludedReason: 'sold to a tenant' });
    const table = textOf(await (await t.get(`/markets/${m.id}?status=excluded`)).text());
    expect(table).toContain('Excluded sold to a tenant');

    const row = await t.post(`/markets/${m.id}/sales/${key}/include`, {}, HTMX);
    expect(await row.text()).toMatch(/^<tr id="sale-\d+">/);
    expect((await allSales(t.db, m.id))[0].included).toBe(true);
    expect((await listSaleChanges(t.db, m.id, key)).map((c) => c.action)).toEqual(['include', 'exclude', 'create']);
  });

  it('asks before deleting, deletes, and undoes from the notice', async () => {
    const confirm = textOf(await (await t.get(`/markets/${m.id}/sales/${key}/delete`)).text());
    expect(confirm).toContain('Delete sale EP-1?');
    expect(await allSales(t.db, m.id)).toHaveLength(1);

    const r = await t.post(`/markets/${m.id}/sales/${key}/delete`, {});
    expect(r.status).toBe(303);
    expect(await allSales(t.db, m.id)).toHaveLength(0);
    const notice = await (await t.get(r.headers.get('Location')!)).text();
    expect(textOf(notice)).toContain('Deleted sale EP-1 at 4 Mill Lane. Undo');
    const undoUrl = /action="(\/markets\/\d+\/sales\/restore\/\d+)"/.exec(notice)![1];

    expect((await t.post(undoUrl, {})).status).toBe(303);
    expect((await allSales(t.db, m.id)).map((s) => [s.key, s.id])).toEqual([[key, 'EP-1']]);
    const again = await t.post(undoUrl, {});
    expect(again.status).toBe(422);
  });

  it('through htmx, delete swaps the row for an undo row and undo brings the row back', async () => {
    const deleted = await (await t.post(`/markets/${m.id}/sales/${key}/delete`, {}, HTMX)).text();
    expect(textOf(deleted)).toContain('Deleted sale EP-1 at 4 Mill Lane. Undo');
    const undoUrl = /hx-post="(\/markets\/\d+\/sales\/restore\/\d+)"/.exec(deleted)![1];
    const row = await (await t.post(undoUrl, {}, HTMX)).text();
    expect(row).toContain(`id="sale-${key}"`);
    expect(textOf(row)).toContain('EP-1');
  });

  it('answers 404 for a sale of another market', async () => {
    const other = await testMarket(t.db, 'Other');
    expect((await t.get(`/markets/${other.id}/sales/${key}`)).status).toBe(404);
    expect((await t.post(`/markets/${other.id}/sales/${key}/delete`, {})).status).toBe(404);
    expect(await allSales(t.db, m.id)).toHaveLength(1);
  });
});
