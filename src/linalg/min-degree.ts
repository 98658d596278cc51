/**
 * Approximate minimum degree ordering of a symmetric graph.
 *
 * Amestoy, Davis & Duff, "An approximate minimum degree ordering algorithm", SIAM J. Matrix
 * Anal. Appl. 17(4):886–905, 1996. The elimination is simulated on the QUOTIENT GRAPH: an
 * eliminated pivot p becomes an "element" whose list L_p holds the variables its elimination
 * made pairwise adjacent (the clique of the elimination graph, stored once instead of as
 * |L_p|² edges). Each variable i keeps a list with its adjacent elements E_i first and its
 * remaining variable neighbours A_i after them. Per pivot step:
 *
 *   1. pivot p = a variable of least approximate external degree;
 *   2. L_p = (A_p ∪ ⋃_{e ∈ E_p} L_e) \ {p}; the elements of E_p are absorbed into p;
 *   3. |L_e \ L_p| for every element e next to a variable of L_p (done while L_p is formed);
 *   4. each i ∈ L_p: E_i loses the absorbed elements and gains p, A_i loses the variables of L_p
 *      (now reached through p); an element with L_e ⊆ L_p is absorbed too (aggressive
 *      absorption); a variable left with E_i = {p}, A_i = ∅ is eliminated together with p
 *      (mass elimination); the others get the paper's approximate external degree
 *        d̄_i = min( n_left − |i|,  d̄_i(old) + |L_p \ i|,  |A_i| + |L_p \ i| + Σ_{e ∈ E_i\{p}} |L_e \ L_p| );
 *   5. variables of L_p with equal lists (E_i, A_i) are indistinguishable: found by a hash of the
 *      list, compared entry by entry, merged into one SUPERVARIABLE of summed weight.
 *
 * Sizes |·| are weights: vertex weights are the matrix rows a vertex stands for (the node
 * graph's dofs), and a supervariable weighs the sum of its members. The same list comparison is
 * applied once to the input graph (closed neighbourhoods), so twins present from the start
 * are merged before the first pivot. Vertices of very high degree are withheld and ordered last
 * (common practice for "dense" rows, which would make every step touch them; none occur in
 * finite element graphs).
 *
 * A large graph whose numbering is scattered is first renumbered breadth first (cache
 * locality; `breadthFirstRenumbering`), and the order mapped back.
 *
 * The output is a postorder of the assembly tree (element e's parent = the pivot that absorbed
 * it), each pivot followed by the variables merged or mass-eliminated into it.
 */

/** vertex states */
const VARIABLE = 0;
/** a pivot that is still an element of the quotient graph */
const ELEMENT = 1;
/** a pivot whose element was absorbed into a later one */
const ABSORBED = 2;
/** a variable merged into a supervariable, or eliminated with a pivot (mass elimination) */
const MERGED = 3;
/** withheld from the elimination, ordered last */
const DENSE = 4;

const NONE = -1;
/** `tag` of a vertex that is no longer a variable: above every stamp, so scans skip it */
const GONE = 0x7fffffff;

/**
 * Quotient graph and the working arrays of one ordering. All lists live in `store`: vertex v
 * owns store[lists[5 * v] … lists[5 * v] + lists[5 * v + 1]); a variable's first `lists[5 * v + 2]` entries are
 * elements, the rest variables; an element's entries are variables. Entries of vertices that
 * left (merged, absorbed) stay in lists until the list is next rewritten; scans skip them
 * (elements by `state`, variables by `tag`).
 */
interface QuotientGraph {
  readonly n: number;
  store: Int32Array;
  /** first free slot of store */
  storeEnd: number;
  /**
   * Per vertex v, side by side (one memory fetch for what a scan reads of a vertex):
   * [5v] = start of its list in store, [5v + 1] = its length, [5v + 2] = how many of its first
   * entries are elements, [5v + 3] = its tag (below), [5v + 4] = its weight: the rows a
   * (super)variable stands for, kept by pivots and merged variables for the record
   */
  readonly lists: Int32Array;
  readonly state: Uint8Array;
  /* Tag (lists[5v + 3]): variable v is in the current L_p when its tag is the step's stamp; GONE
   * once v is no longer a variable. So one test, tag ≥ stamp, skips both in every scan of the
   * current step. */
  /** approximate external degree d̄_i of each variable (weights of its neighbours) */
  readonly degree: Int32Array;
  /** |A_i| + Σ |L_e \ L_p| of the variables of the current L_p (step 4) */
  readonly partialDegree: Int32Array;
  /**
   * Per element e, side by side (one memory fetch): [3e] = stamp of the step that last met e,
   * [3e + 1] = |L_e \ L_p| in that step, [3e + 2] = |L_e| (summed weight of its variables)
   */
  readonly outside: Int32Array;
  /** assembly tree: parent[e] = the pivot whose element absorbed element e (NONE for a root) */
  readonly parent: Int32Array;
  /**
   * Vertices eliminated together: a linked list from each principal variable (later its pivot)
   * through the variables merged or mass-eliminated into it, with its tail for O(1) joins
   */
  readonly memberNext: Int32Array;
  readonly memberTail: Int32Array;
  /** stamp marks for comparing two lists (steps 5 and the initial twins) */
  readonly listMark: Int32Array;
  stamp: number;
  /** hash table of the initial twin search (size a power of two), and its chains */
  readonly hashHead: Int32Array;
  readonly hashNext: Int32Array;
  /**
   * Supervariable candidates of the current step: the members of L_p left after step 4 and the
   * hashes of their lists, side by side in two arrays (sorted together in step 5)
   */
  readonly candidates: Int32Array;
  readonly candidateHash: Int32Array;
  candidateCount: number;
  /** summed weight, and count, of the principal variables not yet eliminated (dense excluded) */
  weightLeft: number;
  variablesLeft: number;
  /** where the current pivot's list L_p sits in store, its entry count, and its members' tag */
  pivotStart: number;
  pivotLength: number;
  pivotStamp: number;
  /** |L_p| as formed (step 2); merges keep it, mass elimination takes its share off */
  pivotWeight: number;
}

/** Variables bucketed by approximate degree, doubly linked, for the minimum-degree pick. */
interface DegreeBuckets {
  readonly head: Int32Array;
  /** [2i] = next and [2i + 1] = previous variable in i's bucket, side by side (one fetch) */
  readonly link: Int32Array;
  minDegree: number;
}

export interface MinDegreeOptions {
  /**
   * The adjacency is already symmetric, without self loops or repeated entries (as
   * `compressGraph` and the dissection's subgraphs build it): skip forming A + Aᵀ. Default false.
   */
  symmetricPattern?: boolean;
}

/**
 * Fill-reducing order of a graph by approximate minimum degree (see the file header).
 * perm[k] = vertex eliminated k-th; a postorder of the assembly tree.
 *
 * @param adjPtr, adjIdx  adjacency in CSR form; unless `options.symmetricPattern`, the pattern
 *   of A + Aᵀ is ordered (a missing mirror entry is added, self loops and repeats ignored)
 * @param weights  rows each vertex stands for (default 1 each), all ≥ 1
 */
export function amdOrder(
  n: number,
  adjPtr: Int32Array,
  adjIdx: Int32Array,
  weights?: Int32Array,
  options: MinDegreeOptions = {},
): Int32Array {
  checkGraph(n, adjPtr, adjIdx, weights);
  if (n === 0) return new Int32Array(0);
  if (!isScattered(n, adjPtr, adjIdx)) return orderQuotientGraph(n, adjPtr, adjIdx, weights, options.symmetricPattern ?? false);
  const local = breadthFirstRenumbering(n, adjPtr, adjIdx, weights);
  const localPerm = orderQuotientGraph(n, local.adjPtr, local.adjIdx, local.weights, options.symmetricPattern ?? false);
  const perm = new Int32Array(n);
  for (let k = 0; k < n; k++) perm[k] = local.vertexOf[localPerm[k]];
  return perm;
}

/**
 * From this many vertices on, a scattered graph is renumbered breadth first before the
 * elimination (see `breadthFirstRenumbering`). Below it the working arrays fit the processor
 * caches whatever the numbering, and the caller's numbering decides the ties as before.
 */
const RENUMBER_MIN_VERTICES = 4096;

/**
 * Whether the numbering is scattered: at least RENUMBER_MIN_VERTICES vertices and a mean
 * |i − j| over the entries above 4√n. A plane mesh numbered along a sweep keeps neighbours
 * about a front's width (≈ √n) apart: the structured bench plates 151–215 for √n ≈ 317, so
 * their numbering, and their order, stay as given; the hole plate's mesher numbering 32 791.
 * One sequential pass over the adjacency.
 */
function isScattered(n: number, adjPtr: Int32Array, adjIdx: Int32Array): boolean {
  if (n < RENUMBER_MIN_VERTICES) return false;
  const nnz = adjPtr[n];
  if (nnz === 0) return false;
  let span = 0;
  for (let v = 0; v < n; v++) {
    for (let p = adjPtr[v], end = adjPtr[v + 1]; p < end; p++) span += Math.abs(adjIdx[p] - v);
  }
  return span / nnz > 4 * Math.sqrt(n);
}

/**
 * The elimination touches, at each pivot, the per-vertex arrays of the pivot's neighbours and
 * of their elements. A mesher's node numbering can be scattered over the whole range (the
 * 105 319-node hole plate graph: mean |i − j| over its edges 32 791, two thirds of its edges
 * span more than 4 096 numbers; the structured plates: 151–215), and then nearly every such
 * access misses the caches. A breadth-first numbering (levels of the search from vertex 0, each
 * further component from its lowest unreached vertex) keeps neighbours a front's width apart
 * (mean 339 on the hole plate) at the cost of one pass over the adjacency. It changes which
 * vertex wins a tie of degrees, hence the order, deterministically (docs/linalg.md).
 * For an unsymmetric pattern the search follows the given entries only (still a permutation).
 */
function breadthFirstRenumbering(
  n: number,
  adjPtr: Int32Array,
  adjIdx: Int32Array,
  weights: Int32Array | undefined,
): { vertexOf: Int32Array; adjPtr: Int32Array; adjIdx: Int32Array; weights: Int32Array | undefined } {
  const vertexOf = new Int32Array(n);
  const numberOf = new Int32Array(n).fill(NONE);
  const ptr = new Int32Array(n + 1);
  const idx = new Int32Array(adjPtr[n]);
  const w = weights ? new Int32Array(n) : undefined;
  // the k-th vertex taken from the queue is vertex k of the new numbering; its neighbours all
  // have numbers once its list is scanned, so its renumbered list is written in the same pass
  let head = 0, tail = 0, q = 0;
  for (let root = 0; root < n; root++) {
    if (numberOf[root] !== NONE) continue;
    numberOf[root] = tail;
    vertexOf[tail++] = root;
    while (head < tail) {
      const v = vertexOf[head];
      if (w && weights) w[head] = weights[v];
      for (let p = adjPtr[v], end = adjPtr[v + 1]; p < end; p++) {
        const u = adjIdx[p];
        let number = numberOf[u];
        if (number === NONE) {
          number = tail++;
          numberOf[u] = number;
          vertexOf[number] = u;
        }
        idx[q++] = number;
      }
      ptr[++head] = q;
    }
  }
  return { vertexOf, adjPtr: ptr, adjIdx: idx, weights: w };
}

/** amdOrder on a checked, non-empty graph in the numbering it is given. */
function orderQuotientGraph(
  n: number,
  adjPtr: Int32Array,
  adjIdx: Int32Array,
  weights: Int32Array | undefined,
  symmetricPattern: boolean,
): Int32Array {
  const q = quotientGraphOf(n, adjPtr, adjIdx, weights, symmetricPattern);
  withholdDense(q);
  degreesAndTwins(q);
  const buckets = degreeBuckets(q);
  while (q.weightLeft > 0) {
    const p = takeMinDegree(q, buckets);
    eliminatePivot(q, buckets, p);
  }
  return assemblyPostorder(q);
}

/** One pivot step (steps 2–5 of the file header). */
function eliminatePivot(q: QuotientGraph, buckets: DegreeBuckets, p: number): void {
  // L_p has at most one entry per variable left; only when that much room is lacking is the
  // exact bound worth its pass
  if (q.storeEnd + q.variablesLeft > q.store.length) reserveStore(q, pivotListBound(q, p));
  formPivotElement(q, p);
  const massWeight = updateVariableLists(q, p);
  mergeIndistinguishable(q);
  finishPivot(q, buckets, p, massWeight);
}

function checkGraph(n: number, adjPtr: Int32Array, adjIdx: Int32Array, weights: Int32Array | undefined): void {
  if (!Number.isInteger(n) || n < 0) throw new RangeError(`amdOrder: vertex count must be an integer ≥ 0, got ${n}`);
  if (adjPtr.length !== n + 1) throw new TypeError(`amdOrder: adjPtr must have n + 1 = ${n + 1} entries, got ${adjPtr.length}`);
  if (adjPtr[0] !== 0) throw new RangeError(`amdOrder: adjPtr[0] must be 0, got ${adjPtr[0]}`);
  for (let i = 0; i < n; i++) {
    if (adjPtr[i + 1] < adjPtr[i]) throw new RangeError(`amdOrder: adjPtr must not decrease, adjPtr[${i + 1}] = ${adjPtr[i + 1]} < adjPtr[${i}] = ${adjPtr[i]}`);
  }
  if (adjPtr[n] > adjIdx.length) throw new TypeError(`amdOrder: adjPtr[n] = ${adjPtr[n]} exceeds adjIdx length ${adjIdx.length}`);
  for (let p = 0; p < adjPtr[n]; p++) {
    const j = adjIdx[p];
    if (j < 0 || j >= n) throw new RangeError(`amdOrder: adjIdx[${p}] = ${j} is not a vertex of 0…${n - 1}`);
  }
  if (weights) {
    if (weights.length !== n) throw new TypeError(`amdOrder: weights must have n = ${n} entries, got ${weights.length}`);
    for (let i = 0; i < n; i++) if (!(weights[i] >= 1)) throw new RangeError(`amdOrder: weight of vertex ${i} must be ≥ 1, got ${weights[i]}`);
  }
}

/**
 * The quotient graph before any elimination: every vertex a variable whose list is its
 * neighbours in A + Aᵀ (self loops and repeats dropped; taken as given when the caller says the
 * pattern is symmetric already), with elbow room after the lists for the element lists to come.
 */
function quotientGraphOf(
  n: number,
  adjPtr: Int32Array,
  adjIdx: Int32Array,
  weights: Int32Array | undefined,
  symmetricPattern: boolean,
): QuotientGraph {
  const nnz = adjPtr[n];
  // elbow room (common practice): element lists are appended; garbage collection reclaims space.
  // nnz/2 + 2n: no collection on the bench plates (nnz/4 + 2n needed one on the LST and hole
  // plates at 200k dofs, and replacing the store array made V8 recompile the step functions)
  const capacity = (symmetricPattern ? nnz : 2 * nnz) + (nnz >> 1) + 2 * n + 16;
  const q = emptyQuotientGraph(n, capacity, weights);
  if (symmetricPattern) {
    q.store.set(adjIdx.subarray(0, nnz));
    const { lists } = q;
    for (let i = 0; i < n; i++) {
      lists[5 * i] = adjPtr[i];
      lists[5 * i + 1] = adjPtr[i + 1] - adjPtr[i];
    }
  } else {
    symmetricLists(n, adjPtr, adjIdx, q.store, q.lists);
  }
  q.storeEnd = q.lists[5 * (n - 1)] + q.lists[5 * (n - 1) + 1];
  let total = 0;
  for (let i = 0; i < n; i++) total += q.lists[5 * i + 4];
  if (total > 0x3fffffff) throw new RangeError(`amdOrder: total vertex weight ${total} exceeds 2^30`);
  q.weightLeft = total;
  return q;
}

/**
 * Every array of the ordering, allocated at once (a function without loops: V8 then never
 * meets an allocation without feedback in code it optimised while inside a loop).
 */
function emptyQuotientGraph(n: number, capacity: number, weights: Int32Array | undefined): QuotientGraph {
  return {
    n,
    store: new Int32Array(capacity),
    storeEnd: 0,
    lists: vertexRecords(n, weights),
    state: new Uint8Array(n), // all VARIABLE
    degree: new Int32Array(n),
    partialDegree: new Int32Array(n),
    outside: new Int32Array(3 * n),
    parent: new Int32Array(n).fill(NONE),
    memberNext: new Int32Array(n).fill(NONE),
    memberTail: identity(n),
    listMark: new Int32Array(n),
    stamp: 0,
    hashHead: new Int32Array(hashSize(n)).fill(NONE),
    hashNext: new Int32Array(n),
    candidates: new Int32Array(n),
    candidateHash: new Int32Array(n),
    candidateCount: 0,
    weightLeft: 0,
    variablesLeft: n,
    pivotStart: 0,
    pivotLength: 0,
    pivotStamp: 0,
    pivotWeight: 0,
  };
}

/** The per-vertex records of `lists`: lists empty, tags 0, weights given (default 1). */
function vertexRecords(n: number, weights: Int32Array | undefined): Int32Array {
  const records = new Int32Array(5 * n);
  for (let v = 0; v < n; v++) records[5 * v + 4] = weights ? weights[v] : 1;
  return records;
}

function identity(n: number): Int32Array {
  const a = new Int32Array(n);
  for (let i = 0; i < n; i++) a[i] = i;
  return a;
}

/** Lists of A + Aᵀ without self loops or repeats: row i of A merged with row i of Aᵀ. */
function symmetricLists(n: number, adjPtr: Int32Array, adjIdx: Int32Array, store: Int32Array, lists: Int32Array): void {
  const nnz = adjPtr[n];
  const tPtr = new Int32Array(n + 1);
  for (let p = 0; p < nnz; p++) tPtr[adjIdx[p] + 1]++;
  for (let i = 0; i < n; i++) tPtr[i + 1] += tPtr[i];
  const tIdx = new Int32Array(nnz);
  const fill = tPtr.slice(0, n);
  for (let i = 0; i < n; i++) for (let p = adjPtr[i]; p < adjPtr[i + 1]; p++) tIdx[fill[adjIdx[p]]++] = i;
  const seen = new Int32Array(n).fill(NONE);
  let w = 0;
  for (let i = 0; i < n; i++) {
    lists[5 * i] = w;
    seen[i] = i;
    for (let p = adjPtr[i]; p < adjPtr[i + 1]; p++) {
      const j = adjIdx[p];
      if (seen[j] !== i) { seen[j] = i; store[w++] = j; }
    }
    for (let p = tPtr[i]; p < tPtr[i + 1]; p++) {
      const j = tIdx[p];
      if (seen[j] !== i) { seen[j] = i; store[w++] = j; }
    }
    lists[5 * i + 1] = w - lists[5 * i];
  }
}

/** Hash table size: the power of two at or above n (a bucket is then the hash's low bits). */
function hashSize(n: number): number {
  let size = 1;
  while (size < n) size *= 2;
  return size;
}

/** A fresh mark value for `tag`, `listMark` and `outside` (older marks read as unmarked). */
function newStamp(q: QuotientGraph): number {
  if (q.stamp >= 0x3fffffff) {
    const lists = q.lists;
    for (let v = 0; v < q.n; v++) if (lists[5 * v + 3] !== GONE) lists[5 * v + 3] = 0;
    q.listMark.fill(0);
    const outside = q.outside;
    for (let e = 0; e < q.n; e++) outside[3 * e] = 0;
    q.stamp = 0;
  }
  return ++q.stamp;
}

/**
 * Withhold vertices with more than max(16, 10·√n) neighbours: they take no part in the
 * elimination and are ordered last. The threshold is common practice for sparse orderings.
 */
function withholdDense(q: QuotientGraph): void {
  const limit = Math.max(16, Math.floor(10 * Math.sqrt(q.n)));
  for (let i = 0; i < q.n; i++) {
    if (q.lists[5 * i + 1] > limit) {
      q.state[i] = DENSE;
      q.lists[5 * i + 3] = GONE;
      q.weightLeft -= q.lists[5 * i + 4];
      q.variablesLeft--;
    }
  }
}

/**
 * Degrees of the input graph (weights of the neighbours), and vertices with equal closed
 * neighbourhoods (Adj(i) ∪ {i} = Adj(j) ∪ {j}) merged before the first pivot: the step-5 test
 * on the input graph. A duplicated vertex then costs nothing and orders as one vertex of the
 * summed weight would. Merging j into i leaves every other vertex's degree as it was (it loses
 * j and i gains j's weight) and takes j's weight off i's own degree.
 */
function degreesAndTwins(q: QuotientGraph): void {
  const { store, lists, state, degree, hashHead, hashNext } = q;
  const mask = hashHead.length - 1;
  for (let i = q.n - 1; i >= 0; i--) {
    if (state[i] !== VARIABLE) continue;
    let h = i;
    let d = 0;
    for (let p = lists[5 * i], end = p + lists[5 * i + 1]; p < end; p++) {
      const j = store[p];
      h = (h + j) | 0;
      if (state[j] === VARIABLE) d += lists[5 * j + 4];
    }
    degree[i] = d;
    const bucket = h & mask;
    hashNext[i] = hashHead[bucket];
    hashHead[bucket] = i;
  }
  for (let bucket = 0; bucket <= mask; bucket++) {
    const first = hashHead[bucket];
    if (first === NONE) continue;
    hashHead[bucket] = NONE;
    if (hashNext[first] !== NONE) mergeTwinsOfBucket(q, first);
  }
}

/** Compare the closed neighbourhoods of one hash bucket's vertices pairwise; merge the equal. */
function mergeTwinsOfBucket(q: QuotientGraph, first: number): void {
  const { store, lists, state, degree, listMark, hashNext } = q;
  for (let i = first; i !== NONE; i = hashNext[i]) {
    if (state[i] !== VARIABLE) continue;
    let s = 0;
    for (let j = hashNext[i]; j !== NONE; j = hashNext[j]) {
      if (state[j] !== VARIABLE || lists[5 * j + 1] !== lists[5 * i + 1]) continue;
      if (s === 0) {
        s = newStamp(q);
        listMark[i] = s;
        for (let p = lists[5 * i], end = p + lists[5 * i + 1]; p < end; p++) listMark[store[p]] = s;
      }
      if (listMark[j] !== s) continue;
      let same = true;
      for (let p = lists[5 * j], end = p + lists[5 * j + 1]; p < end && same; p++) same = listMark[store[p]] === s;
      if (!same) continue;
      degree[i] -= lists[5 * j + 4];
      lists[5 * i + 4] += lists[5 * j + 4];
      joinMembers(q, i, j);
      state[j] = MERGED;
      lists[5 * j + 3] = GONE;
      q.variablesLeft--;
    }
  }
}

/** Append j's members to i's (they will be eliminated together). */
function joinMembers(q: QuotientGraph, i: number, j: number): void {
  q.memberNext[q.memberTail[i]] = j;
  q.memberTail[i] = q.memberTail[j];
}

/** The degree buckets holding every variable. */
function degreeBuckets(q: QuotientGraph): DegreeBuckets {
  const { n, state, degree } = q;
  const buckets: DegreeBuckets = {
    head: new Int32Array(q.weightLeft + 1).fill(NONE),
    link: new Int32Array(2 * n),
    minDegree: q.weightLeft,
  };
  for (let i = 0; i < n; i++) if (state[i] === VARIABLE) addToBucket(buckets, i, degree[i]);
  return buckets;
}

function addToBucket(b: DegreeBuckets, i: number, d: number): void {
  const first = b.head[d];
  b.link[2 * i] = first;
  b.link[2 * i + 1] = NONE;
  if (first !== NONE) b.link[2 * first + 1] = i;
  b.head[d] = i;
  if (d < b.minDegree) b.minDegree = d;
}

function removeFromBucket(b: DegreeBuckets, i: number, d: number): void {
  const link = b.link;
  const after = link[2 * i], before = link[2 * i + 1];
  if (before === NONE) b.head[d] = after;
  else link[2 * before] = after;
  if (after !== NONE) link[2 * after + 1] = before;
}

/** Step 1: a variable of least approximate degree (the last one bucketed at that degree). */
function takeMinDegree(q: QuotientGraph, b: DegreeBuckets): number {
  let d = b.minDegree;
  while (b.head[d] === NONE) d++;
  b.minDegree = d;
  const p = b.head[d];
  removeFromBucket(b, p, d);
  return p;
}

/** Entries L_p can have at most: A_p plus the lists of the elements of E_p. */
function pivotListBound(q: QuotientGraph, p: number): number {
  const { store, lists, state } = q;
  let bound = lists[5 * p + 1] - lists[5 * p + 2];
  for (let t = lists[5 * p], end = t + lists[5 * p + 2]; t < end; t++) {
    const e = store[t];
    if (state[e] === ELEMENT) bound += lists[5 * e + 1];
  }
  return bound;
}

/**
 * Make room for `needed` entries after storeEnd: garbage collection into a new array that
 * keeps only the live lists, each stripped of the vertices that left. The new array has half
 * the live size again plus n free, so collections are some steps apart (cost linear in the
 * live lists each time).
 */
function reserveStore(q: QuotientGraph, needed: number): void {
  if (q.storeEnd + needed <= q.store.length) return;
  const { n, lists, state } = q;
  const old = q.store;
  let live = 0;
  for (let v = 0; v < n; v++) if (state[v] === VARIABLE || state[v] === ELEMENT) live += lists[5 * v + 1];
  const capacity = Math.ceil(1.5 * (live + needed)) + n;
  const store = new Int32Array(capacity);
  let w = 0;
  for (let v = 0; v < n; v++) {
    const s = state[v];
    if (s !== VARIABLE && s !== ELEMENT) continue;
    const from = lists[5 * v], nElements = s === VARIABLE ? lists[5 * v + 2] : 0;
    lists[5 * v] = w;
    for (let t = from; t < from + nElements; t++) if (state[old[t]] === ELEMENT) store[w++] = old[t];
    if (s === VARIABLE) lists[5 * v + 2] = w - lists[5 * v];
    for (let t = from + nElements; t < from + lists[5 * v + 1]; t++) if (state[old[t]] === VARIABLE) store[w++] = old[t];
    lists[5 * v + 1] = w - lists[5 * v];
  }
  q.store = store;
  q.storeEnd = w;
}

/**
 * Steps 2 and 3: the new element's list L_p at the end of store, built from the elements of
 * E_p (absorbed into p on the way) and the variables of A_p; its members are tagged with the
 * step's stamp (they stay in their degree buckets until finishPivot knows their new degree).
 * As each member i joins, |L_e \ L_p| of the elements e of E_i is brought up to date (step 3):
 * the first time e is met this step it starts from |L_e|, and each member met takes its weight
 * off.
 */
function formPivotElement(q: QuotientGraph, p: number): void {
  const { store, lists, state, parent } = q;
  const inPivot = newStamp(q);
  state[p] = ELEMENT;
  lists[5 * p + 3] = GONE;
  q.variablesLeft--;
  const listStart = q.storeEnd;
  let w = listStart;
  let formedWeight = 0;
  const pStart = lists[5 * p], pElements = lists[5 * p + 2], pEnd = pStart + lists[5 * p + 1];
  for (let t = pStart; t < pStart + pElements; t++) {
    const e = store[t];
    if (state[e] !== ELEMENT) continue;
    for (let u = lists[5 * e], end = u + lists[5 * e + 1]; u < end; u++) {
      const i = store[u];
      if (lists[5 * i + 3] >= inPivot) continue; // in L_p already, or no longer a variable
      lists[5 * i + 3] = inPivot;
      store[w++] = i;
      formedWeight += lists[5 * i + 4];
      takeOffOutside(q, i, inPivot);
    }
    state[e] = ABSORBED;
    parent[e] = p;
  }
  for (let t = pStart + pElements; t < pEnd; t++) {
    const i = store[t];
    if (lists[5 * i + 3] >= inPivot) continue;
    lists[5 * i + 3] = inPivot;
    store[w++] = i;
    formedWeight += lists[5 * i + 4];
    takeOffOutside(q, i, inPivot);
  }
  q.pivotWeight = formedWeight;
  q.pivotStart = listStart;
  q.pivotLength = w - listStart;
  q.pivotStamp = inPivot;
  q.storeEnd = w;
  lists[5 * p] = listStart;
  lists[5 * p + 1] = w - listStart;
  lists[5 * p + 2] = 0;
}

/**
 * Step 3 for one new member i of L_p: every element e of E_i loses i's weight from
 * |L_e \ L_p| (the step's stamp beside the value tells it from a stale one). Elements of E_p
 * met here are about to be absorbed; their values are never read.
 */
function takeOffOutside(q: QuotientGraph, i: number, stamp: number): void {
  const { store, lists, state, outside } = q;
  const wi = lists[5 * i + 4];
  for (let u = lists[5 * i], end = u + lists[5 * i + 2]; u < end; u++) {
    const e = store[u];
    if (state[e] !== ELEMENT) continue;
    if (outside[3 * e] !== stamp) {
      outside[3 * e] = stamp;
      outside[3 * e + 1] = outside[3 * e + 2] - wi;
    } else {
      outside[3 * e + 1] -= wi;
    }
  }
}

/**
 * Step 4 for each variable of L_p: rewrite its list in place as p, the elements that remain,
 * the variable neighbours outside L_p; absorb the elements with nothing outside L_p; sum the
 * partial degree |A_i| + Σ |L_e \ L_p|; hash the list (sum of its entries) for step 5. A
 * variable whose list comes out empty (only p's element is left) is eliminated with p.
 * Returns the weight so eliminated.
 *
 * Every member of L_p loses at least one entry (p itself from A_i, or an element absorbed into
 * p from E_i), so p fits. It is written in front without a shift by holding each kept entry
 * back one slot: the write position then never passes the read position.
 */
function updateVariableLists(q: QuotientGraph, p: number): number {
  const { store, lists, state, partialDegree, outside, parent, candidates, candidateHash } = q;
  const inPivot = q.pivotStamp;
  let massWeight = 0;
  let count = 0;
  for (let t = q.pivotStart, end = t + q.pivotLength; t < end; t++) {
    const i = store[t];
    const from = lists[5 * i], to = from + lists[5 * i + 1], elementsEnd = from + lists[5 * i + 2];
    let w = from;
    let held = p;
    let sum = 0;
    let h = 0;
    for (let u = from; u < elementsEnd; u++) {
      const e = store[u];
      if (state[e] !== ELEMENT) continue;
      const ext = outside[3 * e + 1];
      if (ext === 0) {
        // aggressive absorption: L_e ⊆ L_p, so p's element covers e's
        state[e] = ABSORBED;
        parent[e] = p;
        continue;
      }
      store[w++] = held;
      held = e;
      sum += ext;
      h = (h + e) | 0;
    }
    const elementsKept = w - from; // entries written so far = p and all kept elements but the held one
    for (let u = elementsEnd; u < to; u++) {
      const j = store[u];
      if (lists[5 * j + 3] >= inPivot) continue; // reached through p now, or no longer a variable
      store[w++] = held;
      held = j;
      sum += lists[5 * j + 4];
      h = (h + j) | 0;
    }
    const kept = w - from; // kept entries, p not counted
    if (kept === 0) {
      // mass elimination: i is adjacent to p's element only
      state[i] = MERGED;
      lists[5 * i + 3] = GONE;
      joinMembers(q, p, i);
      q.variablesLeft--;
      massWeight += lists[5 * i + 4];
      continue;
    }
    // a list that did not shrink means a mirror entry was missing: the graph was not symmetric
    if (w >= to) throw new Error(`amdOrder: internal error, list of vertex ${i} did not shrink at pivot ${p}`);
    store[w++] = held;
    lists[5 * i + 1] = kept + 1;
    lists[5 * i + 2] = elementsKept + 1;
    partialDegree[i] = sum;
    candidates[count] = i;
    candidateHash[count++] = h;
  }
  q.candidateCount = count;
  return massWeight;
}

/**
 * Step 5: variables of L_p whose lists hold the same elements and variables are
 * indistinguishable (they will be eliminated together). The candidates are sorted by their
 * list hash; within a run of equal hashes, later ones that match merge into the first. Lists
 * are compared by marking one and checking the other's entries; lists have no repeats, so
 * equal lengths and all entries marked mean equal sets.
 */
function mergeIndistinguishable(q: QuotientGraph): void {
  const { candidates, candidateHash } = q;
  const count = q.candidateCount;
  if (count < 2) return;
  sortByHash(candidates, candidateHash, count);
  for (let a = 0; a < count; ) {
    let b = a + 1;
    while (b < count && candidateHash[b] === candidateHash[a]) b++;
    if (b - a > 1) mergeRun(q, a, b);
    a = b;
  }
}

/** Sort ids[0…count) and keys[0…count) together by key (insertion sort for the usual few). */
function sortByHash(ids: Int32Array, keys: Int32Array, count: number): void {
  if (count > 32) {
    const order = Array.from({ length: count }, (_, t) => t).sort((x, y) => keys[x] - keys[y] || x - y);
    const sortedIds = order.map((t) => ids[t]), sortedKeys = order.map((t) => keys[t]);
    ids.set(sortedIds);
    keys.set(sortedKeys);
    return;
  }
  for (let t = 1; t < count; t++) {
    const id = ids[t], key = keys[t];
    let u = t - 1;
    while (u >= 0 && keys[u] > key) {
      ids[u + 1] = ids[u];
      keys[u + 1] = keys[u];
      u--;
    }
    ids[u + 1] = id;
    keys[u + 1] = key;
  }
}

/** Pairwise comparison within candidates[a…b) (equal hashes); merge the equal lists. */
function mergeRun(q: QuotientGraph, a: number, b: number): void {
  const { store, lists, state, listMark, candidates } = q;
  for (let x = a; x < b; x++) {
    const i = candidates[x];
    if (state[i] !== VARIABLE) continue;
    let s = 0;
    for (let y = x + 1; y < b; y++) {
      const j = candidates[y];
      if (state[j] !== VARIABLE || lists[5 * j + 1] !== lists[5 * i + 1] || lists[5 * j + 2] !== lists[5 * i + 2]) continue;
      if (s === 0) {
        s = newStamp(q);
        for (let u = lists[5 * i], uEnd = u + lists[5 * i + 1]; u < uEnd; u++) listMark[store[u]] = s;
      }
      let same = true;
      for (let u = lists[5 * j], uEnd = u + lists[5 * j + 1]; u < uEnd && same; u++) same = listMark[store[u]] === s;
      if (!same) continue;
      lists[5 * i + 4] += lists[5 * j + 4];
      joinMembers(q, i, j);
      state[j] = MERGED;
      lists[5 * j + 3] = GONE;
      q.variablesLeft--;
    }
  }
}

/**
 * Close the step: L_p keeps its surviving supervariables; |L_p| is the weight it was formed
 * with less the mass-eliminated weight (merges keep it); each member gets its new degree bound
 * (step 4's formula) and moves to that bucket if it changed; variables merged or eliminated
 * with p in this step leave theirs.
 */
function finishPivot(q: QuotientGraph, buckets: DegreeBuckets, p: number, massWeight: number): void {
  const { store, state, lists, outside, degree, partialDegree } = q;
  const pivotWeight = q.pivotWeight - massWeight;
  outside[3 * p + 2] = pivotWeight;
  q.weightLeft -= lists[5 * p + 4] + massWeight;
  const left = q.weightLeft;
  const from = q.pivotStart;
  let w = from;
  for (let t = from, end = from + q.pivotLength; t < end; t++) {
    const i = store[t];
    if (state[i] !== VARIABLE) {
      removeFromBucket(buckets, i, degree[i]); // merged or eliminated with p in this step
      continue;
    }
    store[w++] = i;
    const wi = lists[5 * i + 4];
    const external = pivotWeight - wi;
    let d = degree[i] + external;
    const bound = partialDegree[i] + external;
    if (bound < d) d = bound;
    if (left - wi < d) d = left - wi;
    if (d !== degree[i]) {
      removeFromBucket(buckets, i, degree[i]);
      degree[i] = d;
      addToBucket(buckets, i, d);
    }
  }
  q.lists[5 * p + 1] = w - from;
  q.storeEnd = w;
}

/**
 * Elimination order: depth-first postorder of the assembly tree (children before parents,
 * each subtree contiguous, children in ascending vertex order), every pivot followed by the
 * variables merged into it, then the withheld dense vertices. (One loop per function: V8
 * compiles a long function loop by loop and kept deoptimising a single-function version.)
 */
function assemblyPostorder(q: QuotientGraph): Int32Array {
  const n = q.n;
  const childHead = new Int32Array(n).fill(NONE);
  const childNext = new Int32Array(n);
  const perm = new Int32Array(n);
  const stack = new Int32Array(n);
  childLists(q.parent, childHead, childNext);
  let k = 0;
  for (let root = 0; root < n; root++) {
    if (isRootPivot(q, root)) k = emitSubtree(q, root, childHead, childNext, stack, perm, k);
  }
  k = emitDense(q.state, perm, k);
  if (k !== n) throw new Error(`amdOrder: internal error, ordered ${k} of ${n} vertices`);
  return perm;
}

/** Children of each pivot in the assembly tree, in ascending order, as linked lists. */
function childLists(parent: Int32Array, childHead: Int32Array, childNext: Int32Array): void {
  for (let v = parent.length - 1; v >= 0; v--) {
    const up = parent[v];
    if (up === NONE) continue;
    childNext[v] = childHead[up];
    childHead[up] = v;
  }
}

function isRootPivot(q: QuotientGraph, v: number): boolean {
  const s = q.state[v];
  return (s === ELEMENT || s === ABSORBED) && q.parent[v] === NONE;
}

/** Postorder of the subtree of `root` into perm from position k, members after each pivot. */
function emitSubtree(
  q: QuotientGraph,
  root: number,
  childHead: Int32Array,
  childNext: Int32Array,
  stack: Int32Array,
  perm: Int32Array,
  k: number,
): number {
  const memberNext = q.memberNext;
  let top = 0;
  stack[0] = root;
  while (top >= 0) {
    const e = stack[top];
    const child = childHead[e];
    if (child !== NONE) {
      childHead[e] = childNext[child];
      stack[++top] = child;
      continue;
    }
    top--;
    for (let m = e; m !== NONE; m = memberNext[m]) perm[k++] = m;
  }
  return k;
}

function emitDense(state: Uint8Array, perm: Int32Array, k: number): number {
  for (let v = 0; v < state.length; v++) if (state[v] === DENSE) perm[k++] = v;
  return k;
}
