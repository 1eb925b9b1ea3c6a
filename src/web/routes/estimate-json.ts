/**
 * The JSON API's body for an estimate: exactly the UTF-8 bytes of JSON.stringify(result),
 * with less work per request. Serialising and writing the body is most of the request's
 * cost (about 290 KB for a 500-sale market), so:
 * - A result's `sales` (each sale's fitted value and influence measures, about 60% of the
 *   body) is the array of the cached fit, the same object whatever the subject
 *   (estimateFor spreads the fit summary into the result), so its bytes are encoded once
 *   and kept beside it in a WeakMap; they go when the fit leaves the cache.
 * - The other fields are encoded one by one, so a non-ASCII character in a warning does not
 *   turn the large grid into a two-byte string, which is slower to measure and encode.
 * - The body goes to the server as bytes with a known length, so it is not measured and
 *   encoded again on the way out.
 */
import type { EstimateResult } from '../../domain/estimate-result.js';

const encodedOnce = new WeakMap<object, Buffer>();

function encodedValue(key: string, value: unknown): Buffer {
  if (key === 'sales' && typeof value === 'object' && value !== null) {
    let bytes = encodedOnce.get(value);
    if (!bytes) encodedOnce.set(value, (bytes = Buffer.from(JSON.stringify(value))));
    return bytes;
  }
  return Buffer.from(JSON.stringify(value));
}

export function estimateJsonBytes(result: EstimateResult): Uint8Array<ArrayBuffer> {
  const parts: Buffer[] = [];
  let separator = '{';
  for (const [key, value] of Object.entries(result)) {
    // What JSON.stringify leaves out of an object.
    if (value === undefined || typeof value === 'function' || typeof value === 'symbol') continue;
    parts.push(Buffer.from(`${separator}${JSON.stringify(key)}:`), encodedValue(key, value));
    separator = ',';
  }
  parts.push(Buffer.from(separator === '{' ? '{}' : '}'));
  // A new Buffer over an ordinary (not shared) ArrayBuffer.
  return Buffer.concat(parts) as Uint8Array<ArrayBuffer>;
}
