/**
 * Writes a validated set of sales into a market, all in one transaction or not at all.
 * Row numbers in errors count data rows from 1, as readSalesCsv does, so a message points
 * at the same line of the file whichever check found it.
 */
import { eq, max } from 'drizzle-orm';
import type { Sale } from '../domain/sale.js';
import type { RowError } from '../domain/sales-csv.js';
import type { Database } from './database.js';
import { saleToColumns, toDomainSale } from './sale-columns.js';
import { refGenerator } from './sale-refs.js';
import { marketRefs, type Executor } from './sales-repo.js';
import { importBatches, saleChanges, sales } from './schema.js';

/** Rows per INSERT: large enough to amortise statement cost, well under SQLite's parameter limit. */
const CHUNK_ROWS = 400;

export type ImportResult = { ok: true; count: number; batchId: number } | { ok: false; errors: RowError[] };

/** Sales whose reference is already used in the market (the file itself was checked by readSalesCsv). */
export async function findTakenRefs(db: Executor, marketId: number, incoming: readonly Sale[]): Promise<RowError[]> {
  const existing = new Set(await marketRefs(db, marketId));
  const errors: RowError[] = [];
  incoming.forEach((s, i) => {
    if (s.id && existing.has(s.id))
      errors.push({ row: i + 1, column: 'id', value: s.id, message: `id "${s.id}" is already used by a sale in this market` });
  });
  return errors;
}

export interface ImportOptions {
  by: string;
  fileName: string;
  /** A previewed batch to mark as committed; without one a new batch is recorded. */
  batchId?: number;
}

export async function importSales(db: Database, marketId: number, incoming: readonly Sale[], options: ImportOptions): Promise<ImportResult> {
  return db.transaction(async (tx) => {
    const taken = await findTakenRefs(tx, marketId, incoming);
    if (taken.length > 0) return { ok: false, errors: taken };

    const at = new Date().toISOString();
    let batchId = options.batchId;
    if (batchId === undefined) {
      const [b] = await tx
        .insert(importBatches)
        .values({ marketId, fileName: options.fileName, status: 'committed', rowCount: incoming.length, createdBy: options.by, createdAt: at, committedAt: at })
        .returning({ id: importBatches.id });
      batchId = b.id;
    } else {
      await tx
        .update(importBatches)
        .set({ status: 'committed', committedAt: at, csvText: null, rowCount: incoming.length })
        .where(eq(importBatches.id, batchId));
    }

    const nextRef = refGenerator([...(await marketRefs(tx, marketId)), ...incoming.map((s) => s.id).filter(Boolean)]);
    // Keys are assigned here, not by the database, so history rows can be written in bulk too.
    const [{ top }] = await tx.select({ top: max(sales.id) }).from(sales);
    let key = (top ?? 0) + 1;
    for (let start = 0; start < incoming.length; start += CHUNK_ROWS) {
      const chunk = incoming.slice(start, start + CHUNK_ROWS).map((s) => {
        const sale = s.id ? s : { ...s, id: nextRef() };
        return { sale, key: key++ };
      });
      await tx.insert(sales).values(
        chunk.map(({ sale, key: id }) => ({ ...saleToColumns(sale), id, marketId, importBatchId: batchId, createdAt: at, updatedAt: at })),
      );
      await tx.insert(saleChanges).values(
        chunk.map(({ sale, key: id }) => ({
          marketId,
          saleId: id,
          at,
          by: options.by,
          action: 'import' as const,
          afterJson: JSON.stringify(toDomainSale(sale)),
        })),
      );
    }
    return { ok: true, count: incoming.length, batchId };
  });
}
