import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { buildGeometry } from '../../src/geometry/index.js';
import { meshPlate, validateMesh, sizeFieldFromSettings } from '../../src/mesh/index.js';
import type { Plate, Shape, Opening } from '../../src/model/types.js';
import { GeometryError, MeshError } from '../../src/errors.js';
import { angleRuleMargin } from './helpers.js';

// random star-shaped outlines (may have corners sharper than 60° and fillets) with random
// circular, elliptical, rounded-rectangular and triangular openings
const outlineArb = fc.oneof(
  fc.record({ w: fc.double({ min: 40, max: 200, noNaN: true }), h: fc.double({ min: 30, max: 150, noNaN: true }), round: fc.double({ min: 0, max: 0.2, noNaN: true }) })
    .map(({ w, h, round }): Shape => ({ kind: 'rect', center: [0, 0], width: w, height: h, round: round * Math.min(w, h) })),
  fc.array(fc.record({ r: fc.double({ min: 30, max: 100, noNaN: true }), round: fc.constantFrom(0, 0, 0, 2, 5) }), { minLength: 3, maxLength: 9 })
    .map((vs): Shape => ({
      kind: 'polygon',
      vertices: vs.map((v, i) => {
        const a = (2 * Math.PI * i) / vs.length;
        return { at: [v.r * Math.cos(a), v.r * Math.sin(a)] as [number, number], round: v.round };
      }),
    })),
);

const openingArb = fc.record({
  kind: fc.constantFrom('circle', 'ellipse', 'rect', 'triangle'),
  x: fc.double({ min: -40, max: 40, noNaN: true }),
  y: fc.double({ min: -30, max: 30, noNaN: true }),
  s: fc.double({ min: 1, max: 10, noNaN: true }),
  q: fc.double({ min: 0.2, max: 1, noNaN: true }),
  ang: fc.double({ min: 0, max: 180, noNaN: true }),
});

function toShape(o: { kind: string; x: number; y: number; s: number; q: number; ang: number }): Shape {
  switch (o.kind) {
    case 'circle':
      return { kind: 'circle', center: [o.x, o.y], radius: o.s };
    case 'ellipse':
      return { kind: 'ellipse', center: [o.x, o.y], a: o.s, b: o.s * o.q, angleDeg: o.ang };
    case 'rect':
      return { kind: 'rect', center: [o.x, o.y], width: 2 * o.s, height: 2 * o.s * o.q, round: 0.5 * o.s * o.q * (o.ang / 180) };
    default: {
      const a = (o.ang * Math.PI) / 180;
      const pts: Array<[number, number]> = [0, 1, 2].map((k) => [
        o.x + o.s * Math.cos(a + (2 * Math.PI * k) / 3) * (k === 1 ? o.q : 1),
        o.y + o.s * Math.sin(a + (2 * Math.PI * k) / 3) * (k === 1 ? o.q : 1),
      ]);
      return { kind: 'polygon', vertices: pts.map((at) => ({ at, round: 0 })) };
    }
  }
}

describe('fuzz: random plates with random openings', () => {
  it('always give a valid mesh with the angle bound, or a GeometryError / MeshError', () => {
    let meshed = 0;
    let geomErrors = 0;
    const meshErrors: string[] = [];
    fc.assert(
      fc.property(outlineArb, fc.array(openingArb, { maxLength: 4 }), fc.integer({ min: 6, max: 25 }), fc.constantFrom(1, 2), (outline, ops, div, order) => {
        const openings: Opening[] = ops.map((o, i) => ({ id: `o${i}`, shape: toShape(o), keyPath: `plate.openings[${i}]` }));
        let g;
        try {
          g = buildGeometry({ outline, openings } as Plate);
        } catch (e) {
          if (e instanceof GeometryError) {
            geomErrors++;
            return;
          }
          throw e;
        }
        const size = g.scale / div;
        const sizeAt = sizeFieldFromSettings(g, { size, local: [] });
        try {
          // the vertex cap bounds the run time of hostile cases (features far below the size)
          const t0 = Date.now();
          const m = meshPlate(g, { sizeAt, order: order as 1 | 2, maxVertices: 60_000 });
          const problems = validateMesh(m, g);
          const margin = angleRuleMargin(m, g);
          if (process.env.FUZZ_DUMP && (problems.length || margin < 0 || Date.now() - t0 > 1000)) {
            console.log('CASE', Date.now() - t0, 'ms', margin, JSON.stringify(problems.slice(0, 3)), JSON.stringify({ outline, openings, size, order }));
          }
          expect(problems).toEqual([]);
          expect(margin).toBeGreaterThanOrEqual(0);
          meshed++;
        } catch (e) {
          if (e instanceof MeshError || e instanceof GeometryError) {
            meshErrors.push((e as Error).message);
            if (process.env.FUZZ_DUMP) console.log('CASE', JSON.stringify({ outline, openings, size }));
            return;
          }
          throw e;
        }
      }),
      { numRuns: Number(process.env.FUZZ_RUNS ?? 150), seed: Number(process.env.FUZZ_SEED ?? 20261201), endOnFailure: !!process.env.FUZZ_DUMP },
    );
    if (process.env.FUZZ_DUMP) console.log(`fuzz: ${meshed} meshed, ${geomErrors} geometry errors, mesh errors: ${meshErrors.join(' | ')}`);
    // the fuzz must exercise the mesher, not only the geometry checks
    expect(meshed).toBeGreaterThan(30);
  });
});
