import type { ElasticSection } from '../fem/types.js';

/**
 * σᵀ D⁻¹ σ for the stress vector (σxx, σyy, τxy) — twice the complementary energy density.
 * Plane stress: (σx² + σy² − 2νσxσy + 2(1 + ν)τ²)/E;
 * plane strain: (1 + ν)/E · ((1 − ν)(σx² + σy²) − 2νσxσy + 2τ²)
 * (the inverse of the plane-stress and plane-strain D matrices of Hooke's law). An axisymmetric
 * section takes the plane-strain form: the in-plane part of the energy, without the hoop term and
 * without the weight r (an error indicator per unit of section area; docs/recovery.md).
 */
export function complianceForm(section: ElasticSection): (sx: number, sy: number, txy: number) => number {
  const { E, nu } = section;
  if (section.state === 'plane-strain' || section.state === 'axisymmetric') {
    const f = (1 + nu) / E;
    return (sx, sy, txy) => f * ((1 - nu) * (sx * sx + sy * sy) - 2 * nu * sx * sy + 2 * txy * txy);
  }
  return (sx, sy, txy) => (sx * sx + sy * sy - 2 * nu * sx * sy + 2 * (1 + nu) * txy * txy) / E;
}
