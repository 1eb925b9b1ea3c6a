/**
 * Sign-in attempts, per name tried and per address, in the database so that every app
 * process sharing it counts the same attempts (a limit kept in memory would be one limit
 * per process).
 */
import { and, count, eq, gte, lt, min } from 'drizzle-orm';
import type { Database } from './database.js';
import { signInAttempts } from './schema.js';

export async function recordSignInAttempt(db: Database, attempt: { userName: string; address: string; succeeded: boolean; at: Date }, keepSince: Date): Promise<void> {
  await db.delete(signInAttempts).where(lt(signInAttempts.at, keepSince.toISOString()));
  await db.insert(signInAttempts).values({ userName: attempt.userName.toLowerCase(), address: attempt.address, succeeded: attempt.succeeded, at: attempt.at.toISOString() });
}

/** Failed attempts since `since` for the name (any address) or for the address (any name), with the oldest's time. */
export async function failedSignIns(db: Database, by: { userName: string } | { address: string }, since: Date): Promise<{ failures: number; oldest?: string }> {
  const who = 'userName' in by ? eq(signInAttempts.userName, by.userName.toLowerCase()) : eq(signInAttempts.address, by.address);
  const [row] = await db
    .select({ failures: count(), oldest: min(signInAttempts.at) })
    .from(signInAttempts)
    .where(and(who, eq(signInAttempts.succeeded, false), gte(signInAttempts.at, since.toISOString())));
  return { failures: row?.failures ?? 0, ...(row?.oldest ? { oldest: row.oldest } : {}) };
}
