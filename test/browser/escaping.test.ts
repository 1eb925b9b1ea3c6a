/**
 * Stored text is shown as text, never run as markup: a corpus of script-injection payloads
 * (test/browser/injection-payloads.ts) is saved through the forms (a few typed into the
 * page, the rest posted to the same form routes with the page's own token) — market name and notes;
 * sale address, reference, verification, notes and excluded reason; an edit (the change
 * history shows before and after); the exclude form; the subject address on the estimate
 * page and in saved estimates — and through a CSV import (its rows, its file name, and the
 * bad values an import lists), then every page that shows them is opened in headless
 * Chromium. No payload may run: no dialog opens, `window.__pwned` stays unset, no element
 * that could run script appears, no request goes to a "pwned" URL, and the content
 * security policy reports nothing (our pages need nothing it forbids). A last check
 * injects markup directly into a page to show that the policy itself blocks inline script.
 */
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBrowserApp, type BrowserApp } from './browser-app.js';
import { INJECTION_PAYLOADS as P } from './injection-payloads.js';

const n = P.length;
const at = (i: number) => P[i % n];

let app: BrowserApp;
let page: Page;
const dialogs: string[] = [];
const pwnedRequests: string[] = [];
const violations: string[] = [];
const pageErrors: string[] = [];
/** Pages checked, for the report at the end. */
let pagesChecked = 0;

beforeAll(async () => {
  app = await startBrowserApp('escaping');
  page = app.page;
  page.on('dialog', (d) => {
    dialogs.push(`${d.type()}: ${d.message()}`);
    void d.dismiss();
  });
  page.on('request', (r) => {
    // Only where a request goes counts: our own page URLs carry payloads in their query.
    const u = new URL(r.url());
    if (/pwned/i.test(u.host + u.pathname)) pwnedRequests.push(r.url());
  });
  page.on('pageerror', (e) => pageErrors.push(e.message));
  await page.exposeFunction('__noteViolation', (text: string) => violations.push(text));
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      (window as unknown as { __noteViolation: (t: string) => void }).__noteViolation(`${e.violatedDirective} ${e.blockedURI} ${location.pathname}`);
    });
  });
});

afterAll(async () => {
  await app?.close();
});

interface PageFacts {
  title: string;
  main: string;
  /** Values of the inputs and textareas by id. */
  inputs: Record<string, string>;
}

/**
 * Checks what a page must not show after a payload was rendered in it (one round trip to
 * the browser), and returns its text and field values for the caller's checks.
 */
async function expectInert(label: string): Promise<PageFacts> {
  pagesChecked++;
  const state = await page.evaluate(() => ({
    pwned: (window as unknown as { __pwned?: unknown }).__pwned,
    risky: [
      ...document.querySelectorAll(
        'script:not([src]), script:not([src^="/static/"]), [onerror], [onload], [onfocus], [ontoggle], [onclick], iframe, object, embed, meta[http-equiv], base, [hx-trigger="load"], link:not([href="/static/app.css"]), style, a[href^="javascript:"]',
      ),
    ].map((e) => e.outerHTML.slice(0, 80)),
    title: document.title,
    main: document.querySelector('main')?.textContent ?? '',
    inputs: Object.fromEntries([...document.querySelectorAll<HTMLInputElement | HTMLTextAreaElement>('input[id], textarea[id]')].map((e) => [e.id, e.value])),
  }));
  expect(state.pwned, label).toBeUndefined();
  expect(state.risky, label).toEqual([]);
  return state;
}

async function mainText(): Promise<string> {
  return (await page.textContent('main')) ?? '';
}

/** Submits the form on the page the way a person does and waits for the next page. */
async function submitAndWait(button: string, url: RegExp): Promise<void> {
  await Promise.all([page.waitForURL(url), page.click(button)]);
}

/** The page's CSRF token, as htmx reads it from the body. */
async function pageToken(): Promise<string> {
  return page.evaluate(() => JSON.parse(document.body.getAttribute('hx-headers') ?? '{}')['X-CSRF-Token'] as string);
}

/** Posts a form's fields to its route from the browser (its cookies, its page's token); returns where it sent us. */
async function postForm(url: string, fields: Record<string, string>): Promise<string> {
  const res = await page.request.post(`${app.server.url}${url}`, { form: { ...fields, _csrf: await pageToken() }, maxRedirects: 0 });
  expect(res.status(), `${url} ${await res.text()}`).toBe(303);
  return res.headers()['location'];
}

let mainMarket: string; // /markets/:id of the market whose sales hold the payloads
const saleUrls: string[] = [];

describe('payloads saved through the forms render as text', () => {
  it(`market names and notes (${n} markets)`, async () => {
    await page.goto(`${app.server.url}/markets`);
    for (let i = 0; i < n; i++) {
      if (i < 2) {
        await page.goto(`${app.server.url}/markets/new`);
        await page.fill('#f-name', at(i));
        await page.fill('#f-notes', at(i + 1));
        await submitAndWait('button:has-text("Create market")', /\/markets\/\d+$/);
      } else await page.goto(`${app.server.url}${await postForm('/markets', { name: at(i), notes: at(i + 1), area_unit: 'sqft', currency: 'USD' })}`);
      if (i === 0) mainMarket = new URL(page.url()).pathname;
      const facts = await expectInert(`market ${i}`);
      expect(facts.title).toBe(`${at(i)} · compfit`);
      expect(facts.main).toContain(`${at(i)}Areas in sq ft`); // the heading, then the market's facts
      expect(facts.main).toContain(at(i + 1));
    }
    await page.goto(`${app.server.url}/markets`);
    const listed = await page.locator('#markets-table td a').allTextContents();
    for (const p of P) expect(listed).toContain(p);
    await expectInert('markets list');
    for (let i = 0; i < n; i += 5) {
      await page.goto(`${app.server.url}/markets/${Number(mainMarket.split('/')[2]) + i}/edit`);
      const facts = await expectInert(`market settings ${i}`);
      expect(facts.inputs).toMatchObject({ 'f-name': at(i), 'f-notes': at(i + 1) });
    }
  }, 60_000);

  it(`sale address, reference, verification, notes and excluded reason (${n} sales), including a form sent back with an error`, async () => {
    for (let i = 0; i < n; i++) {
      const excluded = i % 3 === 0;
      const area = 1100 + ((i * 137) % 1400);
      const built = 1955 + ((i * 7) % 60);
      const rooms = 4 + (i % 5);
      const fields: Record<string, string> = {
        address: at(i),
        id: `${at(i + 5).slice(0, 56)} #${i}`,
        sale_date: `2024-${String(1 + (i % 12)).padStart(2, '0')}-${String(1 + (i % 27)).padStart(2, '0')}`,
        sale_price: String(90_000 + 140 * area - 900 * (2024 - built) + 6_000 * rooms + ((i * 7919) % 23_000)),
        living_area: String(area),
        year_built: String(built),
        rooms: String(rooms),
        verification: at(i + 1),
        notes: at(i + 2),
        included: excluded ? 'no' : 'yes',
        excluded_reason: excluded ? at(i + 3) : '',
      };
      if (i < 3) {
        await page.goto(`${app.server.url}${mainMarket}/sales/new`);
        for (const [name, value] of Object.entries(fields)) if (name !== 'included' && value) await page.fill(`#f-${name}`, value);
        if (excluded) await page.selectOption('#f-included', 'no');
        if (i === 0) {
          // A first try with a bad price: htmx swaps the form back in with every value kept.
          await page.fill('#f-sale_price', 'not a price');
          await page.click('button:has-text("Add sale")');
          await page.waitForSelector('#f-sale_price-error');
          expect(await page.inputValue('#f-address')).toBe(at(0));
          expect(await page.inputValue('#f-notes')).toBe(at(2));
          await expectInert('sale form sent back with an error');
          await page.fill('#f-sale_price', fields.sale_price);
        }
        await submitAndWait('button:has-text("Add sale")', /\/sales\/\d+$/);
      } else await page.goto(`${app.server.url}${await postForm(`${mainMarket}/sales`, fields)}`);
      saleUrls.push(new URL(page.url()).pathname);
      const shown = await expectInert(`sale ${i}`);
      for (const text of [fields.address, fields.id, fields.verification, fields.notes, ...(excluded ? [fields.excluded_reason] : [])]) expect(shown.main, `sale ${i}`).toContain(text);
      expect(shown.title).toContain(fields.id);
      await page.goto(`${app.server.url}${saleUrls[i]}/edit`);
      const form = await expectInert(`edit form ${i}`);
      for (const name of ['address', 'id', 'verification', 'notes', 'excluded_reason']) expect(form.inputs[`f-${name}`], `${name} of sale ${i}`).toBe(fields[name]);
    }
  }, 60_000);

  it('an edit (before and after in the history), the exclude form, the edit and delete pages', async () => {
    for (let i = 0; i < 6; i++) {
      await page.goto(`${app.server.url}${saleUrls[i]}/edit`);
      await page.fill('#f-notes', at(i + 20));
      await submitAndWait('button:has-text("Save sale")', /\/sales\/\d+$/);
      const history = (await page.textContent('table.history')) ?? '';
      expect(history).toContain(`${at(i + 2)} → ${at(i + 20)}`);
      await expectInert(`history ${i}`);
    }
    for (const i of [1, 2, 4]) {
      await page.goto(`${app.server.url}${saleUrls[i]}/exclude`);
      await page.fill('#f-excluded_reason', at(i + 11));
      await submitAndWait('button:has-text("Exclude sale")', /\/markets\/\d+$/);
      await page.goto(`${app.server.url}${saleUrls[i]}`);
      expect(await mainText()).toContain(`Excluded: ${at(i + 11)}`);
      await expectInert(`excluded ${i}`);
      await page.goto(`${app.server.url}${saleUrls[i]}/delete`);
      expect(await mainText()).toContain(at(i));
      await expectInert(`delete page ${i}`);
    }
  }, 60_000);

  it('the sales table, also when htmx swaps it in', async () => {
    await page.goto(`${app.server.url}${mainMarket}`);
    const table = (await page.textContent('table.sales')) ?? '';
    for (const p of P) expect(table).toContain(p);
    await expectInert('sales table');
    const all = await page.locator('table.sales tbody tr').count();
    expect(all).toBe(n);
    // htmx swaps in the rows matching "script" (in ref, address, verification or notes).
    await page.fill('#f-q', 'script');
    await page.waitForFunction((total) => document.querySelectorAll('table.sales tbody tr').length < total, all);
    const filtered = (await page.textContent('table.sales')) ?? '';
    expect(filtered).toContain(at(0));
    await expectInert('sales table after an htmx filter');
  });

  it(`the subject address on the estimate page (${n} subjects) and in saved estimates`, async () => {
    const estimateQuery = (address: string, extra: Record<string, string> = {}) => {
      const q = new URLSearchParams([['predictors', 'living_area'], ['predictors', 'age'], ['predictors', 'rooms'], ['transform', 'none'], ['level', '0.95']]);
      for (const [k, v] of Object.entries({ address, effective_date: '2025-03-01', living_area: '1600', year_built: '1990', rooms: '6', run: 'estimate', ...extra })) q.set(k, v);
      return q.toString();
    };
    const estimateUrl = (address: string, extra: Record<string, string> = {}) => `${app.server.url}${mainMarket}/estimate?${estimateQuery(address, extra)}`;
    // Every sale used, by its address, in the grid and the diagnostics; excluded sales with their reasons.
    await page.goto(estimateUrl(at(0), { grid: '50', diagnostics: 'all' }));
    await page.waitForSelector('.save-form');
    const text = await mainText();
    for (let s = 0; s < n; s++) expect(text).toContain(at(s));
    await expectInert('estimate with every sale listed');
    for (let i = 0; i < n; i++) {
      await page.goto(estimateUrl(at(i)));
      const facts = await expectInert(`estimate ${i}`);
      expect(facts.inputs['f-address']).toBe(at(i));
      expect(await page.inputValue('.save-form input[name="query"]')).toBe(estimateQuery(at(i)));
      if (i % 6 === 0) {
        if (i === 0) await submitAndWait('button:has-text("Save this estimate")', /\/estimates\/\d+$/);
        else await page.goto(`${app.server.url}${await postForm(`${mainMarket}/estimates`, { query: estimateQuery(at(i)) })}`);
        expect(await page.textContent('h1')).toContain(at(i));
        expect(await page.title()).toContain(at(i));
        await expectInert(`saved estimate ${i}`);
      }
    }
    // Typed into the form and sent by htmx, too.
    await page.goto(estimateUrl('1 Plain Street'));
    await page.fill('#f-address', at(4));
    await page.click('button:has-text("Estimate the subject")');
    await page.waitForFunction((a) => new URL(location.href).searchParams.get('address') === a, at(4));
    await page.waitForSelector('.save-form');
    expect(await page.inputValue('#f-address')).toBe(at(4));
    await expectInert('estimate through htmx');
    await page.goto(`${app.server.url}${mainMarket}/estimates`);
    for (let i = 0; i < n; i += 6) expect(await mainText()).toContain(at(i));
    await expectInert('saved estimates list');
  }, 60_000);
});

/** One CSV field, quoted as the format needs. */
const field = (v: string) => (/[",\r\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v);

describe('payloads in a CSV import render as text', () => {
  it('in the preview, the committed sales and the file name', async () => {
    await page.goto(`${app.server.url}/markets`);
    const market = await page.locator('#markets-table a', { hasText: at(1) }).first().getAttribute('href');
    expect(market).toMatch(/^\/markets\/\d+$/);
    const rows = ['id,address,sale_date,sale_price,living_area,verification,notes,included,excluded_reason'];
    for (let i = 0; i < n; i++) rows.push([`${at(i + 7).slice(0, 56)} #${i}`, at(i), '2024-05-06', String(200_000 + i), String(1200 + i), at(i + 1), at(i + 2), i % 2 ? 'no' : 'yes', i % 2 ? at(i + 3) : ''].map(field).join(','));
    const fileName = '"><img src=/pwned-file onerror=alert(1)>.csv';
    await page.goto(`${app.server.url}${market}/import`);
    await page.setInputFiles('#f-file', { name: fileName, mimeType: 'text/csv', buffer: Buffer.from(rows.join('\n')) });
    await submitAndWait('button:has-text("Check file")', /\/import$/);
    await page.waitForSelector('text=Ready to import');
    const preview = await mainText();
    expect(preview).toContain(`${fileName}: all ${n} rows are valid`);
    for (const p of P) expect(preview).toContain(p);
    await expectInert('import preview');
    await submitAndWait(`button:has-text("Import ${n} sales")`, /\?imported=/);
    const table = (await page.textContent('table.sales')) ?? '';
    for (const p of P) expect(table).toContain(p);
    await expectInert('imported sales');
  }, 60_000);

  it('in the list of problems, which shows each bad value', async () => {
    const market = `${mainMarket}`;
    const rows = ['address,sale_date,sale_price,living_area'];
    for (let i = 0; i < n; i++) rows.push([at(i), at(i + 1).slice(0, 30), at(i + 2), at(i + 3)].map(field).join(','));
    await page.goto(`${app.server.url}${market}/import`);
    await page.setInputFiles('#f-file', { name: '<svg onload=alert(1)>.csv', mimeType: 'text/csv', buffer: Buffer.from(rows.join('\n')) });
    await submitAndWait('button:has-text("Check file")', /\/import$/);
    await page.waitForSelector('text=Nothing was imported');
    const values = await page.locator('table.import-errors td.value').allTextContents();
    for (let i = 0; i < n; i++) expect(values).toContain(at(i + 2));
    expect(await mainText()).toContain('<svg onload=alert(1)>.csv');
    await expectInert('import problems');
  }, 60_000);
});

describe('the content security policy', () => {
  it('nothing ran and nothing was blocked on our own pages', () => {
    expect(pagesChecked).toBeGreaterThan(4 * n);
    expect(dialogs).toEqual([]);
    expect(pwnedRequests).toEqual([]);
    expect(violations).toEqual([]);
    expect(pageErrors).toEqual([]);
  });

  it('blocks inline script and event handlers even when markup gets into a page', async () => {
    await page.goto(`${app.server.url}${mainMarket}`);
    await page.evaluate(() => {
      document.body.insertAdjacentHTML('beforeend', '<img src="data:," onerror="window.__pwned=\'handler\'">');
      const s = document.createElement('script');
      s.textContent = 'window.__pwned = "inline script"';
      document.body.append(s);
    });
    await page.waitForFunction(() => true, undefined, { timeout: 1000 });
    await page.waitForTimeout(200);
    expect(await page.evaluate(() => (window as unknown as { __pwned?: unknown }).__pwned)).toBeUndefined();
    expect(violations.some((v) => v.startsWith('script-src-elem inline'))).toBe(true);
    expect(violations.some((v) => v.startsWith('script-src-attr inline'))).toBe(true);
  });
});
