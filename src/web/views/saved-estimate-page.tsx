/**
 * A saved estimate, shown exactly as saved (numbers, sales and market from the snapshot,
 * never recomputed), and a market's list of saved estimates.
 */
import type { EstimateListItem } from '../../store/estimates-repo.js';
import type { Market } from '../../store/markets-repo.js';
import type { SavedEstimate } from '../../domain/saved-estimate.js';
import type { EstimateCharts } from './estimate-view-model.js';
import { Layout } from './layout.js';
import { MarketHeader } from './market-nav.js';
import { formatTime } from './format.js';
import { AdjustmentGrid, EstimateCaution, FitSummary, Pictures, SalesDiagnostics, ValueBlock, WarningList, money, type DiagnosticsRow } from './estimate-results.js';
import { CHARACTERISTICS, CHARACTERISTIC_RULES } from '../../domain/sale.js';

export function SavedEstimatePage(props: { saved: SavedEstimate; charts: EstimateCharts; gridSize: number }) {
  const { saved, charts } = props;
  const r = saved.result;
  const ctx = { currency: saved.market.currency, areaUnit: saved.market.areaUnit };
  const rows = new Map<string, DiagnosticsRow>(saved.sales.map((s) => [s.id, { id: s.id, address: s.address, salePrice: s.salePrice }]));
  return (
    <Layout title={`Saved estimate ${saved.id} · ${saved.subject.address}`}>
      <p class="breadcrumb">
        <a href="/markets">Markets</a> / <a href={`/markets/${saved.market.id}`}>{saved.market.name}</a> /{' '}
        <a href={`/markets/${saved.market.id}/estimates`}>Saved estimates</a> /
      </p>
      <h1>
        Saved estimate {saved.id}: {saved.subject.address}
      </h1>
      <dl class="facts saved-facts">
        <dt>Effective date</dt>
        <dd>{saved.subject.effectiveDate}</dd>
        <dt>Saved</dt>
        <dd>
          {formatTime(saved.createdAt)} by {saved.createdBy}
        </dd>
        <dt>App version</dt>
        <dd>{saved.appVersion}</dd>
        <dt>Market (as saved)</dt>
        <dd>
          {saved.market.name} · {saved.market.currency}
        </dd>
      </dl>
      <p class="notice">These are the numbers as saved, from the sales as they were then. Later changes to the sales do not alter them.</p>
      <p class="actions">
        <a class="button" href={`/estimates/${saved.id}/worksheet.pdf`}>
          Download the worksheet (PDF)
        </a>{' '}
        <a class="button secondary" href={`/estimates/${saved.id}/worksheet.csv`}>
          Worksheet as CSV
        </a>
      </p>
      <section aria-label="Subject">
        <h2>Subject</h2>
        <dl class="facts">
          {CHARACTERISTICS.filter((c) => saved.subject.characteristics[c] !== undefined).map((c) => (
            <>
              <dt>{CHARACTERISTIC_RULES[c].label}</dt>
              <dd>{String(saved.subject.characteristics[c])}</dd>
            </>
          ))}
        </dl>
      </section>
      <section aria-label="Warnings" class="result-warnings">
        <h2>Warnings</h2>
        <WarningList warnings={r.warnings} />
      </section>
      <ValueBlock result={r} interval={charts.interval} ctx={ctx} />
      <EstimateCaution />
      <FitSummary fit={r} ctx={ctx} />
      <Pictures charts={charts.charts} />
      <AdjustmentGrid result={r} rows={r.grid.slice(0, props.gridSize)} ctx={ctx} sales={new Map(saved.sales.map((s) => [s.id, s]))} subject={saved.subject} />
      <SalesDiagnostics result={r} sales={rows} ctx={ctx} />
    </Layout>
  );
}

export function EstimatesListPage(props: { market: Market; items: EstimateListItem[] }) {
  const { market, items } = props;
  return (
    <Layout title={`Saved estimates · ${market.name}`}>
      <MarketHeader market={market} current="estimates" />
      <h2>Saved estimates</h2>
      {items.length === 0 ? (
        <p>
          No saved estimates yet. <a href={`/markets/${market.id}/estimate`}>Make an estimate</a> and save it.
        </p>
      ) : (
        <table class="data">
          <thead>
            <tr>
              <th scope="col">No.</th>
              <th scope="col">Subject</th>
              <th scope="col">Effective date</th>
              <th scope="col" class="num">Value</th>
              <th scope="col">Prediction interval</th>
              <th scope="col" class="num">Warnings</th>
              <th scope="col">Saved</th>
            </tr>
          </thead>
          <tbody>
            {items.map((e) => (
              <tr>
                <td>
                  <a href={`/estimates/${e.id}`}>{e.id}</a>
                </td>
                <td>
                  <a href={`/estimates/${e.id}`}>{e.subjectAddress}</a>
                </td>
                <td>{e.effectiveDate}</td>
                <td class="num">{money(e.value, market.currency)}</td>
                <td>
                  {money(e.prediction[0], market.currency)} to {money(e.prediction[1], market.currency)}
                </td>
                <td class="num">{e.warningCount}</td>
                <td>
                  {formatTime(e.createdAt)} · {e.createdBy}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </Layout>
  );
}
