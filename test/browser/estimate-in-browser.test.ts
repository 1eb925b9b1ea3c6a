/**
 * Estimates in a real browser (headless Chromium through playwright-core): a subject outside
 * the sales gets the warning first; a saved estimate keeps its numbers after a sale is edited.
 */

import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBrowserApp, type BrowserApp } from './browser-app.js';

const outside = JSON.parse(readFileSync(new URL('../../seed/demo-subject-outside.json', import.meta.url), 'utf8'));
const inside = JSON.parse(readFileSync(new URL('../../seed/demo-subject.json', import.meta.url), 'utf8'));

let app: BrowserApp;
let page: Page;
let server: BrowserApp['server'];

beforeAll(async () => {
  app = await startBrowserApp('estimate-browser');
  ({ page, server } = app);
});

afterAll(async () => {
  await app?.close();
});

async function fillSubject(p: Page, subject: Record<string, string | number>) {
  for (const [k, v] of Object.entries(subject)) await p.fill(`#f-${k}`, String(v));
}

describe('estimates in a browser', () => {
  it('enters a subject outside the range and sees the warning before the value', async () => {
    await page.goto(`${server.url}/markets`);
    await page.click('text=Brindlewick');
    await page.click('nav.market-nav >> text=Estimate');
    await page.waitForSelector('h2:has-text("Fit summary")');
    await fillSubject(page, outside);
    await page.click('button:has-text("Estimate the subject")');
    await page.waitForSelector('.value-block');
    const first = page.locator('.warnings li').first();
    expect(await first.getAttribute('data-code')).toBe('outside-range');
    expect(await first.textContent()).toMatch(/living area \(5,200\) is above the largest/);
    // htmx pushed a URL that reproduces the estimate.
    expect(page.url()).toContain('living_area=5200');
    expect(await page.textContent('.estimate-caution')).toContain('not an appraisal');
  });

  it('saves an estimate, edits a sale, reopens the estimate and sees the old numbers', async () => {
    await page.goto(`${server.url}/markets/1/estimate`);
    await fillSubject(page, inside);
    await page.click('button:has-text("Estimate the subject")');
    await page.waitForSelector('.value-block');
    const value = (await page.textContent('.value-block .estimate-value'))!.trim();
    await page.click('button:has-text("Save this estimate")');
    await page.waitForSelector('h1:has-text("Saved estimate")');
    const savedUrl = page.url();
    expect(await page.textContent('.value-block .estimate-value')).toBe(value);

    // Edit the first sale in the table: triple its price.
    await page.goto(`${server.url}/markets/1`);
    await page.locator('table.data tbody tr a').first().click();
    await page.click('text=Edit');
    const price = Number(await page.inputValue('#f-sale_price'));
    await page.fill('#f-sale_price', String(price * 3));
    await page.click('button:has-text("Save sale")');
    await page.waitForLoadState('networkidle');

    await page.goto(`${server.url}/markets/1/estimate`);
    await fillSubject(page, inside);
    await page.click('button:has-text("Estimate the subject")');
    await page.waitForSelector('.value-block');
    expect((await page.textContent('.value-block .estimate-value'))!.trim()).not.toBe(value);

    await page.goto(savedUrl);
    expect((await page.textContent('.value-block .estimate-value'))!.trim()).toBe(value);
    expect(await page.textContent('body')).toContain('These are the numbers as saved');
  });
});
