/**
 * Superposition of load cases (issue 14 part B, acceptance): every case is a right-hand side of one
 * factorisation, and a combination is the factored sum of its cases' results, never solved again.
 * Independent checks: (1) the combination against the factored sum, computed here from the case
 * results; (2) the combination against a separate solve of one model carrying the factored loads and
 * displacements (linear elasticity: the same system, a different right-hand side); (3) ten cases on one
 * factor against ten separate solves.
 */
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { problemOf, solveProblem, meshAt, baseSizeField, solveMesh } from '../../src/pipeline/index.js';
import { solvePlate, solvePlateCases } from '../../src/fem/index.js';
import type { Load } from '../../src/model/types.js';

const HEAD = `
title: bracket with a hole under two cases
material: { E: 210000, nu: 0.3 }
thickness: 2
plate:
  outline: [[0, 0], [100, 0], [100, 60], [0, 60]]
  openings: [ { id: hole, circle: { center: [50, 30], radius: 8 } } ]
mesh: { size: 8, order: 2 }
`;
const CASES = HEAD + `
supports:
  - { where: { x: 0 }, fix: [x, y] }
  - { id: jack, where: { point: [100, 0] }, displace: [null, 0] }
cases:
  up: [ { where: { y: 60 }, traction: [0, 20] } ]
  side: { loads: [ { where: { x: 100 }, traction: [30, 0] }, { where: { opening: hole }, pressure: 5 } ], displace: { jack: [null, -0.01] } }
combinations:
  both: "1.35*up - 0.8*side"
`;
// the same plate with the loads of 1.35·up − 0.8·side in one list and the jack at −0.8·(−0.01)
const COMBINED = HEAD + `
supports:
  - { where: { x: 0 }, fix: [x, y] }
  - { where: { point: [100, 0] }, displace: [null, 0.008] }
loads:
  - { where: { y: 60 }, traction: [0, 27] }
  - { where: { x: 100 }, traction: [-24, 0] }
  - { where: { opening: hole }, pressure: -4 }
`;

/** max |a − b| / max |b| */
function relDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let d = 0, s = 0;
  for (let i = 0; i < b.length; i++) { d = Math.max(d, Math.abs(a[i] - b[i])); s = Math.max(s, Math.abs(b[i])); }
  return d / s;
}

describe('load cases on one factorisation', () => {
  const model = parseModel(CASES, 'cases.yaml');
  const problem = problemOf(model);
  const level = solveProblem(problem);
  const [up, side, both] = level.sets;

  it('carries every case then every combination; the level\'s own fields are the first case\'s', () => {
    expect(level.sets.map((s) => [s.name, s.kind])).toEqual([['up', 'case'], ['side', 'case'], ['both', 'combination']]);
    expect(level.solution).toBe(up.solution);
    expect(level.field).toBe(up.field);
  });

  it('a combination equals the factored sum of its case solutions (u, reactions, Gauss and nodal stresses) to 1e-12 relative', () => {
    const sum = (a: Float64Array, b: Float64Array) => a.map((v, i) => 1.35 * v - 0.8 * b[i]);
    // the superposition is the same arithmetic done here, so the difference is round-off alone (measured 0)
    expect(relDiff(both.solution.u, sum(up.solution.u, side.solution.u))).toBeLessThan(1e-12);
    expect(relDiff(both.solution.reaction, sum(up.solution.reaction, side.solution.reaction))).toBeLessThan(1e-12);
    expect(relDiff(both.gauss.stress, sum(up.gauss.stress, side.gauss.stress))).toBeLessThan(1e-12);
    expect(relDiff(both.field.stress, sum(up.field.stress, side.field.stress))).toBeLessThan(1e-12);
    // von Mises is not linear: the combination's measure comes from its own field, not a sum of measures
    const s = both.field.stress;
    const n = 7;
    const vm = Math.sqrt(s[3 * n] ** 2 - s[3 * n] * s[3 * n + 1] + s[3 * n + 1] ** 2 + 3 * s[3 * n + 2] ** 2);
    expect(Math.abs(both.nodal[n] - vm)).toBeLessThan(1e-12 * vm);
  });

  it('the combination equals one solve of the factored loads and displacements on the same mesh (to round-off)', () => {
    const combined = problemOf(parseModel(COMBINED, 'combined.yaml'));
    const again = solveMesh(combined, level.mesh);
    // different right-hand side, same K and factor: measured 1e-15 on u, 1.4e-14 on the stresses, 6e-15 on von Mises
    expect(relDiff(both.solution.u, again.solution.u)).toBeLessThan(1e-12);
    expect(relDiff(both.field.stress, again.field.stress)).toBeLessThan(1e-12);
    expect(relDiff(both.nodal, again.nodal)).toBeLessThan(1e-12);
    expect(relDiff(both.solution.reactionSum, again.solution.reactionSum)).toBeLessThan(1e-12);
  });

  it('ten cases on one factor equal ten separate solves', () => {
    const mesh = meshAt(problem, baseSizeField(problem), 2);
    const loads = (k: number): Load[] => [
      { kind: 'traction', where: { kind: 'y', value: 60 }, traction: [k, 20 - k], keyPath: `t${k}` },
      { kind: 'pressure', where: { kind: 'opening', id: 'hole' }, pressure: k - 4, keyPath: `p${k}` },
    ];
    const cases = Array.from({ length: 10 }, (_, k) => ({
      loads: loads(k),
      supports: model.cases![1].supports.map((s) => (s.displace ? { ...s, displace: { kind: 'values' as const, y: 0.001 * k } } : s)),
    }));
    const base = { mesh, geometry: problem.geometry, section: problem.section, supports: [], loads: [] };
    const together = solvePlateCases(base, cases);
    cases.forEach((c, k) => {
      const alone = solvePlate({ ...base, supports: c.supports, loads: c.loads });
      // the same factor and the same sweep arithmetic per column: measured 0 (bit for bit)
      expect(relDiff(together[k].u, alone.u)).toBeLessThan(1e-14);
      expect(relDiff(together[k].reaction, alone.reaction)).toBeLessThan(1e-14);
    });
  });
});

describe('a combination with a temperature case', () => {
  // the stresses of a thermal case are D(Bu − ε₀): linear in (u, ΔT) together, so a combination's are
  // still the factored sum, and equal one solve of the factored loads (ΔT scaled alike)
  const head = HEAD.replace('material: { E: 210000, nu: 0.3 }', 'material: { E: 210000, nu: 0.3, expansion: 1.2e-5 }') + `
supports:
  - { where: { x: 0 }, fix: [x, y] }
`;
  const withCases = head + `
cases:
  warm: [ { temperature: "30 + 0.5 * x" } ]
  pull: [ { where: { x: 100 }, traction: [40, 0] } ]
combinations:
  both: "2*warm - 0.5*pull"
`;
  const once = head + `
loads:
  - { temperature: "60 + x" }
  - { where: { x: 100 }, traction: [-20, 0] }
`;
  it('equals one solve of 2·ΔT and −0.5·traction, stresses included (to round-off)', () => {
    const problem = problemOf(parseModel(withCases, 'warm.yaml'));
    const level = solveProblem(problem);
    const both = level.sets[2];
    const again = solveMesh(problemOf(parseModel(once, 'once.yaml')), level.mesh);
    // measured 2e-15 (u), 9e-14 (Gauss stresses: σ = D(Bu − ε₀) cancels in part), 4e-14 (recovered), 2e-14 (von Mises)
    expect(relDiff(both.solution.u, again.solution.u)).toBeLessThan(1e-12);
    expect(relDiff(both.gauss.stress, again.gauss.stress)).toBeLessThan(1e-12);
    expect(relDiff(both.field.stress, again.field.stress)).toBeLessThan(1e-12);
    expect(relDiff(both.nodal, again.nodal)).toBeLessThan(1e-12);
  });
});
