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
  const nnzAdj = adjPtr[n];
  let totalWeight = 0;
  for (let i = 0; i < n; i++) totalWeight += weight ? weight[i] : 1;
  const N = totalWeight;
  // rows denser than this are set aside and ordered last (they would dominate every list)
  let dense = Math.max(16, 10 * Math.sqrt(n));
  dense = Math.min(n - 2, dense);

  const elbow = nnzAdj + Math.floor(nnzAdj / 5) + 2 * n;
  const iw = new Int32Array(elbow); // quotient graph storage (elements first, then variables)
  // start of each list in iw, or -parent - 2 once absorbed ("flipped", so -1 stays free for
  // "none"); the flip is written out inline: a helper call there deoptimised the function
  // the first time a large graph took a branch the small ones had not
  const pe = new Int32Array(n + 1);
  iw.set(adjIdx.subarray(0, nnzAdj));
  for (let i = 0; i <= n; i++) pe[i] = i < n ? adjPtr[i] : 0;
  let cnz = nnzAdj;
  const nzmax = elbow;

  const len = new Int32Array(n + 1);
  const nv = new Int32Array(n + 1);
  const next = new Int32Array(n + 1);
  const last = new Int32Array(n + 1);
  const head = new Int32Array(Math.max(n, N) + 1);
  const hhead = new Int32Array(n + 1);
  const elen = new Int32Array(n + 1);
  const degree = new Int32Array(n + 1);
  const w = new Int32Array(n + 1);

  for (let i = 0; i < n; i++) len[i] = adjPtr[i + 1] - adjPtr[i];
  len[n] = 0;
  head.fill(-1);
  last.fill(-1);
  next.fill(-1);
  hhead.fill(-1);
  w.fill(1);
  for (let i = 0; i < n; i++) {
    nv[i] = weight ? weight[i] : 1;
  }
  nv[n] = 0;
  weightedDegrees(n, adjPtr, adjIdx, nv, degree);
  let mark = clearMarks(0, 0, w, n);
  elen[n] = -2; // n is a placeholder root for the dense rows
  pe[n] = -1;
  w[n] = 0;
  let nel = 0;
  let mindeg = 0;
  let lemax = 0;

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

  while (nel < N) {
    // --- select a variable of minimum approximate degree
    let k = -1;
    for (; mindeg < N && (k = head[mindeg]) === -1; mindeg++);
    if (next[k] !== -1) last[next[k]] = -1;
    head[mindeg] = next[k];
    const elenk = elen[k];
    let nvk = nv[k];
    nel += nvk;

    // --- garbage collection when the new element might not fit
    if (elenk > 0 && cnz + mindeg >= nzmax) {
      for (let j = 0; j < n; j++) {
        const p = pe[j];
        if (p >= 0) {
          pe[j] = iw[p];
          iw[p] = -j - 2;
        }
      }
      let q = 0;
      for (let p = 0; p < cnz; ) {
        const j = -iw[p++] - 2;
        if (j >= 0) {
          iw[q] = pe[j];
          pe[j] = q++;
          for (let t = 0; t < len[j] - 1; t++) iw[q++] = iw[p++];
        }
      }
      cnz = q;
    }

    // --- construct the new element Lk = union of k's variables and its elements' variables
    let dk = 0;
    nv[k] = -nvk; // flag k as part of Lk
    let p = pe[k];
    const pk1 = elenk === 0 ? p : cnz; // in place when k has no elements
    let pk2 = pk1;
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
        pe[e] = -k - 2; // element absorption: e is now inside k
        w[e] = 0;
      }
    }
    if (elenk !== 0) cnz = pk2;
    degree[k] = dk;
    pe[k] = pk1;
    len[k] = pk2 - pk1;
    elen[k] = -2; // k is now an element

    // --- |Le \ Lk| for every element e adjacent to a variable of Lk (stored as w[e] - mark)
    mark = clearMarks(mark, lemax, w, n);
    for (let pk = pk1; pk < pk2; pk++) {
      const i = iw[pk];
      const eln = elen[i];
      if (eln <= 0) continue;
      const nvi = -nv[i];
      const wnvi = mark - nvi;
      for (let q = pe[i]; q <= pe[i] + eln - 1; q++) {
        const e = iw[q];
        if (w[e] >= mark) w[e] -= nvi;
        else if (w[e] !== 0) w[e] = degree[e] + wnvi;
      }
    }

    // --- approximate degree update of each variable in Lk, and a hash for supervariables
    for (let pk = pk1; pk < pk2; pk++) {
      const i = iw[pk];
      const p1 = pe[i];
      const p2 = p1 + elen[i] - 1;
      let pn = p1;
      let h = 0;
      let d = 0;
      for (let q = p1; q <= p2; q++) {
        const e = iw[q];
        if (w[e] !== 0) {
          const dext = w[e] - mark;
          if (dext > 0) {
            d += dext;
            iw[pn++] = e;
            h += e;
          } else {
            pe[e] = -k - 2; // aggressive absorption: Le ⊆ Lk
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
        pe[i] = -k - 2;
        const nvi = -nv[i];
        dk -= nvi;
        nvk += nvi;
        nel += nvi;
        nv[i] = 0;
        elen[i] = -1;
      } else {
        degree[i] = Math.min(degree[i], d);
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
    lemax = Math.max(lemax, dk);
    mark = clearMarks(mark + lemax, lemax, w, n);

    // --- supervariable detection: compare variables that share a hash bucket
    for (let pk = pk1; pk < pk2; pk++) {
      let i = iw[pk];
      if (nv[i] >= 0) continue;
      const h = last[i];
      i = hhead[h];
      hhead[h] = -1;
      for (; i !== -1 && next[i] !== -1; i = next[i], mark++) {
        const ln = len[i];
        const eln = elen[i];
        for (let q = pe[i] + 1; q <= pe[i] + ln - 1; q++) w[iw[q]] = mark;
        let jlast = i;
        for (let j = next[i]; j !== -1; ) {
          let same = len[j] === ln && elen[j] === eln;
          for (let q = pe[j] + 1; same && q <= pe[j] + ln - 1; q++) {
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

    // --- finalise Lk: restore weights, reinsert its variables in the degree lists
    let pw = pk1;
    for (let pk = pk1; pk < pk2; pk++) {
      const i = iw[pk];
      const nvi = -nv[i];
      if (nvi <= 0) continue;
      nv[i] = nvi;
      let d = degree[i] + dk - nvi;
      d = Math.min(d, N - nel - nvi);
      if (head[d] !== -1) last[head[d]] = i;
      next[i] = head[d];
      last[i] = -1;
      head[d] = i;
      mindeg = Math.min(mindeg, d);
      degree[i] = d;
      iw[pw++] = i;
    }
    nv[k] = nvk;
    len[k] = pw - pk1;
    if (len[k] === 0) {
      pe[k] = -1; // k is a root of the assembly tree
      w[k] = 0;
    }
    if (elenk !== 0) cnz = pw;
  }

  return assemblyTreePostorder(n, pe, nv, head, next, perm);
}


/** Postorder of the assembly tree (elements, with absorbed variables hanging below them). */
function assemblyTreePostorder(
  n: number,
  pe: Int32Array,
  nv: Int32Array,
  head: Int32Array,
  next: Int32Array,
  perm: Int32Array,
): Int32Array {
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

/** degree[i] = Σ weights of i's neighbours. */
function weightedDegrees(n: number, adjPtr: Int32Array, adjIdx: Int32Array, nv: Int32Array, degree: Int32Array): void {
  for (let i = 0; i < n; i++) {
    let d = 0;
    for (let p = adjPtr[i]; p < adjPtr[i + 1]; p++) d += nv[adjIdx[p]];
    degree[i] = d;
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
