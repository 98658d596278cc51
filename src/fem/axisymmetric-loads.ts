/**
 * Surface loads of an axisymmetric section (issue 18), for the whole revolution like the ring
 * stiffness (fem/axisymmetric.ts): a traction or pressure is force per area of the revolved
 * surface, so an edge element's consistent nodal forces are f_i = 2π ∫ N_i t r ds — the edge
 * primitive of fem/edge-load.ts with thickness 2π and the traction weighted by r = x at each
 * quadrature point (exact for a uniform traction on a straight 2-node or 3-node edge: the
 * integrand N_i·r is a polynomial of degree ≤ 3).
 *
 * A concentrated force at a point of the section is a ring load for the whole circle: its
 * components are the total force (the sum around the circumference); a line load q per unit
 * circumference at radius r is the force 2π r q.
 */
import type { Mesh } from '../mesh/types.js';
import type { Point } from '../model/types.js';
import { REVOLUTION } from './axisymmetric.js';
import { edgeTractionLoad } from './edge-load.js';

/** consistent nodal forces of a uniform traction [t_r, t_z] on the revolved surface of `edges` */
export function revolvedTractionLoad(
  mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride'>,
  edges: ArrayLike<number>,
  traction: Point,
  out?: Float64Array,
): Float64Array {
  const [tr, tz] = traction;
  return edgeTractionLoad(mesh, edges, REVOLUTION, (r) => [r * tr, r * tz], out);
}

/** consistent nodal forces of a uniform pressure p (t = −p n) on the revolved surface of `edges` */
export function revolvedPressureLoad(
  mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride'>,
  edges: ArrayLike<number>,
  pressure: number,
  out?: Float64Array,
): Float64Array {
  return edgeTractionLoad(mesh, edges, REVOLUTION, (r, _z, nr, nz) => [-pressure * nr * r, -pressure * nz * r], out);
}
