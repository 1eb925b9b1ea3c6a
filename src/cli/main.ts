/**
 * The compfit command line: `compfit <command> [options]`. Each command lives in its own
 * module under commands/ and is loaded only when asked for, so `estimate` starts without
 * touching the database. Exit status: 0 success, 2 bad input (messages on stderr, nothing
 * written), 1 internal failure.
 */
import { InputError, type CliIo, type Command } from './cli-io.js';

const COMMANDS: Record<string, { summary: string; load: () => Promise<Command> }> = {
  estimate: {
    summary: 'estimate --sales FILE.csv --subject FILE.json [--predictors a,b] [--transform none|log] [--level 0.95] [--format json|text]',
    load: async () => (await import('./commands/estimate.js')).estimateCommand,
  },
};

/** Lets other modules add commands (import, export, serve, user …) without editing this table. */
export function registerCommand(name: string, summary: string, load: () => Promise<Command>): void {
  COMMANDS[name] = { summary, load };
}

function usage(): string {
  return ['usage: compfit <command> [options]', '', 'commands:', ...Object.values(COMMANDS).map((c) => `  ${c.summary}`)].join('\n');
}

export async function runCli(argv: string[], io: CliIo): Promise<number> {
  await import('./commands/index.js');
  const [name, ...rest] = argv;
  if (!name || name === '--help' || name === 'help') {
    io.stdout(usage() + '\n');
    return name ? 0 : 2;
  }
  const entry = COMMANDS[name];
  if (!entry) {
    io.stderr(`compfit: unknown command "${name}"\n${usage()}\n`);
    return 2;
  }
  try {
    const command = await entry.load();
    return await command(rest, io);
  } catch (err) {
    if (err instanceof InputError) {
      for (const p of err.problems) io.stderr(`compfit ${name}: ${p}\n`);
      return 2;
    }
    io.stderr(`compfit ${name}: internal error: ${(err as Error).stack ?? String(err)}\n`);
    return 1;
  }
}
