/**
 * WORKERS=2: the app in two worker processes on one port and one database file. Both
 * serve, a write through either lands, a worker that dies is replaced while the other
 * keeps serving, and SIGTERM stops them all.
 */
import { get } from 'node:http';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readConfig } from '../../src/server.js';
import { cli } from '../helpers/cli.js';
import { startAppProcess, type AppProcess } from './app-process.js';
import { FormClient } from './form-client.js';

let dir: string;
let app: AppProcess;

/** The worker processes of the app: its children running the server entry (read from /proc, Linux). */
function workerPids(): number[] {
  const pids: number[] = [];
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      // Field 4 of /proc/PID/stat is the parent's id; the name in field 2 may hold spaces, so split after its ')'.
      const stat = readFileSync(`/proc/${entry}/stat`, 'utf8');
      const parent = Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]);
      if (parent === app.child.pid && readFileSync(`/proc/${entry}/cmdline`, 'utf8').includes('server.ts')) pids.push(Number(entry));
    } catch {
      // The process ended while being read.
    }
  }
  return pids;
}

/** GET on a new connection (a kept-alive one may belong to a worker that was killed). */
function statusOnNewConnection(url: string): Promise<number> {
  return new Promise((resolve, reject) => {
    get(url, { agent: false }, (res) => {
      res.resume();
      resolve(res.statusCode ?? 0);
    }).on('error', reject);
  });
}

async function waitFor(condition: () => boolean, timeoutMs: number): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!condition()) {
    if (Date.now() > deadline) throw new Error('timed out');
    await new Promise((r) => setTimeout(r, 100));
  }
}

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), 'compfit-workers-'));
  app = await startAppProcess({ databaseUrl: `file:${path.join(dir, 'workers.db')}`, env: { WORKERS: '2' } });
});

afterAll(async () => {
  await app.stop();
  rmSync(dir, { recursive: true, force: true });
});

describe('WORKERS=2', () => {
  it('serves from two processes, replaces one that dies, and stops on SIGTERM', { timeout: 60_000 }, async () => {
    expect(app.output()).toMatch(/serving on http:\/\/127\.0\.0\.1:\d+ .* in 2 worker processes\n/);
    // The primary put the demo market in once.
    expect(app.output().match(/added the demo market/g)).toHaveLength(1);
    const workers = workerPids();
    expect(workers).toHaveLength(2);

    // Connections are handed out in turn, so a run of requests reaches both; writes land once each.
    const client = new FormClient(app.url);
    const markets = (await (await fetch(`${app.url}/api/markets`)).json()) as { id: number; salesCount: number }[];
    const [{ id, salesCount }] = markets;
    for (let i = 1; i <= 10; i++) {
      const r = await client.submit(
        `/markets/${id}/sales`,
        { address: `${i} Two Process Row`, sale_date: '2024-04-02', sale_price: '310000', living_area: '1600', id: '' },
        `/markets/${id}/sales/new`,
      );
      expect(r.status).toBe(303);
    }
    const after = (await (await fetch(`${app.url}/api/markets`)).json()) as { salesCount: number }[];
    expect(after[0].salesCount).toBe(salesCount + 10);

    // A worker that dies is replaced, and the other serves meanwhile. (A connection the
    // primary hands to the worker in the instant it dies, before it hears of the death, is
    // lost: Node's cluster cannot take it back. So this waits for the primary to notice.)
    process.kill(workers[0], 'SIGKILL');
    await waitFor(() => app.output().includes(`worker process ${workers[0]} stopped (exit code null, signal SIGKILL); starting another`), 10_000);
    for (let i = 0; i < 6; i++) expect(await statusOnNewConnection(`${app.url}/markets`)).toBe(200);
    await waitFor(() => workerPids().length === 2 && !workerPids().includes(workers[0]), 20_000);
    for (let i = 0; i < 6; i++) expect(await statusOnNewConnection(`${app.url}/markets`)).toBe(200);

    // SIGTERM: the workers close their database and exit, then the primary.
    const last = workerPids();
    await app.stop();
    expect((await app.exited).code).toBe(0);
    for (const pid of last) expect(() => process.kill(pid, 0)).toThrow();
  });
});

describe('the number of workers', () => {
  it('comes from WORKERS or --workers, 1 to 64', async () => {
    expect(readConfig({}).workers).toBeUndefined();
    expect(readConfig({ WORKERS: '2' }).workers).toBe(2);
    expect(() => readConfig({ WORKERS: 'two' })).toThrow('WORKERS must be a whole number from 1 to 64, got "two"');
    expect(() => readConfig({ WORKERS: '65' })).toThrow('WORKERS must be a whole number from 1 to 64, got "65"');
    expect(await cli(['serve', '--workers', '0'])).toMatchObject({ code: 2, stderr: 'compfit serve: --workers must be a whole number from 1 to 64, got "0"\n' });
  });
});
