import { csrFromTriplets, type Csr } from '../../src/linalg/index.js';
import { seededRandom } from '../helpers/random.js';

export { seededRandom };

/** Random sparse SPD: symmetric random off-diagonals, diagonal made strictly dominant. */
export function randomSpd(n: number, density: number, seed: number): Csr {
  const rnd = seededRandom(seed);
  const rows: number[] = [], cols: number[] = [], vals: number[] = [];
  const rowAbs = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      if (rnd() < density) {
        const v = rnd() * 2 - 1;
        rows.push(i, j); cols.push(j, i); vals.push(v, v);
        rowAbs[i] += Math.abs(v); rowAbs[j] += Math.abs(v);
      }
    }
  }
  for (let i = 0; i < n; i++) { rows.push(i); cols.push(i); vals.push(rowAbs[i] + 0.5 + rnd()); }
  return csrFromTriplets(n, rows, cols, vals);
}

/**
 * FE-like matrix: 5-point Laplacian of an nx × ny grid ⊗ a 2×2 SPD block B (2 dofs per node),
 * plus a small shift so the Neumann Laplacian becomes definite. Kronecker product of SPD
 * matrices is SPD (Horn & Johnson, Topics in Matrix Analysis, 1991, Thm 4.2.12).
 */
export function gridKronecker(nx: number, ny: number, shift = 0.01): { A: Csr; rowXY: Float64Array } {
  const B = [2, 0.6, 0.6, 1];
  const rows: number[] = [], cols: number[] = [], vals: number[] = [];
  const node = (ix: number, iy: number) => iy * nx + ix;
  const add = (a: number, b: number, w: number) => {
    for (let r = 0; r < 2; r++) for (let c = 0; c < 2; c++) { rows.push(2 * a + r); cols.push(2 * b + c); vals.push(w * B[2 * r + c]); }
  };
  for (let iy = 0; iy < ny; iy++) {
    for (let ix = 0; ix < nx; ix++) {
      const a = node(ix, iy);
      let deg = 0;
      for (const [dx, dy] of [[1, 0], [-1, 0], [0, 1], [0, -1]]) {
        const jx = ix + dx, jy = iy + dy;
        if (jx < 0 || jy < 0 || jx >= nx || jy >= ny) continue;
        add(a, node(jx, jy), -1);
        deg++;
      }
      add(a, a, deg + shift);
    }
  }
  const n = 2 * nx * ny;
  const rowXY = new Float64Array(2 * n);
  for (let iy = 0; iy < ny; iy++) for (let ix = 0; ix < nx; ix++) {
    for (let r = 0; r < 2; r++) { const row = 2 * node(ix, iy) + r; rowXY[2 * row] = ix; rowXY[2 * row + 1] = iy; }
  }
  return { A: csrFromTriplets(n, rows, cols, vals), rowXY };
}

export function toDense(A: Csr): number[][] {
  const D: number[][] = [];
  for (let i = 0; i < A.n; i++) {
    const row = new Array<number>(A.n).fill(0);
    for (let p = A.rowPtr[i]; p < A.rowPtr[i + 1]; p++) row[A.colIdx[p]] = A.values[p];
    D.push(row);
  }
  return D;
}
