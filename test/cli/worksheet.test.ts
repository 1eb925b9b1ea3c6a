import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDatabase, openDatabase } from '../../src/store/database.js';
import { saveEstimate } from '../../src/store/estimates-repo.js';
import { createMarket } from '../../src/store/markets-repo.js';
import { migrateDatabase } from '../../src/store/migrate.js';
import { worksheetCsv } from '../../src/worksheet/worksheet-csv.js';
import { buildWorksheet } from '../../src/worksheet/worksheet-model.js';
import { worksheetPdf } from '../../src/worksheet/worksheet-pdf.js';
import { cli } from '../helpers/cli.js';
import { pdfPages } from '../worksheet/pdf-pages.js';
import { savedEstimate } from '../worksheet/demo-snapshot.js';

const dir = mkdtempSync(path.join(tmpdir(), 'compfit-cli-worksheet-'));
const env = { DATABASE_URL: 'file:store.db' };
const snapshot = savedEstimate();
let id: number;
/** The snapshot as the database gives it back: its new id and market id. */
let stored: typeof snapshot;

beforeAll(async () => {
  const db = await openDatabase({ url: `file:${path.join(dir, 'store.db')}` });
  await migrateDatabase(db);
  const market = await createMarket(db, { name: snapshot.market.name, areaUnit: 'sqft', currency: 'USD' });
  if (!market.ok) throw new Error(JSON.stringify(market.errors));
  const withMarket = { ...snapshot, market: { ...snapshot.market, id: market.market.id } };
  id = await saveEstimate(db, withMarket);
  stored = { ...withMarket, id };
  closeDatabase(db);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const run = (...args: string[]) => cli(['worksheet', ...args], { cwd: dir, env });

describe('compfit worksheet', () => {
  it('writes the PDF of a saved estimate, byte for byte the worksheet of the snapshot', async () => {
    const r = await run('--estimate', String(id), '--out', 'w.pdf');
    expect(r).toMatchObject({ code: 0, stdout: '' });
    expect(r.stderr).toBe(`compfit worksheet: wrote the worksheet of estimate ${id} (27 Wicker Lane, Brindlewick) to w.pdf\n`);
    const written = readFileSync(path.join(dir, 'w.pdf'));
    const expected = await worksheetPdf(buildWorksheet(stored));
    expect(written.equals(expected)).toBe(true);
    const pages = pdfPages(written);
    expect(pages[0]).toContain('Value $335,750');
    expect(pages[0]).toMatch(new RegExp(`Estimate id (\\S+ )*${id}\\b`));
  });

  it('writes the CSV for a .csv file', async () => {
    const r = await run('--estimate', String(id), '--out', 'w.csv');
    expect(r.code).toBe(0);
    const expected = worksheetCsv(buildWorksheet(stored));
    expect(readFileSync(path.join(dir, 'w.csv'), 'utf8')).toBe(expected);
  });

  it('bad input: exit 2, one message per problem, nothing written', async () => {
    const cases: [string[], string][] = [
      [[], 'compfit worksheet: --estimate ID is required\ncompfit worksheet: --out FILE.pdf (or FILE.csv) is required\n'],
      [['--estimate', 'seven', '--out', 'x.pdf'], 'compfit worksheet: --estimate must be the number of a saved estimate, got "seven"\n'],
      [['--estimate', '1', '--out', 'x.docx'], 'compfit worksheet: --out must end in .pdf or .csv, got "x.docx"\n'],
      [['--estimate', '999', '--out', 'x.pdf'], 'compfit worksheet: there is no saved estimate 999\n'],
      [['--estimate', '1', '--out', 'x.pdf', 'extra'], 'compfit worksheet: unexpected argument "extra"\n'],
    ];
    for (const [args, stderr] of cases) {
      const r = await run(...args);
      expect(r, args.join(' ')).toEqual({ code: 2, stdout: '', stderr });
    }
    expect(existsSync(path.join(dir, 'x.pdf'))).toBe(false);
  });

  it('never overwrites a file', async () => {
    writeFileSync(path.join(dir, 'keep.pdf'), 'mine');
    const r = await run('--estimate', String(id), '--out', 'keep.pdf');
    expect(r).toEqual({ code: 2, stdout: '', stderr: 'compfit worksheet: "keep.pdf" already exists; choose another name\n' });
    expect(readFileSync(path.join(dir, 'keep.pdf'), 'utf8')).toBe('mine');
  });
});
