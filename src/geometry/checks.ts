/**
 * Clearance and containment checks between boundary pieces and loops.
 *
 * Contact between two pieces is decided by a branch-and-bound on the distance function
 * f(t) = dist(A(t), B): f is 1-Lipschitz in the arc length of A, so on a parameter interval with
 * end values f0, f1 and arc length at most S, min f ≥ (f0 + f1 − S) / 2. Intervals whose bound
 * clears the tolerance are discarded, the others halved. Lines against lines are decided exactly.
 */
import type { Point } from '../model/types.js';
import type { Curve } from './types.js';
import {
  closestOnCurve,
  curveBBox,
  curveEnd,
  curvePoint,
  curveSpeedBound,
  curveStart,
  type BBox,
} from './curves.js';
import { leftOf, segmentMeetPoint, segmentSegmentDistance, segmentsIntersect } from './predicates.js';

/** A point where two pieces come closer than the clearance, or null. */
export function pieceContact(a: Curve, b: Curve, tol: number): Point | null {
  if (a.kind === 'line' && b.kind === 'line') {
    if (segmentsIntersect(a.from, a.to, b.from, b.to)) return segmentMeetPoint(a.from, a.to, b.from, b.to);
    if (segmentSegmentDistance(a.from, a.to, b.from, b.to) < tol) {
      // nearest of the four end point projections, for the message
      const cand = [a.from, a.to];
      let best = cand[0];
      let bestD = Infinity;
      for (const p of cand) {
        const d = closestOnCurve(b, p).distance;
        if (d < bestD) { bestD = d; best = p; }
      }
      return [best[0], best[1]];
    }
    return null;
  }
  // sample the curved one (when there is a choice) so the closest-point query is on a line or arc
  if (a.kind === 'line' || (a.kind === 'arc' && b.kind === 'ellipse-arc')) [a, b] = [b, a];
  const speed = curveSpeedBound(a);
  const f = (t: number): number => closestOnCurve(b, curvePoint(a, t)).distance;
  // stack of intervals as (t0, t1, f(t0), f(t1)) quadruples
  const n0 = 16;
  const stack: number[] = [];
  let fPrev = f(0);
  if (fPrev < tol) return curvePoint(a, 0);
  for (let k = 1; k <= n0; k++) {
    const t = k / n0;
    const ft = f(t);
    if (ft < tol) return curvePoint(a, t);
    stack.push((k - 1) / n0, t, fPrev, ft);
    fPrev = ft;
  }
  let budget = 20000;
  while (stack.length > 0 && budget-- > 0) {
    const f1 = stack.pop()!;
    const f0 = stack.pop()!;
    const t1 = stack.pop()!;
    const t0 = stack.pop()!;
    const S = speed * (t1 - t0);
    if ((f0 + f1 - S) / 2 >= tol) continue;
    const tm = 0.5 * (t0 + t1);
    if (S < 0.25 * tol) return curvePoint(a, tm);
    const fm = f(tm);
    if (fm < tol) return curvePoint(a, tm);
    stack.push(t0, tm, f0, fm, tm, t1, fm, f1);
  }
  return null;
}

/** Crossing contribution of the directed edge ab to the winding number about p (Sunday 2001). */
function windingStep(a: Point, b: Point, p: Point): number {
  if (a[1] <= p[1]) {
    if (b[1] > p[1] && leftOf(a, b, p) > 0) return 1;
  } else if (b[1] <= p[1] && leftOf(a, b, p) < 0) {
    return -1;
  }
  return 0;
}

/** Is p strictly inside the full circle / ellipse that carries the curve? */
function insideCarrier(c: Curve, p: Point): boolean {
  if (c.kind === 'arc') {
    return Math.hypot(p[0] - c.center[0], p[1] - c.center[1]) < c.radius;
  }
  if (c.kind === 'ellipse-arc') {
    const cr = Math.cos(c.rotation);
    const sr = Math.sin(c.rotation);
    const dx = p[0] - c.center[0];
    const dy = p[1] - c.center[1];
    const u = (cr * dx + sr * dy) / c.a;
    const v = (-sr * dx + cr * dy) / c.b;
    return u * u + v * v < 1;
  }
  return false;
}

/**
 * Winding number of a closed chain of pieces about p, exact for the curved pieces too: each arc
 * is replaced by chords of at most 45°, and where p lies in the circular (or elliptic) segment
 * between a chord and its arc the segment's own ±1 is added back.
 */
export function windingNumber(curves: readonly Curve[], p: Point): number {
  let w = 0;
  for (const c of curves) {
    if (c.kind === 'line') {
      w += windingStep(c.from, c.to, p);
      continue;
    }
    const m = Math.max(1, Math.ceil(Math.abs(c.sweep) / (Math.PI / 4)));
    const mayBeInSegment = insideCarrier(c, p);
    let q0 = curveStart(c);
    for (let k = 1; k <= m; k++) {
      const q1 = k === m ? curveEnd(c) : curvePoint(c, k / m);
      w += windingStep(q0, q1, p);
      if (mayBeInSegment) {
        // the segment lies on the side of the chord away from the centre: right of the chord
        // for a counter-clockwise arc, left for a clockwise one
        const side = leftOf(q0, q1, p);
        if (c.sweep > 0 ? side < 0 : side > 0) w += c.sweep > 0 ? 1 : -1;
      }
      q0 = q1;
    }
  }
  return w;
}

export function unionBox(boxes: readonly BBox[]): BBox {
  const out: BBox = { minX: Infinity, minY: Infinity, maxX: -Infinity, maxY: -Infinity };
  for (const b of boxes) {
    out.minX = Math.min(out.minX, b.minX);
    out.minY = Math.min(out.minY, b.minY);
    out.maxX = Math.max(out.maxX, b.maxX);
    out.maxY = Math.max(out.maxY, b.maxY);
  }
  return out;
}

export function boxesOverlap(a: BBox, b: BBox, pad: number): boolean {
  return !(a.minX > b.maxX + pad || b.minX > a.maxX + pad || a.minY > b.maxY + pad || b.minY > a.maxY + pad);
}

export { curveBBox };
