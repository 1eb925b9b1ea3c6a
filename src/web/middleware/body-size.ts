/**
 * Body size limits, checked before anything reads a body: a CSV upload may carry a file of
 * the largest accepted size plus its multipart envelope; every other form or JSON body is
 * small. Too large is a 413 that says the limit and that nothing was saved.
 *
 * A body without a Content-Length (chunked) is read up to the limit and handed on with its
 * length, so later checks (the import route has its own) need not read the stream again.
 */
import type { Context, MiddlewareHandler } from 'hono';
import { bodyLimit } from 'hono/body-limit';
import { MAX_CSV_BYTES } from '../../domain/sales-csv.js';
import { refuse } from './refuse.js';

const KB = 1024;
/** Largest form or JSON body outside the CSV upload. */
export const FORM_LIMIT_BYTES = 256 * KB;
/** The CSV upload: the file plus room for the multipart envelope. */
export const UPLOAD_LIMIT_BYTES = MAX_CSV_BYTES + 64 * KB;

const isUpload = (c: Context) => c.req.method === 'POST' && /^\/markets\/[^/]+\/import\/?$/.test(c.req.path);

function describe(bytes: number): string {
  return bytes >= 1024 * KB ? `${Math.round(bytes / (1024 * KB))} MB` : `${Math.round(bytes / KB)} KB`;
}

function limited(maxSize: number, message: string): MiddlewareHandler {
  const check = bodyLimit({ maxSize, onError: (c) => refuse(c, 413, message) });
  return (c, next) =>
    check(c, async () => {
      const headersOf = c.req.raw.headers;
      if (c.req.raw.body && (headersOf.has('transfer-encoding') || !headersOf.has('content-length'))) {
        const body = await c.req.raw.arrayBuffer();
        const headers = new Headers(c.req.raw.headers);
        headers.delete('transfer-encoding');
        headers.set('content-length', String(body.byteLength));
        c.req.raw = new Request(c.req.raw.url, { method: c.req.raw.method, headers, body });
      }
      await next();
    });
}

export function bodySizeLimits(): MiddlewareHandler {
  // The same words as the import page's own check of the file's size.
  const upload = limited(UPLOAD_LIMIT_BYTES, `The file is larger than ${describe(MAX_CSV_BYTES)}; nothing was imported. Split it into smaller files.`);
  const form = limited(FORM_LIMIT_BYTES, `The request is larger than ${describe(FORM_LIMIT_BYTES)}; nothing was saved.`);
  // GET and HEAD carry no body; touching c.req.raw.body would build a full Request for nothing.
  return (c, next) => (c.req.method === 'GET' || c.req.method === 'HEAD' ? next() : isUpload(c) ? upload(c, next) : form(c, next));
}
