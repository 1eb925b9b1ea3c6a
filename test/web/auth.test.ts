/**
 * Sign-in when the app serves other machines: the gate on every page and API, sessions in
 * the database (hash of the token only, expiry, renewal, shared by app instances), the
 * cookie's attributes, sign-out, the signed-in name in the history and saved estimates,
 * and the sign-in limits per name and per address, counted in the database.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { eq } from 'drizzle-orm';
import { beforeEach, describe, expect, it } from 'vitest';
import { createApp } from '../../src/app.js';
import { installDemoMarket } from '../../src/store/demo-market.js';
import { listSaleChanges } from '../../src/store/sales-repo.js';
import { sessions, signInAttempts } from '../../src/store/schema.js';
import { addUser, removeUser } from '../../src/store/users-repo.js';
import type { AccessPolicy } from '../../src/web/middleware/access-policy.js';
import { CookieJar, csrfTokenOf, HTMX, testApp, textOf, type TestApp } from './test-app.js';

const SIGN_IN: AccessPolicy = { signInRequired: true, trustProxy: false };
const BEHIND_PROXY: AccessPolicy = { signInRequired: true, trustProxy: true };
const PASSWORD = 'correct horse battery staple';
const demoSubject = JSON.parse(readFileSync(new URL('../../seed/demo-subject.json', import.meta.url), 'utf8'));

/** A movable clock for session expiry and the sign-in window. */
function clock(start = '2026-03-02T09:00:00Z') {
  let t = Date.parse(start);
  return { now: () => new Date(t), advance: (ms: number) => (t += ms) };
}

/** One browser: its own cookies, sending the form token its last page carried. */
class Browser {
  readonly jar = new CookieJar();
  token = '';
  constructor(
    private readonly app: ReturnType<typeof createApp>,
    private readonly headers: Record<string, string> = {},
  ) {}
  async request(url: string, init: { method?: string; body?: BodyInit; headers?: Record<string, string> } = {}) {
    const cookie = this.jar.header();
    const res = await this.app.request(url, { ...init, headers: { ...this.headers, ...(cookie ? { Cookie: cookie } : {}), ...init.headers } });
    this.jar.keep(res);
    return res;
  }
  /** Reads a page and keeps the token it carries. */
  async open(url: string, headers: Record<string, string> = {}) {
    const res = await this.request(url, { headers });
    const html = await res.text();
    this.token = csrfTokenOf(html) ?? this.token;
    return { res, html };
  }
  async post(url: string, fields: Record<string, string>, headers: Record<string, string> = {}) {
    return this.request(url, {
      method: 'POST',
      body: new URLSearchParams({ _csrf: this.token, ...fields }),
      headers: { 'Content-Type': 'application/x-www-form-urlencoded', ...headers },
    });
  }
  async signIn(name: string, password: string, next?: string) {
    await this.open('/sign-in');
    const res = await this.post('/sign-in', { name, password, ...(next ? { next } : {}) });
    if (res.status === 303) await this.open('/markets');
    return res;
  }
}

let t: TestApp;
let time: ReturnType<typeof clock>;
let marketId: number;
beforeEach(async () => {
  time = clock();
  t = await testApp({ access: SIGN_IN, now: time.now });
  marketId = (await installDemoMarket(t.db)).marketId;
  const added = await addUser(t.db, 'Ana Ferreira', PASSWORD);
  expect(added.ok).toBe(true);
});

describe('without a session', () => {
  it('a page is sent to sign in and back, keeping where it was going', async () => {
    const res = await t.get(`/markets/${marketId}/estimate?transform=log`);
    expect(res.status).toBe(303);
    expect(res.headers.get('Location')).toBe(`/sign-in?next=${encodeURIComponent(`/markets/${marketId}/estimate?transform=log`)}`);
    expect((await t.get('/markets')).headers.get('Location')).toBe('/sign-in');
  });
  it('the API answers 401 with a JSON message, htmx is told to load the sign-in page, a form post saves nothing', async () => {
    const api = await t.get('/api/markets');
    expect(api.status).toBe(401);
    expect(await api.json()).toEqual({ errors: [expect.stringMatching(/^Sign in first/)] });
    const hx = await t.get(`/markets/${marketId}`, { ...HTMX, 'HX-Current-URL': `http://localhost/markets/${marketId}?q=oak` });
    expect(hx.status).toBe(401);
    expect(hx.headers.get('HX-Redirect')).toBe(`/sign-in?next=${encodeURIComponent(`/markets/${marketId}?q=oak`)}`);
    const post = await t.post('/markets', { name: 'Sneaky', area_unit: 'sqft', currency: 'USD' });
    expect(post.status).toBe(401);
    expect(textOf(await post.text())).toContain('You are not signed in');
    expect((await t.app.request(`/api/markets/${marketId}/estimate`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ subject: demoSubject }) })).status).toBe(401);
  });
  it('the sign-in page, the stylesheet and htmx are served; the page has the caution footer', async () => {
    const page = await t.get('/sign-in');
    expect(page.status).toBe(200);
    const text = textOf(await page.text());
    expect(text).toContain('Sign in');
    expect(text).toContain('It is not an appraisal');
    expect((await t.get('/static/app.css')).status).toBe(200);
    expect((await t.get('/static/htmx.min.js')).status).toBe(200);
  });
});

describe('signing in', () => {
  it('a wrong password and an unknown name get the same answer and no session', async () => {
    const b = new Browser(t.app);
    for (const [name, password] of [
      ['Ana Ferreira', 'not the right password'],
      ['Nobody Here', PASSWORD],
    ]) {
      const res = await b.signIn(name, password);
      expect(res.status).toBe(401);
      expect(textOf(await res.text())).toContain('That name and password do not match a user.');
      expect(b.jar.get('compfit_session')).toBeUndefined();
    }
    expect(await t.db.select().from(sessions)).toHaveLength(0);
  });

  it('the right password (name in any case) starts a session: HttpOnly, SameSite=Lax cookie; the database keeps only its hash', async () => {
    const b = new Browser(t.app);
    await b.open('/sign-in');
    const res = await b.post('/sign-in', { name: '  ana ferreira ', password: PASSWORD, next: `/markets/${marketId}` });
    expect(res.status).toBe(303);
    expect(res.headers.get('Location')).toBe(`/markets/${marketId}`);
    const cookie = res.headers.getSetCookie().find((c) => c.startsWith('compfit_session='))!;
    expect(cookie).toMatch(/; HttpOnly/);
    expect(cookie).toMatch(/; SameSite=Lax/);
    expect(cookie).toMatch(/; Path=\//);
    expect(cookie).toMatch(/; Max-Age=43200/);
    expect(cookie).not.toMatch(/Secure/); // plain http, no proxy
    const token = b.jar.get('compfit_session')!;
    const rows = await t.db.select().from(sessions);
    expect(rows).toHaveLength(1);
    expect(rows[0].id).toBe(createHash('sha256').update(token).digest('hex'));
    expect(JSON.stringify(rows)).not.toContain(token);
    expect(rows[0].expiresAt).toBe('2026-03-02T21:00:00.000Z');

    const page = await b.open(`/markets/${marketId}`);
    expect(page.res.status).toBe(200);
    expect(textOf(page.html)).toContain('Signed in as Ana Ferreira');
  });

  it('after signing in, only a path on this site is followed', async () => {
    for (const next of ['//evil.example/x', 'https://evil.example/', '/\\evil.example', 'markets']) {
      const b = new Browser(t.app);
      await b.open('/sign-in');
      const res = await b.post('/sign-in', { name: 'Ana Ferreira', password: PASSWORD, next });
      expect(res.headers.get('Location')).toBe('/markets');
    }
  });

  it('the history and saved estimates record the signed-in name, and the worksheet says who prepared it', async () => {
    const b = new Browser(t.app);
    await b.signIn('Ana Ferreira', PASSWORD);
    const added = await b.post(`/markets/${marketId}/sales`, { address: '4 Quill Lane', sale_date: '2025-06-01', sale_price: '310000', living_area: '1500' });
    expect(added.status).toBe(303);
    const key = Number(/\/sales\/(\d+)$/.exec(added.headers.get('Location')!)![1]);
    expect((await listSaleChanges(t.db, marketId, key)).map((c) => [c.action, c.by])).toEqual([['create', 'Ana Ferreira']]);

    const q = new URLSearchParams({ ...demoSubject, run: 'estimate' }).toString();
    const saved = await b.post(`/markets/${marketId}/estimates`, { query: q });
    expect(saved.status).toBe(303);
    const url = saved.headers.get('Location')!;
    expect(textOf(await (await b.request(url)).text())).toContain('by Ana Ferreira');
    const worksheet = await (await b.request(`${url}/worksheet.csv`)).text();
    expect(worksheet).toMatch(/Prepared by.*Ana Ferreira/);
    const api = await b.request(`/api/markets/${marketId}/estimates`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ subject: demoSubject }) });
    expect(api.status).toBe(201);
    const { id } = (await api.json()) as { id: number };
    expect(await (await b.request(`/api/estimates/${id}`)).json()).toMatchObject({ createdBy: 'Ana Ferreira' });
  });
});

describe('the session', () => {
  it('its form token is derived from the session: the token from before signing in no longer works', async () => {
    const b = new Browser(t.app);
    await b.open('/sign-in');
    const before = b.token;
    await b.post('/sign-in', { name: 'Ana Ferreira', password: PASSWORD });
    const stale = await b.request('/markets', { method: 'POST', body: new URLSearchParams({ _csrf: before, name: 'M1', area_unit: 'sqft', currency: 'USD' }), headers: { 'Content-Type': 'application/x-www-form-urlencoded' } });
    expect(stale.status).toBe(403);
    await b.open('/markets');
    expect(b.token).not.toBe(before);
    expect((await b.post('/markets', { name: 'M1', area_unit: 'sqft', currency: 'USD' })).status).toBe(303);

    const other = new Browser(t.app);
    await other.signIn('Ana Ferreira', PASSWORD);
    expect(other.token).not.toBe(b.token); // two sessions, two tokens
  });

  it('signing out ends it: the row is gone, the cookie cleared, and replaying the old cookie leads to sign-in', async () => {
    const b = new Browser(t.app);
    await b.signIn('Ana Ferreira', PASSWORD);
    const cookie = b.jar.header();
    const out = await b.post('/sign-out', {});
    expect(out.status).toBe(303);
    expect(out.headers.get('Location')).toBe('/sign-in');
    expect(out.headers.getSetCookie().some((c) => /^compfit_session=;.*Max-Age=0/.test(c))).toBe(true);
    expect(await t.db.select().from(sessions)).toHaveLength(0);
    const replay = await t.app.request('/markets', { headers: { Cookie: cookie } });
    expect(replay.status).toBe(303);
    expect(replay.headers.get('Location')).toBe('/sign-in');
  });

  it('runs out after 12 hours unused, and is extended when used in its second half', async () => {
    const b = new Browser(t.app);
    await b.signIn('Ana Ferreira', PASSWORD);
    time.advance(5 * 3600_000);
    expect((await b.request('/markets')).status).toBe(200);
    expect((await t.db.select().from(sessions))[0].expiresAt).toBe('2026-03-02T21:00:00.000Z'); // first half: unchanged
    time.advance(2 * 3600_000); // 7 h in
    const renewed = await b.request('/markets');
    expect(renewed.status).toBe(200);
    expect(renewed.headers.getSetCookie().some((c) => c.startsWith('compfit_session='))).toBe(true);
    expect((await t.db.select().from(sessions))[0].expiresAt).toBe('2026-03-03T04:00:00.000Z');
    time.advance(12 * 3600_000 + 1000);
    const expired = await b.request('/markets');
    expect(expired.status).toBe(303);
    expect(expired.headers.get('Location')).toBe('/sign-in');
  });

  it('is known to every app instance on the same database, and ends when the user is removed', async () => {
    const b = new Browser(t.app);
    await b.signIn('Ana Ferreira', PASSWORD);
    const second = createApp({ db: t.db, access: SIGN_IN, now: time.now });
    const res = await second.request(`/markets/${marketId}`, { headers: { Cookie: b.jar.header() } });
    expect(res.status).toBe(200);
    expect(textOf(await res.text())).toContain('Signed in as Ana Ferreira');
    await removeUser(t.db, 'ana ferreira');
    expect((await second.request('/markets', { headers: { Cookie: b.jar.header() } })).status).toBe(303);
  });

  it('behind a trusted TLS proxy the cookies are Secure and HSTS is sent; without TRUST_PROXY the header is ignored', async () => {
    const proxied = await testApp({ db: t.db, access: BEHIND_PROXY, now: time.now });
    const viaProxy = new Browser(proxied.app, { 'X-Forwarded-Proto': 'https', 'X-Forwarded-Host': 'compfit.example.org', Origin: 'https://compfit.example.org' });
    const page = await viaProxy.open('/sign-in');
    expect(page.res.headers.get('Strict-Transport-Security')).toBe('max-age=31536000');
    expect(page.res.headers.getSetCookie().find((c) => c.startsWith('compfit_csrf='))).toMatch(/; Secure/);
    const res = await viaProxy.post('/sign-in', { name: 'Ana Ferreira', password: PASSWORD });
    expect(res.status).toBe(303);
    expect(res.headers.getSetCookie().find((c) => c.startsWith('compfit_session='))).toMatch(/; Secure/);

    const direct = new Browser(t.app, { 'X-Forwarded-Proto': 'https' });
    const plain = await direct.open('/sign-in');
    expect(plain.res.headers.get('Strict-Transport-Security')).toBeNull();
    expect(plain.res.headers.getSetCookie().find((c) => c.startsWith('compfit_csrf='))).not.toMatch(/Secure/);
  });
});

describe('sign-in limits', () => {
  it('after 5 failures for a name, even the right password is refused (429) for 15 minutes; other names are not affected', async () => {
    await addUser(t.db, 'Bo Lindqvist', 'another long enough password');
    const b = new Browser(t.app);
    for (let i = 0; i < 5; i++) expect((await b.signIn('Ana Ferreira', `wrong guess number ${i}`)).status).toBe(401);
    const locked = await b.signIn('ana ferreira', PASSWORD);
    expect(locked.status).toBe(429);
    expect(locked.headers.get('Retry-After')).toBe('900');
    expect(textOf(await locked.text())).toContain('Too many failed sign-ins for this name. Try again in 15 minutes.');
    expect(b.jar.get('compfit_session')).toBeUndefined();
    expect((await b.signIn('Bo Lindqvist', 'another long enough password')).status).toBe(303);

    time.advance(10 * 60_000);
    const later = await new Browser(t.app).signIn('Ana Ferreira', PASSWORD);
    expect(later.status).toBe(429);
    expect(later.headers.get('Retry-After')).toBe('300');
    time.advance(5 * 60_000 + 1000);
    expect((await new Browser(t.app).signIn('Ana Ferreira', PASSWORD)).status).toBe(303);
  });

  it('after 20 failures from one address (any names) that address is refused; another is not; the count is shared through the database', async () => {
    const proxied = createApp({ db: t.db, access: BEHIND_PROXY, now: time.now });
    const from = (address: string) => new Browser(proxied, { 'X-Forwarded-For': `203.0.113.9, ${address}` });
    const attacker = from('198.51.100.7');
    for (let i = 0; i < 20; i++) expect((await attacker.signIn(`guess-${i}`, 'some password or other')).status).toBe(401);
    expect(await t.db.select().from(signInAttempts).where(eq(signInAttempts.address, '198.51.100.7'))).toHaveLength(20);
    const refused = await attacker.signIn('Ana Ferreira', PASSWORD);
    expect(refused.status).toBe(429);
    expect(textOf(await refused.text())).toContain('Too many failed sign-ins from this address.');
    // A second app instance on the same database enforces the same count.
    const secondInstance = new Browser(createApp({ db: t.db, access: BEHIND_PROXY, now: time.now }), { 'X-Forwarded-For': '198.51.100.7' });
    expect((await secondInstance.signIn('Ana Ferreira', PASSWORD)).status).toBe(429);
    expect((await from('192.0.2.44').signIn('Ana Ferreira', PASSWORD)).status).toBe(303);
  }, 20_000);
});
