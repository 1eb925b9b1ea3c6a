/** Route parameter and form body helpers shared by the routes. */
import type { Context } from 'hono';
import { HTTPException } from 'hono/http-exception';
import type { RawFields } from '../../domain/validate-sale.js';
import type { Database } from '../../store/database.js';
import { getMarket, type Market } from '../../store/markets-repo.js';

/** A positive integer route parameter; anything else is a 404, as no such record exists. */
export function idParam(c: Context, name: string): number {
  const text = c.req.param(name) ?? '';
  const n = Number(text);
  if (!/^\d{1,15}$/.test(text) || !Number.isSafeInteger(n) || n < 1) throw new HTTPException(404, { message: `There is no ${name.replace(/Id$/, '')} "${text}".` });
  return n;
}

export async function marketOf(c: Context, db: Database): Promise<Market> {
  return getMarket(db, idParam(c, 'marketId'));
}

/** A urlencoded or multipart form as text fields (files are dropped). */
export async function formFields(c: Context): Promise<RawFields> {
  const body = await c.req.parseBody();
  const fields: RawFields = {};
  for (const [k, v] of Object.entries(body)) if (typeof v === 'string') fields[k] = v;
  return fields;
}
