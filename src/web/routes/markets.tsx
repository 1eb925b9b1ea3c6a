/** Markets: list, create, edit, a market's sales page and its CSV export. */
import { Hono } from 'hono';
import { writeSalesCsv } from '../../domain/sales-csv.js';
import type { Database } from '../../store/database.js';
import { validateMarketFields } from '../../store/market-fields.js';
import { createMarket, listMarkets, updateMarket } from '../../store/markets-repo.js';
import { allSales, findSaleChange, listSales, type StoredSale } from '../../store/sales-repo.js';
import type { AppEnv } from '../app-env.js';
import { redirectAfterPost, renderPageOrFragment } from '../middleware/htmx.js';
import { MarketForm, MarketFormPage, marketValues } from '../views/market-form.js';
import { MarketsPage, MarketsTable } from '../views/markets-page.js';
import { SalesPage, type SalesNotice } from '../views/sales-page.js';
import { parseSalesQuery, toSalesQuery } from '../views/sales-query.js';
import { SalesRegion } from '../views/sales-table.js';
import { formFields, marketOf } from './params.js';

/** A file name made of the market name's letters and digits. */
function exportFileName(name: string): string {
  const slug = name.normalize('NFKD').replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '').toLowerCase();
  return `${slug || 'market'}-sales.csv`;
}

export function marketsRoutes(deps: { db: Database }) {
  const { db } = deps;
  const app = new Hono<AppEnv>();

  app.get('/', async (c) => {
    const markets = await listMarkets(db);
    return renderPageOrFragment(
      c,
      () => <MarketsPage markets={markets} />,
      () => <MarketsTable markets={markets} />,
    );
  });

  app.get('/new', (c) => {
    const props = { values: { area_unit: 'sqft', currency: 'USD' }, errors: {} };
    return renderPageOrFragment(
      c,
      () => <MarketFormPage {...props} />,
      () => <MarketForm {...props} />,
    );
  });

  app.post('/', async (c) => {
    const values = await formFields(c);
    const v = validateMarketFields(values);
    const created = v.ok ? await createMarket(db, v.value) : v;
    if (created.ok) return redirectAfterPost(c, `/markets/${created.market.id}`);
    const props = { values, errors: created.errors };
    return renderPageOrFragment(c, () => <MarketFormPage {...props} />, () => <MarketForm {...props} />, 422);
  });

  app.get('/:marketId', async (c) => {
    const market = await marketOf(c, db);
    const { state, errors } = parseSalesQuery(c.req.query());
    const page = await listSales(db, market.id, toSalesQuery(state));
    let notice: SalesNotice | undefined;
    const imported = Number(c.req.query('imported'));
    if (Number.isInteger(imported) && imported > 0) notice = { kind: 'imported', count: imported };
    const deleted = c.req.query('deleted');
    if (deleted && /^\d+$/.test(deleted)) {
      const change = await findSaleChange(db, market.id, Number(deleted));
      if (change?.action === 'delete' && change.before)
        notice = { kind: 'deleted', changeId: change.id, sale: { ...change.before, key: change.saleId } as StoredSale };
    }
    return renderPageOrFragment(
      c,
      () => <SalesPage market={market} state={state} errors={errors} page={page} notice={notice} />,
      () => <SalesRegion market={market} state={state} page={page} />,
    );
  });

  app.get('/:marketId/edit', async (c) => {
    const market = await marketOf(c, db);
    const props = { market, values: marketValues(market), errors: {} };
    return renderPageOrFragment(c, () => <MarketFormPage {...props} />, () => <MarketForm {...props} />);
  });

  app.post('/:marketId', async (c) => {
    const market = await marketOf(c, db);
    const values = await formFields(c);
    const v = validateMarketFields(values);
    const updated = v.ok ? await updateMarket(db, market.id, v.value) : v;
    if (updated.ok) return redirectAfterPost(c, `/markets/${market.id}`);
    const props = { market, values, errors: updated.errors };
    return renderPageOrFragment(c, () => <MarketFormPage {...props} />, () => <MarketForm {...props} />, 422);
  });

  app.get('/:marketId/sales.csv', async (c) => {
    const market = await marketOf(c, db);
    const csv = writeSalesCsv(await allSales(db, market.id));
    c.header('Content-Type', 'text/csv; charset=utf-8');
    c.header('Content-Disposition', `attachment; filename="${exportFileName(market.name)}"`);
    return c.body(csv);
  });

  return app;
}
