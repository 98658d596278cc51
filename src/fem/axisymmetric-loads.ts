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
import { FemError } from '../errors.js';
import type { Mesh } from '../mesh/types.js';
import type { Load, Point } from '../model/types.js';
import { REVOLUTION } from './axisymmetric.js';
import { bodyForceLoad } from './body-load.js';
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

/**
 * Volume loads of an axisymmetric section, for the whole revolution: f_i = 2π ∫ N_i b r dA, the
 * body-force primitive of fem/body-load.ts with thickness 2π and the force weighted by r.
 * - gravity: self-weight ρg along the axis only (`gravity: [0, g_z]`; a radial component would
 *   not be axisymmetric);
 * - spin: rotation about the axis (`about: [0, z]`, any z), centrifugal force ρω²r radially.
 * Temperature loads are not handled here: all of them at once by axisymmetricThermalLoad.
 */
export function revolvedBodyLoad(
  mesh: Pick<Mesh, 'xy' | 'elemNodes' | 'nodesPerElem'>,
  load: Extract<Load, { kind: 'gravity' | 'spin' }>,
  density: () => number,
  keyPath: string,
  out: Float64Array,
): Float64Array {
  if (load.kind === 'gravity') {
    if (load.gravity[0] !== 0) {
      throw new FemError('in an axisymmetric section self-weight acts along the axis only: give gravity as [0, g] (g along z = y)', `${keyPath}.gravity`);
    }
    const bz = density() * load.gravity[1];
    return bodyForceLoad(mesh, REVOLUTION, (r) => [0, r * bz], out);
  }
  if (load.about[0] !== 0) {
    throw new FemError('in an axisymmetric section the rotation is about the axis: give about as [0, z] (the axis is x = 0)', `${keyPath}.spin.about`);
  }
  const c = density() * load.omega * load.omega;
  return bodyForceLoad(mesh, REVOLUTION, (r) => [c * r * r, 0], out);
}
