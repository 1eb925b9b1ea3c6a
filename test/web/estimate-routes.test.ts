/**
 * The estimate pages and JSON API on the demo market: the page shows the engine's own
 * numbers, the API agrees with `compfit estimate` on the same sales, and a saved estimate
 * stays as saved after its sales change.
 */
import { readFileSync, writeFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeEach, describe, expect, it } from 'vitest';
import { runEstimate } from '../../src/domain/estimate.js';
import type { EstimateResult } from '../../src/domain/estimate-result.js';
import { DEFAULT_MODEL } from '../../src/domain/model.js';
import { writeSalesCsv } from '../../src/domain/sales-csv.js';
import { parseSubject } from '../../src/domain/subject-json.js';
import { installDemoMarket } from '../../src/store/demo-market.js';
import { allSales, updateSale } from '../../src/store/sales-repo.js';
import { cli } from '../helpers/cli.js';
import { HTMX, testApp, textOf, type TestApp } from './test-app.js';

const demoSubject = JSON.parse(readFileSync(new URL('../../seed/demo-subject.json', import.meta.url), 'utf8'));
const outsideSubject = JSON.parse(readFileSync(new URL('../../seed/demo-subject-outside.json', import.meta.url), 'utf8'));
const money = (x: number) => `$${Math.round(x).toLocaleString('en-US')}`;

function query(subject: Record<string, unknown>, extra: Record<string, string> = {}) {
  const q = new URLSearchParams();
  for (const p of DEFAULT_MODEL.predictors) q.append('predictors', p);
  q.set('transform', 'none');
  q.set('level', '0.95');
  for (const [k, v] of Object.entries(subject)) q.set(k, String(v));
  q.set('run', 'estimate');
  for (const [k, v] of Object.entries(extra)) q.set(k, v);
  return q.toString();
}

let t: TestApp;
let marketId: number;
beforeEach(async () => {
  t = await testApp();
  marketId = (await installDemoMarket(t.db)).marketId;
});

describe('estimate page', () => {
  it('shows the fit summary and model warnings before a subject is entered', async () => {
    const res = await t.get(`/markets/${marketId}/estimate`);
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html).toContain('Fit summary');
    expect(html).toContain('Leave-one-out ratio study');
    expect(html).not.toContain('Estimated value');
  });

  it('shows the engine’s value, both intervals, the warnings and the caution for the demo subject', async () => {
    const res = await t.get(`/markets/${marketId}/estimate?${query(demoSubject)}`);
    expect(res.status).toBe(200);
    const html = await res.text();
    const subject = parseSubject(demoSubject);
    if (!subject.ok) throw new Error('subject');
    const expected = runEstimate(await allSales(t.db, marketId), subject.value, DEFAULT_MODEL);
    const text = textOf(html);
    expect(text).toContain(money(expected.estimate.value));
    expect(text).toContain(`${money(expected.estimate.prediction[0])} to ${money(expected.estimate.prediction[1])}`);
    expect(text).toContain(`${money(expected.estimate.confidence[0])} to ${money(expected.estimate.confidence[1])}`);
    for (const w of expected.warnings) expect(html).toContain(`data-code="${w.code}"`);
    expect(text).toContain('not an appraisal');
    expect(html.match(/<svg/g)?.length).toBeGreaterThanOrEqual(8);
    expect(html).toContain('<title id="residuals-title">Residuals against fitted values</title>');
  });

  it('warns first, naming the characteristic and the range, for a subject outside the sales', async () => {
    const html = await (await t.get(`/markets/${marketId}/estimate?${query(outsideSubject)}`)).text();
    const warnings = html.indexOf('data-code="outside-range"');
    expect(warnings).toBeGreaterThan(0);
    expect(warnings).toBeLessThan(html.indexOf('Estimated value'));
    expect(textOf(html)).toMatch(/The subject's living area \(5,200\) is above the largest among the sales used \(\d[\d,]* to [\d,]+\)/);
  });

  it('shows each subject field error beside its input with 422, and keeps what was typed', async () => {
    const res = await t.get(`/markets/${marketId}/estimate?${query({ ...demoSubject, living_area: 'big', year_built: '' })}`);
    expect(res.status).toBe(422);
    const html = await res.text();
    expect(html).toMatch(/id="f-living_area-error"[^>]*>living_area must be a plain number, got &quot;big&quot;/);
    expect(html).toMatch(/id="f-year_built-error"[^>]*>year built is needed by the model \(age\)/);
    expect(html).toContain('value="big"');
  });

  it('a model that cannot give a number says what to do', async () => {
    const q = new URLSearchParams(query(demoSubject));
    q.delete('predictors');
    for (const p of ['living_area', 'lot_area', 'living_area^2']) q.append('predictors', p);
    q.set('predictors', 'living_area');
    q.append('predictors', 'pool');
    const res = await t.get(`/markets/${marketId}/estimate?${q}`);
    expect(res.status).toBe(422);
    expect(textOf(await res.text())).toMatch(/"pool" is not a predictor/);
  });

  it('leaving a flagged sale out refits without it and returns to the same estimate', async () => {
    const page = await (await t.get(`/markets/${marketId}/estimate?${query(demoSubject)}`)).text();
    const form = /<form method="post" action="([^"]+)" class="inline leave-out">(?:<input type="hidden" name="_csrf" value="[^"]*"\/>)?<input type="hidden" name="sale" value="(\d+)"\/><input type="hidden" name="back" value="([^"]+)"/.exec(page);
    expect(form).not.toBeNull();
    const [, action, key, back] = form!;
    const res = await t.post(action, { sale: key, back: back.replace(/&amp;/g, '&'), excluded_reason: 'flagged in regression' });
    expect(res.status).toBe(303);
    expect(res.headers.get('Location')).toBe(back.replace(/&amp;/g, '&'));
    const sales = await allSales(t.db, marketId);
    const left = sales.find((s) => s.key === Number(key))!;
    expect(left).toMatchObject({ included: false, excludedReason: 'flagged in regression' });
    const after = await (await t.get(res.headers.get('Location')!)).text();
    expect(after).toMatch(new RegExp(`${left.id} — excluded: flagged in regression`));
  });
});

describe('saved estimates', () => {
  it('saves a snapshot, lists it, and reopens it unchanged after a sale is edited', async () => {
    const q = query(demoSubject);
    const saved = await t.post(`/markets/${marketId}/estimates`, { query: q });
    expect(saved.status).toBe(303);
    const url = saved.headers.get('Location')!;
    expect(url).toMatch(/^\/estimates\/\d+$/);
    const before = textOf(await (await t.get(url)).text());
    const value = /Estimated value \(statistical indication\) (\$[\d,]+)/.exec(before)![1];

    const sales = await allSales(t.db, marketId);
    const first = sales.find((s) => s.included)!;
    const r = await updateSale(t.db, marketId, first.key, { ...first, salePrice: first.salePrice * 3 }, 'test');
    expect(r.ok).toBe(true);
    const live = textOf(await (await t.get(`/markets/${marketId}/estimate?${q}`)).text());
    expect(live).not.toContain(`Estimated value (statistical indication) ${value}`);

    const after = textOf(await (await t.get(url)).text());
    expect(after).toContain(`Estimated value (statistical indication) ${value}`);
    expect(after).toContain('These are the numbers as saved');
    const list = textOf(await (await t.get(`/markets/${marketId}/estimates`)).text());
    expect(list).toContain(demoSubject.address);
    expect(list).toContain(value);
  });
  it('downloads the worksheet as PDF and CSV, the same bytes before and after the sales change', async () => {
    const saved = await t.post(`/markets/${marketId}/estimates`, { query: query(demoSubject) });
    const url = saved.headers.get('Location')!;
    const pdf = await t.get(`${url}/worksheet.pdf`);
    expect(pdf.status).toBe(200);
    expect(pdf.headers.get('Content-Type')).toBe('application/pdf');
    expect(pdf.headers.get('Content-Disposition')).toMatch(/attachment; filename="estimate-\d+-worksheet.pdf"/);
    const first = Buffer.from(await pdf.arrayBuffer());
    expect(first.subarray(0, 5).toString()).toBe('%PDF-');
    const csv = await t.get(`${url}/worksheet.csv`);
    expect(csv.headers.get('Content-Type')).toMatch(/^text\/csv/);
    expect(await csv.text()).toContain(demoSubject.address);

    const sales = await allSales(t.db, marketId);
    await updateSale(t.db, marketId, sales[0].key, { ...sales[0], salePrice: sales[0].salePrice + 12345 }, 'test');
    const again = Buffer.from(await (await t.get(`${url}/worksheet.pdf`)).arrayBuffer());
    expect(again.equals(first)).toBe(true);
    expect((await t.get('/estimates/999/worksheet.pdf')).status).toBe(404);
  });
  it('an unknown saved estimate is a 404', async () => {
    expect((await t.get('/estimates/999')).status).toBe(404);
  });
});

describe('JSON API', () => {
  it('POST /api/markets/:id/estimate agrees with `compfit estimate` on the same sales', async () => {
    const res = await t.app.request(`/api/markets/${marketId}/estimate`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ subject: demoSubject, predictors: ['living_area', 'age', 'rooms', 'bathrooms'], transform: 'log', level: 0.9 }),
    });
    expect(res.status).toBe(200);
    const api = (await res.json()) as EstimateResult;

    const dir = mkdtempSync(path.join(tmpdir(), 'compfit-api-'));
    writeFileSync(path.join(dir, 'sales.csv'), writeSalesCsv(await allSales(t.db, marketId)));
    writeFileSync(path.join(dir, 'subject.json'), JSON.stringify(demoSubject));
    const out = await cli(['estimate', '--sales', 'sales.csv', '--subject', 'subject.json', '--predictors', 'living_area,age,rooms,bathrooms', '--transform', 'log', '--level', '0.9'], { cwd: dir });
    expect(out.code).toBe(0);
    expect(api).toEqual(JSON.parse(out.stdout));
  });
  it('POST /api/markets/:id/estimates saves and GET /api/estimates/:id returns the snapshot', async () => {
    const res = await t.app.request(`/api/markets/${marketId}/estimates`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ subject: demoSubject }),
    });
    expect(res.status).toBe(201);
    const { id } = (await res.json()) as { id: number };
    const snap = await (await t.app.request(`/api/estimates/${id}`)).json();
    expect(snap).toMatchObject({ id, subject: { address: demoSubject.address }, model: DEFAULT_MODEL, market: { id: marketId, currency: 'USD' } });
    expect(snap.result.n).toBeGreaterThan(40);
    expect(snap.sales.length).toBe((await allSales(t.db, marketId)).length);
  });
  it('bad bodies get 422 with one message per field', async () => {
    const res = await t.app.request(`/api/markets/${marketId}/estimate`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ subject: { ...demoSubject, living_area: -3 }, transform: 'cube', level: 'high' }),
    });
    expect(res.status).toBe(422);
    const { errors } = (await res.json()) as { errors: string[] };
    expect(errors).toEqual(expect.arrayContaining([expect.stringMatching(/^transform:/), expect.stringMatching(/^level:/), expect.stringMatching(/^subject.living_area: living_area must be greater than 0/)]));
  });
  it('htmx gets the page too (the form selects #estimate-work), with Vary: HX-Request', async () => {
    const res = await t.get(`/markets/${marketId}/estimate?${query(demoSubject)}`, HTMX);
    expect(res.headers.get('Vary')).toContain('HX-Request');
    expect(await res.text()).toContain('id="estimate-work"');
  });
});
