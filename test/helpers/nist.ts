/**
 * Reads a NIST StRD linear regression file (test/fixtures/nist-strd, public domain) by the
 * line ranges its header states, as the suite's README says to.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export interface NistCase {
  name: string;
  y: number[];
  x: number[][];
  certified: { estimates: number[]; stdDevs: number[]; residualSd: number; rSquared: number };
}

export const NIST_DIR = path.join(path.dirname(fileURLToPath(import.meta.url)), '..', 'fixtures', 'nist-strd');

export function readNist(name: string): NistCase {
  const lines = readFileSync(path.join(NIST_DIR, `${name}.dat`), 'utf8').split('\n');
  const range = (label: string): [number, number] => {
    const line = lines.find((l) => l.includes(label) && /lines \d+ to \d+/.test(l));
    if (!line) throw new Error(`${name}: no ${label} line range`);
    const m = /lines (\d+) to (\d+)/.exec(line)!;
    return [Number(m[1]), Number(m[2])];
  };
  const [c0, c1] = range('Certified Values');
  const [d0, d1] = range('Data');
  const estimates: number[] = [];
  const stdDevs: number[] = [];
  let residualSd = NaN;
  let rSquared = NaN;
  for (let i = c0 - 1; i < c1; i++) {
    const l = lines[i].trim();
    const param = /^B\d+\s+(\S+)\s+(\S+)/.exec(l);
    if (param) {
      estimates.push(Number(param[1]));
      stdDevs.push(Number(param[2]));
    }
    const sd = /^Standard Deviation\s+(\S+)/.exec(l);
    if (sd) residualSd = Number(sd[1]);
    const r2 = /^R-Squared\s+(\S+)/.exec(l);
    if (r2) rSquared = Number(r2[1]);
  }
  const y: number[] = [];
  const x: number[][] = [];
  for (let i = d0 - 1; i < d1; i++) {
    const cells = lines[i].trim().split(/\s+/).map(Number);
    y.push(cells[0]);
    x.push(cells.slice(1));
  }
  return { name, y, x, certified: { estimates, stdDevs, residualSd, rSquared } };
}

/** Log relative error −log10(|est − cert| / |cert|); absolute error when cert = 0. Capped at 15. */
export function lre(estimate: number, certified: number): number {
  const err = certified === 0 ? Math.abs(estimate) : Math.abs(estimate - certified) / Math.abs(certified);
  if (err === 0) return 15;
  return Math.min(15, -Math.log10(err));
}
