import { SolveError } from '../errors.js';
import type { Csr } from './types.js';

/**
 * Compress (row, col, value) triplets into CSR with sorted, unique column indices per row;
 * duplicates are summed (the usual finite element assembly contract). Two counting passes
 * (by column, then by row) give a sorted result without any comparison sort.
 */
export function csrFromTriplets(
  n: number,
  rows: ArrayLike<number>,
  cols: ArrayLike<number>,
  vals: ArrayLike<number>,
): Csr {
  const nnzIn = rows.length;
  if (cols.length !== nnzIn || vals.length !== nnzIn) {
    throw new TypeError(`triplet arrays differ in length: ${rows.length}, ${cols.length}, ${vals.length}`);
  }
  if (!(Number.isInteger(n) && n >= 0)) throw new RangeError(`matrix order must be a non-negative integer, got ${n}`);
  // pass 1: bucket by column (transpose), pass 2: bucket by row — rows end up sorted by column
  const colCount = new Int32Array(n + 1);
  for (let k = 0; k < nnzIn; k++) {
    const i = rows[k], j = cols[k];
    if (!(i >= 0 && i < n && j >= 0 && j < n)) throw new RangeError(`triplet ${k} index (${i}, ${j}) outside 0..${n - 1}`);
    colCount[j + 1]++;
  }
  for (let j = 0; j < n; j++) colCount[j + 1] += colCount[j];
  const tRow = new Int32Array(nnzIn);
  const tVal = new Float64Array(nnzIn);
  const next = colCount.slice(0, n);
  for (let k = 0; k < nnzIn; k++) {
    const q = next[cols[k]]++;
    tRow[q] = rows[k];
    tVal[q] = vals[k];
  }
  const rowCount = new Int32Array(n + 1);
  for (let q = 0; q < nnzIn; q++) rowCount[tRow[q] + 1]++;
  for (let i = 0; i < n; i++) rowCount[i + 1] += rowCount[i];
  const sCol = new Int32Array(nnzIn);
  const sVal = new Float64Array(nnzIn);
  const nextRow = rowCount.slice(0, n);
  for (let j = 0; j < n; j++) {
    for (let q = colCount[j]; q < colCount[j + 1]; q++) {
      const p = nextRow[tRow[q]]++;
      sCol[p] = j;
      sVal[p] = tVal[q];
    }
  }
  // merge duplicates in place (sorted within rows now)
  const rowPtr = new Int32Array(n + 1);
  let w = 0;
  for (let i = 0; i < n; i++) {
    const start = w;
    for (let p = rowCount[i]; p < rowCount[i + 1]; p++) {
      if (w > start && sCol[w - 1] === sCol[p]) sVal[w - 1] += sVal[p];
      else {
        sCol[w] = sCol[p];
        sVal[w] = sVal[p];
        w++;
      }
    }
    rowPtr[i + 1] = w;
  }
  return { n, rowPtr, colIdx: sCol.slice(0, w), values: sVal.slice(0, w) };
}

/** y = A x (y is overwritten; allocated when absent). */
export function csrMatVec(A: Csr, x: ArrayLike<number>, y?: Float64Array): Float64Array {
  const { n, rowPtr, colIdx, values } = A;
  const out = y ?? new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) s += values[p] * x[colIdx[p]];
    out[i] = s;
  }
  return out;
}

/**
 * Principal submatrix A(keep, keep), renumbered 0..keep.length-1 in the order of `keep`
 * (used to eliminate supported dofs). `keep` must hold distinct indices; when it is
 * ascending the result's columns stay sorted without extra work.
 */
export function csrSubmatrix(A: Csr, keep: Int32Array): Csr {
  const m = keep.length;
  const newIndex = new Int32Array(A.n).fill(-1);
  for (let k = 0; k < m; k++) {
    const i = keep[k];
    if (!(i >= 0 && i < A.n)) throw new RangeError(`keep[${k}] = ${i} outside 0..${A.n - 1}`);
    if (newIndex[i] !== -1) throw new RangeError(`keep lists index ${i} twice`);
    newIndex[i] = k;
  }
  let ascending = true;
  for (let k = 1; k < m; k++) if (keep[k] < keep[k - 1]) { ascending = false; break; }
  // counting and filling are functions of their own: a cold first call of one long many-loop function is slow
  const rowPtr = keptRowPointers(A, keep, newIndex);
  const colIdx = new Int32Array(rowPtr[m]);
  const values = new Float64Array(rowPtr[m]);
  fillKeptRows(A, keep, newIndex, rowPtr, colIdx, values, ascending);
  return { n: m, rowPtr, colIdx, values };
}

/** Row pointers of A(keep, keep): each kept row's entries in kept columns. */
function keptRowPointers(A: Csr, keep: Int32Array, newIndex: Int32Array): Int32Array {
  const m = keep.length;
  const rowPtr = new Int32Array(m + 1);
  for (let k = 0; k < m; k++) {
    const i = keep[k];
    let c = 0;
    for (let p = A.rowPtr[i]; p < A.rowPtr[i + 1]; p++) if (newIndex[A.colIdx[p]] >= 0) c++;
    rowPtr[k + 1] = rowPtr[k] + c;
  }
  return rowPtr;
}

/** Columns (renumbered) and values of A(keep, keep), rows sorted unless `keep` is ascending. */
function fillKeptRows(A: Csr, keep: Int32Array, newIndex: Int32Array, rowPtr: Int32Array, colIdx: Int32Array, values: Float64Array, ascending: boolean): void {
  for (let k = 0; k < keep.length; k++) {
    const i = keep[k];
    let w = rowPtr[k];
    for (let p = A.rowPtr[i]; p < A.rowPtr[i + 1]; p++) {
      const j = newIndex[A.colIdx[p]];
      if (j >= 0) { colIdx[w] = j; values[w] = A.values[p]; w++; }
    }
    if (!ascending) sortRowSegment(colIdx, values, rowPtr[k], w);
  }
}

/** Insertion sort of one row's (col, value) pairs; rows are short (tens of entries). */
function sortRowSegment(cols: Int32Array, vals: Float64Array, lo: number, hi: number): void {
  for (let a = lo + 1; a < hi; a++) {
    const c = cols[a], v = vals[a];
    let b = a - 1;
    while (b >= lo && cols[b] > c) { cols[b + 1] = cols[b]; vals[b + 1] = vals[b]; b--; }
    cols[b + 1] = c;
    vals[b + 1] = v;
  }
}

/** Entry A(i, j) by binary search in row i (0 when structurally absent). */
export function csrGet(A: Csr, i: number, j: number): number {
  let lo = A.rowPtr[i], hi = A.rowPtr[i + 1] - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const c = A.colIdx[mid];
    if (c === j) return A.values[mid];
    if (c < j) lo = mid + 1; else hi = mid - 1;
  }
  return 0;
}

/** Largest absolute row sum ‖A‖∞. */
export function csrNormInf(A: Csr): number {
  let best = 0;
  for (let i = 0; i < A.n; i++) {
    let s = 0;
    for (let p = A.rowPtr[i]; p < A.rowPtr[i + 1]; p++) s += Math.abs(A.values[p]);
    if (s > best) best = s;
  }
  return best;
}

/**
 * True when the pattern is symmetric and |A(i,j) − A(j,i)| ≤ tol · max|A| for every stored
 * entry (a missing mirror entry counts as 0).
 */
export function isSymmetric(A: Csr, tol = 1e-12): boolean {
  let maxAbs = 0;
  for (let p = 0; p < A.values.length; p++) maxAbs = Math.max(maxAbs, Math.abs(A.values[p]));
  const bound = tol * maxAbs;
  for (let i = 0; i < A.n; i++) {
    for (let p = A.rowPtr[i]; p < A.rowPtr[i + 1]; p++) {
      const j = A.colIdx[p];
      if (j <= i) continue;
      if (Math.abs(A.values[p] - csrGet(A, j, i)) > bound) return false;
    }
  }
  return true;
}

/** Scaled residual ‖Ax − b‖∞ / (‖A‖∞‖x‖∞ + ‖b‖∞); 0 for a zero system. */
export function residualNorm(A: Csr, x: ArrayLike<number>, b: ArrayLike<number>): number {
  const ax = csrMatVec(A, x);
  let r = 0, xn = 0, bn = 0;
  for (let i = 0; i < A.n; i++) {
    r = Math.max(r, Math.abs(ax[i] - b[i]));
    xn = Math.max(xn, Math.abs(x[i]));
    bn = Math.max(bn, Math.abs(b[i]));
  }
  const scale = csrNormInf(A) * xn + bn;
  return scale > 0 ? r / scale : 0;
}

/**
 * `residualNorm` of several solutions of one matrix: the same scaled residual for each pair
 * (x, b), with ‖A‖∞ computed once and A read once for every four solutions (each row's products
 * summed in the order of csrMatVec, so each residual equals `residualNorm` of its pair).
 */
export function residualNorms(A: Csr, xs: readonly ArrayLike<number>[], bs: readonly ArrayLike<number>[]): number[] {
  const norm = csrNormInf(A);
  const { n, rowPtr, colIdx, values } = A;
  const maxAbs = (v: ArrayLike<number>): number => {
    let m = 0;
    for (let i = 0; i < n; i++) m = Math.max(m, Math.abs(v[i]));
    return m;
  };
  const out: number[] = [];
  for (let g = 0; g < xs.length; g += 4) {
    const m = Math.min(4, xs.length - g);
    // a short group repeats its last pair; those repeats are dropped below
    const at = (c: number) => g + Math.min(c, m - 1);
    const x0 = xs[at(0)], x1 = xs[at(1)], x2 = xs[at(2)], x3 = xs[at(3)];
    const b0 = bs[at(0)], b1 = bs[at(1)], b2 = bs[at(2)], b3 = bs[at(3)];
    let r0 = 0, r1 = 0, r2 = 0, r3 = 0;
    for (let i = 0; i < n; i++) {
      let s0 = 0, s1 = 0, s2 = 0, s3 = 0;
      for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
        const v = values[p], j = colIdx[p];
        s0 += v * x0[j]; s1 += v * x1[j]; s2 += v * x2[j]; s3 += v * x3[j];
      }
      r0 = Math.max(r0, Math.abs(s0 - b0[i]));
      r1 = Math.max(r1, Math.abs(s1 - b1[i]));
      r2 = Math.max(r2, Math.abs(s2 - b2[i]));
      r3 = Math.max(r3, Math.abs(s3 - b3[i]));
    }
    const r = [r0, r1, r2, r3];
    for (let c = 0; c < m; c++) {
      const scale = norm * maxAbs(xs[g + c]) + maxAbs(bs[g + c]);
      out.push(scale > 0 ? r[c] / scale : 0);
    }
  }
  return out;
}

/** Structural checks once at the stage entry: shapes, sorted unique columns, finite values. */
export function validateCsr(A: Csr, what = 'matrix'): void {
  const { n, rowPtr, colIdx, values } = A;
  if (rowPtr.length !== n + 1) throw new TypeError(`${what}: rowPtr length ${rowPtr.length}, expected ${n + 1}`);
  if (rowPtr[0] !== 0 || colIdx.length !== rowPtr[n] || values.length !== rowPtr[n]) {
    throw new TypeError(`${what}: rowPtr/colIdx/values lengths disagree`);
  }
  for (let i = 0; i < n; i++) {
    for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) {
      const j = colIdx[p];
      if (!(j >= 0 && j < n)) throw new RangeError(`${what}: row ${i} has column ${j} outside 0..${n - 1}`);
      if (p > rowPtr[i] && colIdx[p - 1] >= j) throw new RangeError(`${what}: row ${i} columns not sorted and unique`);
      if (!Number.isFinite(values[p])) throw new SolveError(`${what}: entry (${i}, ${j}) is ${values[p]}`);
    }
  }
}
