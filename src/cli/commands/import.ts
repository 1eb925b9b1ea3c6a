/**
 * `compfit import --market NAME FILE.csv [--create [--area-unit sqft|m2] [--currency USD]] [--replace]`:
 * checks every row, then writes all of them in one transaction or none. `-` reads the file
 * from standard input. Problems: exit 2, one line each naming row and column, nothing written.
 */
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { describeRowError, readSalesCsv } from '../../domain/sales-csv.js';
import { closeDatabase } from '../../store/database.js';
import { validateMarketFields } from '../../store/market-fields.js';
import { createMarket, findMarketByName } from '../../store/markets-repo.js';
import { importSales } from '../../store/sales-import.js';
import { InputError, parseOptions, type Command } from '../cli-io.js';
import { openCliDatabase, requireMarket } from './store-access.js';

const ACTOR = 'command line';

export const importCommand: Command = async (args, io) => {
  const { options, positional } = parseOptions(args, ['market', 'area-unit', 'currency'], ['create', 'replace']);
  const problems: string[] = [];
  if (!options.market?.trim()) problems.push('--market NAME is required');
  if (positional.length !== 1) problems.push(positional.length === 0 ? 'the CSV file to import is required (or - for standard input)' : `one file at a time, got ${positional.length}`);
  if (!options.create && (options['area-unit'] || options.currency)) problems.push('--area-unit and --currency only apply with --create');
  if (problems.length > 0) throw new InputError(problems);

  const file = positional[0];
  let text: string;
  try {
    text = file === '-' ? await io.readStdin() : await readFile(path.resolve(io.cwd, file), 'utf8');
  } catch (err) {
    throw new InputError([`cannot read "${file}": ${(err as NodeJS.ErrnoException).code ?? (err as Error).message}`]);
  }
  const csv = readSalesCsv(text);
  for (const n of csv.notices) io.stderr(`compfit import: note: ${n}\n`);
  if (!csv.ok) throw new InputError([...csv.errors.map((e) => `${file}: ${describeRowError(e)}`), `${file}: nothing was imported`]);

  const db = await openCliDatabase(io);
  try {
    const name = options.market.trim();
    let market = await findMarketByName(db, name);
    if (!market && options.create) {
      const fields = validateMarketFields({ name, area_unit: options['area-unit'] ?? 'sqft', currency: options.currency ?? 'USD' });
      if (!fields.ok) throw new InputError(Object.entries(fields.errors).map(([k, m]) => `--${k.replace('_', '-')}: ${m}`));
      const created = await createMarket(db, fields.value);
      if (!created.ok) throw new InputError(Object.values(created.errors));
      market = created.market;
      io.stdout(`created market "${market.name}" (areas in ${market.areaUnit}, prices in ${market.currency})\n`);
    }
    if (!market) {
      try {
        market = await requireMarket(db, name);
      } catch (err) {
        if (err instanceof InputError) throw new InputError([...err.problems, 'add --create to make a new market of that name']);
        throw err;
      }
    }
    const result = await importSales(db, market.id, csv.sales, { by: ACTOR, fileName: file === '-' ? 'stdin' : path.basename(file), replace: options.replace === 'true' });
    if (!result.ok) throw new InputError([...result.errors.map((e) => `${file}: ${describeRowError(e)}`), `${file}: nothing was imported`]);
    io.stdout(`imported ${result.count} ${result.count === 1 ? 'sale' : 'sales'} into "${market.name}"${options.replace ? ' (replacing its sales)' : ''}\n`);
    return 0;
  } finally {
    closeDatabase(db);
  }
};
