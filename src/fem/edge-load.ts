/**
 * The edge-load primitive: consistent nodal forces of a traction field on boundary edges, by
 * Gauss–Legendre quadrature along each edge's own map. Every edge load kind (traction, pressure,
 * far-field stress, pin force) is built on it; the dispatcher over the model's loads is loads.ts.
 */
import { GAUSS_LEGENDRE_3, GAUSS_LEGENDRE_5 } from '../element/index.js';
import type { Mesh } from '../mesh/types.js';

/** traction vector (force per unit area) at a boundary point with outward unit normal (nx, ny) */
export type TractionField = (x: number, y: number, nx: number, ny: number) => readonly [number, number];

/**
 * Consistent equivalent nodal forces of a traction field on boundary edges (whole thickness):
 * f_i += t ∫ N_i(s) τ(x(s)) |dx/ds| ds over each edge, with the edge's own 2-node (linear) or
 * 3-node (quadratic, isoparametric) map, s ∈ [−1, 1] from a to b. Gauss–Legendre with 3 points
 * on 2-node edges and 5 on 3-node edges: exact for polynomial tractions up to degree 4 resp. 5
 * on straight edges, and accurate on curved LST edges where |dx/ds| is not a polynomial.
 * The outward normal is the right-hand normal of a → b (material lies on the left).
 * Adds into `out` (length 2·nNodes) and returns it.
 */
export function edgeTractionLoad(
  mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride'>,
  edges: ArrayLike<number>,
  thickness: number,
  traction: TractionField,
  out: Float64Array = new Float64Array(mesh.xy.length),
): Float64Array {
  const { xy, boundaryEdges } = mesh;
  const stride = mesh.edgeStride;
  const { s: S, w: W } = stride === 2 ? GAUSS_LEGENDRE_3 : GAUSS_LEGENDRE_5;
  for (let k = 0; k < edges.length; k++) {
    const e = edges[k];
    const a = boundaryEdges[stride * e];
    const b = boundaryEdges[stride * e + 1];
    const m = stride === 3 ? boundaryEdges[stride * e + 2] : -1;
    const ax = xy[2 * a], ay = xy[2 * a + 1];
    const bx = xy[2 * b], by = xy[2 * b + 1];
    const mx = m >= 0 ? xy[2 * m] : 0;
    const my = m >= 0 ? xy[2 * m + 1] : 0;
    for (let g = 0; g < S.length; g++) {
      const s = S[g];
      let Na: number, Nb: number, Nm: number;
      let x: number, y: number, tx: number, ty: number;
      if (m < 0) {
        Na = 0.5 * (1 - s);
        Nb = 0.5 * (1 + s);
        Nm = 0;
        x = Na * ax + Nb * bx;
        y = Na * ay + Nb * by;
        tx = 0.5 * (bx - ax);
        ty = 0.5 * (by - ay);
      } else {
        Na = 0.5 * s * (s - 1);
        Nb = 0.5 * s * (s + 1);
        Nm = 1 - s * s;
        x = Na * ax + Nb * bx + Nm * mx;
        y = Na * ay + Nb * by + Nm * my;
        // d/ds of the shape functions: s − ½, s + ½, −2s
        tx = (s - 0.5) * ax + (s + 0.5) * bx - 2 * s * mx;
        ty = (s - 0.5) * ay + (s + 0.5) * by - 2 * s * my;
      }
      const jac = Math.hypot(tx, ty);
      if (jac === 0) continue;
      const nx = ty / jac;
      const ny = -tx / jac;
      const [px, py] = traction(x, y, nx, ny);
      const w = W[g] * jac * thickness;
      out[2 * a] += w * Na * px;
      out[2 * a + 1] += w * Na * py;
      out[2 * b] += w * Nb * px;
      out[2 * b + 1] += w * Nb * py;
      if (m >= 0) {
        out[2 * m] += w * Nm * px;
        out[2 * m + 1] += w * Nm * py;
      }
    }
  }
  return out;
}

/** nodal forces of a uniform pressure p acting against the outward normal (t = −p n) */
export function pressureLoad(
  mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride'>,
  edges: ArrayLike<number>,
  thickness: number,
  pressure: number,
  out?: Float64Array,
): Float64Array {
  return edgeTractionLoad(mesh, edges, thickness, (_x, _y, nx, ny) => [-pressure * nx, -pressure * ny], out);
}
