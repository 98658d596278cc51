import type { ElasticSection } from '../fem/types.js';

/**
 * σᵀ D⁻¹ σ for the stress vector (σxx, σyy, τxy) — twice the complementary energy density.
 * Plane stress: (σx² + σy² − 2νσxσy + 2(1 + ν)τ²)/E;
 * plane strain: (1 + ν)/E · ((1 − ν)(σx² + σy²) − 2νσxσy + 2τ²)
 * (the inverse of the plane-stress and plane-strain D matrices of Hooke's law).
 */
export function complianceForm(section: ElasticSection): (sx: number, sy: number, txy: number) => number {
  const { E, nu } = section;
  if (section.state === 'plane-strain') {
    const f = (1 + nu) / E;
    return (sx, sy, txy) => f * ((1 - nu) * (sx * sx + sy * sy) - 2 * nu * sx * sy + 2 * txy * txy);
  }
  return (sx, sy, txy) => (sx * sx + sy * sy - 2 * nu * sx * sy + 2 * (1 + nu) * txy * txy) / E;
}
