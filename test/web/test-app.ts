/** A web app on a fresh in-memory database, with helpers to post forms and files. */
import { createApp } from '../../src/app.js';
import type { Database } from '../../src/store/database.js';
import { testDatabase, testMarket } from '../store/test-database.js';

export interface TestApp {
  db: Database;
  app: ReturnType<typeof createApp>;
  get: (url: string, headers?: Record<string, string>) => Promise<Response>;
  post: (url: string, fields: Record<string, string>, headers?: Record<string, string>) => Promise<Response>;
  upload: (url: string, fileName: string, content: string) => Promise<Response>;
}

export const HTMX = { 'HX-Request': 'true' };

export async function testApp(): Promise<TestApp> {
  const db = await testDatabase();
  const app = createApp({ db });
  return {
    db,
    app,
    get: async (url, headers = {}) => app.request(url, { headers }),
    post: async (url, fields, headers = {}) =>
      app.request(url, {
        method: 'POST',
        body: new URLSearchParams(fields),
        headers: { 'Content-Type': 'application/x-www-form-urlencoded', ...headers },
      }),
    upload: async (url, fileName, content) => {
      const form = new FormData();
      form.append('file', new File([content], fileName, { type: 'text/csv' }));
      return app.request(url, { method: 'POST', body: form });
    },
  };
}

export { testMarket };

/** The text content of the first element with this id, tags stripped (enough for assertions). */
export function textOf(html: string): string {
  return html.replace(/<[^>]+>/g, ' ').replace(/&amp;/g, '&').replace(/&quot;/g, '"').replace(/&#39;/g, "'").replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/\s+/g, ' ');
}
