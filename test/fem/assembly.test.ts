import { describe, expect, it } from 'vitest';
import { buildGeometry } from '../../src/geometry/index.js';
import { meshPlate } from '../../src/mesh/index.js';
import type { Plate } from '../../src/model/types.js';
import { stiffnessPattern } from '../../src/fem/assembly.js';

// The pattern tells assembly where every element pair lands (elemOffsets) so it writes without
// searching; each place must hold the pair's node in the sorted neighbour list of the row's node.
describe('stiffness pattern', () => {
  for (const order of [1, 2] as const) {
    it(`order ${order}: rows sorted and distinct; every element pair's place holds its node`, () => {
      const corners: [number, number][] = [[0, 0], [60, 0], [60, 20], [20, 20], [20, 60], [0, 60]];
      const g = buildGeometry({ outline: { kind: 'polygon', vertices: corners.map((at) => ({ at, round: 0 })) }, openings: [] } as unknown as Plate);
      const mesh = meshPlate(g, { sizeAt: (x, y) => 0.6 + 0.1 * Math.hypot(x - 20, y - 20), order });
      const p = stiffnessPattern(mesh);
      const npe = mesh.nodesPerElem;
      const nElem = mesh.elemNodes.length / npe;
      for (let n = 0; n < mesh.xy.length / 2; n++) {
        for (let q = p.nodeRowPtr[n] + 1; q < p.nodeRowPtr[n + 1]; q++) expect(p.nodeCols[q]).toBeGreaterThan(p.nodeCols[q - 1]);
      }
      let wrong = 0;
      for (let e = 0; e < nElem; e++) {
        for (let i = 0; i < npe; i++) {
          const a = mesh.elemNodes[npe * e + i];
          for (let j = 0; j < npe; j++) {
            const off = p.elemOffsets[npe * npe * e + npe * i + j];
            if (p.nodeCols[p.nodeRowPtr[a] + off] !== mesh.elemNodes[npe * e + j]) wrong++;
          }
        }
      }
      expect(wrong).toBe(0);
      expect(nElem).toBeGreaterThan(500);
    });
  }
});
