/**
 * CSV import of a market's sales: upload and check every row (nothing written), then
 * commit the checked file in one transaction. Mounted at /markets/:marketId/import.
 * The file text waits in the database between the two steps.
 */
import { Hono } from 'hono';
import { bodyLimit } from 'hono/body-limit';
import type { Sale } from '../../domain/sale.js';
import { MAX_CSV_BYTES, readSalesCsv } from '../../domain/sales-csv.js';
import type { Database } from '../../store/database.js';
import { findBatch, savePreview } from '../../store/import-batches-repo.js';
import type { Market } from '../../store/markets-repo.js';
import { findTakenRefs, importSales } from '../../store/sales-import.js';
import { actorOf, type AppEnv } from '../app-env.js';
import { renderPage } from '../middleware/htmx.js';
import { renderError } from '../middleware/error-handler.js';
import { ImportErrorsPage, ImportPage, ImportPreviewPage } from '../views/import-pages.js';
import { idParam, marketOf } from './params.js';

const MB = 1024 * 1024;
/** Room for the multipart envelope around a file of the largest accepted size. */
const UPLOAD_LIMIT_BYTES = MAX_CSV_BYTES + 64 * 1024;
const tooLarge = `The file is larger than ${MAX_CSV_BYTES / MB} MB; nothing was imported. Split it into smaller files.`;

function safeFileName(name: string): string {
  return name.replace(/[\u0000-\u001f]/g, '').slice(0, 200) || 'upload.csv';
}

/**
 * Checked sales of recent previews, so a commit need not read the file again. Only an
 * optimisation: a commit on another instance, or after a restart, re-reads the stored text.
 */
class PreviewCache {
  private readonly entries = new Map<number, Sale[]>();
  constructor(private readonly maxRows: number) {}
  put(batchId: number, sales: Sale[]): void {
    this.entries.set(batchId, sales);
    let rows = [...this.entries.values()].reduce((n, s) => n + s.length, 0);
    for (const [id, s] of this.entries) {
      if (rows <= this.maxRows) break;
      this.entries.delete(id);
      rows -= s.length;
    }
  }
  take(batchId: number): Sale[] | undefined {
    const sales = this.entries.get(batchId);
    this.entries.delete(batchId);
    return sales;
  }
}

export function importRoutes(deps: { db: Database }) {
  const { db } = deps;
  const app = new Hono<AppEnv>();
  const previews = new PreviewCache(200_000);

  const errorsPage = (market: Market, fileName: string, result: Parameters<typeof ImportErrorsPage>[0]['errors'], notices: string[]) => (
    <ImportErrorsPage market={market} fileName={fileName} errors={result} notices={notices} />
  );

  app.get('/', async (c) => {
    const market = await marketOf(c, db);
    return renderPage(c, <ImportPage market={market} />);
  });

  app.post(
    '/',
    bodyLimit({
      maxSize: UPLOAD_LIMIT_BYTES,
      onError: async (c) => renderPage(c, <ImportPage market={await marketOf(c, db)} error={tooLarge} />, 413),
    }),
    async (c) => {
      const market = await marketOf(c, db);
      const body = await c.req.parseBody();
      const file = body.file;
      if (!(file instanceof File) || file.size === 0)
        return renderPage(c, <ImportPage market={market} error="Choose a CSV file to import (the one chosen is empty)." />, 422);
      if (file.size > MAX_CSV_BYTES) return renderPage(c, <ImportPage market={market} error={tooLarge} />, 413);
      const fileName = safeFileName(file.name);
      const text = await file.text();
      const parsed = readSalesCsv(text);
      if (!parsed.ok) return renderPage(c, errorsPage(market, fileName, parsed.errors, parsed.notices), 422);
      const taken = await findTakenRefs(db, market.id, parsed.sales);
      if (taken.length > 0) return renderPage(c, errorsPage(market, fileName, taken, parsed.notices), 422);
      const batchId = await savePreview(db, { marketId: market.id, fileName, csvText: text, rowCount: parsed.sales.length, by: actorOf(c) });
      previews.put(batchId, parsed.sales);
      return renderPage(c, <ImportPreviewPage market={market} batchId={batchId} fileName={fileName} sales={parsed.sales} notices={parsed.notices} />);
    },
  );

  app.post('/:batchId/commit', async (c) => {
    const market = await marketOf(c, db);
    const batch = await findBatch(db, market.id, idParam(c, 'batchId'));
    if (!batch) return renderError(c, 404, 'This import preview does not exist (previews are kept for a day). Check the file again.');
    if (batch.status === 'committed') return c.redirect(`/markets/${market.id}`, 303);
    let sales = previews.take(batch.id);
    if (!sales) {
      const parsed = readSalesCsv(batch.csvText ?? '');
      if (!parsed.ok) return renderPage(c, errorsPage(market, batch.fileName, parsed.errors, parsed.notices), 422);
      sales = parsed.sales;
    }
    // References are checked again inside the transaction: sales added since the preview may clash.
    const r = await importSales(db, market.id, sales, { by: actorOf(c), fileName: batch.fileName, batchId: batch.id });
    if (!r.ok) return renderPage(c, errorsPage(market, batch.fileName, r.errors, []), 422);
    return c.redirect(`/markets/${market.id}?imported=${r.count}`, 303);
  });

  return app;
}
