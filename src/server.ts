/**
 * Node entry of the web app and the only reader of the environment (DESIGN.md
 * "Configuration"): PORT (3000), HOST (127.0.0.1), DATABASE_URL (an embedded file by
 * default, or a libSQL server URL), DATABASE_AUTH_TOKEN, and TRUST_PROXY (set when a TLS
 * proxy forwards requests here: its X-Forwarded-* headers are then believed, and sign-in
 * is required). It opens and migrates the database, puts the demo market into an empty
 * one, and serves the app. A HOST other machines can reach, or TRUST_PROXY, needs a user
 * first (`compfit user add NAME`); without one the server refuses to start. WORKERS (1) runs
 * that many app processes on the one port and database (server-workers.ts).
 */
import { serve, type ServerType } from '@hono/node-server';
import cluster from 'node:cluster';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { createApp } from './app.js';
import { runWorker, serveWithWorkers } from './server-workers.js';
import { closeDatabase, openDatabase, type Database } from './store/database.js';
import { seedDemoIfEmpty } from './store/demo-market.js';
import { migrateDatabase } from './store/migrate.js';
import { countUsers } from './store/users-repo.js';
import { accessPolicyFor } from './web/middleware/access-policy.js';

export interface Config {
  port: number;
  host: string;
  databaseUrl: string;
  databaseAuthToken?: string;
  /** A proxy in front: believe its X-Forwarded-* headers, and require sign-in. */
  trustProxy?: boolean;
  /** Time limits on a connection (defaults in REQUEST_TIMEOUTS); tests shorten them. */
  timeouts?: Partial<typeof REQUEST_TIMEOUTS>;
  /** App processes sharing the port and the database (WORKERS, default 1); see server-workers.ts. */
  workers?: number;
}

/**
 * A client must send its request head within 20 s and the whole request (a 20 MB upload
 * included) within 2 minutes, or Node answers 408 and closes the connection; this keeps
 * slow or stalled clients from holding connections. Limits are checked every second.
 */
export const REQUEST_TIMEOUTS = { headersMs: 20_000, requestMs: 120_000, checkEveryMs: 1_000 };

export const DEFAULT_DATABASE_URL = 'file:data/compfit.db';
export const MAX_WORKERS = 64;
/** This file, which worker processes run (server-workers.ts). */
export const SERVER_ENTRY = fileURLToPath(import.meta.url);

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
  const proxy = (env.TRUST_PROXY ?? '').trim().toLowerCase();
  if (!['', '0', 'false', 'no', '1', 'true', 'yes'].includes(proxy)) throw new ConfigError(`TRUST_PROXY must be 1/true/yes or 0/false/no, got "${env.TRUST_PROXY}"`);
  const trustProxy = ['1', 'true', 'yes'].includes(proxy);
  const workersText = env.WORKERS?.trim() || '1';
  const workers = Number(workersText);
  if (!/^\d+$/.test(workersText) || workers < 1 || workers > MAX_WORKERS) throw new ConfigError(`WORKERS must be a whole number from 1 to ${MAX_WORKERS}, got "${env.WORKERS}"`);
  return {
    port,
    host: env.HOST?.trim() || '127.0.0.1',
    databaseUrl,
    ...(token ? { databaseAuthToken: token } : {}),
    ...(trustProxy ? { trustProxy } : {}),
    ...(workers > 1 ? { workers } : {}),
  };
}

/** Serving other machines needs someone to sign in as; say how to add them. */
async function checkSomeoneCanSignIn(db: Database, config: Config): Promise<void> {
  if ((await countUsers(db)) > 0) return;
  const why = config.trustProxy ? 'TRUST_PROXY is set (a proxy forwards other machines\' requests here)' : `HOST ${config.host} can be reached from other machines`;
  throw new ConfigError(
    `${why}, so every page needs a sign-in, but there is no user yet. Add one first with \`compfit user add NAME\` ` +
      `(\`npm run compfit -- user add NAME\`; it asks for the password), then start again. ` +
      'To serve only this computer without sign-in, leave HOST unset (127.0.0.1) and TRUST_PROXY unset.',
  );
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

/**
 * Opens and migrates the database, makes sure someone can sign in where that is needed, and
 * (unless `seedDemo` is false) puts the demo market into a database that has no market yet.
 */
export async function prepareDatabase(config: Config, log: (line: string) => void, options: { seedDemo?: boolean } = {}) {
  const db = await openConfiguredDatabase(config);
  const access = accessPolicyFor(config.host, config.trustProxy ?? false);
  if (access.signInRequired) {
    try {
      await checkSomeoneCanSignIn(db, config);
    } catch (err) {
      closeDatabase(db);
      throw err;
    }
  }
  if (options.seedDemo !== false && (await seedDemoIfEmpty(db))) log('compfit: empty database, added the demo market');
  return { db, access };
}

/** Starts the app in this process (several: server-workers.ts); the demo market goes into an empty database. */
export async function startServer(config: Config, log: (line: string) => void = console.log, options: { seedDemo?: boolean } = {}): Promise<RunningServer> {
  const { db, access } = await prepareDatabase(config, log, options);
  const app = createApp({ db, access });
  const timeouts = { ...REQUEST_TIMEOUTS, ...config.timeouts };
  const serverOptions = { headersTimeout: timeouts.headersMs, requestTimeout: timeouts.requestMs, connectionsCheckingInterval: timeouts.checkEveryMs };
  const server = await new Promise<ServerType>((resolve) => {
    const s = serve({ fetch: app.fetch, port: config.port, hostname: config.host, serverOptions }, () => resolve(s));
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.port;
  const url = `http://${config.host.includes(':') ? `[${config.host}]` : config.host}:${port}`;
  log(`compfit: serving on ${url} (database ${config.databaseUrl.replace(/\/\/[^@/]*@/, '//')}; ${access.signInRequired ? 'sign-in required' : 'this computer only, no sign-in'})`);
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
if (isMain && cluster.isWorker) await runWorker();
else if (isMain) {
  try {
    const running = await serveWithWorkers(readConfig(process.env));
    const stop = () => void running.close().then(() => process.exit(0));
    process.once('SIGINT', stop);
    process.once('SIGTERM', stop);
  } catch (err) {
    console.error(err instanceof ConfigError ? `compfit: ${err.message}` : err);
    process.exit(err instanceof ConfigError ? 2 : 1);
  }
}
