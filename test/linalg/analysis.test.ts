import { describe, it, expect } from 'vitest';
import {
  analyze,
  chooseOrderingDetailed,
  csrFromTriplets,
  orderAmd,
  orderNestedDissection,
  postorderedTree,
  symbolicFactor,
  type Csr,
  type Ordering,
} from '../../src/linalg/index.js';
import { gridKronecker, randomSpd } from './helpers.js';

/** A ⊗ B for a dense SPD m × m block B: every vertex of A becomes a node of m rows. */
function kronBlock(A: Csr, m: number): Csr {
  const rows: number[] = [], cols: number[] = [], vals: number[] = [];
  for (let i = 0; i < A.n; i++) {
    for (let p = A.rowPtr[i]; p < A.rowPtr[i + 1]; p++) {
      const j = A.colIdx[p];
      for (let r = 0; r < m; r++) for (let c = 0; c < m; c++) {
        rows.push(m * i + r); cols.push(m * j + c); vals.push(A.values[p] * (r === c ? 2 : 0.5));
      }
    }
  }
  return csrFromTriplets(m * A.n, rows, cols, vals);
}

describe('analysis on the node graph (indistinguishable rows, George & Liu 1981 §5.5)', () => {
  // the node-graph tree and weighted counts must equal what the row-level elimination tree
  // (Liu 1986) and Gilbert–Ng–Peyton (1994) counts give on the full pattern for the same perm
  const cases: { name: string; A: Csr; ords: (A: Csr) => Ordering[] }[] = [
    { name: '2 dofs per node, grid', A: gridKronecker(23, 17).A, ords: (A) => [orderAmd(A), orderNestedDissection(A, gridKronecker(23, 17).rowXY, { leafSize: 16 })] },
    { name: '1 row per node, random', A: randomSpd(70, 0.07, 5), ords: (A) => [orderAmd(A)] },
    { name: '3 rows per node, random', A: kronBlock(randomSpd(40, 0.1, 8), 3), ords: (A) => [orderAmd(A)] },
  ];
  for (const c of cases) {
    it(`tree and column counts agree with the row-level computation: ${c.name}`, () => {
      for (const ord of c.ords(c.A)) {
        expect(ord.tree).toBeDefined();
        const rowLevel = postorderedTree(c.A, { perm: ord.perm, iperm: ord.iperm, method: ord.method });
        // the node tree's perm is already a postorder, so relabelling must leave it unchanged
        expect(Array.from(rowLevel.perm)).toEqual(Array.from(ord.perm));
        expect(Array.from(rowLevel.parent)).toEqual(Array.from(ord.tree!.parent));
        expect(Array.from(rowLevel.colCounts)).toEqual(Array.from(ord.tree!.colCounts));
        expect(rowLevel.nnzL).toBe(ord.tree!.nnzL);
      }
    });
  }

  it('symbolic factor from the carried tree equals the one computed from scratch', () => {
    const { A, rowXY } = gridKronecker(31, 19);
    const choice = chooseOrderingDetailed(A, rowXY, { ndMinRows: 0 });
    const withTree = symbolicFactor(A, choice.ordering);
    const { tree: _unused, ...bare } = choice.ordering;
    const fromScratch = analyze(A, bare);
    expect(withTree.nnzL).toBe(fromScratch.nnzL);
    expect(withTree.nnzL).toBe(choice.nnzL);
    expect(Array.from(withTree.superStart)).toEqual(Array.from(fromScratch.superStart));
    expect(Array.from(withTree.superRows)).toEqual(Array.from(fromScratch.superRows));
    expect(Array.from(withTree.ordering.perm)).toEqual(Array.from(fromScratch.ordering.perm));
  });
});
