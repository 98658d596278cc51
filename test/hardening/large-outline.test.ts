/**
 * Issue 19, class 10: an imported outline of 200 000 points once overflowed the call stack
 * (`Math.min(...xs)` over the vertices). The whole model → geometry → mesh path now takes it:
 * a wavy strip 1.2 wide and 100 000 long, its two sides sampled at unit spacing, read from a CSV
 * generated here. Speed is not asserted (no timed tests); the run takes a few seconds.
 */
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { buildGeometry } from '../../src/geometry/index.js';
import { meshPlate, meshQuality, sizeFieldFromSettings } from '../../src/mesh/index.js';

describe('an outline of 200 000 points', () => {
  it('parses, builds and meshes; the mesh area is the polygon area', () => {
    const n = 100_000;
    const xs: number[] = [];
    const ys: number[] = [];
    for (let i = 0; i < n; i++) { xs.push(i); ys.push(Number((0.3 * Math.sin(i / 7)).toFixed(4))); }
    for (let i = n - 1; i >= 0; i--) { xs.push(i); ys.push(Number((1.2 + 0.3 * Math.sin(i / 7)).toFixed(4))); }
    const csv = ['x,y', ...xs.map((x, k) => `${x},${ys[k]}`)].join('\n');
    const yaml = [
      'material: { E: 210000, nu: 0.3 }', 'thickness: 1',
      'plate:', '  outline: { points: strip.csv }',
      'supports:', '  - { where: { x: 0 }, fix: [x, y] }',
      'loads:', `  - { where: { x: ${n - 1} }, traction: [1, 0] }`,
      'mesh: { size: 3, order: 1 }',
    ].join('\n');
    const model = parseModel(yaml, 'strip.yaml', { readFile: () => csv });
    expect(model.plate.outline.kind === 'polygon' && model.plate.outline.vertices.length).toBe(2 * n);
    const geometry = buildGeometry(model.plate);
    // shoelace formula on the points as written
    let twice = 0;
    for (let k = 0; k < 2 * n; k++) {
      const j = (k + 1) % (2 * n);
      twice += xs[k] * ys[j] - xs[j] * ys[k];
    }
    const exact = Math.abs(twice) / 2;
    expect(Math.abs(geometry.area / exact - 1)).toBeLessThan(1e-12);
    const mesh = meshPlate(geometry, { sizeAt: sizeFieldFromSettings(geometry, model.mesh), order: 1 });
    const q = meshQuality(mesh);
    // straight edges only: the mesh covers the polygon exactly up to the rounding of 2e5 element
    // areas (measured 3.5e-12 relative)
    expect(Math.abs(q.area / exact - 1)).toBeLessThan(1e-10);
    expect(q.minAngleDeg).toBeGreaterThanOrEqual(28);
  });
});
