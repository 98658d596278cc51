import { NotPositiveDefiniteError } from './errors.js';
import type { Csr, Factor, Symbolic } from './types.js';
import { giveBackWasmKernels, takeWasmKernels, type WasmKernels } from './wasm.js';

export interface FactorOptions {
  /** a pivot d ≤ pivotTol · |A_kk| counts as a breakdown (default 1e-12) */
  pivotTol?: number;
  /**
   * dense kernels: 'wasm' = WebAssembly SIMD with the factor in WebAssembly memory, 'js' =
   * plain JavaScript; 'auto' (default) takes wasm when the runtime has it and the factor fits.
   */
  kernels?: 'auto' | 'wasm' | 'js';
}

/** Kernels and memory behind each wasm-held factor, so refactorize can reuse both. */
const wasmOfValues = new WeakMap<Float64Array, WasmKernels>();

/**
 * Give a factor's WebAssembly memory back for the next factorisation (wasm.ts takeWasmKernels): a
 * fresh memory costs a page fault per 4 KiB page on its first writes, a given-back one does not.
 * The factor (its values) must not be used afterwards: the next factor overwrites them.
 */
export function releaseFactor(F: Factor): void {
  const wk = wasmOfValues.get(F.values);
  if (!wk) return;
  wasmOfValues.delete(F.values);
  giveBackWasmKernels(wk);
}

/** Which kernels produced a factor's values. */
export function factorKernels(F: Factor): 'wasm' | 'js' {
  return wasmOfValues.has(F.values) ? 'wasm' : 'js';
}

const roundUp4 = (x: number) => (x + 3) & ~3;

/**
 * Left-looking supernodal Cholesky P A Pᵀ = L Lᵀ.
 * Ng & Peyton, "Block sparse Cholesky algorithms on advanced uniprocessor computers",
 * SIAM J. Sci. Comput. 14(5):1034–1056, 1993. For each supernode J in turn: scatter A's
 * columns into J's dense panel, subtract the update L_D(rows ≥ J, :) · L_D(J's cols, :)ᵀ of
 * every earlier supernode D that has rows in J (D waits on a linked list keyed by its next row),
 * then factor the panel densely.
 */
export function numericFactor(A: Csr, sym: Symbolic, options: FactorOptions = {}, reuse?: Float64Array): Factor {
  const pivotTol = options.pivotTol ?? 1e-12;
  const mode = options.kernels ?? 'auto';
  const { n, nSuper, superStart, superRowPtr, superRows, superValPtr, superOfCol } = sym;
  const { perm, iperm } = sym.ordering;
  const total = superValPtr[nSuper];
  let maxRows = 0;
  let maxCols = 0;
  for (let s = 0; s < nSuper; s++) {
    maxRows = Math.max(maxRows, superRowPtr[s + 1] - superRowPtr[s]);
    maxCols = Math.max(maxCols, superStart[s + 1] - superStart[s]);
  }
  const workLen = roundUp4(maxRows) * roundUp4(Math.max(maxCols, PANEL_BLOCK));

  // wasm layout (doubles): panels [0, total), 8 doubles of padding (kernels read up to 3 rows
  // past a panel's end), the work block, then the int32 row-offset and column-address maps
  let wk: WasmKernels | null = null;
  let L: Float64Array;
  let work: Float64Array;
  let rowOff = new Int32Array(0);
  let colAddr = new Int32Array(0);
  let tolv = new Float64Array(0);
  const workAt = roundUp4(total + 8);
  const rowOffAt = (workAt + workLen + 8) * 8; // bytes
  const colAddrAt = rowOffAt + 4 * roundUp4(maxRows);
  const tolAt = colAddrAt + 4 * roundUp4(maxCols); // bytes, f64 per panel column
  const bytes = tolAt + 8 * roundUp4(maxCols) + 64;
  let dirtyBytes = 0;
  if (mode !== 'js') {
    const prior = reuse && reuse.length === total ? wasmOfValues.get(reuse) : undefined;
    if (prior && prior.memory.buffer.byteLength >= bytes) {
      wk = prior;
      dirtyBytes = bytes;
    } else {
      const taken = takeWasmKernels(bytes);
      wk = taken?.kernels ?? null;
      dirtyBytes = taken?.dirtyBytes ?? 0;
    }
    if (!wk && mode === 'wasm') throw new TypeError('WebAssembly SIMD kernels are unavailable for this factor');
  }
  if (wk) {
    const buf = wk.memory.buffer;
    L = new Float64Array(buf, 0, total);
    // the panels must start at zero (A is scattered in with +=); a spare memory may hold an old factor
    if (dirtyBytes > 0) new Float64Array(buf, 0, Math.min(workAt, Math.floor(dirtyBytes / 8))).fill(0);
    work = new Float64Array(buf, workAt * 8, workLen);
    rowOff = new Int32Array(buf, rowOffAt, roundUp4(maxRows));
    colAddr = new Int32Array(buf, colAddrAt, roundUp4(maxCols));
    tolv = new Float64Array(buf, tolAt, roundUp4(maxCols));
    wasmOfValues.set(L, wk);
  } else if (reuse && reuse.length === total && !wasmOfValues.has(reuse)) {
    L = reuse;
    L.fill(0);
    work = new Float64Array(workLen);
  } else {
    L = new Float64Array(total);
    work = new Float64Array(workLen);
  }
  const st: FactorState = {
    A, sym, perm, iperm, pivotTol, L, work, rowOff, colAddr, tolv,
    syrk: wk ? wk.syrk : null,
    scatter: wk ? wk.scatter : null,
    panel: wk ? wk.panel : null,
    workByte: workAt * 8, rowOffAt, colAddrAt, tolAt,
    map: new Int32Array(n),
    link: new Int32Array(nSuper).fill(-1),
    nextLink: new Int32Array(nSuper).fill(-1),
    nextRow: new Int32Array(nSuper), // position in D's row list of the next row to update
    diag: new Float64Array(n),
    relRow: new Int32Array(maxRows),
  };
  // the loop calls one small function per step: each is optimised on its own after a few calls,
  // where one long loop body would wait for the whole function's on-stack replacement (cold runs)
  const { link, nextLink, nextRow } = st;
  for (let s = 0; s < nSuper; s++) {
    scatterColumns(st, s);
    // updates from descendants
    let d = link[s];
    link[s] = -1;
    while (d !== -1) {
      const dNext = nextLink[d];
      updateFrom(st, s, d);
      d = dNext;
    }
    factorPanel(st, s);
    nextRow[s] = superStart[s + 1] - superStart[s];
    queueForNextRow(st, s);
  }
  return { n, nnzL: sym.nnzL, symbolic: sym, values: L };
}

/** What the steps of one factorisation share. */
interface FactorState {
  A: Csr;
  sym: Symbolic;
  perm: Int32Array;
  iperm: Int32Array;
  pivotTol: number;
  L: Float64Array;
  work: Float64Array;
  rowOff: Int32Array;
  colAddr: Int32Array;
  tolv: Float64Array;
  syrk: WasmKernels['syrk'] | null;
  scatter: WasmKernels['scatter'] | null;
  panel: WasmKernels['panel'] | null;
  /** byte addresses in the wasm memory: work block, row offsets, column addresses, pivot tolerances */
  workByte: number;
  rowOffAt: number;
  colAddrAt: number;
  tolAt: number;
  /** row → place in the current supernode's row list */
  map: Int32Array;
  /** supernodes waiting to update supernode s: link[s], then nextLink[…] */
  link: Int32Array;
  nextLink: Int32Array;
  nextRow: Int32Array;
  diag: Float64Array;
  relRow: Int32Array;
}

/** Supernode s's row map, then A's columns f … f+nc-1 (lower part) scattered into its panel. */
function scatterColumns(st: FactorState, s: number): void {
  const { A, L, map, diag, perm, iperm } = st;
  const { superStart, superRowPtr, superRows, superValPtr } = st.sym;
  const f = superStart[s];
  const nc = superStart[s + 1] - f;
  const rp = superRowPtr[s];
  const nr = superRowPtr[s + 1] - rp;
  const base = superValPtr[s];
  for (let t = 0; t < nr; t++) map[superRows[rp + t]] = t;
  for (let c = 0; c < nc; c++) {
    const col = f + c;
    const row = perm[col];
    const colBase = base + c * nr;
    for (let p = A.rowPtr[row]; p < A.rowPtr[row + 1]; p++) {
      const i = iperm[A.colIdx[p]];
      if (i >= col) L[colBase + map[i]] += A.values[p];
    }
    diag[col] = L[colBase + c];
  }
}

/** Subtract descendant d's update from supernode s's panel, then queue d for the supernode of its next row. */
function updateFrom(st: FactorState, s: number, d: number): void {
  const { L, map, syrk, scatter, rowOff, colAddr, relRow, work, nextRow } = st;
  const { superStart, superRowPtr, superRows, superValPtr } = st.sym;
  const f = superStart[s];
  const nc = superStart[s + 1] - f;
  const nr = superRowPtr[s + 1] - superRowPtr[s];
  const base = superValPtr[s];
  const drp = superRowPtr[d];
  const dnr = superRowPtr[d + 1] - drp;
  const dnc = superStart[d + 1] - superStart[d];
  const dBase = superValPtr[d];
  const p1 = nextRow[d];
  let p2 = p1;
  const lEnd = f + nc;
  while (p2 < dnr && superRows[drp + p2] < lEnd) p2++;
  const m = dnr - p1; // rows of D at or below J's first column
  const k = p2 - p1; // of which inside J's columns
  if (syrk !== null && scatter !== null) {
    // work (m4 × k4) = L_D[p1:, :] · L_D[p1:p2, :]ᵀ, then scatter-subtract, both in wasm
    const m4 = roundUp4(m);
    syrk((dBase + p1) * 8, dnr * 8, m4, roundUp4(k), dnc, st.workByte);
    const rows = drp + p1;
    for (let t = 0; t < m; t++) rowOff[t] = map[superRows[rows + t]] << 3;
    for (let jj = 0; jj < k; jj++) colAddr[jj] = (base + (superRows[rows + jj] - f) * nr) * 8;
    scatter(st.workByte, m4, m, k, st.rowOffAt, st.colAddrAt);
  } else {
    // work (m × k, column-major) = L_D[p1:, :] · L_D[p1:p2, :]ᵀ, lower part only
    updateProduct(L, dBase + p1, dnr, m, k, dnc, work);
    // scatter-subtract into J's panel
    for (let t = 0; t < m; t++) relRow[t] = map[superRows[drp + p1 + t]];
    for (let jj = 0; jj < k; jj++) {
      const colBase = base + (superRows[drp + p1 + jj] - f) * nr;
      const wBase = jj * m;
      for (let ii = jj; ii < m; ii++) L[colBase + relRow[ii]] -= work[wBase + ii];
    }
  }
  nextRow[d] = p2;
  queueForNextRow(st, d);
}

/** Put supernode d on the waiting list of the supernode that holds its next row, if it has one. */
function queueForNextRow(st: FactorState, d: number): void {
  const { superRowPtr, superRows, superOfCol } = st.sym;
  const drp = superRowPtr[d];
  const p = st.nextRow[d];
  if (p < superRowPtr[d + 1] - drp) {
    const target = superOfCol[superRows[drp + p]];
    st.nextLink[d] = st.link[target];
    st.link[target] = d;
  }
}

/** Dense Cholesky of supernode s's panel, in wasm or in JavaScript. */
function factorPanel(st: FactorState, s: number): void {
  const { L, diag, perm, panel, tolv, pivotTol } = st;
  const { superStart, superRowPtr, superValPtr } = st.sym;
  const f = superStart[s];
  const nc = superStart[s + 1] - f;
  const nr = superRowPtr[s + 1] - superRowPtr[s];
  const base = superValPtr[s];
  if (panel !== null) {
    for (let c = 0; c < nc; c++) tolv[c] = pivotTol * Math.abs(diag[f + c]);
    const bad = panel(base * 8, nr, nc, st.tolAt, st.workByte);
    if (bad >= 0) throw new NotPositiveDefiniteError(perm[f + bad], L[base + bad * nr + bad], diag[f + bad]);
  } else {
    denseCholeskyPanel(L, base, nr, nc, f, diag, perm, pivotTol, st.work);
  }
}

/** Depth of one pass over the shared dimension: keeps the strided rows read in L1 cache. */
const K_CHUNK = 64;

/**
 * C (m × k, column-major, leading dimension m; entries i ≥ j) = X · Yᵀ, where X is rows
 * 0…m-1 and Y rows 0…k-1 of a panel `kk` columns wide (leading dimension ld) starting at `off`.
 * Register-blocked: a 4 × 4 tile of C is accumulated in locals over the shared dimension, so
 * each multiply-add costs under one memory load (the JIT keeps the sixteen sums in registers).
 */
function updateProduct(
  P: Float64Array,
  off: number,
  ld: number,
  m: number,
  k: number,
  kk: number,
  C: Float64Array,
): void {
  for (let q0 = 0; q0 < kk; q0 += K_CHUNK) {
    const q1 = Math.min(kk, q0 + K_CHUNK);
    const first = q0 === 0;
    const offQ = off + q0 * ld;
    const depth = q1 - q0;
    let j = 0;
    for (; j + 3 < k; j += 4) {
      const c0 = j * m, c1 = c0 + m, c2 = c1 + m, c3 = c2 + m;
      let i = j;
      for (; i + 3 < m; i += 4) {
        let a00 = 0, a01 = 0, a02 = 0, a03 = 0, a10 = 0, a11 = 0, a12 = 0, a13 = 0;
        let a20 = 0, a21 = 0, a22 = 0, a23 = 0, a30 = 0, a31 = 0, a32 = 0, a33 = 0;
        let px = offQ + i, py = offQ + j;
        for (let q = 0; q < depth; q++, px += ld, py += ld) {
          const y0 = P[py], y1 = P[py + 1], y2 = P[py + 2], y3 = P[py + 3];
          let x = P[px];
          a00 += x * y0; a01 += x * y1; a02 += x * y2; a03 += x * y3;
          x = P[px + 1];
          a10 += x * y0; a11 += x * y1; a12 += x * y2; a13 += x * y3;
          x = P[px + 2];
          a20 += x * y0; a21 += x * y1; a22 += x * y2; a23 += x * y3;
          x = P[px + 3];
          a30 += x * y0; a31 += x * y1; a32 += x * y2; a33 += x * y3;
        }
        if (first) {
          C[c0 + i] = a00; C[c1 + i] = a01; C[c2 + i] = a02; C[c3 + i] = a03;
          C[c0 + i + 1] = a10; C[c1 + i + 1] = a11; C[c2 + i + 1] = a12; C[c3 + i + 1] = a13;
          C[c0 + i + 2] = a20; C[c1 + i + 2] = a21; C[c2 + i + 2] = a22; C[c3 + i + 2] = a23;
          C[c0 + i + 3] = a30; C[c1 + i + 3] = a31; C[c2 + i + 3] = a32; C[c3 + i + 3] = a33;
        } else {
          C[c0 + i] += a00; C[c1 + i] += a01; C[c2 + i] += a02; C[c3 + i] += a03;
          C[c0 + i + 1] += a10; C[c1 + i + 1] += a11; C[c2 + i + 1] += a12; C[c3 + i + 1] += a13;
          C[c0 + i + 2] += a20; C[c1 + i + 2] += a21; C[c2 + i + 2] += a22; C[c3 + i + 2] += a23;
          C[c0 + i + 3] += a30; C[c1 + i + 3] += a31; C[c2 + i + 3] += a32; C[c3 + i + 3] += a33;
        }
      }
      for (; i < m; i++) {
        let a0 = 0, a1 = 0, a2 = 0, a3 = 0;
        let px = offQ + i, py = offQ + j;
        for (let q = 0; q < depth; q++, px += ld, py += ld) {
          const x = P[px];
          a0 += x * P[py]; a1 += x * P[py + 1]; a2 += x * P[py + 2]; a3 += x * P[py + 3];
        }
        if (first) { C[c0 + i] = a0; C[c1 + i] = a1; C[c2 + i] = a2; C[c3 + i] = a3; }
        else { C[c0 + i] += a0; C[c1 + i] += a1; C[c2 + i] += a2; C[c3 + i] += a3; }
      }
    }
    for (; j < k; j++) {
      const c0 = j * m;
      for (let i = j; i < m; i++) {
        let a = 0;
        let px = offQ + i, py = offQ + j;
        for (let q = 0; q < depth; q++, px += ld, py += ld) a += P[px] * P[py];
        if (first) C[c0 + i] = a; else C[c0 + i] += a;
      }
    }
  }
}

/** Columns factored together in the dense panel (matches the 4-wide update tile). */
const PANEL_BLOCK = 4;

/**
 * Dense Cholesky of an nr × nc panel (column-major, leading dimension nr): the top nc × nc
 * block becomes L11 and the rows below become L21 = A21 L11⁻ᵀ. Blocked left-looking: each
 * block of 4 columns first takes the update from all earlier columns through the
 * register-blocked product, then is factored column by column.
 */
function denseCholeskyPanel(
  L: Float64Array,
  base: number,
  nr: number,
  nc: number,
  f: number,
  diag: Float64Array,
  perm: Int32Array,
  pivotTol: number,
  work: Float64Array,
): void {
  for (let j0 = 0; j0 < nc; j0 += PANEL_BLOCK) {
    const jb = Math.min(PANEL_BLOCK, nc - j0);
    const m = nr - j0;
    if (j0 > 0) {
      updateProduct(L, base + j0, nr, m, jb, j0, work);
      for (let t = 0; t < jb; t++) {
        const cj = base + (j0 + t) * nr + j0;
        const w = t * m;
        for (let i = t; i < m; i++) L[cj + i] -= work[w + i];
      }
    }
    for (let j = j0; j < j0 + jb; j++) {
      const cj = base + j * nr;
      for (let q = j0; q < j; q++) {
        const cq = base + q * nr;
        const a = L[cq + j];
        for (let i = j; i < nr; i++) L[cj + i] -= L[cq + i] * a;
      }
      const dj = L[cj + j];
      const a0 = diag[f + j];
      if (!(dj > pivotTol * Math.abs(a0)) || !(dj > 0)) {
        throw new NotPositiveDefiniteError(perm[f + j], dj, a0);
      }
      const r = Math.sqrt(dj);
      L[cj + j] = r;
      const inv = 1 / r;
      for (let i = j + 1; i < nr; i++) L[cj + i] *= inv;
    }
  }
}

/** Solve L Lᵀ (P x) = P b in place of a copy of b. */
export function solveWithFactor(F: Factor, b: ArrayLike<number>): Float64Array {
  const sym = F.symbolic;
  const { n, nSuper, superStart, superRowPtr, superRows, superValPtr } = sym;
  const { perm } = sym.ordering;
  const L = F.values;
  const y = new Float64Array(n);
  for (let k = 0; k < n; k++) y[k] = b[perm[k]];
  // the entries of y at a supernode's rows below its columns, gathered once per supernode: the
  // updates then run over contiguous memory, and each entry sees the same operations in the same
  // order as when updated in place (no other column touches it meanwhile), so x is the same to the bit
  const below = new Float64Array(maxBelow(sym));
  // forward: L y = P b
  for (let s = 0; s < nSuper; s++) {
    const f = superStart[s];
    const nc = superStart[s + 1] - f;
    const rp = superRowPtr[s];
    const nr = superRowPtr[s + 1] - rp;
    const base = superValPtr[s];
    const nb = nr - nc;
    for (let i = 0; i < nb; i++) below[i] = y[superRows[rp + nc + i]];
    for (let j = 0; j < nc; j++) {
      const cj = base + j * nr;
      const yj = (y[f + j] /= L[cj + j]);
      for (let i = j + 1; i < nc; i++) y[f + i] -= L[cj + i] * yj;
      const cb = cj + nc;
      for (let i = 0; i < nb; i++) below[i] -= L[cb + i] * yj;
    }
    for (let i = 0; i < nb; i++) y[superRows[rp + nc + i]] = below[i];
  }
  // backward: Lᵀ x = y
  for (let s = nSuper - 1; s >= 0; s--) {
    const f = superStart[s];
    const nc = superStart[s + 1] - f;
    const rp = superRowPtr[s];
    const nr = superRowPtr[s + 1] - rp;
    const base = superValPtr[s];
    const nb = nr - nc;
    for (let i = 0; i < nb; i++) below[i] = y[superRows[rp + nc + i]];
    for (let j = nc - 1; j >= 0; j--) {
      const cj = base + j * nr;
      let sum = y[f + j];
      for (let i = j + 1; i < nc; i++) sum -= L[cj + i] * y[f + i];
      const cb = cj + nc;
      for (let i = 0; i < nb; i++) sum -= L[cb + i] * below[i];
      y[f + j] = sum / L[cj + j];
    }
  }
  const x = new Float64Array(n);
  for (let k = 0; k < n; k++) x[perm[k]] = y[k];
  return x;
}

/** The most rows any supernode has below its own columns. */
function maxBelow(sym: Symbolic): number {
  const { nSuper, superStart, superRowPtr } = sym;
  let most = 0;
  for (let s = 0; s < nSuper; s++) {
    const nb = superRowPtr[s + 1] - superRowPtr[s] - (superStart[s + 1] - superStart[s]);
    if (nb > most) most = nb;
  }
  return most;
}

/**
 * Solve L Lᵀ (P X) = P B for several right-hand sides at once. The sides go in groups of twelve,
 * eight or four whose rows are interleaved (row k of the group side by side), and the sweep over the
 * factor for a group keeps the group's values of the current column in locals: each entry of L and
 * each row index is read once for the whole group, and a scattered row of the group is one or two
 * cache lines, about what one side's row costs. At 200k dofs twelve sides in one sweep cost about
 * three single solves (src/bench/cases.ts). A short last group is padded with zero sides; a single
 * side is a plain solve. Each column's arithmetic is that of `solveWithFactor`, in the same order, so
 * every result equals the single solve of its side to the last bit.
 */
export function solveWithFactorMany(F: Factor, bs: readonly ArrayLike<number>[]): Float64Array[] {
  const out: Float64Array[] = [];
  for (let g = 0; g < bs.length;) {
    const left = bs.length - g;
    if (left === 1) {
      out.push(solveWithFactor(F, bs[g]));
      break;
    }
    // a short last group is padded with zero sides: a group costs about the same however full it is
    const size = left >= 9 ? 12 : left >= 5 ? 8 : 4;
    const group = bs.slice(g, g + size);
    const taken = group.length;
    while (group.length < size) group.push(new Float64Array(F.n));
    out.push(...(size === 12 ? sweepTwelve(F, group) : size === 8 ? sweepEight(F, group) : sweepFour(F, group)).slice(0, taken));
    g += taken;
  }
  return out;
}

/** y (n·m, interleaved) from the sides, permuted. */
function gatherSides(F: Factor, bs: readonly ArrayLike<number>[]): Float64Array {
  const m = bs.length;
  const { n } = F;
  const { perm } = F.symbolic.ordering;
  const y = new Float64Array(n * m);
  for (let r = 0; r < m; r++) {
    const b = bs[r];
    for (let k = 0; k < n; k++) y[k * m + r] = b[perm[k]];
  }
  return y;
}

/** the sides back from y (n·m, interleaved), unpermuted */
function scatterSides(F: Factor, y: Float64Array, m: number): Float64Array[] {
  const { n } = F;
  const { perm } = F.symbolic.ordering;
  const xs: Float64Array[] = [];
  for (let r = 0; r < m; r++) {
    const x = new Float64Array(n);
    for (let k = 0; k < n; k++) x[perm[k]] = y[k * m + r];
    xs.push(x);
  }
  return xs;
}

/** Four sides, interleaved by four, the column's four values held in locals. */
function sweepFour(F: Factor, bs: readonly ArrayLike<number>[]): Float64Array[] {
  const { nSuper, superStart, superRowPtr, superRows, superValPtr } = F.symbolic;
  const L = F.values;
  const y = gatherSides(F, bs);
  for (let s = 0; s < nSuper; s++) {
    const f = superStart[s];
    const nc = superStart[s + 1] - f;
    const rp = superRowPtr[s];
    const nr = superRowPtr[s + 1] - rp;
    const base = superValPtr[s];
    for (let j = 0; j < nc; j++) {
      const cj = base + j * nr;
      const d = L[cj + j];
      const yj = (f + j) << 2;
      const a0 = (y[yj] /= d), a1 = (y[yj + 1] /= d), a2 = (y[yj + 2] /= d), a3 = (y[yj + 3] /= d);
      for (let i = j + 1; i < nc; i++) {
        const l = L[cj + i];
        const yi = (f + i) << 2;
        y[yi] -= l * a0; y[yi + 1] -= l * a1; y[yi + 2] -= l * a2; y[yi + 3] -= l * a3;
      }
      for (let i = nc; i < nr; i++) {
        const l = L[cj + i];
        const yi = superRows[rp + i] << 2;
        y[yi] -= l * a0; y[yi + 1] -= l * a1; y[yi + 2] -= l * a2; y[yi + 3] -= l * a3;
      }
    }
  }
  for (let s = nSuper - 1; s >= 0; s--) {
    const f = superStart[s];
    const nc = superStart[s + 1] - f;
    const rp = superRowPtr[s];
    const nr = superRowPtr[s + 1] - rp;
    const base = superValPtr[s];
    for (let j = nc - 1; j >= 0; j--) {
      const cj = base + j * nr;
      const yj = (f + j) << 2;
      let s0 = y[yj], s1 = y[yj + 1], s2 = y[yj + 2], s3 = y[yj + 3];
      for (let i = j + 1; i < nc; i++) {
        const l = L[cj + i];
        const yi = (f + i) << 2;
        s0 -= l * y[yi]; s1 -= l * y[yi + 1]; s2 -= l * y[yi + 2]; s3 -= l * y[yi + 3];
      }
      for (let i = nc; i < nr; i++) {
        const l = L[cj + i];
        const yi = superRows[rp + i] << 2;
        s0 -= l * y[yi]; s1 -= l * y[yi + 1]; s2 -= l * y[yi + 2]; s3 -= l * y[yi + 3];
      }
      const d = L[cj + j];
      y[yj] = s0 / d; y[yj + 1] = s1 / d; y[yj + 2] = s2 / d; y[yj + 3] = s3 / d;
    }
  }
  return scatterSides(F, y, 4);
}

/** Eight sides, interleaved by eight, the column's eight values held in locals. */
function sweepEight(F: Factor, bs: readonly ArrayLike<number>[]): Float64Array[] {
  const { nSuper, superStart, superRowPtr, superRows, superValPtr } = F.symbolic;
  const L = F.values;
  const y = gatherSides(F, bs);
  for (let s = 0; s < nSuper; s++) {
    const f = superStart[s];
    const nc = superStart[s + 1] - f;
    const rp = superRowPtr[s];
    const nr = superRowPtr[s + 1] - rp;
    const base = superValPtr[s];
    for (let j = 0; j < nc; j++) {
      const cj = base + j * nr;
      const d = L[cj + j];
      const yj = (f + j) << 3;
      const a0 = (y[yj] /= d), a1 = (y[yj + 1] /= d), a2 = (y[yj + 2] /= d), a3 = (y[yj + 3] /= d);
      const a4 = (y[yj + 4] /= d), a5 = (y[yj + 5] /= d), a6 = (y[yj + 6] /= d), a7 = (y[yj + 7] /= d);
      for (let i = j + 1; i < nc; i++) {
        const l = L[cj + i];
        const yi = (f + i) << 3;
        y[yi] -= l * a0; y[yi + 1] -= l * a1; y[yi + 2] -= l * a2; y[yi + 3] -= l * a3;
        y[yi + 4] -= l * a4; y[yi + 5] -= l * a5; y[yi + 6] -= l * a6; y[yi + 7] -= l * a7;
      }
      for (let i = nc; i < nr; i++) {
        const l = L[cj + i];
        const yi = superRows[rp + i] << 3;
        y[yi] -= l * a0; y[yi + 1] -= l * a1; y[yi + 2] -= l * a2; y[yi + 3] -= l * a3;
        y[yi + 4] -= l * a4; y[yi + 5] -= l * a5; y[yi + 6] -= l * a6; y[yi + 7] -= l * a7;
      }
    }
  }
  for (let s = nSuper - 1; s >= 0; s--) {
    const f = superStart[s];
    const nc = superStart[s + 1] - f;
    const rp = superRowPtr[s];
    const nr = superRowPtr[s + 1] - rp;
    const base = superValPtr[s];
    for (let j = nc - 1; j >= 0; j--) {
      const cj = base + j * nr;
      const yj = (f + j) << 3;
      let s0 = y[yj], s1 = y[yj + 1], s2 = y[yj + 2], s3 = y[yj + 3];
      let s4 = y[yj + 4], s5 = y[yj + 5], s6 = y[yj + 6], s7 = y[yj + 7];
      for (let i = j + 1; i < nc; i++) {
        const l = L[cj + i];
        const yi = (f + i) << 3;
        s0 -= l * y[yi]; s1 -= l * y[yi + 1]; s2 -= l * y[yi + 2]; s3 -= l * y[yi + 3];
        s4 -= l * y[yi + 4]; s5 -= l * y[yi + 5]; s6 -= l * y[yi + 6]; s7 -= l * y[yi + 7];
      }
      for (let i = nc; i < nr; i++) {
        const l = L[cj + i];
        const yi = superRows[rp + i] << 3;
        s0 -= l * y[yi]; s1 -= l * y[yi + 1]; s2 -= l * y[yi + 2]; s3 -= l * y[yi + 3];
        s4 -= l * y[yi + 4]; s5 -= l * y[yi + 5]; s6 -= l * y[yi + 6]; s7 -= l * y[yi + 7];
      }
      const d = L[cj + j];
      y[yj] = s0 / d; y[yj + 1] = s1 / d; y[yj + 2] = s2 / d; y[yj + 3] = s3 / d;
      y[yj + 4] = s4 / d; y[yj + 5] = s5 / d; y[yj + 6] = s6 / d; y[yj + 7] = s7 / d;
    }
  }
  return scatterSides(F, y, 8);
}

/** Twelve sides, interleaved by twelve, the column's twelve values held in locals (the pattern of sweepFour). */
function sweepTwelve(F: Factor, bs: readonly ArrayLike<number>[]): Float64Array[] {
  const { nSuper, superStart, superRowPtr, superRows, superValPtr } = F.symbolic;
  const L = F.values;
  const y = gatherSides(F, bs);
  for (let s = 0; s < nSuper; s++) {
    const f = superStart[s];
    const nc = superStart[s + 1] - f;
    const rp = superRowPtr[s];
    const nr = superRowPtr[s + 1] - rp;
    const base = superValPtr[s];
    for (let j = 0; j < nc; j++) {
      const cj = base + j * nr;
      const d = L[cj + j];
      const yj = (f + j) * 12;
      const a0 = (y[yj + 0] /= d), a1 = (y[yj + 1] /= d), a2 = (y[yj + 2] /= d), a3 = (y[yj + 3] /= d);
      const a4 = (y[yj + 4] /= d), a5 = (y[yj + 5] /= d), a6 = (y[yj + 6] /= d), a7 = (y[yj + 7] /= d);
      const a8 = (y[yj + 8] /= d), a9 = (y[yj + 9] /= d), a10 = (y[yj + 10] /= d), a11 = (y[yj + 11] /= d);
      for (let i = j + 1; i < nc; i++) {
        const l = L[cj + i];
        const yi = (f + i) * 12;
        y[yi + 0] -= l * a0; y[yi + 1] -= l * a1; y[yi + 2] -= l * a2; y[yi + 3] -= l * a3;
        y[yi + 4] -= l * a4; y[yi + 5] -= l * a5; y[yi + 6] -= l * a6; y[yi + 7] -= l * a7;
        y[yi + 8] -= l * a8; y[yi + 9] -= l * a9; y[yi + 10] -= l * a10; y[yi + 11] -= l * a11;
      }
      for (let i = nc; i < nr; i++) {
        const l = L[cj + i];
        const yi = superRows[rp + i] * 12;
        y[yi + 0] -= l * a0; y[yi + 1] -= l * a1; y[yi + 2] -= l * a2; y[yi + 3] -= l * a3;
        y[yi + 4] -= l * a4; y[yi + 5] -= l * a5; y[yi + 6] -= l * a6; y[yi + 7] -= l * a7;
        y[yi + 8] -= l * a8; y[yi + 9] -= l * a9; y[yi + 10] -= l * a10; y[yi + 11] -= l * a11;
      }
    }
  }
  for (let s = nSuper - 1; s >= 0; s--) {
    const f = superStart[s];
    const nc = superStart[s + 1] - f;
    const rp = superRowPtr[s];
    const nr = superRowPtr[s + 1] - rp;
    const base = superValPtr[s];
    for (let j = nc - 1; j >= 0; j--) {
      const cj = base + j * nr;
      const yj = (f + j) * 12;
      let s0 = y[yj + 0], s1 = y[yj + 1], s2 = y[yj + 2], s3 = y[yj + 3];
      let s4 = y[yj + 4], s5 = y[yj + 5], s6 = y[yj + 6], s7 = y[yj + 7];
      let s8 = y[yj + 8], s9 = y[yj + 9], s10 = y[yj + 10], s11 = y[yj + 11];
      for (let i = j + 1; i < nc; i++) {
        const l = L[cj + i];
        const yi = (f + i) * 12;
        s0 -= l * y[yi + 0]; s1 -= l * y[yi + 1]; s2 -= l * y[yi + 2]; s3 -= l * y[yi + 3];
        s4 -= l * y[yi + 4]; s5 -= l * y[yi + 5]; s6 -= l * y[yi + 6]; s7 -= l * y[yi + 7];
        s8 -= l * y[yi + 8]; s9 -= l * y[yi + 9]; s10 -= l * y[yi + 10]; s11 -= l * y[yi + 11];
      }
      for (let i = nc; i < nr; i++) {
        const l = L[cj + i];
        const yi = superRows[rp + i] * 12;
        s0 -= l * y[yi + 0]; s1 -= l * y[yi + 1]; s2 -= l * y[yi + 2]; s3 -= l * y[yi + 3];
        s4 -= l * y[yi + 4]; s5 -= l * y[yi + 5]; s6 -= l * y[yi + 6]; s7 -= l * y[yi + 7];
        s8 -= l * y[yi + 8]; s9 -= l * y[yi + 9]; s10 -= l * y[yi + 10]; s11 -= l * y[yi + 11];
      }
      const d = L[cj + j];
      y[yj + 0] = s0 / d; y[yj + 1] = s1 / d; y[yj + 2] = s2 / d; y[yj + 3] = s3 / d;
      y[yj + 4] = s4 / d; y[yj + 5] = s5 / d; y[yj + 6] = s6 / d; y[yj + 7] = s7 / d;
      y[yj + 8] = s8 / d; y[yj + 9] = s9 / d; y[yj + 10] = s10 / d; y[yj + 11] = s11 / d;
    }
  }
  return scatterSides(F, y, 12);
}
