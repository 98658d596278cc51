import { describe, it, expect } from 'vitest';
import {
  analyze,
  chooseOrderingDetailed,
  columnCounts,
  csrFromTriplets,
  eliminationTree,
  orderNatural,
  postorderTree,
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

/**
 * Structure of L for the order perm by explicit elimination (Rose 1972): column k holds the
 * neighbours of the k-th vertex left when it is eliminated, in permuted numbering.
 */
function columnStructures(A: Csr, perm: Int32Array, iperm: Int32Array): number[][] {
  const adj = Array.from({ length: A.n }, (_, k) => {
    const row = perm[k];
    const s = new Set<number>();
    for (let p = A.rowPtr[row]; p < A.rowPtr[row + 1]; p++) if (iperm[A.colIdx[p]] !== k) s.add(iperm[A.colIdx[p]]);
    return s;
  });
  const cols: number[][] = [];
  for (let k = 0; k < A.n; k++) {
    const below = [...adj[k]].filter((i) => i > k).sort((a, b) => a - b);
    cols.push(below);
    for (const a of below) for (const b of below) if (a !== b) adj[a].add(b);
  }
  return cols;
}

/** Depth-first postorder by recursion, roots and children ascending: the plain definition. */
function recursivePostorder(parent: Int32Array): number[] {
  const kids = Array.from({ length: parent.length }, () => [] as number[]);
  for (let j = 0; j < parent.length; j++) if (parent[j] >= 0) kids[parent[j]].push(j);
  const out: number[] = [];
  const visit = (v: number): void => {
    for (const c of kids[v]) visit(c);
    out.push(v);
  };
  for (let j = 0; j < parent.length; j++) if (parent[j] < 0) visit(j);
  return out;
}

describe('elimination tree, postorder and column counts against explicit elimination', () => {
  const cases: { name: string; A: Csr; ord: (A: Csr) => Ordering }[] = [
    { name: 'random, natural order', A: randomSpd(60, 0.06, 3), ord: (A) => orderNatural(A.n) },
    { name: 'random, AMD', A: randomSpd(80, 0.05, 4), ord: (A) => orderAmd(A) },
    { name: 'grid ⊗ 2×2, natural order', A: gridKronecker(9, 7).A, ord: (A) => orderNatural(A.n) },
    { name: 'forest (block diagonal), natural order', A: kronBlock(randomSpd(30, 0.03, 6), 1), ord: (A) => orderNatural(A.n) },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const { perm, iperm } = c.ord(c.A);
      const cols = columnStructures(c.A, perm, iperm);
      // Liu 1990: parent of j = first row below the diagonal in column j of L
      const parent = eliminationTree(c.A, perm, iperm);
      expect(Array.from(parent)).toEqual(cols.map((col) => (col.length > 0 ? col[0] : -1)));
      const post = postorderTree(parent);
      expect(Array.from(post)).toEqual(recursivePostorder(parent));
      // relabel to the postorder, then the counts (diagonal included) are |column| + 1
      const postPerm = Int32Array.from(post, (k) => perm[k]);
      const postIperm = new Int32Array(c.A.n);
      postPerm.forEach((row, k) => (postIperm[row] = k));
      const postParent = eliminationTree(c.A, postPerm, postIperm);
      const postCols = columnStructures(c.A, postPerm, postIperm);
      const counts = columnCounts(c.A, postPerm, postIperm, postParent);
      expect(Array.from(counts)).toEqual(postCols.map((col) => col.length + 1));
      // weighted: every row weighs w(i); column j's count is the summed weight of its rows
      const w = Int32Array.from({ length: c.A.n }, (_, k) => 1 + (k % 3));
      const weighted = columnCounts(c.A, postPerm, postIperm, postParent, w);
      expect(Array.from(weighted)).toEqual(postCols.map((col, j) => w[j] + col.reduce((s, i) => s + w[i], 0)));
    });
  }

  it('postorderTree rejects a parent numbered before its child', () => {
    expect(() => postorderTree(Int32Array.from([-1, 0]))).toThrow(/parent\[1\] = 0/);
  });
});
