/**
 * People who sign in: add, list, remove, change a password, and check a name and password.
 * Names are matched ignoring case ("Ana" and "ana" are one person) and stored as typed;
 * the name is what the change history and saved estimates record.
 */
import { and, asc, count, eq, gt, sql } from 'drizzle-orm';
import type { Database } from './database.js';
import { decoyHash, hashPassword, verifyPassword } from './password-hash.js';
import { sessions, users } from './schema.js';

export interface User {
  id: number;
  name: string;
  createdAt: string;
}

/**
 * Single-factor passwords of at least 15 characters (NIST SP 800-63B-4, 3.1.1.2); no rules
 * on character classes. The upper bound only keeps a request small.
 */
export const MIN_PASSWORD_LENGTH = 15;
export const MAX_PASSWORD_LENGTH = 256;
export const MAX_NAME_LENGTH = 64;

export type UserErrors = Partial<Record<'name' | 'password', string>>;

/** A name: letters, digits, spaces and . ' @ _ - , starting with a letter or digit. */
export function validateUserName(raw: string): { ok: true; value: string } | { ok: false; error: string } {
  const name = raw.normalize('NFC').trim();
  if (name === '') return { ok: false, error: 'the name is empty' };
  if ([...name].length > MAX_NAME_LENGTH) return { ok: false, error: `the name is longer than ${MAX_NAME_LENGTH} characters` };
  if (!/^[\p{L}\p{N}][\p{L}\p{N} .'@_-]*$/u.test(name))
    return { ok: false, error: `the name "${name}" may hold only letters, digits, spaces and . ' @ _ - (starting with a letter or digit)` };
  return { ok: true, value: name };
}

export function passwordProblem(password: string): string | undefined {
  const length = [...password].length;
  if (length < MIN_PASSWORD_LENGTH) return `the password must have at least ${MIN_PASSWORD_LENGTH} characters (it has ${length}); a few words make a good one`;
  if (length > MAX_PASSWORD_LENGTH) return `the password must have at most ${MAX_PASSWORD_LENGTH} characters`;
  return undefined;
}

const byName = (name: string) => sql`lower(${users.name}) = lower(${name.normalize('NFC').trim()})`;

export async function findUserByName(db: Database, name: string): Promise<User | undefined> {
  const [u] = await db.select({ id: users.id, name: users.name, createdAt: users.createdAt }).from(users).where(byName(name)).limit(1);
  return u;
}

export async function countUsers(db: Database): Promise<number> {
  const [row] = await db.select({ n: count() }).from(users);
  return row?.n ?? 0;
}

/** Every user with the number of sessions still current. */
export async function listUsers(db: Database, now = new Date()): Promise<(User & { sessions: number })[]> {
  return db
    .select({ id: users.id, name: users.name, createdAt: users.createdAt, sessions: count(sessions.id) })
    .from(users)
    .leftJoin(sessions, and(eq(sessions.userId, users.id), gt(sessions.expiresAt, now.toISOString())))
    .groupBy(users.id)
    .orderBy(asc(users.name));
}

export async function addUser(db: Database, rawName: string, password: string): Promise<{ ok: true; user: User } | { ok: false; errors: UserErrors }> {
  const errors: UserErrors = {};
  const name = validateUserName(rawName);
  if (!name.ok) errors.name = name.error;
  else if (await findUserByName(db, name.value)) errors.name = `a user named "${name.value}" already exists`;
  const weak = passwordProblem(password);
  if (weak) errors.password = weak;
  if (!name.ok || errors.name || errors.password) return { ok: false, errors };
  const { hash, salt } = await hashPassword(password);
  const [user] = await db.insert(users).values({ name: name.value, passwordHash: hash, salt }).returning({ id: users.id, name: users.name, createdAt: users.createdAt });
  return { ok: true, user };
}

/** Sets a new password and ends the user's sessions, so an old password's sessions stop working. */
export async function setPassword(db: Database, name: string, password: string): Promise<{ ok: true } | { ok: false; errors: UserErrors }> {
  const user = await findUserByName(db, name);
  if (!user) return { ok: false, errors: { name: `there is no user named "${name.trim()}"` } };
  const weak = passwordProblem(password);
  if (weak) return { ok: false, errors: { password: weak } };
  const { hash, salt } = await hashPassword(password);
  await db.transaction(async (tx) => {
    await tx.update(users).set({ passwordHash: hash, salt }).where(eq(users.id, user.id));
    await tx.delete(sessions).where(eq(sessions.userId, user.id));
  });
  return { ok: true };
}

/** Removes a user and their sessions; false when there is no such user. */
export async function removeUser(db: Database, name: string): Promise<boolean> {
  const user = await findUserByName(db, name);
  if (!user) return false;
  await db.transaction(async (tx) => {
    await tx.delete(sessions).where(eq(sessions.userId, user.id));
    await tx.delete(users).where(eq(users.id, user.id));
  });
  return true;
}

/** The user when name and password match. An unknown name costs the same hashing time as a wrong password. */
export async function checkPassword(db: Database, name: string, password: string): Promise<User | undefined> {
  const [row] = await db.select().from(users).where(byName(name)).limit(1);
  if (!row || password.length > MAX_PASSWORD_LENGTH * 4) {
    await verifyPassword(password.slice(0, MAX_PASSWORD_LENGTH), await decoyHash());
    return undefined;
  }
  const ok = await verifyPassword(password, { hash: row.passwordHash, salt: row.salt });
  return ok ? { id: row.id, name: row.name, createdAt: row.createdAt } : undefined;
}
