/**
 * The sales table of a market with its sort links and pages (`SalesRegion`, the part htmx
 * swaps), and one row (`SaleRow`), which the include and undo actions re-render alone.
 */
import type { Market } from '../../store/markets-repo.js';
import type { SalesPage, SaleSort, StoredSale } from '../../store/sales-repo.js';
import { areaLabel, formatMoney, formatNumber } from './format.js';
import { salesQueryString, type SalesQueryState } from './sales-query.js';
import { CsrfField } from './csrf-field.js';

const COLUMNS: { sort?: SaleSort; label: string; num?: boolean; unit?: boolean; minor?: boolean }[] = [
  { sort: 'id', label: 'Ref' },
  { sort: 'sale_date', label: 'Sale date' },
  { sort: 'address', label: 'Address' },
  { sort: 'sale_price', label: 'Sale price', num: true },
  { sort: 'living_area', label: 'Living area', num: true, unit: true },
  { sort: 'year_built', label: 'Built', num: true },
  { sort: 'rooms', label: 'Rooms', num: true },
  { label: 'Beds', num: true, minor: true },
  { label: 'Baths', num: true, minor: true },
  { label: 'Status' },
  { label: 'Actions' },
];

/** Attributes for a link that swaps only the sales region when htmx is there, and loads the page when not. */
function regionLink(href: string) {
  return { href, 'hx-get': href, 'hx-target': '#sales-region', 'hx-swap': 'outerHTML', 'hx-push-url': 'true' };
}

export function saleUrl(market: Market, sale: { key: number }, suffix = ''): string {
  return `/markets/${market.id}/sales/${sale.key}${suffix}`;
}

export function SaleRow(props: { market: Market; sale: StoredSale }) {
  const { market, sale } = props;
  const c = sale.characteristics;
  return (
    <tr id={`sale-${sale.key}`} class={sale.included ? undefined : 'excluded'}>
      <td class="nowrap">
        <a href={saleUrl(market, sale)}>{sale.id}</a>
      </td>
      <td class="nowrap">{sale.saleDate}</td>
      <td class="address">{sale.address}</td>
      <td class="num">{formatMoney(sale.salePrice, market.currency)}</td>
      <td class="num">{formatNumber(c.living_area, 1)}</td>
      <td class="num">{c.year_built ?? ''}</td>
      <td class="num">{c.rooms ?? ''}</td>
      <td class="num minor">{c.bedrooms ?? ''}</td>
      <td class="num minor">{formatNumber(c.bathrooms, 1)}</td>
      <td class="status">
        {sale.included ? (
          'Included'
        ) : (
          <>
            Excluded<span class="reason">{sale.excludedReason}</span>
          </>
        )}
      </td>
      <td class="nowrap">
        <div class="row-actions">
          <a href={saleUrl(market, sale, '/edit')}>Edit</a>
          {sale.included ? (
            <a href={saleUrl(market, sale, '/exclude')}>Exclude</a>
          ) : (
            <form method="post" action={saleUrl(market, sale, '/include')} hx-post={saleUrl(market, sale, '/include')} hx-target="closest tr" hx-swap="outerHTML">
              <CsrfField />
              <button type="submit" class="link">
                Include
              </button>
            </form>
          )}
          <a
            href={saleUrl(market, sale, '/delete')}
            hx-post={saleUrl(market, sale, '/delete')}
            hx-confirm={`Delete sale ${sale.id} at ${sale.address}? You can undo this right after.`}
            hx-target="closest tr"
            hx-swap="outerHTML"
          >
            Delete
          </a>
        </div>
      </td>
    </tr>
  );
}

/** Shown in place of a row just deleted through htmx, with the undo button. */
export function DeletedSaleRow(props: { market: Market; sale: StoredSale; changeId: number }) {
  const url = `/markets/${props.market.id}/sales/restore/${props.changeId}`;
  return (
    <tr id={`sale-${props.sale.key}`} class="deleted">
      <td colspan={COLUMNS.length}>
        <form method="post" action={url} hx-post={url} hx-target="closest tr" hx-swap="outerHTML" class="inline">
          <CsrfField />
          Deleted sale {props.sale.id} at {props.sale.address}.{' '}
          <button type="submit" class="link">
            Undo
          </button>
        </form>
      </td>
    </tr>
  );
}

function SortHeader(props: { market: Market; state: SalesQueryState; column: (typeof COLUMNS)[number] }) {
  const { column, state, market } = props;
  const label = column.unit ? `${column.label} (${areaLabel(market.areaUnit)})` : column.label;
  const cls = [column.num ? 'num' : '', column.minor ? 'minor' : ''].filter(Boolean).join(' ') || undefined;
  if (!column.sort) return <th scope="col" class={cls}>{label}</th>;
  const active = state.sort === column.sort;
  const dir = active && state.dir === 'asc' ? 'desc' : active ? 'asc' : column.sort === 'sale_date' ? 'desc' : 'asc';
  const href = `/markets/${market.id}${salesQueryString(state, { sort: column.sort, dir, page: 1 })}`;
  return (
    <th scope="col" class={cls} aria-sort={active ? (state.dir === 'asc' ? 'ascending' : 'descending') : undefined}>
      <a {...regionLink(href)}>
        {label}
        {active ? (state.dir === 'asc' ? ' ▲' : ' ▼') : ''}
      </a>
    </th>
  );
}

function Pager(props: { market: Market; state: SalesQueryState; page: SalesPage }) {
  const { page, state, market } = props;
  if (page.pageCount <= 1) return null;
  const link = (n: number, label: string) => <a {...regionLink(`/markets/${market.id}${salesQueryString(state, { page: n })}`)}>{label}</a>;
  return (
    <nav class="pager" aria-label="Pages">
      {page.page > 1 ? link(page.page - 1, '‹ Previous') : <span class="disabled">‹ Previous</span>}
      <span>
        Page {page.page} of {page.pageCount}
      </span>
      {page.page < page.pageCount ? link(page.page + 1, 'Next ›') : <span class="disabled">Next ›</span>}
    </nav>
  );
}

export function SalesRegion(props: { market: Market; state: SalesQueryState; page: SalesPage }) {
  const { market, state, page } = props;
  const first = (page.page - 1) * page.pageSize + 1;
  const last = first + page.sales.length - 1;
  return (
    <div id="sales-region">
      {/* Linked to the filter form by the form attribute, so filtering keeps the sort. */}
      <input type="hidden" name="sort" value={state.sort} form="sales-filter" />
      <input type="hidden" name="dir" value={state.dir} form="sales-filter" />
      <p class="count" role="status">
        {page.total === 0
          ? 'No sales match.'
          : page.total <= page.pageSize
            ? `${page.total} ${page.total === 1 ? 'sale' : 'sales'}`
            : `Sales ${first}–${last} of ${page.total}`}
      </p>
      {page.total > 0 ? (
        <div class="table-scroll">
          <table class="data sales">
            <thead>
              <tr>
                {COLUMNS.map((column) => (
                  <SortHeader market={market} state={state} column={column} />
                ))}
              </tr>
            </thead>
            <tbody>
              {page.sales.map((s) => (
                <SaleRow market={market} sale={s} />
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      <Pager market={market} state={state} page={page} />
    </div>
  );
}
