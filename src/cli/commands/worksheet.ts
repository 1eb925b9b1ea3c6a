/**
 * `compfit worksheet --estimate ID --out FILE.pdf|FILE.csv`: writes the worksheet of a saved
 * estimate, the same file the web app serves, built from the saved snapshot alone. The
 * format follows the file's extension. An existing file is never overwritten.
 */
import { writeFile } from 'node:fs/promises';
import path from 'node:path';
import { closeDatabase } from '../../store/database.js';
import { findEstimate } from '../../store/estimates-repo.js';
import { worksheetDownload } from '../../worksheet/worksheet-download.js';
import { InputError, parseOptions, type Command } from '../cli-io.js';
import { openCliDatabase } from './store-access.js';

export const worksheetCommand: Command = async (args, io) => {
  const { options, positional } = parseOptions(args, ['estimate', 'out']);
  const problems: string[] = [];
  if (positional.length > 0) problems.push(`unexpected argument "${positional[0]}"`);
  const id = Number(options.estimate);
  if (options.estimate === undefined) problems.push('--estimate ID is required');
  else if (!/^\d+$/.test(options.estimate) || !Number.isSafeInteger(id) || id < 1)
    problems.push(`--estimate must be the number of a saved estimate, got "${options.estimate}"`);
  const extension = options.out ? path.extname(options.out).toLowerCase() : '';
  if (!options.out) problems.push('--out FILE.pdf (or FILE.csv) is required');
  else if (extension !== '.pdf' && extension !== '.csv') problems.push(`--out must end in .pdf or .csv, got "${options.out}"`);
  if (problems.length > 0) throw new InputError(problems);

  const db = await openCliDatabase(io);
  let saved;
  try {
    saved = await findEstimate(db, id);
  } finally {
    closeDatabase(db);
  }
  if (!saved) throw new InputError([`there is no saved estimate ${id}`]);

  const { body } = await worksheetDownload(saved, extension === '.pdf' ? 'pdf' : 'csv');
  try {
    await writeFile(path.resolve(io.cwd, options.out), body, { flag: 'wx' });
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    throw new InputError([code === 'EEXIST' ? `"${options.out}" already exists; choose another name` : `cannot write "${options.out}": ${code ?? (err as Error).message}`]);
  }
  io.stderr(`compfit worksheet: wrote the worksheet of estimate ${id} (${saved.subject.address}) to ${options.out}\n`);
  return 0;
};
