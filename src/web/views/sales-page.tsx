/** A market's page: its sales, with the filter form above the table. */
import type { Market } from '../../store/markets-repo.js';
import type { SalesPage as SalesPageData, StoredSale } from '../../store/sales-repo.js';
import { Field } from './field.js';
import { Layout } from './layout.js';
import { MarketHeader } from './market-nav.js';
import { SalesRegion } from './sales-table.js';
import type { SalesQueryState } from './sales-query.js';
import { CsrfField } from './csrf-field.js';

export type SalesNotice = { kind: 'imported'; count: number } | { kind: 'deleted'; sale: StoredSale | undefined; changeId: number } | { kind: 'saved'; ref: string };

function Notice(props: { market: Market; notice?: SalesNotice }) {
  const n = props.notice;
  if (!n) return null;
  if (n.kind === 'imported') return <p class="notice" role="status">Imported {n.count} {n.count === 1 ? 'sale' : 'sales'}.</p>;
  if (n.kind === 'saved') return <p class="notice" role="status">Saved sale {n.ref}.</p>;
  const url = `/markets/${props.market.id}/sales/restore/${n.changeId}`;
  return (
    <form class="notice" method="post" action={url}>
      <CsrfField />
      Deleted sale {n.sale ? `${n.sale.id} at ${n.sale.address}` : ''}.{' '}
      <button type="submit" class="link">
        Undo
      </button>
    </form>
  );
}

export function SalesFilter(props: { market: Market; state: SalesQueryState; errors: Record<string, string> }) {
  const { market, state, errors } = props;
  const url = `/markets/${market.id}`;
  return (
    <form
      id="sales-filter"
      class="filter"
      method="get"
      action={url}
      role="search"
      hx-get={url}
      hx-target="#sales-region"
      hx-swap="outerHTML"
      hx-push-url="true"
      hx-trigger="submit, change, input changed delay:400ms from:#f-q"
    >
      <Field name="q" label="Search" type="search" value={state.q} hint="Ref, address, verification or notes" />
      <Field name="from" label="Sold from" type="date" value={state.from} error={errors.from} />
      <Field name="to" label="Sold to" type="date" value={state.to} error={errors.to} />
      <div class="field">
        <label for="f-status">Status</label>
        <div class="control">
          <select id="f-status" name="status">
            <option value="all" selected={state.status === 'all'}>
              All sales
            </option>
            <option value="included" selected={state.status === 'included'}>
              Included
            </option>
            <option value="excluded" selected={state.status === 'excluded'}>
              Excluded
            </option>
          </select>
        </div>
      </div>
      <div class="actions">
        <button type="submit">Filter</button>
        <a href={url}>Clear</a>
      </div>
    </form>
  );
}

export function SalesPage(props: {
  market: Market;
  state: SalesQueryState;
  errors: Record<string, string>;
  page: SalesPageData;
  notice?: SalesNotice;
}) {
  const { market } = props;
  return (
    <Layout title={market.name}>
      <MarketHeader market={market} current="sales" />
      {market.notes ? <p class="market-notes">{market.notes}</p> : null}
      <Notice market={market} notice={props.notice} />
      <SalesFilter market={market} state={props.state} errors={props.errors} />
      <SalesRegion market={market} state={props.state} page={props.page} />
    </Layout>
  );
}
