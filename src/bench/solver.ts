/**
 * Solver benchmark: plane-stress stiffness of a clamped rectangle (structured right-triangle
 * mesh, CST or LST, E = 210000, ν = 0.3, t = 1) at about 50k, 200k and 1M dofs. Times
 * ordering, symbolic analysis, numeric factorisation and solve, reports nnz(L), peak RSS and
 * the factor-time growth exponent, and — when the anchor program /tmp/cholmod_mtx has been
 * built (a small program of ours that times a mature sparse Cholesky library on a Matrix Market
 * file) — runs it on the very same matrix and prints our/anchor ratios.
 *
 * The assembly here is a self-contained few lines on purpose: the benchmark must not depend on
 * the fem stage.
 */
import { execFileSync } from 'node:child_process';
import { createWriteStream, existsSync, unlinkSync } from 'node:fs';
import { once } from 'node:events';
import { fileURLToPath } from 'node:url';
import { recordGoal } from './goals.js';
import {
  chooseOrderingDetailed,
  csrFromTriplets,
  csrSubmatrix,
  factorize,
  factorKernels,
  matrixMarketChunks,
  residualNorm,
  solveFactor,
  symbolicFactor,
  type Csr,
} from '../linalg/index.js';

export interface BenchSolverOptions {
  /** largest dof count to run (default 1e6) */
  max?: number;
  /** element order: 1 = CST, 2 = LST (default 1, as in the anchor table) */
  order?: 1 | 2;
  /** run the anchor program when present (default true) */
  anchor?: boolean;
  /** print lines as they come (default true) */
  log?: boolean;
}

interface PlateMatrix {
  K: Csr;
  rowXY: Float64Array;
  nx: number;
  ny: number;
}

/** Plane-stress constitutive matrix, row-major 3×3 (Timoshenko & Goodier). */
function planeStressD(E: number, nu: number): Float64Array {
  const c = E / (1 - nu * nu);
  return Float64Array.from([c, c * nu, 0, c * nu, c, 0, 0, 0, (c * (1 - nu)) / 2]);
}

/**
 * K_e = t ∫ Bᵀ D B dA for a triangle with `nen` nodes (3: CST, 6: LST with mid-side nodes
 * 3,4,5 on edges 0-1, 1-2, 2-0), by the 3-point rule with points at the edge midpoints
 * (exact for the quadratic integrand of a straight-sided LST; Zienkiewicz & Taylor, vol. 1).
 */
function triangleStiffness(xy: number[], nen: 3 | 6, D: Float64Array, ke: Float64Array): void {
  const x0 = xy[0], y0 = xy[1], x1 = xy[2], y1 = xy[3], x2 = xy[4], y2 = xy[5];
  const twoA = (x1 - x0) * (y2 - y0) - (x2 - x0) * (y1 - y0);
  const area = twoA / 2;
  // gradients of the area coordinates L0, L1, L2
  const b = [(y1 - y2) / twoA, (y2 - y0) / twoA, (y0 - y1) / twoA];
  const c = [(x2 - x1) / twoA, (x0 - x2) / twoA, (x1 - x0) / twoA];
  const ndof = 2 * nen;
  ke.fill(0, 0, ndof * ndof);
  const pts = nen === 3 ? [[1 / 3, 1 / 3, 1 / 3]] : [[0.5, 0.5, 0], [0, 0.5, 0.5], [0.5, 0, 0.5]];
  const wgt = area / pts.length;
  const dNdx = new Float64Array(nen);
  const dNdy = new Float64Array(nen);
  const DB = new Float64Array(3 * 12);
  for (const L of pts) {
    if (nen === 3) {
      for (let a = 0; a < 3; a++) { dNdx[a] = b[a]; dNdy[a] = c[a]; }
    } else {
      for (let a = 0; a < 3; a++) { dNdx[a] = (4 * L[a] - 1) * b[a]; dNdy[a] = (4 * L[a] - 1) * c[a]; }
      const edges = [[0, 1], [1, 2], [2, 0]];
      for (let m = 0; m < 3; m++) {
        const [i, j] = edges[m];
        dNdx[3 + m] = 4 * (L[i] * b[j] + L[j] * b[i]);
        dNdy[3 + m] = 4 * (L[i] * c[j] + L[j] * c[i]);
      }
    }
    // B is 3 × ndof: [dN/dx 0; 0 dN/dy; dN/dy dN/dx]
    for (let r = 0; r < 3; r++) {
      for (let a = 0; a < nen; a++) {
        DB[r * ndof + 2 * a] = D[r * 3] * dNdx[a] + D[r * 3 + 2] * dNdy[a];
        DB[r * ndof + 2 * a + 1] = D[r * 3 + 1] * dNdy[a] + D[r * 3 + 2] * dNdx[a];
      }
    }
    for (let a = 0; a < nen; a++) {
      const bx = dNdx[a], by = dNdy[a];
      for (let q = 0; q < ndof; q++) {
        // rows 2a (ε_x, γ_xy parts) and 2a+1 (ε_y, γ_xy parts) of Bᵀ(DB)
        ke[2 * a * ndof + q] += wgt * (bx * DB[q] + by * DB[2 * ndof + q]);
        ke[(2 * a + 1) * ndof + q] += wgt * (by * DB[ndof + q] + bx * DB[2 * ndof + q]);
      }
    }
  }
}

/**
 * Rectangle 2·ny × ny (unit squares), each square cut into two right triangles; left edge
 * clamped (both dofs eliminated). LST adds mid-side nodes (the node grid doubles).
 */
export function plateMatrix(nx: number, ny: number, order: 1 | 2): PlateMatrix {
  const E = 210000, nu = 0.3;
  const D = planeStressD(E, nu);
  const s = order; // node grid steps per element edge
  const gx = s * nx + 1, gy = s * ny + 1;
  const nodeId = (ix: number, iy: number) => ix * gy + iy;
  const nNodes = gx * gy;
  const nen = order === 1 ? 3 : 6;
  const ndof = 2 * nen;
  const nTri = 2 * nx * ny;
  const nTrip = nTri * ndof * ndof;
  const rows = new Int32Array(nTrip), cols = new Int32Array(nTrip), vals = new Float64Array(nTrip);
  const ke = new Float64Array(144);
  const conn = new Int32Array(6);
  let w = 0;
  const xy: number[] = [0, 0, 0, 0, 0, 0];
  const addTri = (a: [number, number], b: [number, number], c: [number, number]) => {
    const corners = [a, b, c];
    for (let k = 0; k < 3; k++) {
      conn[k] = nodeId(corners[k][0], corners[k][1]);
      xy[2 * k] = corners[k][0] / s;
      xy[2 * k + 1] = corners[k][1] / s;
    }
    if (order === 2) {
      const edges = [[0, 1], [1, 2], [2, 0]];
      for (let m = 0; m < 3; m++) {
        const p = corners[edges[m][0]], q = corners[edges[m][1]];
        conn[3 + m] = nodeId((p[0] + q[0]) / 2, (p[1] + q[1]) / 2);
      }
    }
    triangleStiffness(xy, nen as 3 | 6, D, ke);
    for (let r = 0; r < ndof; r++) {
      const gr = 2 * conn[r >> 1] + (r & 1);
      for (let q = 0; q < ndof; q++) {
        rows[w] = gr;
        cols[w] = 2 * conn[q >> 1] + (q & 1);
        vals[w] = ke[r * ndof + q];
        w++;
      }
    }
  };
  for (let ex = 0; ex < nx; ex++) {
    for (let ey = 0; ey < ny; ey++) {
      const x0 = s * ex, y0 = s * ey, x1 = x0 + s, y1 = y0 + s;
      addTri([x0, y0], [x1, y0], [x1, y1]);
      addTri([x0, y0], [x1, y1], [x0, y1]);
    }
  }
  const full = csrFromTriplets(2 * nNodes, rows, cols, vals);
  // clamp x = 0: keep every dof of nodes with ix > 0
  const keep = new Int32Array(2 * nNodes - 2 * gy);
  const rowXY = new Float64Array(2 * keep.length);
  let k = 0;
  for (let ix = 1; ix < gx; ix++) {
    for (let iy = 0; iy < gy; iy++) {
      const node = nodeId(ix, iy);
      for (let d = 0; d < 2; d++) {
        rowXY[2 * k] = ix / s;
        rowXY[2 * k + 1] = iy / s;
        keep[k++] = 2 * node + d;
      }
    }
  }
  return { K: csrSubmatrix(full, keep), rowXY, nx, ny };
}

export interface AnchorResult {
  t_analyze: number;
  t_factorize: number;
  t_factorize2: number;
  t_solve_med: number;
  lnz: number;
  lnz_amd: number;
  lnz_metis: number;
  ordering: string;
  maxrss_MiB: number;
  flops: number;
}

export async function writeMatrixMarket(K: Csr, file: string): Promise<void> {
  const out = createWriteStream(file);
  for (const chunk of matrixMarketChunks(K)) {
    if (!out.write(chunk)) await once(out, 'drain');
  }
  out.end();
  await once(out, 'finish');
}

/**
 * The anchor program (../shared/anchors.md): /tmp/cholmod_mtx, or the one PEAKWISE_ANCHOR names —
 * e.g. the same source built with CLOCK_PROCESS_CPUTIME_ID in place of CLOCK_MONOTONIC, so that on
 * a shared, loaded machine it reports CPU seconds to compare with our CPU seconds (docs/linalg.md).
 */
export const ANCHOR = process.env.PEAKWISE_ANCHOR ?? '/tmp/cholmod_mtx';
/** PEAKWISE_ANCHOR_CPU=1: the anchor reports CPU seconds, so goals compare our CPU seconds with them. */
export const ANCHOR_CPU = process.env.PEAKWISE_ANCHOR_CPU === '1';

export function runAnchor(file: string): AnchorResult | undefined {
  try {
    const text = execFileSync(ANCHOR, [file, 'default', '3'], {
      env: { ...process.env, OMP_NUM_THREADS: '1', OPENBLAS_NUM_THREADS: '1' },
      encoding: 'utf8',
      maxBuffer: 1 << 20,
    });
    const line = text.split('\n').find((l) => l.startsWith('RESULT '));
    return line ? (JSON.parse(line.slice(7)) as AnchorResult) : undefined;
  } catch {
    return undefined;
  }
}

const seconds = (t0: number) => (performance.now() - t0) / 1000;
/** CPU seconds of this process since c0 (steadier than wall time on a loaded machine) */
const cpuSeconds = (c0: NodeJS.CpuUsage) => {
  const c = process.cpuUsage(c0);
  return (c.user + c.system) / 1e6;
};

export async function benchSolver(opts: BenchSolverOptions = {}): Promise<object> {
  const max = opts.max ?? 1e6;
  const order = opts.order ?? 1;
  const log = opts.log ?? true;
  const useAnchor = (opts.anchor ?? true) && existsSync(ANCHOR);
  const say = (s: string) => { if (log) console.log(s); };
  // ny for ≈ 50k, 200k, 800k dofs (CST; the same node grids for LST use half the elements)
  const sizes = order === 1 ? [112, 224, 448] : [56, 112, 224];
  const results: Record<string, unknown>[] = [];
  say(`solver benchmark: clamped rectangle, ${order === 1 ? 'CST' : 'LST'}, plane stress E = 210000, ν = 0.3`);
  {
    // warm-up (not timed): the JIT compiles the kernels on a small plate first, as it would
    // have during the earlier solves of a study. Two rounds on ~15k dofs: V8 moves the
    // WebAssembly kernels to its optimising tier in the background, which needs a few
    // hundred milliseconds of use on a loaded machine.
    for (let round = 0; round < 2; round++) {
      const { K, rowXY } = plateMatrix(order === 1 ? 120 : 60, order === 1 ? 60 : 30, order);
      const F = factorize(K, symbolicFactor(K, chooseOrderingDetailed(K, rowXY).ordering));
      solveFactor(F, new Float64Array(K.n).fill(1));
    }
  }
  for (const ny of sizes) {
    const nx = 2 * ny;
    let t0 = performance.now();
    const { K, rowXY } = plateMatrix(nx, ny, order);
    const assembleS = seconds(t0);
    if (K.n > max * 1.05) break;
    t0 = performance.now();
    let c0 = process.cpuUsage();
    const choice = chooseOrderingDetailed(K, rowXY);
    const orderS = seconds(t0);
    const orderCpuS = cpuSeconds(c0);
    t0 = performance.now();
    c0 = process.cpuUsage();
    const sym = symbolicFactor(K, choice.ordering);
    const symbolicS = seconds(t0);
    const symbolicCpuS = cpuSeconds(c0);
    t0 = performance.now();
    const cpu0 = process.cpuUsage();
    const F = factorize(K, sym);
    const factorS = seconds(t0);
    // CPU time of the factorisation: on a loaded shared machine it is steadier than wall time
    const cpu = process.cpuUsage(cpu0);
    const factorCpuS = (cpu.user + cpu.system) / 1e6;
    const kernels = factorKernels(F);
    const b = new Float64Array(K.n).fill(1);
    t0 = performance.now();
    const x = solveFactor(F, b);
    const solveS = seconds(t0);
    const residual = residualNorm(K, x, b);
    const maxRssMiB = process.resourceUsage().maxRSS / 1024;
    const row: Record<string, unknown> = {
      dofs: K.n,
      nnzA: K.rowPtr[K.n],
      assembleS,
      orderS,
      orderCpuS,
      symbolicS,
      symbolicCpuS,
      factorS,
      factorCpuS,
      kernels,
      solveS,
      method: choice.ordering.method,
      candidates: choice.candidates,
      nnzL: sym.nnzL,
      nnzStored: sym.nnzStored,
      supernodes: sym.nSuper,
      gflop: sym.flops / 1e9,
      gflopPerS: sym.flops / 1e9 / factorS,
      residual,
      maxRssMiB,
    };
    say(
      `dofs ${K.n}: assemble ${assembleS.toFixed(3)} s, order ${orderS.toFixed(3)} s (${choice.ordering.method}; ` +
        choice.candidates.map((c) => `${c.method} ${(c.nnzL / 1e6).toFixed(2)}M`).join(', ') +
        `; cpu ${orderCpuS.toFixed(3)} s), symbolic ${symbolicS.toFixed(3)} s (cpu ${symbolicCpuS.toFixed(3)} s), factor ${factorS.toFixed(3)} s (${(sym.flops / 1e9).toFixed(2)} Gflop, ` +
        `${(sym.flops / 1e9 / factorS).toFixed(2)} Gflop/s; cpu ${factorCpuS.toFixed(3)} s, ${(sym.flops / 1e9 / factorCpuS).toFixed(2)} Gflop/s; ` +
        `${kernels === 'wasm' ? 'WebAssembly SIMD' : 'JavaScript'} kernels, 1 thread), solve ${solveS.toFixed(3)} s, nnz(L) ${(sym.nnzL / 1e6).toFixed(2)}M ` +
        `(stored ${(sym.nnzStored / 1e6).toFixed(2)}M), residual ${residual.toExponential(2)}, peak RSS ${maxRssMiB.toFixed(0)} MiB`,
    );
    if (useAnchor) {
      const file = `/tmp/peakwise_bench_k_${K.n}.mtx`;
      await writeMatrixMarket(K, file);
      const a = runAnchor(file);
      try { unlinkSync(file); } catch { /* already gone */ }
      if (a) {
        const oursWall = orderS + symbolicS + factorS;
        const oursCpu = orderCpuS + symbolicCpuS + factorCpuS;
        const ours = ANCHOR_CPU ? oursCpu : oursWall;
        const theirs = a.t_analyze + a.t_factorize;
        row.anchor = a;
        row.ratioTime = ours / theirs;
        row.ratioTimeCpu = oursCpu / theirs;
        row.ratioNnzL = sym.nnzL / a.lnz;
        say(
          `  anchor: analyze ${a.t_analyze.toFixed(3)} s (${a.ordering}), factor ${a.t_factorize.toFixed(3)} s ` +
            `(repeat ${a.t_factorize2.toFixed(3)} s), solve ${a.t_solve_med.toFixed(3)} s, nnz(L) ${(a.lnz / 1e6).toFixed(2)}M, ` +
            `RSS ${a.maxrss_MiB.toFixed(0)} MiB → ratio ordering+factor ${(oursWall / theirs).toFixed(2)} (our cpu ${(oursCpu / theirs).toFixed(2)}; the anchor's seconds are ${ANCHOR_CPU ? 'CPU' : 'wall'}), nnz(L) ${(sym.nnzL / a.lnz).toFixed(2)}`,
        );
        if (K.n >= 150_000) {
          recordGoal({
            what: `solver order + factor, clamped rectangle ${order === 1 ? 'CST' : 'LST'} ${K.n} dofs`,
            measured: `ours ${ours.toFixed(2)} s, anchor ${theirs.toFixed(2)} s (${a.ordering}; ${ANCHOR_CPU ? 'CPU' : 'wall'} seconds)`,
            value: ours / theirs, limit: 1, unit: '×', against: 'the anchor (optimised BLAS, 1 thread)',
          });
        }
      } else {
        say('  anchor: run failed');
      }
    }
    results.push(row);
  }
  const growth: { from: number; to: number; factorExponent: number; nnzLExponent: number }[] = [];
  for (let i = 1; i < results.length; i++) {
    const a = results[i - 1], c = results[i];
    const r = Math.log((c.dofs as number) / (a.dofs as number));
    growth.push({
      from: a.dofs as number,
      to: c.dofs as number,
      factorExponent: Math.log((c.factorS as number) / (a.factorS as number)) / r,
      nnzLExponent: Math.log((c.nnzL as number) / (a.nnzL as number)) / r,
    });
    say(
      `growth ${a.dofs} → ${c.dofs}: factor time ∝ dofs^${growth[i - 1].factorExponent.toFixed(2)}, nnz(L) ∝ dofs^${growth[i - 1].nnzLExponent.toFixed(2)}`,
    );
  }
  return { order, results, growth };
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const args = process.argv.slice(2);
  const maxAt = args.indexOf('--max');
  const orderAt = args.indexOf('--order');
  const max = maxAt >= 0 ? Number(args[maxAt + 1]) : 1e6;
  const order = orderAt >= 0 && args[orderAt + 1] === '2' ? 2 : 1;
  const result = await benchSolver({ max, order, anchor: !args.includes('--no-anchor') });
  if (args.includes('--json')) console.log(JSON.stringify(result));
}
