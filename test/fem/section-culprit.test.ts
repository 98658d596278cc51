/**
 * Issue 19, class 14: a breakdown caused by the section (plane strain near ν = 0.5, an E × thickness
 * out of double range) names that key instead of blaming the supports.
 */
import { describe, expect, it } from 'vitest';
import { SolveError } from '../../src/errors.js';
import { sectionCulprit } from '../../src/fem/health.js';
import { parseModel } from '../../src/model/index.js';
import { solveModel } from './issue9-helpers.js';

const strip = (material: string, thickness: string, state: string) => parseModel([
  `material: ${material}`, `thickness: ${thickness}`, `state: ${state}`,
  'plate:', '  outline: [[0, 0], [100, 0], [100, 40], [0, 40]]',
  'supports: [ { where: { x: 0 }, fix: [x, y] } ]', 'loads: [ { where: { x: 100 }, traction: [1, 0] } ]', 'mesh: { size: 10 }',
].join('\n'), 'strip.yaml');

function failure(f: () => unknown): SolveError {
  try {
    f();
  } catch (e) {
    if (e instanceof SolveError) return e;
    throw e;
  }
  throw new Error('expected a SolveError');
}

describe('a section that breaks the solve is named', () => {
  it('plane strain with ν = 0.5 − 5e-14: material.nu, bulk/shear = 2(1 + ν)/(3(1 − 2ν))', () => {
    const e = failure(() => solveModel(strip('{ E: 5, nu: 0.49999999999995 }', '1', 'plane-strain')));
    expect(e.keyPath).toBe('material.nu');
    // 2·1.5/(3·1e-13) = 1e13
    expect(e.message).toMatch(/bulk stiffness is 1\.0e13 times its shear stiffness/);
    expect(e.message).toContain('the supports are not the cause');
  });
  it('a thickness that makes E × t subnormal: thickness', () => {
    const e = failure(() => solveModel(strip('{ E: 210000, nu: 0.3 }', '1e-320', 'plane-stress')));
    expect(e.keyPath).toBe('thickness');
  });
  it('sound sections, and plane stress near 0.5, are not blamed', () => {
    expect(sectionCulprit({ E: 210000, nu: 0.3, thickness: 5, state: 'plane-strain' })).toBeUndefined();
    expect(sectionCulprit({ E: 5, nu: 0.4999, thickness: 1, state: 'plane-strain' })).toBeUndefined();
    expect(sectionCulprit({ E: 5, nu: 0.49999999999995, thickness: 1, state: 'plane-stress' })).toBeUndefined();
    expect(sectionCulprit({ E: 1e300, nu: 0.3, thickness: 1e10, state: 'plane-stress' })?.keyPath).toBe('material.E');
  });
});
