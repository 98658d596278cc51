import type { PlaneState } from '../model/types.js';
import { kolosov } from './elastic.js';

/**
 * Circular hole of radius a in an infinite plate under remote uniaxial stress S along x.
 * G. Kirsch, "Die Theorie der Elastizität und die Bedürfnisse der Festigkeitslehre",
 * Zeitschrift des Vereines deutscher Ingenieure 42 (1898) 797–807; Timoshenko & Goodier,
 * Theory of Elasticity, 3rd ed. (1970). θ is measured from the load (x) axis.
 */
export function kirschPolar(S: number, a: number, r: number, theta: number): { srr: number; stt: number; srt: number } {
  const a2 = (a * a) / (r * r);
  const a4 = a2 * a2;
  const c2 = Math.cos(2 * theta);
  const s2 = Math.sin(2 * theta);
  return {
    srr: (S / 2) * (1 - a2) + (S / 2) * (1 - 4 * a2 + 3 * a4) * c2,
    stt: (S / 2) * (1 + a2) - (S / 2) * (1 + 3 * a4) * c2,
    srt: -(S / 2) * (1 + 2 * a2 - 3 * a4) * s2,
  };
}

/** Kirsch (1898) field in Cartesian components at (x, y), hole centred at the origin. */
export function kirschCartesian(S: number, a: number, x: number, y: number): { sxx: number; syy: number; sxy: number } {
  const r2 = x * x + y * y;
  const theta = Math.atan2(y, x);
  const a2 = (a * a) / r2;
  const a4 = a2 * a2;
  const c2 = Math.cos(2 * theta), c4 = Math.cos(4 * theta);
  const s2 = Math.sin(2 * theta), s4 = Math.sin(4 * theta);
  return {
    sxx: S * (1 - a2 * (1.5 * c2 + c4) + 1.5 * a4 * c4),
    syy: S * (-a2 * (0.5 * c2 - c4) - 1.5 * a4 * c4),
    sxy: S * (-a2 * (0.5 * s2 + s4) + 1.5 * a4 * s4),
  };
}

/**
 * Kirsch (1898) displacements, without rigid-body part (u_x = 0 on x = 0, u_y = 0 on y = 0).
 * Re-derived by integrating the strains of Kirsch's stress field (Hooke's law, plane stress or strain).
 */
export function kirschDisplacement(
  S: number, a: number, x: number, y: number, E: number, nu: number, state: PlaneState = 'plane-stress',
): { ux: number; uy: number } {
  const { mu, kappa } = kolosov(E, nu, state);
  const r = Math.hypot(x, y);
  const t = Math.atan2(y, x);
  const k = (S * a) / (8 * mu);
  const ra = r / a, ar = a / r, ar3 = ar * ar * ar;
  return {
    ux: k * (ra * (kappa + 1) * Math.cos(t) + 2 * ar * ((1 + kappa) * Math.cos(t) + Math.cos(3 * t)) - 2 * ar3 * Math.cos(3 * t)),
    uy: k * (ra * (kappa - 3) * Math.sin(t) + 2 * ar * ((1 - kappa) * Math.sin(t) + Math.sin(3 * t)) - 2 * ar3 * Math.sin(3 * t)),
  };
}

/** Hoop stress on the hole edge under remote biaxial S1 (along x) and S2 (along y): (S1 + S2) − 2(S1 − S2) cos 2θ. */
export function kirschHoopAtEdge(S1: number, S2: number, theta: number): number {
  return S1 + S2 - 2 * (S1 - S2) * Math.cos(2 * theta);
}

/** Kt of a circular hole in an infinite plate, uniaxial tension (Kirsch 1898). */
export const KIRSCH_KT = 3;
