/**
 * The web app as users run it: `src/server.ts` in its own Node process on an embedded
 * database file, on a free port. Durability tests kill it, run two of it, or back up its
 * database while it serves.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const REPO_ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

export interface AppProcess {
  url: string;
  child: ChildProcess;
  /** Everything the process printed so far (stdout and stderr). */
  output: () => string;
  /** Resolves when the process has exited, with its exit code or the signal that ended it. */
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
  /** SIGTERM and wait (the server closes its database cleanly). */
  stop: () => Promise<void>;
}

/** A port free right now, so a restarted app can come back at the same address (its cookies still apply). */
export async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as { port: number };
  await new Promise((resolve) => server.close(resolve));
  return port;
}

/** Runs `node --import tsx src/server.ts` (or another entry) and waits until it serves. */
export async function startAppProcess(options: {
  databaseUrl: string;
  env?: Record<string, string>;
  entry?: string[];
  startTimeoutMs?: number;
}): Promise<AppProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', ...(options.entry ?? ['src/server.ts'])], {
    cwd: REPO_ROOT,
    env: { ...process.env, PORT: '0', HOST: '127.0.0.1', ...options.env, DATABASE_URL: options.databaseUrl },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout!.on('data', (d: Buffer) => (output += d.toString()));
  child.stderr!.on('data', (d: Buffer) => (output += d.toString()));
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    child.once('exit', (code, signal) => resolve({ code, signal })),
  );
  const url = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => {
      child.kill('SIGKILL');
      reject(new Error(`the app did not start within ${options.startTimeoutMs ?? 30_000} ms:\n${output}`));
    }, options.startTimeoutMs ?? 30_000);
    const onData = () => {
      const m = /serving on (http:\/\/[^\s]+)/.exec(output);
      if (m) {
        clearTimeout(timer);
        child.stdout!.off('data', onData);
        child.stderr!.off('data', onData);
        resolve(m[1]);
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    void exited.then(({ code, signal }) => {
      clearTimeout(timer);
      reject(new Error(`the app exited before serving (code ${code}, signal ${signal}):\n${output}`));
    });
  });
  return {
    url,
    child,
    output: () => output,
    exited,
    stop: async () => {
      if (child.exitCode === null && child.signalCode === null) child.kill('SIGTERM');
      await exited;
    },
  };
}
