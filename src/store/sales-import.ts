/**
 * Writes a validated set of sales into a market, all in one transaction or not at all.
 * Row numbers in errors count data rows from 1, as readSalesCsv does, so a message points
 * at the same line of the file whichever check found it.
 *
 * The bulk insert goes straight to the libSQL transaction with multi-row INSERTs: drizzle's
 * query builder spends about 1 ms per row building large statements, which alone would
 * take 100,000 rows past the 5 s budget. Column names still come from the schema.
 *
 * Statements run synchronously, so between chunks the import yields to the event loop:
 * a large import would otherwise stop every other request of its process for seconds
 * (and let idle keep-alive timers drop connections that had a request waiting). Writers
 * of the same process then wait for the lock without blocking (busy-retry.ts).
 */
import type { InArgs, Transaction } from '@libsql/client';
import type { Sale } from '../domain/sale.js';
import type { RowError } from '../domain/sales-csv.js';
import type { Database } from './database.js';
import { saleToColumns, toDomainSale } from './sale-columns.js';
import { refGenerator } from './sale-refs.js';
import { saleChanges, sales } from './schema.js';

/** Rows per INSERT: large enough to amortise statement cost, well under SQLite's parameter limit. */
const CHUNK_ROWS = 400;

export type ImportResult = { ok: true; count: number; batchId: number } | { ok: false; errors: RowError[] };

export interface ImportOptions {
  by: string;
  fileName: string;
  /** A previewed batch to mark as committed; without one a new batch is recorded. */
  batchId?: number;
  /** Delete the market's sales, their history and earlier imports first, in the same transaction. */
  replace?: boolean;
}

const SALE_COLUMNS = [
  sales.id,
  sales.marketId,
  sales.ref,
  sales.address,
  sales.saleDate,
  sales.salePrice,
  sales.livingArea,
  sales.yearBuilt,
  sales.rooms,
  sales.bedrooms,
  sales.bathrooms,
  sales.lotArea,
  sales.garageSpaces,
  sales.verification,
  sales.notes,
  sales.included,
  sales.excludedReason,
  sales.importBatchId,
  sales.createdAt,
  sales.updatedAt,
];
const CHANGE_COLUMNS = [saleChanges.marketId, saleChanges.saleId, saleChanges.at, saleChanges.by, saleChanges.action, saleChanges.afterJson];

function insertSql(table: string, columns: { name: string }[], rows: number): string {
  const tuple = `(${columns.map(() => '?').join(',')})`;
  return `insert into "${table}" (${columns.map((c) => `"${c.name}"`).join(',')}) values ${Array(rows).fill(tuple).join(',')}`;
}

async function refsOf(tx: Transaction, marketId: number): Promise<string[]> {
  const rs = await tx.execute({ sql: `select "${sales.ref.name}" as ref from "sales" where "${sales.marketId.name}" = ?`, args: [marketId] });
  return rs.rows.map((r) => String(r.ref));
}

/** Sales whose reference is already used in the market (the file itself was checked by readSalesCsv). */
function takenRefErrors(existing: readonly string[], incoming: readonly Sale[]): RowError[] {
  const taken = new Set(existing);
  const errors: RowError[] = [];
  incoming.forEach((s, i) => {
    if (s.id && taken.has(s.id))
      errors.push({ row: i + 1, column: 'id', value: s.id, message: `id "${s.id}" is already used by a sale in this market` });
  });
  return errors;
}

export async function findTakenRefs(db: Database, marketId: number, incoming: readonly Sale[]): Promise<RowError[]> {
  const tx = await db.$client.transaction('read');
  try {
    return takenRefErrors(await refsOf(tx, marketId), incoming);
  } finally {
    tx.close();
  }
}

export async function importSales(db: Database, marketId: number, incoming: readonly Sale[], options: ImportOptions): Promise<ImportResult> {
  const tx = await db.$client.transaction('write');
  try {
    if (options.replace) {
      for (const table of ['sale_changes', 'sales'])
        await tx.execute({ sql: `delete from "${table}" where "market_id" = ?`, args: [marketId] });
      await tx.execute({ sql: `delete from "import_batches" where "market_id" = ? and "id" is not ?`, args: [marketId, options.batchId ?? null] });
    }
    const existing = await refsOf(tx, marketId);
    const taken = takenRefErrors(existing, incoming);
    if (taken.length > 0) return { ok: false, errors: taken };

    const at = new Date().toISOString();
    let batchId = options.batchId;
    if (batchId === undefined) {
      const rs = await tx.execute({
        sql: 'insert into "import_batches" ("market_id","file_name","status","row_count","created_at","created_by","committed_at") values (?,?,?,?,?,?,?) returning "id"',
        args: [marketId, options.fileName, 'committed', incoming.length, at, options.by, at],
      });
      batchId = Number(rs.rows[0].id);
    } else {
      await tx.execute({
        sql: `update "import_batches" set "status" = 'committed', "committed_at" = ?, "csv_text" = null, "row_count" = ? where "id" = ? and "market_id" = ?`,
        args: [at, incoming.length, batchId, marketId],
      });
    }

    const nextRef = refGenerator([...existing, ...incoming.map((s) => s.id).filter(Boolean)]);
    // Keys are assigned here, not by the database, so history rows can be written in bulk too.
    const top = await tx.execute('select max("id") as top from "sales"');
    let key = Number(top.rows[0].top ?? 0) + 1;
    for (let start = 0; start < incoming.length; start += CHUNK_ROWS) {
      const chunk = incoming.slice(start, start + CHUNK_ROWS);
      const saleArgs: InArgs = [];
      const changeArgs: InArgs = [];
      for (const s of chunk) {
        const sale = s.id ? s : { ...s, id: nextRef() };
        const c = saleToColumns(sale);
        saleArgs.push(
          key, marketId, c.ref, c.address, c.saleDate, c.salePrice, c.livingArea ?? null, c.yearBuilt ?? null, c.rooms ?? null,
          c.bedrooms ?? null, c.bathrooms ?? null, c.lotArea ?? null, c.garageSpaces ?? null, c.verification ?? null,
          c.notes ?? null, c.included === false ? 0 : 1, c.excludedReason ?? null, batchId, at, at,
        );
        changeArgs.push(marketId, key, at, options.by, 'import', JSON.stringify(toDomainSale(sale)));
        key++;
      }
      await tx.execute({ sql: insertSql('sales', SALE_COLUMNS, chunk.length), args: saleArgs });
      await tx.execute({ sql: insertSql('sale_changes', CHANGE_COLUMNS, chunk.length), args: changeArgs });
      await new Promise<void>((resolve) => setImmediate(resolve));
    }
    await tx.commit();
    return { ok: true, count: incoming.length, batchId };
  } finally {
    tx.close();
  }
}
