import { describe, expect, it } from 'vitest';
import { FemError, ModelError, SolveError } from '../../src/errors.js';
import { parseModel } from '../../src/model/index.js';
import { problemOf, solveProblem } from '../../src/pipeline/index.js';

/* The model keys of an axisymmetric section (issue 18) and their errors, each naming its key. */
const base = (over: { outline?: string; extra?: string; supports?: string; loads?: string } = {}) => `
material: { E: 210000, nu: 0.3 }
state: axisymmetric
${over.extra ?? ''}
plate:
  outline: ${over.outline ?? '[[0, 0], [10, 0], [10, 20], [0, 20]]'}
supports:
${over.supports ?? '  - { where: { y: 0 }, fix: [y] }'}
loads:
${over.loads ?? '  - { where: { y: 20 }, traction: [0, 50] }'}
mesh: { size: 2, order: 2 }
`;

function modelError(text: string): ModelError {
  try {
    parseModel(text, 'm.yaml');
  } catch (e) {
    expect(e).toBeInstanceOf(ModelError);
    return e as ModelError;
  }
  throw new Error('expected a ModelError');
}

function solveError(text: string): FemError | SolveError {
  try {
    solveProblem(problemOf(parseModel(text, 'm.yaml')));
  } catch (e) {
    expect(e instanceof FemError || e instanceof SolveError).toBe(true);
    return e as FemError;
  }
  throw new Error('expected an error');
}

describe('state: axisymmetric in the model', () => {
  it('needs no thickness; a thickness given is a warning that it is not used', () => {
    const m = parseModel(base(), 'm.yaml');
    expect(m.state).toBe('axisymmetric');
    expect(m.warnings).toBeUndefined();
    const w = parseModel(base({ extra: 'thickness: 5' }), 'm.yaml');
    expect(w.warnings?.map((x) => x.keyPath)).toEqual(['thickness']);
  });

  it('a plane state still requires the thickness', () => {
    const e = modelError(base().replace('state: axisymmetric', 'state: plane-stress'));
    expect(e.keyPath).toBe('thickness');
  });

  it('material at r < 0 is an error naming the outline vertex', () => {
    const e = modelError(base({ outline: '[[0, 0], [10, 0], [10, 20], [-1, 20]]' }));
    expect(e.keyPath).toBe('plate.outline[3][0]');
    expect(e.message).toMatch(/r = x ≥ 0/);
    expect(modelError(base({ outline: '{ circle: { center: [5, 5], radius: 6 } }' })).keyPath).toBe('plate.outline');
  });

  it('the axis holds u_r by itself: one axial support is enough; none is an error', () => {
    const level = solveProblem(problemOf(parseModel(base(), 'm.yaml')));
    const { xy } = level.mesh;
    for (let n = 0; n < xy.length / 2; n++) if (xy[2 * n] === 0) expect(level.solution.u[2 * n]).toBe(0);
    // the traction's total force σ π R² along the axis, balanced by the support
    expect(level.solution.appliedSum[1]).toBeCloseTo(50 * Math.PI * 100, 6);
    expect(level.solution.reactionSum[1]).toBeCloseTo(-50 * Math.PI * 100, 6);
    const e = solveError(base({ supports: '  - { where: { x: 10 }, fix: [x] }' }));
    expect(e.keyPath).toBe('supports');
    expect(e.message).toMatch(/along the axis/);
  });

  it('a far-field stress, a radial gravity and a spin off the axis are errors naming the load', () => {
    expect(solveError(base({ loads: '  - { where: { y: 20 }, stress: [0, 50, 0] }' })).keyPath).toBe('loads[0]');
    const dense = (l: string) => base({ loads: l }).replace('nu: 0.3 }', 'nu: 0.3, density: 7.85e-9 }');
    expect(solveError(dense('  - { gravity: [9810, 0] }')).keyPath).toBe('loads[0].gravity');
    expect(solveError(dense('  - { spin: { about: [5, 0], omega: 10 } }')).keyPath).toBe('loads[0].spin.about');
  });
});
