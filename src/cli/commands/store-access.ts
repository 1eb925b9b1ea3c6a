/**
 * How the store commands (import, export, seed) reach the database: DATABASE_URL and
 * DATABASE_AUTH_TOKEN from the environment the command line was given, a relative file
 * path taken from the command's working directory, migrations applied first.
 */
import path from 'node:path';
import { ConfigError, openConfiguredDatabase, readConfig } from '../../server.js';
import type { Database } from '../../store/database.js';
import { embeddedFilePath, isEmbeddedFileUrl } from '../../store/database.js';
import { findMarketByName, listMarkets, type Market } from '../../store/markets-repo.js';
import { InputError, type CliIo } from '../cli-io.js';

/** The configuration from the environment; a bad setting is bad input (exit 2). */
export function cliConfig(io: CliIo): ReturnType<typeof readConfig> {
  try {
    return readConfig(io.env);
  } catch (err) {
    if (err instanceof ConfigError) throw new InputError([err.message]);
    throw err;
  }
}

export async function openCliDatabase(io: CliIo): Promise<Database> {
  let config = cliConfig(io);
  const url = config.databaseUrl;
  if (isEmbeddedFileUrl(url) && !path.isAbsolute(embeddedFilePath(url)))
    config = { ...config, databaseUrl: `file:${path.resolve(io.cwd, embeddedFilePath(url))}` };
  return openConfiguredDatabase(config);
}

/** The market of that name, or an InputError listing the names there are. */
export async function requireMarket(db: Database, name: string): Promise<Market> {
  const market = await findMarketByName(db, name);
  if (market) return market;
  const names = (await listMarkets(db)).map((m) => `"${m.name}"`);
  throw new InputError([`there is no market named "${name}"${names.length ? `; markets: ${names.join(', ')}` : '; there are no markets yet'}`]);
}
