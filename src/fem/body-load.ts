/** Consistent nodal forces of a body force (force per unit volume) over every element. */
import type { Mesh } from '../mesh/types.js';
import { TRI_7, cstShape, lstShape } from '../element/index.js';
import { cstGradients, gatherElementXY, lstGradients } from './shape.js';

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
  const exy = new Float64Array(2 * npe);
  const N = new Float64Array(6);
  const dx = new Float64Array(6);
  const dy = new Float64Array(6);
  const nElem = mesh.elemNodes.length / npe;
  for (let e = 0; e < nElem; e++) {
    gatherElementXY(mesh.xy, mesh.elemNodes, npe, e, exy);
    for (let g = 0; g < TRI_7.w.length; g++) {
      const xi = TRI_7.xi[g];
      const eta = TRI_7.eta[g];
      let det: number;
      if (npe === 3) {
        det = cstGradients(exy, dx, dy);
        cstShape(xi, eta, N);
      } else {
        det = lstGradients(exy, xi, eta, dx, dy);
        lstShape(xi, eta, N);
      }
      let x = 0;
      let y = 0;
      for (let i = 0; i < npe; i++) {
        x += N[i] * exy[2 * i];
        y += N[i] * exy[2 * i + 1];
      }
      const [bx, by] = bodyForce(x, y);
      // weight × |J|/2 (element/rules.ts convention)
      const w = 0.5 * TRI_7.w[g] * det * thickness;
      for (let i = 0; i < npe; i++) {
        const n = mesh.elemNodes[npe * e + i];
        out[2 * n] += w * N[i] * bx;
        out[2 * n + 1] += w * N[i] * by;
      }
    }
  }
  return out;
}
