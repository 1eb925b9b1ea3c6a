/**
 * Node entry of the web app and the only reader of the environment (DESIGN.md
 * "Configuration"): PORT (3000), HOST (127.0.0.1), DATABASE_URL (an embedded file by
 * default, or a libSQL server URL), DATABASE_AUTH_TOKEN. It opens and migrates the
 * database, puts the demo market into an empty one, and serves the app.
 */
import { serve, type ServerType } from '@hono/node-server';
import { pathToFileURL } from 'node:url';
import { createApp } from './app.js';
import { closeDatabase, openDatabase, type Database } from './store/database.js';
import { seedDemoIfEmpty } from './store/demo-market.js';
import { migrateDatabase } from './store/migrate.js';

export interface Config {
  port: number;
  host: string;
  databaseUrl: string;
  databaseAuthToken?: string;
}

export const DEFAULT_DATABASE_URL = 'file:data/compfit.db';

export class ConfigError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ConfigError';
  }
}

export function readConfig(env: Record<string, string | undefined>): Config {
  const portText = env.PORT?.trim() || '3000';
  const port = Number(portText);
  if (!/^\d+$/.test(portText) || port < 0 || port > 65535) throw new ConfigError(`PORT must be a whole number from 0 to 65535, got "${env.PORT}"`);
  const databaseUrl = env.DATABASE_URL?.trim() || DEFAULT_DATABASE_URL;
  if (!/^(file:|libsql:|https?:|wss?:|:memory:$)/.test(databaseUrl))
    throw new ConfigError(`DATABASE_URL must be a file:, libsql:, http: or https: URL, got "${databaseUrl}"`);
  const token = env.DATABASE_AUTH_TOKEN?.trim();
  return { port, host: env.HOST?.trim() || '127.0.0.1', databaseUrl, ...(token ? { databaseAuthToken: token } : {}) };
}

/** Opens the configured database and brings its schema up to date. */
export async function openConfiguredDatabase(config: Config): Promise<Database> {
  const db = await openDatabase({ url: config.databaseUrl, ...(config.databaseAuthToken ? { authToken: config.databaseAuthToken } : {}) });
  await migrateDatabase(db);
  return db;
}

export interface RunningServer {
  url: string;
  db: Database;
  close: () => Promise<void>;
}

/** Starts the app; `seedDemo` puts the demo market into a database that has no market yet. */
export async function startServer(config: Config, log: (line: string) => void = console.log): Promise<RunningServer> {
  const db = await openConfiguredDatabase(config);
  if (await seedDemoIfEmpty(db)) log('compfit: empty database, added the demo market');
  const app = createApp({ db });
  const server = await new Promise<ServerType>((resolve) => {
    const s = serve({ fetch: app.fetch, port: config.port, hostname: config.host }, () => resolve(s));
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.port;
  const url = `http://${config.host.includes(':') ? `[${config.host}]` : config.host}:${port}`;
  log(`compfit: serving on ${url} (database ${config.databaseUrl.replace(/\/\/[^@/]*@/, '//')})`);
  return {
    url,
    db,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => {
          closeDatabase(db);
          resolve();
        });
        // Idle keep-alive connections would hold close() open.
        if ('closeAllConnections' in server) server.closeAllConnections();
      }),
  };
}

const isMain = process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href;
if (isMain) {
  try {
    const running = await startServer(readConfig(process.env));
    const stop = () => void running.close().then(() => process.exit(0));
    process.once('SIGINT', stop);
    process.once('SIGTERM', stop);
  } catch (err) {
    console.error(err instanceof ConfigError ? `compfit: ${err.message}` : err);
    process.exit(err instanceof ConfigError ? 2 : 1);
  }
}
