/**
 * A detail driven only by prescribed displacements (no loads): a 100 × 20 plate, left edge held
 * in x, one corner in y, right edge pulled to u_x = 0.1. Uniaxial stress σxx = E·ε = 210000 ·
 * 0.1/100 = 210, σyy = τxy = 0 (Hooke's law; Timoshenko & Goodier 1970 §2), reproduced exactly by
 * both element orders (constant strain: patch test, Irons), and the reactions balance each other.
 */
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { buildGeometry } from '../../src/geometry/index.js';
import { meshPlate, sizeFieldFromSettings } from '../../src/mesh/index.js';
import { gaussStresses, solvePlate } from '../../src/fem/index.js';
import { ModelError } from '../../src/errors.js';

const text = (loads: string, right: string) => `
material: { E: 210000, nu: 0.3 }
thickness: 4
plate: { outline: [[0, 0], [100, 0], [100, 20], [0, 20]] }
supports:
  - { where: { x: 0 }, fix: [x] }
  - { where: { point: [0, 0] }, fix: [y] }
  - ${right}
loads: ${loads}
mesh: { size: 6, order: 2 }
`;

describe('a model driven by prescribed displacements alone', () => {
  it.each([1, 2] as const)('order %i: σxx = Eε exactly, σyy = τxy = 0, reactions self-balanced', (order) => {
    const model = parseModel(text('[]', '{ where: { x: 100 }, displace: [0.1, null] }'), 'pull.yaml');
    expect(model.loads).toEqual([]);
    const geometry = buildGeometry(model.plate);
    const mesh = meshPlate(geometry, { sizeAt: sizeFieldFromSettings(geometry, model.mesh), order, requiredPoints: [[0, 0]] });
    const section = { E: 210000, nu: 0.3, state: 'plane-stress' as const, thickness: 4 };
    const s = solvePlate({ mesh, geometry, section, supports: model.supports, loads: model.loads });
    const g = gaussStresses(mesh, s.u, section);
    let worst = 0;
    for (let k = 0; k < g.weight.length; k++) {
      worst = Math.max(worst, Math.abs(g.stress[3 * k] - 210), Math.abs(g.stress[3 * k + 1]), Math.abs(g.stress[3 * k + 2]));
    }
    expect(worst / 210).toBeLessThan(1e-9);
    // the pulling edge carries σxx·area = 210 · 20 · 4 = 16800; the held edge the opposite
    expect(Math.abs(s.reactionSum[0])).toBeLessThan(1e-6 * 16800);
    expect(s.appliedSum).toEqual([0, 0]);
  });

  it('an empty load list without a prescribed displacement is still an error', () => {
    expect(() => parseModel(text('[]', '{ where: { x: 100 }, fix: [y] }'), 'none.yaml')).toThrow(ModelError);
    expect(() => parseModel(text('[]', '{ where: { x: 100 }, fix: [y] }'), 'none.yaml')).toThrow(/at least one load/);
  });
});
