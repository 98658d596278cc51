/**
 * Issue 19, class 14 (model side): later-stage errors name the model key, and advice that cannot
 * help is not given.
 */
import { describe, expect, it } from 'vitest';
import { MeshError } from '../../src/errors.js';
import { buildGeometry } from '../../src/geometry/index.js';
import { meshPlate, sizeFieldFromSettings } from '../../src/mesh/index.js';
import { dofLimitError, healthWarnings } from '../../src/fem/health.js';
import { formatModelError, parseModel, pointKeyPath } from '../../src/model/index.js';
import { mesh as meshModel } from '../../src/index.js';

const base = [
  'material: { E: 210000, nu: 0.3 }', 'thickness: 6',
  'plate:', '  outline: [[0, 0], [120, 0], [120, 50], [0, 50]]', '  openings: [ { id: bore, circle: { center: [30, 25], radius: 8 } } ]',
];

describe('a required point outside the plate names the entry that asked for it', () => {
  it('point load, point support and listed site', () => {
    const model = parseModel([
      ...base,
      'supports:', '  - { where: { x: 0 }, fix: [x] }', '  - { where: { point: [0, 0] }, fix: [y] }',
      'loads:', '  - { where: { point: [120, 500] }, force: [0, -1000] }',
      'study: { sites: [[60, 25], [200, 10]] }',
    ].join('\n'), 'lug.yaml');
    expect(pointKeyPath(model, [120, 500])).toBe('loads[0].where.point');
    expect(pointKeyPath(model, [0, 1e-12])).toBe('supports[1].where.point');
    expect(pointKeyPath(model, [200, 10])).toBe('study.sites[1]');
    expect(pointKeyPath(model, [200, 11])).toBeUndefined();
    let caught: unknown;
    try {
      meshModel(model);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(MeshError);
    // the only required point outside the plate: the load
    expect(formatModelError(caught as MeshError, 'lug.yaml', model)).toBe(
      'lug.yaml:10:23 loads[0].where.point: required point (120, 500) lies outside the plate (not inside the outline, or inside an opening)',
    );
  });
});

describe('advice that cannot help is not given', () => {
  const strip = (long: number, narrow: number, size: number) => {
    const geometry = buildGeometry({ outline: { kind: 'rect', center: [long / 2, narrow / 2], width: long, height: narrow, round: 0 }, openings: [] });
    const mesh = meshPlate(geometry, { sizeAt: () => size, order: 1 });
    return healthWarnings({ section: { E: 1, nu: 0.3, state: 'plane-stress', thickness: 1 }, geometry, mesh, size, lengthUnit: 'mm' });
  };
  it('a strip 4000 to 1 with 2 elements across: one warning, not "use a smaller mesh.size"', () => {
    // 3 across needs size ≤ 10/3, which puts 12 000 > 10⁴ elements along the 40 000 mm
    const w = strip(40000, 10, 5);
    expect(w.filter((m) => m.includes('mesh.size'))).toHaveLength(1);
    expect(w[0]).toContain('the plate is 40000 mm long and 10 mm across (4,000 to 1): no single mesh.size gives 3 elements across');
    expect(w.join(' ')).not.toMatch(/use a (smaller|larger) mesh\.size/);
  });
  it('a strip that a smaller size would fix still gets that advice', () => {
    expect(strip(400, 10, 5).join(' ')).toContain('use a smaller mesh.size');
  });
  it('the dof cap on a narrow strip does not suggest a size that leaves fewer than 3 elements across', () => {
    const e = dofLimitError(8e6, 2e6, 4, 'estimated', { narrow: 10, lengthUnit: 'mm' });
    // √(8e6 / 2e6) · 4 · 1.1 = 8.8 mm > 10/3 mm
    expect(e.message).toContain('a mesh.size that fits (about 8.8 mm) would leave fewer than 3 elements across');
    expect(e.message).toContain('coarsening cannot help');
    expect(dofLimitError(8e6, 2e6, 4, 'estimated', { narrow: 100 }).message).toContain('mesh.size 4 → about 8.8');
  });
  it('a vertex cap reached by the boundary alone asks for a simpler outline, not a larger mesh.size', () => {
    const n = 2000;
    const vertices = Array.from({ length: n }, (_, k) => ({ at: [100 * Math.cos((2 * Math.PI * k) / n), 100 * Math.sin((2 * Math.PI * k) / n)] as [number, number], round: 0 }));
    const geometry = buildGeometry({ outline: { kind: 'polygon', vertices }, openings: [] });
    expect(() => meshPlate(geometry, { sizeAt: sizeFieldFromSettings(geometry, { size: 20, local: [] }), order: 1, maxVertices: 3000 }))
      .toThrow(/the plate boundary alone takes 2000 of them .* simplify the outline/);
  });
});
