import { inversePerm } from './graph.js';
import type { Csr, EliminationTree, Ordering, Symbolic } from './types.js';

const NONE = -1;

/**
 * Elimination tree of P A Pᵀ from the full symmetric pattern of A: parent[j] = the first row
 * below j in column j of L (−1 for a root).
 *
 * Liu, "The role of elimination trees in sparse factorization", SIAM J. Matrix Anal. Appl.
 * 11(1):134–172, 1990 (the algorithm first appeared in Liu, "A compact row storage scheme for
 * Cholesky factors using elimination trees", ACM TOMS 12(2):127–148, 1986). Rows are
 * added one at a time: row k of A with entries in columns j < k links, for each such j, the
 * root of the tree j belongs to (among rows 0…k−1) below k. Roots are found through `climb`,
 * a shortcut pointer redirected to k along every path walked (path compression), so the
 * walks cost O(nnz(A)·log n) at most and nearly O(nnz(A)) in practice.
 */
export function eliminationTree(A: Csr, perm: Int32Array, iperm: Int32Array): Int32Array {
  const n = A.n;
  const parent = new Int32Array(n).fill(NONE);
  const climb = new Int32Array(n).fill(NONE);
  const rowPtr = A.rowPtr, colIdx = A.colIdx;
  for (let k = 0; k < n; k++) {
    const row = perm[k];
    for (let p = rowPtr[row]; p < rowPtr[row + 1]; p++) {
      const j = iperm[colIdx[p]];
      if (j < k) linkRootBelow(parent, climb, j, k);
    }
  }
  return parent;
}

/** Walk from j to the root of its tree, pointing each node passed at k; a root found becomes k's child. */
function linkRootBelow(parent: Int32Array, climb: Int32Array, j: number, k: number): void {
  let node = j;
  for (;;) {
    const up = climb[node];
    if (up === k) return; // this tree hangs below k already
    climb[node] = k;
    if (up === NONE) {
      parent[node] = k;
      return;
    }
    node = up;
  }
}

/**
 * Postorder of a forest whose parents come after their children (parent[j] > j, as in every
 * elimination tree): post[k] = node visited k-th by a depth-first search that takes roots and
 * children in ascending order. Computed without a search: subtree sizes in one upward pass,
 * then each node's slot range handed out downward — a node's range ends at its own slot, and
 * its children's ranges fill the slots before it, the largest child last.
 */
export function postorderTree(parent: Int32Array): Int32Array {
  const n = parent.length;
  const size = new Int32Array(n).fill(1);
  for (let j = 0; j < n; j++) {
    const p = parent[j];
    if (p === NONE) continue;
    if (!(p > j && p < n)) throw new RangeError(`postorderTree: parent[${j}] = ${p} must be −1 or a node after ${j}`);
    size[p] += size[j];
  }
  // free[v] = one past the last unassigned slot in v's range (its own slot comes last)
  const free = new Int32Array(n);
  const post = new Int32Array(n);
  let rootsFree = n;
  for (let j = n - 1; j >= 0; j--) {
    const p = parent[j];
    let end: number; // one past j's own slot
    if (p === NONE) {
      end = rootsFree;
      rootsFree -= size[j];
    } else {
      end = free[p];
      free[p] -= size[j];
    }
    post[end - 1] = j;
    free[j] = end - 1;
  }
  return post;
}

/**
 * Column counts of L (diagonal included) for a matrix whose elimination tree is postordered
 * (children before parents, each subtree a contiguous range of columns).
 *
 * Gilbert, Ng & Peyton, "An efficient algorithm to compute row and column counts for sparse
 * Cholesky factorization", SIAM J. Matrix Anal. Appl. 15(4):1075–1091, 1994. Row i of L is
 * nonzero in the columns of its ROW SUBTREE: the union of the tree paths from the columns
 * j < i of A's row i up to i. The count of column j is the number of rows whose row subtree
 * holds j, which is a sum over the subtree of j of per-node terms: +1 at each leaf of a row
 * subtree, −1 at the least common ancestor of each two leaves of the same row subtree that are
 * consecutive in postorder, −1 at the parent of each row's top node i (and +1 at i itself when
 * row i has no entries left of the diagonal). Leaves are recognised in postorder: j is a leaf
 * of row i's subtree when no earlier column of row i lies in j's subtree, i.e. when the first
 * descendant of j comes after the last column of row i seen so far. The common ancestors come
 * from a disjoint-set forest in which each finished column joins its parent's set.
 *
 * `weight[j]` (optional) = rows that column j stands for: every term of row i then counts
 * weight[i] instead of 1 (used on the compressed node graph; see node-tree.ts).
 */
export function columnCounts(
  A: Csr,
  perm: Int32Array,
  iperm: Int32Array,
  parent: Int32Array,
  weight?: Int32Array,
): Int32Array {
  const n = A.n;
  const firstDescendant = firstDescendants(parent);
  const term = new Int32Array(n);
  /** last column j < i of row i met so far, and the last leaf of its row subtree */
  const lastColumn = new Int32Array(n).fill(NONE);
  const lastLeaf = new Int32Array(n).fill(NONE);
  const setLink = new Int32Array(n);
  for (let j = 0; j < n; j++) setLink[j] = j;
  const rowPtr = A.rowPtr, colIdx = A.colIdx;
  for (let i = 0; i < n; i++) {
    const wi = weight ? weight[i] : 1;
    if (firstDescendant[i] === i) term[i] += wi; // a tree leaf: row i has nothing left of the diagonal
    if (parent[i] !== NONE) term[parent[i]] -= wi;
  }
  for (let j = 0; j < n; j++) {
    // rows i > j with an entry in column j, in any order: each sees its columns ascending
    const row = perm[j];
    for (let p = rowPtr[row]; p < rowPtr[row + 1]; p++) {
      const i = iperm[colIdx[p]];
      if (i <= j) continue;
      const isLeaf = firstDescendant[j] > lastColumn[i];
      lastColumn[i] = j;
      if (!isLeaf) continue;
      const wi = weight ? weight[i] : 1;
      term[j] += wi;
      if (lastLeaf[i] !== NONE) term[setRoot(setLink, lastLeaf[i])] -= wi;
      lastLeaf[i] = j;
    }
    if (parent[j] !== NONE) setLink[j] = parent[j];
  }
  // sum the terms over each subtree: children come before parents
  for (let j = 0; j < n; j++) if (parent[j] !== NONE) term[parent[j]] += term[j];
  return term;
}

/** First (lowest-numbered) descendant of each node of a postordered tree, itself for a leaf. */
function firstDescendants(parent: Int32Array): Int32Array {
  const n = parent.length;
  const first = new Int32Array(n);
  for (let j = 0; j < n; j++) first[j] = j;
  // in postorder a node's first descendant is its first child's; children come before parents,
  // so one ascending pass sees every child before its parent
  const seen = new Uint8Array(n);
  for (let j = 0; j < n; j++) {
    const p = parent[j];
    if (p !== NONE && !seen[p]) {
      seen[p] = 1;
      first[p] = first[j];
    }
  }
  return first;
}

/**
 * Representative of j's set in the disjoint-set forest (the set's one unfinished column, the
 * lowest common ancestor asked for), halving the path on the way (Tarjan & van Leeuwen,
 * "Worst-case analysis of set union algorithms", J. ACM 31(2):245–281, 1984).
 */
function setRoot(link: Int32Array, j: number): number {
  let x = j;
  while (link[x] !== x) {
    const up = link[x];
    link[x] = link[up];
    x = up;
  }
  return x;
}

/** Do the adjacent rows colIdx[a…b) and colIdx[b…end) hold the same columns? */
function samePattern(colIdx: Int32Array, a: number, b: number, end: number): boolean {
  if (b - a !== end - b) return false;
  for (let t = 0; t < end - b; t++) if (colIdx[a + t] !== colIdx[b + t]) return false;
  return true;
}

/** Entries of a lower trapezoidal panel of nc columns and nr rows (nr ≥ nc). */
function panelEntries(nc: number, nr: number): number {
  return nc * nr - (nc * (nc - 1)) / 2;
}

/**
 * Relaxed supernode amalgamation: merge a child supernode into its parent when the explicit
 * zeros this adds stay a small fraction of the merged panel. Bigger panels let the dense
 * kernels run longer inner loops; the thresholds are common practice (tuned for speed, not
 * from a paper): always for tiny panels, then 50 %, 10 % and 5 % of the panel as it grows.
 */
function allowedZeroFraction(nc: number): number {
  if (nc <= 4) return 1;
  if (nc <= 16) return 0.8;
  if (nc <= 48) return 0.1;
  return 0.05;
}

export interface SupernodeOptions {
  /** merge supernodes whose zeros stay below the thresholds above (default true) */
  relax?: boolean;
  /** cap on columns per supernode (keeps update workspaces bounded) */
  maxCols?: number;
}

/**
 * Elimination tree of P A Pᵀ relabelled to a postorder (fill unchanged, subtrees become
 * contiguous), with the column counts — from the full pattern of A, row by row.
 */
export function postorderedTree(A: Csr, ordering: Ordering): EliminationTree {
  const n = A.n;
  const parent0 = eliminationTree(A, ordering.perm, ordering.iperm);
  const { perm, parent } = relabelPostorder(ordering.perm, parent0);
  const colCounts = columnCounts(A, perm, inversePerm(perm), parent);
  let nnzL = 0;
  for (let j = 0; j < n; j++) nnzL += colCounts[j];
  return { perm, parent, colCounts, nnzL };
}

/**
 * Renumber an elimination tree (of the order perm0) in a depth-first postorder: returns the
 * new order and the parent of each new column.
 */
export function relabelPostorder(perm0: Int32Array, parent0: Int32Array): { perm: Int32Array; parent: Int32Array } {
  const n = perm0.length;
  const post = postorderTree(parent0);
  const perm = new Int32Array(n);
  const ipost = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    perm[k] = perm0[post[k]];
    ipost[post[k]] = k;
  }
  const parent = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    const p = parent0[post[k]];
    parent[k] = p === -1 ? -1 : ipost[p];
  }
  return { perm, parent };
}

/**
 * Symbolic factorisation for an ordering: postorders the elimination tree (fill unchanged,
 * subtrees become contiguous), counts columns, finds fundamental supernodes (Liu, Ng & Peyton,
 * "On finding supernodes for sparse matrix computations", SIAM J. Matrix Anal. Appl. 14(1),
 * 1993), amalgamates, and builds each supernode's row structure.
 */
export function symbolicFactor(A: Csr, ordering: Ordering, options: SupernodeOptions = {}): Symbolic {
  // the steps are separate small functions on purpose: V8 compiles a long function with many
  // loops loop by loop (on-stack replacement, the whole function each time) on its first
  // calls, which made the first large analyses several times slower than later ones
  const n = A.n;
  const relax = options.relax ?? true;
  const maxCols = options.maxCols ?? 96;
  const tree = ordering.tree && ordering.tree.perm === ordering.perm ? ordering.tree : postorderedTree(A, ordering);
  const fundStart = fundamentalSupernodes(tree.parent, tree.colCounts);
  const groups = amalgamate(fundStart, tree.parent, tree.colCounts, relax, maxCols, n);
  const { perm, parent, colCounts } = renumberColumns(tree, groups.newToOld);
  const iperm = inversePerm(perm);
  const nSuper = groups.nGroups;
  const superStart = groups.groupStart;
  const superRowPtr = new Int32Array(nSuper + 1);
  const superValPtr = new Float64Array(nSuper + 1);
  const superOfCol = new Int32Array(n);
  for (let s = 0; s < nSuper; s++) {
    const nr = groups.groupRows[s];
    const f = superStart[s], l = superStart[s + 1];
    superRowPtr[s + 1] = superRowPtr[s] + nr;
    superValPtr[s + 1] = superValPtr[s] + (l - f) * nr;
    superOfCol.fill(s, f, l);
  }
  // flops from the true column counts: Σ c_j² (one multiply-add per pair of entries below)
  // (starts as a double: the sum passes 2^31 from about 50k dofs, and a small-integer start
  // made V8 deoptimise symbolicFactor there on its overflow)
  let flops = -0;
  for (let j = 0; j < n; j++) flops += colCounts[j] * colCounts[j];
  const superRows = rowStructures(A, perm, iperm, parent, superStart, superRowPtr, superOfCol);
  return {
    n,
    ordering: { perm, iperm, method: ordering.method },
    parent,
    colCounts,
    nnzL: tree.nnzL,
    nSuper,
    superStart,
    superRowPtr,
    superRows,
    superValPtr,
    superOfCol,
    nnzStored: superValPtr[nSuper],
    flops: flops + 0, // + 0 turns the -0 of an empty matrix into 0
  };
}

/** Fundamental supernodes: j joins j-1 when j-1 is j's only child and L(:,j-1) = {j-1} ∪ L(:,j). */
function fundamentalSupernodes(parent: Int32Array, colCounts: Int32Array): Int32Array {
  const n = parent.length;
  const childCount = new Int32Array(n);
  for (let j = 0; j < n; j++) if (parent[j] !== -1) childCount[parent[j]]++;
  const starts = new Int32Array(n + 1);
  let nf = 0;
  for (let j = 0; j < n; j++) {
    const joins = j > 0 && parent[j - 1] === j && childCount[j] === 1 && colCounts[j - 1] === colCounts[j] + 1;
    if (!joins) starts[nf++] = j;
  }
  starts[nf] = n;
  return starts.slice(0, nf + 1);
}

interface Groups {
  nGroups: number;
  /** first column of each group in the new numbering, length nGroups + 1 */
  groupStart: Int32Array;
  /** rows of each group's panel */
  groupRows: Float64Array;
  /** old column of each new column */
  newToOld: Int32Array;
}

/**
 * Amalgamation on the supernodal tree: merge a child into its parent when the explicit zeros
 * stay small. Siblings may be merged into the same parent; the merged columns are then
 * renumbered (children's subtrees first, then the members) — any topological order of the
 * elimination tree gives the same fill (Liu 1990, "The role of elimination trees").
 */
function amalgamate(
  fundStart: Int32Array,
  parent: Int32Array,
  colCounts: Int32Array,
  relax: boolean,
  maxCols: number,
  n: number,
): Groups {
  const nFund = fundStart.length - 1;
  const fNc = new Int32Array(nFund);
  const fParent = new Int32Array(nFund).fill(-1);
  const colToFund = new Int32Array(n);
  for (let f = 0; f < nFund; f++) {
    fNc[f] = fundStart[f + 1] - fundStart[f];
    for (let c = fundStart[f]; c < fundStart[f + 1]; c++) colToFund[c] = f;
  }
  for (let f = 0; f < nFund; f++) {
    const pc = parent[fundStart[f + 1] - 1];
    if (pc !== -1) fParent[f] = colToFund[pc];
  }
  const gNc = Float64Array.from(fNc);
  const gNr = new Float64Array(nFund);
  const gEntries = new Float64Array(nFund);
  for (let f = 0; f < nFund; f++) {
    gNr[f] = colCounts[fundStart[f]];
    let e = 0;
    for (let c = fundStart[f]; c < fundStart[f + 1]; c++) e += colCounts[c];
    gEntries[f] = e;
  }
  // member lists (in column order) of each group, as linked lists over fundamental supernodes
  const memberHead = new Int32Array(nFund);
  const memberTail = new Int32Array(nFund);
  const memberNext = new Int32Array(nFund).fill(-1);
  for (let f = 0; f < nFund; f++) { memberHead[f] = f; memberTail[f] = f; }
  const mergedInto = new Int32Array(nFund).fill(-1);
  // children lists of the fundamental tree
  const kidHead = new Int32Array(nFund).fill(-1);
  const kidNext = new Int32Array(nFund).fill(-1);
  for (let f = nFund - 1; f >= 0; f--) {
    const p = fParent[f];
    if (p !== -1) { kidNext[f] = kidHead[p]; kidHead[p] = f; }
  }
  if (relax) {
    for (let p = 0; p < nFund; p++) {
      for (let c = kidHead[p]; c !== -1; c = kidNext[c]) {
        const mergedNc = gNc[c] + gNc[p];
        if (mergedNc > maxCols) continue;
        const mergedNr = gNc[c] + gNr[p];
        const stored = panelEntries(mergedNc, mergedNr);
        const trueEntries = gEntries[c] + gEntries[p];
        if (stored - trueEntries > allowedZeroFraction(mergedNc) * stored) continue;
        // c's members go before p's members
        memberNext[memberTail[c]] = memberHead[p];
        memberHead[p] = memberHead[c];
        gNc[p] = mergedNc;
        gNr[p] = mergedNr;
        gEntries[p] = trueEntries;
        mergedInto[c] = p;
      }
    }
  }
  // group of each fundamental supernode (follow mergedInto to the root; parents come later)
  const groupOf = new Int32Array(nFund);
  for (let f = nFund - 1; f >= 0; f--) groupOf[f] = mergedInto[f] === -1 ? f : groupOf[mergedInto[f]];
  // group tree: a surviving group's parent is the group of its top member's parent
  const gKidHead = new Int32Array(nFund).fill(-1);
  const gKidNext = new Int32Array(nFund).fill(-1);
  for (let f = nFund - 1; f >= 0; f--) {
    if (mergedInto[f] !== -1 || fParent[f] === -1) continue;
    const pg = groupOf[fParent[f]];
    gKidNext[f] = gKidHead[pg];
    gKidHead[pg] = f;
  }
  // postorder of the group tree, emitting member columns
  const newToOld = new Int32Array(n);
  const groupStart = new Int32Array(nFund + 1);
  const groupRows = new Float64Array(nFund);
  let nGroups = 0;
  const stack = new Int32Array(nFund);
  let col = 0;
  for (let root = 0; root < nFund; root++) {
    if (mergedInto[root] !== -1 || fParent[root] !== -1) continue;
    let top = 0;
    stack[0] = root;
    while (top >= 0) {
      const g = stack[top];
      const kid = gKidHead[g];
      if (kid !== -1) {
        gKidHead[g] = gKidNext[kid];
        stack[++top] = kid;
        continue;
      }
      top--;
      groupStart[nGroups] = col;
      groupRows[nGroups++] = gNr[g];
      for (let m = memberHead[g]; m !== -1; m = memberNext[m]) {
        for (let c = fundStart[m]; c < fundStart[m + 1]; c++) newToOld[col++] = c;
      }
    }
  }
  groupStart[nGroups] = n;
  return { nGroups, groupStart: groupStart.slice(0, nGroups + 1), groupRows, newToOld };
}

/** perm, parent and counts in the new column numbering of the amalgamated supernodes. */
function renumberColumns(
  tree: EliminationTree,
  newToOld: Int32Array,
): { perm: Int32Array; parent: Int32Array; colCounts: Int32Array } {
  const n = newToOld.length;
  const oldToNew = inversePerm(newToOld);
  const perm = new Int32Array(n);
  const parent = new Int32Array(n);
  const colCounts = new Int32Array(n);
  const perm0 = tree.perm, parent0 = tree.parent, counts0 = tree.colCounts;
  for (let k = 0; k < n; k++) {
    const o = newToOld[k];
    perm[k] = perm0[o];
    parent[k] = parent0[o] === -1 ? -1 : oldToNew[parent0[o]];
    colCounts[k] = counts0[o];
  }
  return { perm, parent, colCounts };
}

/**
 * Row structures in one pass over the rows of P A Pᵀ, by row subtrees: row i of L is nonzero
 * in every column on the elimination-tree paths from the columns j < i of A's row i up to i
 * (Liu 1986; the traversal of cs_ereach in Davis 2006, §4.1), so walking the supernodal tree
 * from supernode(j) until a supernode already holding i appends i to every supernode whose
 * structure contains it — and, rows being taken in increasing order, every structure comes
 * out sorted, with no per-supernode merge or sort.
 */
function rowStructures(
  A: Csr,
  perm: Int32Array,
  iperm: Int32Array,
  parent: Int32Array,
  superStart: Int32Array,
  superRowPtr: Int32Array,
  superOfCol: Int32Array,
): Int32Array {
  const n = A.n;
  const nSuper = superStart.length - 1;
  const superRows = new Int32Array(superRowPtr[nSuper]);
  const superParent = new Int32Array(nSuper);
  const writePos = new Int32Array(nSuper);
  const mark = new Int32Array(nSuper).fill(-1);
  for (let s = 0; s < nSuper; s++) {
    const f = superStart[s];
    const l = superStart[s + 1];
    let w = superRowPtr[s];
    for (let c = f; c < l; c++) superRows[w++] = c; // the diagonal block's rows come first
    writePos[s] = w;
    const top = parent[l - 1];
    superParent[s] = top === -1 ? -1 : superOfCol[top];
  }
  // supernodes that received the previous row: the next row, when it is the following row of
  // the same node (same pattern in A, same supernode), goes to exactly the same ones
  const touched = new Int32Array(nSuper);
  let nTouched = 0;
  const rowPtr = A.rowPtr, colIdx = A.colIdx;
  for (let i = 0; i < n; i++) {
    const si = superOfCol[i];
    const row = perm[i];
    const start = rowPtr[row], end = rowPtr[row + 1];
    if (i > 0 && perm[i - 1] === row - 1 && superOfCol[i - 1] === si && samePattern(colIdx, rowPtr[row - 1], start, end)) {
      for (let t = 0; t < nTouched; t++) superRows[writePos[touched[t]]++] = i;
      continue;
    }
    mark[si] = i; // the walk from any descendant stops at i's own supernode
    nTouched = 0;
    for (let p = start; p < end; p++) {
      const j = iperm[colIdx[p]];
      if (j >= i) continue;
      for (let sj = superOfCol[j]; mark[sj] !== i; sj = superParent[sj]) {
        mark[sj] = i;
        superRows[writePos[sj]++] = i;
        touched[nTouched++] = sj;
      }
    }
  }
  for (let s = 0; s < nSuper; s++) {
    if (writePos[s] !== superRowPtr[s + 1]) {
      throw new Error(`symbolic: supernode ${s} structure has ${writePos[s] - superRowPtr[s]} rows, counts predicted ${superRowPtr[s + 1] - superRowPtr[s]}`);
    }
  }
  return superRows;
}
