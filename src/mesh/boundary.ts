/**
 * Boundary discretisation: every piece is cut at its junctions and at required points lying on
 * it, then subdivided so that each segment is about the local size and, on curves, subtends at
 * most ~0.2 rad (chord deviation ≤ 0.5 % of the radius of curvature).
 */
import type { PlateGeometry } from '../geometry/types.js';
import type { SizeField } from './types.js';
import { curvatureRadius, curveProject, curveSpeed, curveXY, isCurved } from './curves.js';
import { CURVE_SEGMENT_ANGLE } from './sizefield.js';
import { GeometryError, MeshError } from '../errors.js';

/** discretisation uses a little less than the chord-rule angle so later halving keeps it */
const DISCRETE_ANGLE = 0.95 * CURVE_SEGMENT_ANGLE;

export interface BoundaryPoints {
  /** x, y of every boundary point (unique) */
  xy: number[];
  /** piece whose interior the point lies on, −2 for a junction of pieces */
  piece: number[];
  t: number[];
  /** segments: start point, end point, piece, t at start, t at end */
  segA: number[];
  segB: number[];
  segPiece: number[];
  segT0: number[];
  segT1: number[];
  /** required points that lie on no piece (candidate interior vertices) */
  interior: Array<[number, number]>;
  /** indices of boundary points that came from required points */
  requiredOnBoundary: number[];
}

/** cut parameters of one piece: required-point parameters, then size-driven subdivision */
function pieceParams(geom: PlateGeometry, pid: number, cuts: number[], sizeAt: SizeField, hCap: number, origin: readonly [number, number]): number[] {
  const c = geom.pieces[pid].curve;
  // required points closer than the tolerance along the curve are one cut
  const len = Math.max(curveSpeed(c, 0), 1e-300);
  const tGap = (1e-9 * geom.scale) / len;
  const ts = [0];
  for (const t of [...cuts].sort((a, b) => a - b)) if (t - ts[ts.length - 1] > tGap && 1 - t > tGap) ts.push(t);
  ts.push(1);
  const out: number[] = [0];
  const p = [0, 0];
  const curved = isCurved(c);
  const localH = (t: number): number => {
    curveXY(c, t, p);
    let h = sizeAt(p[0], p[1]);
    if (!(h > 0) || !Number.isFinite(h)) {
      throw new MeshError(`size field gave ${h} at (${p[0] + origin[0]}, ${p[1] + origin[1]}); sizes must be positive numbers`, 'mesh.size');
    }
    if (h > hCap) h = hCap;
    if (curved) {
      const hr = DISCRETE_ANGLE * curvatureRadius(c, t);
      if (hr < h) h = hr;
    }
    return h;
  };
  for (let k = 0; k + 1 < ts.length; k++) {
    const t0 = ts[k];
    const t1 = ts[k + 1];
    // march with steps of a quarter of the local size, accumulating cost = ∫ ds / h
    const tt: number[] = [t0];
    const cost: number[] = [0];
    let t = t0;
    let acc = 0;
    let guard = 0;
    while (t < t1 && guard++ < 2_000_000) {
      const h = localH(t);
      const sp = Math.max(curveSpeed(c, t), 1e-300);
      let dt = (0.25 * h) / sp;
      if (t + dt > t1) dt = t1 - t;
      // midpoint rule on the size for accuracy
      const hm = localH(t + 0.5 * dt);
      acc += (dt * sp) / hm;
      t += dt;
      tt.push(t);
      cost.push(acc);
    }
    if (guard >= 2_000_000) throw new MeshError(`size far too small along ${geom.pieces[pid].keyPath}: more than 500 000 segments`, 'mesh.size');
    const n = Math.max(1, curved ? Math.ceil(acc - 1e-6) : Math.round(acc));
    let j = 0;
    for (let i = 1; i < n; i++) {
      const target = (acc * i) / n;
      while (j + 1 < cost.length && cost[j + 1] < target) j++;
      const f = (target - cost[j]) / Math.max(cost[j + 1] - cost[j], 1e-300);
      out.push(tt[j] + f * (tt[j + 1] - tt[j]));
    }
    out.push(t1);
  }
  return out;
}

export function discretiseBoundary(
  geom: PlateGeometry,
  sizeAt: SizeField,
  required: ReadonlyArray<readonly [number, number]>,
  tol: number,
  /** added to coordinates in messages (the geometry is about this point, see PlateGeometry.local) */
  origin: readonly [number, number] = [0, 0],
): BoundaryPoints {
  const np = geom.pieces.length;
  const cuts: number[][] = Array.from({ length: np }, () => []);
  const interior: Array<[number, number]> = [];
  const reqPiece: Array<{ piece: number; t: number; x: number; y: number }> = [];
  const diag = geom.scale;
  for (const [x, y] of required) {
    let best = { piece: -1, t: 0, dist: Infinity };
    for (let i = 0; i < np; i++) {
      const r = curveProject(geom.pieces[i].curve, x, y);
      if (r.dist < best.dist) best = { piece: i, t: r.t, dist: r.dist };
    }
    if (best.dist <= tol) {
      const len = curveSpeed(geom.pieces[best.piece].curve, best.t);
      const tTol = len > 0 ? tol / len : 0;
      if (best.t > tTol && best.t < 1 - tTol) {
        cuts[best.piece].push(best.t);
        reqPiece.push({ piece: best.piece, t: best.t, x, y });
      }
      // at a junction: that point is a node already
    } else interior.push([x, y]);
  }
  const hCap = diag; // a segment never longer than the plate
  const out: BoundaryPoints = {
    xy: [], piece: [], t: [], segA: [], segB: [], segPiece: [], segT0: [], segT1: [],
    interior, requiredOnBoundary: [],
  };
  const seen = new Map<string, number>();
  const addPoint = (x: number, y: number, piece: number, t: number, where: string): number => {
    const key = `${x},${y}`;
    if (seen.has(key)) {
      throw new GeometryError(`boundary loops touch at (${x + origin[0]}, ${y + origin[1]}) (${where}); openings must keep clear of each other and of the outline`, where);
    }
    const i = out.piece.length;
    seen.set(key, i);
    out.xy.push(x, y);
    out.piece.push(piece);
    out.t.push(t);
    return i;
  };
  const p = [0, 0];
  for (const loop of geom.loops) {
    const first = out.piece.length;
    let prevPoint = -1;
    loop.pieces.forEach((pid, k) => {
      const piece = geom.pieces[pid];
      const params = pieceParams(geom, pid, cuts[pid], sizeAt, hCap, origin);
      // the junction at t = 0 (shared with the previous piece's end)
      let start: number;
      if (k === 0) {
        curveXY(piece.curve, 0, p);
        start = addPoint(p[0], p[1], -2, 0, piece.keyPath);
      } else start = prevPoint;
      let a = start;
      for (let i = 1; i < params.length; i++) {
        const t = params[i];
        let b: number;
        if (i === params.length - 1) {
          if (k === loop.pieces.length - 1) b = first;
          else {
            const nextPiece = geom.pieces[loop.pieces[k + 1]];
            curveXY(nextPiece.curve, 0, p);
            b = addPoint(p[0], p[1], -2, 0, nextPiece.keyPath);
          }
        } else {
          curveXY(piece.curve, t, p);
          b = addPoint(p[0], p[1], pid, t, piece.keyPath);
        }
        out.segA.push(a);
        out.segB.push(b);
        out.segPiece.push(pid);
        out.segT0.push(params[i - 1]);
        out.segT1.push(t);
        a = b;
      }
      prevPoint = a;
    });
  }
  for (const r of reqPiece) {
    curveXY(geom.pieces[r.piece].curve, r.t, p);
    const idx = seen.get(`${p[0]},${p[1]}`);
    if (idx !== undefined) out.requiredOnBoundary.push(idx);
  }
  return out;
}

/**
 * Pairs of segments that cross or touch (other than at a shared end point), found with a uniform
 * bucket grid. Returns the indices of the segments involved.
 */
export function crossingSegments(b: BoundaryPoints): number[] {
  const ns = b.segA.length;
  const xy = b.xy;
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  let sumLen = 0;
  for (let s = 0; s < ns; s++) {
    const a = b.segA[s];
    const c = b.segB[s];
    minX = Math.min(minX, xy[2 * a], xy[2 * c]);
    maxX = Math.max(maxX, xy[2 * a], xy[2 * c]);
    minY = Math.min(minY, xy[2 * a + 1], xy[2 * c + 1]);
    maxY = Math.max(maxY, xy[2 * a + 1], xy[2 * c + 1]);
    sumLen += Math.hypot(xy[2 * c] - xy[2 * a], xy[2 * c + 1] - xy[2 * a + 1]);
  }
  // cells about two segment lengths wide; the cap is on the cell count, not on each side, so a
  // long thin plate keeps its buckets small
  let cell = Math.max((2 * sumLen) / ns, 1e-300);
  while (Math.ceil((maxX - minX) / cell) * Math.ceil((maxY - minY) / cell) > 1 << 22) cell *= 2;
  const nx = Math.max(1, Math.ceil((maxX - minX) / cell));
  const ny = Math.max(1, Math.ceil((maxY - minY) / cell));
  const cw = (maxX - minX) / nx || 1;
  const ch = (maxY - minY) / ny || 1;
  const buckets = new Map<number, number[]>();
  for (let s = 0; s < ns; s++) {
    const a = b.segA[s];
    const c = b.segB[s];
    const i0 = Math.min(nx - 1, Math.floor((Math.min(xy[2 * a], xy[2 * c]) - minX) / cw));
    const i1 = Math.min(nx - 1, Math.floor((Math.max(xy[2 * a], xy[2 * c]) - minX) / cw));
    const j0 = Math.min(ny - 1, Math.floor((Math.min(xy[2 * a + 1], xy[2 * c + 1]) - minY) / ch));
    const j1 = Math.min(ny - 1, Math.floor((Math.max(xy[2 * a + 1], xy[2 * c + 1]) - minY) / ch));
    for (let i = i0; i <= i1; i++) {
      for (let j = j0; j <= j1; j++) {
        const key = i * ny + j;
        let l = buckets.get(key);
        if (!l) buckets.set(key, (l = []));
        l.push(s);
      }
    }
  }
  const bad = new Set<number>();
  const orient = (ax: number, ay: number, bx: number, by: number, cx: number, cy: number) =>
    (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
  for (const l of buckets.values()) {
    for (let i = 0; i < l.length; i++) {
      for (let j = i + 1; j < l.length; j++) {
        const s = l[i];
        const r = l[j];
        const a1 = b.segA[s], b1 = b.segB[s], a2 = b.segA[r], b2 = b.segB[r];
        const shared = a1 === a2 || a1 === b2 || b1 === a2 || b1 === b2;
        const P = (k: number) => [xy[2 * k], xy[2 * k + 1]] as const;
        const [x1, y1] = P(a1), [x2, y2] = P(b1), [x3, y3] = P(a2), [x4, y4] = P(b2);
        const d1 = orient(x3, y3, x4, y4, x1, y1);
        const d2 = orient(x3, y3, x4, y4, x2, y2);
        const d3 = orient(x1, y1, x2, y2, x3, y3);
        const d4 = orient(x1, y1, x2, y2, x4, y4);
        if (shared) {
          // adjacent segments only conflict when they fold back onto each other
          if (d1 === 0 && d2 === 0 && d3 === 0 && d4 === 0) {
            const common = a1 === a2 || a1 === b2 ? a1 : b1;
            const o1 = common === a1 ? b1 : a1;
            const o2 = common === a2 ? b2 : a2;
            const [cx, cy] = P(common), [ox1, oy1] = P(o1), [ox2, oy2] = P(o2);
            if ((ox1 - cx) * (ox2 - cx) + (oy1 - cy) * (oy2 - cy) > 0) {
              bad.add(s);
              bad.add(r);
            }
          }
          continue;
        }
        if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) {
          bad.add(s);
          bad.add(r);
          continue;
        }
        const on = (d: number, px: number, py: number, qx: number, qy: number, rx: number, ry: number) =>
          d === 0 && Math.min(qx, rx) <= px && px <= Math.max(qx, rx) && Math.min(qy, ry) <= py && py <= Math.max(qy, ry);
        if (on(d1, x1, y1, x3, y3, x4, y4) || on(d2, x2, y2, x3, y3, x4, y4) || on(d3, x3, y3, x1, y1, x2, y2) || on(d4, x4, y4, x1, y1, x2, y2)) {
          bad.add(s);
          bad.add(r);
        }
      }
    }
  }
  return [...bad].sort((x, y) => x - y);
}

/** split the given segments at their curve mid-parameter (in place); false if any is straight */
export function splitSegmentsOnCurve(geom: PlateGeometry, b: BoundaryPoints, segs: number[], lines = false): boolean {
  const p = [0, 0];
  let allCurved = true;
  // process from the highest index so earlier indices stay valid
  for (let k = segs.length - 1; k >= 0; k--) {
    const s = segs[k];
    const pid = b.segPiece[s];
    const c = geom.pieces[pid].curve;
    if (!isCurved(c)) {
      allCurved = false;
      if (!lines) continue;
    }
    const tm = 0.5 * (b.segT0[s] + b.segT1[s]);
    curveXY(c, tm, p);
    const m = b.piece.length;
    b.xy.push(p[0], p[1]);
    b.piece.push(pid);
    b.t.push(tm);
    const end = b.segB[s];
    const t1 = b.segT1[s];
    b.segB[s] = m;
    b.segT1[s] = tm;
    b.segA.splice(s + 1, 0, m);
    b.segB.splice(s + 1, 0, end);
    b.segPiece.splice(s + 1, 0, pid);
    b.segT0.splice(s + 1, 0, tm);
    b.segT1.splice(s + 1, 0, t1);
  }
  return allCurved;
}
