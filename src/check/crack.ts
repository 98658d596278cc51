/**
 * Centre-crack stress intensity: the closed forms the crack case compares with, and the
 * displacement-extrapolation estimate of K_I from crack-face openings.
 */
import { lineFit } from '../study/index.js';

/**
 * Centre crack of length 2a in a long strip of width W under remote tension S:
 * K_I = S √(πa) · F(α), α = 2a/W, with Tada's correction of Feddersen's secant form
 * F = (1 − 0.025 α² + 0.06 α⁴) √(sec(πα/2)).
 * H. Tada, P. C. Paris & G. R. Irwin, The Stress Analysis of Cracks Handbook, 3rd ed., ASME (2000),
 * p. 2.2 (stated within about 0.1 % of Isida's series, Int. J. Fracture 7 (1971) 301–316).
 */
export function tadaCentreCrackK(S: number, a: number, W: number): number {
  const alpha = (2 * a) / W;
  const F = (1 - 0.025 * alpha ** 2 + 0.06 * alpha ** 4) * Math.sqrt(1 / Math.cos((Math.PI * alpha) / 2));
  return S * Math.sqrt(Math.PI * a) * F;
}

/** C. E. Feddersen, discussion in ASTM STP 410 (1966) 77–79: K_I = S √(πa) √(sec(πa/W)). */
export function feddersenCentreCrackK(S: number, a: number, W: number): number {
  return S * Math.sqrt(Math.PI * a) * Math.sqrt(1 / Math.cos((Math.PI * a) / W));
}

/**
 * Mode-I displacement extrapolation. From the near-tip field (Irwin 1957; e.g. Anderson,
 * Fracture Mechanics, 3rd ed. (2005), Table 2.2) the opening of the upper face at distance r
 * behind the tip is u_y(r, π) = (K_I/2μ) √(r/2π) (κ + 1), so
 *   K_I(r) = (2μ/(κ + 1)) √(2π/r) u_y(r, π) = (E'/4) √(2π/r) u_y,
 * and K_I(r) = K_I + O(r): fit a straight line to K_I(r) over the face nodes with
 * rMin ≤ r ≤ rMax (leaving out the tip and the first element, where the polynomial element
 * cannot follow √r) and take its value at r = 0.
 */
export function extrapolateK(
  faceR: ArrayLike<number>,
  faceUy: ArrayLike<number>,
  E: number,
  nu: number,
  state: 'plane-stress' | 'plane-strain',
  rMin: number,
  rMax: number,
): { K: number; points: number } {
  const mu = E / (2 * (1 + nu));
  const kappa = state === 'plane-stress' ? (3 - nu) / (1 + nu) : 3 - 4 * nu;
  const xs: number[] = [];
  const ks: number[] = [];
  for (let i = 0; i < faceR.length; i++) {
    const r = faceR[i];
    if (r < rMin || r > rMax) continue;
    xs.push(r);
    ks.push(((2 * mu) / (kappa + 1)) * Math.sqrt((2 * Math.PI) / r) * faceUy[i]);
  }
  if (xs.length < 2) return { K: NaN, points: xs.length };
  const fit = lineFit(xs, ks);
  return { K: fit.intercept, points: xs.length };
}
