/**
 * HTTP load, printed as figures (not asserted): autocannon, 20 connections, against the app
 * served from an embedded file database with a 500-sale market. Measures the sales page,
 * the estimate page (model + subject, the whole result with pictures) and the JSON estimate.
 * The server runs in its own process (bench/http-server.ts); server time is measured inside
 * it (a middleware around every request), client latency by autocannon. Targets: estimate p95 ≤ 30 ms server time (issue 4); ≥ 300
 * requests/s for an estimate of a 500-sale market with p99 ≤ 100 ms (issue 6).
 *   npm run bench:http [-- --seconds 10]
 */
import { fork } from 'node:child_process';
import autocannon from 'autocannon';

const seconds = Number(process.argv[process.argv.indexOf('--seconds') + 1]) || 10;

function percentile(sorted: number[], q: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];
}

const child = fork(new URL('./http-server.ts', import.meta.url), [], { execArgv: ['--import', 'tsx'] });
const ready = await new Promise<{ port: number; marketId: number }>((resolve) => child.once('message', (m) => resolve(m as { port: number; marketId: number })));
const { port, marketId } = ready;
const serverTimes = () =>
  new Promise<number[]>((resolve) => {
    child.once('message', (m) => resolve((m as { times: number[] }).times));
    child.send('times');
  });

const subject = { address: '1 Bench Road', effective_date: '2025-01-01', living_area: 1800, year_built: 1990, rooms: 7, bathrooms: 2, garage_spaces: 1 };
const q = new URLSearchParams({ transform: 'none', level: '0.95', run: 'estimate', ...Object.fromEntries(Object.entries(subject).map(([k, v]) => [k, String(v)])) });
for (const p of ['living_area', 'age', 'rooms']) q.append('predictors', p);

const targets: { name: string; opts: autocannon.Options }[] = [
  { name: 'sales page (500 sales, page 1)', opts: { url: `http://127.0.0.1:${port}/markets/${marketId}` } },
  { name: 'estimate page (500 sales)', opts: { url: `http://127.0.0.1:${port}/markets/${marketId}/estimate?${q}` } },
  {
    name: 'JSON estimate (500 sales)',
    opts: {
      url: `http://127.0.0.1:${port}/api/markets/${marketId}/estimate`,
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ subject }),
    },
  },
];

console.log(`compfit HTTP benchmark: autocannon, 20 connections, ${seconds} s each, node ${process.version}`);
console.log('target                            req/s   client p50  p97.5   p99 ms | server p50   p95   p99 ms | non-2xx');
for (const t of targets) {
  await autocannon({ ...t.opts, connections: 4, duration: 1 }); // warm up
  await serverTimes();
  const r = await autocannon({ ...t.opts, connections: 20, duration: seconds });
  const s = (await serverTimes()).sort((a, b) => a - b);
  console.log(
    `${t.name.padEnd(32)} ${r.requests.average.toFixed(0).padStart(6)}   ${String(r.latency.p50).padStart(9)} ${String(r.latency.p97_5).padStart(6)} ${String(r.latency.p99).padStart(6)}    | ${percentile(s, 0.5).toFixed(1).padStart(9)} ${percentile(s, 0.95).toFixed(1).padStart(5)} ${percentile(s, 0.99).toFixed(1).padStart(5)}    | ${r.non2xx}`,
  );
}
child.send('stop');
