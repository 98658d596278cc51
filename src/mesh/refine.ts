/**
 * Delaunay refinement: Ruppert, "A Delaunay refinement algorithm for quality 2-dimensional mesh
 * generation", J. Algorithms 18 (1995), with the practical rules of Shewchuk, "Delaunay
 * refinement algorithms for triangular mesh generation", Comput. Geom. 22 (2002): encroached
 * segments first, then skinny or oversized triangles at their circumcentre — or at the
 * off-centre of Üngör, "Off-centers: a new type of Steiner points for computing size-optimal
 * quality-guaranteed Delaunay triangulations", LATIN 2004, when that is nearer the short edge.
 * A circumcentre that encroaches a segment (or lies beyond one) is not inserted; the segment
 * is split instead.
 *
 * Termination near small input angles: segments leaving a corner sharper than 60° are split on
 * concentric shells (distances from the corner that are powers of two, Shewchuk 2002 §4), and
 * a skinny triangle whose small angle is forced by the input — it touches such a corner, or its
 * shortest edge joins the corner's two pieces — is left alone.
 */
import type { PlateGeometry } from '../geometry/types.js';
import type { SizeField } from './types.js';
import { MeshError } from '../errors.js';
import { curveXY } from './curves.js';
import { INSERT_ENCROACHES, TriMesh, V_FREE, nextHalf, prevHalf } from './trimesh.js';

export interface RefineOptions {
  sizeAt: SizeField;
  minAngleDeg: number;
  maxVertices: number;
  /** a triangle is oversized when its longest edge exceeds sizeFactor · h(centroid) */
  sizeFactor: number;
  /** added to coordinates in messages (the geometry is about this point, see PlateGeometry.local) */
  origin?: readonly [number, number];
}

/** What a triangle needs (`triangleCure`): nothing, a Steiner point, or (≥ 0) a split of boundary half-edge e. */
const KEEP = -1;
const STEINER = -2;

/**
 * Refine `m` in place until no boundary segment is encroached and no triangle is skinny or
 * oversized: encroached segments first (oldest first), then the triangles, newest first.
 */
export function refineMesh(m: TriMesh, geom: PlateGeometry, opts: RefineOptions): void {
  const r = new Refinement(m, geom, opts);
  r.queueInitial();
  r.run();
}

/** The state of one refinement: the mesh, its two work queues, and the quality bounds. */
class Refinement {
  private readonly sizeAt: SizeField;
  private readonly maxVertices: number;
  private readonly sizeFactor: number;
  /** radius–edge bound B = 1 / (2 sin θmin), and B² */
  private readonly B: number;
  private readonly B2: number;
  private readonly tinyLen: number;
  private readonly np: number;
  /** vertices before refinement (boundary and required points), which no mesh.size thins */
  private readonly boundaryVertices: number;
  /** added to coordinates in messages */
  private readonly origin: readonly [number, number];
  /** pieces meeting at a sharp corner → that corner's position */
  private readonly acutePair = new Map<number, readonly [number, number]>();
  private readonly segQ = new IntQueue(1024);
  private readonly triQ: IntStack;
  private readonly pt = [0, 0];
  private readonly sp = [0, 0];

  constructor(private readonly m: TriMesh, private readonly geom: PlateGeometry, opts: RefineOptions) {
    this.sizeAt = opts.sizeAt;
    this.maxVertices = opts.maxVertices;
    this.sizeFactor = opts.sizeFactor;
    const sinMin = Math.sin((opts.minAngleDeg * Math.PI) / 180);
    this.B = 1 / (2 * sinMin);
    this.B2 = this.B * this.B;
    this.tinyLen = 1e-9 * geom.scale;
    this.np = geom.pieces.length;
    this.boundaryVertices = m.nV;
    this.origin = opts.origin ?? [0, 0];
    for (const c of geom.corners) {
      if (c.interiorAngleDeg < 60) {
        this.acutePair.set(c.pieceIn * this.np + c.pieceOut, c.at);
        this.acutePair.set(c.pieceOut * this.np + c.pieceIn, c.at);
      }
    }
    this.triQ = new IntStack(4 * m.nT + 1024);
  }

  /** every encroached boundary edge and every triangle of the initial triangulation */
  queueInitial(): void {
    const m = this.m;
    for (let e = 0; e < 3 * m.nT; e++) if (m.twin[e] < 0 && this.isEncroached(e)) this.segQ.push(e);
    for (let t = 0; t < m.nT; t++) this.triQ.push(t);
  }

  /** the refinement loop: segments before triangles, until both queues are empty */
  run(): void {
    const m = this.m;
    const { segQ, triQ } = this;
    let guard = 0;
    const maxSteps = 40 * this.maxVertices + 1000;
    for (;;) {
      if (guard++ > maxSteps) throw new MeshError('mesh refinement did not finish (step limit); the geometry may have features far below mesh.size', 'mesh.size');
      if (segQ.size > 0) {
        const e = segQ.shift();
        if (e < 3 * m.nT && m.twin[e] < 0 && this.isEncroached(e)) this.splitSegment(e);
        continue;
      }
      if (triQ.size === 0) break;
      const t = triQ.pop();
      const cure = this.triangleCure(t);
      if (cure === KEEP) continue;
      if (cure >= 0) {
        if (this.splitSegment(cure)) triQ.push(t);
        continue;
      }
      this.insertSteinerPoint(t);
    }
  }

  private isEncroached(e: number): boolean {
    const m = this.m;
    const w = m.tri[prevHalf(e)];
    return m.encroachesEdge(e, m.xy[2 * w], m.xy[2 * w + 1]);
  }

  private checkVertexCap(): void {
    const { m, maxVertices, boundaryVertices } = this;
    // the boundary points (the outline's own edges, arcs at the chord rule) and required points:
    // a larger mesh.size does not thin them
    if (m.nV >= maxVertices && boundaryVertices > 0.5 * maxVertices) {
      throw new MeshError(
        `mesh would need more than ${maxVertices} vertices, and the plate boundary alone takes ${boundaryVertices} of them `
          + '(every point of the outline and openings, and arcs at 0.2 rad per segment), which no mesh.size reduces; '
          + 'simplify the outline (fewer points, or arcs instead of many short edges)',
        'plate.outline',
      );
    }
    if (m.nV >= maxVertices) {
      throw new MeshError(
        `mesh would need more than ${maxVertices} vertices (plate of size ${this.geom.scale.toPrecision(4)}, ` +
          `smallest requested size ${this.smallestSize().toPrecision(3)}); increase mesh.size or the local sizes`,
        'mesh.size',
      );
    }
  }

  private smallestSize(): number {
    const m = this.m;
    let h = Infinity;
    for (let v = 0; v < m.nV; v += Math.max(1, (m.nV / 2000) | 0)) h = Math.min(h, this.sizeAt(m.xy[2 * v], m.xy[2 * v + 1]));
    return h;
  }

  /** queue the triangles the last insertion made, and their boundary edges that are now encroached */
  private afterInsert(): void {
    const m = this.m;
    const n = m.nNew;
    for (let i = 0; i < n; i++) {
      const t = m.newTris[i];
      this.triQ.push(t);
      for (let j = 0; j < 3; j++) {
        const e = 3 * t + j;
        if (m.twin[e] < 0 && this.isEncroached(e)) this.segQ.push(e);
      }
    }
  }

  /** split boundary half-edge e on its curve (at a concentric shell next to a sharp corner); false when it cannot be */
  private splitSegment(e: number): boolean {
    const m = this.m;
    if (m.twin[e] >= 0) return false;
    const tri = m.tri;
    const a = tri[e];
    const b = tri[nextHalf(e)];
    const xy = m.xy;
    const ax = xy[2 * a], ay = xy[2 * a + 1], bx = xy[2 * b], by = xy[2 * b + 1];
    const L = Math.hypot(bx - ax, by - ay);
    if (L < this.tinyLen) return false;
    const piece = m.sPiece[e];
    const t0 = m.sT0[e];
    const t1 = m.sT1[e];
    const curve = this.geom.pieces[piece].curve;
    let x: number, y: number, tm: number;
    if (curve.kind === 'line') {
      let f = 0.5;
      const acA = m.vAcute[a] === 1, acB = m.vAcute[b] === 1;
      if (acA !== acB) {
        // concentric shells: split at a power-of-two distance from the sharp corner
        const d = Math.pow(2, Math.round(Math.log2(0.5 * L)));
        f = acA ? d / L : 1 - d / L;
      }
      x = ax + f * (bx - ax);
      y = ay + f * (by - ay);
      tm = t0 + f * (t1 - t0);
    } else {
      tm = 0.5 * (t0 + t1);
      curveXY(curve, tm, this.pt);
      x = this.pt[0];
      y = this.pt[1];
    }
    this.checkVertexCap();
    const p = m.addVertex(x, y, piece, tm);
    const r = m.insertVertex(p, (e / 3) | 0, e, false);
    if (r < 0) {
      m.popVertex();
      return false;
    }
    this.afterInsert();
    return true;
  }

  /**
   * What triangle t needs: KEEP (good enough, or its small angle is forced by the input), STEINER
   * (oversized or skinny), or the boundary half-edge to split instead (a skinny triangle across a
   * sharp corner whose cure is to split a long side segment).
   */
  private triangleCure(t: number): number {
    const m = this.m;
    const tri = m.tri;
    const xy = m.xy;
    const a = tri[3 * t], b = tri[3 * t + 1], c = tri[3 * t + 2];
    const ax = xy[2 * a], ay = xy[2 * a + 1], bx = xy[2 * b], by = xy[2 * b + 1], cx = xy[2 * c], cy = xy[2 * c + 1];
    const la = (bx - cx) ** 2 + (by - cy) ** 2; // opposite a
    const lb = (cx - ax) ** 2 + (cy - ay) ** 2; // opposite b
    const lc = (ax - bx) ** 2 + (ay - by) ** 2; // opposite c
    const lmax = Math.max(la, lb, lc);
    const h = this.sizeFactor * this.sizeAt((ax + bx + cx) / 3, (ay + by + cy) / 3);
    if (lmax > h * h) return STEINER;
    if (!(h > 0)) {
      const [ox, oy] = this.origin;
      throw new MeshError(`size field gave ${h / this.sizeFactor} at (${(ax + bx + cx) / 3 + ox}, ${(ay + by + cy) / 3 + oy}); sizes must be positive numbers`, 'mesh.size');
    }
    const area2 = (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
    const lmin = Math.min(la, lb, lc);
    // R² = la lb lc / (4 area2²) ; skinny when R² > B² lmin²
    if (la * lb * lc <= this.B2 * lmin * 4 * area2 * area2) return KEEP;
    if (lmin < this.tinyLen * this.tinyLen) return KEEP;
    // small angles forced by the input
    if (m.vAcute[a] || m.vAcute[b] || m.vAcute[c]) return KEEP;
    let u: number, w: number;
    if (lmin === la) {
      u = b;
      w = c;
    } else if (lmin === lb) {
      u = c;
      w = a;
    } else {
      u = a;
      w = b;
    }
    // shortest edge across a sharp corner between points on one shell (equidistant from the
    // corner): splitting it would only cascade toward the corner (Shewchuk 2002, §4)
    const pu = m.vPiece[u], pw = m.vPiece[w];
    if (pu >= 0 && pw >= 0 && pu !== pw) {
      const at = this.acutePair.get(pu * this.np + pw);
      if (at) {
        const du = Math.hypot(xy[2 * u] - at[0], xy[2 * u + 1] - at[1]);
        const dw = Math.hypot(xy[2 * w] - at[0], xy[2 * w + 1] - at[1]);
        if (Math.abs(du - dw) <= 0.05 * Math.max(du, dw)) return this.longSideSegment(t, lmin);
      }
    }
    return STEINER;
  }

  /**
   * A skinny triangle on a shell around a sharp corner: a long segment edge from the shell
   * outward along a side is split, so the triangle's far vertex moves in and its angle opens up;
   * KEEP when it has none (the last such edge of the triangle when it has several).
   */
  private longSideSegment(t: number, lmin: number): number {
    const { tri, twin, xy } = this.m;
    let found = KEEP;
    for (let j = 0; j < 3; j++) {
      const e = 3 * t + j;
      if (twin[e] >= 0) continue;
      const p0 = tri[e], p1 = tri[nextHalf(e)];
      const l2 = (xy[2 * p0] - xy[2 * p1]) ** 2 + (xy[2 * p0 + 1] - xy[2 * p1 + 1]) ** 2;
      if (l2 > 4 * lmin) found = e;
    }
    return found;
  }

  /**
   * Insert triangle t's Steiner point, unless it lies beyond a boundary segment or encroaches one:
   * then that segment is split instead (and t queued again when it was).
   */
  private insertSteinerPoint(t: number): void {
    const { m, sp, triQ } = this;
    this.steinerPoint(t, sp);
    const loc = m.locate(t, sp[0], sp[1]);
    if (loc <= -2) {
      if (this.splitSegment(-(loc + 2))) triQ.push(t);
      return;
    }
    if (loc < 0) return;
    this.checkVertexCap();
    const p = m.addVertex(sp[0], sp[1], V_FREE, 0);
    const r = m.insertVertex(p, loc, -1, true);
    if (r === INSERT_ENCROACHES) {
      m.popVertex();
      const enc = m.encroached.slice();
      let any = false;
      for (const e of enc) if (m.twin[e] < 0 && m.encroachesEdge(e, sp[0], sp[1]) && this.splitSegment(e)) any = true;
      if (any) triQ.push(t);
      return;
    }
    if (r < 0) {
      m.popVertex();
      return;
    }
    this.afterInsert();
  }

  /** circumcentre, or Üngör's off-centre when that is nearer the shortest edge */
  private steinerPoint(t: number, out: number[]): void {
    const { tri, xy } = this.m;
    const { B, B2 } = this;
    const a = tri[3 * t], b = tri[3 * t + 1], c = tri[3 * t + 2];
    const ax = xy[2 * a], ay = xy[2 * a + 1];
    const dx = xy[2 * b] - ax, dy = xy[2 * b + 1] - ay;
    const ex = xy[2 * c] - ax, ey = xy[2 * c + 1] - ay;
    const bl = dx * dx + dy * dy;
    const cl = ex * ex + ey * ey;
    const d = 0.5 / (dx * ey - dy * ex);
    const ccx = ax + (ey * bl - dy * cl) * d;
    const ccy = ay + (dx * cl - ex * bl) * d;
    out[0] = ccx;
    out[1] = ccy;
    // shortest edge p→q
    const la = (xy[2 * b] - xy[2 * c]) ** 2 + (xy[2 * b + 1] - xy[2 * c + 1]) ** 2;
    const lmin = Math.min(la, bl, cl);
    let p: number, q: number;
    if (lmin === la) {
      p = b;
      q = c;
    } else if (lmin === cl) {
      p = c;
      q = a;
    } else {
      p = a;
      q = b;
    }
    const mx = 0.5 * (xy[2 * p] + xy[2 * q]);
    const my = 0.5 * (xy[2 * p + 1] + xy[2 * q + 1]);
    const L = Math.sqrt(lmin);
    const dOff = L * (Math.sqrt(Math.max(B2 - 0.25, 0)) + B);
    const dc = Math.hypot(ccx - mx, ccy - my);
    if (dc > dOff && dc > 0) {
      const f = dOff / dc;
      out[0] = mx + f * (ccx - mx);
      out[1] = my + f * (ccy - my);
    }
  }
}

/**
 * LIFO of integer ids that doubles when full: the triangles to check. The newest triangles are
 * checked first, while their vertices, neighbours and marks are still in the processor's cache —
 * the refinement is memory-bound, and taking the triangles first-in first-out visited the mesh in
 * generations spread over all of it (2.2–2.5× the time on a 300 000-vertex plate, docs/mesh.md).
 * Ruppert's guarantees (termination, the angle bound, size grading) hold for any order.
 */
class IntStack {
  private buf: Int32Array;
  size = 0;
  constructor(cap: number) {
    this.buf = new Int32Array(Math.max(16, cap));
  }
  push(v: number): void {
    if (this.size === this.buf.length) {
      const b = new Int32Array(2 * this.buf.length);
      b.set(this.buf);
      this.buf = b;
    }
    this.buf[this.size++] = v;
  }
  pop(): number {
    return this.buf[--this.size];
  }
}

/** FIFO of integer ids on a ring buffer that doubles when full (no per-item allocation) */
class IntQueue {
  private buf: Int32Array;
  private head = 0;
  size = 0;
  constructor(cap: number) {
    this.buf = new Int32Array(Math.max(16, cap));
  }
  push(v: number): void {
    if (this.size === this.buf.length) {
      const b = new Int32Array(2 * this.buf.length);
      for (let i = 0; i < this.size; i++) b[i] = this.buf[(this.head + i) % this.buf.length];
      this.buf = b;
      this.head = 0;
    }
    let k = this.head + this.size;
    if (k >= this.buf.length) k -= this.buf.length;
    this.buf[k] = v;
    this.size++;
  }
  shift(): number {
    const v = this.buf[this.head];
    this.head++;
    if (this.head === this.buf.length) this.head = 0;
    this.size--;
    return v;
  }
}
