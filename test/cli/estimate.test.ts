import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { writeSalesCsv } from '../../src/domain/sales-csv.js';
import { cli } from '../helpers/cli.js';
import { syntheticSales } from '../helpers/sales.js';

const dir = mkdtempSync(path.join(tmpdir(), 'compfit-cli-'));
const file = (name: string, text: string) => {
  writeFileSync(path.join(dir, name), text);
  return name;
};
const goodCsv = file('sales.csv', writeSalesCsv(syntheticSales(30, 11)));
const subject = { address: '7 Example Row', effective_date: '2024-03-01', living_area: 1750, year_built: 1985, rooms: 6 };
const goodSubject = file('subject.json', JSON.stringify(subject));
const run = (...args: string[]) => cli(['estimate', ...args], { cwd: dir });

describe('compfit estimate', () => {
  it('prints the Result JSON with exit 0', async () => {
    const r = await run('--sales', goodCsv, '--subject', goodSubject);
    expect(r.code).toBe(0);
    const json = JSON.parse(r.stdout);
    expect(json.n).toBe(30);
    expect(json.predictors).toEqual(['living_area', 'age', 'rooms']);
    expect(Object.keys(json)).toEqual(expect.arrayContaining(['coefficients', 'fit', 'estimate', 'warnings', 'sales', 'validation', 'grid']));
    expect(json.estimate.prediction[0]).toBeLessThan(json.estimate.value);
  });
  it('prints a text summary that ends with the caution', async () => {
    const r = await run('--sales', goodCsv, '--subject', goodSubject, '--format', 'text', '--level', '0.9', '--transform', 'log');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/90 % prediction/);
    expect(r.stdout.trim().split('\n').at(-1)).toMatch(/^Caution: .*not an appraisal.*USPAP/);
  });
});

describe('compfit estimate: bad input exits 2, names the problem, prints no result', () => {
  const header = 'id,address,sale_date,sale_price,living_area,year_built,rooms';
  const rows = syntheticSales(12, 2).map((s) => `${s.id},${s.address},${s.saleDate},${s.salePrice},${s.characteristics.living_area},${s.characteristics.year_built},${s.characteristics.rooms}`);
  const cases: [string, string, RegExp][] = [
    ['negative price', [header, ...rows, 'B1,1 Bad St,2024-01-01,-5,1500,1990,6'].join('\n'), /row 13, column sale_price: sale_price must be greater than 0/],
    ['zero area', [header, ...rows, 'B1,1 Bad St,2024-01-01,250000,0,1990,6'].join('\n'), /row 13, column living_area: living_area must be greater than 0/],
    ['year built after the sale', [header, ...rows, 'B1,1 Bad St,2024-01-01,250000,1500,2026,6'].join('\n'), /row 13, column year_built: year_built 2026 is after the year of sale 2024/],
    ['non-ISO date', [header, ...rows, 'B1,1 Bad St,01/02/2024,250000,1500,1990,6'].join('\n'), /row 13, column sale_date: .*YYYY-MM-DD.*01\/02\/2024/],
    ['text in a number', [header, ...rows, 'B1,1 Bad St,2024-01-01,250000,big,1990,6'].join('\n'), /row 13, column living_area: living_area must be a plain number, got "big"/],
    ['duplicate id', [header, ...rows, `${rows[0].split(',')[0]},1 Bad St,2024-01-01,250000,1500,1990,6`].join('\n'), /row 13, column id: id "T1" is already used by row 1/],
    ['missing required column', ['id,address,sale_price', 'A,1 St,100000'].join('\n'), /required column "sale_date" is missing/],
    ['fractional rooms', [header, ...rows, 'B1,1 Bad St,2024-01-01,250000,1500,1990,6.5'].join('\n'), /row 13, column rooms: rooms must be a whole number/],
  ];
  for (const [name, text, message] of cases)
    it(name, async () => {
      const f = file(`${name.replace(/\W+/g, '-')}.csv`, text);
      const r = await run('--sales', f, '--subject', goodSubject);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stdout).toBe('');
    });

  const subjectCases: [string, unknown, RegExp][] = [
    ['subject without effective_date', { address: 'x', living_area: 1700 }, /effective_date is required/],
    ['subject with a text area', { ...subject, living_area: 'large' }, /living_area must be a plain number, got "large"/],
    ['subject with an unknown field', { ...subject, pool: true }, /pool is not a subject field/],
    ['subject missing a characteristic the model needs', { address: 'x', effective_date: '2024-01-01', living_area: 1700, rooms: 5 }, /subject has no year_built, which age needs/],
    ['subject built after its effective date', { ...subject, year_built: 2030 }, /year_built 2030 is after the effective date/],
  ];
  for (const [name, body, message] of subjectCases)
    it(name, async () => {
      const f = file(`${name.replace(/\W+/g, '-')}.json`, JSON.stringify(body));
      const r = await run('--sales', goodCsv, '--subject', f);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stdout).toBe('');
    });

  it('subject file that is not JSON', async () => {
    const r = await run('--sales', goodCsv, '--subject', file('broken.json', '{"address": '));
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/broken\.json: not valid JSON/);
  });
  it('missing files and options', async () => {
    const r = await run('--sales', 'nope.csv', '--subject', goodSubject);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/cannot read the sales file "nope.csv": ENOENT/);
    const r2 = await run('--subject', goodSubject, '--format', 'xml', '--predictors', 'living_area,pool', '--level', 'high');
    expect(r2.code).toBe(2);
    expect(r2.stderr).toMatch(/--sales FILE.csv is required/);
    expect(r2.stderr).toMatch(/--format must be json or text/);
    expect(r2.stderr).toMatch(/"pool" is not a predictor/);
    expect(r2.stderr).toMatch(/--level must be a number/);
  });
  it('too few sales for the model', async () => {
    const f = file('three.csv', [header, ...rows.slice(0, 3)].join('\n'));
    const r = await run('--sales', f, '--subject', goodSubject);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/only 3 sales can be used but the model has 4 coefficients/);
  });
  it('an unknown command exits 2', async () => {
    const r = await cli(['appraise']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/unknown command "appraise"/);
  });
});

describe('the installed program (bin/compfit.js) as a separate process', () => {
  it('exits 0 with JSON on stdout, and 2 with the message on stderr', async () => {
    const { spawnSync } = await import('node:child_process');
    const bin = path.resolve('bin/compfit.js');
    const ok = spawnSync(process.execPath, [bin, 'estimate', '--sales', goodCsv, '--subject', goodSubject, '--format', 'json'], { cwd: dir, encoding: 'utf8' });
    expect(ok.status).toBe(0);
    expect(JSON.parse(ok.stdout).n).toBe(30);
    const bad = spawnSync(process.execPath, [bin, 'estimate', '--sales', 'missing.csv', '--subject', goodSubject], { cwd: dir, encoding: 'utf8' });
    expect(bad.status).toBe(2);
    expect(bad.stdout).toBe('');
    expect(bad.stderr).toMatch(/cannot read the sales file/);
  });
});
