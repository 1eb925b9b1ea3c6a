/**
 * Several app processes on one port and one database (WORKERS=N, `compfit serve --workers N`).
 *
 * One Node process runs JavaScript on one core, and most of an estimate request's cost is
 * on its event loop (serialising and writing some 300 KB of JSON for a 500-sale market),
 * so a second core needs a second process. Node's cluster module lets worker processes
 * share the listening socket (the primary accepts connections and hands them out in turn);
 * the workers share the database file as any app processes may, and everything a request
 * can depend on (sessions, import previews, the revision that keys the fit cache) is in
 * the database, so any worker can answer any request.
 *
 * The primary prepares the database once (migrations, the sign-in check, the demo market)
 * before forking, reports one "serving on" line when every worker listens, starts a new
 * worker when one dies, and on SIGINT or SIGTERM stops the workers and waits for them.
 */
import cluster, { type Worker } from 'node:cluster';
import { ConfigError, prepareDatabase, SERVER_ENTRY, startServer, type Config } from './server.js';
import { closeDatabase } from './store/database.js';

const WORKER_CONFIG_ENV = 'COMPFIT_WORKER_CONFIG';
/** A worker that dies is replaced, but no faster than this, so a worker that cannot start does not spin. */
const RESTART_PAUSE_MS = 1000;

type WorkerMessage = { log: string } | { serving: string };

export interface ServingApp {
  url: string;
  close: () => Promise<void>;
}

/** Serves the app in this process, or, with `config.workers` above 1, in that many worker processes. */
export async function serveWithWorkers(config: Config, log: (line: string) => void = console.log): Promise<ServingApp> {
  const count = config.workers ?? 1;
  if (count <= 1) return startServer(config, log);

  const { db } = await prepareDatabase(config, log);
  closeDatabase(db);
  cluster.setupPrimary({ exec: SERVER_ENTRY, args: [] });
  const workers = new Set<Worker>();
  let stopping = false;
  let servingLine = '';

  const fork = (onServing: () => void) => {
    const worker = cluster.fork({ [WORKER_CONFIG_ENV]: JSON.stringify(config) });
    workers.add(worker);
    worker.on('message', (m: WorkerMessage) => {
      if ('serving' in m) {
        servingLine ||= m.serving;
        onServing();
      } else log(m.log);
    });
    return worker;
  };

  const url = await new Promise<string>((resolve, reject) => {
    let listening = 0;
    const onServing = () => {
      if (++listening === count) resolve(/serving on (\S+)/.exec(servingLine)?.[1] ?? '');
    };
    for (let i = 0; i < count; i++) fork(onServing);
    cluster.on('exit', (worker, code, signal) => {
      workers.delete(worker);
      if (stopping) return;
      if (listening < count) {
        stopping = true;
        for (const w of workers) w.process.kill('SIGTERM');
        reject(new Error(`a worker process stopped before it served (exit code ${code}, signal ${signal})`));
        return;
      }
      log(`compfit: worker process ${worker.process.pid} stopped (exit code ${code}, signal ${signal}); starting another`);
      setTimeout(() => !stopping && fork(() => {}), RESTART_PAUSE_MS);
    });
  });
  log(`${servingLine} in ${count} worker processes`);

  return {
    url,
    close: async () => {
      stopping = true;
      await Promise.all(
        [...workers].map(
          (w) =>
            new Promise<void>((resolve) => {
              if (w.isDead()) return resolve();
              w.once('exit', () => resolve());
              w.process.kill('SIGTERM');
            }),
        ),
      );
    },
  };
}

/** The body of a worker process: the app on the primary's configuration, the database already prepared. */
export async function runWorker(): Promise<void> {
  const config = JSON.parse(process.env[WORKER_CONFIG_ENV] ?? '{}') as Config;
  const send = (m: WorkerMessage) => process.send?.(m);
  try {
    const running = await startServer({ ...config, workers: 1 }, (line) => send(line.includes('serving on') ? { serving: line } : { log: line }), {
      seedDemo: false,
    });
    const stop = () => void running.close().then(() => process.exit(0));
    // Ctrl-C reaches the whole process group; the primary decides, and sends SIGTERM.
    process.on('SIGINT', () => {});
    process.once('SIGTERM', stop);
    // Without a primary (it was killed) nobody would stop this worker.
    process.once('disconnect', stop);
  } catch (err) {
    console.error(err instanceof ConfigError ? `compfit: ${err.message}` : err);
    process.exit(err instanceof ConfigError ? 2 : 1);
  }
}
