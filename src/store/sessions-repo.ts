/**
 * Signed-in sessions, kept in the database so every app process sharing it knows them.
 * The browser holds a random token; the table holds only its SHA-256, so a copy of the
 * database (a backup, say) does not let anyone sign in as anybody.
 */
import { createHash, randomBytes } from 'node:crypto';
import { and, eq, gt, lte } from 'drizzle-orm';
import type { Database } from './database.js';
import { sessions, users } from './schema.js';

/** How long a session lasts without use; using it in its second half extends it. */
export const SESSION_LIFETIME_MS = 12 * 60 * 60 * 1000;

export function tokenDigest(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export interface SessionUser {
  userId: number;
  userName: string;
  expiresAt: string;
}

/** Starts a session and returns its token (to be sent to the browser once, in a cookie). */
export async function createSession(db: Database, userId: number, now = new Date()): Promise<{ token: string; expiresAt: string }> {
  const token = randomBytes(32).toString('base64url');
  const expiresAt = new Date(now.getTime() + SESSION_LIFETIME_MS).toISOString();
  // Each sign-in also clears sessions that ran out, so the table stays small without a timer.
  await db.delete(sessions).where(lte(sessions.expiresAt, now.toISOString()));
  await db.insert(sessions).values({ id: tokenDigest(token), userId, createdAt: now.toISOString(), expiresAt });
  return { token, expiresAt };
}

/** The session's user while the session is current; undefined for an unknown or expired token. */
export async function findSession(db: Database, token: string, now = new Date()): Promise<SessionUser | undefined> {
  const [row] = await db
    .select({ userId: users.id, userName: users.name, expiresAt: sessions.expiresAt })
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(and(eq(sessions.id, tokenDigest(token)), gt(sessions.expiresAt, now.toISOString())))
    .limit(1);
  return row;
}

/** Pushes the expiry out when less than half the lifetime is left; returns the new expiry, if any. */
export async function renewSession(db: Database, token: string, current: SessionUser, now = new Date()): Promise<string | undefined> {
  if (Date.parse(current.expiresAt) - now.getTime() > SESSION_LIFETIME_MS / 2) return undefined;
  const expiresAt = new Date(now.getTime() + SESSION_LIFETIME_MS).toISOString();
  await db.update(sessions).set({ expiresAt }).where(eq(sessions.id, tokenDigest(token)));
  return expiresAt;
}

export async function deleteSession(db: Database, token: string): Promise<void> {
  await db.delete(sessions).where(eq(sessions.id, tokenDigest(token)));
}
