/**
 * Exact segment predicates on top of Shewchuk's adaptive orientation test ("Adaptive precision
 * floating-point arithmetic and fast robust geometric predicates", Discrete & Computational
 * Geometry 18, 1997) as ported by `robust-predicates`, and a sweep-and-prune broad phase.
 */
import { orient2d } from 'robust-predicates';
import type { Point } from '../model/types.js';
import type { BBox } from './curves.js';

/**
 * > 0 when c lies to the LEFT of the directed line a → b, < 0 to the right, 0 on it (exactly).
 * `robust-predicates` returns the opposite sign convention, hence the minus.
 */
export function leftOf(a: Point, b: Point, c: Point): number {
  return -orient2d(a[0], a[1], b[0], b[1], c[0], c[1]);
}

function onSegmentCollinear(a: Point, b: Point, c: Point): boolean {
  // c is known collinear with a, b: is it within the closed segment's box?
  return (
    Math.min(a[0], b[0]) <= c[0] && c[0] <= Math.max(a[0], b[0]) &&
    Math.min(a[1], b[1]) <= c[1] && c[1] <= Math.max(a[1], b[1])
  );
}

/** Do the closed segments ab and cd share at least one point? Exact. */
export function segmentsIntersect(a: Point, b: Point, c: Point, d: Point): boolean {
  const o1 = Math.sign(leftOf(a, b, c));
  const o2 = Math.sign(leftOf(a, b, d));
  const o3 = Math.sign(leftOf(c, d, a));
  const o4 = Math.sign(leftOf(c, d, b));
  if (o1 * o2 < 0 && o3 * o4 < 0) return true;
  if (o1 === 0 && onSegmentCollinear(a, b, c)) return true;
  if (o2 === 0 && onSegmentCollinear(a, b, d)) return true;
  if (o3 === 0 && onSegmentCollinear(c, d, a)) return true;
  if (o4 === 0 && onSegmentCollinear(c, d, b)) return true;
  return false;
}

/** A representative common point of two intersecting segments (for messages). */
export function segmentMeetPoint(a: Point, b: Point, c: Point, d: Point): Point {
  const rx = b[0] - a[0];
  const ry = b[1] - a[1];
  const sx = d[0] - c[0];
  const sy = d[1] - c[1];
  const den = rx * sy - ry * sx;
  if (den !== 0) {
    const t = ((c[0] - a[0]) * sy - (c[1] - a[1]) * sx) / den;
    const tc = t < 0 ? 0 : t > 1 ? 1 : t;
    return [a[0] + tc * rx, a[1] + tc * ry];
  }
  for (const p of [c, d, a, b]) {
    if (p === c || p === d ? onSegmentCollinear(a, b, p) : onSegmentCollinear(c, d, p)) return [p[0], p[1]];
  }
  return [a[0], a[1]];
}

/** Distance from p to the closed segment ab. */
export function pointSegmentDistance(p: Point, a: Point, b: Point): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len2 = dx * dx + dy * dy;
  let t = len2 > 0 ? ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2 : 0;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  return Math.hypot(a[0] + t * dx - p[0], a[1] + t * dy - p[1]);
}

/** Smallest distance between closed segments ab and cd (0 when they meet, decided exactly). */
export function segmentSegmentDistance(a: Point, b: Point, c: Point, d: Point): number {
  if (segmentsIntersect(a, b, c, d)) return 0;
  return Math.min(
    pointSegmentDistance(a, c, d),
    pointSegmentDistance(b, c, d),
    pointSegmentDistance(c, a, b),
    pointSegmentDistance(d, a, b),
  );
}

/**
 * Sweep and prune: calls `visit(i, j)` (i < j) for every pair of boxes that overlap after growing
 * each by `pad`. Sorting by minX makes this O(n log n + pairs) instead of O(n²).
 */
export function forEachOverlappingPair(boxes: readonly BBox[], pad: number, visit: (i: number, j: number) => void): void {
  const order = boxes.map((_, i) => i).sort((i, j) => boxes[i].minX - boxes[j].minX);
  for (let oi = 0; oi < order.length; oi++) {
    const i = order[oi];
    const bi = boxes[i];
    for (let oj = oi + 1; oj < order.length; oj++) {
      const j = order[oj];
      const bj = boxes[j];
      if (bj.minX > bi.maxX + 2 * pad) break;
      if (bj.minY > bi.maxY + 2 * pad || bi.minY > bj.maxY + 2 * pad) continue;
      if (i < j) visit(i, j);
      else visit(j, i);
    }
  }
}
