import type { NodeGraph } from './graph.js';
import { columnCounts, eliminationTree, postorderTree } from './symbolic.js';
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
  const n = g.n;
  const nodeIperm = new Int32Array(n);
  for (let k = 0; k < n; k++) nodeIperm[nodePerm[k]] = k;
  const graph: Csr = { n, rowPtr: g.adjPtr, colIdx: g.adjIdx, values: new Float64Array(0) };
  const parent0 = eliminationTree(graph, nodePerm, nodeIperm);
  const post = postorderTree(parent0);
  // relabel so that the node tree is postordered
  const perm = new Int32Array(n);
  const ipost = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    perm[k] = nodePerm[post[k]];
    ipost[post[k]] = k;
  }
  const parent = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    const p = parent0[post[k]];
    parent[k] = p === -1 ? -1 : ipost[p];
  }
  for (let k = 0; k < n; k++) nodeIperm[perm[k]] = k;
  const weight = new Int32Array(n);
  for (let k = 0; k < n; k++) weight[k] = g.rowStart[perm[k] + 1] - g.rowStart[perm[k]];
  const nodeCounts = columnCounts(graph, perm, nodeIperm, parent, weight);

  // expand to rows: rows of the k-th node follow each other, the last one's parent is the
  // first row of the parent node
  const rowPerm = new Int32Array(nRows);
  const rowParent = new Int32Array(nRows);
  const rowCounts = new Int32Array(nRows);
  const firstRow = new Int32Array(n);
  let r = 0;
  for (let k = 0; k < n; k++) {
    firstRow[k] = r;
    r += weight[k];
  }
  let nnzL = 0;
  for (let k = 0; k < n; k++) {
    const v = perm[k];
    const r0 = firstRow[k];
    const w = weight[k];
    for (let t = 0; t < w; t++) {
      rowPerm[r0 + t] = g.rowStart[v] + t;
      rowCounts[r0 + t] = nodeCounts[k] - t;
      nnzL += nodeCounts[k] - t;
      rowParent[r0 + t] = t < w - 1 ? r0 + t + 1 : parent[k] === -1 ? -1 : firstRow[parent[k]];
    }
  }
  return { perm: rowPerm, parent: rowParent, colCounts: rowCounts, nnzL };
}
