import { describe, expect, it } from 'vitest';
import { winAnsiText, wrapText } from '../../src/worksheet/pdf-text.js';

describe('text for the PDF standard fonts', () => {
  const usd = winAnsiText('USD');
  it('keeps Latin-1 and the Windows-1252 extras as they are', () => {
    expect(usd('Brindlewick – Tansy Row · R² ± 3 — “quoted” arm’s-length €5')).toBe('Brindlewick – Tansy Row · R² ± 3 — “quoted” arm’s-length €5');
    expect(usd('Ærøskøbing, Müllerstraße')).toBe('Ærøskøbing, Müllerstraße');
  });
  it('spells out signs the fonts lack and marks the rest', () => {
    expect(usd('h ≤ 2p/n, √(h), −3, β, ŷ₀')).toBe('h <= 2p/n, sqrt(h), -3, beta, y^0');
    expect(usd('Łódź')).toBe('?ód?');
  });
  it('writes a currency sign the fonts lack as its code', () => {
    expect(winAnsiText('INR')('₹3,35,750 and ₹12')).toBe('INR 3,35,750 and INR 12');
    expect(winAnsiText('EUR')('€335,750')).toBe('€335,750');
  });
});

describe('wrapText', () => {
  const mono = { widthOfString: (s: string) => s.length }; // one point per character
  it('fills lines greedily by words', () => {
    expect(wrapText(mono, 'the quick brown fox jumps', 10)).toEqual(['the quick', 'brown fox', 'jumps']);
  });
  it('cuts a word longer than a line', () => {
    expect(wrapText(mono, 'abcdefghijkl xy', 5)).toEqual(['abcde', 'fghij', 'kl xy']);
  });
  it('keeps explicit line breaks and gives at least one line', () => {
    expect(wrapText(mono, 'ab\ncd', 10)).toEqual(['ab', 'cd']);
    expect(wrapText(mono, '', 10)).toEqual(['']);
  });
});
