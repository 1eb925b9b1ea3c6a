/**
 * The app in a real browser (headless Chromium through playwright-core): the server runs
 * on a free port with a temporary database file, htmx loads from /static, and the pages
 * are driven the way a person would.
 */
import { countSales, findMarketByName } from '../../src/store/markets-repo.js';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBrowserApp, type BrowserApp } from './browser-app.js';

let app: BrowserApp;
let page: Page;
let server: BrowserApp['server'];

beforeAll(async () => {
  app = await startBrowserApp('browser');
  ({ page, server } = app);
});

afterAll(async () => {
  await app?.close();
});

describe('in a browser', () => {
  it('creates a market, adds a sale through the form and finds it in the table', async () => {
    await page.goto(`${server.url}/markets`);
    expect(await page.textContent('body')).toContain('Brindlewick'); // the demo market of a new database
    await page.click('text=New market');
    await page.fill('#f-name', 'Browser Test Market');
    await page.selectOption('#f-area_unit', 'm2');
    await page.fill('#f-currency', 'EUR');
    await page.click('button:has-text("Create market")');
    await page.waitForSelector('h1:has-text("Browser Test Market")');

    await page.click('nav.market-nav >> text=Add a sale');
    expect(await page.textContent('#f-living_area + .unit')).toBe('m²');
    // A first try with an error: htmx swaps the form in place with the message beside the field.
    await page.fill('#f-address', '8 Rowan Walk');
    await page.fill('#f-sale_date', '2024-05-06');
    await page.fill('#f-sale_price', '0');
    await page.click('button:has-text("Add sale")');
    await page.waitForSelector('#f-sale_price-error');
    expect(await page.textContent('#f-sale_price-error')).toBe('sale_price must be greater than 0, got "0"');
    expect(await page.inputValue('#f-address')).toBe('8 Rowan Walk');

    await page.fill('#f-sale_price', '287500');
    await page.fill('#f-living_area', '104');
    await page.fill('#f-year_built', '1979');
    await page.click('button:has-text("Add sale")');
    await page.waitForSelector('h2:has-text("8 Rowan Walk")');

    await page.click('nav.market-nav >> text=Sales');
    const row = page.locator('table.sales tbody tr', { hasText: '8 Rowan Walk' });
    expect(await row.count()).toBe(1);
    expect(await row.textContent()).toContain('€287,500');

    // Filtering through htmx narrows the table without a page load.
    await page.fill('#f-q', 'no such street');
    await page.waitForSelector('text=No sales match.');
    await page.fill('#f-q', 'rowan');
    await page.waitForSelector('table.sales >> text=8 Rowan Walk');
  });

  it('imports a CSV with one bad row, shows the error and imports nothing', async () => {
    const market = await findMarketByName(server.db, 'Browser Test Market');
    expect(market).toBeDefined();
    await page.goto(`${server.url}/markets/${market!.id}/import`);
    const csv = [
      'id,address,sale_date,sale_price,living_area',
      'B1,1 Alder Row,2024-01-10,250000,98',
      'B2,2 Alder Row,2024-01-11,255000,-3',
      'B3,3 Alder Row,2024-01-12,260000,101',
    ].join('\n');
    await page.setInputFiles('#f-file', { name: 'one-bad-row.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
    await page.click('button:has-text("Check file")');
    await page.waitForSelector('h2:has-text("Nothing was imported")');
    const errorRow = await page.textContent('table.import-errors tbody tr');
    expect(errorRow).toContain('2');
    expect(errorRow).toContain('living_area');
    expect(errorRow).toContain('living_area must be greater than 0, got "-3"');
    expect(await page.locator('button:has-text("Import")').count()).toBe(0);

    await page.goto(`${server.url}/markets/${market!.id}`);
    expect(await page.locator('table.sales tbody tr').count()).toBe(1);
    expect(await page.textContent('body')).not.toContain('Alder Row');
    expect(await countSales(server.db, market!.id)).toBe(1);
  });
});
