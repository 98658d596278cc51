import { describe, it, expect } from 'vitest';
import { buildGeometry } from '../../src/geometry/index.js';
import { gradedToward, meshPlate, sizeFieldFromSettings } from '../../src/mesh/index.js';
import type { Mesh } from '../../src/mesh/types.js';
import type { Plate } from '../../src/model/types.js';
import { buildPointLocator } from '../../src/recovery/index.js';
import { ElementScratch, inverseMap } from '../../src/recovery/element.js';
import { rng } from './hand-mesh.js';

/** The lowest-numbered element whose reference coordinates put (x, y) inside, by trying every element. */
function lowestContaining(mesh: Mesh, x: number, y: number): number {
  const s = new ElementScratch(mesh.nodesPerElem as 3 | 6);
  const ref = new Float64Array(2);
  const nElem = mesh.elemNodes.length / mesh.nodesPerElem;
  for (let e = 0; e < nElem; e++) {
    s.load(mesh, e);
    if (inverseMap(s, x, y, ref) && Math.max(-ref[0], -ref[1], ref[0] + ref[1] - 1) <= 0) return e;
  }
  return -1;
}

// A ladder's finest mesh is graded about 30-fold towards a corner: the buckets there hold hundreds of
// elements unless they nest. Whatever the nesting, the locator must answer as a search of every element.
describe('point location on a strongly graded mesh', () => {
  it('finds the same element as trying every element, near the graded corner and far from it', () => {
    const corners: [number, number][] = [[0, 0], [120, 0], [120, 40], [40, 40], [40, 120], [0, 120]];
    const outline = { kind: 'polygon', vertices: corners.map((at) => ({ at, round: 0 })) };
    const g = buildGeometry({ outline, openings: [] } as unknown as Plate);
    const mesh = meshPlate(g, { sizeAt: gradedToward(sizeFieldFromSettings(g, { size: 8, local: [] }), [40, 40], 0.02), order: 2 });
    const loc = buildPointLocator(mesh);
    const rand = rng(7);
    let near = 0;
    for (let k = 0; k < 600; k++) {
      // half the points within 1 of the corner (where the elements crowd), half anywhere in the box
      const close = k % 2 === 0;
      const x = close ? 40 + 2 * rand() - 1 : 120 * rand();
      const y = close ? 40 + 2 * rand() - 1 : 120 * rand();
      const want = lowestContaining(mesh, x, y);
      const hit = loc.locate(x, y);
      if (want >= 0) {
        expect(hit?.elem).toBe(want);
        if (close) near++;
      } else if (hit) {
        // outside every element: only a point within the locator's tolerance of an element may be given one
        expect(Math.max(-hit.xi, -hit.eta, hit.xi + hit.eta - 1)).toBeLessThanOrEqual(1e-9);
      }
    }
    expect(near).toBeGreaterThan(200); // three quarters of the square round the corner is material
  });
});
