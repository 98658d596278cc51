/**
 * The error estimate's element integral has the right scale: with the reference field set to
 * zero, ∫ σhᵀ D⁻¹ σh dA summed over the elements (exactError, the 3- or 7-point rule on the
 * element's linear stress fit) must equal the strain-energy norm ‖u_h‖² from the solver's own
 * Gauss points and weights (energyNormSq) — both integrals are exact for the linear (LST) or
 * constant (CST) stresses of straight-sided elements, so they agree to round-off. Before the one
 * reference-element module the 7-point rule's weights summed to 2 and the LST estimate came out
 * twice too large (η √2 too large in percent).
 */
import { describe, expect, it } from 'vitest';
import { energyNormSq, exactError } from '../../src/recovery/index.js';
import { lShapeMesh } from '../../src/bench/lshape-mesh.js';
import { L_SECTION, lSolve } from './lshape-setup.js';

describe('ZZ element integrals against the energy norm', () => {
  for (const order of [1, 2] as const) {
    it(`order ${order}: Σ ∫ σhᵀD⁻¹σh over the elements = ‖u_h‖² to round-off`, () => {
      const { mesh, geometry } = lShapeMesh(3, order);
      const { gauss } = lSolve(mesh, geometry);
      const byElements = exactError(mesh, gauss, L_SECTION, () => [0, 0, 0]).errorSq;
      const energy = energyNormSq(gauss, L_SECTION);
      expect(Math.abs(byElements / energy - 1)).toBeLessThan(1e-12);
    });
  }
});
