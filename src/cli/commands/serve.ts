/**
 * `compfit serve [--port N] [--host H] [--workers N]`: runs the web app (the same as
 * `npm start`) until interrupted. Options override PORT, HOST and WORKERS.
 */
import { ConfigError, readConfig } from '../../server.js';
import { serveWithWorkers } from '../../server-workers.js';
import { InputError, parseOptions, type Command } from '../cli-io.js';

export const serveCommand: Command = async (args, io) => {
  const { options, positional } = parseOptions(args, ['port', 'host', 'workers']);
  if (positional.length > 0) throw new InputError([`unexpected argument "${positional[0]}"`]);
  let config;
  try {
    config = readConfig({
      ...io.env,
      ...(options.port ? { PORT: options.port } : {}),
      ...(options.host ? { HOST: options.host } : {}),
      ...(options.workers ? { WORKERS: options.workers } : {}),
    });
  } catch (err) {
    if (err instanceof ConfigError) throw new InputError([err.message.replace(/^PORT/, '--port').replace(/^WORKERS/, options.workers ? '--workers' : 'WORKERS')]);
    throw err;
  }
  let running;
  try {
    running = await serveWithWorkers(config, (line) => io.stderr(`${line}\n`));
  } catch (err) {
    // Refusing to start (no user to sign in as, say) is the user's to fix: exit 2 with the reason.
    if (err instanceof ConfigError) throw new InputError([err.message]);
    throw err;
  }
  await new Promise<void>((resolve) => {
    const stop = () => resolve();
    process.once('SIGINT', stop);
    process.once('SIGTERM', stop);
  });
  await running.close();
  return 0;
};
