/**
 * pointInMaterial counts crossings only on the pieces along the shortest axis ray, found in a
 * bucket grid (issue 19, class 11: the dof estimate asked it once per quadtree leaf, over every
 * piece, and took 151 s on a 1 600-hole plate). Oracle: the sum over all loops of the winding
 * number about p (loopWinding, every piece, the +x ray), on random points and on points just
 * off the boundary.
 */
import { describe, expect, it } from 'vitest';
import { buildGeometry, curvePoint, loopWinding, pointInMaterial, type PlateGeometry } from '../../src/geometry/index.js';
import type { Opening, Plate } from '../../src/model/types.js';
import { seededRandom } from '../helpers/random.js';

function bruteForce(geom: PlateGeometry, p: [number, number]): boolean {
  let w = 0;
  for (const loop of geom.loops) w += loopWinding(geom, loop.id, p);
  return w !== 0;
}

const openings: Opening[] = [];
for (let i = 0; i < 6; i++) {
  for (let j = 0; j < 4; j++) {
    const k = openings.length;
    const center: [number, number] = [20 + 30 * i, 20 + 25 * j];
    const shape = k % 3 === 0
      ? { kind: 'ellipse' as const, center, a: 9, b: 4, angleDeg: 17 * k }
      : k % 3 === 1 ? { kind: 'circle' as const, center, radius: 6 + (k % 4) }
        : { kind: 'rect' as const, center, width: 14, height: 8, round: 3 };
    openings.push({ id: `o${k}`, shape, keyPath: `plate.openings[${k}]` });
  }
}
const plate: Plate = {
  outline: {
    kind: 'polygon',
    vertices: [
      { at: [0, 0], round: 0 }, { at: [190, 0], round: 12 }, { at: [190, 110], round: 0 }, { at: [120, 110], round: 5 },
      { at: [100, 125], round: 0 }, { at: [80, 110], round: 5 }, { at: [0, 110], round: 20 },
    ],
  },
  openings,
};

describe('pointInMaterial through the piece grid', () => {
  const geom = buildGeometry(plate);
  it('agrees with the winding number over every piece on 20 000 random points', () => {
    const rnd = seededRandom(1911);
    let inside = 0;
    for (let k = 0; k < 20000; k++) {
      const p: [number, number] = [-20 + 230 * rnd(), -20 + 165 * rnd()];
      const got = pointInMaterial(geom, p);
      expect(got).toBe(bruteForce(geom, p));
      if (got) inside++;
    }
    // sanity: a fair share of the points is in the material (area ≈ 1.9e4 of a 3.8e4 box)
    expect(inside).toBeGreaterThan(6000);
  });
  it('agrees just off every piece (1e-6 of the plate size to either side)', () => {
    const rnd = seededRandom(5);
    for (const piece of geom.pieces) {
      for (let s = 0; s < 5; s++) {
        const t = rnd();
        const a = curvePoint(piece.curve, Math.max(0, t - 1e-3)), b = curvePoint(piece.curve, Math.min(1, t + 1e-3));
        const m = curvePoint(piece.curve, t);
        const len = Math.hypot(b[0] - a[0], b[1] - a[1]) || 1;
        const nx = -(b[1] - a[1]) / len, ny = (b[0] - a[0]) / len;
        for (const side of [1, -1]) {
          const p: [number, number] = [m[0] + side * 2e-4 * nx, m[1] + side * 2e-4 * ny];
          expect(pointInMaterial(geom, p)).toBe(bruteForce(geom, p));
        }
      }
    }
  });
});
