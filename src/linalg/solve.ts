import { SolveError } from '../errors.js';
import { validateCsr } from './csr.js';
import { numericFactor, solveWithFactor, solveWithFactorMany, type FactorOptions } from './numeric.js';
import { chooseOrdering } from './ordering.js';
import { symbolicFactor, type SupernodeOptions } from './symbolic.js';
import type { Csr, Factor, Ordering, Symbolic } from './types.js';

/**
 * Symbolic analysis: fill-reducing ordering (chooseOrdering when none is given),
 * elimination tree, column counts, supernodes. Depends only on the pattern of A.
 */
export function analyze(A: Csr, ordering?: Ordering, options: SupernodeOptions & { rowXY?: Float64Array } = {}): Symbolic {
  validateCsr(A, 'stiffness matrix');
  const ord = ordering ?? chooseOrdering(A, options.rowXY);
  if (ord.perm.length !== A.n || ord.iperm.length !== A.n) {
    throw new TypeError(`ordering has length ${ord.perm.length}, matrix order is ${A.n}`);
  }
  return symbolicFactor(A, ord, options);
}

/** Numeric Cholesky of A on a symbolic analysis of A's pattern. */
export function factorize(A: Csr, symbolic: Symbolic, options: FactorOptions = {}): Factor {
  if (A.n !== symbolic.n) throw new TypeError(`matrix order ${A.n} differs from the analysis (${symbolic.n})`);
  return numericFactor(A, symbolic, options);
}

/** Refactor new values on the same pattern, reusing the previous factor's storage. */
export function refactorize(A: Csr, previous: Factor, options: FactorOptions = {}): Factor {
  if (A.n !== previous.n) throw new TypeError(`matrix order ${A.n} differs from the factor (${previous.n})`);
  return numericFactor(A, previous.symbolic, options, previous.values);
}

/** x = A⁻¹ b from a factor of A. */
export function solveFactor(F: Factor, b: ArrayLike<number>): Float64Array {
  if (b.length !== F.n) throw new TypeError(`right-hand side has length ${b.length}, matrix order is ${F.n}`);
  for (let i = 0; i < b.length; i++) {
    if (!Number.isFinite(b[i])) throw new SolveError(`right-hand side entry ${i} is ${b[i]}`);
  }
  return solveWithFactor(F, b);
}

/**
 * X = A⁻¹ B for several right-hand sides from one factor of A, in one sweep over the factor
 * (`solveWithFactorMany`): each result equals `solveFactor` of that side, to the last bit.
 */
export function solveFactorMany(F: Factor, bs: readonly ArrayLike<number>[]): Float64Array[] {
  bs.forEach((b, r) => {
    if (b.length !== F.n) throw new TypeError(`right-hand side ${r} has length ${b.length}, matrix order is ${F.n}`);
    for (let i = 0; i < b.length; i++) {
      if (!Number.isFinite(b[i])) throw new SolveError(`right-hand side ${r}, entry ${i} is ${b[i]}`);
    }
  });
  if (bs.length === 0) return [];
  return solveWithFactorMany(F, bs);
}

export interface SpdSolution {
  x: Float64Array;
  nnzL: number;
  method: Ordering['method'];
  timings: { orderS: number; symbolicS: number; factorS: number; solveS: number };
}

function seconds(t0: number): number {
  return (performance.now() - t0) / 1000;
}

/** One-shot A x = b for symmetric positive definite A (rowXY: x, y per row enables nested dissection). */
export function solveSpd(A: Csr, b: ArrayLike<number>, rowXY?: Float64Array): SpdSolution {
  validateCsr(A, 'stiffness matrix');
  let t0 = performance.now();
  const ordering = chooseOrdering(A, rowXY);
  const orderS = seconds(t0);
  t0 = performance.now();
  const symbolic = symbolicFactor(A, ordering);
  const symbolicS = seconds(t0);
  t0 = performance.now();
  const F = numericFactor(A, symbolic);
  const factorS = seconds(t0);
  t0 = performance.now();
  const x = solveFactor(F, b);
  const solveS = seconds(t0);
  return { x, nnzL: F.nnzL, method: ordering.method, timings: { orderS, symbolicS, factorS, solveS } };
}
