/**
 * HTTP load, printed as figures (not asserted): autocannon, 20 connections, against the app
 * served from an embedded file database with a 500-sale market, in one process and in two
 * worker processes (WORKERS=2). Measures the sales page, the estimate page (model +
 * subject, the whole result with pictures) and the JSON estimate. The server runs in its
 * own process(es) (bench/http-server.ts); server time is measured inside them (a
 * middleware around every request), client latency by autocannon, which runs on the same
 * machine and takes CPU too; so the server's CPU time per request is printed as well, which
 * does not depend on what else the machine is doing: 2,000 / (CPU ms per request) is what
 * two cores could serve with the load generator elsewhere. Targets: estimate p95 ≤ 30 ms server time (issue 4); ≥ 300
 * requests/s for an estimate of a 500-sale market on 2 cores with p99 ≤ 100 ms (issue 6).
 *   npm run bench:http [-- --seconds 10] [-- --workers 1,2]
 */
import { fork } from 'node:child_process';
import { cpus } from 'node:os';
import autocannon from 'autocannon';

const option = (name: string) => (process.argv.includes(`--${name}`) ? process.argv[process.argv.indexOf(`--${name}`) + 1] : undefined);
const seconds = Number(option('seconds')) || 10;
const workerCounts = (option('workers') ?? '1,2').split(',').map(Number);

function percentile(sorted: number[], q: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))] ?? NaN;
}

const subject = { address: '1 Bench Road', effective_date: '2025-01-01', living_area: 1800, year_built: 1990, rooms: 7, bathrooms: 2, garage_spaces: 1 };
const q = new URLSearchParams({ transform: 'none', level: '0.95', run: 'estimate', ...Object.fromEntries(Object.entries(subject).map(([k, v]) => [k, String(v)])) });
for (const p of ['living_area', 'age', 'rooms']) q.append('predictors', p);

console.log(`compfit HTTP benchmark: autocannon, 20 connections, ${seconds} s each, node ${process.version}, ${cpus().length} cores`);
console.log('target                            workers   req/s   client p50  p97.5   p99 ms | server p50   p95   p99 ms | CPU ms/req | non-2xx');
for (const workers of workerCounts) {
  const child = fork(new URL('./http-server.ts', import.meta.url), ['--workers', String(workers)], { execArgv: ['--import', 'tsx'] });
  const { port, marketId } = await new Promise<{ port: number; marketId: number }>((resolve) => child.once('message', (m) => resolve(m as { port: number; marketId: number })));
  const serverReport = () =>
    new Promise<{ times: number[]; cpuMs: number }>((resolve) => {
      child.once('message', (m) => resolve(m as { times: number[]; cpuMs: number }));
      child.send('times');
    });
  const origin = `http://127.0.0.1:${port}`;
  const targets: { name: string; opts: autocannon.Options }[] = [
    { name: 'sales page (500 sales, page 1)', opts: { url: `${origin}/markets/${marketId}` } },
    { name: 'estimate page (500 sales)', opts: { url: `${origin}/markets/${marketId}/estimate?${q}` } },
    {
      name: 'JSON estimate (500 sales)',
      opts: { url: `${origin}/api/markets/${marketId}/estimate`, method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ subject }) },
    },
  ];
  for (const t of targets) {
    await autocannon({ ...t.opts, connections: 4, duration: 2 }); // warm up every worker
    await serverReport();
    const r = await autocannon({ ...t.opts, connections: 20, duration: seconds });
    const report = await serverReport();
    const s = report.times.sort((a, b) => a - b);
    const cpuPerRequest = report.cpuMs / Math.max(1, s.length);
    console.log(
      `${t.name.padEnd(32)} ${String(workers).padStart(7)}  ${r.requests.average.toFixed(0).padStart(6)}   ${String(r.latency.p50).padStart(9)} ${String(r.latency.p97_5).padStart(6)} ${String(r.latency.p99).padStart(6)}    | ${percentile(s, 0.5).toFixed(1).padStart(9)} ${percentile(s, 0.95).toFixed(1).padStart(5)} ${percentile(s, 0.99).toFixed(1).padStart(5)}    | ${cpuPerRequest.toFixed(2).padStart(10)} | ${r.non2xx}`,
    );
  }
  child.send('stop');
  await new Promise((r) => child.once('exit', r));
}
