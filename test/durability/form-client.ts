/**
 * A small browser stand-in for durability tests that drive a running app over HTTP: keeps
 * cookies, sends the Origin a browser would, and posts a form with the hidden fields its
 * page carries (a CSRF token, say), so a test goes through the app's real form flow.
 */

export interface FormResponse {
  status: number;
  location: string | null;
  body: string;
}

export class FormClient {
  private readonly cookies = new Map<string, string>();
  /** Hidden fields per form action, read from the page that shows the form. */
  private readonly hiddenFields = new Map<string, Record<string, string>>();

  constructor(readonly baseUrl: string) {}

  private headers(extra: Record<string, string> = {}): Record<string, string> {
    const cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
    return { Origin: new URL(this.baseUrl).origin, ...(cookie ? { Cookie: cookie } : {}), ...extra };
  }

  private keepCookies(res: Response): void {
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const eq = pair.indexOf('=');
      if (eq > 0) this.cookies.set(pair.slice(0, eq).trim(), pair.slice(eq + 1).trim());
    }
  }

  async request(pathOrUrl: string, init: { method?: string; body?: BodyInit; headers?: Record<string, string> } = {}): Promise<FormResponse> {
    const res = await fetch(new URL(pathOrUrl, this.baseUrl), {
      method: init.method ?? 'GET',
      body: init.body,
      headers: this.headers(init.headers),
      redirect: 'manual',
    });
    this.keepCookies(res);
    return { status: res.status, location: res.headers.get('Location'), body: await res.text() };
  }

  async get(path: string): Promise<FormResponse> {
    const r = await this.request(path);
    this.rememberForms(r.body);
    return r;
  }

  /** Reads the hidden inputs of every form on a page, keyed by the form's action. */
  rememberForms(html: string): void {
    for (const form of html.matchAll(/<form\b([^>]*)>([\s\S]*?)<\/form>/g)) {
      const action = /\baction="([^"]*)"/.exec(form[1])?.[1];
      if (!action) continue;
      const hidden: Record<string, string> = {};
      for (const input of form[2].matchAll(/<input\b[^>]*>/g)) {
        if (!/\btype="hidden"/.test(input[0])) continue;
        const name = /\bname="([^"]*)"/.exec(input[0])?.[1];
        if (name) hidden[decodeEntities(name)] = decodeEntities(/\bvalue="([^"]*)"/.exec(input[0])?.[1] ?? '');
      }
      this.hiddenFields.set(decodeEntities(action), hidden);
    }
  }

  /**
   * Posts a form to `action`. The hidden fields come from the last page read that showed
   * this form; `formPage` is read first when no such page has been seen yet.
   */
  async submit(action: string, fields: Record<string, string>, formPage?: string): Promise<FormResponse> {
    if (!this.hiddenFields.has(action) && formPage) await this.get(formPage);
    const body = new URLSearchParams({ ...this.hiddenFields.get(action), ...fields });
    return this.request(action, { method: 'POST', body, headers: { 'Content-Type': 'application/x-www-form-urlencoded' } });
  }

  /** Posts a file upload form (multipart) to `action`, with the hidden fields of its page. */
  async upload(action: string, fileField: string, file: File, formPage?: string): Promise<FormResponse> {
    if (!this.hiddenFields.has(action) && formPage) await this.get(formPage);
    const form = new FormData();
    for (const [k, v] of Object.entries(this.hiddenFields.get(action) ?? {})) form.append(k, v);
    form.append(fileField, file);
    const r = await this.request(action, { method: 'POST', body: form });
    this.rememberForms(r.body);
    return r;
  }
}

function decodeEntities(text: string): string {
  return text
    .replace(/&quot;/g, '"')
    .replace(/&#39;/g, "'")
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&amp;/g, '&');
}
