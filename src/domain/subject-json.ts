/**
 * Reads the subject JSON of DESIGN.md "Subject": `{ "address", "effective_date", and the
 * CSV's characteristic names }`. Numbers may be JSON numbers or plain numeric strings.
 * Each bad field gets one message naming it.
 */
import { z } from 'zod';
import { CHARACTERISTICS, type Characteristics, type Subject } from './sale.js';
import { checkCharacteristic, parseIsoDate, type Validated } from './validate-sale.js';

const subjectShape = z.object({
  address: z.string().trim().min(1, 'address is required').max(200, 'address is longer than 200 characters'),
  effective_date: z.string({ error: 'effective_date is required (YYYY-MM-DD)' }),
}).catchall(z.unknown());

export function parseSubject(input: unknown): Validated<Subject> {
  const errors: Record<string, string> = {};
  if (typeof input !== 'object' || input === null || Array.isArray(input))
    return { ok: false, errors: { subject: 'the subject must be a JSON object' } };
  const parsed = subjectShape.safeParse(input);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const field = String(issue.path[0] ?? 'subject');
      errors[field] ??= issue.code === 'invalid_type' && field === 'address' ? 'address is required' : issue.message;
    }
  }
  const raw = input as Record<string, unknown>;
  const effectiveDate = typeof raw.effective_date === 'string' ? parseIsoDate(raw.effective_date.trim()) : undefined;
  if (typeof raw.effective_date === 'string' && !effectiveDate && !errors.effective_date)
    errors.effective_date = `effective_date must be a real date as YYYY-MM-DD, got "${raw.effective_date}"`;
  const year = effectiveDate ? Number(effectiveDate.slice(0, 4)) : undefined;
  const characteristics: Characteristics = {};
  for (const name of CHARACTERISTICS) {
    const v = raw[name];
    if (v === undefined || v === null || v === '') continue;
    if (typeof v !== 'number' && typeof v !== 'string') {
      errors[name] = `${name} must be a number`;
      continue;
    }
    const r = checkCharacteristic(name, String(v).trim(), year);
    if ('error' in r) errors[name] = r.error.replace('after the year of sale', 'after the effective date');
    else characteristics[name] = r.value;
  }
  const known = new Set<string>(['address', 'effective_date', ...CHARACTERISTICS]);
  for (const key of Object.keys(raw)) if (!known.has(key)) errors[key] = `${key} is not a subject field (use ${[...known].join(', ')})`;
  if (Object.keys(errors).length > 0) return { ok: false, errors };
  return { ok: true, value: { address: String(raw.address).trim(), effectiveDate: effectiveDate!, characteristics } };
}
