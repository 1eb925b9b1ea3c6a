/**
 * Password hashing with scrypt from node:crypto. The stored hash carries its cost
 * parameters (`scrypt$N$r$p$<base64 key>`), so they can be raised later without breaking
 * old hashes; the salt is 16 random bytes per user. Comparison is constant-time.
 *
 * Cost: N = 2^15, r = 8, p = 1 (32 MiB, about 0.1 s on one core here), the figure the Go
 * x/crypto/scrypt documentation recommends for interactive logins; RFC 7914 defines scrypt.
 */
import { randomBytes, scrypt, timingSafeEqual, type ScryptOptions } from 'node:crypto';

const COST = { N: 2 ** 15, r: 8, p: 1 };
const KEY_BYTES = 32;
const SALT_BYTES = 16;

function derive(password: string, salt: Buffer, cost: { N: number; r: number; p: number }): Promise<Buffer> {
  // scrypt needs 128·N·r bytes; Node's default ceiling (32 MiB) is just too small for N = 2^15.
  const options: ScryptOptions = { ...cost, maxmem: 256 * cost.N * cost.r };
  return new Promise((resolve, reject) => scrypt(password.normalize('NFC'), salt, KEY_BYTES, options, (err, key) => (err ? reject(err) : resolve(key))));
}

export interface PasswordHash {
  hash: string;
  salt: string;
}

export async function hashPassword(password: string): Promise<PasswordHash> {
  const salt = randomBytes(SALT_BYTES);
  const key = await derive(password, salt, COST);
  return { hash: `scrypt$${COST.N}$${COST.r}$${COST.p}$${key.toString('base64')}`, salt: salt.toString('base64') };
}

/** True when `password` matches; a hash in an unknown format never matches. */
export async function verifyPassword(password: string, stored: PasswordHash): Promise<boolean> {
  const m = /^scrypt\$(\d+)\$(\d+)\$(\d+)\$([A-Za-z0-9+/=]+)$/.exec(stored.hash);
  if (!m) return false;
  const [N, r, p] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const expected = Buffer.from(m[4], 'base64');
  if (expected.length !== KEY_BYTES || N > 2 ** 20 || r > 32 || p > 16) return false;
  const key = await derive(password, Buffer.from(stored.salt, 'base64'), { N, r, p });
  return timingSafeEqual(key, expected);
}

/** A hash of no one's password, checked when the name is unknown so both cases take the same time. */
let decoy: Promise<PasswordHash> | undefined;
export function decoyHash(): Promise<PasswordHash> {
  decoy ??= hashPassword(randomBytes(18).toString('base64'));
  return decoy;
}
