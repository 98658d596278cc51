/**
 * Issue 19, class 5: two supports holding one dof at different values are an error naming both
 * entries (before, the later `displace` or any `displace` over a `fix` silently won, and the
 * stresses changed with the order of the list). Equal values held twice are fine.
 */
import { describe, expect, it } from 'vitest';
import { FemError } from '../../src/errors.js';
import { gaussStresses } from '../../src/fem/index.js';
import { formatModelError, parseModel } from '../../src/model/index.js';
import { solveModel } from './issue9-helpers.js';

const strap = (supports: string[]) => parseModel([
  'material: { E: 70000, nu: 0.33 }', 'thickness: 2',
  'plate:', '  outline: [[0, 0], [80, 0], [80, 40], [0, 40]]',
  'supports:', ...supports.map((s) => `  - ${s}`),
  'loads: []', 'mesh: { size: 8, order: 2 }',
].join('\n'), 'strap.yaml');

function caught(f: () => unknown): FemError {
  try {
    f();
  } catch (e) {
    if (e instanceof FemError) return e;
    throw e;
  }
  throw new Error('expected a FemError');
}

describe('conflicting prescriptions on one node', () => {
  const fix = '{ where: { y: 0 }, fix: [y] }';
  const left = '{ where: { x: 0 }, fix: [x] }';
  const pull = '{ where: { x: 80 }, displace: [0.04, 0.01] }';

  it('a fix and a non-zero displace on one dof: names both, in either order of the list', () => {
    for (const order of [[fix, left, pull], [pull, left, fix]]) {
      const model = strap(order);
      const e = caught(() => solveModel(model));
      const iFix = order.indexOf(fix), iPull = order.indexOf(pull);
      expect(e.message).toContain('u_y of the node at (80, 0)');
      expect(e.message).toContain(`supports[${iFix}] fixes it (u_y = 0)`);
      expect(e.message).toContain(`supports[${iPull}] prescribes u_y = 0.01`);
      // the later entry carries the key path, the earlier one is related (the CLI adds its line)
      expect(e.keyPath).toBe(`supports[${Math.max(iFix, iPull)}]`);
      expect(e.related).toEqual([`supports[${Math.min(iFix, iPull)}]`]);
      const line = formatModelError(e, 'strap.yaml', model);
      expect(line).toMatch(new RegExp(`^strap\\.yaml:${6 + Math.max(iFix, iPull)}:\\d+ supports\\[${Math.max(iFix, iPull)}\\]: `));
      expect(line).toContain(`(supports[${Math.min(iFix, iPull)}] is at line ${6 + Math.min(iFix, iPull)})`);
    }
  });

  it('two displacements that differ at a shared corner', () => {
    const e = caught(() => solveModel(strap([left, '{ where: { point: [0, 0] }, fix: [y] }',
      '{ where: { x: 80 }, displace: { x: 0.04 } }', '{ where: { y: 40 }, displace: { x: "0.0004 * x" } }'])));
    expect(e.message).toContain('supports[2] prescribes u_x = 0.04, supports[3] prescribes u_x = 0.032');
  });

  it('equal values held twice are fine: uniform stretch gives σxx = E·ε exactly', () => {
    // u_x = ε·x on the right, top and bottom edges, u_x = 0 on the left: the corners are held by two
    // entries each, at equal values (0.0005·80 = 0.04, 0.0005·0 = 0). The exact field is uniaxial
    // stress σxx = E ε, σyy = σxy = 0 (lateral contraction free), which LST reproduces to rounding
    // (patch test)
    const eps = 0.0005;
    const model = strap([left, '{ where: { point: [0, 0] }, fix: [y] }', '{ where: { x: 80 }, displace: { x: 0.04 } }',
      `{ where: { y: 40 }, displace: { x: "${eps} * x" } }`, `{ where: { y: 0 }, displace: { x: "${eps} * x" } }`]);
    const { mesh, solution } = solveModel(model);
    const g = gaussStresses(mesh, solution.u, { E: 70000, nu: 0.33, state: 'plane-stress' });
    let worst = 0;
    for (let k = 0; k < g.stress.length / 3; k++) {
      worst = Math.max(worst, Math.abs(g.stress[3 * k] - 70000 * eps), Math.abs(g.stress[3 * k + 1]), Math.abs(g.stress[3 * k + 2]));
    }
    expect(worst).toBeLessThan(1e-9 * 70000 * eps);
  });
});
