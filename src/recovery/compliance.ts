import type { ElasticSection } from '../fem/types.js';

/**
 * σᵀ D⁻¹ σ for the stress vector (σxx, σyy, τxy) — twice the complementary energy density.
 * Plane stress: (σx² + σy² − 2νσxσy + 2(1 + ν)τ²)/E;
 * plane strain: (1 + ν)/E · ((1 − ν)(σx² + σy²) − 2νσxσy + 2τ²)
 * (the inverse of the plane-stress and plane-strain D matrices of Hooke's law). An axisymmetric
 * section without a hoop stress at hand takes the plane-strain form (revolvedComplianceForm is the
 * full one).
 */
export function complianceForm(section: ElasticSection): (sx: number, sy: number, txy: number) => number {
  const { E, nu } = section;
  if (section.state === 'plane-strain' || section.state === 'axisymmetric') {
    const f = (1 + nu) / E;
    return (sx, sy, txy) => f * ((1 - nu) * (sx * sx + sy * sy) - 2 * nu * sx * sy + 2 * txy * txy);
  }
  return (sx, sy, txy) => (sx * sx + sy * sy - 2 * nu * sx * sy + 2 * (1 + nu) * txy * txy) / E;
}

/**
 * σᵀ D⁻¹ σ of an axisymmetric section, (σr, σz, τrz, σθ): Hooke's 3-D law,
 * (σr² + σz² + σθ² − 2ν(σrσz + σzσθ + σθσr) + 2(1 + ν)τ²)/E.
 */
export function revolvedComplianceForm(section: Pick<ElasticSection, 'E' | 'nu'>): (sr: number, sz: number, trz: number, st: number) => number {
  const { E, nu } = section;
  return (sr, sz, trz, st) => (sr * sr + sz * sz + st * st - 2 * nu * (sr * sz + sz * st + st * sr) + 2 * (1 + nu) * trz * trz) / E;
}
