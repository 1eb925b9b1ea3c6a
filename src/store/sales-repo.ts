/**
 * Sales of a market: list with sort, filter and pages; look up; add, edit, exclude,
 * include, delete and restore. Every change writes one row of history (who, when, the
 * sale before and after) in the same transaction. Lookups return undefined; `getSale`
 * throws. A reference already used in the market is a field error, not an exception.
 */
import { and, asc, count, desc, eq, gte, lte, or, sql, type AnyColumn, type SQL } from 'drizzle-orm';
import type { BaseSQLiteDatabase } from 'drizzle-orm/sqlite-core';
import type { Sale } from '../domain/sale.js';
import type { FieldErrors } from '../domain/validate-sale.js';
import type { Database } from './database.js';
import { NotFoundError } from './markets-repo.js';
import { rowToSale, saleToColumns, toDomainSale, type StoredSale } from './sale-columns.js';
import { refGenerator } from './sale-refs.js';
import * as schema from './schema.js';
import { saleChanges, sales, type SaleChangeRow } from './schema.js';

export type { StoredSale } from './sale-columns.js';

/** The database or an open transaction on it. */
export type Executor = BaseSQLiteDatabase<'async', unknown, typeof schema>;

export const SALE_SORTS = ['sale_date', 'sale_price', 'address', 'id', 'living_area', 'year_built', 'rooms', 'updated'] as const;
export type SaleSort = (typeof SALE_SORTS)[number];

const SORT_COLUMN = {
  sale_date: sales.saleDate,
  sale_price: sales.salePrice,
  address: sales.address,
  id: sales.ref,
  living_area: sales.livingArea,
  year_built: sales.yearBuilt,
  rooms: sales.rooms,
  updated: sales.updatedAt,
} as const satisfies Record<SaleSort, unknown>;

export type SaleStatus = 'all' | 'included' | 'excluded';

export interface SalesQuery {
  /** Matched, case-insensitively, against reference, address, verification and notes. */
  text?: string;
  /** Inclusive ISO dates. */
  from?: string;
  to?: string;
  status?: SaleStatus;
  sort?: SaleSort;
  direction?: 'asc' | 'desc';
  /** 1-based. */
  page?: number;
  pageSize?: number;
}

export interface SalesPage {
  sales: StoredSale[];
  /** Sales matching the filter, over all pages. */
  total: number;
  page: number;
  pageSize: number;
  pageCount: number;
}

export type SaleResult = { ok: true; sale: StoredSale } | { ok: false; errors: FieldErrors };

function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (ch) => `\\${ch}`);
}

function filterOf(marketId: number, q: SalesQuery): SQL | undefined {
  const parts: (SQL | undefined)[] = [eq(sales.marketId, marketId)];
  const text = q.text?.trim();
  if (text) {
    const pattern = `%${escapeLike(text)}%`;
    const likeEscaped = (col: AnyColumn) => sql`${col} like ${pattern} escape '\\'`;
    parts.push(or(likeEscaped(sales.ref), likeEscaped(sales.address), likeEscaped(sales.verification), likeEscaped(sales.notes)));
  }
  if (q.from) parts.push(gte(sales.saleDate, q.from));
  if (q.to) parts.push(lte(sales.saleDate, q.to));
  if (q.status === 'included') parts.push(eq(sales.included, true));
  if (q.status === 'excluded') parts.push(eq(sales.included, false));
  return and(...parts);
}

export async function listSales(db: Executor, marketId: number, q: SalesQuery = {}): Promise<SalesPage> {
  const where = filterOf(marketId, q);
  const pageSize = Math.min(Math.max(Math.trunc(q.pageSize ?? 50), 1), 500);
  const [{ total }] = await db.select({ total: count() }).from(sales).where(where);
  const pageCount = Math.max(1, Math.ceil(total / pageSize));
  const page = Math.min(Math.max(Math.trunc(q.page ?? 1), 1), pageCount);
  const column = SORT_COLUMN[q.sort ?? 'sale_date'];
  const order = q.direction === 'asc' ? asc : desc;
  const rows = await db
    .select()
    .from(sales)
    .where(where)
    .orderBy(order(column), order(sales.id))
    .limit(pageSize)
    .offset((page - 1) * pageSize);
  return { sales: rows.map(rowToSale), total, page, pageSize, pageCount };
}

/** Every sale of a market, oldest first (export, estimates). */
export async function allSales(db: Executor, marketId: number): Promise<StoredSale[]> {
  const rows = await db.select().from(sales).where(eq(sales.marketId, marketId)).orderBy(asc(sales.saleDate), asc(sales.id));
  return rows.map(rowToSale);
}

export async function findSale(db: Executor, marketId: number, key: number): Promise<StoredSale | undefined> {
  const [row] = await db
    .select()
    .from(sales)
    .where(and(eq(sales.marketId, marketId), eq(sales.id, key)));
  return row ? rowToSale(row) : undefined;
}

export async function getSale(db: Executor, marketId: number, key: number): Promise<StoredSale> {
  const s = await findSale(db, marketId, key);
  if (!s) throw new NotFoundError(`sale ${key} of market ${marketId}`);
  return s;
}

export async function findSaleByRef(db: Executor, marketId: number, ref: string): Promise<StoredSale | undefined> {
  const [row] = await db
    .select()
    .from(sales)
    .where(and(eq(sales.marketId, marketId), eq(sales.ref, ref)));
  return row ? rowToSale(row) : undefined;
}

export async function marketRefs(db: Executor, marketId: number): Promise<string[]> {
  const rows = await db.select({ ref: sales.ref }).from(sales).where(eq(sales.marketId, marketId));
  return rows.map((r) => r.ref);
}

type ChangeAction = SaleChangeRow['action'];

async function recordChange(
  db: Executor,
  change: { marketId: number; saleId: number; by: string; at: string; action: ChangeAction; before?: Sale; after?: Sale },
): Promise<number> {
  const [row] = await db
    .insert(saleChanges)
    .values({
      marketId: change.marketId,
      saleId: change.saleId,
      by: change.by,
      at: change.at,
      action: change.action,
      beforeJson: change.before ? JSON.stringify(toDomainSale(change.before)) : null,
      afterJson: change.after ? JSON.stringify(toDomainSale(change.after)) : null,
    })
    .returning({ id: saleChanges.id });
  return row.id;
}

function refTaken(ref: string): FieldErrors {
  return { id: `id "${ref}" is already used by another sale in this market` };
}

/** Adds one sale; an empty `id` gets the next generated reference. */
export async function addSale(db: Database, marketId: number, sale: Sale, by: string): Promise<SaleResult> {
  return db.transaction(async (tx) => {
    let ref = sale.id.trim();
    if (ref) {
      if (await findSaleByRef(tx, marketId, ref)) return { ok: false, errors: refTaken(ref) };
    } else ref = refGenerator(await marketRefs(tx, marketId))();
    const at = new Date().toISOString();
    const [row] = await tx
      .insert(sales)
      .values({ ...saleToColumns({ ...sale, id: ref }), marketId, createdAt: at, updatedAt: at })
      .returning();
    const stored = rowToSale(row);
    await recordChange(tx, { marketId, saleId: row.id, by, at, action: 'create', after: stored });
    return { ok: true, sale: stored };
  });
}

/** Replaces a sale's fields; an empty `id` keeps the current reference. */
export async function updateSale(db: Database, marketId: number, key: number, sale: Sale, by: string): Promise<SaleResult> {
  return db.transaction(async (tx) => {
    const before = await getSale(tx, marketId, key);
    const ref = sale.id.trim() || before.id;
    if (ref !== before.id && (await findSaleByRef(tx, marketId, ref))) return { ok: false, errors: refTaken(ref) };
    return { ok: true, sale: await writeChange(tx, before, { ...sale, id: ref }, 'update', by) };
  });
}

async function writeChange(tx: Executor, before: StoredSale, next: Sale, action: ChangeAction, by: string): Promise<StoredSale> {
  const at = new Date().toISOString();
  const [row] = await tx
    .update(sales)
    .set({ ...saleToColumns(next), updatedAt: at })
    .where(eq(sales.id, before.key))
    .returning();
  const after = rowToSale(row);
  await recordChange(tx, { marketId: before.marketId, saleId: before.key, by, at, action, before, after });
  return after;
}

/** Leaves a sale out of estimates, with the reason shown wherever it is listed. */
export async function excludeSale(db: Database, marketId: number, key: number, reason: string, by: string): Promise<StoredSale> {
  return db.transaction(async (tx) => {
    const before = await getSale(tx, marketId, key);
    return writeChange(tx, before, { ...toDomainSale(before), included: false, excludedReason: reason }, 'exclude', by);
  });
}

export async function includeSale(db: Database, marketId: number, key: number, by: string): Promise<StoredSale> {
  return db.transaction(async (tx) => {
    const before = await getSale(tx, marketId, key);
    const { excludedReason: _dropped, ...rest } = toDomainSale(before);
    return writeChange(tx, before, { ...rest, included: true }, 'include', by);
  });
}

/** Deletes a sale and returns the id of the history row that can restore it. */
export async function deleteSale(db: Database, marketId: number, key: number, by: string): Promise<{ sale: StoredSale; changeId: number }> {
  return db.transaction(async (tx) => {
    const before = await getSale(tx, marketId, key);
    await tx.delete(sales).where(eq(sales.id, key));
    const changeId = await recordChange(tx, { marketId, saleId: key, by, at: new Date().toISOString(), action: 'delete', before });
    return { sale: before, changeId };
  });
}

/**
 * Undoes a delete: puts the sale back under its old key and reference with its original
 * creation time. Fails with a field error if the reference has been taken since.
 */
export async function restoreSale(db: Database, marketId: number, changeId: number, by: string): Promise<SaleResult> {
  return db.transaction(async (tx) => {
    const [change] = await tx
      .select()
      .from(saleChanges)
      .where(and(eq(saleChanges.id, changeId), eq(saleChanges.marketId, marketId), eq(saleChanges.action, 'delete')));
    if (!change || !change.beforeJson) throw new NotFoundError(`deleted sale (change ${changeId})`);
    if (await findSale(tx, marketId, change.saleId)) return { ok: false, errors: { id: 'this sale has already been restored' } };
    const sale = JSON.parse(change.beforeJson) as Sale;
    if (await findSaleByRef(tx, marketId, sale.id)) return { ok: false, errors: refTaken(sale.id) };
    const [created] = await tx
      .select({ at: saleChanges.at })
      .from(saleChanges)
      .where(eq(saleChanges.saleId, change.saleId))
      .orderBy(asc(saleChanges.id))
      .limit(1);
    const at = new Date().toISOString();
    const [row] = await tx
      .insert(sales)
      .values({ ...saleToColumns(sale), id: change.saleId, marketId, createdAt: created?.at ?? at, updatedAt: at })
      .returning();
    const stored = rowToSale(row);
    await recordChange(tx, { marketId, saleId: row.id, by, at, action: 'restore', after: stored });
    return { ok: true, sale: stored };
  });
}

export interface SaleChange {
  id: number;
  saleId: number;
  at: string;
  by: string;
  action: ChangeAction;
  before?: Sale;
  after?: Sale;
}

function rowToChange(row: SaleChangeRow): SaleChange {
  return {
    id: row.id,
    saleId: row.saleId,
    at: row.at,
    by: row.by,
    action: row.action,
    ...(row.beforeJson ? { before: JSON.parse(row.beforeJson) as Sale } : {}),
    ...(row.afterJson ? { after: JSON.parse(row.afterJson) as Sale } : {}),
  };
}

/** A sale's history, newest first. */
export async function listSaleChanges(db: Executor, marketId: number, saleId: number): Promise<SaleChange[]> {
  const rows = await db
    .select()
    .from(saleChanges)
    .where(and(eq(saleChanges.marketId, marketId), eq(saleChanges.saleId, saleId)))
    .orderBy(desc(saleChanges.id));
  return rows.map(rowToChange);
}

export async function findSaleChange(db: Executor, marketId: number, changeId: number): Promise<SaleChange | undefined> {
  const [row] = await db
    .select()
    .from(saleChanges)
    .where(and(eq(saleChanges.marketId, marketId), eq(saleChanges.id, changeId)));
  return row ? rowToChange(row) : undefined;
}
