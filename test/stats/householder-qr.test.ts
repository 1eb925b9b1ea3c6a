import { Matrix, QrDecomposition } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { householderQr } from '../../src/stats/householder-qr.js';

describe('householderQr', () => {
  it('gives the same R as ml-matrix QrDecomposition (the library it replaces for speed)', () => {
    const rows = [
      [1, 2.5, 3],
      [1, -1, 4],
      [1, 0.5, -2],
      [1, 7, 1],
      [1, 3, 3.5],
    ];
    const ours = householderQr([0, 1, 2].map((j) => Float64Array.from(rows, (r) => r[j]))).r;
    const theirs = new QrDecomposition(new Matrix(rows)).upperTriangularMatrix.to2DArray();
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(ours[i][j]).toBeCloseTo(theirs[i][j], 12);
  });
  it('Qᵀy keeps the norm of y (Q is orthogonal)', () => {
    const qr = householderQr([Float64Array.of(1, 1, 1, 1), Float64Array.of(0, 1, 2, 3)]);
    const y = Float64Array.of(2, -1, 4, 0.5);
    const norm = Math.hypot(...y);
    qr.applyQt(y);
    expect(Math.hypot(...y)).toBeCloseTo(norm, 12);
  });
  it('documented example: a single column (3, 4) has R = −5', () => {
    expect(householderQr([Float64Array.of(3, 4)]).r[0][0]).toBeCloseTo(-5, 14);
  });
});
