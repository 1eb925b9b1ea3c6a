import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { readSalesCsv } from '../../src/domain/sales-csv.js';
import { cli } from '../helpers/cli.js';

let dir: string;
let env: Record<string, string>;
beforeEach(() => {
  dir = mkdtempSync(path.join(tmpdir(), 'compfit-cli-'));
  env = { DATABASE_URL: 'file:store.db' };
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

const CSV = ['id,address,sale_date,sale_price,living_area,included,excluded_reason', 'K1,1 Fen Road,2024-01-05,"$199,000",1210,yes,', 'K2,2 Fen Road,2024-02-05,204000,1260,no,sold to a neighbour', ''].join('\n');

describe('compfit import and export', () => {
  it('imports into a new market with --create, exports the same records', async () => {
    writeFileSync(path.join(dir, 'in.csv'), CSV);
    const imp = await cli(['import', '--market', 'Fen Side', '--create', '--area-unit', 'm2', '--currency', 'gbp', 'in.csv'], { cwd: dir, env });
    expect(imp).toMatchObject({ code: 0, stderr: '' });
    expect(imp.stdout).toBe('created market "Fen Side" (areas in m2, prices in GBP)\nimported 2 sales into "Fen Side"\n');

    const exp = await cli(['export', '--market', 'Fen Side'], { cwd: dir, env });
    expect(exp.code).toBe(0);
    const back = readSalesCsv(exp.stdout);
    const original = readSalesCsv(CSV);
    expect(back.ok && original.ok && back.sales).toEqual(original.ok && original.sales);

    const toFile = await cli(['export', '--market', 'Fen Side', '--output', 'out.csv'], { cwd: dir, env });
    expect(toFile.code).toBe(0);
    expect(readFileSync(path.join(dir, 'out.csv'), 'utf8')).toBe(exp.stdout);
    const again = await cli(['export', '--market', 'Fen Side', '--output', 'out.csv'], { cwd: dir, env });
    expect(again).toMatchObject({ code: 2, stderr: 'compfit export: "out.csv" already exists; choose another name\n' });
  });

  it('reads standard input for -, and --replace swaps the market’s sales', async () => {
    await cli(['import', '--market', 'Fen Side', '--create', '-'], { cwd: dir, env, stdin: CSV });
    const r = await cli(['import', '--market', 'Fen Side', '--replace', '-'], { cwd: dir, env, stdin: CSV.replace('1 Fen Road', '1A Fen Road') });
    expect(r.stdout).toBe('imported 2 sales into "Fen Side" (replacing its sales)\n');
    const exp = await cli(['export', '--market', 'Fen Side'], { cwd: dir, env });
    expect(exp.stdout).toContain('1A Fen Road');
    expect(exp.stdout.trim().split('\n')).toHaveLength(3);
  });

  it('bad rows: exit 2, one line per problem naming row and column, nothing written', async () => {
    await cli(['import', '--market', 'Fen Side', '--create', '-'], { cwd: dir, env, stdin: CSV });
    const bad = 'address,sale_date,sale_price,living_area\n3 Fen Road,2024-03-01,0,1200\n4 Fen Road,2024-13-01,210000,abc\n';
    const r = await cli(['import', '--market', 'Fen Side', '-'], { cwd: dir, env, stdin: bad });
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toEqual([
      'compfit import: -: row 1, column sale_price: sale_price must be greater than 0, got "0"',
      'compfit import: -: row 2, column sale_date: sale_date must be a real date as YYYY-MM-DD, got "2024-13-01"',
      'compfit import: -: row 2, column living_area: living_area must be a plain number, got "abc"',
      'compfit import: -: nothing was imported',
    ]);
    const exp = await cli(['export', '--market', 'Fen Side'], { cwd: dir, env });
    expect(exp.stdout.trim().split('\n')).toHaveLength(3);
  });

  it('an id already in the market stops the whole file', async () => {
    await cli(['import', '--market', 'Fen Side', '--create', '-'], { cwd: dir, env, stdin: CSV });
    const r = await cli(['import', '--market', 'Fen Side', '-'], { cwd: dir, env, stdin: 'id,address,sale_date,sale_price\nK9,9 Fen Road,2024-01-01,1\nK2,x,2024-01-01,1\n' });
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('row 2, column id: id "K2" is already used by a sale in this market');
    const exp = await cli(['export', '--market', 'Fen Side'], { cwd: dir, env });
    expect(exp.stdout).not.toContain('K9');
  });

  it('names the markets there are when the one asked for does not exist', async () => {
    await cli(['import', '--market', 'Fen Side', '--create', '-'], { cwd: dir, env, stdin: CSV });
    const r = await cli(['export', '--market', 'Fen'], { cwd: dir, env });
    expect(r).toMatchObject({ code: 2, stdout: '' });
    expect(r.stderr).toBe('compfit export: there is no market named "Fen"; markets: "Fen Side"\n');
    const i = await cli(['import', '--market', 'Fen', '-'], { cwd: dir, env, stdin: CSV });
    expect(i.stderr).toContain('add --create to make a new market of that name');
  });

  it('checks its options', async () => {
    const r = await cli(['import', 'in.csv'], { cwd: dir, env });
    expect(r).toMatchObject({ code: 2, stderr: 'compfit import: --market NAME is required\n' });
    const unit = await cli(['import', '--market', 'X', '--create', '--area-unit', 'acre', '-'], { cwd: dir, env, stdin: CSV });
    expect(unit.stderr).toContain('--area-unit: area_unit must be sqft or m2, got "acre"');
    const missing = await cli(['import', '--market', 'X', 'nope.csv'], { cwd: dir, env });
    expect(missing.stderr).toBe('compfit import: cannot read "nope.csv": ENOENT\n');
  });

  it('compfit seed rebuilds the demo market', async () => {
    const r = await cli(['seed'], { cwd: dir, env });
    expect(r).toMatchObject({ code: 0, stdout: 'rebuilt the demo market with 60 sales\n' });
    const exp = await cli(['export', '--market', 'Brindlewick – Tansy Row'], { cwd: dir, env });
    expect(exp.stdout.trim().split('\n')).toHaveLength(61);
  });
});
