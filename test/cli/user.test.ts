/**
 * `compfit user …`: the password from standard input or asked twice at a terminal, the
 * stored scrypt hash with its salt and parameters, the rules on names and passwords
 * (exit 2, nothing written), list, password change and removal ending sessions, and
 * `compfit serve` refusing other machines until a user exists.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { openDatabase, closeDatabase, type Database } from '../../src/store/database.js';
import { migrateDatabase } from '../../src/store/migrate.js';
import { verifyPassword } from '../../src/store/password-hash.js';
import { users } from '../../src/store/schema.js';
import { createSession, findSession } from '../../src/store/sessions-repo.js';
import { checkPassword, findUserByName } from '../../src/store/users-repo.js';
import { cli } from '../helpers/cli.js';

const PASSWORD = 'correct horse battery staple';
const repo = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

let dir: string;
let env: Record<string, string>;
beforeEach(() => {
  dir = mkdtempSync(path.join(tmpdir(), 'compfit-user-'));
  env = { DATABASE_URL: 'file:users.db' };
});
afterEach(() => rmSync(dir, { recursive: true, force: true }));

async function withDb<T>(work: (db: Database) => Promise<T>): Promise<T> {
  const db = await openDatabase({ url: `file:${path.join(dir, 'users.db')}` });
  await migrateDatabase(db);
  try {
    return await work(db);
  } finally {
    closeDatabase(db);
  }
}

const user = (args: string[], stdin = '') => cli(['user', ...args], { cwd: dir, env, stdin });

/** Runs the command as at a terminal: each prompt answered in turn. */
async function atTerminal(args: string[], answers: string[]) {
  let stdout = '';
  let stderr = '';
  const prompts: string[] = [];
  const code = await runCli(['user', ...args], {
    stdout: (s) => (stdout += s),
    stderr: (s) => (stderr += s),
    readStdin: async () => {
      throw new Error('standard input must not be read at a terminal');
    },
    readSecret: async (prompt) => {
      prompts.push(prompt);
      const a = answers.shift();
      if (a === undefined) throw new Error('cancelled at the prompt');
      return a;
    },
    env,
    cwd: dir,
  });
  return { code, stdout, stderr, prompts };
}

describe('compfit user add', () => {
  it('reads the password from the first line of standard input and stores only a salted scrypt hash', async () => {
    const r = await user(['add', 'Ana Ferreira'], `${PASSWORD}\r\nignored second line\n`);
    expect(r).toEqual({ code: 0, stdout: 'added user "Ana Ferreira"\n', stderr: '' });
    await withDb(async (db) => {
      const [row] = await db.select().from(users);
      expect(row.name).toBe('Ana Ferreira');
      expect(row.passwordHash).toMatch(/^scrypt\$32768\$8\$1\$[A-Za-z0-9+/]{43}=$/);
      expect(Buffer.from(row.salt, 'base64')).toHaveLength(16);
      expect(row.passwordHash + row.salt).not.toContain(PASSWORD);
      expect(await verifyPassword(PASSWORD, { hash: row.passwordHash, salt: row.salt })).toBe(true);
      expect(await verifyPassword(`${PASSWORD}\r`, { hash: row.passwordHash, salt: row.salt })).toBe(false);
      expect(await checkPassword(db, 'ANA FERREIRA', PASSWORD)).toMatchObject({ name: 'Ana Ferreira' });
    });
  });

  it('gives two users with the same password different salts and hashes', async () => {
    await user(['add', 'ana'], PASSWORD);
    await user(['add', 'bo'], PASSWORD);
    await withDb(async (db) => {
      const [a, b] = await db.select().from(users);
      expect(a.salt).not.toBe(b.salt);
      expect(a.passwordHash).not.toBe(b.passwordHash);
    });
  });

  it('asks twice at a terminal, and refuses two different answers', async () => {
    const differ = await atTerminal(['add', 'ana'], [PASSWORD, `${PASSWORD}!`]);
    expect(differ).toMatchObject({ code: 2, stderr: 'compfit user: the two passwords differ; nothing was changed\n' });
    expect(differ.prompts).toEqual(['Password for ana (at least 15 characters): ', 'The same password again: ']);
    const short = await atTerminal(['add', 'ana'], ['short one']);
    expect(short.code).toBe(2);
    expect(short.prompts).toHaveLength(1); // a too-short password is refused before asking again
    const cancelled = await atTerminal(['add', 'ana'], []);
    expect(cancelled).toMatchObject({ code: 2, stderr: 'compfit user: no password given (cancelled at the prompt)\n' });
    expect(await withDb(async (db) => db.select().from(users))).toEqual([]);
    const ok = await atTerminal(['add', 'ana'], [PASSWORD, PASSWORD]);
    expect(ok).toMatchObject({ code: 0, stdout: 'added user "ana"\n' });
  });

  it('refuses bad input with exit 2, one message each, and writes nothing', async () => {
    const cases: [string[], string, string][] = [
      [['add', 'ana'], 'only fourteen!', 'compfit user: the password must have at least 15 characters (it has 14); a few words make a good one\n'],
      [['add', 'ana'], '', 'compfit user: no password on standard input (give it as the first line, or run at a terminal to be asked)\n'],
      [['add', '<script>'], PASSWORD, `compfit user: the name "<script>" may hold only letters, digits, spaces and . ' @ _ - (starting with a letter or digit)\n`],
      [['add', '   '], PASSWORD, 'compfit user: the name is empty\n'],
      [['add', 'x'.repeat(65)], PASSWORD, 'compfit user: the name is longer than 64 characters\n'],
      [['add'], PASSWORD, 'compfit user: user add needs exactly one NAME\ncompfit user: usage: compfit user add NAME | user password NAME | user remove NAME | user list\n'],
      [['add', 'Ana', 'Ferreira'], PASSWORD, expect.stringContaining('user add needs exactly one NAME (got 2; quote a name with spaces)') as unknown as string],
      [['rename', 'ana'], '', expect.stringContaining('unknown user action "rename"') as unknown as string],
    ];
    for (const [args, stdin, stderr] of cases) {
      const r = await user(args, stdin);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.stderr, args.join(' ')).toEqual(stderr);
    }
    expect(await withDb(async (db) => db.select().from(users))).toEqual([]);
  });

  it('refuses a name already taken, in any case', async () => {
    expect((await user(['add', 'Ana'], PASSWORD)).code).toBe(0);
    expect(await user(['add', 'ANA'], PASSWORD)).toMatchObject({ code: 2, stderr: 'compfit user: a user named "ANA" already exists\n' });
  });

  it('works through the installed program with the password piped in', () => {
    const r = spawnSync(process.execPath, [path.join(repo, 'bin', 'compfit.js'), 'user', 'add', 'piped user'], {
      cwd: dir,
      env: { ...process.env, DATABASE_URL: 'file:users.db' },
      input: `${PASSWORD}\n`,
      encoding: 'utf8',
    });
    expect(r.stderr).toBe('');
    expect(r.stdout).toBe('added user "piped user"\n');
    expect(r.status).toBe(0);
  }, 20_000);
});

describe('compfit user list, password, remove', () => {
  it('lists users with their current sessions; a new password and removal end the sessions', async () => {
    expect((await user(['list'])).stdout).toBe('no users yet (add one with: compfit user add NAME)\n');
    await user(['add', 'Bo Lindqvist'], PASSWORD);
    await user(['add', 'Ana Ferreira'], PASSWORD);
    const token = await withDb(async (db) => (await createSession(db, (await findUserByName(db, 'ana ferreira'))!.id)).token);
    const list = await user(['list']);
    expect(list.code).toBe(0);
    expect(list.stdout).toMatch(/^Ana Ferreira\tadded \d{4}-\d\d-\d\d\t1 session\nBo Lindqvist\tadded \d{4}-\d\d-\d\d\t0 sessions\n$/);

    const changed = await user(['password', 'ana ferreira'], 'a brand new long password');
    expect(changed).toMatchObject({ code: 0, stdout: 'changed the password of "ana ferreira" and ended their sessions\n' });
    await withDb(async (db) => {
      expect(await findSession(db, token)).toBeUndefined();
      expect(await checkPassword(db, 'Ana Ferreira', PASSWORD)).toBeUndefined();
      expect(await checkPassword(db, 'Ana Ferreira', 'a brand new long password')).toBeDefined();
    });
    expect((await user(['password', 'nobody'], PASSWORD)).stderr).toBe('compfit user: there is no user named "nobody"\n');

    expect(await user(['remove', 'Bo Lindqvist'])).toMatchObject({ code: 0, stdout: 'removed user "Bo Lindqvist" and ended their sessions\n' });
    expect(await user(['remove', 'Bo Lindqvist'])).toMatchObject({ code: 2, stderr: 'compfit user: there is no user named "Bo Lindqvist"\n' });
    expect((await user(['list'])).stdout).toMatch(/^Ana Ferreira\t/);
  });
});

describe('compfit serve', () => {
  it('refuses a HOST other machines reach while there is no user, with exit 2 and how to add one', async () => {
    const r = await cli(['serve', '--host', '0.0.0.0', '--port', '0'], { cwd: dir, env });
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('compfit serve: HOST 0.0.0.0 can be reached from other machines, so every page needs a sign-in, but there is no user yet. Add one first with `compfit user add NAME`');
  });
});
