/**
 * Text for the PDF's standard fonts, which hold only the Windows-1252 (WinAnsi) characters:
 * common mathematical signs become their plain spellings, a currency sign the fonts lack
 * becomes its ISO code, anything else unknown becomes "?". Also a greedy word wrapper on
 * the font's own glyph widths.
 */
import { currencySymbol } from '../domain/format.js';

/** Characters above U+00FF that WinAnsi has (the 0x80–0x9F block of Windows-1252). */
const WIN_ANSI_EXTRA = new Set([
  0x0152, 0x0153, 0x0160, 0x0161, 0x0178, 0x017d, 0x017e, 0x0192, 0x02c6, 0x02dc, 0x2013, 0x2014, 0x2018, 0x2019, 0x201a, 0x201c,
  0x201d, 0x201e, 0x2020, 0x2021, 0x2022, 0x2026, 0x2030, 0x2039, 0x203a, 0x20ac, 0x2122,
]);

const PLAIN: Record<string, string> = {
  '\u2212': '-', // minus sign
  '\u2264': '<=',
  '\u2265': '>=',
  '\u2248': '~',
  '\u2260': '!=',
  '\u221a': 'sqrt',
  '\u03b2': 'beta',
  '\u03c3': 'sigma',
  '\u03c7': 'chi',
  '\u0177': 'y^',
  '\u2080': '0',
  '\u2081': '1',
  '\u2082': '2',
  '\u1d62': 'i',
  '\u2c7c': 'j',
  '\u207b': '-',
  '\u00b9': '1',
  '\u2009': ' ', // thin space
  '\u202f': ' ', // narrow no-break space (some number formats)
  '\u2011': '-',
};

function encodable(code: number): boolean {
  return code <= 0xff || WIN_ANSI_EXTRA.has(code);
}

/** Builds the sanitizer for one worksheet's currency. */
export function winAnsiText(currency: string): (text: string) => string {
  const symbol = currencySymbol(currency);
  const symbolOk = [...symbol].every((ch) => encodable(ch.codePointAt(0)!));
  return (text) => {
    // Fast path: almost every string is plain Latin-1 already.
    if (!/[^\x00-\xff]/.test(text)) return text;
    let s = symbolOk ? text : text.split(symbol).join(`${currency} `);
    s = s.replace(/[^\x00-\xff]/gu, (ch) => PLAIN[ch] ?? (encodable(ch.codePointAt(0)!) ? ch : '?'));
    return s;
  };
}

/** Anything with a width in the current font and size (a PDFKit document). */
export interface Measurer {
  widthOfString(text: string): number;
}

/**
 * Greedy word wrap to `width` points in the measurer's current font; a word longer than a
 * whole line is cut between characters. Always at least one line.
 */
export function wrapText(m: Measurer, text: string, width: number): string[] {
  const lines: string[] = [];
  for (const paragraph of text.split('\n')) {
    if (m.widthOfString(paragraph) <= width) {
      lines.push(paragraph);
      continue;
    }
    let line = '';
    for (const word of paragraph.split(' ')) {
      const candidate = line ? `${line} ${word}` : word;
      if (m.widthOfString(candidate) <= width) {
        line = candidate;
        continue;
      }
      if (line) lines.push(line);
      line = word;
      while (m.widthOfString(line) > width && line.length > 1) {
        let cut = line.length - 1;
        while (cut > 1 && m.widthOfString(line.slice(0, cut)) > width) cut--;
        lines.push(line.slice(0, cut));
        line = line.slice(cut);
      }
    }
    lines.push(line);
  }
  return lines;
}
