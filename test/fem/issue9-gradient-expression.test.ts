/**
 * Two issue-9 keys checked against closed forms:
 * - a far-field state with a `gradient` (in-plane bending): σxx = −k (y − yc) on both ends of a
 *   plate is pure bending, σxx = −M y/I exactly (Timoshenko & Goodier 1970, §22 "pure bending of
 *   prismatic bars"); the LST reproduces a linear stress field exactly (higher-order patch test), so
 *   every Gauss point must match to round-off;
 * - displacements given as expressions of x and y: the linear field of the MacNeal & Harder (1985)
 *   membrane patch on the whole outline gives the constant stress σx = σy = 1333.333…, τxy = 400
 *   (Irons & Razzaque 1972) everywhere, for CST and LST (Irons patch test B).
 */
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { gaussStresses } from '../../src/fem/index.js';
import { solveModel } from './issue9-helpers.js';

describe('far-field stress with a gradient: pure bending', () => {
  const model = parseModel(`
material: { E: 210000, nu: 0.3 }
thickness: 5
plate: { outline: [[0, 0], [200, 0], [200, 40], [0, 40]] }
supports:
  - { where: { point: [0, 20] }, fix: [x, y] }
  - { where: { point: [200, 20] }, fix: [y] }
loads:
  - { where: { x: 0 }, stress: [0, 0, 0], gradient: { sxx: [0, -1] }, about: [0, 20] }
  - { where: { x: 200 }, stress: [0, 0, 0], gradient: { sxx: [0, -1] }, about: [0, 20] }
mesh: { size: 8, order: 2 }
`, 'bending.yaml');
  const { mesh, solution } = solveModel(model);
  const section = { E: 210000, nu: 0.3, state: 'plane-stress' as const, thickness: 5 };
  const g = gaussStresses(mesh, solution.u, section);

  it('LST: σxx = −(y − 20) at every Gauss point, σyy = τxy = 0 (extreme fibre stress 20)', () => {
    let worst = 0;
    for (let k = 0; k < g.weight.length; k++) {
      const y = g.xy[2 * k + 1];
      worst = Math.max(worst, Math.abs(g.stress[3 * k] + (y - 20)), Math.abs(g.stress[3 * k + 1]), Math.abs(g.stress[3 * k + 2]));
    }
    expect(worst / 20).toBeLessThan(1e-8);
  });
  it('the pure moment loads the neutral-axis supports with nothing', () => {
    const R = Math.hypot(solution.reactionSum[0], solution.reactionSum[1]);
    // Σ|f| is the scale: the end tractions add up to zero force but not to zero magnitude
    const scale = solution.load.reduce((a, f) => a + Math.abs(f), 0);
    expect(R).toBeLessThan(1e-9 * scale);
  });
});

describe('prescribed displacements as expressions of x and y: patch test', () => {
  const text = (order: number) => `
params: { e: 0.001 }
material: { E: 1000000, nu: 0.25 }
thickness: 0.001
plate: { outline: [[0, 0], [0.24, 0], [0.24, 0.12], [0, 0.12]] }
supports:
  - { where: { outline: true }, displace: ["e * (x + y / 2)", "e * (y + x / 2)"] }
loads: []
mesh: { size: 0.03, order: ${order} }
`;
  it.each([1, 2])('order %i: σx = σy = 1333.333, τxy = 400 everywhere (1e-9 relative)', (order) => {
    const model = parseModel(text(order), 'patch.yaml');
    const { mesh, solution } = solveModel(model);
    const g = gaussStresses(mesh, solution.u, { E: 1e6, nu: 0.25, state: 'plane-stress' });
    const sx = (1e6 * 1.25 * 1e-3) / (1 - 0.25 * 0.25); // E(1 + ν)ε/(1 − ν²) = 1333.333…
    let worst = 0;
    for (let k = 0; k < g.weight.length; k++) {
      worst = Math.max(worst, Math.abs(g.stress[3 * k] - sx), Math.abs(g.stress[3 * k + 1] - sx), Math.abs(g.stress[3 * k + 2] - 400));
    }
    expect(sx).toBeCloseTo(1333.3333333, 6);
    expect(worst / sx).toBeLessThan(1e-9);
  });
});
