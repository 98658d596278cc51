import { describe, expect, it } from 'vitest';
import { pressureLoad, solvePlate, type ElasticSection } from '../../src/fem/index.js';
import { lameRadialDisplacement } from './helpers/closed-form.js';
import { nodeAt } from './helpers/exact.js';
import { quarterAnnulusGeometry, quarterAnnulusMesh } from './helpers/meshes.js';
import { edgesOfPieces, rollersOnAxes } from './helpers/problems.js';

/*
 * Lamé (1852); Timoshenko & Goodier (1970) §28 [memory for the section]: thick ring a = 1, b = 2
 * under internal pressure p = 1, E = 1000, ν = 0.3, as a symmetric quarter with rollers on both
 * cut edges. u_r(a) = 1.966667e−3 (plane stress),
 * 1.906667e−3 (plane strain); u_r(b) = 1.333333e−3, 1.213333e−3 [derived from the closed form].
 * Mid-side nodes of the LST sit on the true circles (isoparametric curved edges).
 */
const a = 1, b = 2, p = 1, E = 1000, nu = 0.3;

function solveQuarterRing(state: ElasticSection['state'], nr: number, nt: number, order: 1 | 2) {
  const section: ElasticSection = { E, nu, state, thickness: 1 };
  const mesh = quarterAnnulusMesh(a, b, nr, nt, order);
  const geometry = quarterAnnulusGeometry(a, b);
  // the bore is piece 3 of the hand-made geometry (no selector spells a part of the outline by piece)
  const extraLoad = pressureLoad(mesh, edgesOfPieces(mesh, [3]), 1, p);
  const solution = solvePlate({ mesh, geometry, section, supports: rollersOnAxes, loads: [], extraLoad });
  return { mesh, solution };
}

describe.each(['plane-stress', 'plane-strain'] as const)('Lamé thick ring, %s', (state) => {
  it('closed form matches the values derived by hand', () => {
    expect(lameRadialDisplacement(a, b, p, E, nu, state, 1)).toBeCloseTo(state === 'plane-stress' ? 1.966667e-3 : 1.906667e-3, 9);
    expect(lameRadialDisplacement(a, b, p, E, nu, state, 2)).toBeCloseTo(state === 'plane-stress' ? 1.333333e-3 : 1.213333e-3, 9);
  });

  it('LST 8 × 16: u_r at a and b within 0.2 %', () => {
    const { mesh, solution } = solveQuarterRing(state, 8, 16, 2);
    // issue acceptance 0.5 % (0.2 % is common practice with ≥ 8 elements through the wall)
    for (const [x, y, r] of [[a, 0, a], [0, a, a], [b, 0, b], [a / Math.SQRT2, a / Math.SQRT2, a]]) {
      const n = nodeAt(mesh, x, y);
      const ur = Math.hypot(solution.u[2 * n], solution.u[2 * n + 1]);
      expect(Math.abs(ur / lameRadialDisplacement(a, b, p, E, nu, state, r) - 1)).toBeLessThan(0.002);
    }
    // the pressure on the quarter bore has resultant p·a·(1, 1), balanced by the rollers
    expect(solution.appliedSum[0]).toBeCloseTo(p * a, 12);
    expect(solution.appliedSum[1]).toBeCloseTo(p * a, 12);
    expect(Math.abs(solution.reactionSum[0] + solution.appliedSum[0])).toBeLessThan(1e-9 * p * a);
    expect(Math.abs(solution.reactionSum[1] + solution.appliedSum[1])).toBeLessThan(1e-9 * p * a);
  });

  it('CST 16 × 32: u_r(a) within 1 %', () => {
    // 1 % for CST with ≥ 16 elements through the wall [common practice]
    const { mesh, solution } = solveQuarterRing(state, 16, 32, 1);
    const n = nodeAt(mesh, a, 0);
    expect(Math.abs(solution.u[2 * n] / lameRadialDisplacement(a, b, p, E, nu, state, a) - 1)).toBeLessThan(0.01);
  });
});
