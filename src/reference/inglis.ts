import type { PlaneState } from '../model/types.js';
import { cadd, cconj, cdiv, cexpi, cmul, cscale, csub, type Cx } from './complex.js';
import { kolosov } from './elastic.js';

/**
 * Elliptical hole, semi-axis a across the remote tension, b along it: Kt = 1 + 2a/b at the ends of a.
 * C. E. Inglis, "Stresses in a plate due to the presence of cracks and sharp corners",
 * Trans. Inst. Naval Architects 55 (1913) 219–241.
 */
export function inglisKt(a: number, b: number): number {
  return 1 + (2 * a) / b;
}

/** Same, written with the tip radius of curvature ρ = b²/a: Kt = 1 + 2√(a/ρ) (Inglis 1913). */
export function inglisKtFromRadius(a: number, rho: number): number {
  return 1 + 2 * Math.sqrt(a / rho);
}

/**
 * The whole field round an elliptical hole (semi-axis a along x, b along y, traction-free) in an
 * infinite plate under remote uniaxial tension S along y — Inglis' problem — from the
 * Kolosov–Muskhelishvili potentials of the conformal map z = ω(ζ) = R(ζ + m/ζ), R = (a + b)/2,
 * m = (a − b)/(a + b), for tension p at angle β to the x axis (here β = π/2):
 *   φ(ζ) = (pR/4) [ζ + (2e^{2iβ} − m)/ζ],
 *   ψ(ζ) = −(pR/2) [e^{−2iβ} ζ + e^{2iβ}/(mζ) − (1 + m²)(e^{2iβ} − m)/m · ζ/(ζ² − m)]
 * (N. I. Muskhelishvili, Some Basic Problems of the Mathematical Theory of Elasticity, Noordhoff 1953,
 * the elliptic hole; the printed form recalled from memory and checked in test/reference: traction-free
 * hole edge, remote stress, Kt = 1 + 2a/b, strains of the displacement against Hooke's law).
 * Stresses σxx + σyy = 4 Re Φ, σyy − σxx + 2iσxy = 2(z̄ Φ′(z) + Ψ), Φ = φ′/ω′, Ψ = ψ′/ω′; displacement
 * 2μ(u + iv) = κφ − ω conj(φ′)/conj(ω′) − conj(ψ). No rigid motion: u_x = 0 on x = 0, u_y = 0 on y = 0.
 * Needs a > b (m > 0); x, y outside the hole.
 */
export function inglisField(
  S: number, a: number, b: number, x: number, y: number, E: number, nu: number, state: PlaneState = 'plane-stress',
): { sxx: number; syy: number; sxy: number; ux: number; uy: number } {
  if (!(a > b && b > 0)) throw new RangeError(`inglisField needs a > b > 0, got a = ${a}, b = ${b}`);
  const { mu, kappa } = kolosov(E, nu, state);
  const R = (a + b) / 2, m = (a - b) / (a + b);
  const z: Cx = [x, y];
  // ζ from Rζ² − zζ + Rm = 0: the root outside the unit circle
  const disc = csqrt(csub(cmul(z, z), [4 * R * R * m, 0]));
  const r1 = cscale(cadd(z, disc), 1 / (2 * R)), r2 = cscale(csub(z, disc), 1 / (2 * R));
  const zeta = Math.hypot(...r1) >= Math.hypot(...r2) ? r1 : r2;
  const e2 = cexpi(Math.PI); // e^{2iβ}, β = π/2
  const e2c = cconj(e2);
  const z2 = cmul(zeta, zeta), z3 = cmul(z2, zeta);
  const k = (S * R) / 4;
  const c1 = csub(cscale(e2, 2), [m, 0]); // 2e^{2iβ} − m
  const K = cscale(csub(e2, [m, 0]), (1 + m * m) / m);
  const phi = cscale(cadd(zeta, cdiv(c1, zeta)), k);
  const dphi = cscale(csub([1, 0], cdiv(c1, z2)), k);
  const d2phi = cscale(cdiv(cscale(c1, 2), z3), k);
  const zm = csub(z2, [m, 0]);
  const psi = cscale(csub(cadd(cmul(e2c, zeta), cdiv(e2, cscale(zeta, m))), cmul(K, cdiv(zeta, zm))), -2 * k);
  const dpsi = cscale(cadd(csub(e2c, cdiv(e2, cscale(z2, m))), cmul(K, cdiv(cadd(z2, [m, 0]), cmul(zm, zm)))), -2 * k);
  const w1 = cscale(csub([1, 0], cdiv([m, 0], z2)), R); // ω′(ζ)
  const w2 = cdiv([2 * R * m, 0], z3); // ω″(ζ)
  const Phi = cdiv(dphi, w1);
  const Psi = cdiv(dpsi, w1);
  const dPhiZ = cdiv(cdiv(csub(cmul(d2phi, w1), cmul(dphi, w2)), cmul(w1, w1)), w1);
  const sum = 4 * Phi[0];
  const diff = cscale(cadd(cmul(cconj(z), dPhiZ), Psi), 2); // σyy − σxx + 2iσxy
  const syy = 0.5 * (sum + diff[0]), sxx = 0.5 * (sum - diff[0]), sxy = 0.5 * diff[1];
  const omega = cscale(cadd(zeta, cdiv([m, 0], zeta)), R);
  const u2mu = csub(csub(cscale(phi, kappa), cdiv(cmul(omega, cconj(dphi)), cconj(w1))), cconj(psi));
  return { sxx, syy, sxy, ux: u2mu[0] / (2 * mu), uy: u2mu[1] / (2 * mu) };
}

/** principal square root of a complex number */
function csqrt(w: Cx): Cx {
  const r = Math.hypot(w[0], w[1]);
  const re = Math.sqrt(Math.max(0, (r + w[0]) / 2));
  const im = Math.sqrt(Math.max(0, (r - w[0]) / 2));
  return [re, w[1] < 0 ? -im : im];
}
