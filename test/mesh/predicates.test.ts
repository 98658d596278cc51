/**
 * The mesher's inlined predicate filters (src/mesh/trimesh.ts, Shewchuk 1997 first-stage bounds)
 * must give the sign of the exact predicate on every input, above all on the nearly degenerate
 * ones where floating point alone gets it wrong: points on a line or a circle up to a few ulps.
 * The exact reference is robust-predicates' adaptive routine (orient2d is clockwise-positive).
 */
import { describe, expect, it } from 'vitest';
import { incircle, orient2d } from 'robust-predicates';
import { inCircle, orientCcw } from '../../src/mesh/trimesh.js';

function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), a | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

describe('inlined predicate filters', () => {
  it('orientation: the exact sign on points a few ulps off a line, at several scales', () => {
    const r = rng(7);
    let decidedByFloat = 0;
    for (let k = 0; k < 20000; k++) {
      const s = 10 ** Math.floor(r() * 8 - 3);
      const ax = r() * s, ay = r() * s, bx = r() * s, by = r() * s;
      const t = r();
      // c on the line a–b, nudged by a few ulps
      const cx = ax + t * (bx - ax) + (r() - 0.5) * 8 * Number.EPSILON * s;
      const cy = ay + t * (by - ay) + (r() - 0.5) * 8 * Number.EPSILON * s;
      const ours = Math.sign(orientCcw(ax, ay, bx, by, cx, cy));
      expect(ours).toBe(Math.sign(-orient2d(ax, ay, bx, by, cx, cy)));
      const naive = (ax - cx) * (by - cy) - (ay - cy) * (bx - cx);
      if (Math.sign(naive) === ours) decidedByFloat++;
    }
    // the case set is hard enough that plain floating point gets some signs wrong
    expect(decidedByFloat).toBeLessThan(20000);
  });

  it('in-circle: the exact sign on points a few ulps off the circle through three others', () => {
    const r = rng(11);
    for (let k = 0; k < 20000; k++) {
      const R = 10 ** Math.floor(r() * 6 - 2);
      const cx0 = (r() - 0.5) * 10 * R, cy0 = (r() - 0.5) * 10 * R;
      const ang = [r(), r(), r()].map((u) => u * 2 * Math.PI).sort((p, q) => p - q); // counter-clockwise
      const [a, b, c] = ang.map((t) => [cx0 + R * Math.cos(t), cy0 + R * Math.sin(t)]);
      const t = r() * 2 * Math.PI;
      const f = 1 + (r() - 0.5) * 16 * Number.EPSILON;
      const dx = cx0 + f * R * Math.cos(t), dy = cy0 + f * R * Math.sin(t);
      expect(Math.sign(inCircle(a[0], a[1], b[0], b[1], c[0], c[1], dx, dy))).toBe(Math.sign(incircle(a[0], a[1], b[0], b[1], c[0], c[1], dx, dy)));
    }
  });
});
