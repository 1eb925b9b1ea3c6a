/** One sale: its fields, the actions on it and its change history. */
import { CHARACTERISTICS, CHARACTERISTIC_RULES, type Sale } from '../../domain/sale.js';
import type { Market } from '../../store/markets-repo.js';
import type { SaleChange, StoredSale } from '../../store/sales-repo.js';
import { formatArea, formatMoney, formatNumber, formatTime } from './format.js';
import { Layout } from './layout.js';
import { MarketHeader } from './market-nav.js';
import { saleValues } from './sale-form.js';
import { saleUrl } from './sales-table.js';
import { CsrfField } from './csrf-field.js';

function characteristicText(market: Market, sale: Sale, c: (typeof CHARACTERISTICS)[number]): string {
  const v = sale.characteristics[c];
  if (v === undefined) return '—';
  if (CHARACTERISTIC_RULES[c].unit === 'area') return formatArea(v, market.areaUnit);
  return c === 'year_built' ? String(v) : formatNumber(v, 1);
}

const ACTION_WORDS: Record<SaleChange['action'], string> = {
  create: 'Added',
  import: 'Imported',
  update: 'Edited',
  exclude: 'Excluded',
  include: 'Included',
  delete: 'Deleted',
  restore: 'Restored',
};

/** Field-by-field differences between two versions of a sale, as "field: before → after". */
export function changedFields(before: Sale | undefined, after: Sale | undefined): { field: string; before: string; after: string }[] {
  if (!before || !after) return [];
  const b = saleValues(before);
  const a = saleValues(after);
  return Object.keys({ ...b, ...a })
    .filter((k) => (b[k] ?? '') !== (a[k] ?? ''))
    .map((k) => ({ field: k, before: b[k] ?? '', after: a[k] ?? '' }));
}

function History(props: { changes: SaleChange[] }) {
  return (
    <table class="data history">
      <thead>
        <tr>
          <th scope="col">When</th>
          <th scope="col">Who</th>
          <th scope="col">What</th>
          <th scope="col">Changes</th>
        </tr>
      </thead>
      <tbody>
        {props.changes.map((ch) => {
          const diffs = changedFields(ch.before, ch.after);
          return (
            <tr>
              <td class="nowrap">{formatTime(ch.at)}</td>
              <td>{ch.by}</td>
              <td>{ACTION_WORDS[ch.action]}</td>
              <td>
                {diffs.length > 0 ? (
                  <ul class="diff">
                    {diffs.map((d) => (
                      <li>
                        <code>{d.field}</code>: {d.before || '(empty)'} → {d.after || '(empty)'}
                      </li>
                    ))}
                  </ul>
                ) : (
                  ''
                )}
              </td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

export function SalePage(props: { market: Market; sale: StoredSale; changes: SaleChange[] }) {
  const { market, sale } = props;
  return (
    <Layout title={`Sale ${sale.id} · ${market.name}`}>
      <MarketHeader market={market} current="sales" />
      <h2>
        Sale {sale.id}: {sale.address}
      </h2>
      <dl class="facts">
        <dt>Sale date</dt>
        <dd>{sale.saleDate}</dd>
        <dt>Sale price</dt>
        <dd>{formatMoney(sale.salePrice, market.currency)}</dd>
        {CHARACTERISTICS.map((c) => (
          <>
            <dt>{CHARACTERISTIC_RULES[c].label}</dt>
            <dd>{characteristicText(market, sale, c)}</dd>
          </>
        ))}
        <dt>Verification</dt>
        <dd>{sale.verification ?? '—'}</dd>
        <dt>Notes</dt>
        <dd>{sale.notes ?? '—'}</dd>
        <dt>Status</dt>
        <dd>{sale.included ? 'Included in estimates' : `Excluded: ${sale.excludedReason}`}</dd>
      </dl>
      <div class="actions">
        <a class="button" href={saleUrl(market, sale, '/edit')}>
          Edit
        </a>
        {sale.included ? (
          <a class="button secondary" href={saleUrl(market, sale, '/exclude')}>
            Exclude
          </a>
        ) : (
          <form method="post" action={saleUrl(market, sale, '/include')} class="inline">
            <CsrfField />
            <button type="submit" class="secondary">
              Include
            </button>
          </form>
        )}
        <a class="button danger" href={saleUrl(market, sale, '/delete')}>
          Delete
        </a>
      </div>
      <h3>History</h3>
      <History changes={props.changes} />
    </Layout>
  );
}

export function ExcludeSalePage(props: { market: Market; sale: StoredSale; reason: string; error?: string }) {
  const { market, sale } = props;
  const url = saleUrl(market, sale, '/exclude');
  return (
    <Layout title={`Exclude sale ${sale.id} · ${market.name}`}>
      <MarketHeader market={market} current="sales" />
      <h2>Exclude sale {sale.id}</h2>
      <p>
        {sale.address}, sold {sale.saleDate} for {formatMoney(sale.salePrice, market.currency)}. An excluded sale stays in the market but is left
        out of estimates; the reason is shown wherever the sale is listed.
      </p>
      <form id="exclude-form" class="form" method="post" action={url} hx-post={url} hx-target="this" hx-swap="outerHTML" hx-select="#exclude-form">
        <CsrfField />
        <div class={`field${props.error ? ' has-error' : ''}`}>
          <label for="f-excluded_reason">Reason</label>
          <div class="control">
            <input id="f-excluded_reason" name="excluded_reason" value={props.reason} maxlength={500} autofocus aria-describedby={props.error ? 'f-excluded_reason-error' : undefined} />
          </div>
          {props.error ? (
            <p class="error" id="f-excluded_reason-error">
              {props.error}
            </p>
          ) : null}
        </div>
        <div class="actions">
          <button type="submit">Exclude sale</button>
          <a href={`/markets/${market.id}`}>Cancel</a>
        </div>
      </form>
    </Layout>
  );
}

export function DeleteSalePage(props: { market: Market; sale: StoredSale }) {
  const { market, sale } = props;
  return (
    <Layout title={`Delete sale ${sale.id} · ${market.name}`}>
      <MarketHeader market={market} current="sales" />
      <h2>Delete sale {sale.id}?</h2>
      <p>
        {sale.address}, sold {sale.saleDate} for {formatMoney(sale.salePrice, market.currency)}. You can undo the delete from the sales page
        right after; the history keeps the sale as it was.
      </p>
      <form method="post" action={saleUrl(market, sale, '/delete')} class="actions">
        <CsrfField />
        <button type="submit" class="danger">
          Delete sale
        </button>
        <a href={`/markets/${market.id}`}>Keep it</a>
      </form>
    </Layout>
  );
}
