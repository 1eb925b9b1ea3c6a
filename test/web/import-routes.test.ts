import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { readSalesCsv } from '../../src/domain/sales-csv.js';
import { closeDatabase } from '../../src/store/database.js';
import type { Market } from '../../src/store/markets-repo.js';
import { allSales } from '../../src/store/sales-repo.js';
import { toDomainSale } from '../../src/store/sale-columns.js';
import { generateDemoSales } from '../../seed/demo-sales.js';
import { writeSalesCsv } from '../../src/domain/sales-csv.js';
import { createApp } from '../../src/app.js';
import { testApp, testMarket, textOf, type TestApp } from './test-app.js';

let t: TestApp;
let m: Market;
beforeEach(async () => {
  t = await testApp();
  m = await testMarket(t.db, 'Elm Park');
});
afterEach(() => closeDatabase(t.db));

const HEADER = 'id,address,sale_date,sale_price,living_area,year_built,rooms';
const GOOD_ROW = 'A1,1 Low Road,2024-02-01,250000,1500,1990,6';

async function preview(csv: string, name = 'sales.csv') {
  const r = await t.upload(`/markets/${m.id}/import`, name, csv);
  return { status: r.status, html: await r.text() };
}

async function commitFrom(html: string) {
  const url = /action="(\/markets\/\d+\/import\/\d+\/commit)"/.exec(html)?.[1];
  if (!url) throw new Error('no commit form in the preview');
  return t.post(url, {});
}

describe('CSV import', () => {
  it('previews every row without writing, then commits them all', async () => {
    const csv = `${HEADER},colour\n${GOOD_ROW},red\nA2,3 Low Road,2024-03-01,"$260,000",1600,1992,6\n`;
    const p = await preview(csv);
    expect(p.status).toBe(200);
    const text = textOf(p.html);
    expect(text).toContain('sales.csv: all 2 rows are valid');
    expect(text).toContain('columns not used and left out: "colour"');
    expect(text).toContain('$260,000');
    expect(await allSales(t.db, m.id)).toEqual([]);

    const r = await commitFrom(p.html);
    expect(r.status).toBe(303);
    expect(r.headers.get('Location')).toBe(`/markets/${m.id}?imported=2`);
    expect((await allSales(t.db, m.id)).map((s) => s.id)).toEqual(['A1', 'A2']);
    const page = textOf(await (await t.get(r.headers.get('Location')!)).text());
    expect(page).toContain('Imported 2 sales.');
    // A second commit of the same preview writes nothing more.
    await commitFrom(p.html);
    expect(await allSales(t.db, m.id)).toHaveLength(2);
  });

  // Each case: a good first row (row 1) and the bad row (row 2), or a whole file for header problems.
  const GOOD_FIRST = GOOD_ROW.replace('A1', 'A0');
  it('a commit on another app instance (or after a restart) reads the stored file again', async () => {
    const p = await preview(`${HEADER}\n${GOOD_ROW}\nA2,3 Low Road,2024-03-01,260000,1600,1992,6\n`);
    const url = /action="(\/markets\/\d+\/import\/\d+\/commit)"/.exec(p.html)![1];
    const other = createApp({ db: t.db });
    // The same browser (cookie and form token) posting to the other instance.
    const r = await other.request(url, {
      method: 'POST',
      body: new URLSearchParams({ _csrf: t.csrfToken }),
      headers: { 'Content-Type': 'application/x-www-form-urlencoded', Cookie: t.cookie() },
    });
    expect(r.status).toBe(303);
    expect((await allSales(t.db, m.id)).map((s) => s.id)).toEqual(['A1', 'A2']);
  });

  it('a commit refuses references taken since the preview, and writes nothing', async () => {
    const p = await preview(`${HEADER}\n${GOOD_ROW}\nA2,3 Low Road,2024-03-01,260000,1600,1992,6\n`);
    await t.post(`/markets/${m.id}/sales`, { id: 'A2', address: 'x', sale_date: '2024-01-01', sale_price: '1' });
    const r = await commitFrom(p.html);
    expect(r.status).toBe(422);
    expect(textOf(await r.text())).toMatch(/2\s*id\s*A2\s*id "A2" is already used by a sale in this market/);
    expect((await allSales(t.db, m.id)).map((s) => s.id)).toEqual(['A2']);
  });

  const matrix: [string, string, RegExp][] = [
    ['negative price', `${HEADER}\n${GOOD_FIRST}\nA1,1 Low Road,2024-02-01,-250000,1500,1990,6`, /2\s*sale_price\s*-250000\s*sale_price must be greater than 0/],
    ['zero area', `${HEADER}\n${GOOD_FIRST}\nA1,1 Low Road,2024-02-01,250000,0,1990,6`, /2\s*living_area\s*0\s*living_area must be greater than 0, got "0"/],
    ['year built after the sale', `${HEADER}\n${GOOD_FIRST}\nA1,1 Low Road,2024-02-01,250000,1500,2025,6`, /2\s*year_built\s*2025\s*year_built 2025 is after the year of sale 2024/],
    ['a date that is not ISO', `${HEADER}\n${GOOD_FIRST}\nA1,1 Low Road,01/02/2024,250000,1500,1990,6`, /2\s*sale_date\s*01\/02\/2024\s*sale_date must be a real date as YYYY-MM-DD/],
    ['text in a number', `${HEADER}\n${GOOD_FIRST}\nA1,1 Low Road,2024-02-01,250000,about 1500,1990,6`, /2\s*living_area\s*about 1500\s*living_area must be a plain number/],
    ['duplicate id', `${HEADER}\n${GOOD_ROW}\nA1,2 Low Road,2024-02-01,250000,1500,1990,6`, /2\s*id\s*A1\s*id "A1" is already used by row 1/],
    ['a missing required column', `id,address,sale_price\nA1,1 Low Road,250000`, /header\s*sale_date\s*required column "sale_date" is missing from the header/],
  ];

  for (const [what, file, message] of matrix) {
    it(`refuses ${what} with a message naming row and column, and writes nothing`, async () => {
      const p = await preview(file);
      expect(p.status).toBe(422);
      const text = textOf(p.html);
      expect(text).toContain('Nothing was imported');
      expect(text).toMatch(message);
      expect(p.html).not.toContain('/commit"');
      expect(await allSales(t.db, m.id)).toEqual([]);
    });
  }

  it('refuses an id already used in the market', async () => {
    await t.post(`/markets/${m.id}/sales`, { id: 'A1', address: 'x', sale_date: '2024-01-01', sale_price: '1' });
    const p = await preview(`${HEADER}\n${GOOD_ROW}`);
    expect(p.status).toBe(422);
    expect(textOf(p.html)).toMatch(/1\s*id\s*A1\s*id "A1" is already used by a sale in this market/);
    expect(await allSales(t.db, m.id)).toHaveLength(1);
  });

  it('lists every bad row, not just the first', async () => {
    const p = await preview(`${HEADER}\nA1,,2024-02-01,0,1500,1990,6\nA2,2 Low Road,2024-02-30,1,x,1990,0`);
    const text = textOf(p.html);
    expect(text).toContain('5 problems');
    for (const m of [/1\s*address/, /1\s*sale_price/, /2\s*sale_date/, /2\s*living_area/, /2\s*rooms/]) expect(text).toMatch(m);
  });

  it('refuses a file over 20 MB with a clear message and writes nothing', async () => {
    const row = `${GOOD_ROW}\n`;
    // Just over the limit (caught after upload), and far over it (cut off while uploading).
    for (const extraRows of [10, 40_000]) {
      const big = `${HEADER}\n${row.repeat(Math.ceil((20 * 1024 * 1024) / row.length) + extraRows)}`;
      const p = await preview(big, 'big.csv');
      expect(p.status).toBe(413);
      expect(textOf(p.html)).toContain('The file is larger than 20 MB; nothing was imported.');
    }
    expect(await allSales(t.db, m.id)).toEqual([]);
  });

  it('keeps markup and SQL in text fields as plain text, shown escaped', async () => {
    const csv = `${HEADER},notes\nA1,"<b>1</b> Low Road'); DROP TABLE sales; --",2024-02-01,250000,1500,1990,6,<script>alert(1)</script>\n`;
    const p = await preview(csv);
    expect(p.html).not.toContain('<script>alert(1)</script>');
    expect(p.html).toContain('&lt;b&gt;1&lt;/b&gt; Low Road&#39;); DROP TABLE sales; --');
    await commitFrom(p.html);
    const [s] = await allSales(t.db, m.id);
    expect(s).toMatchObject({ address: "<b>1</b> Low Road'); DROP TABLE sales; --", notes: '<script>alert(1)</script>' });
  });

  it('refuses an empty upload', async () => {
    const p = await preview('', 'empty.csv');
    expect(p.status).toBe(422);
    expect(p.html).toContain('Choose a CSV file to import');
  });
});

describe('CSV export', () => {
  it('exports every sale and the file imports back to the same records', async () => {
    const demo = generateDemoSales();
    const first = await preview(writeSalesCsv(demo), 'demo.csv');
    await commitFrom(first.html);

    const r = await t.get(`/markets/${m.id}/sales.csv`);
    expect(r.headers.get('Content-Type')).toContain('text/csv');
    expect(r.headers.get('Content-Disposition')).toBe('attachment; filename="elm-park-sales.csv"');
    const exported = await r.text();
    const back = readSalesCsv(exported);
    if (!back.ok) throw new Error(JSON.stringify(back.errors));
    const byRef = (a: { id: string }, b: { id: string }) => a.id.localeCompare(b.id);
    expect(back.sales.sort(byRef)).toEqual([...demo].sort(byRef));

    const other = await testMarket(t.db, 'Copy');
    const again = await t.upload(`/markets/${other.id}/import`, 'copy.csv', exported);
    await commitFrom(await again.text());
    const copied = (await allSales(t.db, other.id)).map(toDomainSale).sort(byRef);
    const original = (await allSales(t.db, m.id)).map(toDomainSale).sort(byRef);
    expect(copied).toEqual(original);
    expect(copied.filter((s) => !s.included).map((s) => s.excludedReason)).toHaveLength(2);
  });
});
