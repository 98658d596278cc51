/**
 * Cantilever of length L, depth D, thickness t, with a parabolic end shear of total force P acting in −y at
 * x = L, root at x = 0, y ∈ [−D/2, D/2]. Timoshenko & Goodier, Theory of Elasticity, 3rd ed. (1970),
 * "Bending of a cantilever loaded at the end"; root condition (c), u(0, ±D/2) = 0, as used in
 * C. E. Augarde & A. J. Deeks, Finite Elements in Analysis and Design 44 (2008) 595–601 (sign flipped for −y).
 * Plane stress.
 */
export interface CantileverData {
  L: number;
  D: number;
  t: number;
  P: number;
  E: number;
  nu: number;
}

export function cantileverStress(c: CantileverData, x: number, y: number): { sxx: number; syy: number; sxy: number } {
  const I = (c.t * c.D ** 3) / 12;
  return {
    sxx: (c.P * (c.L - x) * y) / I,
    syy: 0,
    sxy: -(c.P / (2 * I)) * ((c.D * c.D) / 4 - y * y),
  };
}

export function cantileverDisplacement(c: CantileverData, x: number, y: number): { ux: number; uy: number } {
  const { L, D, P, E, nu } = c;
  const I = (c.t * D ** 3) / 12;
  return {
    ux: ((P * y) / (6 * E * I)) * ((6 * L - 3 * x) * x + (2 + nu) * (y * y - (D * D) / 4)),
    uy: -(P / (6 * E * I)) * (3 * nu * y * y * (L - x) + ((4 + 5 * nu) * D * D * x) / 4 + (3 * L - x) * x * x),
  };
}

/** Tip deflection δ = −v(L, 0) for root condition (c): P L³/(3EI) + (4 + 5ν) P D² L/(24 E I). */
export function cantileverTipDeflection(c: CantileverData): number {
  const I = (c.t * c.D ** 3) / 12;
  return (c.P * c.L ** 3) / (3 * c.E * I) + ((4 + 5 * c.nu) * c.P * c.D * c.D * c.L) / (24 * c.E * I);
}
