/**
 * Uploaded files waiting between preview and commit. The text is kept in the database,
 * not in memory, so any app instance can commit a preview another one made.
 */
import { and, eq, lt } from 'drizzle-orm';
import type { Database } from './database.js';
import { importBatches, type ImportBatchRow } from './schema.js';

/** Previews older than this are dropped when a new one is made. */
const PREVIEW_LIFETIME_MS = 24 * 60 * 60 * 1000;

export async function savePreview(
  db: Database,
  preview: { marketId: number; fileName: string; csvText: string; rowCount: number; by: string },
): Promise<number> {
  const cutoff = new Date(Date.now() - PREVIEW_LIFETIME_MS).toISOString();
  await db.delete(importBatches).where(and(eq(importBatches.status, 'previewed'), lt(importBatches.createdAt, cutoff)));
  const [row] = await db
    .insert(importBatches)
    .values({
      marketId: preview.marketId,
      fileName: preview.fileName,
      csvText: preview.csvText,
      rowCount: preview.rowCount,
      status: 'previewed',
      createdBy: preview.by,
    })
    .returning({ id: importBatches.id });
  return row.id;
}

export async function findBatch(db: Database, marketId: number, batchId: number): Promise<ImportBatchRow | undefined> {
  const [row] = await db
    .select()
    .from(importBatches)
    .where(and(eq(importBatches.id, batchId), eq(importBatches.marketId, marketId)));
  return row;
}
