/**
 * CSV import in two steps: upload → preview (every row checked; errors listed by row and
 * column, or the rows shown) → commit. Nothing is written before the commit.
 */
import { CHARACTERISTICS, type Sale } from '../../domain/sale.js';
import { CSV_COLUMNS, MAX_CSV_BYTES, type RowError } from '../../domain/sales-csv.js';
import type { Market } from '../../store/markets-repo.js';
import { formatMoney, formatNumber } from './format.js';
import { Layout } from './layout.js';
import { MarketHeader } from './market-nav.js';
import { CsrfField } from './csrf-field.js';

/** Rows shown in the preview; the commit writes all of them. */
export const PREVIEW_ROWS = 100;

export function ImportPage(props: { market: Market; error?: string }) {
  const { market } = props;
  return (
    <Layout title={`Import CSV · ${market.name}`}>
      <MarketHeader market={market} current="import" />
      <h2>Import sales from a CSV file</h2>
      <p>
        The first row names the columns (any order, any case). Required: <code>address</code>, <code>sale_date</code> (YYYY-MM-DD),{' '}
        <code>sale_price</code>. Optional: <code>id</code>, {CHARACTERISTICS.map((c) => <><code>{c}</code>, </>)}
        <code>verification</code>, <code>notes</code>, <code>included</code>, <code>excluded_reason</code>. Areas are in this market's unit.
        Every row is checked first; if any row has a problem, nothing is imported. Files up to {MAX_CSV_BYTES / 1024 / 1024} MB.
      </p>
      <form id="import-form" class="form" method="post" action={`/markets/${market.id}/import`} enctype="multipart/form-data">
        <CsrfField />
        <div class={`field${props.error ? ' has-error' : ''}`}>
          <label for="f-file">CSV file</label>
          <div class="control">
            <input id="f-file" type="file" name="file" accept=".csv,text/csv" required aria-describedby={props.error ? 'f-file-error' : undefined} />
          </div>
          {props.error ? (
            <p class="error" id="f-file-error" role="alert">
              {props.error}
            </p>
          ) : null}
        </div>
        <div class="actions">
          <button type="submit">Check file</button>
          <a href={`/markets/${market.id}`}>Cancel</a>
        </div>
      </form>
      <p class="hint">
        The columns of an export, in order: <code>{CSV_COLUMNS.join(',')}</code>
      </p>
    </Layout>
  );
}

function Notices(props: { notices: string[] }) {
  if (props.notices.length === 0) return null;
  return (
    <ul class="notices">
      {props.notices.map((n) => (
        <li>{n}</li>
      ))}
    </ul>
  );
}

export function ImportErrorsPage(props: { market: Market; fileName: string; errors: RowError[]; notices: string[] }) {
  const { market, errors } = props;
  return (
    <Layout title={`Import problems · ${market.name}`}>
      <MarketHeader market={market} current="import" />
      <h2>Nothing was imported</h2>
      <div class="error-summary" role="alert">
        <p>
          {props.fileName}: {errors.length === 1 ? 'one problem' : `${errors.length} problems`}. Correct the file and check it again; no sale
          has been written.
        </p>
      </div>
      <Notices notices={props.notices} />
      <table class="data import-errors">
        <thead>
          <tr>
            <th scope="col" class="num">
              Row
            </th>
            <th scope="col">Column</th>
            <th scope="col">Value</th>
            <th scope="col">Problem</th>
          </tr>
        </thead>
        <tbody>
          {errors.map((e) => (
            <tr>
              <td class="num">{e.row === 0 ? 'header' : e.row}</td>
              <td>{e.column ? <code>{e.column}</code> : ''}</td>
              <td class="value">{e.value}</td>
              <td>{e.message}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p>
        <a class="button" href={`/markets/${market.id}/import`}>
          Choose another file
        </a>
      </p>
    </Layout>
  );
}

export function ImportPreviewPage(props: { market: Market; batchId: number; fileName: string; sales: Sale[]; notices: string[] }) {
  const { market, sales } = props;
  const shown = sales.slice(0, PREVIEW_ROWS);
  return (
    <Layout title={`Import preview · ${market.name}`}>
      <MarketHeader market={market} current="import" />
      <h2>Ready to import</h2>
      <p class="notice" role="status">
        {props.fileName}: all {sales.length} {sales.length === 1 ? 'row is' : 'rows are'} valid. Nothing is written until you import them.
      </p>
      <Notices notices={props.notices} />
      <form method="post" action={`/markets/${market.id}/import/${props.batchId}/commit`} class="actions">
        <CsrfField />
        <button type="submit">
          Import {sales.length} {sales.length === 1 ? 'sale' : 'sales'}
        </button>
        <a href={`/markets/${market.id}/import`}>Cancel</a>
      </form>
      {sales.length > shown.length ? <p>The first {shown.length} rows:</p> : null}
      <div class="table-scroll">
        <table class="data">
          <thead>
            <tr>
              <th scope="col" class="num">
                Row
              </th>
              <th scope="col">Ref</th>
              <th scope="col">Address</th>
              <th scope="col">Sale date</th>
              <th scope="col" class="num">
                Sale price
              </th>
              {CHARACTERISTICS.map((c) => (
                <th scope="col" class="num">
                  <code>{c}</code>
                </th>
              ))}
              <th scope="col">Status</th>
            </tr>
          </thead>
          <tbody>
            {shown.map((s, i) => (
              <tr>
                <td class="num">{i + 1}</td>
                <td>{s.id || '(new)'}</td>
                <td>{s.address}</td>
                <td class="nowrap">{s.saleDate}</td>
                <td class="num">{formatMoney(s.salePrice, market.currency)}</td>
                {CHARACTERISTICS.map((c) => (
                  <td class="num">{formatNumber(s.characteristics[c], 1)}</td>
                ))}
                <td>{s.included ? 'Included' : `Excluded: ${s.excludedReason}`}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </Layout>
  );
}
