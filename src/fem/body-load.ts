/** Consistent nodal forces of a body force (force per unit volume) over every element. */
import type { Mesh } from '../mesh/types.js';
import { TRI_7 } from '../element/index.js';
import { forEachRulePoint } from './shape.js';

/** body force per unit volume at a point (e.g. ρ·g, or −div σ of a manufactured field) */
export type BodyForceField = (x: number, y: number) => readonly [number, number];

/**
 * Consistent nodal forces of a body force b(x, y) (force per unit volume), whole thickness:
 * f_i += t ∫ N_i b dA over every element, with the 7-point degree-5 rule through the element's
 * own (isoparametric) map — exact for a body force up to degree 3 (LST) or 4 (CST) on
 * straight-sided elements. Adds into `out` and returns it.
 */
export function bodyForceLoad(
  mesh: Pick<Mesh, 'xy' | 'elemNodes' | 'nodesPerElem'>,
  thickness: number,
  bodyForce: BodyForceField,
  out: Float64Array = new Float64Array(mesh.xy.length),
): Float64Array {
  const npe = mesh.nodesPerElem;
  forEachRulePoint(mesh, TRI_7, ({ e, x, y, area, N }) => {
    const [bx, by] = bodyForce(x, y);
    const w = area * thickness;
    for (let i = 0; i < npe; i++) {
      const n = mesh.elemNodes[npe * e + i];
      out[2 * n] += w * N[i] * bx;
      out[2 * n + 1] += w * N[i] * by;
    }
  });
  return out;
}
