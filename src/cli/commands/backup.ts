/**
 * `compfit backup FILE [--force]`: writes a consistent copy of the embedded database file,
 * safe while the app runs and writes. SQLite's `VACUUM INTO` reads one snapshot (a read
 * transaction; in WAL mode writers go on meanwhile) and writes it as a compact database
 * (https://www.sqlite.org/lang_vacuum.html#vacuuminto). The copy is written beside the
 * target under a temporary name, checked (`PRAGMA integrity_check`), flushed to disk and
 * only then renamed into place, so FILE is never half-written. An existing FILE is kept
 * unless --force. Restoring is described in README.md ("Backup and restore").
 */
import { closeSync, existsSync, fsyncSync, openSync, realpathSync, renameSync, rmSync, statSync } from 'node:fs';
import path from 'node:path';
import { createClient } from '@libsql/client';
import { cliConfig } from './store-access.js';
import { DEFAULT_BUSY_TIMEOUT_MS, embeddedFilePath, isEmbeddedFileUrl } from '../../store/database.js';
import { InputError, parseOptions, type Command } from '../cli-io.js';

const USAGE = 'compfit backup FILE [--force]';

/** Flushes a file (or a folder's entry list) to disk, so a crash right after cannot lose it. */
function flushToDisk(p: string): void {
  const fd = openSync(p, 'r');
  try {
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
}

/** Integrity and what the copy holds, read from the copy itself. */
async function checkCopy(file: string): Promise<{ integrity: string[]; markets: number; sales: number; estimates: number }> {
  const copy = createClient({ url: `file:${file}` });
  try {
    const count = async (table: string) => Number((await copy.execute(`select count(*) as n from "${table}"`)).rows[0].n);
    const integrity = (await copy.execute('PRAGMA integrity_check')).rows.map((r) => String(r.integrity_check));
    return { integrity, markets: await count('markets'), sales: await count('sales'), estimates: await count('estimates') };
  } finally {
    copy.close();
  }
}

export const backupCommand: Command = async (args, io) => {
  const { options, positional } = parseOptions(args, [], ['force']);
  if (positional.length !== 1) throw new InputError([positional.length === 0 ? `name the backup file: ${USAGE}` : `one backup file only: ${USAGE}`]);
  const config = cliConfig(io);
  if (!isEmbeddedFileUrl(config.databaseUrl))
    throw new InputError([
      `backup copies an embedded database file, and DATABASE_URL points at a libSQL server (${config.databaseUrl.replace(/\/\/[^@/]*@/, '//')}). ` +
        'Back that database up with the libSQL server’s own snapshot or dump tools, or save each market with compfit export --market NAME.',
    ]);

  const source = path.resolve(io.cwd, embeddedFilePath(config.databaseUrl));
  const target = path.resolve(io.cwd, positional[0]);
  const problems: string[] = [];
  if (!existsSync(source)) problems.push(`there is no database at ${source} (DATABASE_URL ${config.databaseUrl})`);
  if (!existsSync(path.dirname(target))) problems.push(`the folder ${path.dirname(target)} does not exist`);
  else if (existsSync(target)) {
    if (statSync(target).isDirectory()) problems.push(`${target} is a folder; name a file in it`);
    else if (existsSync(source) && realpathSync(target) === realpathSync(source)) problems.push(`${target} is the database itself; name another file`);
    else if (options.force !== 'true') problems.push(`${target} already exists; add --force to replace it`);
  }
  if (problems.length > 0) throw new InputError(problems);

  const partial = `${target}.partial-${process.pid}`;
  rmSync(partial, { force: true });
  // A plain connection: the copy only reads, so it need not wait for the app's writes as
  // openDatabase's writers do; the busy timeout covers the moment another process recovers the WAL.
  const db = createClient({ url: `file:${source}`, timeout: DEFAULT_BUSY_TIMEOUT_MS });
  try {
    await db.execute({ sql: 'VACUUM INTO ?', args: [partial] });
  } catch (err) {
    rmSync(partial, { force: true });
    throw err;
  } finally {
    db.close();
  }
  const copy = await checkCopy(partial);
  if (copy.integrity.join() !== 'ok') {
    rmSync(partial, { force: true });
    throw new Error(`the copy failed its integrity check (${copy.integrity.slice(0, 5).join('; ')}); nothing was written to ${target}`);
  }
  flushToDisk(partial);
  renameSync(partial, target);
  flushToDisk(path.dirname(target));
  const mb = (statSync(target).size / 1024 / 1024).toFixed(1);
  const counted = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
  io.stdout(
    `backed up ${source} to ${target}: ${counted(copy.markets, 'market', 'markets')}, ${counted(copy.sales, 'sale', 'sales')}, ` +
      `${counted(copy.estimates, 'saved estimate', 'saved estimates')}, ${mb} MB; integrity check ok\n`,
  );
  return 0;
};
