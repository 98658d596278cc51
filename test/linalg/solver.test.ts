import { describe, it, expect } from 'vitest';
import { CholeskyDecomposition, Matrix } from 'ml-matrix';
import {
  analyze,
  factorize,
  refactorize,
  solveFactor,
  solveSpd,
  residualNorm,
  orderAmd,
  orderNatural,
  orderNestedDissection,
  chooseOrderingDetailed,
  NotPositiveDefiniteError,
  csrFromTriplets,
  type Csr,
  type Factor,
} from '../../src/linalg/index.js';
import { SolveError } from '../../src/errors.js';
import { gridKronecker, randomSpd, seededRandom, toDense } from './helpers.js';

function rhs(n: number, seed: number): Float64Array {
  const rnd = seededRandom(seed);
  return Float64Array.from({ length: n }, () => rnd() * 2 - 1);
}

function denseSolve(A: Csr, b: Float64Array): number[] {
  const chol = new CholeskyDecomposition(new Matrix(toDense(A)));
  expect(chol.isPositiveDefinite()).toBe(true);
  return chol.solve(Matrix.columnVector(Array.from(b))).to1DArray();
}

function maxRelDiff(x: ArrayLike<number>, y: ArrayLike<number>): number {
  let d = 0, s = 0;
  for (let i = 0; i < x.length; i++) { d = Math.max(d, Math.abs(x[i] - y[i])); s = Math.max(s, Math.abs(y[i])); }
  return d / s;
}

/** Dense L from the supernodal panels, in the permuted numbering. */
function denseL(F: Factor): number[][] {
  const S = F.symbolic;
  const L = Array.from({ length: F.n }, () => new Array<number>(F.n).fill(0));
  for (let s = 0; s < S.nSuper; s++) {
    const f = S.superStart[s], nc = S.superStart[s + 1] - f;
    const rp = S.superRowPtr[s], nr = S.superRowPtr[s + 1] - rp;
    for (let j = 0; j < nc; j++) for (let i = j; i < nr; i++) L[S.superRows[rp + i]][f + j] = F.values[S.superValPtr[s] + j * nr + i];
  }
  return L;
}

describe('sparse Cholesky against a dense solve (ml-matrix CholeskyDecomposition)', () => {
  // the two solvers round differently; for these well-conditioned matrices (diagonally
  // dominant, cond ≲ 1e3) agreement to 1e-10 relative is far above the ~1e-13 rounding level
  it('random sparse SPD matrices, every ordering', () => {
    for (let seed = 1; seed <= 12; seed++) {
      const n = 20 + 7 * seed;
      const A = randomSpd(n, 0.06 + 0.01 * (seed % 4), seed);
      const b = rhs(n, 100 + seed);
      const ref = denseSolve(A, b);
      for (const ord of [orderNatural(n), orderAmd(A)]) {
        const F = factorize(A, analyze(A, ord));
        const x = solveFactor(F, b);
        expect(maxRelDiff(x, ref)).toBeLessThan(1e-10);
        expect(residualNorm(A, x, b)).toBeLessThan(1e-12);
      }
    }
  });

  it('FE-like 2D Laplacian ⊗ 2×2 block, AMD and nested dissection', () => {
    const { A, rowXY } = gridKronecker(9, 7);
    const b = rhs(A.n, 7);
    const ref = denseSolve(A, b);
    for (const ord of [orderAmd(A), orderNestedDissection(A, rowXY, { leafSize: 8 })]) {
      const F = factorize(A, analyze(A, ord));
      const x = solveFactor(F, b);
      expect(maxRelDiff(x, ref)).toBeLessThan(1e-10);
      expect(residualNorm(A, x, b)).toBeLessThan(1e-12);
    }
  });

  it('solveSpd with coordinates on a larger grid keeps the scaled residual at rounding level', () => {
    const { A, rowXY } = gridKronecker(60, 50);
    const b = rhs(A.n, 3);
    const sol = solveSpd(A, b, rowXY);
    expect(residualNorm(A, sol.x, b)).toBeLessThan(1e-12);
    expect(sol.nnzL).toBeGreaterThan(A.n);
  });

  it('refactorize reuses the analysis for new values on the same pattern', () => {
    const { A } = gridKronecker(12, 10);
    const F = factorize(A, analyze(A));
    const A2: Csr = { ...A, values: A.values.map((v) => 3 * v) };
    const F2 = refactorize(A2, F);
    const b = rhs(A.n, 5);
    const x = solveFactor(F2, b);
    const x1 = solveFactor(factorize(A, analyze(A)), b);
    // (3A)⁻¹ b = A⁻¹ b / 3 exactly in exact arithmetic
    expect(maxRelDiff(x, x1.map((v) => v / 3))).toBeLessThan(1e-12);
  });
});

describe('factor reconstruction L·Lᵀ = P A Pᵀ', () => {
  it('holds entrywise on small cases (relative to max |A|)', () => {
    const cases: Csr[] = [randomSpd(30, 0.15, 42), gridKronecker(5, 4).A, randomSpd(1, 1, 1)];
    for (const A of cases) {
      const F = factorize(A, analyze(A));
      const L = denseL(F);
      const D = toDense(A);
      const perm = F.symbolic.ordering.perm;
      let err = 0, scale = 0;
      for (let i = 0; i < A.n; i++) for (let j = 0; j < A.n; j++) {
        let s = 0;
        for (let k = 0; k < A.n; k++) s += L[i][k] * L[j][k];
        err = Math.max(err, Math.abs(s - D[perm[i]][perm[j]]));
        scale = Math.max(scale, Math.abs(D[i][j]));
      }
      expect(err / scale).toBeLessThan(1e-13);
    }
  });
});

describe('orderings', () => {
  function isPermutation(p: Int32Array, n: number): boolean {
    if (p.length !== n) return false;
    const seen = new Uint8Array(n);
    for (const v of p) { if (v < 0 || v >= n || seen[v]) return false; seen[v] = 1; }
    return true;
  }

  it('AMD and nested dissection return valid permutations and inverses', () => {
    const { A, rowXY } = gridKronecker(23, 17);
    for (const ord of [orderAmd(A), orderNestedDissection(A, rowXY), orderAmd(randomSpd(50, 0.1, 9))]) {
      const n = ord.perm.length;
      expect(isPermutation(ord.perm, n)).toBe(true);
      for (let k = 0; k < n; k++) expect(ord.iperm[ord.perm[k]]).toBe(k);
    }
  });

  it('reduce fill against the natural order on a 40×40 grid (AMD ≥ 3×, ND ≥ 2×)', () => {
    // natural (banded) order on a 40×40 grid fills the whole band: ≈ n·bandwidth ≈ 2.5e5 entries,
    // while nested dissection and minimum degree give O(n log n) (George 1973). At this small size
    // the log factor and ND's constant still weigh, so the bounds are loose (common practice)
    const { A, rowXY } = gridKronecker(40, 40);
    const natural = analyze(A, orderNatural(A.n)).nnzL;
    const amd = analyze(A, orderAmd(A)).nnzL;
    const nd = analyze(A, orderNestedDissection(A, rowXY)).nnzL;
    expect(natural / amd).toBeGreaterThan(3);
    expect(natural / nd).toBeGreaterThan(2);
    const choice = chooseOrderingDetailed(A, rowXY, { ndMinRows: 0 });
    expect(choice.candidates.length).toBe(2);
    expect(choice.nnzL).toBe(Math.min(...choice.candidates.map((c) => c.nnzL)));
    // above ndOnlyRows nested dissection alone: one candidate, the same permutation and fill as ND
    const ndOnly = chooseOrderingDetailed(A, rowXY, { ndMinRows: 0, ndOnlyRows: 0 });
    expect(ndOnly.candidates.map((c) => c.method)).toEqual(['nested-dissection']);
    expect(Array.from(ndOnly.ordering.perm)).toEqual(Array.from(orderNestedDissection(A, rowXY).perm));
    expect(ndOnly.nnzL).toBe(nd);
  });

  it('symbolic column counts match the numeric pattern (row-subtree check on the dense L)', () => {
    const A = randomSpd(40, 0.08, 17);
    const S = analyze(A, orderAmd(A), { relax: false });
    const L = denseL(factorize(A, S));
    // with random values there is no accidental cancellation, so nonzeros = structural fill
    let count = 0;
    for (let i = 0; i < A.n; i++) for (let j = 0; j <= i; j++) if (L[i][j] !== 0) count++;
    expect(count).toBe(S.nnzL);
  });
});

describe('breakdown', () => {
  it('a singular matrix throws NotPositiveDefiniteError naming the original dof', () => {
    // 4 dofs, dof 2 decoupled with zero stiffness (a free motion)
    const A = csrFromTriplets(4, [0, 0, 1, 1, 2, 3], [0, 1, 0, 1, 2, 3], [4, 1, 1, 3, 0, 2]);
    let caught: unknown;
    try { factorize(A, analyze(A)); } catch (e) { caught = e; }
    expect(caught).toBeInstanceOf(NotPositiveDefiniteError);
    expect(caught).toBeInstanceOf(SolveError);
    expect((caught as NotPositiveDefiniteError).dof).toBe(2);
  });

  it('an indefinite matrix throws at the dof whose pivot goes negative', () => {
    // [[1,2],[2,1]] has eigenvalues 3 and −1; with a natural order the second pivot is 1−4 = −3
    const A = csrFromTriplets(3, [0, 0, 1, 1, 2], [0, 1, 0, 1, 2], [1, 2, 2, 1, 5]);
    let caught: unknown;
    try { factorize(A, analyze(A, orderNatural(3))); } catch (e) { caught = e; }
    expect(caught).toBeInstanceOf(NotPositiveDefiniteError);
    expect((caught as NotPositiveDefiniteError).dof).toBe(1);
    expect((caught as NotPositiveDefiniteError).pivot).toBeCloseTo(-3, 12);
  });
});

// An assembled finite element stiffness (not a model matrix): a 6-node-triangle plate from the
// real mesher and assembler, clamped on one edge, supported dofs removed as the solver does; the
// sparse factor must agree with a dense Cholesky of the same matrix (ml-matrix) to round-off.
describe('sparse Cholesky on an assembled LST stiffness against a dense solve', () => {
  it('agrees with ml-matrix CholeskyDecomposition to 1e-10 relative', async () => {
    const { parseModel } = await import('../../src/model/index.js');
    const { buildGeometry } = await import('../../src/geometry/index.js');
    const { meshPlate, sizeFieldFromSettings } = await import('../../src/mesh/index.js');
    const { assembleStiffness, supportedDofs } = await import('../../src/fem/index.js');
    const { csrSubmatrix, solveSpd } = await import('../../src/linalg/index.js');
    const model = parseModel(`
material: { E: 210000, nu: 0.3 }
thickness: 2
plate: { outline: [[0, 0], [30, 0], [30, 12], [0, 12]], openings: [ { id: h, circle: { center: [18, 6], radius: 3 } } ] }
supports: [ { where: { x: 0 }, fix: [x, y] } ]
loads: [ { where: { x: 30 }, traction: [5, 1] } ]
mesh: { size: 4, order: 2 }
`, 'small.yaml');
    const geometry = buildGeometry(model.plate);
    const mesh = meshPlate(geometry, { sizeAt: sizeFieldFromSettings(geometry, model.mesh), order: 2 });
    const section = { E: 210000, nu: 0.3, state: 'plane-stress' as const, thickness: 2 };
    const fixed = supportedDofs(mesh, geometry, model.supports);
    const keep: number[] = [];
    for (let i = 0; i < fixed.length; i++) if (!fixed[i]) keep.push(i);
    const K = csrSubmatrix(assembleStiffness(mesh, section), Int32Array.from(keep));
    expect(K.n).toBeLessThan(2000); // small enough for a dense factor in a test
    const rnd = seededRandom(7);
    const b = Float64Array.from({ length: K.n }, () => rnd() - 0.5);
    const sparse = solveSpd(K, b).x;
    // the assembled halves can differ in the last bit (summation order); the dense factor wants exact symmetry
    const A = new Matrix(toDense(K));
    const dense = new CholeskyDecomposition(A.add(A.transpose()).div(2)).solve(Matrix.columnVector(Array.from(b))).getColumn(0);
    let num = 0;
    let den = 0;
    for (let i = 0; i < K.n; i++) {
      num = Math.max(num, Math.abs(sparse[i] - dense[i]));
      den = Math.max(den, Math.abs(dense[i]));
    }
    expect(num / den).toBeLessThan(1e-10);
  });
});
