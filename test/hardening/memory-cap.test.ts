/**
 * The memory check before factorising (issue 8, limits): after the symbolic analysis the solver
 * knows the number of stored factor entries exactly, so a cap below that refuses the solve with a
 * message giving the size and how to coarsen, and a cap above it lets the same solve through.
 */
import { describe, expect, it } from 'vitest';
import { SolveError } from '../../src/errors.js';
import { parseModel } from '../../src/model/index.js';
import { buildGeometry } from '../../src/geometry/index.js';
import { meshPlate, sizeFieldFromSettings } from '../../src/mesh/index.js';
import { solvePlate } from '../../src/fem/index.js';

const model = parseModel(`
material: { E: 210000, nu: 0.3 }
thickness: 5
plate: { outline: [[0, 0], [100, 0], [100, 40], [0, 40]] }
supports: [ { where: { x: 0 }, fix: [x, y] } ]
loads: [ { where: { x: 100 }, traction: [10, 0] } ]
mesh: { size: 4, order: 2 }
`, 'cap.yaml');
const geometry = buildGeometry(model.plate);
const mesh = meshPlate(geometry, { sizeAt: sizeFieldFromSettings(geometry, model.mesh), order: 2 });
const section = { E: 210000, nu: 0.3, state: 'plane-stress' as const, thickness: 5 };
const problem = { mesh, geometry, section, supports: model.supports, loads: model.loads };

describe('memory cap before factorising', () => {
  it('a factor larger than the cap is refused with its size and a way to coarsen', () => {
    const solved = solvePlate(problem);
    // the factor holds at least nnz(L) doubles: 8 bytes each; a cap of half that must refuse
    const cap = 4 * solved.nnzL;
    let err: unknown;
    try {
      solvePlate({ ...problem, maxFactorBytes: cap });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(SolveError);
    expect((err as SolveError).message).toMatch(/needs about .* of memory, above the .* allowed; coarsen the mesh/);
    expect((err as SolveError).keyPath).toBe('mesh.size');
  });
  it('a cap well above the factor lets the same solve through unchanged', () => {
    const free = solvePlate(problem);
    const capped = solvePlate({ ...problem, maxFactorBytes: 64 * free.nnzL });
    expect(capped.maxDisplacement).toBe(free.maxDisplacement);
  });
});
