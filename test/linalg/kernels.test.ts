import { describe, it, expect } from 'vitest';
import {
  analyze,
  factorize,
  refactorize,
  solveFactor,
  residualNorm,
  orderAmd,
  orderNatural,
  orderNestedDissection,
  factorKernels,
  wasmKernelsAvailable,
  NotPositiveDefiniteError,
  csrFromTriplets,
  type Csr,
} from '../../src/linalg/index.js';
import { gridKronecker, randomSpd, seededRandom } from './helpers.js';

function rhs(n: number, seed: number): Float64Array {
  const rnd = seededRandom(seed);
  return Float64Array.from({ length: n }, () => rnd() * 2 - 1);
}

/** max |a − b| over max |b|, over the entries the factor defines (lower parts of the panels) */
function maxRelDiffL(a: Float64Array, b: Float64Array, A: Csr, ord: ReturnType<typeof orderAmd>): number {
  const S = analyze(A, ord);
  let d = 0, s = 0;
  for (let k = 0; k < S.nSuper; k++) {
    const nc = S.superStart[k + 1] - S.superStart[k], nr = S.superRowPtr[k + 1] - S.superRowPtr[k];
    for (let j = 0; j < nc; j++) {
      for (let i = j; i < nr; i++) {
        const p = S.superValPtr[k] + j * nr + i;
        d = Math.max(d, Math.abs(a[p] - b[p]));
        s = Math.max(s, Math.abs(b[p]));
      }
    }
  }
  return d / s;
}

// The SIMD and plain kernels sum the same products in different groupings (the JS kernel adds
// 64-deep partial sums), so the factors agree to rounding: ~1e-15 relative for these
// well-conditioned matrices; 1e-12 leaves room for growth over a few hundred columns.
describe('WebAssembly SIMD kernels against the plain JavaScript kernels', () => {
  it('the runtime (Node 20) provides WebAssembly SIMD', () => {
    expect(wasmKernelsAvailable()).toBe(true);
  });

  it('give the same factor on random SPD matrices (odd sizes, every ordering)', () => {
    for (let seed = 1; seed <= 10; seed++) {
      const n = 17 + 13 * seed;
      const A = randomSpd(n, 0.08 + 0.02 * (seed % 3), seed);
      for (const ord of [orderNatural(n), orderAmd(A)]) {
        const S = analyze(A, ord);
        const Fj = factorize(A, S, { kernels: 'js' });
        const Fw = factorize(A, S, { kernels: 'wasm' });
        expect(factorKernels(Fj)).toBe('js');
        expect(factorKernels(Fw)).toBe('wasm');
        expect(maxRelDiffL(Fw.values, Fj.values, A, ord)).toBeLessThan(1e-12);
        const b = rhs(n, seed);
        expect(residualNorm(A, solveFactor(Fw, b), b)).toBeLessThan(1e-13);
      }
    }
  });

  it('give the same factor on an FE-like grid with wide supernodes (AMD and nested dissection)', () => {
    const { A, rowXY } = gridKronecker(37, 23);
    for (const ord of [orderAmd(A), orderNestedDissection(A, rowXY, { leafSize: 16 })]) {
      const S = analyze(A, ord);
      const Fj = factorize(A, S, { kernels: 'js' });
      const Fw = factorize(A, S, { kernels: 'wasm' });
      expect(maxRelDiffL(Fw.values, Fj.values, A, ord)).toBeLessThan(1e-12);
      const b = rhs(A.n, 3);
      const xj = solveFactor(Fj, b), xw = solveFactor(Fw, b);
      expect(residualNorm(A, xw, b)).toBeLessThan(1e-14);
      let d = 0, s = 0;
      for (let i = 0; i < A.n; i++) { d = Math.max(d, Math.abs(xw[i] - xj[i])); s = Math.max(s, Math.abs(xj[i])); }
      expect(d / s).toBeLessThan(1e-12);
    }
  });

  it('refactorize keeps the factor in the same WebAssembly memory and gives new values', () => {
    const { A } = gridKronecker(15, 11);
    const { A: A2 } = gridKronecker(15, 11, 0.5);
    const S = analyze(A, orderAmd(A));
    const F = factorize(A, S, { kernels: 'wasm' });
    const buffer = F.values.buffer;
    const F2 = refactorize(A2, F);
    expect(factorKernels(F2)).toBe('wasm');
    expect(F2.values.buffer).toBe(buffer);
    const b = rhs(A.n, 9);
    expect(residualNorm(A2, solveFactor(F2, b), b)).toBeLessThan(1e-14);
    const F3 = factorize(A2, S, { kernels: 'js' });
    expect(maxRelDiffL(F2.values, F3.values, A2, S.ordering)).toBeLessThan(1e-12);
  });

  it('report a breakdown at the same dof with either kernel', () => {
    // 3 × 3 all-ones block: singular, pivot 2 vanishes; the dof index is the original one
    const r: number[] = [], c: number[] = [], v: number[] = [];
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) { r.push(i); c.push(j); v.push(1); }
    const A = csrFromTriplets(3, Int32Array.from(r), Int32Array.from(c), Float64Array.from(v));
    const S = analyze(A, orderNatural(3));
    for (const kernels of ['js', 'wasm'] as const) {
      let err: unknown;
      try { factorize(A, S, { kernels }); } catch (e) { err = e; }
      expect(err).toBeInstanceOf(NotPositiveDefiniteError);
      expect((err as NotPositiveDefiniteError).dof).toBe(1);
    }
  });
});
