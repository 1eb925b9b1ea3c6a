/**
 * The heading and section links of one market. Sections are a list so later pages
 * (estimates) add a link here and every market page shows it.
 */
import type { Market } from '../../store/markets-repo.js';
import { areaLabel } from './format.js';

export interface MarketSection {
  key: string;
  label: string;
  href: (marketId: number) => string;
}

export const MARKET_SECTIONS: MarketSection[] = [
  { key: 'sales', label: 'Sales', href: (id) => `/markets/${id}` },
  { key: 'estimate', label: 'Estimate', href: (id) => `/markets/${id}/estimate` },
  { key: 'estimates', label: 'Saved estimates', href: (id) => `/markets/${id}/estimates` },
  { key: 'add', label: 'Add a sale', href: (id) => `/markets/${id}/sales/new` },
  { key: 'import', label: 'Import CSV', href: (id) => `/markets/${id}/import` },
  { key: 'export', label: 'Export CSV', href: (id) => `/markets/${id}/sales.csv` },
  { key: 'settings', label: 'Market settings', href: (id) => `/markets/${id}/edit` },
];

export function MarketHeader(props: { market: Market; current?: string }) {
  const { market } = props;
  return (
    <div class="market-header">
      <p class="breadcrumb">
        <a href="/markets">Markets</a> /
      </p>
      <h1>{market.name}</h1>
      <p class="market-facts">
        Areas in {areaLabel(market.areaUnit)} · prices in {market.currency}
      </p>
      <nav class="market-nav" aria-label="Market">
        {MARKET_SECTIONS.map((s) => (
          <a href={s.href(market.id)} aria-current={s.key === props.current ? 'page' : undefined}>
            {s.label}
          </a>
        ))}
      </nav>
    </div>
  );
}
