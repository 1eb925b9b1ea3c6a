/**
 * `compfit user add NAME`, `user password NAME`, `user remove NAME`, `user list`: the
 * people who may sign in when the app serves other machines. A password is asked twice at
 * the terminal (not shown), or read as the first line of standard input when that is not a
 * terminal (`printf '%s\n' "$PASSWORD" | compfit user add ana`). Bad input: exit 2,
 * nothing written.
 */
import { closeDatabase, type Database } from '../../store/database.js';
import { addUser, listUsers, MIN_PASSWORD_LENGTH, passwordProblem, removeUser, setPassword, validateUserName } from '../../store/users-repo.js';
import { InputError, parseOptions, type CliIo, type Command } from '../cli-io.js';
import { openCliDatabase } from './store-access.js';

const USAGE = 'usage: compfit user add NAME | user password NAME | user remove NAME | user list';

async function readNewPassword(io: CliIo, name: string): Promise<string> {
  if (io.readSecret) {
    let first: string;
    let second: string;
    try {
      first = await io.readSecret(`Password for ${name} (at least ${MIN_PASSWORD_LENGTH} characters): `);
      const weak = passwordProblem(first);
      if (weak) throw new InputError([weak]);
      second = await io.readSecret('The same password again: ');
    } catch (err) {
      if (err instanceof InputError) throw err;
      throw new InputError([`no password given (${(err as Error).message})`]);
    }
    if (first !== second) throw new InputError(['the two passwords differ; nothing was changed']);
    return first;
  }
  const text = await io.readStdin();
  // The first line is the password; a trailing newline (or \r\n) is not part of it.
  const line = text.split(/\r?\n/)[0] ?? '';
  if (line === '') throw new InputError(['no password on standard input (give it as the first line, or run at a terminal to be asked)']);
  return line;
}

function oneName(args: string[], action: string): string {
  if (args.length !== 1) throw new InputError([`user ${action} needs exactly one NAME${args.length > 1 ? ` (got ${args.length}; quote a name with spaces)` : ''}`, USAGE]);
  return args[0];
}

async function withDatabase<T>(io: CliIo, work: (db: Database) => Promise<T>): Promise<T> {
  const db = await openCliDatabase(io);
  try {
    return await work(db);
  } finally {
    closeDatabase(db);
  }
}

export const userCommand: Command = async (args, io) => {
  const [action, ...rest] = args;
  const { positional } = parseOptions(rest, []);
  switch (action) {
    case 'add': {
      const name = oneName(positional, 'add');
      const checked = validateUserName(name);
      if (!checked.ok) throw new InputError([checked.error]);
      const password = await readNewPassword(io, checked.value);
      return withDatabase(io, async (db) => {
        const r = await addUser(db, checked.value, password);
        if (!r.ok) throw new InputError(Object.values(r.errors));
        io.stdout(`added user "${r.user.name}"\n`);
        return 0;
      });
    }
    case 'password': {
      const name = oneName(positional, 'password');
      const password = await readNewPassword(io, name.trim());
      return withDatabase(io, async (db) => {
        const r = await setPassword(db, name, password);
        if (!r.ok) throw new InputError(Object.values(r.errors));
        io.stdout(`changed the password of "${name.trim()}" and ended their sessions\n`);
        return 0;
      });
    }
    case 'remove': {
      const name = oneName(positional, 'remove');
      return withDatabase(io, async (db) => {
        if (!(await removeUser(db, name))) throw new InputError([`there is no user named "${name.trim()}"`]);
        io.stdout(`removed user "${name.trim()}" and ended their sessions\n`);
        return 0;
      });
    }
    case 'list': {
      if (positional.length > 0) throw new InputError([`user list takes no arguments, got "${positional[0]}"`]);
      return withDatabase(io, async (db) => {
        const users = await listUsers(db);
        if (users.length === 0) io.stdout('no users yet (add one with: compfit user add NAME)\n');
        for (const u of users) io.stdout(`${u.name}\tadded ${u.createdAt.slice(0, 10)}\t${u.sessions} ${u.sessions === 1 ? 'session' : 'sessions'}\n`);
        return 0;
      });
    }
    default:
      throw new InputError([action ? `unknown user action "${action}"` : 'say what to do with users', USAGE]);
  }
};
