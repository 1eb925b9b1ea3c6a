/** The list of markets with their sales counts. */
import type { MarketSummary } from '../../store/markets-repo.js';
import { Layout } from './layout.js';

export function MarketsTable(props: { markets: MarketSummary[] }) {
  if (props.markets.length === 0) return <p id="markets-table">No markets yet. Create one to start recording sales.</p>;
  return (
    <table id="markets-table" class="data">
      <thead>
        <tr>
          <th scope="col">Market</th>
          <th scope="col" class="num">
            Sales
          </th>
        </tr>
      </thead>
      <tbody>
        {props.markets.map((m) => (
          <tr>
            <td>
              <a href={`/markets/${m.id}`}>{m.name}</a>
            </td>
            <td class="num">{m.salesCount}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

export function MarketsPage(props: { markets: MarketSummary[] }) {
  return (
    <Layout title="Markets">
      <div class="page-head">
        <h1>Markets</h1>
        <a class="button" href="/markets/new">
          New market
        </a>
      </div>
      <p class="lead">A market is an area whose sales are compared with each other: one area unit, one currency.</p>
      <MarketsTable markets={props.markets} />
    </Layout>
  );
}
