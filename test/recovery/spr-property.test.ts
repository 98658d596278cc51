import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { recoverSpr, estimateError } from '../../src/recovery/index.js';
import type { ElasticSection } from '../../src/fem/types.js';
import { rectMesh, sampledGauss } from './hand-mesh.js';

const section: ElasticSection = { E: 70_000, nu: 0.33, state: 'plane-stress', thickness: 2 };

// Zienkiewicz & Zhu (1992) Part 1: the patch fit of degree p reproduces any field of degree ≤ p;
// then σ* = σh everywhere and the ZZ estimate (1987) is zero. Checked over random meshes and fields.
describe('SPR reproduction, property-based', () => {
  it('LST: any linear field on any jittered rectangle mesh comes back exactly, estimate 0', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 6 }),
        fc.integer({ min: 1, max: 6 }),
        fc.double({ min: 0, max: 0.6, noNaN: true }),
        fc.integer({ min: 1, max: 1000 }),
        fc.array(fc.double({ min: -100, max: 100, noNaN: true }), { minLength: 9, maxLength: 9 }),
        (nx, ny, jitter, seed, c) => {
          const mesh = rectMesh(nx, ny, 2, 1.5, 2, jitter, seed);
          const fn = (x: number, y: number): [number, number, number] => [c[0] + c[1] * x + c[2] * y, c[3] + c[4] * x + c[5] * y, c[6] + c[7] * x + c[8] * y];
          const gauss = sampledGauss(mesh, fn);
          const field = recoverSpr(mesh, gauss, section);
          const scale = 1 + Math.max(...c.map(Math.abs)) * 4;
          for (let n = 0; n < mesh.xy.length / 2; n++) {
            const e = fn(mesh.xy[2 * n], mesh.xy[2 * n + 1]);
            for (let k = 0; k < 3; k++) expect(Math.abs(field.stress[3 * n + k] - e[k]) / scale).toBeLessThan(1e-8);
          }
          const est = estimateError(mesh, gauss, field, section);
          // relative to the energy of a stress of the field's size over the plate (area 3)
          expect(est.errorSq).toBeLessThanOrEqual((1e-14 * scale * scale * 3) / section.E);
        },
      ),
      { numRuns: 60 },
    );
  });

  it('CST: any constant field comes back exactly', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 7 }),
        fc.integer({ min: 1, max: 7 }),
        fc.double({ min: 0, max: 0.6, noNaN: true }),
        fc.integer({ min: 1, max: 1000 }),
        fc.tuple(fc.double({ min: -1e3, max: 1e3, noNaN: true }), fc.double({ min: -1e3, max: 1e3, noNaN: true }), fc.double({ min: -1e3, max: 1e3, noNaN: true })),
        (nx, ny, jitter, seed, s) => {
          const mesh = rectMesh(nx, ny, 1, 3, 1, jitter, seed);
          const field = recoverSpr(mesh, sampledGauss(mesh, () => s), section);
          const scale = 1 + Math.max(...s.map(Math.abs));
          for (let n = 0; n < mesh.xy.length / 2; n++) {
            for (let k = 0; k < 3; k++) expect(Math.abs(field.stress[3 * n + k] - s[k]) / scale).toBeLessThan(1e-8);
          }
        },
      ),
      { numRuns: 60 },
    );
  });
});
