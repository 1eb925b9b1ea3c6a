/**
 * Several processes started at once on a brand-new database file all come up: whoever loses
 * the race to apply the migrations retries and finds them applied.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, expect, it } from 'vitest';

const dir = mkdtempSync(path.join(tmpdir(), 'compfit-migrate-race-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(script: string, url: string, startAt: number): Promise<{ code: number | null; out: string }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, ['--import', 'tsx', script, url, String(startAt)], { stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    child.stdout.on('data', (d) => (out += d));
    child.stderr.on('data', (d) => (out += d));
    child.on('exit', (code) => resolve({ code, out }));
  });
}

it('four processes migrating one new file at the same moment all succeed', async () => {
  const script = path.join(dir, 'migrate.mts');
  const src = path.resolve('src/store');
  writeFileSync(
    script,
    `import { openDatabase } from ${JSON.stringify(path.join(src, 'database.ts'))};
import { migrateDatabase } from ${JSON.stringify(path.join(src, 'migrate.ts'))};
const db = await openDatabase({ url: process.argv[2] });
// Start together: every process waits for the same moment, then migrates.
await new Promise((r) => setTimeout(r, Math.max(0, Number(process.argv[3]) - Date.now())));
await migrateDatabase(db);
const r = await db.$client.execute('select count(*) as n from __drizzle_migrations');
console.log('applied', r.rows[0].n);
`,
  );
  const url = `file:${path.join(dir, 'race.db')}`;
  const startAt = Date.now() + 4000;
  const results = await Promise.all([1, 2, 3, 4].map(() => run(script, url, startAt)));
  for (const r of results) {
    expect(r.out).toMatch(/applied \d+/);
    expect(r.code).toBe(0);
  }
  const counts = new Set(results.map((r) => /applied (\d+)/.exec(r.out)![1]));
  expect(counts.size).toBe(1);
});
