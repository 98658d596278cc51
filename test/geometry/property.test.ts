import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { GeometryError } from '../../src/errors.js';
import { CLEARANCE_RELATIVE, buildGeometry, closestOnCurve, curveEnd, curveStart, loopPolyline, loopWinding } from '../../src/geometry/index.js';
import type { Plate } from '../../src/model/types.js';
import { circle, ellipse, plate, poly, rect, rectPoints } from './fixtures.js';

interface Hole { cx: number; cy: number; r: number }

/** Keep the candidate holes that sit inside the plate and clear of each other by `gap`. */
function placeHoles(w: number, h: number, cand: Hole[], gap: number): Hole[] {
  const kept: Hole[] = [];
  for (const c of cand) {
    if (c.cx - c.r < gap || c.cx + c.r > w - gap || c.cy - c.r < gap || c.cy + c.r > h - gap) continue;
    if (kept.some((k) => Math.hypot(k.cx - c.cx, k.cy - c.cy) < k.r + c.r + gap)) continue;
    kept.push(c);
  }
  return kept;
}

describe('property: random plates', () => {
  it('rectangles with non-overlapping circular holes always build, with area w·h − Σπr²', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 1000, noNaN: true }),
        fc.double({ min: 1, max: 1000, noNaN: true }),
        fc.double({ min: -1e4, max: 1e4, noNaN: true }),
        fc.double({ min: -1e4, max: 1e4, noNaN: true }),
        fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0.001, max: 0.4, noNaN: true })), { maxLength: 12 }),
        fc.boolean(),
        (w, h, x0, y0, raw, clockwise) => {
          const m = Math.min(w, h);
          const cand = raw.map(([u, v, s]) => ({ cx: u * w, cy: v * h, r: s * m }));
          // gap of 1e-4 of the smaller side: far above the 1e-8 clearance, still a tight ligament
          const holes = placeHoles(w, h, cand, 1e-4 * m);
          const pts = rectPoints(x0, y0, w, h);
          const p = plate(poly(clockwise ? pts.reverse() : pts), ...holes.map((c) => circle(x0 + c.cx, y0 + c.cy, c.r)));
          const g = buildGeometry(p);
          const exact = w * h - holes.reduce((s, c) => s + Math.PI * c.r * c.r, 0);
          // 1e-12 relative: the bound; the translation by up to 1e4 is taken out by the
          // box-centred Green's sum
          expect(Math.abs(g.area - exact) / exact).toBeLessThan(1e-12);
          expect(g.loops.length).toBe(1 + holes.length);
          expect(g.corners.length).toBe(4);
        },
      ),
      { numRuns: 300, seed: 20261201 },
    );
  });

  it('random polygons with random fillets and holes build or throw GeometryError, never anything else', () => {
    const pt = fc.tuple(fc.integer({ min: 0, max: 20 }), fc.integer({ min: 0, max: 20 }));
    let built = 0;
    fc.assert(
      fc.property(
        fc.array(fc.tuple(pt, fc.oneof(fc.constant(0), fc.constant(0), fc.double({ min: 0, max: 6, noNaN: true }))), { minLength: 0, maxLength: 10 }),
        fc.array(fc.tuple(fc.double({ min: -2, max: 22, noNaN: true }), fc.double({ min: -2, max: 22, noNaN: true }), fc.double({ min: -1, max: 5, noNaN: true })), { maxLength: 3 }),
        (verts, holes) => {
          const rounds: Record<number, number> = {};
          verts.forEach(([, r], i) => (rounds[i] = r));
          const p: Plate = plate(poly(verts.map(([q]) => q), rounds), ...holes.map(([x, y, r]) => circle(x, y, r)));
          let g;
          try {
            g = buildGeometry(p);
          } catch (e) {
            expect(e).toBeInstanceOf(GeometryError);
            return;
          }
          built++;
          expect(g.area).toBeGreaterThan(0);
          // without fillets and holes the area is the polygon's own shoelace area
          if (holes.length === 0 && verts.every(([, r]) => r === 0)) {
            let s = 0;
            for (let i = 0; i < verts.length; i++) {
              const a = verts[i][0];
              const b = verts[(i + 1) % verts.length][0];
              s += a[0] * b[1] - b[0] * a[1];
            }
            expect(Math.abs(g.area - Math.abs(s) / 2)).toBeLessThan(1e-12 * g.area);
          }
          for (const loop of g.loops) {
            for (let k = 0; k < loop.pieces.length; k++) {
              const e = curveEnd(g.pieces[loop.pieces[k]].curve);
              const s = curveStart(g.pieces[loop.pieces[(k + 1) % loop.pieces.length]].curve);
              expect(e[0] === s[0] && e[1] === s[1]).toBe(true);
            }
          }
        },
      ),
      { numRuns: 1500, seed: 7 },
    );
    expect(built).toBeGreaterThan(5); // most random rings cross themselves; some must build
  });
  it('star-shaped polygons with fillets and holes: area = shoelace − Σπr² ∓ Σ r²(tan(|τ|/2) − |τ|/2)', () => {
    let built = 0;
    // [derived] a fillet of radius r at a vertex where the boundary turns by τ cuts off (convex, left
    // turn on a counter-clockwise outline) or fills in (re-entrant) the kite r·(r tan(|τ|/2)) less
    // the sector r²|τ|/2 between the two tangent points
    fc.assert(
      fc.property(
        // distinct spoke angles on a 5° grid: vertices sorted by angle about (10, 10) make a simple polygon
        fc.uniqueArray(fc.tuple(fc.integer({ min: 0, max: 71 }), fc.double({ min: 2, max: 10, noNaN: true }), fc.oneof(fc.constant(0), fc.double({ min: 0, max: 2, noNaN: true }))), { minLength: 3, maxLength: 12, selector: (s) => s[0] }),
        fc.array(fc.tuple(fc.double({ min: -3, max: 3, noNaN: true }), fc.double({ min: -3, max: 3, noNaN: true }), fc.double({ min: 0.05, max: 1.5, noNaN: true })), { maxLength: 4 }),
        fc.boolean(),
        (spokes, holes, clockwise) => {
          const sorted = [...spokes].sort((a, b) => a[0] - b[0]);
          if (clockwise) sorted.reverse();
          const pts: Array<[number, number]> = sorted.map(([k, r]) => [10 + r * Math.cos((k * Math.PI) / 36), 10 + r * Math.sin((k * Math.PI) / 36)]);
          const rounds: Record<number, number> = {};
          sorted.forEach(([, , r], i) => (rounds[i] = r));
          let g;
          try {
            g = buildGeometry(plate(poly(pts, rounds), ...holes.map(([x, y, r]) => circle(10 + x, 10 + y, r))));
          } catch (e) {
            expect(e).toBeInstanceOf(GeometryError);
            return;
          }
          built++;
          const n = pts.length;
          let twice = 0;
          for (let i = 0; i < n; i++) {
            const a = pts[i];
            const b = pts[(i + 1) % n];
            twice += a[0] * b[1] - b[0] * a[1];
          }
          const ccw = twice > 0 ? 1 : -1;
          let expected = Math.abs(twice) / 2 - holes.reduce((acc, [, , r]) => acc + Math.PI * r * r, 0);
          for (let i = 0; i < n; i++) {
            const r = rounds[i];
            if (r === 0) continue;
            const p0 = pts[(i + n - 1) % n];
            const p1 = pts[i];
            const p2 = pts[(i + 1) % n];
            const ux = p1[0] - p0[0], uy = p1[1] - p0[1], vx = p2[0] - p1[0], vy = p2[1] - p1[1];
            const tau = ccw * Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy); // turn on CCW travel
            const a = Math.abs(tau);
            expected -= Math.sign(tau) * r * r * (Math.tan(a / 2) - a / 2);
          }
          expect(Math.abs(g.area - expected)).toBeLessThan(1e-10 * Math.abs(twice));
        },
      ),
      { numRuns: 1000, seed: 99 },
    );
    expect(built).toBeGreaterThan(200); // the check above must have run on plenty of plates
  });
});

describe('property: mixed openings, decisions checked independently', () => {
  it('built plates have openings inside the outline and outside each other; "overlaps or touches" is true', () => {
    const W = 100;
    const H = 60;
    const shape = fc.oneof(
      fc.record({ kind: fc.constant('circle' as const), x: fc.double({ min: 10, max: W - 10, noNaN: true }), y: fc.double({ min: 10, max: H - 10, noNaN: true }), r: fc.double({ min: 0.5, max: 10, noNaN: true }) }),
      fc.record({ kind: fc.constant('ellipse' as const), x: fc.double({ min: 10, max: W - 10, noNaN: true }), y: fc.double({ min: 10, max: H - 10, noNaN: true }), a: fc.double({ min: 1, max: 12, noNaN: true }), b: fc.double({ min: 0.3, max: 8, noNaN: true }), ang: fc.double({ min: -180, max: 180, noNaN: true }) }),
      fc.record({ kind: fc.constant('rect' as const), x: fc.double({ min: 10, max: W - 10, noNaN: true }), y: fc.double({ min: 10, max: H - 10, noNaN: true }), w: fc.double({ min: 1, max: 18, noNaN: true }), h: fc.double({ min: 1, max: 18, noNaN: true }), u: fc.double({ min: 0, max: 1, noNaN: true }) }),
    );
    let built = 0;
    let overlapsChecked = 0;
    fc.assert(
      fc.property(fc.array(shape, { minLength: 1, maxLength: 4 }), (specs) => {
        const shapes = specs.map((s) =>
          s.kind === 'circle' ? circle(s.x, s.y, s.r)
          : s.kind === 'ellipse' ? ellipse(s.x, s.y, s.a, s.b, s.ang)
          : rect(s.x, s.y, s.w, s.h, s.u * 0.5 * Math.min(s.w, s.h)),
        );
        const p = plate(poly(rectPoints(0, 0, W, H)), ...shapes);
        const maxChord = 0.05;
        let g;
        try {
          g = buildGeometry(p);
        } catch (e) {
          expect(e).toBeInstanceOf(GeometryError);
          const m = /opening (h\d+) overlaps or touches opening (h\d+)/.exec((e as Error).message);
          if (m) {
            // the named pair must truly come within the clearance: the sampled distance of A's
            // boundary to B's pieces exceeds the true one by at most half the sample spacing
            const ia = Number(m[1].slice(1));
            const ib = Number(m[2].slice(1));
            const ga = buildGeometry(plate(poly(rectPoints(-1e3, -1e3, 3e3, 3e3)), shapes[ia]));
            const gb = buildGeometry(plate(poly(rectPoints(-1e3, -1e3, 3e3, 3e3)), shapes[ib]));
            const bPieces = gb.pieces.filter((q) => q.loop === 'h0');
            let dMin = Infinity;
            for (const q of loopPolyline(ga, 'h0', maxChord)) {
              for (const piece of bPieces) dMin = Math.min(dMin, closestOnCurve(piece.curve, q).distance);
            }
            const tol = CLEARANCE_RELATIVE * Math.hypot(W, H);
            expect(dMin).toBeLessThanOrEqual(tol + maxChord / 2 + 1e-12);
            overlapsChecked++;
          }
          return;
        }
        built++;
        // every boundary point of each opening is inside the outline and outside every other opening
        // (exact winding numbers, so this can only fail if the checks let a bad plate through)
        for (const loop of g.loops.filter((l) => l.hole)) {
          for (const q of loopPolyline(g, loop.id, 1)) {
            expect(loopWinding(g, 'outline', q)).toBe(1);
            for (const other of g.loops) {
              if (other.hole && other.id !== loop.id) expect(loopWinding(g, other.id, q)).toBe(0);
            }
          }
        }
        const exact = W * H - specs.reduce((acc, s) => acc + (s.kind === 'circle' ? Math.PI * s.r ** 2 : s.kind === 'ellipse' ? Math.PI * s.a * s.b : s.w * s.h - (4 - Math.PI) * (s.u * 0.5 * Math.min(s.w, s.h)) ** 2), 0);
        expect(Math.abs(g.area - exact)).toBeLessThan(1e-12 * W * H);
      }),
      { numRuns: 400, seed: 4242 },
    );
    expect(built).toBeGreaterThan(150);
    expect(overlapsChecked).toBeGreaterThan(20);
  });
});
