import { inversePerm, type NodeGraph } from './graph.js';
import { columnCounts, eliminationTree, relabelPostorder } from './symbolic.js';
import type { Csr, EliminationTree } from './types.js';

/**
 * Elimination tree and column counts of P A Pᵀ computed on the compressed node graph, for an
 * ordering that keeps each node's rows together (every ordering of this stage does).
 *
 * The rows of one node have identical patterns (diagonal included), so they are
 * indistinguishable in the sense of George & Liu ("Computer Solution of Large Sparse Positive
 * Definite Systems", Prentice-Hall 1981, §5.5): in L they form a chain r0 → r0+1 → … whose last
 * row's parent is the first row of the parent node, and column r0+k holds the node's own rows
 * from r0+k on plus the rows of every node below it in the node factor's column. So the tree
 * and the counts of the node graph, with the node's row count as its weight (weighted form of
 * Gilbert, Ng & Peyton 1994), give the row-level ones exactly — on a graph with half the
 * vertices and a quarter of the edges for 2 dofs per node.
 *
 * The node order is postordered on the way (same fill, subtrees contiguous), so `perm` may
 * differ from the order the caller passed; it is the permutation the tree belongs to.
 */
export function nodeEliminationTree(g: NodeGraph, nodePerm: Int32Array, nRows: number): EliminationTree {
  // small step functions rather than one long one: see symbolicFactor
  const graph: Csr = { n: g.n, rowPtr: g.adjPtr, colIdx: g.adjIdx, values: new Float64Array(0) };
  const parent0 = eliminationTree(graph, nodePerm, inversePerm(nodePerm));
  const { perm, parent } = relabelPostorder(nodePerm, parent0);
  const weight = permutedWeights(g.rowStart, perm);
  const nodeCounts = columnCounts(graph, perm, inversePerm(perm), parent, weight);
  return expandToRows(g.rowStart, perm, parent, weight, nodeCounts, nRows);
}

/** Rows of each node, in the node order perm. */
function permutedWeights(rowStart: Int32Array, perm: Int32Array): Int32Array {
  const weight = new Int32Array(perm.length);
  for (let k = 0; k < perm.length; k++) weight[k] = rowStart[perm[k] + 1] - rowStart[perm[k]];
  return weight;
}

/**
 * Row-level tree from the node tree: the rows of the k-th node follow each other, the last
 * one's parent is the first row of the parent node, and row t of a node has t fewer entries
 * in its column than the node's first row.
 */
function expandToRows(
  rowStart: Int32Array,
  perm: Int32Array,
  parent: Int32Array,
  weight: Int32Array,
  nodeCounts: Int32Array,
  nRows: number,
): EliminationTree {
  const n = perm.length;
  const rowPerm = new Int32Array(nRows);
  const rowParent = new Int32Array(nRows);
  const rowCounts = new Int32Array(nRows);
  const firstRow = new Int32Array(n + 1);
  for (let k = 0; k < n; k++) firstRow[k + 1] = firstRow[k] + weight[k];
  let nnzL = 0;
  for (let k = 0; k < n; k++) {
    const v0 = rowStart[perm[k]];
    const r0 = firstRow[k];
    const w = weight[k];
    const c = nodeCounts[k];
    const up = parent[k] === -1 ? -1 : firstRow[parent[k]];
    for (let t = 0; t < w; t++) {
      rowPerm[r0 + t] = v0 + t;
      rowCounts[r0 + t] = c - t;
      nnzL += c - t;
      rowParent[r0 + t] = t < w - 1 ? r0 + t + 1 : up;
    }
  }
  return { perm: rowPerm, parent: rowParent, colCounts: rowCounts, nnzL };
}
