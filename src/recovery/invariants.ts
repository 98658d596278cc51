import type { StressMeasure } from '../model/types.js';
import type { NodalStress } from './types.js';

/**
 * Stress invariants of a plane stress state (σxx, σyy, τxy) with an out-of-plane normal stress
 * σzz (0 in plane stress, ν(σxx + σyy) in plane strain; τxz = τyz = 0 in both).
 * Formulas: any elasticity text, e.g. Timoshenko & Goodier, Theory of Elasticity (1970).
 */

export interface PrincipalStresses {
  /** larger in-plane principal stress */
  s1: number;
  /** smaller in-plane principal stress */
  s2: number;
  /** angle of the s1 direction from the x axis, radians, in (−π/2, π/2] */
  angle: number;
}

/** In-plane principal stresses σ₁,₂ = (σx + σy)/2 ± √(((σx − σy)/2)² + τxy²), θp = ½ atan2(2τxy, σx − σy). */
export function principal(sxx: number, syy: number, sxy: number): PrincipalStresses {
  const mean = 0.5 * (sxx + syy);
  const radius = Math.hypot(0.5 * (sxx - syy), sxy);
  return { s1: mean + radius, s2: mean - radius, angle: 0.5 * Math.atan2(2 * sxy, sxx - syy) };
}

/**
 * von Mises equivalent stress √(½[(σx − σy)² + (σy − σz)² + (σz − σx)²] + 3τxy²).
 * With σzz = 0 this is the plane-stress form √(σx² − σxσy + σy² + 3τxy²).
 */
export function vonMises(sxx: number, syy: number, sxy: number, szz = 0): number {
  const a = sxx - syy;
  const b = syy - szz;
  const c = szz - sxx;
  return Math.sqrt(0.5 * (a * a + b * b + c * c) + 3 * sxy * sxy);
}

/**
 * Tresca equivalent stress σmax − σmin over all three principal stresses. The out-of-plane
 * normal stress is always a principal stress: 0 in plane stress, σzz in plane strain — so a
 * state with σ₁ > σ₂ > 0 in plane stress gives σ₁, not σ₁ − σ₂.
 */
export function tresca(sxx: number, syy: number, sxy: number, szz = 0): number {
  const mean = 0.5 * (sxx + syy);
  const radius = Math.hypot(0.5 * (sxx - syy), sxy);
  const s1 = mean + radius;
  const s2 = mean - radius;
  return Math.max(s1, szz) - Math.min(s2, szz);
}

/** Largest shear stress over all planes, (σmax − σmin)/2 — half the Tresca stress. */
export function maxShear(sxx: number, syy: number, sxy: number, szz = 0): number {
  return 0.5 * tresca(sxx, syy, sxy, szz);
}

/** Largest shear stress in the plane of the plate, √(((σx − σy)/2)² + τxy²). */
export function inPlaneMaxShear(sxx: number, syy: number, sxy: number): number {
  return Math.hypot(0.5 * (sxx - syy), sxy);
}

/**
 * The value of a study measure. `max-principal` is the larger in-plane principal stress σ₁
 * (the out-of-plane stress is left out: it is 0 in plane stress and a reaction to the in-plane
 * state in plane strain; an engineer reading "max principal" on a plate means σ₁).
 */
export function measureValue(measure: StressMeasure, sxx: number, syy: number, sxy: number, szz = 0): number {
  switch (measure) {
    case 'von-mises':
      return vonMises(sxx, syy, sxy, szz);
    case 'max-principal':
      return 0.5 * (sxx + syy) + Math.hypot(0.5 * (sxx - syy), sxy);
    case 'tresca':
      return tresca(sxx, syy, sxy, szz);
    case 'sxx':
      return sxx;
    case 'syy':
      return syy;
    case 'sxy':
      return sxy;
    default: {
      const never: never = measure;
      throw new RangeError(`unknown stress measure ${String(never)}`);
    }
  }
}

/** The measure at every node of a recovered field. */
export function nodalMeasure(field: Pick<NodalStress, 'stress' | 'szz'>, measure: StressMeasure): Float64Array {
  const n = field.szz.length;
  const out = new Float64Array(n);
  const s = field.stress;
  for (let i = 0; i < n; i++) out[i] = measureValue(measure, s[3 * i], s[3 * i + 1], s[3 * i + 2], field.szz[i]);
  return out;
}
