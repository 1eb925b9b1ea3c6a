/**
 * What a command needs from the outside world, passed in so tests can run commands
 * in-process and read exactly what was printed.
 */
export interface CliIo {
  stdout: (text: string) => void;
  stderr: (text: string) => void;
  /** Reads all of standard input (used for passwords and `-` file arguments). */
  readStdin: () => Promise<string>;
  /** Asks at the terminal without echoing what is typed; present only when standard input is a terminal. */
  readSecret?: (prompt: string) => Promise<string>;
  env: Record<string, string | undefined>;
  cwd: string;
}

/** Bad input from the user: exit status 2, one message per problem, nothing written. */
export class InputError extends Error {
  constructor(public readonly problems: string[]) {
    super(problems.join('\n'));
    this.name = 'InputError';
  }
}

/** A command: gets the arguments after its name; returns the exit status. */
export type Command = (args: string[], io: CliIo) => Promise<number>;

/**
 * Parses `--name value` and `--name=value` options and positional arguments. Unknown
 * options are an InputError naming them.
 */
export function parseOptions(
  args: string[],
  known: readonly string[],
  flags: readonly string[] = [],
): { options: Record<string, string>; positional: string[] } {
  const options: Record<string, string> = {};
  const positional: string[] = [];
  const problems: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (!a.startsWith('--')) {
      positional.push(a);
      continue;
    }
    const eq = a.indexOf('=');
    const name = eq >= 0 ? a.slice(2, eq) : a.slice(2);
    if (flags.includes(name)) {
      options[name] = 'true';
      continue;
    }
    if (!known.includes(name)) {
      problems.push(`unknown option --${name}`);
      continue;
    }
    const value = eq >= 0 ? a.slice(eq + 1) : args[++i];
    if (value === undefined) problems.push(`option --${name} needs a value`);
    else options[name] = value;
  }
  if (problems.length > 0) throw new InputError(problems);
  return { options, positional };
}
