import { amdOrder } from './min-degree.js';
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
  const nodePerm = amdOrder(g.n, g.adjPtr, g.adjIdx, nodeWeights(g), { symmetricPattern: true });
  return fromNodePerm(g, nodePerm, A.n, 'amd');
}

export interface NestedDissectionOptions {
  /** subgraphs with at most this many nodes are ordered by AMD instead of being split */
  leafSize?: number;
}

/**
 * Nested dissection from coordinates (George, "Nested dissection of a regular finite element
 * mesh", SIAM J. Numer. Anal. 10(2):345–363, 1973) with coordinate cuts: each step tries x and
 * y cuts near the median, takes as vertex separator of each the minimum vertex cover of its cut
 * edges (König), keeps the cut with the smallest separator for its balance, orders both halves
 * recursively, separators last. Leaves (≤ 64 nodes by default: the smallest fill on the
 * benchmark plates among 16–1500) are ordered by AMD.
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
  const leafSize = options.leafSize ?? 64;
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
  const work = new DissectionWork(g, nx, ny);
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
      outPos = orderLeaf(g, nodes, work.local, weights, out, outPos);
      continue;
    }
    const { left, right, sep } = work.bisect(nodes);
    stack.push({ nodes: sep, emit: true });
    stack.push({ nodes: right, emit: false });
    stack.push({ nodes: left, emit: false });
  }
  return out;
}

/**
 * One bisection step of the dissection, with its scratch arrays shared by all steps.
 *
 * Both coordinate directions are tried, each at the split positions CUT_FRACTIONS; nodes are
 * ordered by the cut coordinate with ties broken by the other one, so that a row of nodes with
 * equal key is split in one place (a staircase) rather than scattered across both halves (the
 * earlier plain quickselect did that, and its one-sided separators came out up to two layers
 * thick). The vertex separator of each cut is a minimum vertex cover of its cut edges (König's
 * theorem on the bipartite graph of cut edges, from a maximum matching by augmenting paths),
 * never larger than either one-sided boundary layer; the cut with the best size-for-balance
 * score wins.
 */
/**
 * Split positions tried per direction, as fractions of the node count. Off-median cuts find
 * the shorter separators of unstructured meshes (measured: −5 % fill on a 1M-dof LST hole
 * plate against the median alone; docs/linalg.md); the score below charges them for imbalance.
 */
const CUT_FRACTIONS = [0.45, 0.5, 0.55];

class DissectionWork {
  readonly side: Int8Array; // 0 outside current set, 1 left, 2 right, 3 separator
  readonly local: Int32Array;
  private readonly mate: Int32Array;
  private readonly stamp: Int32Array;
  private readonly from: Int32Array;
  private readonly queue: Int32Array;
  private readonly keys: Float64Array[];
  /** per key: the largest change of that key along any edge of each node (see `separator`) */
  private readonly reach: Float64Array[];
  private stampNow = 0;

  constructor(private readonly g: NodeGraph, nx: Float64Array, ny: Float64Array) {
    const n = g.n;
    this.side = new Int8Array(n);
    this.local = new Int32Array(n).fill(-1);
    this.mate = new Int32Array(n).fill(-1);
    this.stamp = new Int32Array(n);
    this.from = new Int32Array(n);
    this.queue = new Int32Array(n);
    const sum = new Float64Array(n), diff = new Float64Array(n);
    for (let v = 0; v < n; v++) {
      sum[v] = nx[v] + ny[v];
      diff[v] = nx[v] - ny[v];
    }
    this.keys = [nx, ny, sum, diff];
    this.reach = [edgeReach(g, nx), edgeReach(g, ny)];
  }

  bisect(nodes: Int32Array): { left: Int32Array; right: Int32Array; sep: Int32Array } {
    const m = nodes.length;
    let best: Int32Array | undefined;
    let bestSep: Int32Array | undefined;
    let bestCut = 0;
    let bestKey = 0;
    let bestScore = Infinity;
    // primary / secondary key pairs x|y and y|x (the two diagonals were tried too: they never
    // gave a smaller fill on the benchmark plates and doubled the time)
    const pairs: [number, number][] = [[0, 1], [1, 0]];
    const half = m >> 1;
    const cuts = CUT_FRACTIONS.map((f) => Math.min(m - 1, Math.max(1, Math.round(f * m))));
    for (const [a, b] of pairs) {
      const trial = nodes.slice();
      const ka = this.keys[a], kb = this.keys[b];
      selectByKey(trial, ka, kb, half);
      for (const c of cuts) {
        if (c < half) selectByKey(trial.subarray(0, half), ka, kb, c);
        else if (c > half) selectByKey(trial.subarray(half), ka, kb, c - half);
      }
      for (const c of cuts) {
        // separator size over the balance term s(1 − s): the median is charged 4·|S|, a
        // 45/55 cut 4.04·|S|. Scoring by the one-sided layer instead of the cover was tried:
        // cheaper per cut but 1–4 % more fill.
        const size = this.separator(trial, c, a).length;
        const smaller = Math.min(c, m - c) / m;
        const score = size / (smaller * (1 - smaller));
        if (score < bestScore) {
          best = trial;
          bestCut = c;
          bestKey = a;
          bestScore = score;
        }
      }
    }
    bestSep = this.separator(best!, bestCut, bestKey);
    const order = best!;
    const sep = bestSep!;
    const side = this.side;
    for (let t = 0; t < order.length; t++) side[order[t]] = t < bestCut ? 1 : 2;
    for (let t = 0; t < sep.length; t++) side[sep[t]] = 3;
    let nl = 0, nr = 0;
    for (let t = 0; t < order.length; t++) {
      const s = side[order[t]];
      if (s === 1) nl++; else if (s === 2) nr++;
    }
    const left = new Int32Array(nl), right = new Int32Array(nr);
    nl = 0;
    nr = 0;
    for (let t = 0; t < order.length; t++) {
      const v = order[t];
      const s = side[v];
      if (s === 1) left[nl++] = v; else if (s === 2) right[nr++] = v;
      side[v] = 0;
    }
    return { left, right, sep };
  }

  /**
   * Minimum vertex cover of the edges between order[0…half-1] and order[half…] (König):
   * maximum matching by breadth-first augmenting paths from each left boundary node, then
   * Z = nodes reachable from unmatched left nodes by alternating paths; cover = (left \ Z) ∪
   * (right ∩ Z). Leaves `side` cleared.
   */
  private separator(order: Int32Array, half: number, key: number): Int32Array {
    const { g, side, mate, stamp, from, queue } = this;
    const adjPtr = g.adjPtr, adjIdx = g.adjIdx;
    // The cut splits by `key` first: every right node has key ≥ the right side's smallest key, so
    // a left node whose key plus its edge reach stays below that cannot touch the right side and
    // its adjacency need not be read (the same boundary list, in the same order, as reading all).
    const k = this.keys[key], reach = this.reach[key];
    let rightMin = Infinity;
    for (let t = 0; t < order.length; t++) {
      const v = order[t];
      if (t < half) side[v] = 1;
      else {
        side[v] = 2;
        if (k[v] < rightMin) rightMin = k[v];
      }
    }
    // left boundary nodes, and reset mates of the boundary
    const leftB: number[] = [];
    for (let t = 0; t < half; t++) {
      const v = order[t];
      if (k[v] + reach[v] + 1e-9 * (Math.abs(k[v]) + reach[v]) < rightMin) continue; // margin for rounding
      for (let p = adjPtr[v]; p < adjPtr[v + 1]; p++) {
        if (side[adjIdx[p]] === 2) {
          leftB.push(v);
          mate[v] = -1;
          for (let q = adjPtr[v]; q < adjPtr[v + 1]; q++) if (side[adjIdx[q]] === 2) mate[adjIdx[q]] = -1;
          break;
        }
      }
    }
    // greedy matching first, then augment
    for (const v of leftB) {
      for (let p = adjPtr[v]; p < adjPtr[v + 1]; p++) {
        const u = adjIdx[p];
        if (side[u] === 2 && mate[u] < 0) {
          mate[u] = v;
          mate[v] = u;
          break;
        }
      }
    }
    for (const root of leftB) {
      if (mate[root] >= 0) continue;
      const s = ++this.stampNow;
      let head = 0, tail = 0;
      queue[tail++] = root;
      stamp[root] = s;
      let end = -1;
      while (head < tail && end < 0) {
        const v = queue[head++];
        for (let p = adjPtr[v]; p < adjPtr[v + 1]; p++) {
          const u = adjIdx[p];
          if (side[u] !== 2 || stamp[u] === s) continue;
          stamp[u] = s;
          from[u] = v;
          if (mate[u] < 0) { end = u; break; }
          const w = mate[u];
          stamp[w] = s;
          queue[tail++] = w;
        }
      }
      // flip the path root → … → end
      while (end >= 0) {
        const v = from[end];
        const next = mate[v];
        mate[end] = v;
        mate[v] = end;
        end = v === root ? -1 : next;
      }
    }
    // alternating reachability from unmatched left boundary nodes
    const z = ++this.stampNow;
    let head = 0, tail = 0;
    for (const v of leftB) if (mate[v] < 0) { stamp[v] = z; queue[tail++] = v; }
    while (head < tail) {
      const v = queue[head++];
      for (let p = adjPtr[v]; p < adjPtr[v + 1]; p++) {
        const u = adjIdx[p];
        if (side[u] !== 2 || stamp[u] === z) continue;
        stamp[u] = z;
        const w = mate[u];
        if (w >= 0 && stamp[w] !== z) { stamp[w] = z; queue[tail++] = w; }
      }
    }
    const cover: number[] = [];
    for (const v of leftB) if (stamp[v] !== z) cover.push(v);
    // every right node in Z is matched (else there would be an augmenting path) to a left node in Z
    for (const v of leftB) {
      const u = mate[v];
      if (u >= 0 && stamp[v] === z && stamp[u] === z) cover.push(u);
    }
    for (let t = 0; t < order.length; t++) side[order[t]] = 0;
    return Int32Array.from(cover);
  }
}

/** Per node: the largest |key(u) − key(v)| over its neighbours u (0 for an isolated node). */
function edgeReach(g: NodeGraph, key: Float64Array): Float64Array {
  const r = new Float64Array(g.n);
  for (let v = 0; v < g.n; v++) {
    let m = 0;
    for (let p = g.adjPtr[v]; p < g.adjPtr[v + 1]; p++) {
      const d = Math.abs(key[g.adjIdx[p]] - key[v]);
      if (d > m) m = d;
    }
    r[v] = m;
  }
  return r;
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
  const order = amdOrder(m, ptr, idx, wgt, { symmetricPattern: true });
  for (let t = 0; t < m; t++) out[outPos + t] = nodes[order[t]];
  for (let t = 0; t < m; t++) local[nodes[t]] = -1;
  return outPos + m;
}

/**
 * Rearrange nodes so that nodes[0…k-1] come before nodes[k…] in the order of (key, key2)
 * (Hoare quickselect on the pair, so ties of key are split by key2 in one place).
 */
function selectByKey(nodes: Int32Array, key: Float64Array, key2: Float64Array, k: number): void {
  let lo = 0, hi = nodes.length - 1;
  while (hi > lo) {
    const m = nodes[(lo + hi) >> 1];
    const pivot = key[m], pivot2 = key2[m];
    let i = lo, j = hi;
    while (i <= j) {
      while (key[nodes[i]] < pivot || (key[nodes[i]] === pivot && key2[nodes[i]] < pivot2)) i++;
      while (key[nodes[j]] > pivot || (key[nodes[j]] === pivot && key2[nodes[j]] > pivot2)) j--;
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
   * benchmark plates (docs/linalg.md, "Nested dissection fill"): ND's fill is now lower than
   * AMD's from 50 000 dofs on the structured plates, but on the meshed hole plate only by 3 %
   * at 200 000 dofs (8 % at 400 000, 15 % at 1M), while ND costs 3–4× AMD's time (0.3–0.5 s
   * against 0.1 s at 200 000 dofs), so below the threshold it would mostly be paid for nothing.
   */
  ndMinRows?: number;
  /**
   * From this many rows on (default 600 000), with coordinates, nested dissection alone: AMD is
   * not computed. Measured (docs/linalg.md): ND's fill is 0.64–0.88 × AMD's on every benchmark
   * plate from 400 000 rows on (hole 1M 0.85, LST 800k 0.82, CST 800k 0.81), so AMD would be
   * thrown away, and at 800 000 LST dofs it took 0.5–0.9 s of a 2.3–3.5 s ordering.
   */
  ndOnlyRows?: number;
}

/**
 * Try AMD and, when coordinates are given and the matrix is large enough, nested dissection;
 * keep the one with the smaller predicted nnz(L) — or, above `ndOnlyRows`, nested dissection alone. The node graph is built once for both, and
 * each candidate carries its elimination tree and column counts (computed on the node graph),
 * so the prediction is a sum and `symbolicFactor` starts from the winner's tree.
 */
export function chooseOrderingDetailed(A: Csr, rowXY?: Float64Array, options: ChooseOrderingOptions = {}): OrderingChoice {
  const ndMinRows = options.ndMinRows ?? 300_000;
  const ndOnlyRows = options.ndOnlyRows ?? 600_000;
  const candidates: OrderingChoice['candidates'] = [];
  const g = compressGraph(A);
  if (rowXY && A.n >= Math.max(ndMinRows, ndOnlyRows)) {
    const nd = orderNestedDissection(A, rowXY, {}, g);
    const ndNnz = predictNnzL(A, nd);
    candidates.push({ method: 'nested-dissection', nnzL: ndNnz });
    return { ordering: nd, nnzL: ndNnz, candidates };
  }
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
