/**
 * A web app on a fresh in-memory database, with helpers to post forms and files the way a
 * browser does: the first page read gives the CSRF cookie and token (from the body's
 * hx-headers, as htmx reads it), and every post sends both back.
 */
import { createApp, type AppDeps } from '../../src/app.js';
import type { Database } from '../../src/store/database.js';
import { testDatabase, testMarket } from '../store/test-database.js';

export interface TestApp {
  db: Database;
  app: ReturnType<typeof createApp>;
  /** The token every form carries, and the cookies a browser would hold. */
  csrfToken: string;
  cookie: () => string;
  get: (url: string, headers?: Record<string, string>) => Promise<Response>;
  post: (url: string, fields: Record<string, string>, headers?: Record<string, string>) => Promise<Response>;
  upload: (url: string, fileName: string, content: string) => Promise<Response>;
  /** Sends a JSON body (the API), with the browser's cookies. */
  postJson: (url: string, body: unknown, headers?: Record<string, string>) => Promise<Response>;
}

export const HTMX = { 'HX-Request': 'true' };

/** The CSRF token a page carries for htmx (hx-headers on the body). */
export function csrfTokenOf(html: string): string | undefined {
  const m = /<body[^>]*hx-headers="([^"]*)"/.exec(html);
  if (!m) return undefined;
  return (JSON.parse(m[1].replace(/&quot;/g, '"')) as Record<string, string>)['X-CSRF-Token'];
}

/** A cookie jar of name → value, filled from Set-Cookie headers (an expired cookie is dropped). */
export class CookieJar {
  private readonly cookies = new Map<string, string>();
  keep(res: Response): void {
    for (const line of res.headers.getSetCookie()) {
      const [pair, ...attributes] = line.split(';');
      const eq = pair.indexOf('=');
      const name = pair.slice(0, eq).trim();
      if (attributes.some((a) => /^\s*max-age=0\s*$/i.test(a))) this.cookies.delete(name);
      else this.cookies.set(name, pair.slice(eq + 1).trim());
    }
  }
  get(name: string): string | undefined {
    return this.cookies.get(name);
  }
  header(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }
}

export async function testApp(options: Omit<AppDeps, 'db'> & { db?: Database } = {}): Promise<TestApp> {
  const db = options.db ?? (await testDatabase());
  const app = createApp({ ...options, db });
  const jar = new CookieJar();
  const send = async (url: string, init: RequestInit & { headers?: Record<string, string> } = {}) => {
    const res = await app.request(url, { ...init, headers: { ...(jar.header() ? { Cookie: jar.header() } : {}), ...init.headers } });
    jar.keep(res);
    return res;
  };
  const first = await send('/markets');
  const token = csrfTokenOf(await first.text());
  if (!token && !options.access?.signInRequired) throw new Error('test-app: the first page carries no CSRF token');
  const t: TestApp = {
    db,
    app,
    csrfToken: token ?? '',
    cookie: () => jar.header(),
    get: async (url, headers = {}) => send(url, { headers }),
    post: async (url, fields, headers = {}) =>
      send(url, {
        method: 'POST',
        body: new URLSearchParams({ _csrf: t.csrfToken, ...fields }),
        headers: { 'Content-Type': 'application/x-www-form-urlencoded', ...headers },
      }),
    upload: async (url, fileName, content) => {
      const form = new FormData();
      form.append('_csrf', t.csrfToken);
      form.append('file', new File([content], fileName, { type: 'text/csv' }));
      return send(url, { method: 'POST', body: form });
    },
    postJson: async (url, body, headers = {}) => send(url, { method: 'POST', body: JSON.stringify(body), headers: { 'Content-Type': 'application/json', ...headers } }),
  };
  return t;
}

export { testMarket };

/** The text content of the first element with this id, tags stripped (enough for assertions). */
export function textOf(html: string): string {
  return html.replace(/<[^>]+>/g, ' ').replace(/&amp;/g, '&').replace(/&quot;/g, '"').replace(/&#39;/g, "'").replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/\s+/g, ' ');
}
