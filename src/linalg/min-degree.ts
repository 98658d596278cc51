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
 *   3. |L_e \ L_p| for every element e next to a variable of L_p, in one pass over their E lists;
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

/**
 * Quotient graph and the working arrays of one ordering. All lists live in `store`: vertex v
 * owns store[start[v] … start[v] + length[v]); a variable's first `elementCount[v]` entries are
 * elements, the rest variables; an element's entries are variables. Entries of vertices that
 * left (merged, absorbed) stay in lists until the list is next rewritten; every scan checks
 * `state`.
 */
interface QuotientGraph {
  readonly n: number;
  store: Int32Array;
  /** first free slot of store */
  storeEnd: number;
  readonly start: Int32Array;
  readonly length: Int32Array;
  readonly elementCount: Int32Array;
  readonly state: Uint8Array;
  /** rows a (super)variable stands for; kept by pivots and merged variables for the record */
  readonly weight: Int32Array;
  /** |L_e|: summed weight of the variables of element e */
  readonly elementWeight: Int32Array;
  /** approximate external degree d̄_i of each variable (weights of its neighbours) */
  readonly degree: Int32Array;
  /** |A_i| + Σ |L_e \ L_p| of the variables of the current L_p (step 4) */
  readonly partialDegree: Int32Array;
  /** |L_e \ L_p| of the elements met in the current step (valid where tag = the step's stamp) */
  readonly outside: Int32Array;
  /** assembly tree: merged variable → the vertex it joined; element → pivot that absorbed it */
  readonly parent: Int32Array;
  /** stamp marks (L_p membership, elements seen, list comparison) */
  readonly tag: Int32Array;
  stamp: number;
  /** supervariable hash table over the variables of L_p (size a power of two) */
  readonly hashHead: Int32Array;
  readonly hashNext: Int32Array;
  readonly hashOf: Int32Array;
  /** summed weight of the variables not yet eliminated (dense ones excluded) */
  weightLeft: number;
  /** where the current pivot's list L_p sits in store, its entry count, and its members' tag */
  pivotStart: number;
  pivotLength: number;
  pivotStamp: number;
}

/** Variables bucketed by approximate degree, doubly linked, for the minimum-degree pick. */
interface DegreeBuckets {
  readonly head: Int32Array;
  readonly next: Int32Array;
  readonly prev: Int32Array;
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
  const q = quotientGraphOf(n, adjPtr, adjIdx, weights, options.symmetricPattern ?? false);
  withholdDense(q);
  mergeInitialTwins(q);
  const buckets = initialDegrees(q);
  while (q.weightLeft > 0) {
    const p = takeMinDegree(q, buckets);
    eliminatePivot(q, buckets, p);
  }
  return assemblyPostorder(q);
}

/** One pivot step (steps 2–5 of the file header), each in its own function. */
function eliminatePivot(q: QuotientGraph, buckets: DegreeBuckets, p: number): void {
  reserveStore(q, pivotListBound(q, p));
  formPivotElement(q, buckets, p);
  measureOutsideParts(q);
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
  const listEntries = symmetricPattern ? nnz : 2 * nnz;
  // elbow room (common practice): element lists are appended; garbage collection reclaims space
  const store = new Int32Array(listEntries + (nnz >> 2) + 2 * n + 16);
  const start = new Int32Array(n);
  const length = new Int32Array(n);
  if (symmetricPattern) {
    store.set(adjIdx.subarray(0, nnz));
    for (let i = 0; i < n; i++) { start[i] = adjPtr[i]; length[i] = adjPtr[i + 1] - adjPtr[i]; }
  } else {
    symmetricLists(n, adjPtr, adjIdx, store, start, length);
  }
  const w = start[n - 1] + length[n - 1];
  const weight = weights ? weights.slice() : new Int32Array(n).fill(1);
  let total = 0;
  for (let i = 0; i < n; i++) total += weight[i];
  if (total > 0x3fffffff) throw new RangeError(`amdOrder: total vertex weight ${total} exceeds 2^30`);
  return {
    n,
    store,
    storeEnd: w,
    start,
    length,
    elementCount: new Int32Array(n),
    state: new Uint8Array(n), // all VARIABLE
    weight,
    elementWeight: new Int32Array(n),
    degree: new Int32Array(n),
    partialDegree: new Int32Array(n),
    outside: new Int32Array(n),
    parent: new Int32Array(n).fill(NONE),
    tag: new Int32Array(n),
    stamp: 0,
    hashHead: new Int32Array(hashSize(n)).fill(NONE),
    hashNext: new Int32Array(n),
    hashOf: new Int32Array(n),
    weightLeft: total,
    pivotStart: 0,
    pivotLength: 0,
    pivotStamp: 0,
  };
}

/** Lists of A + Aᵀ without self loops or repeats: row i of A merged with row i of Aᵀ. */
function symmetricLists(n: number, adjPtr: Int32Array, adjIdx: Int32Array, store: Int32Array, start: Int32Array, length: Int32Array): void {
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
    start[i] = w;
    seen[i] = i;
    for (let p = adjPtr[i]; p < adjPtr[i + 1]; p++) {
      const j = adjIdx[p];
      if (seen[j] !== i) { seen[j] = i; store[w++] = j; }
    }
    for (let p = tPtr[i]; p < tPtr[i + 1]; p++) {
      const j = tIdx[p];
      if (seen[j] !== i) { seen[j] = i; store[w++] = j; }
    }
    length[i] = w - start[i];
  }
}

/** Hash table size: the power of two at or above n (a bucket is then the hash's low bits). */
function hashSize(n: number): number {
  let size = 1;
  while (size < n) size *= 2;
  return size;
}

/** A fresh mark value for `tag` (tags older than it read as unmarked). */
function newStamp(q: QuotientGraph): number {
  if (q.stamp >= 0x3fffffff) {
    q.tag.fill(0);
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
    if (q.length[i] > limit) {
      q.state[i] = DENSE;
      q.weightLeft -= q.weight[i];
    }
  }
}

/**
 * Merge vertices with equal closed neighbourhoods (Adj(i) ∪ {i} = Adj(j) ∪ {j}) before the
 * first pivot: the step-5 test on the input graph. A duplicated vertex then costs nothing and
 * orders as one vertex of the summed weight would.
 */
function mergeInitialTwins(q: QuotientGraph): void {
  const { n, store, start, length, state, weight, parent, tag, hashHead, hashNext } = q;
  const mask = hashHead.length - 1;
  for (let i = n - 1; i >= 0; i--) {
    if (state[i] !== VARIABLE) continue;
    let h = i;
    for (let p = start[i], end = p + length[i]; p < end; p++) h = (h + store[p]) | 0;
    const bucket = h & mask;
    hashNext[i] = hashHead[bucket];
    hashHead[bucket] = i;
  }
  for (let bucket = 0; bucket <= mask; bucket++) {
    let i = hashHead[bucket];
    if (i === NONE) continue;
    hashHead[bucket] = NONE;
    for (; i !== NONE; i = hashNext[i]) {
      if (state[i] !== VARIABLE) continue;
      let marked = false;
      let s = 0;
      for (let j = hashNext[i]; j !== NONE; j = hashNext[j]) {
        if (state[j] !== VARIABLE || length[j] !== length[i]) continue;
        if (!marked) {
          s = newStamp(q);
          tag[i] = s;
          for (let p = start[i], end = p + length[i]; p < end; p++) tag[store[p]] = s;
          marked = true;
        }
        if (tag[j] !== s) continue;
        let same = true;
        for (let p = start[j], end = p + length[j]; p < end && same; p++) same = tag[store[p]] === s;
        if (!same) continue;
        weight[i] += weight[j];
        state[j] = MERGED;
        parent[j] = i;
      }
    }
  }
}

/** Degrees of the input graph (weights of the neighbours) and the degree buckets. */
function initialDegrees(q: QuotientGraph): DegreeBuckets {
  const { n, store, start, length, state, weight, degree } = q;
  const buckets: DegreeBuckets = {
    head: new Int32Array(q.weightLeft + 1).fill(NONE),
    next: new Int32Array(n),
    prev: new Int32Array(n),
    minDegree: q.weightLeft,
  };
  for (let i = 0; i < n; i++) {
    if (state[i] !== VARIABLE) continue;
    let d = 0;
    for (let p = start[i], end = p + length[i]; p < end; p++) {
      const j = store[p];
      if (state[j] === VARIABLE) d += weight[j];
    }
    degree[i] = d;
    addToBucket(buckets, i, d);
  }
  return buckets;
}

function addToBucket(b: DegreeBuckets, i: number, d: number): void {
  const first = b.head[d];
  b.next[i] = first;
  b.prev[i] = NONE;
  if (first !== NONE) b.prev[first] = i;
  b.head[d] = i;
  if (d < b.minDegree) b.minDegree = d;
}

function removeFromBucket(b: DegreeBuckets, i: number, d: number): void {
  const before = b.prev[i], after = b.next[i];
  if (before === NONE) b.head[d] = after;
  else b.next[before] = after;
  if (after !== NONE) b.prev[after] = before;
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
  const { store, start, length, elementCount, state } = q;
  let bound = length[p] - elementCount[p];
  for (let t = start[p], end = t + elementCount[p]; t < end; t++) {
    const e = store[t];
    if (state[e] === ELEMENT) bound += length[e];
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
  const { n, start, length, elementCount, state } = q;
  const old = q.store;
  let live = 0;
  for (let v = 0; v < n; v++) if (state[v] === VARIABLE || state[v] === ELEMENT) live += length[v];
  const capacity = Math.ceil(1.5 * (live + needed)) + n;
  const store = new Int32Array(capacity);
  let w = 0;
  for (let v = 0; v < n; v++) {
    const s = state[v];
    if (s !== VARIABLE && s !== ELEMENT) continue;
    const from = start[v], nElements = s === VARIABLE ? elementCount[v] : 0;
    start[v] = w;
    for (let t = from; t < from + nElements; t++) if (state[old[t]] === ELEMENT) store[w++] = old[t];
    if (s === VARIABLE) elementCount[v] = w - start[v];
    for (let t = from + nElements; t < from + length[v]; t++) if (state[old[t]] === VARIABLE) store[w++] = old[t];
    length[v] = w - start[v];
  }
  q.store = store;
  q.storeEnd = w;
}

/**
 * Step 2: the new element's list L_p at the end of store, built from the elements of E_p
 * (absorbed into p on the way) and the variables of A_p. Its members leave their degree
 * buckets until step 4 has their new degree. Members are tagged with the step's stamp.
 */
function formPivotElement(q: QuotientGraph, buckets: DegreeBuckets, p: number): void {
  const { store, start, length, elementCount, state, weight, degree, parent, tag } = q;
  const inPivot = newStamp(q);
  state[p] = ELEMENT;
  tag[p] = inPivot;
  const listStart = q.storeEnd;
  let w = listStart;
  const pStart = start[p], pElements = elementCount[p], pEnd = pStart + length[p];
  for (let t = pStart; t < pStart + pElements; t++) {
    const e = store[t];
    if (state[e] !== ELEMENT) continue;
    for (let u = start[e], end = u + length[e]; u < end; u++) {
      const i = store[u];
      if (state[i] !== VARIABLE || tag[i] === inPivot) continue;
      tag[i] = inPivot;
      store[w++] = i;
      removeFromBucket(buckets, i, degree[i]);
    }
    state[e] = ABSORBED;
    parent[e] = p;
  }
  for (let t = pStart + pElements; t < pEnd; t++) {
    const i = store[t];
    if (state[i] !== VARIABLE || tag[i] === inPivot) continue;
    tag[i] = inPivot;
    store[w++] = i;
    removeFromBucket(buckets, i, degree[i]);
  }
  q.pivotStart = listStart;
  q.pivotLength = w - listStart;
  q.pivotStamp = inPivot;
  q.storeEnd = w;
  start[p] = listStart;
  length[p] = w - listStart;
  elementCount[p] = 0;
}

/**
 * Step 3: |L_e \ L_p| for every element e adjacent to a variable of L_p. Starting from |L_e|,
 * each variable of L_p met in e's list takes its weight off; elements are tagged with a stamp
 * one above L_p's (variables and elements are different vertices, so the tags do not clash).
 */
function measureOutsideParts(q: QuotientGraph): void {
  const { store, start, elementCount, state, weight, elementWeight, outside, tag } = q;
  const seenHere = newStamp(q);
  for (let t = q.pivotStart, end = t + q.pivotLength; t < end; t++) {
    const i = store[t];
    const wi = weight[i];
    for (let u = start[i], uEnd = u + elementCount[i]; u < uEnd; u++) {
      const e = store[u];
      if (state[e] !== ELEMENT) continue;
      if (tag[e] !== seenHere) {
        tag[e] = seenHere;
        outside[e] = elementWeight[e] - wi;
      } else {
        outside[e] -= wi;
      }
    }
  }
}

/**
 * Step 4 for each variable of L_p: rewrite its list in place as p, the elements that remain,
 * the variable neighbours outside L_p; absorb the elements with nothing outside L_p; sum the
 * partial degree |A_i| + Σ |L_e \ L_p|; hash the list for step 5. A variable whose list comes
 * out empty (only p's element is left) is eliminated with p. Returns the weight so eliminated.
 *
 * Every member of L_p loses at least one entry (p itself from A_i, or an element absorbed into
 * p from E_i), so p fits. It is written in front without a shift by holding each kept entry
 * back one slot: the write position then never passes the read position.
 */
function updateVariableLists(q: QuotientGraph, p: number): number {
  const { store, start, length, elementCount, state, weight, partialDegree, outside, parent, tag, hashHead, hashNext, hashOf } = q;
  const mask = hashHead.length - 1;
  const inPivot = q.pivotStamp;
  let massWeight = 0;
  for (let t = q.pivotStart, end = t + q.pivotLength; t < end; t++) {
    const i = store[t];
    const from = start[i], to = from + length[i], elementsEnd = from + elementCount[i];
    let w = from;
    let held = p;
    let sum = 0;
    let h = 0;
    for (let u = from; u < elementsEnd; u++) {
      const e = store[u];
      if (state[e] !== ELEMENT) continue;
      const ext = outside[e];
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
      if (state[j] !== VARIABLE || tag[j] === inPivot) continue;
      store[w++] = held;
      held = j;
      sum += weight[j];
      h = (h + j) | 0;
    }
    const kept = w - from; // kept entries, p not counted
    if (kept === 0) {
      // mass elimination: i is adjacent to p's element only
      state[i] = MERGED;
      parent[i] = p;
      massWeight += weight[i];
      continue;
    }
    // a list that did not shrink means a mirror entry was missing: the graph was not symmetric
    if (w >= to) throw new Error(`amdOrder: internal error, list of vertex ${i} did not shrink at pivot ${p}`);
    store[w++] = held;
    length[i] = kept + 1;
    elementCount[i] = elementsKept + 1;
    partialDegree[i] = sum;
    const bucket = h & mask;
    hashOf[i] = bucket;
    hashNext[i] = hashHead[bucket];
    hashHead[bucket] = i;
  }
  return massWeight;
}

/**
 * Step 5: variables of L_p whose lists hold the same elements and variables are
 * indistinguishable (they will be eliminated together); the later ones of a hash bucket merge
 * into the first. Lists are compared by tagging one and checking the other's entries; lists
 * have no repeats, so equal lengths and all entries tagged mean equal sets.
 */
function mergeIndistinguishable(q: QuotientGraph): void {
  const { store, start, length, elementCount, state, weight, parent, tag, hashHead, hashNext, hashOf } = q;
  for (let t = q.pivotStart, end = t + q.pivotLength; t < end; t++) {
    const first = store[t];
    if (state[first] !== VARIABLE) continue;
    const bucket = hashOf[first];
    if (hashHead[bucket] === NONE) continue; // bucket already done
    let i = hashHead[bucket];
    hashHead[bucket] = NONE;
    for (; i !== NONE; i = hashNext[i]) {
      if (state[i] !== VARIABLE) continue;
      let s = 0;
      for (let j = hashNext[i]; j !== NONE; j = hashNext[j]) {
        if (state[j] !== VARIABLE || length[j] !== length[i] || elementCount[j] !== elementCount[i]) continue;
        if (s === 0) {
          s = newStamp(q);
          for (let u = start[i], uEnd = u + length[i]; u < uEnd; u++) tag[store[u]] = s;
        }
        let same = true;
        for (let u = start[j], uEnd = u + length[j]; u < uEnd && same; u++) same = tag[store[u]] === s;
        if (!same) continue;
        weight[i] += weight[j];
        state[j] = MERGED;
        parent[j] = i;
      }
    }
  }
}

/**
 * Close the step: L_p keeps its surviving supervariables, |L_p| is summed, each member gets
 * its new degree bound (step 4's formula) and goes back into its bucket.
 */
function finishPivot(q: QuotientGraph, buckets: DegreeBuckets, p: number, massWeight: number): void {
  const { store, state, weight, elementWeight, degree, partialDegree } = q;
  const from = q.pivotStart;
  let w = from;
  let pivotWeight = 0;
  for (let t = from, end = from + q.pivotLength; t < end; t++) {
    const i = store[t];
    if (state[i] !== VARIABLE) continue;
    store[w++] = i;
    pivotWeight += weight[i];
  }
  q.length[p] = w - from;
  q.storeEnd = w;
  elementWeight[p] = pivotWeight;
  q.weightLeft -= weight[p] + massWeight;
  const left = q.weightLeft;
  for (let t = from; t < w; t++) {
    const i = store[t];
    const wi = weight[i];
    const external = pivotWeight - wi;
    let d = degree[i] + external;
    const bound = partialDegree[i] + external;
    if (bound < d) d = bound;
    if (left - wi < d) d = left - wi;
    degree[i] = d;
    addToBucket(buckets, i, d);
  }
}

/**
 * Elimination order: depth-first postorder of the assembly tree (children before parents,
 * each subtree contiguous), every pivot followed by the variables merged into it (directly or
 * through a chain of merges), then the withheld dense vertices.
 */
function assemblyPostorder(q: QuotientGraph): Int32Array {
  const { n, state, parent } = q;
  const isPivot = (v: number) => state[v] === ELEMENT || state[v] === ABSORBED;
  // members: each merged variable hangs on the pivot its chain of merges ends at
  const memberHead = new Int32Array(n).fill(NONE);
  const memberNext = new Int32Array(n);
  const pivotOf = new Int32Array(n).fill(NONE);
  for (let v = 0; v < n; v++) {
    if (state[v] !== MERGED) continue;
    let r = v;
    while (!isPivot(r) && pivotOf[r] === NONE) r = parent[r];
    const pivot = isPivot(r) ? r : pivotOf[r];
    for (let u = v; u !== r; u = parent[u]) pivotOf[u] = pivot; // path compression
    memberNext[v] = memberHead[pivot];
    memberHead[pivot] = v;
  }
  // children of each pivot, in ascending vertex order
  const childHead = new Int32Array(n).fill(NONE);
  const childNext = new Int32Array(n);
  for (let v = n - 1; v >= 0; v--) {
    if (!isPivot(v) || parent[v] === NONE) continue;
    childNext[v] = childHead[parent[v]];
    childHead[parent[v]] = v;
  }
  const perm = new Int32Array(n);
  const stack = new Int32Array(n);
  let k = 0;
  for (let root = 0; root < n; root++) {
    if (!isPivot(root) || parent[root] !== NONE) continue;
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
      perm[k++] = e;
      for (let m = memberHead[e]; m !== NONE; m = memberNext[m]) perm[k++] = m;
    }
  }
  for (let v = 0; v < n; v++) if (state[v] === DENSE) perm[k++] = v;
  if (k !== n) throw new Error(`amdOrder: internal error, ordered ${k} of ${n} vertices`);
  return perm;
}
