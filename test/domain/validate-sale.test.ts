import { describe, expect, it } from 'vitest';
import { parseIsoDate, parsePrice, validateSale } from '../../src/domain/validate-sale.js';

const base = { address: '4 Quill Row', sale_date: '2024-05-02', sale_price: '$312,500' };

describe('validateSale', () => {
  it('accepts a price with a currency sign and thousands separators (DESIGN.md "CSV of sales")', () => {
    const r = validateSale({ ...base, living_area: '1760', bathrooms: '2.5' });
    expect(r.ok && r.value).toMatchObject({ salePrice: 312500, characteristics: { living_area: 1760, bathrooms: 2.5 }, included: true });
  });
  it('other numbers are plain decimals; a thousands separator is named as the problem', () => {
    const r = validateSale({ ...base, living_area: '1,760' });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.living_area).toBe('living_area must be a plain number without thousands separators, got "1,760"');
  });
  it('names each bad field once', () => {
    const r = validateSale({ address: ' ', sale_date: '2024-02-30', sale_price: '0', rooms: '0', bathrooms: '1.25', year_built: '2030', included: 'maybe' });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(Object.keys(r.errors).sort()).toEqual(['address', 'bathrooms', 'included', 'rooms', 'sale_date', 'sale_price']);
    expect(r.errors.bathrooms).toMatch(/steps of 0.5/);
  });
  it('an excluded sale needs its reason', () => {
    const r = validateSale({ ...base, included: 'no' });
    expect(!r.ok && r.errors.excluded_reason).toBe('an excluded sale needs a reason');
  });
  it('parses only real calendar dates and well-formed prices', () => {
    expect(parseIsoDate('2024-02-29')).toBe('2024-02-29');
    expect(parseIsoDate('2023-02-29')).toBeUndefined();
    expect(parsePrice('1,250,000.50')).toBe(1250000.5);
    expect(parsePrice('12,50')).toBeUndefined();
  });
});
