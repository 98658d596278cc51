import type { Mesh } from '../mesh/types.js';
import type { Load } from '../model/types.js';
import { edgeTractionLoad } from './edge-load.js';

type StressLoad = Extract<Load, { kind: 'stress' }>;

/**
 * Nodal forces of a far-field stress state on boundary edges (issue 9): the traction of the
 * state on each edge, t = σ·n with n the edge's outward normal (the right-hand normal of the
 * edge's travel, material on the left), integrated consistently by edgeTractionLoad. The state
 * may vary linearly, σ(p) = σ₀ + G·(p − about), for in-plane bending; with a linear state the
 * traction is linear along a straight edge and the Gauss rule integrates it exactly.
 * Cauchy's relation t_i = σ_ij n_j; a uniform state is in equilibrium, so its tractions on a
 * closed outline sum to zero force and zero moment.
 */
export function farFieldStressLoad(
  mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride'>,
  edges: ArrayLike<number>,
  thickness: number,
  load: Pick<StressLoad, 'stress' | 'gradient' | 'about'>,
  out?: Float64Array,
): Float64Array {
  const [s0xx, s0yy, s0xy] = load.stress;
  const { sxx: gxx, syy: gyy, sxy: gxy } = load.gradient;
  const [x0, y0] = load.about;
  return edgeTractionLoad(mesh, edges, thickness, (x, y, nx, ny) => {
    const dx = x - x0;
    const dy = y - y0;
    const sxx = s0xx + gxx[0] * dx + gxx[1] * dy;
    const syy = s0yy + gyy[0] * dx + gyy[1] * dy;
    const sxy = s0xy + gxy[0] * dx + gxy[1] * dy;
    return [sxx * nx + sxy * ny, sxy * nx + syy * ny];
  }, out);
}
