import type { PlaneState } from '../model/types.js';
import { cadd, cconj, cdiv, cexpi, cmul, cpow, cscale, csub, cx, type Cx } from './complex.js';
import { kolosov } from './elastic.js';

/**
 * Exact symmetric (mode I) Williams eigen-field of a wedge with traction-free faces, from the
 * Kolosov–Muskhelishvili potentials φ = A z'^λ, ψ = B z'^λ in coordinates z' turned so the wedge
 * bisector is the local x' axis. M. L. Williams, "Stress singularities resulting from various boundary
 * conditions in angular corners of plates in extension", J. Appl. Mech. 19 (1952) 526–528.
 * B/A = −(λ e^{iβ₁} + e^{−iβ₁}) e^{−iβ₂}, β₁ = (λ−1)α/2, β₂ = (λ+1)α/2 (faces at local θ = ±α/2).
 * `lambda` must be a free–free symmetric root for the faces to be traction-free (see study/williams).
 * The principal branch of z'^λ is used: its cut (local angle ±180°) must lie outside the material.
 */
export interface WedgeModeI {
  alphaDeg: number;
  lambda: number;
  /** global direction of the bisector, degrees */
  bisectorDeg: number;
  /** amplitude of φ */
  A: number;
  E: number;
  nu: number;
  state?: PlaneState;
}

export function wedgeModeIB(alphaDeg: number, lambda: number): Cx {
  const alpha = (alphaDeg * Math.PI) / 180;
  const b1 = ((lambda - 1) * alpha) / 2;
  const b2 = ((lambda + 1) * alpha) / 2;
  const inner = cadd(cscale(cexpi(b1), lambda), cexpi(-b1));
  return cscale(cmul(inner, cexpi(-b2)), -1);
}

export function wedgeModeIField(w: WedgeModeI, x: number, y: number): { sxx: number; syy: number; sxy: number; ux: number; uy: number } {
  const { lambda, A } = w;
  const { mu, kappa } = kolosov(w.E, w.nu, w.state ?? 'plane-stress');
  const om = (w.bisectorDeg * Math.PI) / 180;
  const B = cscale(wedgeModeIB(w.alphaDeg, lambda), A);
  const z = cmul(cexpi(-om), cx(x, y));
  const zl = cpow(z, lambda);
  const zl1 = cdiv(zl, z);
  const zl2 = cdiv(zl1, z);
  const phi = cscale(zl, A);
  const dphi = cscale(zl1, A * lambda);
  const ddphi = cscale(zl2, A * lambda * (lambda - 1));
  const psi = cmul(B, zl);
  const dpsi = cscale(cmul(B, zl1), lambda);
  const sum = 4 * dphi[0];
  const diff = cscale(cadd(cmul(cconj(z), ddphi), dpsi), 2); // σ'yy − σ'xx + 2iτ'
  // back to global axes: local = e^{2iω}·global for axes turned by ω (Muskhelishvili), so global = e^{−2iω}·local
  const g = cmul(diff, cexpi(-2 * om));
  const sxx = (sum - g[0]) / 2;
  const syy = (sum + g[0]) / 2;
  const sxy = g[1] / 2;
  const disp = cscale(csub(csub(cscale(phi, kappa), cmul(z, cconj(dphi))), cconj(psi)), 1 / (2 * mu));
  const dg = cmul(disp, cexpi(om));
  return { sxx, syy, sxy, ux: dg[0], uy: dg[1] };
}

/**
 * The classic L-shaped test domain of corner-singularity benchmarks: [−1, 1]² minus the quadrant x > 0, y < 0,
 * re-entrant 270° corner at the origin, bisector at 135°, λ = 0.5444837368 (the 270° free–free symmetric root),
 * A = 1.
 */
export const L_SHAPE_LAMBDA = 0.5444837368;
export function lShapeModeIField(x: number, y: number, E = 1, nu = 0.3) {
  return wedgeModeIField({ alphaDeg: 270, lambda: L_SHAPE_LAMBDA, bisectorDeg: 135, A: 1, E, nu }, x, y);
}
