/**
 * The parts of an estimate as markup: warnings, the value with its intervals, the fit
 * summary, the pictures, the adjustment grid and the sales diagnostics. Plain props in,
 * markup out; the live page and a saved estimate render the same components.
 */
import type { Chart, IntervalPicture } from '../../domain/estimate-charts.js';
import type { EstimateResult, EstimateWarning, GridRow, ModelFitSummary, Predictor } from '../../domain/estimate-result.js';
import { isLargeAdjustment } from '../../domain/adjustment-grid.js';
import { perUnitLabel, predictorWords, saleValue } from '../../domain/model.js';
import type { Sale, Subject } from '../../domain/sale.js';
import { CAUTION_TEXT, CAUTION_TITLE } from '../../domain/cautions.js';
import { ChartSvg, IntervalSvg } from './charts.js';
import { areaLabel, formatMoney } from './format.js';
import { CsrfField } from './csrf-field.js';

export interface MoneyContext {
  currency: string;
  areaUnit: string;
}

/** Rounded to the currency unit; −0 prints as 0. */
export const money = (x: number, currency: string) => formatMoney(Math.round(x) || 0, currency);

/** Four significant digits, grouped; large values to the unit. */
// The formats toLocaleString would build on every call (Intl.NumberFormat is specified as its behaviour).
const WHOLE = new Intl.NumberFormat('en-US');
const UP_TO_12_DECIMALS = new Intl.NumberFormat('en-US', { maximumFractionDigits: 12 });

export function formatStat(x: number | null | undefined, digits = 4): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—';
  if (Math.abs(x) >= 10 ** digits) return WHOLE.format(Math.round(x));
  if (x !== 0 && Math.abs(x) < 1e-4) return x.toExponential(digits - 1);
  return UP_TO_12_DECIMALS.format(Number(x.toPrecision(digits)));
}

export function formatP(p: number): string {
  if (!Number.isFinite(p)) return '—';
  return p < 0.0001 ? '< 0.0001' : p.toFixed(4);
}

const SEVERITY_WORD = { serious: 'Serious', caution: 'Caution', info: 'Note' } as const;

export function WarningList(props: { warnings: EstimateWarning[]; title?: string }) {
  if (props.warnings.length === 0) return <p class="no-warnings">No warnings.</p>;
  return (
    <ul class="warnings" aria-label={props.title ?? 'Warnings'}>
      {props.warnings.map((w) => (
        <li class={`warning ${w.severity}`} data-code={w.code}>
          <strong>{SEVERITY_WORD[w.severity]}</strong> <span class="code">{w.code}</span> {w.message}
        </li>
      ))}
    </ul>
  );
}

export function EstimateCaution() {
  return (
    <aside class="caution estimate-caution" role="note">
      <strong>{CAUTION_TITLE}.</strong> {CAUTION_TEXT}
    </aside>
  );
}

export function ValueBlock(props: { result: EstimateResult; interval: IntervalPicture; ctx: MoneyContext }) {
  const { result: r, ctx } = props;
  const e = r.estimate;
  const pct = `${+(r.level * 100).toFixed(2)} %`;
  const fmt = (x: number) => money(x, ctx.currency);
  return (
    <section class="value-block" aria-label="Estimate">
      <p class="value-label">Estimated value (statistical indication)</p>
      <p class="estimate-value" data-value={e.value}>
        {fmt(e.value)}
      </p>
      <dl class="intervals">
        <dt>{pct} prediction interval (one sale like the subject)</dt>
        <dd data-prediction={`${e.prediction[0]},${e.prediction[1]}`}>
          {fmt(e.prediction[0])} to {fmt(e.prediction[1])}
        </dd>
        <dt>{pct} confidence interval (mean price of such properties)</dt>
        <dd>
          {fmt(e.confidence[0])} to {fmt(e.confidence[1])}
        </dd>
        {r.transform === 'log' ? (
          <>
            <dt>Median (exp of the fitted log price)</dt>
            <dd>
              {fmt(e.median)} · smearing factor {e.smearingFactor.toFixed(4)}
            </dd>
          </>
        ) : null}
        <dt>Subject leverage</dt>
        <dd>
          {e.leverage.toFixed(4)} (largest among the sales {e.maxLeverage.toFixed(4)})
        </dd>
      </dl>
      <IntervalSvg picture={props.interval} format={fmt} />
    </section>
  );
}

function unitLabel(term: string, areaUnit: string): string {
  return term === '(intercept)' ? '' : perUnitLabel(term as Predictor, areaLabel(areaUnit));
}

function rangeStatus(value: number, lo: number, hi: number): { text: string; ok: boolean } {
  const ok = value >= lo && value <= hi;
  return { text: ok ? 'within' : 'outside', ok };
}

export function FitSummary(props: { fit: ModelFitSummary; ctx: MoneyContext }) {
  const { fit: r, ctx } = props;
  const v = r.validation;
  const level = rangeStatus(v.medianRatio, 0.9, 1.1);
  const cod = rangeStatus(v.cod, 0, 15);
  const prd = rangeStatus(v.prd, 0.98, 1.03);
  const prb = rangeStatus(v.prb, -0.05, 0.05);
  return (
    <section class="fit-summary" aria-label="Fit summary">
      <h2>Fit summary</h2>
      <p class="lead">
        {r.transform === 'log' ? 'ln(sale price)' : 'Sale price'} on {r.predictors.join(', ')} · {r.n} sales used
        {r.transform === 'log' ? ' · coefficients are changes in ln(price): 100·(e^b − 1) % per unit' : ''}
      </p>
      <div class="table-scroll">
        <table class="data coefficients">
          <caption>Coefficients in unit terms, with standardized (beta) coefficients</caption>
          <thead>
            <tr>
              <th scope="col">Term</th>
              <th scope="col" class="num">Estimate</th>
              <th scope="col">Unit</th>
              <th scope="col" class="num">Std. error</th>
              <th scope="col" class="num">t</th>
              <th scope="col" class="num">p</th>
              <th scope="col" class="num">Beta</th>
              <th scope="col" class="num">VIF</th>
            </tr>
          </thead>
          <tbody>
            {r.coefficients.map((c) => (
              <tr>
                <th scope="row">{c.term}</th>
                <td class="num">{formatStat(c.estimate, 5)}</td>
                <td>{unitLabel(c.term, ctx.areaUnit)}</td>
                <td class="num">{formatStat(c.stdError)}</td>
                <td class="num">{formatStat(c.t, 3)}</td>
                <td class="num">{formatP(c.p)}</td>
                <td class="num">{formatStat(c.standardized, 3)}</td>
                <td class={`num${c.vif !== null && c.vif > 10 ? ' bad' : c.vif !== null && c.vif > 5 ? ' warn' : ''}`}>{formatStat(c.vif, 3)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <dl class="facts fit-facts">
        <dt>R²</dt>
        <dd>{r.fit.rSquared.toFixed(4)}</dd>
        <dt>Adjusted R²</dt>
        <dd>{r.fit.adjRSquared.toFixed(4)}</dd>
        <dt>Residual standard error (sigma)</dt>
        <dd>{r.transform === 'log' ? r.fit.sigma.toFixed(4) : formatMoney(Math.round(r.fit.sigma), ctx.currency)}</dd>
        <dt>F statistic</dt>
        <dd>
          {formatStat(r.fit.fStatistic, 4)} on {r.predictors.length} and {r.fit.dfResidual} df, p {formatP(r.fit.fPValue)}
        </dd>
        <dt>Condition number</dt>
        <dd>{formatStat(r.fit.conditionNumber, 3)}</dd>
        <dt>Predicted R² (leave-one-out)</dt>
        <dd>{v.predictedRSquared.toFixed(4)}</dd>
      </dl>
      <h3>Leave-one-out ratio study</h3>
      <p class="hint">
        Each sale predicted by a fit without it, then measured as the assessment trade measures accuracy. With few sales it is indicative only.
      </p>
      <table class="data ratio-study">
        <thead>
          <tr>
            <th scope="col">Measure</th>
            <th scope="col" class="num">Value</th>
            <th scope="col">Usual range (IAAO)</th>
            <th scope="col">Here</th>
          </tr>
        </thead>
        <tbody>
          <tr>
            <th scope="row">Median ratio (level)</th>
            <td class="num">{v.medianRatio.toFixed(3)}</td>
            <td>0.90 – 1.10</td>
            <td class={level.ok ? 'ok' : 'warn'}>{level.text}</td>
          </tr>
          <tr>
            <th scope="row">COD</th>
            <td class="num">{v.cod.toFixed(1)}</td>
            <td>up to 15 for residential (5 – 10 newer, more similar homes)</td>
            <td class={cod.ok ? 'ok' : 'warn'}>{cod.text}</td>
          </tr>
          <tr>
            <th scope="row">PRD</th>
            <td class="num">{v.prd.toFixed(3)}</td>
            <td>0.98 – 1.03</td>
            <td class={prd.ok ? 'ok' : 'warn'}>{prd.text}</td>
          </tr>
          <tr>
            <th scope="row">PRB</th>
            <td class="num">{v.prb.toFixed(3)}</td>
            <td>−0.05 – 0.05</td>
            <td class={prb.ok ? 'ok' : 'warn'}>{prb.text}</td>
          </tr>
        </tbody>
      </table>
      <p class="hint">
        Ranges from the IAAO Standard on Ratio Studies (2013) as used in state rules; the COD split by home type and the PRB range are as commonly
        reported. A COD below about 5 can mean the sales are not representative.
      </p>
    </section>
  );
}

export function Pictures(props: { charts: Chart[] }) {
  return (
    <section class="pictures" aria-label="Pictures">
      <h2>Pictures</h2>
      <div class="chart-grid">
        {props.charts.map((c) => (
          <ChartSvg chart={c} />
        ))}
      </div>
    </section>
  );
}

export function AdjustmentGrid(props: {
  result: EstimateResult;
  rows: GridRow[];
  ctx: MoneyContext;
  /** The sales the estimate was computed from, by id: each cell shows the sale's value above its adjustment. */
  sales: Map<string, Sale>;
  subject: Subject;
}) {
  const { result: r, rows, ctx, subject } = props;
  const fmt = (x: number) => money(x, ctx.currency);
  const value = (p: Predictor, v: number | undefined) => (v === undefined ? '' : formatStat(p === 'months_since_sale' ? Math.round(v * 10) / 10 : v, 6));
  const adjusted = rows.map((g) => g.adjustedPrice);
  const lo = Math.min(...adjusted);
  const hi = Math.max(...adjusted);
  return (
    <section class="adjustment-grid" aria-label="Adjustment grid">
      <h2>Adjustment grid</h2>
      <p class="lead">
        The {rows.length} sales with the smallest gross adjustment of {r.grid.length}, each adjusted to the subject by the fitted coefficients
        {r.transform === 'log' ? ' (log model: adjustments multiply; each column is the change it makes alone)' : ''}. Adjusted prices range{' '}
        <strong>
          {fmt(lo)} to {fmt(hi)}
        </strong>{' '}
        beside the regression estimate <strong>{fmt(r.estimate.value)}</strong>.
      </p>
      <div class="table-scroll">
        <table class="data grid-table">
          <thead>
            <tr>
              <th scope="col">Sale</th>
              <th scope="col">Sale date</th>
              <th scope="col" class="num">Sale price</th>
              {r.predictors.map((p) => (
                <th scope="col" class="num">
                  {predictorWords(p)}
                  <span class="sub">value · adjustment</span>
                </th>
              ))}
              <th scope="col" class="num">Adjusted price</th>
              <th scope="col" class="num">Net %</th>
              <th scope="col" class="num">Gross %</th>
            </tr>
          </thead>
          <tbody>
            <tr class="subject-row">
              <th scope="row">
                Subject
                <span class="sub">{subject.address}</span>
              </th>
              <td>{subject.effectiveDate}</td>
              <td class="num"></td>
              {r.predictors.map((p) => (
                <td class="num">{value(p, r.estimate.predictorValues[p])}</td>
              ))}
              <td class="num">
                <strong>{fmt(r.estimate.value)}</strong>
              </td>
              <td class="num"></td>
              <td class="num"></td>
            </tr>
            {rows.map((g) => (
              <tr class={isLargeAdjustment(g) ? 'large' : ''}>
                <th scope="row">
                  {g.id}
                  <span class="sub">{props.sales.get(g.id)?.address ?? ''}</span>
                </th>
                <td>{props.sales.get(g.id)?.saleDate ?? ''}</td>
                <td class="num">{fmt(g.salePrice)}</td>
                {r.predictors.map((p) => {
                  const sale = props.sales.get(g.id);
                  return (
                    <td class="num">
                      {sale ? value(p, saleValue(p, sale, subject.effectiveDate)) : ''}
                      <span class="sub">{fmt(g.adjustments[p])}</span>
                    </td>
                  );
                })}
                <td class="num">
                  <strong>{fmt(g.adjustedPrice)}</strong>
                </td>
                <td class="num">{g.netPercent.toFixed(1)}</td>
                <td class="num">
                  {g.grossPercent.toFixed(1)}
                  {isLargeAdjustment(g) ? <span class="flag" title="above 15 % net or 25 % gross"> large-adjustment</span> : null}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p class="hint">Flag at 15 % net or 25 % gross: a former lender guideline, shown as a prompt to look for more similar sales, not as a rule.</p>
    </section>
  );
}

export interface DiagnosticsRow {
  id: string;
  address: string;
  salePrice: number;
  /** The sale's database key, for the leave-out form; absent on a saved estimate. */
  key?: number;
}

export function SalesDiagnostics(props: {
  result: ModelFitSummary;
  sales: Map<string, DiagnosticsRow>;
  ctx: MoneyContext;
  /** Where the leave-out form posts, and the page to come back to; absent on a saved estimate. */
  leaveOut?: { action: string; back: string };
  /** Unflagged sales shown besides the flagged ones (largest studentized residuals first), with a link to all. */
  limit?: { others: number; allHref: string };
}) {
  const { result: r, ctx } = props;
  const used = r.sales.filter((s) => s.used);
  const flagged = used.filter((s) => s.flags.length > 0);
  const others = used.filter((s) => s.flags.length === 0);
  const shownOthers = props.limit
    ? [...others].sort((a, b) => Math.abs(b.studentized ?? 0) - Math.abs(a.studentized ?? 0)).slice(0, props.limit.others)
    : others;
  const rows = [...flagged, ...shownOthers];
  const fmt = (x: number) => money(x, ctx.currency);
  return (
    <section class="diagnostics" aria-label="Sales diagnostics">
      <h2>Sales diagnostics</h2>
      <p class="lead">
        {flagged.length} of {used.length} sales flagged (leverage above 2p/n, studentized residual beyond ±3, Cook's distance above 4/n). A flag
        asks for a second look at the sale's record, not for its removal: exclude a sale only for a reason found in verifying it (it can be
        included again from its page). Flagged
        sales come first{shownOthers.length < others.length ? `, then the ${shownOthers.length} others with the largest studentized residuals` : ''}.
        {props.limit && shownOthers.length < others.length ? (
          <>
            {' '}
            <a href={props.limit.allHref}>Show all {used.length} sales</a>
          </>
        ) : null}
      </p>
      <div class="table-scroll">
        <table class="data diagnostics-table">
          <thead>
            <tr>
              <th scope="col">Sale</th>
              <th scope="col" class="num">Sale price</th>
              <th scope="col" class="num">Fitted</th>
              <th scope="col" class="num">Residual</th>
              <th scope="col" class="num">Studentized</th>
              <th scope="col" class="num">Leverage</th>
              <th scope="col" class="num">Cook's D</th>
              <th scope="col">Flags</th>
              {props.leaveOut ? <th scope="col">Exclude, with a reason</th> : null}
            </tr>
          </thead>
          <tbody>
            {rows.map((s) => {
              const sale = props.sales.get(s.id);
              return (
                <tr class={s.flags.length > 0 ? 'flagged' : ''}>
                  <th scope="row">
                    {s.id}
                    <span class="sub">{sale?.address ?? ''}</span>
                  </th>
                  <td class="num">{sale ? fmt(sale.salePrice) : ''}</td>
                  <td class="num">{s.fitted === null ? '' : fmt(s.fitted)}</td>
                  <td class="num">{s.residual === null ? '' : r.transform === 'log' ? s.residual.toFixed(4) : fmt(s.residual)}</td>
                  <td class="num">{formatStat(s.studentized, 3)}</td>
                  <td class="num">{s.leverage === null ? '—' : s.leverage.toFixed(3)}</td>
                  <td class="num">{s.cooksDistance === null ? '—' : s.cooksDistance.toFixed(3)}</td>
                  <td>{s.flags.join(', ')}</td>
                  {props.leaveOut ? (
                    <td>
                      {s.flags.length > 0 && sale?.key !== undefined ? (
                        <form method="post" action={props.leaveOut.action} class="inline leave-out">
                          <CsrfField />
                          <input type="hidden" name="sale" value={String(sale.key)} />
                          <input type="hidden" name="back" value={props.leaveOut.back} />
                          <label for={`reason-${sale.key}`} class="reason-label">
                            Why exclude {s.id} from the market's sales?
                          </label>
                          <input
                            id={`reason-${sale.key}`}
                            name="excluded_reason"
                            required
                            maxlength={500}
                            placeholder="e.g. not arm's length, verified with the buyer"
                          />
                          <button type="submit" class="secondary">
                            Exclude from market and refit
                          </button>
                        </form>
                      ) : null}
                    </td>
                  ) : null}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {r.sales.some((s) => !s.used) ? (
        <>
          <h3>Sales not used</h3>
          <ul class="left-out">
            {r.sales
              .filter((s) => !s.used)
              .map((s) => (
                <li>
                  {s.id} — {s.excludedReason}
                </li>
              ))}
          </ul>
        </>
      ) : null}
    </section>
  );
}
