/**
 * A mutable triangulation on flat half-edge arrays (the delaunator layout, but counter-clockwise):
 * triangle t owns half-edges 3t, 3t+1, 3t+2; half-edge e runs from tri[e] to tri[next(e)] and has
 * its triangle on its LEFT; twin[e] is the opposite half-edge or −1 on the domain boundary. After
 * the exterior triangles are removed every boundary half-edge is a constrained segment, so
 * "constrained" is simply twin === −1, and each carries the boundary piece it approximates and
 * the curve parameters of its two ends.
 *
 * Vertex insertion is the cavity method of Bowyer (1981) and Watson (1981), restricted to the
 * triangles visible from the new point without crossing a segment (the constrained Delaunay
 * cavity, Chew 1989), so a segment is never flipped away. Splitting a segment replaces it by two
 * constrained halves.
 */
import { orient2d, incircle } from 'robust-predicates';

export const NONE = -1;

/*
 * The predicates' floating-point filters (Shewchuk, "Adaptive precision floating-point arithmetic
 * and fast robust geometric predicates", Discrete Comput. Geom. 18 (1997), the first-stage error
 * bounds): a determinant whose magnitude exceeds bound × permanent has the sign of the exact
 * determinant, so the exact routine of `robust-predicates` is called only when it does not. They
 * are small enough to be inlined into the cavity loops: a call to the library for every test
 * passed its six or eight coordinates as heap numbers (about 1 GB of garbage per 300 000
 * insertions, a scavenge every 8 ms). Callers use signs only, so the mesh is the same.
 */
const EPS = Number.EPSILON / 2;
const CCW_BOUND = (3 + 16 * EPS) * EPS;
const ICC_BOUND = (10 + 96 * EPS) * EPS;

/** > 0 when (a, b, c) turn counter-clockwise, < 0 clockwise, 0 collinear (exact sign). */
export function orientCcw(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  const l = (ax - cx) * (by - cy);
  const r = (ay - cy) * (bx - cx);
  const det = l - r;
  if (Math.abs(det) >= CCW_BOUND * Math.abs(l + r)) return det;
  return -orient2d(ax, ay, bx, by, cx, cy);
}

/** > 0 when d lies inside the circle through the counter-clockwise a, b, c (exact sign). */
export function inCircle(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, dx: number, dy: number): number {
  const adx = ax - dx, ady = ay - dy, bdx = bx - dx, bdy = by - dy, cdx = cx - dx, cdy = cy - dy;
  const bc = bdx * cdy, cb = cdx * bdy, ca = cdx * ady, ac = adx * cdy, ab = adx * bdy, ba = bdx * ady;
  const al = adx * adx + ady * ady, bl = bdx * bdx + bdy * bdy, cl = cdx * cdx + cdy * cdy;
  const det = al * (bc - cb) + bl * (ca - ac) + cl * (ab - ba);
  const permanent = (Math.abs(bc) + Math.abs(cb)) * al + (Math.abs(ca) + Math.abs(ac)) * bl + (Math.abs(ab) + Math.abs(ba)) * cl;
  if (Math.abs(det) > ICC_BOUND * permanent) return det;
  return incircle(ax, ay, bx, by, cx, cy, dx, dy);
}

/** −1, 0 or 1 by the sign of d (NaN stays NaN, so every comparison with it stays false) */
function signOf(d: number): number {
  return d > 0 ? 1 : d < 0 ? -1 : d === 0 ? 0 : d;
}

/** a vertex in the interior of no piece / at a junction of two pieces */
export const V_FREE = -1;
export const V_JUNCTION = -2;

export function nextHalf(e: number): number {
  return e % 3 === 2 ? e - 2 : e + 1;
}
export function prevHalf(e: number): number {
  return e % 3 === 0 ? e + 2 : e - 1;
}

/** result codes of insertVertex */
export const INSERT_REJECTED = -1;
export const INSERT_ENCROACHES = -2;

export class TriMesh {
  nV = 0;
  nT = 0;
  xy: Float64Array;
  /** piece whose interior the vertex lies on, V_FREE or V_JUNCTION */
  vPiece: Int32Array;
  /** curve parameter of the vertex on vPiece */
  vT: Float64Array;
  /** 1 = vertex is an input corner sharper than 60° */
  vAcute: Uint8Array;
  tri: Int32Array;
  twin: Int32Array;
  /** per boundary half-edge: piece id and curve parameters at its start and end */
  sPiece: Int32Array;
  sT0: Float64Array;
  sT1: Float64Array;

  // scratch for insertion
  private mark: Int32Array;
  private stamp = 0;
  private vStamp: Int32Array;
  private vNext: Int32Array;
  private cav: Int32Array = new Int32Array(64);
  private bnd: Int32Array = new Int32Array(64);
  private ord: Int32Array = new Int32Array(64);
  private saveU: Int32Array = new Int32Array(64);
  private saveV: Int32Array = new Int32Array(64);
  private saveO: Int32Array = new Int32Array(64);
  private saveP: Int32Array = new Int32Array(64);
  private saveT0: Float64Array = new Float64Array(64);
  private saveT1: Float64Array = new Float64Array(64);
  /** triangles created by the last successful insertion */
  newTris: Int32Array = new Int32Array(64);
  nNew = 0;
  /** boundary half-edges encroached by the point of the last INSERT_ENCROACHES answer */
  encroached: number[] = [];

  constructor(vCap: number, tCap: number) {
    vCap = Math.max(vCap, 16);
    tCap = Math.max(tCap, 16);
    this.xy = new Float64Array(2 * vCap);
    this.vPiece = new Int32Array(vCap);
    this.vT = new Float64Array(vCap);
    this.vAcute = new Uint8Array(vCap);
    this.vStamp = new Int32Array(vCap);
    this.vNext = new Int32Array(vCap);
    this.tri = new Int32Array(3 * tCap);
    this.twin = new Int32Array(3 * tCap);
    this.sPiece = new Int32Array(3 * tCap);
    this.sT0 = new Float64Array(3 * tCap);
    this.sT1 = new Float64Array(3 * tCap);
    this.mark = new Int32Array(tCap);
  }

  addVertex(x: number, y: number, piece: number, t: number): number {
    if (this.nV === this.vPiece.length) this.growV(2 * this.nV);
    const v = this.nV++;
    this.xy[2 * v] = x;
    this.xy[2 * v + 1] = y;
    this.vPiece[v] = piece;
    this.vT[v] = t;
    this.vAcute[v] = 0;
    return v;
  }

  /** drop the last vertex (an insertion that was refused) */
  popVertex(): void {
    this.nV--;
  }

  private growV(cap: number): void {
    const g = <T extends Float64Array | Int32Array | Uint8Array>(a: T, n: number): T => {
      const b = new (a.constructor as new (n: number) => T)(n);
      b.set(a);
      return b;
    };
    this.xy = g(this.xy, 2 * cap);
    this.vPiece = g(this.vPiece, cap);
    this.vT = g(this.vT, cap);
    this.vAcute = g(this.vAcute, cap);
    this.vStamp = g(this.vStamp, cap);
    this.vNext = g(this.vNext, cap);
  }

  ensureTris(n: number): void {
    const cap = this.mark.length;
    if (n <= cap) return;
    let c = cap;
    while (c < n) c *= 2;
    const g = <T extends Float64Array | Int32Array>(a: T, m: number): T => {
      const b = new (a.constructor as new (n: number) => T)(m);
      b.set(a);
      return b;
    };
    this.tri = g(this.tri, 3 * c);
    this.twin = g(this.twin, 3 * c);
    this.sPiece = g(this.sPiece, 3 * c);
    this.sT0 = g(this.sT0, 3 * c);
    this.sT1 = g(this.sT1, 3 * c);
    this.mark = g(this.mark, c);
  }

  // The predicate methods return the sign as a small integer (−1, 0, 1) and take vertices by index where
  // they can: a double passed to or returned from a call that is not inlined is boxed as a heap number,
  // and the cavity loops of insertVertex make some ten such calls per new vertex (200 MB of garbage for
  // a 300 000-vertex mesh when they returned the determinant).

  /** orientation of (a, b, c): 1 counter-clockwise, −1 clockwise, 0 collinear (exact sign) */
  orient(a: number, b: number, c: number): number {
    const xy = this.xy;
    return signOf(orientCcw(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1]));
  }

  orientP(a: number, b: number, px: number, py: number): number {
    const xy = this.xy;
    return signOf(orientCcw(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], px, py));
  }

  /** 1 when (px, py) is strictly inside the circumcircle of triangle t, −1 outside, 0 on it */
  inCircum(t: number, px: number, py: number): number {
    const xy = this.xy;
    const a = this.tri[3 * t];
    const b = this.tri[3 * t + 1];
    const c = this.tri[3 * t + 2];
    return signOf(inCircle(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1], px, py));
  }

  /** inCircum for vertex p */
  inCircumOf(t: number, p: number): number {
    return this.inCircum(t, this.xy[2 * p], this.xy[2 * p + 1]);
  }

  /** true when (px, py) lies strictly inside the diametral circle of half-edge e */
  encroachesEdge(e: number, px: number, py: number): boolean {
    const xy = this.xy;
    const u = this.tri[e];
    const v = this.tri[nextHalf(e)];
    return (xy[2 * u] - px) * (xy[2 * v] - px) + (xy[2 * u + 1] - py) * (xy[2 * v + 1] - py) < 0;
  }

  /**
   * Straight walk from the centroid of `start` toward (qx, qy). Returns the triangle that holds
   * the point (≥ 0), or −(e + 2) when the walk is stopped by the boundary half-edge e, or
   * −1 when the walk failed (degenerate path).
   */
  locate(start: number, qx: number, qy: number): number {
    const tri = this.tri;
    const xy = this.xy;
    let t = start;
    const a0 = tri[3 * t];
    const b0 = tri[3 * t + 1];
    const c0 = tri[3 * t + 2];
    const sx = (xy[2 * a0] + xy[2 * b0] + xy[2 * c0]) / 3;
    const sy = (xy[2 * a0 + 1] + xy[2 * b0 + 1] + xy[2 * c0 + 1]) / 3;
    let entry = -1;
    const maxSteps = this.nT + 8;
    for (let step = 0; step < maxSteps; step++) {
      let exit = -1;
      let anyOut = -1;
      for (let j = 0; j < 3; j++) {
        const e = 3 * t + j;
        if (e === entry) continue;
        const u = tri[e];
        const v = tri[nextHalf(e)];
        if (this.orientP(u, v, qx, qy) < 0) {
          if (anyOut < 0) anyOut = e;
          const ou = orientCcw(sx, sy, qx, qy, xy[2 * u], xy[2 * u + 1]);
          const ov = orientCcw(sx, sy, qx, qy, xy[2 * v], xy[2 * v + 1]);
          if ((ou >= 0 && ov <= 0) || (ou <= 0 && ov >= 0)) {
            exit = e;
            break;
          }
        }
      }
      if (anyOut < 0) return t;
      if (exit < 0) exit = anyOut;
      const o = this.twin[exit];
      if (o < 0) return -(exit + 2);
      t = (o / 3) | 0;
      entry = o;
    }
    return -1;
  }

  private growScratch(n: number): void {
    // the growth is a function of its own: its closure's context would otherwise be allocated on
    // every call, before the test (some ten calls per new vertex: 200 MB of garbage per 300 000)
    if (n > this.cav.length) this.regrowScratch(n);
  }

  private regrowScratch(n: number): void {
    const c = 2 * n;
    const gi = (a: Int32Array) => {
      const b = new Int32Array(c);
      b.set(a);
      return b;
    };
    this.cav = gi(this.cav);
    this.bnd = gi(this.bnd);
    this.ord = gi(this.ord);
    this.saveU = gi(this.saveU);
    this.saveV = gi(this.saveV);
    this.saveO = gi(this.saveO);
    this.saveP = gi(this.saveP);
    this.newTris = gi(this.newTris);
    const f0 = new Float64Array(c);
    f0.set(this.saveT0);
    this.saveT0 = f0;
    const f1 = new Float64Array(c);
    f1.set(this.saveT1);
    this.saveT1 = f1;
  }

  /**
   * Insert the already-added vertex p. `seed` is a triangle whose circumcircle holds p (the
   * triangle containing it, or the triangle of the split segment). `split` is the boundary
   * half-edge that p splits (−1 for a free vertex). With `checkEncroach`, the insertion is
   * abandoned when p lies in the diametral circle of a segment on the cavity boundary; those
   * half-edges are then listed in `encroached`.
   *
   * Returns the number of new triangles (listed in newTris), INSERT_ENCROACHES, or
   * INSERT_REJECTED when no valid star-shaped cavity was found (nothing is changed then).
   */
  insertVertex(p: number, seed: number, split: number, checkEncroach: boolean): number {
    const tri = this.tri;
    const twin = this.twin;
    const xy = this.xy;
    const px = xy[2 * p];
    const py = xy[2 * p + 1];
    // triangles banned from the cavity because p cannot see them past a segment
    let banStamp = 0;
    for (let attempt = 0; attempt < 12; attempt++) {
      const st = ++this.stamp;
      // --- grow the cavity (breadth first, never across a segment)
      let nc = 0;
      this.growScratch(8);
      this.cav[nc++] = seed;
      this.mark[seed] = st;
      for (let i = 0; i < nc; i++) {
        const t = this.cav[i];
        for (let j = 0; j < 3; j++) {
          const o = twin[3 * t + j];
          if (o < 0) continue;
          const ot = (o / 3) | 0;
          const m = this.mark[ot];
          if (m === st || (banStamp !== 0 && m === banStamp)) continue;
          if (this.inCircumOf(ot, p) > 0) {
            this.growScratch(nc + 1);
            this.cav[nc++] = ot;
            this.mark[ot] = st;
          }
        }
      }
      // --- force in neighbours until the cavity is star-shaped from p
      let nb = 0;
      let again = true;
      let banned = -1;
      let guard = 0;
      while (again && guard++ < 64) {
        again = false;
        nb = 0;
        for (let i = 0; i < nc && !again; i++) {
          const t = this.cav[i];
          for (let j = 0; j < 3; j++) {
            const e = 3 * t + j;
            const o = twin[e];
            if (o >= 0 && this.mark[(o / 3) | 0] === st) continue;
            if (e === split) continue;
            if (this.orient(tri[e], tri[nextHalf(e)], p) <= 0) {
              if (o >= 0 && (banStamp === 0 || this.mark[(o / 3) | 0] !== banStamp)) {
                const ot = (o / 3) | 0;
                this.growScratch(nc + 1);
                this.cav[nc++] = ot;
                this.mark[ot] = st;
                again = true;
                break;
              }
              // a segment hides part of this triangle from p: drop the triangle and retry
              if (t !== seed) banned = t;
              else return INSERT_REJECTED;
              break;
            }
            this.growScratch(nb + 1);
            this.bnd[nb++] = e;
          }
          if (banned >= 0) break;
        }
        if (banned >= 0) break;
      }
      if (again) return INSERT_REJECTED;
      if (banned >= 0) {
        // ban it under a stamp of its own, then regrow
        if (banStamp === 0) banStamp = ++this.stamp;
        // re-mark previously banned triangles too: they carry the old banStamp only if unchanged
        this.mark[banned] = banStamp;
        continue;
      }
      // --- encroachment check on cavity-boundary segments
      if (checkEncroach) {
        if (this.encroached.length > 0) this.encroached.length = 0;
        for (let i = 0; i < nb; i++) {
          const e = this.bnd[i];
          if (twin[e] < 0 && this.encroachesEdge(e, px, py)) this.encroached.push(e);
        }
        if (this.encroached.length > 0) return INSERT_ENCROACHES;
      }
      // --- topology: the cavity must be a disk without interior vertices
      const k = nb + (split >= 0 ? 1 : 0);
      if (nc !== k - 2) return INSERT_REJECTED;
      const vs = st;
      for (let i = 0; i < nb; i++) {
        const u = tri[this.bnd[i]];
        if (this.vStamp[u] === vs) return INSERT_REJECTED;
        this.vStamp[u] = vs;
        this.vNext[u] = i;
      }
      let startV: number;
      let endV: number;
      let sPiece = 0;
      let sT0 = 0;
      let sT1 = 0;
      if (split >= 0) {
        startV = tri[nextHalf(split)];
        endV = tri[split];
        sPiece = this.sPiece[split];
        sT0 = this.sT0[split];
        sT1 = this.sT1[split];
      } else {
        startV = tri[this.bnd[0]];
        endV = startV;
      }
      let v = startV;
      for (let i = 0; i < nb; i++) {
        if (this.vStamp[v] !== vs) return INSERT_REJECTED;
        const bi = this.vNext[v];
        this.ord[i] = this.bnd[bi];
        this.vStamp[v] = 0;
        v = tri[nextHalf(this.bnd[bi])];
      }
      if (v !== endV) return INSERT_REJECTED;
      // --- save the boundary before overwriting the cavity's slots
      for (let i = 0; i < nb; i++) {
        const e = this.ord[i];
        this.saveU[i] = tri[e];
        this.saveV[i] = tri[nextHalf(e)];
        const o = twin[e];
        this.saveO[i] = o;
        if (o < 0) {
          this.saveP[i] = this.sPiece[e];
          this.saveT0[i] = this.sT0[e];
          this.saveT1[i] = this.sT1[e];
        }
      }
      const nNew = nb;
      this.ensureTris(this.nT + nNew - nc);
      const T = this.newTris;
      for (let i = 0; i < nNew; i++) T[i] = i < nc ? this.cav[i] : this.nT++;
      const tri2 = this.tri;
      const twin2 = this.twin;
      for (let i = 0; i < nNew; i++) {
        const h0 = 3 * T[i];
        tri2[h0] = this.saveU[i];
        tri2[h0 + 1] = this.saveV[i];
        tri2[h0 + 2] = p;
        const o = this.saveO[i];
        twin2[h0] = o;
        if (o >= 0) twin2[o] = h0;
        else {
          this.sPiece[h0] = this.saveP[i];
          this.sT0[h0] = this.saveT0[i];
          this.sT1[h0] = this.saveT1[i];
        }
      }
      const closed = split < 0;
      for (let i = 0; i < nNew; i++) {
        const h1 = 3 * T[i] + 1;
        if (i + 1 < nNew || closed) {
          const h2 = 3 * T[(i + 1) % nNew] + 2;
          twin2[h1] = h2;
          twin2[h2] = h1;
        }
      }
      if (!closed) {
        const tm = this.vT[p];
        // p → b in the first fan triangle, a → p in the last
        const hb = 3 * T[0] + 2;
        twin2[hb] = NONE;
        this.sPiece[hb] = sPiece;
        this.sT0[hb] = tm;
        this.sT1[hb] = sT1;
        const ha = 3 * T[nNew - 1] + 1;
        twin2[ha] = NONE;
        this.sPiece[ha] = sPiece;
        this.sT0[ha] = sT0;
        this.sT1[ha] = tm;
      }
      this.nNew = nNew;
      return nNew;
    }
    return INSERT_REJECTED;
  }
}
