/**
 * The estimate page of a market: one GET form (model and subject, so every result has a
 * URL that reproduces it), the fit summary, and — once a subject is entered — warnings
 * first, the value with both intervals, pictures, the adjustment grid and diagnostics.
 * htmx swaps #estimate-work in place; without JavaScript the form loads the page.
 */
import type { EstimateCharts } from './estimate-view-model.js';
import type { EstimateResult, ModelFitSummary } from '../../domain/estimate-result.js';
import { CHARACTERISTICS, CHARACTERISTIC_RULES, type Sale } from '../../domain/sale.js';
import type { Market } from '../../store/markets-repo.js';
import { LEVELS, PREDICTOR_CHOICES, type EstimateInput } from '../routes/estimate-input.js';
import { Field } from './field.js';
import { areaLabel } from './format.js';
import { Layout } from './layout.js';
import { MarketHeader } from './market-nav.js';
import {
  AdjustmentGrid,
  EstimateCaution,
  FitSummary,
  Pictures,
  SalesDiagnostics,
  ValueBlock,
  WarningList,
  type DiagnosticsRow,
} from './estimate-results.js';
import { CsrfField } from './csrf-field.js';

export interface EstimateWorkProps {
  market: Market;
  input: EstimateInput;
  fit?: ModelFitSummary;
  result?: EstimateResult;
  charts?: EstimateCharts;
  /** A model that gives no number: what is wrong and what to do. */
  problems: string[];
  sales: Map<string, DiagnosticsRow>;
  /** The sales the estimate was computed from, by id (for the grid's values). */
  saleRecords: Map<string, Sale>;
  query: string;
}

function ModelFields(props: { input: EstimateInput }) {
  const { model } = props.input;
  return (
    <fieldset class="model-fields">
      <legend>Model</legend>
      <div class="choices" role="group" aria-label="Predictors">
        {PREDICTOR_CHOICES.map((c) => (
          <label class="check">
            <input type="checkbox" name="predictors" value={c.name} checked={model.predictors.includes(c.name)} /> {c.label}
          </label>
        ))}
      </div>
      <div class="inline-fields">
        <fieldset class="radio-group">
          <legend>Response</legend>
          <label class="check">
            <input type="radio" name="transform" value="none" checked={model.transform === 'none'} /> sale price
          </label>
          <label class="check">
            <input type="radio" name="transform" value="log" checked={model.transform === 'log'} /> ln(sale price)
          </label>
        </fieldset>
        <div class="field">
          <label for="f-level">Interval level</label>
          <div class="control">
            <select id="f-level" name="level">
              {LEVELS.map((l) => (
                <option value={String(l)} selected={model.level === l}>
                  {l * 100} %
                </option>
              ))}
            </select>
          </div>
        </div>
        <div class="field">
          <label for="f-grid">Sales in the grid</label>
          <div class="control">
            <input id="f-grid" name="grid" inputmode="numeric" value={String(props.input.gridSize)} size={3} />
          </div>
        </div>
      </div>
      {props.input.modelErrors.length > 0 ? (
        <ul class="error-summary">
          {props.input.modelErrors.map((e) => (
            <li>{e}</li>
          ))}
        </ul>
      ) : null}
    </fieldset>
  );
}

function SubjectFields(props: { input: EstimateInput; areaUnit: string }) {
  const f = props.input.subjectFields;
  const e = props.input.subjectErrors;
  const needed = new Set(props.input.model.predictors.map((p) => (p === 'age' ? 'year_built' : p === 'living_area^2' ? 'living_area' : p)));
  return (
    <fieldset class="subject-fields">
      <legend>Subject</legend>
      <Field name="address" label="Address" value={f.address} error={e.address} required maxlength={200} />
      <Field name="effective_date" label="Effective date of value" type="date" value={f.effective_date} error={e.effective_date} required />
      <div class="field-grid">
        {CHARACTERISTICS.map((c) => {
          const rule = CHARACTERISTIC_RULES[c];
          const unit = rule.unit === 'area' ? areaLabel(props.areaUnit) : rule.unit === 'year' ? '' : undefined;
          return (
            <Field
              name={c}
              label={rule.label}
              value={f[c]}
              error={e[c]}
              unit={unit}
              inputmode={rule.integer ? 'numeric' : 'decimal'}
              required={needed.has(c)}
            />
          );
        })}
      </div>
    </fieldset>
  );
}

export function EstimateWork(props: EstimateWorkProps) {
  const { market, input, fit, result, charts } = props;
  const ctx = { currency: market.currency, areaUnit: market.areaUnit };
  const action = `/markets/${market.id}/estimate`;
  return (
    <div id="estimate-work">
      <form
        method="get"
        action={action}
        class="estimate-form"
        hx-get={action}
        hx-target="#estimate-work"
        hx-select="#estimate-work"
        hx-swap="outerHTML"
        hx-push-url="true"
      >
        <ModelFields input={input} />
        <SubjectFields input={input} areaUnit={market.areaUnit} />
        <div class="actions">
          <button type="submit" name="run" value="fit" class="secondary">
            Update the fit
          </button>
          <button type="submit" name="run" value="estimate">
            Estimate the subject
          </button>
        </div>
      </form>

      {props.problems.length > 0 ? (
        <section class="problems" role="alert">
          <h2>No estimate from this model</h2>
          <ul>
            {props.problems.map((p) => (
              <li>{p}</li>
            ))}
          </ul>
        </section>
      ) : null}

      <div id="estimate-result">
        {result && charts ? (
          <>
            <section aria-label="Warnings" class="result-warnings">
              <h2>Warnings</h2>
              <WarningList warnings={result.warnings} />
            </section>
            <ValueBlock result={result} interval={charts.interval} ctx={ctx} />
            <EstimateCaution />
            <form method="post" action={`/markets/${market.id}/estimates`} class="save-form">
              <CsrfField />
              <input type="hidden" name="query" value={props.query} />
              <button type="submit">Save this estimate</button>
              <span class="hint"> Saving keeps the exact sales, model, subject and numbers; they never change afterwards.</span>
            </form>
          </>
        ) : null}
        {!result && fit ? (
          <>
            <section aria-label="Model warnings" class="result-warnings">
              <h2>Model warnings</h2>
              <WarningList warnings={fit.warnings} />
            </section>
            <p class="hint">Enter the subject and choose “Estimate the subject” for its value, intervals and the adjustment grid.</p>
          </>
        ) : null}
        {fit ? <FitSummary fit={result ?? fit} ctx={ctx} /> : null}
        {result && charts && input.subject ? (
          <>
            <Pictures charts={charts.charts} />
            <AdjustmentGrid
              result={result}
              rows={result.grid.slice(0, input.gridSize)}
              ctx={ctx}
              sales={props.saleRecords}
              subject={input.subject!}
            />
          </>
        ) : null}
        {fit ? (
          <SalesDiagnostics
            result={result ?? fit}
            sales={props.sales}
            ctx={ctx}
            leaveOut={{ action: `/markets/${market.id}/estimate/leave-out`, back: `${action}?${props.query}` }}
            {...(input.allDiagnostics ? {} : { limit: { others: 20, allHref: `${action}?${props.query}&diagnostics=all` } })}
          />
        ) : null}
      </div>
    </div>
  );
}

export function EstimatePage(props: EstimateWorkProps) {
  return (
    <Layout title={`Estimate · ${props.market.name}`}>
      <MarketHeader market={props.market} current="estimate" />
      <EstimateWork {...props} />
    </Layout>
  );
}
