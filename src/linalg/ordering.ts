import { amdOrder } from './amd.js';
import { compressGraph, inversePerm, nodeWeights, type NodeGraph } from './graph.js';
import { nodeEliminationTree } from './node-tree.js';
import { postorderedTree } from './symbolic.js';
import type { Csr, Ordering } from './types.js';

export function orderNatural(n: number): Ordering {
  const perm = new Int32Array(n);
  for (let k = 0; k < n; k++) perm[k] = k;
  return { perm, iperm: perm.slice(), method: 'natural' };
}

/**
 * Row ordering from a node ordering, with the elimination tree and column counts computed on
 * the node graph on the way (so choosing between candidates and the symbolic factorisation
 * need no pass over A).
 */
function fromNodePerm(g: NodeGraph, nodePerm: Int32Array, nRows: number, method: Ordering['method']): Ordering {
  const tree = nodeEliminationTree(g, nodePerm, nRows);
  return { perm: tree.perm, iperm: inversePerm(tree.perm), method, tree };
}

/** Approximate minimum degree on the compressed node graph, expanded to rows. */
export function orderAmd(A: Csr, graph?: NodeGraph): Ordering {
  const g = graph ?? compressGraph(A);
  const nodePerm = amdOrder(g.n, g.adjPtr, g.adjIdx, nodeWeights(g));
  return fromNodePerm(g, nodePerm, A.n, 'amd');
}

export interface NestedDissectionOptions {
  /** subgraphs with at most this many nodes are ordered by AMD instead of being split */
  leafSize?: number;
}

/**
 * Nested dissection from coordinates (George, "Nested dissection of a regular finite element
 * mesh", SIAM J. Numer. Anal. 10(2):345–363, 1973), with the splitting of recursive coordinate
 * bisection: cut the node set at the median of its wider coordinate extent, take as vertex
 * separator the smaller of the two one-sided boundary layers, order both halves recursively,
 * separators last. Leaves are ordered by AMD.
 */
export function orderNestedDissection(
  A: Csr,
  rowXY: Float64Array,
  options: NestedDissectionOptions = {},
  graph?: NodeGraph,
): Ordering {
  if (rowXY.length !== 2 * A.n) {
    throw new TypeError(`rowXY must hold x, y for each of the ${A.n} rows, got length ${rowXY.length}`);
  }
  const leafSize = options.leafSize ?? 128;
  const g = graph ?? compressGraph(A);
  const nx = new Float64Array(g.n);
  const ny = new Float64Array(g.n);
  for (let v = 0; v < g.n; v++) {
    const r = g.rowStart[v];
    nx[v] = rowXY[2 * r];
    ny[v] = rowXY[2 * r + 1];
  }
  const nodePerm = dissect(g, nx, ny, leafSize);
  return fromNodePerm(g, nodePerm, A.n, 'nested-dissection');
}

function dissect(g: NodeGraph, nx: Float64Array, ny: Float64Array, leafSize: number): Int32Array {
  const n = g.n;
  const out = new Int32Array(n);
  let outPos = 0;
  const side = new Int8Array(n); // 0 outside current set, 1 left, 2 right, 3 separator
  const local = new Int32Array(n).fill(-1);
  const weights = nodeWeights(g);
  const all = new Int32Array(n);
  for (let v = 0; v < n; v++) all[v] = v;

  // explicit stack of tasks: a set to split, or a separator to emit after its halves
  type Task = { nodes: Int32Array; emit: boolean };
  const stack: Task[] = [{ nodes: all, emit: false }];
  // emitting happens in reverse of a post-order: we push [sep(emit), right, left] so that left
  // is handled first, then right, then the separator
  while (stack.length > 0) {
    const task = stack.pop()!;
    const nodes = task.nodes;
    if (task.emit) {
      out.set(nodes, outPos);
      outPos += nodes.length;
      continue;
    }
    if (nodes.length <= leafSize) {
      outPos = orderLeaf(g, nodes, local, weights, out, outPos);
      continue;
    }
    let xmin = Infinity, xmax = -Infinity, ymin = Infinity, ymax = -Infinity;
    for (let t = 0; t < nodes.length; t++) {
      const v = nodes[t];
      if (nx[v] < xmin) xmin = nx[v];
      if (nx[v] > xmax) xmax = nx[v];
      if (ny[v] < ymin) ymin = ny[v];
      if (ny[v] > ymax) ymax = ny[v];
    }
    const key = xmax - xmin >= ymax - ymin ? nx : ny;
    const half = nodes.length >> 1;
    selectByKey(nodes, key, half);
    for (let t = 0; t < nodes.length; t++) side[nodes[t]] = t < half ? 1 : 2;
    // boundary layers on each side
    let nLeftB = 0, nRightB = 0;
    for (let t = 0; t < nodes.length; t++) {
      const v = nodes[t];
      const sv = side[v];
      for (let p = g.adjPtr[v]; p < g.adjPtr[v + 1]; p++) {
        const su = side[g.adjIdx[p]];
        if (su !== 0 && su !== sv) {
          if (sv === 1) nLeftB++; else nRightB++;
          break;
        }
      }
    }
    const sepSide = nLeftB <= nRightB ? 1 : 2;
    const sep = new Int32Array(Math.min(nLeftB, nRightB));
    let ns = 0;
    for (let t = 0; t < nodes.length; t++) {
      const v = nodes[t];
      if (side[v] !== sepSide) continue;
      for (let p = g.adjPtr[v]; p < g.adjPtr[v + 1]; p++) {
        const su = side[g.adjIdx[p]];
        if (su !== 0 && su !== sepSide && su !== 3) {
          sep[ns++] = v;
          break;
        }
      }
    }
    // mark separator after the scan so that it is taken from the other side's view consistently
    for (let t = 0; t < ns; t++) side[sep[t]] = 3;
    let nl = 0, nrt = 0;
    for (let t = 0; t < nodes.length; t++) {
      const s = side[nodes[t]];
      if (s === 1) nl++; else if (s === 2) nrt++;
    }
    const left = new Int32Array(nl);
    const right = new Int32Array(nrt);
    nl = 0;
    nrt = 0;
    for (let t = 0; t < nodes.length; t++) {
      const v = nodes[t];
      const s = side[v];
      if (s === 1) left[nl++] = v; else if (s === 2) right[nrt++] = v;
      side[v] = 0;
    }
    stack.push({ nodes: sep.subarray(0, ns), emit: true });
    stack.push({ nodes: right, emit: false });
    stack.push({ nodes: left, emit: false });
  }
  return out;
}

/** AMD on the subgraph induced by `nodes`, appended to out. */
function orderLeaf(
  g: NodeGraph,
  nodes: Int32Array,
  local: Int32Array,
  weights: Int32Array,
  out: Int32Array,
  outPos: number,
): number {
  const m = nodes.length;
  for (let t = 0; t < m; t++) local[nodes[t]] = t;
  const ptr = new Int32Array(m + 1);
  for (let t = 0; t < m; t++) {
    const v = nodes[t];
    let c = 0;
    for (let p = g.adjPtr[v]; p < g.adjPtr[v + 1]; p++) if (local[g.adjIdx[p]] >= 0) c++;
    ptr[t + 1] = ptr[t] + c;
  }
  const idx = new Int32Array(ptr[m]);
  const wgt = new Int32Array(m);
  for (let t = 0; t < m; t++) {
    const v = nodes[t];
    wgt[t] = weights[v];
    let w = ptr[t];
    for (let p = g.adjPtr[v]; p < g.adjPtr[v + 1]; p++) {
      const u = local[g.adjIdx[p]];
      if (u >= 0) idx[w++] = u;
    }
  }
  const order = amdOrder(m, ptr, idx, wgt);
  for (let t = 0; t < m; t++) out[outPos + t] = nodes[order[t]];
  for (let t = 0; t < m; t++) local[nodes[t]] = -1;
  return outPos + m;
}

/** Rearrange nodes so that nodes[0…k-1] have key ≤ those of nodes[k…] (Hoare quickselect). */
function selectByKey(nodes: Int32Array, key: Float64Array, k: number): void {
  let lo = 0, hi = nodes.length - 1;
  while (hi > lo) {
    const pivot = key[nodes[(lo + hi) >> 1]];
    let i = lo, j = hi;
    while (i <= j) {
      while (key[nodes[i]] < pivot) i++;
      while (key[nodes[j]] > pivot) j--;
      if (i <= j) {
        const t = nodes[i];
        nodes[i] = nodes[j];
        nodes[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return;
  }
}

/**
 * nnz(L) (diagonal included) that an ordering would give — from the tree the ordering carries,
 * else elimination tree and column counts only (no supernodes, no row structure).
 */
export function predictNnzL(A: Csr, ordering: Ordering): number {
  if (ordering.tree && ordering.tree.perm === ordering.perm) return ordering.tree.nnzL;
  return postorderedTree(A, ordering).nnzL;
}

export interface OrderingChoice {
  ordering: Ordering;
  nnzL: number;
  /** predicted nnz(L) of every candidate tried */
  candidates: { method: Ordering['method']; nnzL: number }[];
}

export interface ChooseOrderingOptions {
  /**
   * Try nested dissection only from this many rows on (default 300 000). Measured on the
   * benchmark plates (docs/linalg.md): with CST, AMD's fill is lower up to 200 000 dofs
   * (ND/AMD 1.07, 1.01, 1.007 at 50k, 100k, 200k) and ND wins from about 300 000 (0.97 at
   * 315k, 0.92 at 805k); with LST, AMD is still lower at 410 000 (1.04). ND costs about 2.5×
   * AMD, so below the threshold it would be paid for nothing.
   */
  ndMinRows?: number;
}

/**
 * Try AMD and, when coordinates are given and the matrix is large enough, nested dissection;
 * keep the one with the smaller predicted nnz(L). The node graph is built once for both, and
 * each candidate carries its elimination tree and column counts (computed on the node graph),
 * so the prediction is a sum and `symbolicFactor` starts from the winner's tree.
 */
export function chooseOrderingDetailed(A: Csr, rowXY?: Float64Array, options: ChooseOrderingOptions = {}): OrderingChoice {
  const ndMinRows = options.ndMinRows ?? 300_000;
  const candidates: OrderingChoice['candidates'] = [];
  const g = compressGraph(A);
  const amd = orderAmd(A, g);
  let best = amd;
  let bestNnz = predictNnzL(A, amd);
  candidates.push({ method: 'amd', nnzL: bestNnz });
  if (rowXY && A.n >= ndMinRows) {
    const nd = orderNestedDissection(A, rowXY, {}, g);
    const ndNnz = predictNnzL(A, nd);
    candidates.push({ method: 'nested-dissection', nnzL: ndNnz });
    if (ndNnz < bestNnz) {
      best = nd;
      bestNnz = ndNnz;
    }
  }
  return { ordering: best, nnzL: bestNnz, candidates };
}

export function chooseOrdering(A: Csr, rowXY?: Float64Array, options: ChooseOrderingOptions = {}): Ordering {
  return chooseOrderingDetailed(A, rowXY, options).ordering;
}
