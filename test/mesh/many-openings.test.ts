/**
 * Plates with many openings (issue 19, class 11). The size field buckets its features, so a
 * query visits only the holes near it; these tests check that the bucketed field is still the
 * lower envelope of every feature's cone, and that a 100-hole plate meshes correctly. Speed is
 * measured by `npm run bench` (src/bench/holes.ts), never here.
 */
import { describe, expect, it } from 'vitest';
import { buildGeometry, closestOnCurve } from '../../src/geometry/index.js';
import { CURVE_SEGMENT_ANGLE, meshPlate, meshQuality, sizeFieldFromSettings } from '../../src/mesh/index.js';
import { curvatureRadius, curveLen, curveXY } from '../../src/mesh/curves.js';
import { perforatedPlate } from '../../src/bench/holes.js';
import type { Opening, Plate } from '../../src/model/types.js';
import { seededRandom } from '../helpers/random.js';

describe('size field with many features', () => {
  it('equals the brute-force lower envelope of the base size, local disks and arc cones', () => {
    const rnd = seededRandom(1901);
    const openings: Opening[] = [];
    // 60 holes of radii 0.5 … 20 on a 30-pitch grid (some large enough to ask for no refinement)
    for (let i = 0; i < 10; i++) {
      for (let j = 0; j < 6; j++) {
        const r = 0.5 + 19.5 * rnd() ** 3 * (i % 3 === 0 ? 0.2 : 0.6);
        openings.push({ id: `o${openings.length}`, shape: { kind: 'circle', center: [30 * i + 15, 30 * j + 15], radius: r }, keyPath: `plate.openings[${openings.length}]` });
      }
    }
    const plate: Plate = { outline: { kind: 'rect', center: [150, 90], width: 300, height: 180, round: 12 }, openings };
    const geom = buildGeometry(plate);
    const local = [{ near: [40, 40] as [number, number], size: 0.3, radius: 6 }, { near: [150, 90] as [number, number], size: 2, radius: 200 }];
    const h0 = 8, g = 0.3;
    const field = sizeFieldFromSettings(geom, { size: h0, local }, g);
    let worst = 0;
    for (let k = 0; k < 4000; k++) {
      // points inside and around the plate, so queries outside the index are covered too
      const x = -40 + 380 * rnd(), y = -40 + 260 * rnd();
      let h = h0;
      for (const l of local) h = Math.min(h, l.size + g * Math.max(0, Math.hypot(x - l.near[0], y - l.near[1]) - l.radius));
      for (const piece of geom.pieces) {
        if (piece.curve.kind !== 'arc') continue;
        // the chord rule's size on an arc of radius R is 0.2·R (CURVE_SEGMENT_ANGLE·R)
        const hArc = CURVE_SEGMENT_ANGLE * piece.curve.radius;
        h = Math.min(h, hArc + g * closestOnCurve(piece.curve, [x, y]).distance);
      }
      worst = Math.max(worst, Math.abs(field(x, y) - h) / h);
    }
    // the closest-point search on an arc is exact to rounding; 1e-9 leaves room for it
    expect(worst).toBeLessThan(1e-9);
  });
});

describe('a 100-hole perforated plate', () => {
  it('meshes to the exact area (plate minus 100 πr²) with the 28° angle target', () => {
    const geom = buildGeometry(perforatedPlate(10));
    const exact = 100 * 100 - 100 * Math.PI * 4;
    expect(Math.abs(geom.area - exact)).toBeLessThan(1e-9 * exact);
    const mesh = meshPlate(geom, { sizeAt: sizeFieldFromSettings(geom, { size: 2, local: [] }), order: 2 });
    // validateMesh tests every centroid against every loop (quadratic here); on this plate the
    // same checks are direct: counter-clockwise elements, centroids in the square and off the
    // hole of their own pitch cell (the only one within reach)
    const { xy, elemNodes: en } = mesh;
    let bad = 0;
    for (let e = 0; e < en.length / 6; e++) {
      const [a, b, c] = [en[6 * e], en[6 * e + 1], en[6 * e + 2]];
      const twiceArea = (xy[2 * b] - xy[2 * a]) * (xy[2 * c + 1] - xy[2 * a + 1]) - (xy[2 * b + 1] - xy[2 * a + 1]) * (xy[2 * c] - xy[2 * a]);
      const cx = (xy[2 * a] + xy[2 * b] + xy[2 * c]) / 3, cy = (xy[2 * a + 1] + xy[2 * b + 1] + xy[2 * c + 1]) / 3;
      const hx = 10 * Math.floor(cx / 10) + 5, hy = 10 * Math.floor(cy / 10) + 5;
      // next to a hole, two vertices on the circle (chords of ≤ 0.2 rad, at ≥ 0.995 r) and one
      // outside put the centroid beyond 0.99 r; 0.9 r is a safe margin
      if (!(twiceArea > 0) || cx < 0 || cx > 100 || cy < 0 || cy > 100 || Math.hypot(cx - hx, cy - hy) < 0.9 * 2) bad++;
    }
    expect(bad).toBe(0);
    const q = meshQuality(mesh);
    // LST mid-side nodes on the true circle: the parabola deviates from an arc of ≤ 0.2 rad by
    // O(θ⁴) (common practice); measured 3.5e-7 relative here, so 1e-6 is a few times that
    expect(Math.abs(q.area / exact - 1)).toBeLessThan(1e-6);
    // Ruppert–Shewchuk refinement with a 28° target; no input corner is sharper than 90°
    expect(q.minAngleDeg).toBeGreaterThanOrEqual(28 - 1e-9);
    // every hole is resolved by the chord rule: at least 2π/0.2 ≈ 32 boundary edges each
    const perHole = new Map<string, number>();
    for (let i = 0; i < mesh.boundaryPiece.length; i++) {
      const loop = geom.pieces[mesh.boundaryPiece[i]].loop;
      perHole.set(loop, (perHole.get(loop) ?? 0) + 1);
    }
    for (const o of geom.loops.filter((l) => l.hole)) expect(perHole.get(o.id)!).toBeGreaterThanOrEqual(32);
  });
});

describe('size field near ellipses', () => {
  it('equals, to the last bit, the lower envelope of every ellipse sample cone (runs of samples passed over change nothing)', () => {
    const rnd = seededRandom(4407);
    // slender and round ellipses, rotated, small enough that their curvature asks for refinement
    const shapes = [
      { a: 12, b: 1.5, ang: 20, c: [40, 40] }, { a: 6, b: 4, ang: -35, c: [100, 50] }, { a: 20, b: 0.8, ang: 90, c: [160, 60] },
    ];
    const openings: Opening[] = shapes.map((s, i) => ({ id: `e${i}`, shape: { kind: 'ellipse', center: s.c as [number, number], a: s.a, b: s.b, angleDeg: s.ang }, keyPath: `plate.openings[${i}]` }));
    const geom = buildGeometry({ outline: { kind: 'rect', center: [100, 50], width: 200, height: 100, round: 0 }, openings });
    const h0 = 6, g = 0.3;
    const field = sizeFieldFromSettings(geom, { size: h0, local: [] }, g);
    // the sampling rule of sizefield.ts: n + 1 points evenly in the parameter, each asking for
    // CURVE_SEGMENT_ANGLE × the radius of curvature there, kept when that is below h0
    // (about the plate's centre, as the field itself is built: see PlateGeometry.local)
    const local = geom.local?.geometry ?? geom, [ox, oy] = geom.local?.origin ?? [0, 0];
    const cones: number[] = [];
    const p = [0, 0];
    for (const piece of local.pieces) {
      const c = piece.curve;
      if (c.kind !== 'ellipse-arc') continue;
      const rhoMin = Math.min(c.a, c.b) ** 2 / Math.max(c.a, c.b);
      const n = Math.min(400, Math.max(8, Math.ceil(curveLen(c) / (CURVE_SEGMENT_ANGLE * rhoMin * 2))));
      for (let i = 0; i <= n; i++) {
        const h = CURVE_SEGMENT_ANGLE * curvatureRadius(c, i / n);
        if (h >= h0) continue;
        curveXY(c, i / n, p);
        cones.push(p[0], p[1], h);
      }
    }
    expect(cones.length / 3).toBeGreaterThan(300);
    let differ = 0;
    for (let k = 0; k < 3000; k++) {
      // most points close to an ellipse, where only some runs of its samples can matter
      const s = shapes[k % 3];
      const t = 2 * Math.PI * rnd(), rho = 0.5 + 1.5 * rnd();
      const x = k % 5 === 0 ? 200 * rnd() : s.c[0] + rho * s.a * Math.cos(t);
      const y = k % 5 === 0 ? 100 * rnd() : s.c[1] + rho * s.a * Math.sin(t);
      let h = h0;
      for (let i = 0; i < cones.length; i += 3) h = Math.min(h, cones[i + 2] + g * Math.hypot(x - ox - cones[i], y - oy - cones[i + 1]));
      if (field(x, y) !== h) differ++;
    }
    expect(differ).toBe(0);
  });
});
