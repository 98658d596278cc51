import { describe, it, expect } from 'vitest';
import {
  buildGeometry,
  closestOnCurve,
  curveBBox,
  curveCurvatureRadius,
  curveLength,
  curveLengthBetween,
  curveOutwardNormal,
  curveParamAtLength,
  curvePoint,
  curveTangent,
  loopPolyline,
  pieceAtPoint,
  type Curve,
} from '../../src/geometry/index.js';
import { circle, ellipse, plate, poly, rectPoints } from './fixtures.js';
import { seededRandom as rng } from '../helpers/random.js';


/**
 * Ellipse perimeter by the Gauss–Kummer series P = π(a + b) Σ C(1/2, n)² hⁿ, h = ((a − b)/(a + b))²
 * (the exact series; summed here until the terms vanish).
 */
function ellipsePerimeterSeries(a: number, b: number): number {
  const h = ((a - b) / (a + b)) ** 2;
  let sum = 0;
  let coef = 1; // C(1/2, n)
  let hn = 1;
  for (let n = 0; n < 2000; n++) {
    const term = coef * coef * hn;
    sum += term;
    if (n > 2 && term < 1e-18 * sum) break;
    coef *= (0.5 - n) / (n + 1);
    hn *= h;
  }
  return Math.PI * (a + b) * sum;
}

const ell = (a: number, b: number, rotation: number, startParam = 0, sweep = 2 * Math.PI): Curve => ({
  kind: 'ellipse-arc', center: [3, -2], a, b, rotation, startParam, sweep,
});

describe('curve evaluation', () => {
  it('ellipse length by quadrature matches the Gauss–Kummer series', () => {
    for (const [a, b] of [[2, 1], [40, 12], [10, 1], [100, 1], [5, 5]] as const) {
      const exact = ellipsePerimeterSeries(a, b);
      // full turn, and two half arcs going clockwise (as in an opening)
      expect(Math.abs(curveLength(ell(a, b, 0.3)) / exact - 1)).toBeLessThan(1e-12);
      const halves = curveLength(ell(a, b, 0.3, 0, -Math.PI)) + curveLength(ell(a, b, 0.3, Math.PI, -Math.PI));
      expect(Math.abs(halves / exact - 1)).toBeLessThan(1e-12);
    }
  });

  it('line and arc lengths; partial lengths and the inverse curveParamAtLength', () => {
    expect(curveLength({ kind: 'line', from: [0, 0], to: [3, 4] })).toBe(5);
    expect(curveLength({ kind: 'arc', center: [0, 0], radius: 2, startAngle: 1, sweep: -Math.PI / 2 })).toBeCloseTo(Math.PI, 14);
    const c = ell(40, 12, 0.5, 0.2, -2.5);
    const total = curveLength(c);
    expect(Math.abs(curveLengthBetween(c, 0, 0.3) + curveLengthBetween(c, 0.3, 1) - total)).toBeLessThan(1e-12 * total);
    for (const frac of [0.05, 0.37, 0.5, 0.91]) {
      const t = curveParamAtLength(c, frac * total);
      expect(Math.abs(curveLengthBetween(c, 0, t) - frac * total)).toBeLessThan(1e-11 * total);
    }
  });

  it('tangent is the unit direction of travel (central differences)', () => {
    const curves: Curve[] = [
      { kind: 'line', from: [1, 1], to: [4, -3] },
      { kind: 'arc', center: [0, 0], radius: 3, startAngle: 0.4, sweep: -2 },
      ell(7, 2, 1.1, 0.3, 4),
    ];
    for (const c of curves) {
      for (const t of [0.1, 0.5, 0.9]) {
        const d = 1e-6;
        const p1 = curvePoint(c, t + d);
        const p0 = curvePoint(c, t - d);
        const fd = [p1[0] - p0[0], p1[1] - p0[1]];
        const len = Math.hypot(fd[0], fd[1]);
        const tan = curveTangent(c, t);
        expect(Math.hypot(tan[0] - fd[0] / len, tan[1] - fd[1] / len)).toBeLessThan(1e-8);
        const n = curveOutwardNormal(c, t);
        expect(Math.abs(n[0] * tan[0] + n[1] * tan[1])).toBeLessThan(1e-15);
        expect(n[0] * tan[1] - n[1] * tan[0]).toBeCloseTo(1, 14); // normal on the right of travel
      }
    }
  });

  it('radius of curvature: ellipse b²/a at the major-axis ends, a²/b at the minor-axis ends', () => {
    // standard result for the ellipse x = a cos φ, y = b sin φ: ρ = (a² sin²φ + b² cos²φ)^{3/2} / (ab)
    const c = ell(40, 12, 0.7);
    expect(curveCurvatureRadius(c, 0)).toBeCloseTo((12 * 12) / 40, 12);
    expect(curveCurvatureRadius(c, 0.25)).toBeCloseTo((40 * 40) / 12, 10);
    expect(curveCurvatureRadius({ kind: 'line', from: [0, 0], to: [1, 0] }, 0.5)).toBe(Infinity);
    expect(curveCurvatureRadius({ kind: 'arc', center: [0, 0], radius: 4, startAngle: 0, sweep: 1 }, 0.5)).toBe(4);
  });

  it('closestOnCurve on ellipse arcs agrees with dense sampling', () => {
    const rand = rng(7);
    const curves = [ell(40, 12, 0.5), ell(10, 1, -0.3, 0.4, -2.2), ell(30, 29, 2, 1, 3), ell(100, 1, 0)];
    for (const c of curves) {
      const m = 100000;
      const xs = new Float64Array(m + 1);
      const ys = new Float64Array(m + 1);
      for (let k = 0; k <= m; k++) [xs[k], ys[k]] = curvePoint(c, k / m);
      const L = curveLength(c);
      const spacing = (L / m) * 1.01; // arc between samples, a little slack for uneven speed
      const span = c.kind === 'ellipse-arc' ? 1.5 * c.a : 1;
      for (let q = 0; q < 40; q++) {
        const p: [number, number] = [3 + (2 * rand() - 1) * span, -2 + (2 * rand() - 1) * span];
        let dense = Infinity;
        for (let k = 0; k <= m; k++) dense = Math.min(dense, Math.hypot(xs[k] - p[0], ys[k] - p[1]));
        const got = closestOnCurve(c, p);
        // the true minimum lies in [dense − spacing/2, dense]; ours may not be worse than dense
        expect(got.distance).toBeLessThanOrEqual(dense + 1e-12 * span);
        expect(got.distance).toBeGreaterThanOrEqual(dense - spacing);
        const at = curvePoint(c, got.t);
        expect(Math.hypot(at[0] - got.point[0], at[1] - got.point[1])).toBeLessThan(1e-12 * span);
      }
    }
  });

  it('closestOnCurve on lines and arcs, including points beyond the ends', () => {
    const line: Curve = { kind: 'line', from: [0, 0], to: [10, 0] };
    expect(closestOnCurve(line, [4, 3])).toEqual({ t: 0.4, point: [4, 0], distance: 3 });
    expect(closestOnCurve(line, [-3, 4]).distance).toBe(5);
    const arc: Curve = { kind: 'arc', center: [0, 0], radius: 5, startAngle: 0, sweep: Math.PI / 2 };
    const inRange = closestOnCurve(arc, [3, 3]);
    expect(inRange.t).toBeCloseTo(0.5, 14);
    expect(inRange.distance).toBeCloseTo(5 - Math.hypot(3, 3), 14);
    const beyond = closestOnCurve(arc, [1, -10]); // nearest is the start point (5, 0)
    expect(beyond.t).toBe(0);
    expect(beyond.distance).toBeCloseTo(Math.hypot(4, 10), 13);
    const cw: Curve = { kind: 'arc', center: [0, 0], radius: 5, startAngle: 0, sweep: -Math.PI / 2 };
    expect(closestOnCurve(cw, [0, -7]).t).toBe(1);
  });

  it('bounding boxes of arcs and rotated ellipse arcs are tight', () => {
    const curves: Curve[] = [
      { kind: 'arc', center: [1, 2], radius: 3, startAngle: -0.3, sweep: 2.9 },
      { kind: 'arc', center: [1, 2], radius: 3, startAngle: 2, sweep: -4 },
      ell(40, 12, 0.5, 0.2, 5.5),
      ell(10, 1, 2.2, -1, -3),
    ];
    for (const c of curves) {
      const box = curveBBox(c);
      let minX = Infinity, maxX = -Infinity, minY = Infinity, maxY = -Infinity;
      for (let k = 0; k <= 100000; k++) {
        const [x, y] = curvePoint(c, k / 100000);
        minX = Math.min(minX, x); maxX = Math.max(maxX, x); minY = Math.min(minY, y); maxY = Math.max(maxY, y);
      }
      const size = Math.max(maxX - minX, maxY - minY);
      // dense samples lie inside the box and reach it to within the sampling sag (~(Δφ)²·a/8)
      for (const [got, want, sign] of [[box.minX, minX, -1], [box.maxX, maxX, 1], [box.minY, minY, -1], [box.maxY, maxY, 1]] as const) {
        expect(sign * (got - want)).toBeGreaterThanOrEqual(-1e-12 * size);
        expect(sign * (got - want)).toBeLessThan(1e-7 * size);
      }
    }
  });
});

describe('queries on a built plate', () => {
  const g = buildGeometry(plate(poly(rectPoints(0, 0, 200, 100)), circle(50, 50, 10), ellipse(140, 50, 30, 10, 20)));

  it('pieceAtPoint finds the pieces within tol, nearest first', () => {
    const corner = pieceAtPoint(g, [200, 0], 1e-9);
    expect(corner.map((h) => h.piece.keyPath).sort()).toEqual(['plate.outline[0]', 'plate.outline[1]']);
    const onHole = pieceAtPoint(g, [50, 39.5], 1);
    expect(onHole.length).toBe(1);
    expect(onHole[0].piece.loop).toBe('h0');
    expect(onHole[0].distance).toBeCloseTo(0.5, 12);
    expect(pieceAtPoint(g, [100, 80], 1)).toEqual([]);
  });

  it('loopPolyline keeps every junction and chords within maxChord', () => {
    for (const loop of g.loops) {
      const pts = loopPolyline(g, loop.id, 2);
      for (const id of loop.pieces) {
        const s = curvePoint(g.pieces[id].curve, 0);
        expect(pts.some((p) => p[0] === s[0] && p[1] === s[1])).toBe(true);
      }
      for (let i = 0; i < pts.length; i++) {
        const a = pts[i];
        const b = pts[(i + 1) % pts.length];
        expect(Math.hypot(b[0] - a[0], b[1] - a[1])).toBeLessThanOrEqual(2 + 1e-12);
      }
    }
  });
});
