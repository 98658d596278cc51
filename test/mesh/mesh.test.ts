import { describe, it, expect } from 'vitest';
import { readdirSync, readFileSync, existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { buildGeometry } from '../../src/geometry/index.js';
import type { PlateGeometry } from '../../src/geometry/index.js';
import {
  meshPlate, meshQuality, validateMesh, findNode, elementNeighbors, nodeToElements,
  sizeFieldFromSettings, gradedToward, NO_ELEM,
} from '../../src/mesh/index.js';
import type { Plate, Shape } from '../../src/model/types.js';
import { MeshError } from '../../src/errors.js';
import { angleRuleMargin, chordAreaBound, minAngleAwayFromSharpCorners } from './helpers.js';

const rect = (cx: number, cy: number, w: number, h: number, round = 0): Shape => ({ kind: 'rect', center: [cx, cy], width: w, height: h, round });
const circle = (cx: number, cy: number, r: number): Shape => ({ kind: 'circle', center: [cx, cy], radius: r });
const poly = (pts: Array<[number, number, number?]>): Shape => ({
  kind: 'polygon',
  vertices: pts.map(([x, y, r]) => ({ at: [x, y] as [number, number], round: r ?? 0 })),
});
const plate = (outline: Shape, ...openings: Shape[]): PlateGeometry =>
  buildGeometry({ outline, openings: openings.map((shape, i) => ({ id: `o${i}`, shape, keyPath: `plate.openings[${i}]` })) } as Plate);

// exact areas: elementary closed forms (rectangle w·h, circle πr², ellipse πab, a rounded
// corner removes (1 − π/4)r² from its square)
const CASES: Array<{ name: string; geom: () => PlateGeometry; exact: number; h: number }> = [
  { name: 'rectangle minus circle', geom: () => plate(rect(60, 30, 120, 60), circle(50, 30, 12)), exact: 120 * 60 - Math.PI * 144, h: 4 },
  {
    name: 'rectangle minus rotated ellipse',
    geom: () => plate(rect(60, 30, 120, 60), { kind: 'ellipse', center: [60, 30], a: 20, b: 6, angleDeg: 30 }),
    exact: 120 * 60 - Math.PI * 20 * 6,
    h: 4,
  },
  { name: 'rounded rectangle', geom: () => plate(rect(0, 0, 80, 50, 10)), exact: 80 * 50 - (4 - Math.PI) * 100, h: 3 },
  {
    name: 'filleted L',
    geom: () => plate(poly([[0, 0], [100, 0], [100, 30], [30, 30, 8], [30, 100], [0, 100]])),
    // re-entrant fillet adds the (1 − π/4)r² sliver between the tangent lines and the arc
    exact: 100 * 30 + 30 * 70 + (1 - Math.PI / 4) * 64,
    h: 4,
  },
];

describe('meshPlate: area, coverage, validity', () => {
  for (const c of CASES) {
    it(`${c.name}: area within the chord-error bound, mesh valid (order 1 and 2)`, () => {
      const g = c.geom();
      expect(Math.abs(g.area - c.exact)).toBeLessThan(1e-9 * c.exact);
      const bound = chordAreaBound(g);
      for (const order of [1, 2] as const) {
        const m = meshPlate(g, { sizeAt: () => c.h, order });
        expect(validateMesh(m, g)).toEqual([]);
        const q = meshQuality(m);
        if (bound === 0) expect(Math.abs(q.area - c.exact)).toBeLessThan(1e-9 * c.exact);
        else if (order === 1) expect(Math.abs(q.area - c.exact)).toBeLessThanOrEqual(bound);
        // common practice: a three-point parabola deviates from an arc of angle θ by O(θ⁴) against
        // O(θ²) for the chord; at θ ≤ 0.2 rad that is below θ² = 0.04 of the chord error
        else expect(Math.abs(q.area - c.exact)).toBeLessThanOrEqual(0.04 * bound);
        expect(q.minAngleDeg).toBeGreaterThanOrEqual(25);
      }
    });
  }

  it('triangle count at size h is within 35 % of A / (√3/4 · h²) (equilateral area)', () => {
    const g = plate(rect(500, 300, 1000, 600), circle(300, 300, 100), circle(750, 250, 60));
    for (const h of [40, 15]) {
      const m = meshPlate(g, { sizeAt: () => h, order: 1 });
      const ideal = g.area / ((Math.sqrt(3) / 4) * h * h);
      const n = m.elemNodes.length / 3;
      expect(Math.abs(n / ideal - 1)).toBeLessThan(0.35);
    }
  });

  it('order-2 mid-side nodes on circles lie at the radius (1e-12 relative)', () => {
    const r = 6;
    const g = plate(rect(0, 0, 80, 40), circle(-20, 0, r), circle(15, 2, 2 * r));
    const m = meshPlate(g, { sizeAt: () => 3, order: 2 });
    let checked = 0;
    for (let i = 0; i < m.boundaryPiece.length; i++) {
      const piece = g.pieces[m.boundaryPiece[i]];
      if (piece.curve.kind !== 'arc') continue;
      const mid = m.boundaryEdges[3 * i + 2];
      const d = Math.hypot(m.xy[2 * mid] - piece.curve.center[0], m.xy[2 * mid + 1] - piece.curve.center[1]);
      expect(Math.abs(d / piece.curve.radius - 1)).toBeLessThan(1e-12);
      expect(mid).toBeGreaterThanOrEqual(m.nVertices);
      checked++;
    }
    expect(checked).toBeGreaterThan(20);
  });

  it('boundary segments on arcs subtend at most 2·acos(0.995) (chord deviation ≤ 0.5 % of r)', () => {
    const g = plate(rect(0, 0, 200, 100), circle(0, 0, 30));
    const m = meshPlate(g, { sizeAt: () => 50, order: 1 });
    const piece = g.pieces.find((p) => p.curve.kind === 'arc')!;
    const R = piece.radius;
    for (let i = 0; i < m.boundaryPiece.length; i++) {
      if (m.boundaryPiece[i] !== piece.id) continue;
      const a = m.boundaryEdges[2 * i], b = m.boundaryEdges[2 * i + 1];
      const chord = Math.hypot(m.xy[2 * a] - m.xy[2 * b], m.xy[2 * a + 1] - m.xy[2 * b + 1]);
      const angle = 2 * Math.asin(Math.min(1, chord / (2 * R)));
      // sagitta r(1 − cos(θ/2)) ≤ 0.005 r
      expect(1 - Math.cos(angle / 2)).toBeLessThanOrEqual(0.005 + 1e-12);
    }
  });

  it('required points become nodes, on the boundary and inside', () => {
    const g = plate(rect(50, 25, 100, 50), circle(30, 25, 8));
    const pts: Array<[number, number]> = [[70.123, 31.4], [100, 17.25], [33.3, 0], [30 + 8 * Math.cos(1), 25 + 8 * Math.sin(1)]];
    for (const order of [1, 2] as const) {
      const m = meshPlate(g, { sizeAt: () => 6, order, requiredPoints: pts });
      expect(validateMesh(m, g)).toEqual([]);
      for (const p of pts) {
        const n = findNode(m, p, 1e-9 * g.scale);
        expect(n).toBeGreaterThanOrEqual(0);
        expect(n).toBeLessThan(m.nVertices);
      }
    }
    expect(() => meshPlate(g, { sizeAt: () => 6, order: 1, requiredPoints: [[30, 25]] })).toThrow(MeshError);
    // the same point twice (and once a hair away) is one node, not an error
    const twice = meshPlate(g, { sizeAt: () => 6, order: 1, requiredPoints: [[100, 17.25], [100, 17.25], [100, 17.25 + 1e-13], [60, 20], [60, 20]] });
    expect(validateMesh(twice, g)).toEqual([]);
    expect(findNode(twice, [100, 17.25], 1e-9 * g.scale)).toBeGreaterThanOrEqual(0);
  });

  it('graded toward a point: min angle stays ≥ 25° and sizes shrink there', () => {
    const g = plate(poly([[0, 0], [120, 0], [120, 40], [40, 40], [40, 120], [0, 120]]));
    const base = sizeFieldFromSettings(g, { size: 8, local: [] });
    const f = gradedToward(base, [40, 40], 0.01);
    expect(f(40, 40)).toBeCloseTo(0.01, 12);
    expect(f(100, 100)).toBe(8);
    const m = meshPlate(g, { sizeAt: f, order: 2 });
    expect(validateMesh(m, g)).toEqual([]);
    expect(meshQuality(m).minAngleDeg).toBeGreaterThanOrEqual(25);
    expect(meshQuality(m).minEdge).toBeLessThan(0.02);
  });

  it('sizeFieldFromSettings: min of size, local disks and curve resolution, graded', () => {
    const g = plate(rect(0, 0, 200, 100), circle(50, 0, 10));
    const f = sizeFieldFromSettings(g, { size: 20, local: [{ near: [-50, 0], size: 1, radius: 5 }] }, 0.3);
    expect(f(-50, 2)).toBe(1);
    expect(f(-50, 15)).toBeCloseTo(1 + 0.3 * 10, 12);
    // on the circle: 2·acos(0.995)·r
    expect(f(60, 0)).toBeCloseTo(2 * Math.acos(0.995) * 10, 12);
    expect(f(-99, 49)).toBe(20);
    // Lipschitz with slope ≤ grading
    for (let i = 0; i < 200; i++) {
      const x = -100 + i, y = -40 + 0.3 * i;
      expect(Math.abs(f(x + 0.5, y) - f(x, y))).toBeLessThanOrEqual(0.3 * 0.5 + 1e-12);
    }
  });

  it('element neighbours and node-to-element lists agree with the element table', () => {
    const g = plate(rect(0, 0, 40, 20), circle(0, 0, 4));
    const m = meshPlate(g, { sizeAt: () => 2, order: 2 });
    const nb = elementNeighbors(m);
    const nE = m.elemNodes.length / 6;
    let free = 0;
    for (let e = 0; e < nE; e++) {
      for (let i = 0; i < 3; i++) {
        const f = nb[3 * e + i];
        if (f === NO_ELEM) {
          free++;
          continue;
        }
        expect([nb[3 * f], nb[3 * f + 1], nb[3 * f + 2]]).toContain(e);
      }
    }
    expect(free).toBe(m.boundaryPiece.length);
    const { offsets, elems } = nodeToElements(m);
    expect(offsets[offsets.length - 1]).toBe(6 * nE);
    for (let n = 0; n < m.xy.length / 2; n += 7) {
      for (let k = offsets[n]; k < offsets[n + 1]; k++) expect(Array.from(m.elemNodes.subarray(6 * elems[k], 6 * elems[k] + 6))).toContain(n);
    }
  });

  it('sizes far too small give a MeshError that names the size', () => {
    const g = plate(rect(0, 0, 100, 100));
    expect(() => meshPlate(g, { sizeAt: () => 0.5, order: 1, maxVertices: 2000 })).toThrow(/mesh\.size|vertices/);
    expect(() => meshPlate(g, { sizeAt: () => 0, order: 1 })).toThrow(MeshError);
    // a field that is positive on the boundary but NaN inside
    expect(() => meshPlate(g, { sizeAt: (x, y) => (x > 10 && x < 90 && y > 10 && y < 90 ? NaN : 5), order: 1 })).toThrow(/size field gave NaN/);
    expect(() => meshPlate(g, { sizeAt: () => 1, order: 3 as 1 })).toThrow(MeshError);
  });
});

describe('demo models', () => {
  const dir = fileURLToPath(new URL('../../models/', import.meta.url));
  const files = existsSync(dir) ? readdirSync(dir).filter((f) => f.endsWith('.yaml')) : [];
  it.skipIf(files.length === 0)('every demo model meshes validly with min angle ≥ 25° away from sharp corners', async () => {
    const { parseModel } = await import('../../src/model/index.js');
    for (const f of files) {
      const model = parseModel(readFileSync(dir + f, 'utf8'), `models/${f}`);
      const g = buildGeometry(model.plate);
      const sizeAt = sizeFieldFromSettings(g, { size: model.mesh.size, local: model.mesh.local });
      const m = meshPlate(g, { sizeAt, order: model.mesh.order });
      expect(validateMesh(m, g), f).toEqual([]);
      const away = minAngleAwayFromSharpCorners(m, g);
      if (process.env.MESH_REPORT) console.log(`${f}: ${m.elemNodes.length / m.nodesPerElem} elements, min angle ${meshQuality(m).minAngleDeg.toFixed(2)}°, away from sharp corners ${away.toFixed(2)}°`);
      expect(away, f).toBeGreaterThanOrEqual(25);
      expect(angleRuleMargin(m, g), f).toBeGreaterThanOrEqual(0);
    }
  });
});
