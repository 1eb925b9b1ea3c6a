/**
 * One market's sales: add, view, edit, exclude with a reason, include, delete with
 * confirmation, and undo a delete. Mounted at /markets/:marketId/sales.
 */
import { Hono } from 'hono';
import { validateSale, MAX_TEXT_LENGTH } from '../../domain/validate-sale.js';
import type { Database } from '../../store/database.js';
import {
  addSale,
  deleteSale,
  excludeSale,
  getSale,
  includeSale,
  listSaleChanges,
  restoreSale,
  updateSale,
} from '../../store/sales-repo.js';
import { actorOf, type AppEnv } from '../app-env.js';
import { isHtmx, redirectAfterPost, renderPage, renderPageOrFragment } from '../middleware/htmx.js';
import { renderError } from '../middleware/error-handler.js';
import { SaleForm, SaleFormPage, saleValues } from '../views/sale-form.js';
import { DeleteSalePage, ExcludeSalePage, SalePage } from '../views/sale-page.js';
import { DeletedSaleRow, SaleRow } from '../views/sales-table.js';
import { formFields, idParam, marketOf } from './params.js';

export function salesRoutes(deps: { db: Database }) {
  const { db } = deps;
  const app = new Hono<AppEnv>();

  app.get('/', async (c) => {
    const market = await marketOf(c, db);
    const query = new URL(c.req.url).search;
    return c.redirect(`/markets/${market.id}${query}`, 301);
  });

  app.get('/new', async (c) => {
    const market = await marketOf(c, db);
    const props = { market, values: {}, errors: {} };
    return renderPageOrFragment(c, () => <SaleFormPage {...props} />, () => <SaleForm {...props} />);
  });

  app.post('/', async (c) => {
    const market = await marketOf(c, db);
    const values = await formFields(c);
    const v = validateSale(values);
    const r = v.ok ? await addSale(db, market.id, v.value, actorOf(c)) : v;
    if (r.ok) return redirectAfterPost(c, `/markets/${market.id}/sales/${r.sale.key}`);
    const props = { market, values, errors: r.errors };
    return renderPageOrFragment(c, () => <SaleFormPage {...props} />, () => <SaleForm {...props} />, 422);
  });

  app.post('/restore/:changeId', async (c) => {
    const market = await marketOf(c, db);
    const r = await restoreSale(db, market.id, idParam(c, 'changeId'), actorOf(c));
    if (!r.ok) return renderError(c, 422, Object.values(r.errors).join(' '));
    if (isHtmx(c)) return c.html(<SaleRow market={market} sale={r.sale} />);
    return c.redirect(`/markets/${market.id}/sales/${r.sale.key}`, 303);
  });

  app.get('/:saleId', async (c) => {
    const market = await marketOf(c, db);
    const sale = await getSale(db, market.id, idParam(c, 'saleId'));
    const changes = await listSaleChanges(db, market.id, sale.key);
    return renderPage(c, <SalePage market={market} sale={sale} changes={changes} />);
  });

  app.get('/:saleId/edit', async (c) => {
    const market = await marketOf(c, db);
    const sale = await getSale(db, market.id, idParam(c, 'saleId'));
    const props = { market, sale, values: saleValues(sale), errors: {} };
    return renderPageOrFragment(c, () => <SaleFormPage {...props} />, () => <SaleForm {...props} />);
  });

  app.post('/:saleId', async (c) => {
    const market = await marketOf(c, db);
    const sale = await getSale(db, market.id, idParam(c, 'saleId'));
    const values = await formFields(c);
    const v = validateSale(values);
    const r = v.ok ? await updateSale(db, market.id, sale.key, v.value, actorOf(c)) : v;
    if (r.ok) return redirectAfterPost(c, `/markets/${market.id}/sales/${sale.key}`);
    const props = { market, sale, values, errors: r.errors };
    return renderPageOrFragment(c, () => <SaleFormPage {...props} />, () => <SaleForm {...props} />, 422);
  });

  app.get('/:saleId/exclude', async (c) => {
    const market = await marketOf(c, db);
    const sale = await getSale(db, market.id, idParam(c, 'saleId'));
    return renderPage(c, <ExcludeSalePage market={market} sale={sale} reason={sale.excludedReason ?? ''} />);
  });

  app.post('/:saleId/exclude', async (c) => {
    const market = await marketOf(c, db);
    const sale = await getSale(db, market.id, idParam(c, 'saleId'));
    const reason = ((await formFields(c)).excluded_reason ?? '').trim();
    const error = !reason
      ? 'Give the reason the sale is left out, e.g. not an arm’s-length sale.'
      : reason.length > MAX_TEXT_LENGTH.excluded_reason
        ? `The reason is longer than ${MAX_TEXT_LENGTH.excluded_reason} characters.`
        : undefined;
    if (error) return renderPage(c, <ExcludeSalePage market={market} sale={sale} reason={reason} error={error} />, 422);
    await excludeSale(db, market.id, sale.key, reason, actorOf(c));
    return redirectAfterPost(c, `/markets/${market.id}`);
  });

  app.post('/:saleId/include', async (c) => {
    const market = await marketOf(c, db);
    const sale = await includeSale(db, market.id, idParam(c, 'saleId'), actorOf(c));
    if (isHtmx(c)) return c.html(<SaleRow market={market} sale={sale} />);
    return c.redirect(`/markets/${market.id}/sales/${sale.key}`, 303);
  });

  app.get('/:saleId/delete', async (c) => {
    const market = await marketOf(c, db);
    const sale = await getSale(db, market.id, idParam(c, 'saleId'));
    return renderPage(c, <DeleteSalePage market={market} sale={sale} />);
  });

  app.post('/:saleId/delete', async (c) => {
    const market = await marketOf(c, db);
    const { sale, changeId } = await deleteSale(db, market.id, idParam(c, 'saleId'), actorOf(c));
    if (isHtmx(c)) return c.html(<DeletedSaleRow market={market} sale={sale} changeId={changeId} />);
    return c.redirect(`/markets/${market.id}?deleted=${changeId}`, 303);
  });

  return app;
}
