import type { Csr } from './types.js';

/** Shortest decimal that reads back to the same double (JavaScript's Number → string). */
function fmt(v: number): string {
  return String(v);
}

/**
 * Lower triangle of a symmetric CSR matrix in Matrix Market coordinate format
 * (`real symmetric`, 1-based), yielded in chunks of about `linesPerChunk` entries so a caller
 * can stream a million-row matrix to a file without one giant string.
 * Entries are written row by row of the lower triangle, i.e. (i, j) with i ≥ j.
 */
export function* matrixMarketChunks(A: Csr, linesPerChunk = 65536): Generator<string> {
  let nnzLower = 0;
  for (let i = 0; i < A.n; i++) {
    for (let p = A.rowPtr[i]; p < A.rowPtr[i + 1]; p++) if (A.colIdx[p] <= i) nnzLower++;
  }
  yield `%%MatrixMarket matrix coordinate real symmetric\n% written by peakwise\n${A.n} ${A.n} ${nnzLower}\n`;
  let lines: string[] = [];
  for (let i = 0; i < A.n; i++) {
    for (let p = A.rowPtr[i]; p < A.rowPtr[i + 1]; p++) {
      const j = A.colIdx[p];
      if (j > i) break; // columns sorted: the rest is upper triangle
      lines.push(`${i + 1} ${j + 1} ${fmt(A.values[p])}`);
    }
    if (lines.length >= linesPerChunk) {
      yield lines.join('\n') + '\n';
      lines = [];
    }
  }
  if (lines.length > 0) yield lines.join('\n') + '\n';
}

/** Whole matrix as one string (small matrices; use matrixMarketChunks for big ones). */
export function toMatrixMarket(A: Csr): string {
  let s = '';
  for (const chunk of matrixMarketChunks(A)) s += chunk;
  return s;
}

/**
 * A vector as a Matrix Market `coordinate real general` n × 1 matrix (1-based rows, one line per
 * non-zero entry), the same format family as the stiffness, so any reader of one reads the other.
 */
export function vectorToMatrixMarket(b: ArrayLike<number>): string {
  const rows: string[] = [];
  for (let i = 0; i < b.length; i++) if (b[i] !== 0) rows.push(`${i + 1} 1 ${fmt(b[i])}`);
  const lines: string[] = ['%%MatrixMarket matrix coordinate real general', '% written by peakwise', `${b.length} 1 ${rows.length}`, ...rows];
  return lines.join('\n') + '\n';
}
