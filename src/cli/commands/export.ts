/**
 * `compfit export --market NAME [--output FILE.csv]`: writes every sale of the market in
 * the import format (it reads back to the same records), to standard output by default.
 */
import { writeFile } from 'node:fs/promises';
import path from 'node:path';
import { writeSalesCsv } from '../../domain/sales-csv.js';
import { closeDatabase } from '../../store/database.js';
import { allSales } from '../../store/sales-repo.js';
import { InputError, parseOptions, type Command } from '../cli-io.js';
import { openCliDatabase, requireMarket } from './store-access.js';

export const exportCommand: Command = async (args, io) => {
  const { options, positional } = parseOptions(args, ['market', 'output']);
  const problems: string[] = [];
  if (!options.market?.trim()) problems.push('--market NAME is required');
  if (positional.length > 0) problems.push(`unexpected argument "${positional[0]}"`);
  if (problems.length > 0) throw new InputError(problems);

  const db = await openCliDatabase(io);
  try {
    const market = await requireMarket(db, options.market.trim());
    const sales = await allSales(db, market.id);
    const csv = writeSalesCsv(sales);
    if (!options.output) io.stdout(csv);
    else {
      try {
        await writeFile(path.resolve(io.cwd, options.output), csv, { flag: 'wx' });
      } catch (err) {
        const code = (err as NodeJS.ErrnoException).code;
        throw new InputError([code === 'EEXIST' ? `"${options.output}" already exists; choose another name` : `cannot write "${options.output}": ${code}`]);
      }
      io.stderr(`compfit export: wrote ${sales.length} sales of "${market.name}" to ${options.output}\n`);
    }
    return 0;
  } finally {
    closeDatabase(db);
  }
};
