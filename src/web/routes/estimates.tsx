/**
 * Estimates: the estimate page of a market (GET, so each result has a URL), leaving a
 * flagged sale out and refitting, saving an immutable snapshot, the list of saved
 * estimates, a saved estimate as saved, and the JSON API over the same service.
 */
import { Hono, type Context } from 'hono';
import { HTTPException } from 'hono/http-exception';
import { estimateCharts } from '../../domain/estimate-charts.js';
import { validateModel } from '../../domain/model.js';
import { parseSubject } from '../../domain/subject-json.js';
import { MAX_TEXT_LENGTH, parseIsoDate } from '../../domain/validate-sale.js';
import type { Database } from '../../store/database.js';
import { findEstimate, listEstimates } from '../../store/estimates-repo.js';
import { getMarket } from '../../store/markets-repo.js';
import { excludeSale, findSale } from '../../store/sales-repo.js';
import { actorOf, type AppEnv } from '../app-env.js';
import { redirectAfterPost, renderPage } from '../middleware/htmx.js';
import { EstimatePage, type EstimateWorkProps } from '../views/estimate-page.js';
import type { DiagnosticsRow } from '../views/estimate-results.js';
import { areaLabel } from '../views/format.js';
import { EstimatesListPage, SavedEstimatePage } from '../views/saved-estimate-page.js';
import { worksheetDownload } from '../../worksheet/worksheet-download.js';
import { estimateQuery, readEstimateInput, DEFAULT_GRID_SIZE } from './estimate-input.js';
import { estimateJsonBytes } from './estimate-json.js';
import { runMarketModel, saveMarketEstimate } from './estimate-service.js';
import { formFields, idParam, marketOf } from './params.js';

const today = () => new Date().toISOString().slice(0, 10);

/** Mounted at /markets/:marketId. */
export function marketEstimateRoutes(deps: { db: Database }) {
  const { db } = deps;
  const app = new Hono<AppEnv>();

  app.get('/estimate', async (c) => {
    const market = await marketOf(c, db);
    const input = readEstimateInput(new URL(c.req.url).searchParams, today());
    const subjectOk = input.subject !== undefined;
    // The fit needs a real date (months_since_sale counts to it); a bad one is a field error, the fit is as of today.
    const given = input.subjectFields.effective_date;
    const fitDate = parseIsoDate(given) ?? today();
    if (fitDate !== given) input.subjectErrors.effective_date ??= `effective_date must be a real date as YYYY-MM-DD, got "${given}"`;
    const run = await runMarketModel(db, market, input.model, fitDate, input.subject);
    const sales = new Map<string, DiagnosticsRow>(run.sales.map((s) => [s.id, { id: s.id, address: s.address, salePrice: s.salePrice, key: s.key }]));
    const props: EstimateWorkProps = {
      market,
      input,
      fit: run.fitted?.summary,
      result: run.result,
      charts: run.result && input.subject ? estimateCharts(run.result, run.sales, input.subject, areaLabel(market.areaUnit)) : undefined,
      problems: [...input.modelErrors, ...run.problems],
      sales,
      saleRecords: new Map(run.sales.map((s) => [s.id, s])),
      query: estimateQuery(input.model, input.subjectFields, input.gridSize),
    };
    const status = input.modelErrors.length > 0 || (input.wantsEstimate && !subjectOk) || input.subjectErrors.effective_date ? 422 : 200;
    return renderPage(c, <EstimatePage {...props} />, status);
  });

  // One step from a flagged sale in the diagnostics: exclude it with a reason, refit.
  app.post('/estimate/leave-out', async (c) => {
    const market = await marketOf(c, db);
    const form = await formFields(c);
    const key = Number(form.sale);
    const reason = (form.excluded_reason ?? '').trim();
    if (!Number.isSafeInteger(key) || key < 1) throw new HTTPException(400, { message: 'Which sale to leave out is missing.' });
    if (!reason) throw new HTTPException(422, { message: 'A sale left out needs a reason (excluded_reason).' });
    if (reason.length > MAX_TEXT_LENGTH.excluded_reason)
      throw new HTTPException(422, { message: `The reason is longer than ${MAX_TEXT_LENGTH.excluded_reason} characters.` });
    const sale = await findSale(db, market.id, key);
    if (!sale) throw new HTTPException(404, { message: `There is no sale ${key} in ${market.name}.` });
    await excludeSale(db, market.id, sale.key, reason, actorOf(c));
    const back = form.back ?? '';
    // Only come back to this market's own estimate page (no open redirect).
    const target = back.startsWith(`/markets/${market.id}/estimate?`) ? back : `/markets/${market.id}/estimate`;
    return redirectAfterPost(c, target);
  });

  app.post('/estimates', async (c) => {
    const market = await marketOf(c, db);
    const form = await formFields(c);
    const input = readEstimateInput(new URLSearchParams(form.query ?? ''), today());
    if (!input.subject) throw new HTTPException(422, { message: `The subject is incomplete: ${Object.values(input.subjectErrors).join('; ') || 'enter it first'}.` });
    const run = await runMarketModel(db, market, input.model, input.subject.effectiveDate, input.subject);
    if (!run.result) throw new HTTPException(422, { message: run.problems.join(' ') });
    const id = await saveMarketEstimate(db, market, run.sales, input.subject, input.model, run.result, actorOf(c));
    return redirectAfterPost(c, `/estimates/${id}`);
  });

  app.get('/estimates', async (c) => {
    const market = await marketOf(c, db);
    return renderPage(c, <EstimatesListPage market={market} items={await listEstimates(db, market.id)} />);
  });

  return app;
}

/** Mounted at /estimates. */
export function savedEstimateRoutes(deps: { db: Database }) {
  const { db } = deps;
  const app = new Hono<AppEnv>();
  // The worksheet of a saved estimate, from the snapshot alone: same bytes on every download.
  for (const format of ['pdf', 'csv'] as const)
    app.get(`/:estimateId/worksheet.${format}`, async (c) => {
      const id = idParam(c, 'estimateId');
      const saved = await findEstimate(db, id);
      if (!saved) throw new HTTPException(404, { message: `There is no saved estimate ${id}.` });
      const download = await worksheetDownload(saved, format);
      return c.body(new Uint8Array(download.body), 200, {
        'Content-Type': download.contentType,
        'Content-Disposition': `attachment; filename="${download.fileName}"`,
        'Cache-Control': 'private, max-age=3600',
      });
    });

  app.get('/:estimateId', async (c) => {
    const id = idParam(c, 'estimateId');
    const saved = await findEstimate(db, id);
    if (!saved) throw new HTTPException(404, { message: `There is no saved estimate ${id}.` });
    const charts = estimateCharts(saved.result, saved.sales, saved.subject, areaLabel(saved.market.areaUnit));
    return renderPage(c, <SavedEstimatePage saved={saved} charts={charts} gridSize={DEFAULT_GRID_SIZE} />);
  });
  return app;
}

interface ApiBody {
  subject?: unknown;
  predictors?: unknown;
  transform?: unknown;
  level?: unknown;
}

async function readApiBody(c: { req: { json: () => Promise<unknown> } }) {
  let body: ApiBody;
  try {
    body = (await c.req.json()) as ApiBody;
  } catch {
    throw new HTTPException(400, { message: 'The body must be JSON: { subject, predictors?, transform?, level? }.' });
  }
  if (typeof body !== 'object' || body === null) throw new HTTPException(400, { message: 'The body must be a JSON object.' });
  const errors: string[] = [];
  if (body.predictors !== undefined && !(Array.isArray(body.predictors) && body.predictors.every((p) => typeof p === 'string')))
    errors.push('predictors: must be a list of predictor names');
  if (body.transform !== undefined && typeof body.transform !== 'string') errors.push('transform: must be "none" or "log"');
  if (body.level !== undefined && typeof body.level !== 'number') errors.push('level: must be a number such as 0.95');
  // Only values of the right type go on to the model check; the others already have their message.
  const model = validateModel({
    predictors: Array.isArray(body.predictors) && body.predictors.every((p) => typeof p === 'string') ? (body.predictors as string[]) : undefined,
    transform: typeof body.transform === 'string' ? body.transform : undefined,
    level: typeof body.level === 'number' ? body.level : undefined,
  });
  if (!model.ok) errors.push(...model.errors);
  const subject = parseSubject(body.subject);
  if (!subject.ok) errors.push(...Object.entries(subject.errors).map(([f, m]) => `subject.${f}: ${m}`));
  return { errors, model: model.ok ? model.value : undefined, subject: subject.ok ? subject.value : undefined };
}

/** Mounted at /api: POST /markets/:marketId/estimate, POST /markets/:marketId/estimates, GET /estimates/:estimateId. */
export function estimateApiRoutes(deps: { db: Database }) {
  const { db } = deps;
  const app = new Hono<AppEnv>();

  const compute = async (c: Context<AppEnv>) => {
    const market = await getMarket(db, idParam(c, 'marketId'));
    const { errors, model, subject } = await readApiBody(c);
    if (errors.length > 0 || !model || !subject) return { error: c.json({ errors }, 422) };
    const run = await runMarketModel(db, market, model, subject.effectiveDate, subject);
    if (!run.result) return { error: c.json({ errors: run.problems }, 422) };
    return { market, run, model, subject, result: run.result };
  };

  app.post('/markets/:marketId/estimate', async (c) => {
    const r = await compute(c);
    if ('error' in r) return r.error;
    // The bytes of c.json(r.result), built with less work per request (estimate-json.ts).
    return c.body(estimateJsonBytes(r.result), 200, { 'Content-Type': 'application/json' });
  });
  app.post('/markets/:marketId/estimates', async (c) => {
    const r = await compute(c);
    if ('error' in r) return r.error;
    const id = await saveMarketEstimate(db, r.market, r.run.sales, r.subject, r.model, r.result, actorOf(c));
    return c.json({ id }, 201);
  });
  app.get('/estimates/:estimateId', async (c) => {
    const id = idParam(c, 'estimateId');
    const saved = await findEstimate(db, id);
    if (!saved) return c.json({ errors: [`there is no saved estimate ${id}`] }, 404);
    return c.json(saved);
  });
  return app;
}
