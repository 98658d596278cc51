import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { problemOf, solveProblem } from '../../src/pipeline/index.js';
import { axisymmetricMatrix, axisymmetricStiffness, axisymmetricGaussStresses } from '../../src/fem/axisymmetric.js';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';

/** nearest Gauss point of a solved level to (r, z): index */
function nearestGauss(xy: Float64Array, r: number, z: number): number {
  let best = 0, dBest = Infinity;
  for (let k = 0; k < xy.length / 2; k++) {
    const d = Math.hypot(xy[2 * k] - r, xy[2 * k + 1] - z);
    if (d < dBest) { dBest = d; best = k; }
  }
  return best;
}

function solveText(text: string) {
  const model = parseModel(text, 'axisym.yaml');
  const problem = problemOf(model);
  const level = solveProblem(problem);
  const g = axisymmetricGaussStresses(level.mesh, level.solution.u, problem.section);
  return { model, level, g };
}

describe('axisymmetric element', () => {
  it('a free ring element has exactly one zero-energy mode (translation along the axis), CST and LST', () => {
    const D = axisymmetricMatrix({ E: 1, nu: 0.3 });
    const cst = [1, 0, 2, 0.2, 1.3, 1];
    const lst = [...cst, 1.5, 0.1, 1.65, 0.6, 1.15, 0.5];
    for (const [xy, n] of [[cst, 3], [lst, 6]] as const) {
      const K = axisymmetricStiffness(xy, n, D);
      const m = new Matrix(2 * n, 2 * n);
      for (let i = 0; i < 2 * n; i++) for (let j = 0; j < 2 * n; j++) m.set(i, j, K[2 * n * i + j]);
      const ev = new EigenvalueDecomposition(m, { assumeSymmetric: true }).realEigenvalues.sort((a, b) => a - b);
      const top = ev[ev.length - 1];
      expect(Math.abs(ev[0])).toBeLessThan(1e-12 * top);
      expect(ev[1]).toBeGreaterThan(1e-6 * top);
    }
  });
});

/*
 * Thick cylinder under internal pressure p with closed ends: Lamé (1852); Timoshenko & Goodier,
 * Theory of Elasticity (1970) §33; Young & Budynas, Roark's Formulas for Stress and Strain, 7th ed.
 * (2002) Table 13.5 case 1c [memory for the table number]:
 *   σr = A − B/r², σθ = A + B/r², σz = A, A = p a²/(b² − a²), B = p a² b²/(b² − a²).
 * Modelled as a ring a ≤ r ≤ b, 0 ≤ z ≤ L, held in z on z = 0, the end cap's pull as the uniform
 * traction A on z = L; the exact field is then the Lamé field along the whole length.
 */
const cyl = { a: 10, b: 20, L: 10, p: 100, E: 200000, nu: 0.3 };
const lameA = (cyl.p * cyl.a ** 2) / (cyl.b ** 2 - cyl.a ** 2);
const lameB = (cyl.p * cyl.a ** 2 * cyl.b ** 2) / (cyl.b ** 2 - cyl.a ** 2);
const cylinderText = (order: 1 | 2, size: number) => `
title: thick cylinder, closed ends
material: { E: ${cyl.E}, nu: ${cyl.nu} }
state: axisymmetric
plate:
  outline: [[${cyl.a}, 0], [${cyl.b}, 0], [${cyl.b}, ${cyl.L}], [${cyl.a}, ${cyl.L}]]
supports:
  - { where: { y: 0 }, fix: [y] }
loads:
  - { where: { x: ${cyl.a} }, pressure: ${cyl.p} }
  - { where: { y: ${cyl.L} }, traction: [0, ${lameA}] }
mesh: { size: ${size}, order: ${order} }
`;

describe('thick cylinder, closed ends (Lamé)', () => {
  // measured largest errors / p over the four components at both radii: LST 1.4e-3, CST 3.2e-2
  // (centroid values of the element next to the bore); u_r(a): LST 5.7e-5, CST 7.5e-4
  it.each([[2, 1.25, 5e-3, 3e-4], [1, 0.625, 8e-2, 3e-3]] as const)('order %i: σr, σθ, σz at Gauss points near both radii, u_r(a)', (order, size, tol, tolU) => {
    const { level, g } = solveText(cylinderText(order, size));
    for (const r0 of [cyl.a, cyl.b]) {
      const k = nearestGauss(g.xy, r0, cyl.L / 2);
      const r = g.xy[2 * k];
      const st = lameA + lameB / r ** 2;
      const sr = lameA - lameB / r ** 2;
      expect(Math.abs(g.hoop[k] - st) / cyl.p).toBeLessThan(tol);
      expect(Math.abs(g.stress[3 * k] - sr) / cyl.p).toBeLessThan(tol);
      expect(Math.abs(g.stress[3 * k + 1] - lameA) / cyl.p).toBeLessThan(tol);
      expect(Math.abs(g.stress[3 * k + 2]) / cyl.p).toBeLessThan(tol);
    }
    // axial balance for the whole revolution: the end traction's total force A·π(b² − a²) = p π a²
    expect(level.solution.appliedSum[1]).toBeCloseTo(cyl.p * Math.PI * cyl.a ** 2, 6);
    expect(level.solution.reactionSum[1]).toBeCloseTo(-cyl.p * Math.PI * cyl.a ** 2, 6);
    // u_r(a) = a (σθ − ν(σr + σz))/E
    const ua = (cyl.a * (lameA + lameB / cyl.a ** 2 - cyl.nu * (lameA - lameB / cyl.a ** 2 + lameA))) / cyl.E;
    let n = 0;
    for (let i = 0; i < level.mesh.xy.length / 2; i++) if (level.mesh.xy[2 * i] === cyl.a && level.mesh.xy[2 * i + 1] === 0) n = i;
    expect(Math.abs(level.solution.u[2 * n] / ua - 1)).toBeLessThan(tolU);
  });
});
