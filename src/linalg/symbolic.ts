import { inversePerm } from './graph.js';
import type { Csr, EliminationTree, Ordering, Symbolic } from './types.js';

/**
 * Elimination tree of P A Pᵀ from the full symmetric pattern of A.
 * Liu, "A compact row storage scheme for Cholesky factors using elimination trees",
 * ACM TOMS 12(2):127–148, 1986 — path compression through `ancestor`.
 */
export function eliminationTree(A: Csr, perm: Int32Array, iperm: Int32Array): Int32Array {
  const n = A.n;
  const parent = new Int32Array(n).fill(-1);
  const ancestor = new Int32Array(n).fill(-1);
  for (let k = 0; k < n; k++) {
    const row = perm[k];
    for (let p = A.rowPtr[row]; p < A.rowPtr[row + 1]; p++) {
      let i = iperm[A.colIdx[p]];
      while (i !== -1 && i < k) {
        const next = ancestor[i];
        ancestor[i] = k;
        if (next === -1) parent[i] = k;
        i = next;
      }
    }
  }
  return parent;
}

/** Depth-first postorder of a forest given by parent pointers: post[k] = node visited k-th. */
export function postorderTree(parent: Int32Array): Int32Array {
  const n = parent.length;
  const head = new Int32Array(n).fill(-1);
  const next = new Int32Array(n);
  // insert children in reverse so that they are visited in ascending order
  for (let j = n - 1; j >= 0; j--) {
    const p = parent[j];
    if (p === -1) continue;
    next[j] = head[p];
    head[p] = j;
  }
  const post = new Int32Array(n);
  const stack = new Int32Array(n);
  let k = 0;
  for (let root = 0; root < n; root++) {
    if (parent[root] !== -1) continue;
    let top = 0;
    stack[0] = root;
    while (top >= 0) {
      const p = stack[top];
      const c = head[p];
      if (c === -1) {
        top--;
        post[k++] = p;
      } else {
        head[p] = next[c];
        stack[++top] = c;
      }
    }
  }
  return post;
}

/**
 * Column counts of L (diagonal included) for a matrix whose elimination tree is already
 * postordered (children numbered before parents, subtrees contiguous).
 * Gilbert, Ng & Peyton, "An efficient algorithm to compute row and column counts for sparse
 * Cholesky factorization", SIAM J. Matrix Anal. Appl. 15(4):1075–1091, 1994: each column's
 * count is a sum of ±1 "deltas" placed at the leaves of the row subtrees and at the least
 * common ancestors of consecutive leaves, found with a disjoint-set forest.
 */
export function columnCounts(
  A: Csr,
  perm: Int32Array,
  iperm: Int32Array,
  parent: Int32Array,
  weight?: Int32Array,
): Int32Array {
  // weight[j] (optional) = rows that permuted vertex j stands for: every ±1 of row i becomes
  // ±weight[i], so the counts are sums of weights (used on the compressed node graph)
  if (weight) return weightedColumnCounts(A, perm, iperm, parent, weight);
  const n = A.n;
  const delta = new Int32Array(n);
  const first = new Int32Array(n).fill(-1);
  const maxFirst = new Int32Array(n).fill(-1);
  const prevLeaf = new Int32Array(n).fill(-1);
  const ancestor = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    let j = k;
    delta[j] = first[j] === -1 ? 1 : 0; // j is a leaf of the etree
    for (; j !== -1 && first[j] === -1; j = parent[j]) first[j] = k;
  }
  for (let i = 0; i < n; i++) ancestor[i] = i;
  for (let j = 0; j < n; j++) {
    if (parent[j] !== -1) delta[parent[j]]--;
    const row = perm[j];
    for (let p = A.rowPtr[row]; p < A.rowPtr[row + 1]; p++) {
      const i = iperm[A.colIdx[p]];
      // is j a leaf of the i-th row subtree? (only entries below the diagonal matter)
      if (i <= j || first[j] <= maxFirst[i]) continue;
      maxFirst[i] = first[j];
      const jPrev = prevLeaf[i];
      prevLeaf[i] = j;
      delta[j]++;
      if (jPrev === -1) continue; // first leaf of row i's subtree
      // least common ancestor q of jPrev and j, with path compression
      let q = jPrev;
      while (q !== ancestor[q]) q = ancestor[q];
      for (let s = jPrev; s !== q; ) {
        const sp = ancestor[s];
        ancestor[s] = q;
        s = sp;
      }
      delta[q]--;
    }
    if (parent[j] !== -1) ancestor[j] = parent[j];
  }
  for (let j = 0; j < n; j++) if (parent[j] !== -1) delta[parent[j]] += delta[j];
  return delta;
}

function weightedColumnCounts(
  A: Csr,
  perm: Int32Array,
  iperm: Int32Array,
  parent: Int32Array,
  weight: Int32Array,
): Int32Array {
  const n = A.n;
  const delta = new Int32Array(n);
  const first = new Int32Array(n).fill(-1);
  const maxFirst = new Int32Array(n).fill(-1);
  const prevLeaf = new Int32Array(n).fill(-1);
  const ancestor = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    let j = k;
    delta[j] = first[j] === -1 ? weight[j] : 0;
    for (; j !== -1 && first[j] === -1; j = parent[j]) first[j] = k;
  }
  for (let i = 0; i < n; i++) ancestor[i] = i;
  for (let j = 0; j < n; j++) {
    if (parent[j] !== -1) delta[parent[j]] -= weight[j];
    const row = perm[j];
    for (let p = A.rowPtr[row]; p < A.rowPtr[row + 1]; p++) {
      const i = iperm[A.colIdx[p]];
      if (i <= j || first[j] <= maxFirst[i]) continue;
      maxFirst[i] = first[j];
      const jPrev = prevLeaf[i];
      prevLeaf[i] = j;
      delta[j] += weight[i];
      if (jPrev === -1) continue;
      let q = jPrev;
      while (q !== ancestor[q]) q = ancestor[q];
      for (let s = jPrev; s !== q; ) {
        const sp = ancestor[s];
        ancestor[s] = q;
        s = sp;
      }
      delta[q] -= weight[i];
    }
    if (parent[j] !== -1) ancestor[j] = parent[j];
  }
  for (let j = 0; j < n; j++) if (parent[j] !== -1) delta[parent[j]] += delta[j];
  return delta;
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
