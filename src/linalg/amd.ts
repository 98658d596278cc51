/**
 * Approximate minimum degree ordering.
 *
 * Amestoy, Davis & Duff, "An approximate minimum degree ordering algorithm",
 * SIAM J. Matrix Anal. Appl. 17(4):886–905, 1996. Layout of the quotient graph in one
 * integer array with elbow room and in-place garbage collection as in Davis, "Direct
 * Methods for Sparse Linear Systems", SIAM 2006, §7.1.
 *
 * What makes it AMD and not plain minimum degree:
 * - quotient graph: eliminated pivots become *elements* (cliques stored by their variable
 *   list), so storage never grows beyond nnz(A) + elbow room;
 * - element absorption: an element whose variables all lie in the new element is absorbed
 *   (and aggressive absorption when |Le \ Lk| = 0 for an element adjacent to a variable);
 * - approximate external degrees d̄_i = |A_i \ i| + |L_k \ i| + Σ_e |L_e \ L_k| (eq. 4 of the paper),
 *   an upper bound computed from one pass over the elements adjacent to L_k;
 * - mass elimination: a variable whose approximate degree becomes 0 is eliminated with k;
 * - supervariables: variables with identical adjacency (found by hashing) are merged, their
 *   weight nv carried by the principal variable.
 *
 * Input is a graph of `n` vertices with weights (number of matrix rows each vertex stands
 * for; 1 for a plain matrix) given as a symmetric adjacency without self loops.
 * Output: perm[k] = vertex eliminated k-th (a postorder of the assembly tree).
 */
export function amdOrder(
  n: number,
  adjPtr: Int32Array,
  adjIdx: Int32Array,
  weight?: Int32Array,
): Int32Array {
  const perm = new Int32Array(n);
  if (n === 0) return perm;
  const g = new QuotientGraph(n, adjPtr, adjIdx, weight);
  // each pivot's steps are methods called once per pivot, not one long loop body: V8 then
  // optimises them as ordinary hot functions early in the first large run, where a single
  // function with many loops was compiled loop by loop (on-stack replacement) and fell back
  // to the interpreter each time a loop exited or a branch ran for the first time
  while (g.nel < g.N) {
    const k = g.selectPivot();
    const elenk = g.elen[k];
    if (elenk > 0 && g.cnz + g.mindeg >= g.nzmax) g.collectGarbage();
    const pk1 = g.buildElement(k, elenk);
    const pk2 = g.len[k] + pk1;
    g.externalDegrees(pk1, pk2);
    g.updateDegrees(k, pk1, pk2);
    g.findSupervariables(pk1, pk2);
    g.finishElement(k, elenk, pk1, pk2);
  }
  return g.postorder(perm);
}

/**
 * The quotient graph of the elimination and the degree lists (Amestoy, Davis & Duff 1996;
 * layout of Davis 2006, §7.1). All storage is flat Int32Arrays sized once; no allocation
 * happens while pivots are eliminated.
 */
class QuotientGraph {
  readonly n: number;
  readonly N: number;
  readonly nzmax: number;
  /** quotient graph storage (element lists and variable lists) with elbow room */
  readonly iw: Int32Array;
  /** start of each list in iw, or -parent - 2 once absorbed ("flipped", -1 stays free for "none") */
  readonly pe: Int32Array;
  readonly len: Int32Array;
  readonly nv: Int32Array;
  readonly next: Int32Array;
  readonly last: Int32Array;
  readonly head: Int32Array;
  readonly hhead: Int32Array;
  readonly elen: Int32Array;
  readonly degree: Int32Array;
  readonly w: Int32Array;
  cnz: number;
  mark: number;
  nel = 0;
  mindeg = 0;
  lemax = 0;
  /** weight of the current pivot's element and its degree, carried between the steps */
  nvk = 0;
  dk = 0;

  constructor(n: number, adjPtr: Int32Array, adjIdx: Int32Array, weight: Int32Array | undefined) {
    this.n = n;
    const nnzAdj = adjPtr[n];
    let totalWeight = 0;
    for (let i = 0; i < n; i++) totalWeight += weight ? weight[i] : 1;
    const N = totalWeight;
    this.N = N;
    // rows denser than this are set aside and ordered last (they would dominate every list)
    const dense = Math.min(n - 2, Math.max(16, 10 * Math.sqrt(n)));
    const elbow = nnzAdj + Math.floor(nnzAdj / 5) + 2 * n;
    this.nzmax = elbow;
    const iw = (this.iw = new Int32Array(elbow));
    const pe = (this.pe = new Int32Array(n + 1));
    iw.set(adjIdx.subarray(0, nnzAdj));
    pe.set(adjPtr.subarray(0, n));
    this.cnz = nnzAdj;
    const len = (this.len = new Int32Array(n + 1));
    const nv = (this.nv = new Int32Array(n + 1));
    const next = (this.next = new Int32Array(n + 1).fill(-1));
    const last = (this.last = new Int32Array(n + 1).fill(-1));
    const head = (this.head = new Int32Array(Math.max(n, N) + 1).fill(-1));
    this.hhead = new Int32Array(n + 1).fill(-1);
    const elen = (this.elen = new Int32Array(n + 1));
    const degree = (this.degree = new Int32Array(n + 1));
    const w = (this.w = new Int32Array(n + 1).fill(1));
    for (let i = 0; i < n; i++) len[i] = adjPtr[i + 1] - adjPtr[i];
    if (weight) nv.set(weight.subarray(0, n));
    else nv.fill(1, 0, n);
    nv[n] = 0;
    for (let i = 0; i < n; i++) {
      let d = 0;
      for (let p = adjPtr[i]; p < adjPtr[i + 1]; p++) d += nv[adjIdx[p]];
      degree[i] = d;
    }
    this.mark = clearMarks(0, 0, w, n);
    elen[n] = -2; // n is a placeholder root for the dense rows
    pe[n] = -1;
    w[n] = 0;
    let nel = 0;
    for (let i = 0; i < n; i++) {
      const d = degree[i];
      if (len[i] === 0) {
        // isolated vertex: eliminate now, ordered early by the postorder
        elen[i] = -2;
        nel += nv[i];
        pe[i] = -1;
        w[i] = 0;
      } else if (len[i] > dense) {
        // dense row: absorbed into the placeholder root, ordered last
        nel += nv[i];
        nv[n] += nv[i];
        nv[i] = 0;
        elen[i] = -1;
        pe[i] = -n - 2;
      } else {
        if (head[d] !== -1) last[head[d]] = i;
        next[i] = head[d];
        head[d] = i;
      }
    }
    this.nel = nel;
  }

  /** Take a variable of minimum approximate degree off its degree list. */
  selectPivot(): number {
    const head = this.head, next = this.next, last = this.last, N = this.N;
    let mindeg = this.mindeg;
    let k = -1;
    for (; mindeg < N && (k = head[mindeg]) === -1; mindeg++);
    this.mindeg = mindeg;
    if (next[k] !== -1) last[next[k]] = -1;
    head[mindeg] = next[k];
    this.nvk = this.nv[k];
    this.nel += this.nvk;
    return k;
  }

  /** Compact iw in place, dropping absorbed lists, when the new element might not fit. */
  collectGarbage(): void {
    const n = this.n, pe = this.pe, iw = this.iw, len = this.len;
    for (let j = 0; j < n; j++) {
      const p = pe[j];
      if (p >= 0) {
        pe[j] = iw[p];
        iw[p] = -j - 2;
      }
    }
    let q = 0;
    for (let p = 0; p < this.cnz; ) {
      const j = -iw[p++] - 2;
      if (j >= 0) {
        iw[q] = pe[j];
        pe[j] = q++;
        for (let t = 0; t < len[j] - 1; t++) iw[q++] = iw[p++];
      }
    }
    this.cnz = q;
  }

  /**
   * Construct the new element Lk = union of k's variables and its elements' variables,
   * absorbing those elements; returns where Lk starts in iw (len[k] holds its length).
   */
  buildElement(k: number, elenk: number): number {
    const iw = this.iw, pe = this.pe, len = this.len, nv = this.nv, next = this.next, last = this.last;
    const head = this.head, degree = this.degree, w = this.w;
    let dk = 0;
    const nvk = this.nvk;
    nv[k] = -nvk; // flag k as part of Lk
    let p = pe[k];
    const pk1 = elenk === 0 ? p : this.cnz; // in place when k has no elements
    let pk2 = pk1;
    const flipK = -k - 2;
    for (let k1 = 1; k1 <= elenk + 1; k1++) {
      let e: number, pj: number, ln: number;
      if (k1 > elenk) {
        e = k;
        pj = p;
        ln = len[k] - elenk;
      } else {
        e = iw[p++];
        pj = pe[e];
        ln = len[e];
      }
      for (let k2 = 1; k2 <= ln; k2++) {
        const i = iw[pj++];
        const nvi = nv[i];
        if (nvi <= 0) continue; // already in Lk or not a principal variable
        dk += nvi;
        nv[i] = -nvi;
        iw[pk2++] = i;
        // remove i from its degree list
        if (next[i] !== -1) last[next[i]] = last[i];
        if (last[i] !== -1) next[last[i]] = next[i];
        else head[degree[i]] = next[i];
      }
      if (e !== k) {
        pe[e] = flipK; // element absorption: e is now inside k
        w[e] = 0;
      }
    }
    if (elenk !== 0) this.cnz = pk2;
    degree[k] = dk;
    pe[k] = pk1;
    len[k] = pk2 - pk1;
    this.elen[k] = -2; // k is now an element
    this.dk = dk;
    return pk1;
  }

  /** |Le \ Lk| for every element e adjacent to a variable of Lk, stored as w[e] - mark. */
  externalDegrees(pk1: number, pk2: number): void {
    const iw = this.iw, pe = this.pe, elen = this.elen, nv = this.nv, w = this.w, degree = this.degree;
    const mark = (this.mark = clearMarks(this.mark, this.lemax, w, this.n));
    for (let pk = pk1; pk < pk2; pk++) {
      const i = iw[pk];
      const eln = elen[i];
      if (eln <= 0) continue;
      const nvi = -nv[i];
      const wnvi = mark - nvi;
      const q2 = pe[i] + eln;
      for (let q = pe[i]; q < q2; q++) {
        const e = iw[q];
        const we = w[e];
        if (we >= mark) w[e] = we - nvi;
        else if (we !== 0) w[e] = degree[e] + wnvi;
      }
    }
  }

  /**
   * Approximate degree of each variable of Lk (eq. 4 of the paper), aggressive absorption,
   * mass elimination, and a hash of each survivor's lists for the supervariable search.
   */
  updateDegrees(k: number, pk1: number, pk2: number): void {
    const iw = this.iw, pe = this.pe, elen = this.elen, len = this.len, nv = this.nv, w = this.w;
    const degree = this.degree, next = this.next, last = this.last, hhead = this.hhead, n = this.n;
    const mark = this.mark;
    const flipK = -k - 2;
    let dk = this.dk, nvk = this.nvk, nel = this.nel;
    for (let pk = pk1; pk < pk2; pk++) {
      const i = iw[pk];
      const p1 = pe[i];
      const p2 = p1 + elen[i] - 1;
      let pn = p1;
      let h = 0;
      let d = 0;
      for (let q = p1; q <= p2; q++) {
        const e = iw[q];
        const we = w[e];
        if (we !== 0) {
          const dext = we - mark;
          if (dext > 0) {
            d += dext;
            iw[pn++] = e;
            h += e;
          } else {
            pe[e] = flipK; // aggressive absorption: Le ⊆ Lk
            w[e] = 0;
          }
        }
      }
      elen[i] = pn - p1 + 1; // elements of i, plus k (inserted below)
      const p3 = pn;
      const p4 = p1 + len[i];
      for (let q = p2 + 1; q < p4; q++) {
        const j = iw[q];
        const nvj = nv[j];
        if (nvj <= 0) continue; // absorbed, or in Lk (covered by element k)
        d += nvj;
        iw[pn++] = j;
        h += j;
      }
      if (d === 0) {
        // mass elimination: i's only neighbours are in Lk, eliminate it with k
        pe[i] = flipK;
        const nvi = -nv[i];
        dk -= nvi;
        nvk += nvi;
        nel += nvi;
        nv[i] = 0;
        elen[i] = -1;
      } else {
        if (d < degree[i]) degree[i] = d;
        // put k first in i's element list
        iw[pn] = iw[p3];
        iw[p3] = iw[p1];
        iw[p1] = k;
        len[i] = pn - p1 + 1;
        h %= n;
        next[i] = hhead[h];
        hhead[h] = i;
        last[i] = h; // last[] doubles as the hash of i until degree lists are rebuilt
      }
    }
    degree[k] = dk;
    this.dk = dk;
    this.nvk = nvk;
    this.nel = nel;
    if (dk > this.lemax) this.lemax = dk;
    this.mark = clearMarks(mark + this.lemax, this.lemax, w, n);
  }

  /** Merge variables of Lk with identical lists (compared within each hash bucket). */
  findSupervariables(pk1: number, pk2: number): void {
    const iw = this.iw, pe = this.pe, elen = this.elen, len = this.len, nv = this.nv, w = this.w;
    const next = this.next, last = this.last, hhead = this.hhead;
    let mark = this.mark;
    for (let pk = pk1; pk < pk2; pk++) {
      let i = iw[pk];
      if (nv[i] >= 0) continue;
      const h = last[i];
      i = hhead[h];
      hhead[h] = -1;
      for (; i !== -1 && next[i] !== -1; i = next[i], mark++) {
        const ln = len[i];
        const eln = elen[i];
        const pi = pe[i];
        for (let q = pi + 1; q < pi + ln; q++) w[iw[q]] = mark;
        let jlast = i;
        for (let j = next[i]; j !== -1; ) {
          let same = len[j] === ln && elen[j] === eln;
          const pj = pe[j];
          for (let q = pj + 1; same && q < pj + ln; q++) {
            if (w[iw[q]] !== mark) same = false;
          }
          if (same) {
            pe[j] = -i - 2; // j merges into supervariable i
            nv[i] += nv[j];
            nv[j] = 0;
            elen[j] = -1;
            j = next[j];
            next[jlast] = j;
          } else {
            jlast = j;
            j = next[j];
          }
        }
      }
    }
    this.mark = mark;
  }

  /** Restore the weights of Lk's variables and put them back on the degree lists. */
  finishElement(k: number, elenk: number, pk1: number, pk2: number): void {
    const iw = this.iw, nv = this.nv, degree = this.degree, head = this.head, next = this.next, last = this.last;
    const N = this.N, nel = this.nel, dk = this.dk;
    let mindeg = this.mindeg;
    let pw = pk1;
    for (let pk = pk1; pk < pk2; pk++) {
      const i = iw[pk];
      const nvi = -nv[i];
      if (nvi <= 0) continue;
      nv[i] = nvi;
      let d = degree[i] + dk - nvi;
      if (d > N - nel - nvi) d = N - nel - nvi;
      if (head[d] !== -1) last[head[d]] = i;
      next[i] = head[d];
      last[i] = -1;
      head[d] = i;
      if (d < mindeg) mindeg = d;
      degree[i] = d;
      iw[pw++] = i;
    }
    this.mindeg = mindeg;
    nv[k] = this.nvk;
    this.len[k] = pw - pk1;
    if (pw === pk1) {
      this.pe[k] = -1; // k is a root of the assembly tree
      this.w[k] = 0;
    }
    if (elenk !== 0) this.cnz = pw;
  }

  /** Postorder of the assembly tree (elements, with absorbed variables hanging below them). */
  postorder(perm: Int32Array): Int32Array {
    const n = this.n, pe = this.pe, nv = this.nv, head = this.head, next = this.next;
    for (let i = 0; i < n; i++) pe[i] = -pe[i] - 2;
    for (let j = 0; j <= n; j++) head[j] = -1;
    for (let j = n; j >= 0; j--) {
      if (nv[j] > 0 || pe[j] === -1) continue; // non-principal variables hang below their representative
      next[j] = head[pe[j]];
      head[pe[j]] = j;
    }
    for (let e = n; e >= 0; e--) {
      if (nv[e] <= 0) continue;
      if (pe[e] !== -1) {
        next[e] = head[pe[e]];
        head[pe[e]] = e;
      }
    }
    const order = new Int32Array(n + 1);
    const stack = new Int32Array(n + 1);
    let k = 0;
    for (let i = 0; i <= n; i++) {
      if (pe[i] === -1) k = depthFirst(i, k, head, next, order, stack);
    }
    // drop the placeholder root n
    let q = 0;
    for (let t = 0; t < k; t++) if (order[t] !== n) perm[q++] = order[t];
    return perm;
  }
}

/** Reset the marker array when the running mark would overflow 32 bits. */
function clearMarks(mark: number, lemax: number, w: Int32Array, n: number): number {
  if (mark < 2 || mark + lemax >= 0x3fffffff) {
    for (let k = 0; k < n; k++) if (w[k] !== 0) w[k] = 1;
    mark = 2;
  }
  return mark;
}

/** Non-recursive depth-first postorder of the tree rooted at j (children lists head/next). */
function depthFirst(
  j: number,
  k: number,
  head: Int32Array,
  next: Int32Array,
  post: Int32Array,
  stack: Int32Array,
): number {
  let top = 0;
  stack[0] = j;
  while (top >= 0) {
    const p = stack[top];
    const i = head[p];
    if (i === -1) {
      top--;
      post[k++] = p;
    } else {
      head[p] = next[i];
      stack[++top] = i;
    }
  }
  return k;
}
