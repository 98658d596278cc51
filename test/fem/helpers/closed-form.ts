/**
 * Closed-form elasticity fields used by the fem tests: Kirsch, Lamé, the Timoshenko–Goodier cantilever.
 * Each function names its published source.
 */

/**
 * Timoshenko & Goodier, Theory of Elasticity, 3rd ed. (1970), §21: cantilever with a parabolic
 * end shear P (acting in −y) at x = L, root at x = 0, depth D, thickness t; plane stress.
 * Root condition (c) (Augarde & Deeks, FEAD 44, 2008): u(0, ±D/2) = 0 and the root centroid held.
 */
export function cantilever(L: number, D: number, t: number, P: number, E: number, nu: number) {
  const I = (t * D ** 3) / 12;
  return {
    I,
    displacement: (x: number, y: number): [number, number] => [
      ((P * y) / (6 * E * I)) * ((6 * L - 3 * x) * x + (2 + nu) * (y * y - (D * D) / 4)),
      -(P / (6 * E * I)) * (3 * nu * y * y * (L - x) + ((4 + 5 * nu) * D * D * x) / 4 + (3 * L - x) * x * x),
    ],
    stress: (x: number, y: number): [number, number, number] => [(P * (L - x) * y) / I, 0, -(P / (2 * I)) * ((D * D) / 4 - y * y)],
    strain: (x: number, y: number): [number, number, number] => {
      const s = (P * (L - x) * y) / I;
      const tau = -(P / (2 * I)) * ((D * D) / 4 - y * y);
      return [s / E, (-nu * s) / E, (2 * (1 + nu) * tau) / E];
    },
    /** tip deflection δ = −v(L, 0) for root condition (c) */
    tipDeflection: (P * L ** 3) / (3 * E * I) + ((4 + 5 * nu) * P * D * D * L) / (24 * E * I),
  };
}

/**
 * Lamé (1852); Timoshenko & Goodier (1970) §28: thick ring a ≤ r ≤ b under internal pressure p.
 * Radial displacement in plane stress or plane strain (from Hooke's law with Lamé's stresses).
 */
export function lameRadialDisplacement(a: number, b: number, p: number, E: number, nu: number, state: 'plane-stress' | 'plane-strain', r: number): number {
  const c = (p * a * a) / (b * b - a * a);
  return state === 'plane-stress'
    ? (c / E) * ((1 - nu) * r + ((1 + nu) * b * b) / r)
    : ((c * (1 + nu)) / E) * ((1 - 2 * nu) * r + (b * b) / r);
}

/**
 * Kirsch (1898): circular hole of radius a in an infinite plate under remote σxx = S.
 * Cartesian stresses and displacements (plane stress); the displacements derived by integrating Kirsch's strains.
 */
export function kirsch(a: number, S: number, E: number, nu: number) {
  const mu = E / (2 * (1 + nu));
  const kappa = (3 - nu) / (1 + nu);
  return {
    stress: (x: number, y: number): [number, number, number] => {
      const r = Math.hypot(x, y);
      const th = Math.atan2(y, x);
      const q2 = (a * a) / (r * r);
      const q4 = q2 * q2;
      const c2 = Math.cos(2 * th), c4 = Math.cos(4 * th), s2 = Math.sin(2 * th), s4 = Math.sin(4 * th);
      return [
        S * (1 - q2 * (1.5 * c2 + c4) + 1.5 * q4 * c4),
        S * (-q2 * (0.5 * c2 - c4) - 1.5 * q4 * c4),
        S * (-q2 * (0.5 * s2 + s4) + 1.5 * q4 * s4),
      ];
    },
    displacement: (x: number, y: number): [number, number] => {
      const r = Math.hypot(x, y);
      const th = Math.atan2(y, x);
      const c = (S * a) / (8 * mu);
      const ra = r / a, ar = a / r, ar3 = ar ** 3;
      return [
        c * (ra * (kappa + 1) * Math.cos(th) + 2 * ar * ((1 + kappa) * Math.cos(th) + Math.cos(3 * th)) - 2 * ar3 * Math.cos(3 * th)),
        c * (ra * (kappa - 3) * Math.sin(th) + 2 * ar * ((1 - kappa) * Math.sin(th) + Math.sin(3 * th)) - 2 * ar3 * Math.sin(3 * th)),
      ];
    },
  };
}
