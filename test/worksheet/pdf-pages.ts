/**
 * Text of each page of a PDF, by poppler's pdftotext (Debian poppler-utils; .ci/run
 * installs it) in layout mode, so a label and its value stay on one line. Whitespace is
 * collapsed, so text wrapped onto several lines still matches.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

const dir = mkdtempSync(path.join(tmpdir(), 'compfit-worksheet-'));
let count = 0;

export const squash = (text: string) => text.replace(/\s+/g, ' ').trim();

export function pdfPages(pdf: Buffer): string[] {
  const file = path.join(dir, `w${++count}.pdf`);
  writeFileSync(file, pdf);
  const text = execFileSync('pdftotext', ['-layout', '-enc', 'UTF-8', file, '-'], { encoding: 'utf8' });
  // pdftotext ends every page with a form feed.
  return text.split('\f').slice(0, -1).map(squash);
}

/** Page count from the file itself (page objects), to check against the text. */
export function pageObjects(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/Type \/Page\b/g) ?? []).length;
}
