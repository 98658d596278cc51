import type { PlaneState } from '../model/types.js';

/**
 * Shear modulus μ and Kolosov constant κ: κ = (3 − ν)/(1 + ν) in plane stress, 3 − 4ν in plane
 * strain and in an axisymmetric section (whose local corner field is the plane-strain one).
 */
export function kolosov(E: number, nu: number, state: PlaneState): { mu: number; kappa: number } {
  const mu = E / (2 * (1 + nu));
  const kappa = state === 'plane-stress' ? (3 - nu) / (1 + nu) : 3 - 4 * nu;
  return { mu, kappa };
}
