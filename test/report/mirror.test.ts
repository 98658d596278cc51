import { describe, expect, it } from 'vitest';
import { mirroredSection } from '../../src/report/mirror.js';
import { cornerArea } from '../../src/recovery/element.js';
import { quarterAnnulusMesh } from '../fem/helpers/meshes.js';

/* The mirrored view of a section (geometry only: the image is the section reflected in x = 0). */
describe('mirroredSection', () => {
  it.each([1, 2] as const)('order %i: twice the nodes and elements, image reflected, every element counter-clockwise, vertices first', (order) => {
    const mesh = quarterAnnulusMesh(1, 2, 3, 5, order);
    const values = Float64Array.from({ length: mesh.xy.length / 2 }, (_, i) => i);
    const m = mirroredSection(mesh, values);
    expect(m.mesh.xy.length).toBe(2 * mesh.xy.length);
    expect(m.mesh.elemNodes.length).toBe(2 * mesh.elemNodes.length);
    expect(m.mesh.nVertices).toBe(2 * mesh.nVertices);
    const nElem = m.mesh.elemNodes.length / m.mesh.nodesPerElem;
    for (let e = 0; e < nElem; e++) expect(cornerArea(m.mesh, e)).toBeGreaterThan(0);
    for (let k = 0; k < m.mesh.elemNodes.length; k++) {
      // corners are vertices, mid-side nodes come after them
      const local = k % m.mesh.nodesPerElem;
      expect(m.mesh.elemNodes[k] < m.mesh.nVertices).toBe(local < 3);
    }
    // each value appears at a point and at its image
    const seen = new Map<number, number[]>();
    for (let n = 0; n < m.values.length; n++) seen.set(m.values[n], [...(seen.get(m.values[n]) ?? []), n]);
    for (const [, nodes] of seen) {
      expect(nodes.length).toBe(2);
      expect(m.mesh.xy[2 * nodes[0]]).toBe(-m.mesh.xy[2 * nodes[1]]);
      expect(m.mesh.xy[2 * nodes[0] + 1]).toBe(m.mesh.xy[2 * nodes[1] + 1]);
    }
  });
});
