/**
 * How many failed sign-ins are allowed: 5 per name (from any address) and 20 per address
 * (for any name) in 15 minutes. Past either, sign-in is refused without checking the
 * password until the oldest failure leaves the window. Counted in the database, so every
 * app process sharing it enforces one limit.
 */
import type { Database } from '../../store/database.js';
import { failedSignIns, recordSignInAttempt } from '../../store/sign-in-attempts-repo.js';

export const SIGN_IN_WINDOW_MS = 15 * 60 * 1000;
export const MAX_FAILURES_PER_NAME = 5;
export const MAX_FAILURES_PER_ADDRESS = 20;

export type SignInAllowance = { ok: true } | { ok: false; retryAfterSeconds: number; message: string };

/** The name as counted: trimmed, NFC, cut short (the repository lower-cases it). */
const counted = (name: string) => name.normalize('NFC').trim().slice(0, 256);

export async function signInAllowance(db: Database, name: string, address: string, now: Date): Promise<SignInAllowance> {
  const since = new Date(now.getTime() - SIGN_IN_WINDOW_MS);
  const checks = [
    { count: await failedSignIns(db, { userName: counted(name) }, since), max: MAX_FAILURES_PER_NAME, what: 'for this name' },
    { count: await failedSignIns(db, { address }, since), max: MAX_FAILURES_PER_ADDRESS, what: 'from this address' },
  ];
  for (const { count, max, what } of checks) {
    if (count.failures < max || !count.oldest) continue;
    const retryAfterSeconds = Math.max(1, Math.ceil((Date.parse(count.oldest) + SIGN_IN_WINDOW_MS - now.getTime()) / 1000));
    const minutes = Math.ceil(retryAfterSeconds / 60);
    return { ok: false, retryAfterSeconds, message: `Too many failed sign-ins ${what}. Try again in ${minutes} ${minutes === 1 ? 'minute' : 'minutes'}.` };
  }
  return { ok: true };
}

export async function noteSignIn(db: Database, name: string, address: string, succeeded: boolean, now: Date): Promise<void> {
  await recordSignInAttempt(db, { userName: counted(name), address, succeeded, at: now }, new Date(now.getTime() - SIGN_IN_WINDOW_MS));
}
