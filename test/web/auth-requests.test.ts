/**
 * What every request goes through on this computer without sign-in: the CSRF token of
 * every form (a double-submit cookie), Origin and Sec-Fetch-Site checks, JSON-only API
 * posts, answering loopback names only, the security headers and content security policy,
 * and body size limits with a clear 413. Every refusal writes nothing.
 */
import { readFileSync } from 'node:fs';
import { count } from 'drizzle-orm';
import { beforeEach, describe, expect, it } from 'vitest';
import { installDemoMarket } from '../../src/store/demo-market.js';
import { markets, sales } from '../../src/store/schema.js';
import { csrfTokenOf, HTMX, testApp, textOf, type TestApp } from './test-app.js';

const demoSubject = JSON.parse(readFileSync(new URL('../../seed/demo-subject.json', import.meta.url), 'utf8'));
const NEW_MARKET = { name: 'Forged Market', area_unit: 'sqft', currency: 'USD' };
const FORM = { 'Content-Type': 'application/x-www-form-urlencoded' };

let t: TestApp;
let marketId: number;
beforeEach(async () => {
  t = await testApp();
  marketId = (await installDemoMarket(t.db)).marketId;
});

async function marketCount() {
  return (await t.db.select({ n: count() }).from(markets))[0].n;
}

describe('CSRF token', () => {
  it('a form post without the token, with a wrong one, or without the cookie is refused with 403 and writes nothing', async () => {
    const before = await marketCount();
    const cases: [string, RequestInit][] = [
      ['no token', { body: new URLSearchParams(NEW_MARKET), headers: { ...FORM, Cookie: t.cookie() } }],
      ['wrong token', { body: new URLSearchParams({ ...NEW_MARKET, _csrf: 'x'.repeat(43) }), headers: { ...FORM, Cookie: t.cookie() } }],
      ['token without its cookie', { body: new URLSearchParams({ ...NEW_MARKET, _csrf: t.csrfToken }), headers: FORM }],
      ['text/plain body', { body: `_csrf=${t.csrfToken}&name=x`, headers: { 'Content-Type': 'text/plain', Cookie: t.cookie() } }],
    ];
    for (const [what, init] of cases) {
      const res = await t.app.request('/markets', { method: 'POST', ...init });
      expect(res.status, what).toBe(403);
      expect(textOf(await res.text()), what).toContain('This form has expired or did not come from compfit, so nothing was saved.');
    }
    expect(await marketCount()).toBe(before);
  });

  it('another browser (another cookie) cannot use this one’s token', async () => {
    const other = await testApp({ db: t.db });
    const res = await t.app.request('/markets', { method: 'POST', body: new URLSearchParams({ ...NEW_MARKET, _csrf: t.csrfToken }), headers: { ...FORM, Cookie: other.cookie() } });
    expect(res.status).toBe(403);
  });

  it('htmx sends it in the X-CSRF-Token header, and a refusal goes to the page’s message area', async () => {
    const ok = await t.app.request('/markets', { method: 'POST', body: new URLSearchParams(NEW_MARKET), headers: { ...FORM, ...HTMX, Cookie: t.cookie(), 'X-CSRF-Token': t.csrfToken } });
    expect(ok.status).toBe(200);
    expect(ok.headers.get('HX-Redirect')).toMatch(/^\/markets\/\d+$/);
    const refused = await t.app.request('/markets', { method: 'POST', body: new URLSearchParams({ ...NEW_MARKET, name: 'Other' }), headers: { ...FORM, ...HTMX, Cookie: t.cookie(), 'X-CSRF-Token': 'forged' } });
    expect(refused.status).toBe(403);
    expect(refused.headers.get('HX-Retarget')).toBe('#messages');
  });

  it('the cookie is HttpOnly, SameSite=Lax, and the same token stays for the browser', async () => {
    const first = await t.app.request('/markets');
    const cookie = first.headers.getSetCookie().find((c) => c.startsWith('compfit_csrf='))!;
    expect(cookie).toMatch(/; HttpOnly/);
    expect(cookie).toMatch(/; SameSite=Lax/);
    const again = await t.get(`/markets/${marketId}`);
    expect(again.headers.getSetCookie()).toEqual([]);
    expect(csrfTokenOf(await again.text())).toBe(t.csrfToken);
  });

  it('every form that posts, on every page, carries the token', async () => {
    const key = (await t.db.select({ key: sales.id }).from(sales).limit(1))[0].key;
    await t.post(`/markets/${marketId}/sales/${key}/exclude`, { excluded_reason: 'not arm’s length' });
    const deleted = await t.post(`/markets/${marketId}/sales/${key + 1}/delete`, {});
    const q = new URLSearchParams({ ...demoSubject, run: 'estimate' }).toString();
    const saved = (await t.post(`/markets/${marketId}/estimates`, { query: q })).headers.get('Location')!;
    const preview = await (await t.upload(`/markets/${marketId}/import`, 'x.csv', 'address,sale_date,sale_price\n1 Elm Row,2025-01-02,200000\n')).text();
    const pages = [
      '/markets/new',
      `/markets/${marketId}`,
      deleted.headers.get('Location')!,
      `/markets/${marketId}/edit`,
      `/markets/${marketId}/sales/new`,
      `/markets/${marketId}/sales/${key}`,
      `/markets/${marketId}/sales/${key + 2}`,
      `/markets/${marketId}/sales/${key + 2}/exclude`,
      `/markets/${marketId}/sales/${key + 2}/delete`,
      `/markets/${marketId}/sales/${key + 2}/edit`,
      `/markets/${marketId}/estimate?${q}`,
      `/markets/${marketId}/import`,
      saved,
    ];
    let forms = 0;
    const actions = new Set<string>();
    for (const html of [...(await Promise.all(pages.map(async (p) => (await t.get(p)).text()))), preview]) {
      for (const m of html.matchAll(/<form\b[^>]*\bmethod="post"[^>]*>([\s\S]*?)<\/form>/g)) {
        forms++;
        actions.add(/action="([^"?]*)/.exec(m[0])![1].replace(/\d+/g, 'N'));
        expect(m[1]).toContain(`<input type="hidden" name="_csrf" value="${t.csrfToken}"/>`);
      }
    }
    // Each kind of form was seen: market, sale, include, exclude, delete, undo, leave out, save, import, commit.
    expect([...actions].sort()).toEqual(
      [
        '/markets',
        '/markets/N',
        '/markets/N/estimate/leave-out',
        '/markets/N/estimates',
        '/markets/N/import',
        '/markets/N/import/N/commit',
        '/markets/N/sales',
        '/markets/N/sales/N',
        '/markets/N/sales/N/delete',
        '/markets/N/sales/N/exclude',
        '/markets/N/sales/N/include',
        '/markets/N/sales/restore/N',
      ].sort(),
    );
    expect(forms).toBeGreaterThan(20);
  });
});

describe('where a request comes from', () => {
  it('a post from another origin or another site is refused even with the right token', async () => {
    const before = await marketCount();
    const foreign: Record<string, string>[] = [{ Origin: 'http://evil.example' }, { 'Sec-Fetch-Site': 'cross-site' }, { 'Sec-Fetch-Site': 'same-site' }, { Origin: 'https://localhost' }];
    for (const headers of foreign) {
      const res = await t.post('/markets', NEW_MARKET, headers);
      expect(res.status, JSON.stringify(headers)).toBe(403);
      expect(textOf(await res.text())).toMatch(/A request from .* was refused/);
    }
    expect(await marketCount()).toBe(before);
    expect((await t.post('/markets', NEW_MARKET, { Origin: 'http://localhost', 'Sec-Fetch-Site': 'same-origin' })).status).toBe(303);
  });

  it('the JSON API takes only application/json (415 otherwise) and refuses a foreign Origin', async () => {
    const body = JSON.stringify({ subject: demoSubject });
    for (const type of ['text/plain', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x']) {
      const res = await t.app.request(`/api/markets/${marketId}/estimates`, { method: 'POST', body, headers: { 'Content-Type': type, Cookie: t.cookie() } });
      expect(res.status, type).toBe(415);
      expect(await res.json()).toEqual({ errors: ['The API takes JSON bodies only: send Content-Type: application/json.'] });
    }
    const foreign = await t.postJson(`/api/markets/${marketId}/estimates`, { subject: demoSubject }, { Origin: 'http://evil.example' });
    expect(foreign.status).toBe(403);
    expect((await t.postJson(`/api/markets/${marketId}/estimate`, { subject: demoSubject }, { Origin: 'http://localhost' })).status).toBe(200);
  });

  it('without sign-in, only loopback names are answered (no DNS rebinding)', async () => {
    const res = await t.app.request('http://rebound.example/markets');
    expect(res.status).toBe(403);
    expect(textOf(await res.text())).toContain('answers to localhost or 127.0.0.1, not "rebound.example"');
    for (const url of ['http://127.0.0.1/markets', 'http://[::1]:3000/markets', 'http://localhost:3000/markets']) expect((await t.app.request(url)).status, url).toBe(200);
  });
});

describe('security headers', () => {
  it('a content security policy of our own origin only, and the usual protections', async () => {
    const res = await t.get(`/markets/${marketId}`);
    const csp = res.headers.get('Content-Security-Policy')!;
    expect(csp.split('; ').sort()).toEqual(
      ["base-uri 'none'", "connect-src 'self'", "default-src 'self'", "font-src 'self'", "form-action 'self'", "frame-ancestors 'none'", "img-src 'self' data:", "object-src 'none'", "script-src 'self'", "style-src 'self'"].sort(),
    );
    expect(res.headers.get('X-Content-Type-Options')).toBe('nosniff');
    expect(res.headers.get('X-Frame-Options')).toBe('DENY');
    expect(res.headers.get('Referrer-Policy')).toBe('same-origin');
    expect(res.headers.get('Cross-Origin-Opener-Policy')).toBe('same-origin');
    expect(res.headers.get('Strict-Transport-Security')).toBeNull(); // plain http
    // Refusals carry them too.
    expect((await t.post('/markets', NEW_MARKET, { Origin: 'http://evil.example' })).headers.get('Content-Security-Policy')).toBe(csp);
  });

  it('pages hold nothing the policy would block: no inline script, no style attribute, no event-handler attribute', async () => {
    const q = new URLSearchParams({ ...demoSubject, run: 'estimate' }).toString();
    for (const url of ['/markets', `/markets/${marketId}`, `/markets/${marketId}/estimate?${q}`, `/markets/${marketId}/sales/new`, `/markets/${marketId}/import`]) {
      const html = await (await t.get(url)).text();
      expect(html).not.toMatch(/<script(?![^>]*\bsrc=)[^>]*>/);
      expect(html).not.toMatch(/<[^>]+\sstyle=/);
      expect(html).not.toMatch(/<style\b/);
      expect(html).not.toMatch(/<[^>]+\son[a-z]+=/);
      expect(html).toContain('<meta name="htmx-config"');
    }
  });
});

describe('body size', () => {
  const big = 'x'.repeat(300 * 1024);

  it('a form over 256 KB is refused with 413 before it is read, and nothing is saved', async () => {
    const before = await marketCount();
    const res = await t.post('/markets', { ...NEW_MARKET, notes: big });
    expect(res.status).toBe(413);
    expect(textOf(await res.text())).toContain('The request is larger than 256 KB; nothing was saved.');
    const hx = await t.post('/markets', { ...NEW_MARKET, notes: big }, HTMX);
    expect(hx.status).toBe(413);
    expect(hx.headers.get('HX-Retarget')).toBe('#messages');
    expect(await marketCount()).toBe(before);
  });

  it('a body without a length (chunked) is cut off at the limit too', async () => {
    const chunks = new ReadableStream<Uint8Array>({
      start(controller) {
        const piece = new TextEncoder().encode(`_csrf=${t.csrfToken}&name=Chunky&area_unit=sqft&currency=USD&notes=`);
        controller.enqueue(piece);
        for (let i = 0; i < 40; i++) controller.enqueue(new TextEncoder().encode('y'.repeat(8 * 1024)));
        controller.close();
      },
    });
    const res = await t.app.request('/markets', { method: 'POST', body: chunks, headers: { ...FORM, Cookie: t.cookie() }, duplex: 'half' } as RequestInit);
    expect(res.status).toBe(413);
    // A small chunked form goes through, read once by the token check and again by the route.
    const small = new ReadableStream<Uint8Array>({
      start(controller) {
        controller.enqueue(new TextEncoder().encode(`_csrf=${t.csrfToken}&name=Chunky&area_unit=sqft&currency=USD`));
        controller.close();
      },
    });
    const ok = await t.app.request('/markets', { method: 'POST', body: small, headers: { ...FORM, Cookie: t.cookie() }, duplex: 'half' } as RequestInit);
    expect(ok.status).toBe(303);
  });

  it('the JSON API gets its 413 as JSON', async () => {
    const res = await t.postJson(`/api/markets/${marketId}/estimate`, { subject: demoSubject, padding: big });
    expect(res.status).toBe(413);
    expect(await res.json()).toEqual({ errors: ['The request is larger than 256 KB; nothing was saved.'] });
  });

  it('a field holding a NUL character (which SQLite would cut the text at) is refused naming the field; in a CSV, naming row and column', async () => {
    const before = await marketCount();
    const res = await t.post('/markets', { ...NEW_MARKET, notes: 'before\u0000after' });
    expect(res.status).toBe(422);
    expect(textOf(await res.text())).toContain('The field notes contains a NUL character (U+0000), which cannot be stored; nothing was saved.');
    expect(await marketCount()).toBe(before);
    const csv = await t.upload(`/markets/${marketId}/import`, 'nul.csv', 'address,sale_date,sale_price\n1 Elm\u0000 Row,2025-01-02,200000\n');
    expect(csv.status).toBe(422);
    expect(textOf(await csv.text())).toMatch(/1\s*address\s*1 Elm\u0000 Row\s*address contains a NUL character \(U\+0000\), which cannot be stored/);
  });

  it('a body that is not a well-formed form is a 400, not a server error', async () => {
    const res = await t.app.request('/markets', {
      method: 'POST',
      body: '--zz\r\nContent-Disposition: form-data; name="_csrf"\r\n\r\nabc\r\n--zz', // never closed
      headers: { 'Content-Type': 'multipart/form-data; boundary=zz', Cookie: t.cookie() },
    });
    expect(res.status).toBe(400);
    expect(textOf(await res.text())).toContain('The form could not be read');
  });
});
