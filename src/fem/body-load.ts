/** Consistent nodal forces of a body force (force per unit volume) over every element. */
import type { Mesh } from '../mesh/types.js';
import { cstGradients, gatherElementXY, lstGradients, lstShape } from './shape.js';

/** body force per unit volume at a point (e.g. ρ·g, or −div σ of a manufactured field) */
export type BodyForceField = (x: number, y: number) => readonly [number, number];

// 7-point degree-5 rule on the reference triangle (Radon 1948, as tabulated by Dunavant,
// "High degree efficient symmetrical Gaussian quadrature rules for the triangle", IJNME 21, 1985):
// (ξ, η, weight) with weights summing to 1 (multiply by the reference area ½).
const T7_A1 = 0.059715871789770, T7_B1 = 0.470142064105115;
const T7_A2 = 0.797426985353087, T7_B2 = 0.101286507323456;
const T7_W1 = 0.132394152788506, T7_W2 = 0.125939180544827;
const T7_XI = [1 / 3, T7_B1, T7_A1, T7_B1, T7_B2, T7_A2, T7_B2];
const T7_ETA = [1 / 3, T7_B1, T7_B1, T7_A1, T7_B2, T7_B2, T7_A2];
const T7_W = [0.225, T7_W1, T7_W1, T7_W1, T7_W2, T7_W2, T7_W2];

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
    for (let g = 0; g < 7; g++) {
      const xi = T7_XI[g];
      const eta = T7_ETA[g];
      let det: number;
      if (npe === 3) {
        det = cstGradients(exy, dx, dy);
        N[0] = 1 - xi - eta;
        N[1] = xi;
        N[2] = eta;
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
      const w = 0.5 * det * T7_W[g] * thickness;
      for (let i = 0; i < npe; i++) {
        const n = mesh.elemNodes[npe * e + i];
        out[2 * n] += w * N[i] * bx;
        out[2 * n + 1] += w * N[i] * by;
      }
    }
  }
  return out;
}
