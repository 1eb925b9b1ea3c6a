/**
 * The sales table's state in the URL (q, from, to, status, sort, dir, page), so every
 * view of the table has an address: filter and sort links keep the rest of the state.
 */
import { parseIsoDate } from '../../domain/validate-sale.js';
import { SALE_SORTS, type SaleSort, type SaleStatus, type SalesQuery } from '../../store/sales-repo.js';

export interface SalesQueryState {
  q: string;
  from: string;
  to: string;
  status: SaleStatus;
  sort: SaleSort;
  dir: 'asc' | 'desc';
  page: number;
}

export const DEFAULT_STATE: SalesQueryState = { q: '', from: '', to: '', status: 'all', sort: 'sale_date', dir: 'desc', page: 1 };
export const PAGE_SIZE = 50;

export function parseSalesQuery(params: Record<string, string | undefined>): { state: SalesQueryState; errors: Record<string, string> } {
  const errors: Record<string, string> = {};
  const date = (name: 'from' | 'to') => {
    const t = params[name]?.trim() ?? '';
    if (t && !parseIsoDate(t)) {
      errors[name] = `${name === 'from' ? 'From' : 'To'} must be a date as YYYY-MM-DD, got "${t}"`;
      return '';
    }
    return t;
  };
  const status = params.status === 'included' || params.status === 'excluded' ? params.status : 'all';
  const sort = (SALE_SORTS as readonly string[]).includes(params.sort ?? '') ? (params.sort as SaleSort) : DEFAULT_STATE.sort;
  const dir = params.dir === 'asc' ? 'asc' : params.dir === 'desc' ? 'desc' : sort === 'sale_date' ? 'desc' : 'asc';
  const page = Math.max(1, Math.trunc(Number(params.page)) || 1);
  return { state: { q: (params.q ?? '').trim().slice(0, 200), from: date('from'), to: date('to'), status, sort, dir, page }, errors };
}

export function toSalesQuery(s: SalesQueryState): SalesQuery {
  return {
    ...(s.q ? { text: s.q } : {}),
    ...(s.from ? { from: s.from } : {}),
    ...(s.to ? { to: s.to } : {}),
    status: s.status,
    sort: s.sort,
    direction: s.dir,
    page: s.page,
    pageSize: PAGE_SIZE,
  };
}

/** `?…` for the state with some parts changed; defaults are left out to keep URLs short. */
export function salesQueryString(s: SalesQueryState, change: Partial<SalesQueryState> = {}): string {
  const next = { ...s, ...change };
  const p = new URLSearchParams();
  if (next.q) p.set('q', next.q);
  if (next.from) p.set('from', next.from);
  if (next.to) p.set('to', next.to);
  if (next.status !== 'all') p.set('status', next.status);
  if (next.sort !== DEFAULT_STATE.sort || next.dir !== DEFAULT_STATE.dir) {
    p.set('sort', next.sort);
    p.set('dir', next.dir);
  }
  if (next.page > 1) p.set('page', String(next.page));
  const text = p.toString();
  return text ? `?${text}` : '';
}
