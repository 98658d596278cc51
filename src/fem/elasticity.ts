import type { ElasticSection } from './types.js';

/**
 * Isotropic plane elasticity matrix D (3×3, row-major) mapping the strain vector
 * {εx, εy, γxy} (engineering shear strain) to the stress vector {σx, σy, τxy}.
 *
 * Any elasticity text, e.g. Timoshenko & Goodier, "Theory of Elasticity", 3rd ed. (1970);
 * Cook, Malkus, Plesha & Witt, "Concepts and Applications of Finite Element Analysis", 4th ed. (2002):
 *   plane stress  D = E/(1 − ν²) · [[1, ν, 0], [ν, 1, 0], [0, 0, (1 − ν)/2]]
 *   plane strain  D = E/((1 + ν)(1 − 2ν)) · [[1 − ν, ν, 0], [ν, 1 − ν, 0], [0, 0, (1 − 2ν)/2]]
 */
export function elasticityMatrix(section: Pick<ElasticSection, 'E' | 'nu' | 'state'>): Float64Array {
  const { E, nu } = section;
  const D = new Float64Array(9);
  if (section.state === 'plane-strain') {
    const c = E / ((1 + nu) * (1 - 2 * nu));
    D[0] = c * (1 - nu);
    D[1] = c * nu;
    D[3] = c * nu;
    D[4] = c * (1 - nu);
    D[8] = c * (1 - 2 * nu) * 0.5;
  } else {
    const c = E / (1 - nu * nu);
    D[0] = c;
    D[1] = c * nu;
    D[3] = c * nu;
    D[4] = c;
    D[8] = c * (1 - nu) * 0.5;
  }
  return D;
}

/**
 * Out-of-plane normal stress implied by the in-plane stresses of a purely mechanical field: 0 in plane
 * stress, ν(σx + σy) in plane strain (εz = 0). With a temperature change, σz = ν(σx + σy) − EαΔT: use
 * the Gauss-point `GaussStresses.szz` (fem/stresses.ts) or the recovered `NodalStress.szz` instead.
 */
export function outOfPlaneStress(section: Pick<ElasticSection, 'nu' | 'state'>, sxx: number, syy: number): number {
  return section.state === 'plane-strain' ? section.nu * (sxx + syy) : 0;
}
