import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import {
  csrFromTriplets,
  csrMatVec,
  csrSubmatrix,
  csrGet,
  isSymmetric,
  residualNorm,
  toMatrixMarket,
  vectorToMatrixMarket,
  matrixMarketChunks,
  type Csr,
} from '../../src/linalg/index.js';
import { gridKronecker, randomSpd, toDense } from './helpers.js';

/** Minimal reader for what we write: coordinate real symmetric (lower triangle, 1-based). */
function parseMatrixMarketSymmetric(text: string): { n: number; entries: [number, number, number][] } {
  const lines = text.split('\n').filter((l) => l.length > 0 && !l.startsWith('%'));
  const [n, m, nnz] = lines[0].trim().split(/\s+/).map(Number);
  expect(n).toBe(m);
  const entries = lines.slice(1).map((l) => {
    const [i, j, v] = l.trim().split(/\s+/);
    return [Number(i) - 1, Number(j) - 1, Number(v)] as [number, number, number];
  });
  expect(entries.length).toBe(nnz);
  return { n, entries };
}

describe('CSR utilities', () => {
  it('csrFromTriplets sums duplicates and sorts columns (checked against a dense accumulation)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 12 }),
        fc.array(fc.tuple(fc.nat(), fc.nat(), fc.double({ min: -10, max: 10, noNaN: true })), { maxLength: 80 }),
        (n, trip) => {
          const rows = trip.map((t) => t[0] % n), cols = trip.map((t) => t[1] % n), vals = trip.map((t) => t[2]);
          const A = csrFromTriplets(n, rows, cols, vals);
          const D = Array.from({ length: n }, () => new Array<number>(n).fill(0));
          trip.forEach((_, k) => (D[rows[k]][cols[k]] += vals[k]));
          for (let i = 0; i < n; i++) {
            for (let p = A.rowPtr[i] + 1; p < A.rowPtr[i + 1]; p++) expect(A.colIdx[p]).toBeGreaterThan(A.colIdx[p - 1]);
            // the same additions in a different order: equal to a few ulps of the summed magnitudes
            for (let j = 0; j < n; j++) expect(Math.abs(csrGet(A, i, j) - D[i][j])).toBeLessThanOrEqual(1e-12 * 10 * trip.length);
          }
        },
      ),
      { numRuns: 60 },
    );
  });

  it('csrMatVec equals the dense product', () => {
    const A = randomSpd(25, 0.2, 3);
    const x = Float64Array.from({ length: 25 }, (_, i) => Math.cos(i));
    const y = csrMatVec(A, x);
    const D = toDense(A);
    for (let i = 0; i < 25; i++) {
      const ref = D[i].reduce((s, v, j) => s + v * x[j], 0);
      expect(Math.abs(y[i] - ref)).toBeLessThan(1e-13 * (1 + Math.abs(ref)));
    }
  });

  it('csrSubmatrix keeps the principal submatrix, in the order of keep', () => {
    const { A } = gridKronecker(4, 3);
    const D = toDense(A);
    for (const keep of [Int32Array.from([0, 3, 4, 7, 8, 20]), Int32Array.from([9, 2, 14, 1])]) {
      const S = csrSubmatrix(A, keep);
      expect(S.n).toBe(keep.length);
      for (let a = 0; a < keep.length; a++) {
        for (let p = S.rowPtr[a] + 1; p < S.rowPtr[a + 1]; p++) expect(S.colIdx[p]).toBeGreaterThan(S.colIdx[p - 1]);
        for (let b = 0; b < keep.length; b++) expect(csrGet(S, a, b)).toBe(D[keep[a]][keep[b]]);
      }
    }
  });

  it('isSymmetric detects an asymmetric entry; residualNorm is 0 for an exact solution', () => {
    const A = randomSpd(15, 0.3, 8);
    expect(isSymmetric(A)).toBe(true);
    const B: Csr = { ...A, values: A.values.slice() };
    const p = B.rowPtr[3] + (B.colIdx[B.rowPtr[3]] === 3 ? 1 : 0);
    B.values[p] += 1e-3;
    expect(isSymmetric(B)).toBe(false);
    // exact: A x with small integers is exact in floating point
    const I = csrFromTriplets(3, [0, 1, 2, 0, 1], [0, 1, 2, 1, 0], [2, 3, 4, 1, 1]);
    expect(residualNorm(I, [1, 2, 3], [4, 7, 12])).toBe(0);
    // ‖Ax−b‖∞ / (‖A‖∞‖x‖∞ + ‖b‖∞) by hand: r = (1,0,0), ‖A‖∞ = 4, ‖x‖∞ = 3, ‖b‖∞ = 12
    expect(residualNorm(I, [1, 2, 3], [5, 7, 12])).toBeCloseTo(1 / (4 * 3 + 12), 15);
  });
});

describe('Matrix Market export', () => {
  it('round-trips a symmetric matrix bit for bit (lower triangle, 1-based)', () => {
    const A = randomSpd(40, 0.1, 21);
    const text = toMatrixMarket(A);
    expect(text.startsWith('%%MatrixMarket matrix coordinate real symmetric\n')).toBe(true);
    const { n, entries } = parseMatrixMarketSymmetric(text);
    expect(n).toBe(40);
    const rows: number[] = [], cols: number[] = [], vals: number[] = [];
    for (const [i, j, v] of entries) {
      expect(i).toBeGreaterThanOrEqual(j);
      rows.push(i); cols.push(j); vals.push(v);
      if (i !== j) { rows.push(j); cols.push(i); vals.push(v); }
    }
    const B = csrFromTriplets(n, rows, cols, vals);
    expect(Array.from(B.rowPtr)).toEqual(Array.from(A.rowPtr));
    expect(Array.from(B.colIdx)).toEqual(Array.from(A.colIdx));
    expect(Array.from(B.values)).toEqual(Array.from(A.values)); // shortest round-trip decimal
  });

  it('chunked writer gives the same text; vector export is an n × 1 coordinate matrix of its non-zeros', () => {
    const { A } = gridKronecker(6, 5);
    expect([...matrixMarketChunks(A, 7)].join('')).toBe(toMatrixMarket(A));
    const b = [0.1, 0, -2.5e-300, 1 / 3];
    const lines = vectorToMatrixMarket(b).trim().split('\n');
    expect(lines[0]).toBe('%%MatrixMarket matrix coordinate real general');
    const data = lines.filter((l) => !l.startsWith('%'));
    expect(data[0]).toBe('4 1 3');
    // read it back: row, column, value, shortest round-trip decimals
    const back = new Array<number>(4).fill(0);
    for (const l of data.slice(1)) {
      const [i, j, v] = l.split(' ');
      expect(j).toBe('1');
      back[Number(i) - 1] = Number(v);
    }
    expect(back).toEqual(b);
  });
});
