import { describe, it, expect } from 'vitest';
import { buildPointLocator, stressAt, boundaryTangentialStress } from '../../src/recovery/index.js';
import type { PlateGeometry, BoundaryPiece } from '../../src/geometry/types.js';
import type { Mesh } from '../../src/mesh/types.js';
import { rectMesh, rng } from './hand-mesh.js';
import { quarterRingMesh } from './mapped-mesh.js';

function fieldFrom(mesh: Mesh, fn: (x: number, y: number) => [number, number, number]) {
  const n = mesh.xy.length / 2;
  const stress = new Float64Array(3 * n);
  for (let i = 0; i < n; i++) stress.set(fn(mesh.xy[2 * i], mesh.xy[2 * i + 1]), 3 * i);
  return { stress, szz: new Float64Array(n), method: 'spr' as const };
}

// Interpolation property of the 6-node triangle (any FE text, e.g. Cook et al. 2002 §7): its
// shape functions reproduce every quadratic exactly on a straight-sided element, so a nodal
// field sampled from a quadratic must come back exactly at any point.
describe('point location and interpolation', () => {
  it('LST on a jittered mesh: a quadratic nodal field is reproduced at random points; outside is null', () => {
    const mesh = rectMesh(7, 5, 3.5, 2.5, 2, 0.5, 4);
    const q = (x: number, y: number): [number, number, number] => [1 + x * x - 2 * x * y, 3 * y * y - x, 0.5 * x + y];
    const field = fieldFrom(mesh, q);
    const loc = buildPointLocator(mesh);
    const rand = rng(99);
    for (let k = 0; k < 200; k++) {
      const x = 3.5 * rand();
      const y = 2.5 * rand();
      const s = stressAt(mesh, field, x, y, loc)!;
      const e = q(x, y);
      expect(Math.abs(s.sxx - e[0]) + Math.abs(s.syy - e[1]) + Math.abs(s.sxy - e[2])).toBeLessThan(1e-10);
    }
    expect(stressAt(mesh, field, -0.01, 1)).toBeNull();
    expect(stressAt(mesh, field, 1, 2.6)).toBeNull();
  });

  it('curved LST edges: a point between the chord and the true bore circle is found', () => {
    const { mesh } = quarterRingMesh(1, 2, 3, 4, 2);
    const field = fieldFrom(mesh, (x, y) => [x, y, 0]);
    // bore vertices at 0° and 22.5°: at 11.25° the circle lies inside the chord's bulge
    const th = (11.25 * Math.PI) / 180;
    const r = 1 + 1e-4; // the chord is at r = cos(11.25°) ≈ 0.981 here, so r = 1.0001 is outside it
    const hit = buildPointLocator(mesh).locate(r * Math.cos(th), r * Math.sin(th));
    expect(hit).not.toBeNull();
    // x and y are quadratic in (ξ, η) on the curved element; the field is x, y at the nodes, so
    // interpolation returns the point's own coordinates (isoparametric consistency)
    const s = stressAt(mesh, field, r * Math.cos(th), r * Math.sin(th))!;
    expect(Math.abs(s.sxx - r * Math.cos(th))).toBeLessThan(1e-10);
    expect(Math.abs(s.syy - r * Math.sin(th))).toBeLessThan(1e-10);
    // the ring's hole is not material
    expect(stressAt(mesh, field, 0.5, 0.5)).toBeNull();
  });
});

function rectGeometry(W: number, H: number): PlateGeometry {
  const line = (id: number, from: [number, number], to: [number, number]): BoundaryPiece => ({
    id, curve: { kind: 'line', from, to }, loop: 'outline', role: 'edge', radius: 0, keyPath: `plate.outline[${id}]`,
  });
  return {
    pieces: [line(0, [0, 0], [W, 0]), line(1, [W, 0], [W, H]), line(2, [W, H], [0, H]), line(3, [0, H], [0, 0])],
    loops: [{ id: 'outline', hole: false, pieces: [0, 1, 2, 3], keyPath: 'plate.outline' }],
    corners: [],
    area: W * H,
    bbox: { minX: 0, minY: 0, maxX: W, maxY: H },
    scale: Math.hypot(W, H),
  };
}

// σt = tᵀσt (Cauchy's formula for the normal stress on a plane, resolved along the tangent).
describe('tangential stress along a boundary', () => {
  for (const order of [1, 2] as const) {
    it(`order ${order}: uniform stress, each edge of a rectangle in travel order, corners twice`, () => {
      const W = 3;
      const H = 2;
      const mesh = rectMesh(6, 4, W, H, order, 0.3, 2);
      const field = fieldFrom(mesh, () => [10, 3, 2]);
      const b = boundaryTangentialStress(mesh, rectGeometry(W, H), field, 'outline');
      const perSide = order === 1 ? [7, 5, 7, 5] : [13, 9, 13, 9]; // nodes along each side
      expect(b.st.length).toBe(perSide.reduce((x, y) => x + y, 0));
      // first and last sample at the start of piece 0, the walk closes the loop
      expect(b.x[0]).toBe(0);
      expect(b.y[0]).toBe(0);
      expect(Math.abs(b.s[b.s.length - 1] - 2 * (W + H))).toBeLessThan(1e-12);
      for (let k = 1; k < b.s.length; k++) expect(b.s[k]).toBeGreaterThanOrEqual(b.s[k - 1]);
      for (let k = 0; k < b.st.length; k++) {
        const horizontal = b.piece[k] === 0 || b.piece[k] === 2;
        expect(b.st[k]).toBeCloseTo(horizontal ? 10 : 3, 12);
      }
    });
  }

  it('a list of pieces that does not close gives one open run from its free end', () => {
    const mesh = rectMesh(4, 2, 2, 1, 1);
    const field = fieldFrom(mesh, (x) => [x, 0, 0]);
    const b = boundaryTangentialStress(mesh, rectGeometry(2, 1), field, [2, 3]);
    expect(Array.from(new Set(b.run))).toEqual([0]);
    expect([b.x[0], b.y[0]]).toEqual([2, 1]); // top edge starts at (W, H)
    expect([b.x[b.x.length - 1], b.y[b.y.length - 1]]).toEqual([0, 0]);
    // top edge: σt = σxx = x; left edge: σt = σyy = 0
    for (let k = 0; k < b.st.length; k++) expect(b.st[k]).toBeCloseTo(b.piece[k] === 2 ? b.x[k] : 0, 12);
  });
});
