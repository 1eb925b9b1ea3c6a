/**
 * Reads a posted form once, before the routes: a body that is not a well-formed form is a
 * 400 here rather than a failure inside a route, and a field holding a NUL character
 * (U+0000) is a 422 naming the field, as SQLite text would end at it and the value would be
 * stored cut short. Hono keeps the parsed body, so the routes read it again for free.
 */
import type { Context, MiddlewareHandler } from 'hono';
import { refuse } from './refuse.js';

const FORM_TYPES = /^(application\/x-www-form-urlencoded|multipart\/form-data)/i;

export class MalformedFormError extends Error {}

/** The parsed form fields (files included), or an empty record for a body that is not a form. */
export async function readFormBody(c: Context): Promise<Record<string, unknown>> {
  if (!FORM_TYPES.test(c.req.header('Content-Type') ?? '')) return {};
  try {
    return await c.req.parseBody();
  } catch {
    throw new MalformedFormError('not a well-formed form');
  }
}

export function wellFormedForms(): MiddlewareHandler {
  return async (c, next) => {
    if (/^(GET|HEAD|OPTIONS)$/.test(c.req.method)) return next();
    let body: Record<string, unknown>;
    try {
      body = await readFormBody(c);
    } catch (err) {
      if (!(err instanceof MalformedFormError)) throw err;
      return refuse(c, 400, 'The form could not be read (its body is not a well-formed form); nothing was saved.');
    }
    for (const [name, value] of Object.entries(body)) {
      const values = Array.isArray(value) ? value : [value];
      if (values.some((v) => typeof v === 'string' && v.includes('\u0000')))
        return refuse(c, 422, `The field ${name.slice(0, 40)} contains a NUL character (U+0000), which cannot be stored; nothing was saved.`);
    }
    return next();
  };
}
