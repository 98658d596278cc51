/**
 * Temperature loads (issue 14, point 5) through the public pipeline: `material.expansion` and
 * `temperature` parsed from YAML, solved by problemOf / solveProblem. The stresses are those in the
 * material (total strain minus αΔT), and σzz = ν(σxx + σyy) − EαΔT in plane strain.
 *
 * Closed forms (Hooke's law with the free thermal strain αΔT, e.g. Timoshenko & Goodier, Theory of
 * Elasticity, 3rd ed., 1970, ch. 13; the restrained-plate values derived in docs/fem.md):
 * - a free plate under a uniform or linear ΔT expands without stress (a linear ΔT gives compatible
 *   strains); in plane strain σzz = −EαΔT remains;
 * - plane stress, x held and y free: σxx = −EαΔT; both held: σxx = σyy = −EαΔT/(1 − ν);
 * - plane strain, x held and y free: σxx = −EαΔT/(1 − ν); both: −EαΔT/(1 − 2ν); σzz equal to them.
 */
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { problemOf, solveProblem, type SolvedLevel } from '../../src/pipeline/index.js';
import { loadVector, appliedResultant } from '../../src/fem/index.js';
import { meshPlate, sizeFieldFromSettings } from '../../src/mesh/index.js';

const E = 210000, NU = 0.3, ALPHA = 1.2e-5, DT = 80;
const THERMAL = E * ALPHA * DT; // 201.6 MPa

const FREE = `
  - { where: { point: [0, 0] }, fix: [x, y] }
  - { where: { point: [120, 0] }, fix: [y] }`;
const X_HELD = `
  - { where: { x: 0 }, fix: [x] }
  - { where: { x: 120 }, fix: [x] }
  - { where: { point: [0, 0] }, fix: [y] }`;
const BOTH_HELD = `
  - { where: { x: 0 }, fix: [x] }
  - { where: { x: 120 }, fix: [x] }
  - { where: { y: 0 }, fix: [y] }
  - { where: { y: 60 }, fix: [y] }`;

function plate(state: string, supports: string, temperature: string, order = 2): string {
  return `
title: warm plate
material: { E: ${E}, nu: ${NU}, expansion: ${ALPHA} }
thickness: 5
state: ${state}
plate:
  outline: { rect: { center: [60, 30], width: 120, height: 60 } }
supports:${supports}
loads:
  - temperature: ${temperature}
mesh: { size: 12, order: ${order} }
`;
}

function solve(yaml: string): SolvedLevel {
  return solveProblem(problemOf(parseModel(yaml, 'warm.yaml')));
}

/** Largest |Gauss value − expected| over every Gauss point, per component (σxx, σyy, τxy, σzz). */
function gaussDeviation(level: SolvedLevel, expected: readonly [number, number, number, number]): number[] {
  const { stress, szz } = level.gauss;
  const d = [0, 0, 0, 0];
  for (let k = 0; k < szz.length; k++) {
    for (let c = 0; c < 3; c++) d[c] = Math.max(d[c], Math.abs(stress[3 * k + c] - expected[c]));
    d[3] = Math.max(d[3], Math.abs(szz[k] - expected[3]));
  }
  return d;
}

/** Largest |nodal value − expected| of the recovered field (σxx, σyy, τxy, σzz). */
function nodalDeviation(level: SolvedLevel, expected: readonly [number, number, number, number]): number[] {
  const { stress, szz } = level.field;
  const d = [0, 0, 0, 0];
  for (let n = 0; n < szz.length; n++) {
    for (let c = 0; c < 3; c++) d[c] = Math.max(d[c], Math.abs(stress[3 * n + c] - expected[c]));
    d[3] = Math.max(d[3], Math.abs(szz[n] - expected[3]));
  }
  return d;
}

describe('free plate: a uniform or linear ΔT causes no in-plane stress', () => {
  it.each([1, 2])('uniform ΔT, plane stress, order %i: zero stress; the expansion is αΔT', (order) => {
    const level = solve(plate('plane-stress', FREE, String(DT), order));
    // measured: ≤ 1e−13 of EαΔT (round-off), Gauss points and recovered nodes; tolerance 2e−12
    for (const d of [...gaussDeviation(level, [0, 0, 0, 0]), ...nodalDeviation(level, [0, 0, 0, 0])]) expect(d / THERMAL).toBeLessThan(2e-12);
    // free expansion: the far corner moves by αΔT·(120, 60)
    const { xy } = level.mesh;
    const n = [...Array(xy.length / 2).keys()].find((i) => xy[2 * i] === 120 && xy[2 * i + 1] === 60)!;
    expect(level.solution.u[2 * n]).toBeCloseTo(ALPHA * DT * 120, 12);
    expect(level.solution.u[2 * n + 1]).toBeCloseTo(ALPHA * DT * 60, 12);
  });

  it('linear ΔT in x and y, plane stress, LST: zero stress (the strains αΔT are compatible and lie in the LST space)', () => {
    const level = solve(plate('plane-stress', FREE, '"40 + 0.5*x - 0.8*y"'));
    // round-off (tolerance 2e−12, as the uniform cases, which measure ≤ 3e−13)
    const scale = E * ALPHA * 100;
    for (const d of gaussDeviation(level, [0, 0, 0, 0])) expect(d / scale).toBeLessThan(2e-12);
  });

  it('linear ΔT on CST: the constant-strain element cannot follow a linear thermal strain; the spurious stress falls at first order', () => {
    const scale = E * ALPHA * 100;
    const worst = [12, 6].map((h) => {
      const level = solve(plate('plane-stress', FREE, '"40 + 0.5*x - 0.8*y"', 1).replace('size: 12', `size: ${h}`));
      let m = 0;
      for (const v of level.gauss.stress) m = Math.max(m, Math.abs(v));
      return m / scale;
    });
    // measured: 4.4 % at h = 12, 2.3 % at h = 6 (1.3 % at h = 3) of Eα·100
    expect(worst[1]).toBeLessThan(0.035);
    expect(worst[1] / worst[0]).toBeLessThan(0.65);
  });

  it('uniform ΔT, plane strain: no in-plane stress, σzz = −EαΔT at every Gauss point and node', () => {
    for (const order of [1, 2]) {
      const level = solve(plate('plane-strain', FREE, String(DT), order));
      const want = [0, 0, 0, -THERMAL] as const;
      // measured: ≤ 3e−13 of EαΔT; tolerance 2e−12
      for (const d of [...gaussDeviation(level, want), ...nodalDeviation(level, want)]) expect(d / THERMAL).toBeLessThan(2e-12);
    }
  });

  it('linear ΔT, plane strain, LST: σzz = −EαΔT(x, y) follows the temperature, in-plane stress zero', () => {
    const level = solve(plate('plane-strain', FREE, '"40 + 0.5*x - 0.8*y"'));
    const { xy, stress, szz } = level.gauss;
    let inPlane = 0, out = 0;
    for (let k = 0; k < szz.length; k++) {
      const dT = 40 + 0.5 * xy[2 * k] - 0.8 * xy[2 * k + 1];
      inPlane = Math.max(inPlane, Math.abs(stress[3 * k]), Math.abs(stress[3 * k + 1]), Math.abs(stress[3 * k + 2]));
      out = Math.max(out, Math.abs(szz[k] + E * ALPHA * dT));
    }
    // round-off (tolerance 2e−12)
    expect(inPlane / (E * ALPHA * 100)).toBeLessThan(2e-12);
    expect(out / (E * ALPHA * 100)).toBeLessThan(2e-12);
    // the recovered σzz reproduces the linear field at the nodes too (SPR is exact for a linear field)
    const nodes = level.mesh.xy;
    let nodal = 0;
    for (let n = 0; n < level.field.szz.length; n++) {
      const dT = 40 + 0.5 * nodes[2 * n] - 0.8 * nodes[2 * n + 1];
      nodal = Math.max(nodal, Math.abs(level.field.szz[n] + E * ALPHA * dT));
    }
    expect(nodal / (E * ALPHA * 100)).toBeLessThan(2e-12);
  });
});

describe('restrained plate, uniform ΔT (Hooke\'s law with the thermal strain)', () => {
  const cases = [
    { name: 'plane stress, x held, y free: σxx = −EαΔT', state: 'plane-stress', supports: X_HELD, want: [-THERMAL, 0, 0, 0] },
    { name: 'plane stress, both held: σxx = σyy = −EαΔT/(1 − ν)', state: 'plane-stress', supports: BOTH_HELD, want: [-THERMAL / (1 - NU), -THERMAL / (1 - NU), 0, 0] },
    {
      name: 'plane strain, x held, y free: σxx = σzz = −EαΔT/(1 − ν)', state: 'plane-strain', supports: X_HELD,
      want: [-THERMAL / (1 - NU), 0, 0, -THERMAL / (1 - NU)],
    },
    {
      name: 'plane strain, both held: σxx = σyy = σzz = −EαΔT/(1 − 2ν)', state: 'plane-strain', supports: BOTH_HELD,
      want: [-THERMAL / (1 - 2 * NU), -THERMAL / (1 - 2 * NU), 0, -THERMAL / (1 - 2 * NU)],
    },
  ] as const;
  it.each(cases)('$name', ({ state, supports, want }) => {
    for (const order of [1, 2]) {
      const level = solve(plate(state, supports, String(DT), order));
      // measured: ≤ 1.1e−13 of EαΔT (a uniform state, which both elements represent exactly); tolerance 2e−12
      for (const d of [...gaussDeviation(level, want), ...nodalDeviation(level, want)]) expect(d / THERMAL).toBeLessThan(2e-12);
      // von Mises of the recovered field uses σzz: in plane strain with both held the state is hydrostatic
      if (state === 'plane-strain' && supports === BOTH_HELD) expect(Math.max(...level.nodal) / THERMAL).toBeLessThan(2e-12);
    }
  });
});

describe('thermal load vector', () => {
  it('is self-equilibrated, and two temperature loads add', () => {
    const model = parseModel(plate('plane-stress', FREE, '"40 + 0.5*x"'), 'warm.yaml');
    const problem = problemOf(model);
    const mesh = meshPlate(problem.geometry, { sizeAt: sizeFieldFromSettings(problem.geometry, problem.meshSettings), order: 2, requiredPoints: problem.requiredPoints });
    const one = loadVector(mesh, problem.geometry, problem.section, problem.loads);
    const [fx, fy] = appliedResultant(one);
    let size = 0;
    for (const v of one) size += Math.abs(v);
    // round-off
    expect(Math.abs(fx) / size).toBeLessThan(1e-12);
    expect(Math.abs(fy) / size).toBeLessThan(1e-12);
    const split = loadVector(mesh, problem.geometry, problem.section, [
      { kind: 'temperature', temperature: 40, keyPath: 'loads[0]' },
      { kind: 'temperature', temperature: { expression: '0.5*x', params: {} }, keyPath: 'loads[1]' },
    ]);
    let diff = 0;
    for (let i = 0; i < one.length; i++) diff = Math.max(diff, Math.abs(one[i] - split[i]));
    expect(diff / size).toBeLessThan(1e-14);
  });
});
