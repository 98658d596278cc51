/**
 * The L-plate problem of src/bench/lshape.ts with this folder's own, independent implementation
 * of the exact Williams mode-I field (williams-field.ts), so the test does not check the
 * product's reference code against itself.
 */
import type { GaussStresses } from '../../src/fem/types.js';
import type { PlateGeometry } from '../../src/geometry/types.js';
import type { Mesh } from '../../src/mesh/types.js';
import type { Problem } from '../../src/pipeline/index.js';
import * as L from '../../src/bench/lshape.js';
import { williamsDisplacement, williamsStress } from './williams-field.js';

export { L_SECTION, L_ENERGY, lGeometry, lTrueError, logSlope } from '../../src/bench/lshape.js';
const MU = 1 / (2 * 1.3);
const KAPPA = (3 - 0.3) / (1 + 0.3);

export const TEST_FIELD: L.LField = {
  stress: williamsStress,
  displacement: (x, y) => williamsDisplacement(x, y, MU, KAPPA),
};

export const lTractions = (mesh: Mesh): Float64Array => L.lTractions(mesh, TEST_FIELD);
export const lConstraints = (mesh: Mesh): { dof: number; value: number }[] => L.lConstraints(mesh, TEST_FIELD);
export const lSolve = (mesh: Mesh, geometry: PlateGeometry): { gauss: GaussStresses; dofs: number } => L.lSolve(mesh, geometry, TEST_FIELD);
/** the L-plate problem with this folder's exact field, for the adaptive loop */
export const lProblem = (order: 1 | 2, size: number): Problem => L.lProblem(TEST_FIELD, order, size);
