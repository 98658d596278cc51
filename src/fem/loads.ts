import { FemError } from '../errors.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { Mesh } from '../mesh/types.js';
import type { AnyLoad } from '../model/types.js';
import { farFieldStressLoad } from './farfield.js';
import { pinForceLoad } from './pin-force.js';
import { describeSelector, farFieldEdges, selectBoundary } from './selectors.js';
import { cstGradients, gatherElementXY, lstGradients, lstShape } from './shape.js';
import type { ElasticSection } from './types.js';

/** traction vector (force per unit area) at a boundary point with outward unit normal (nx, ny) */
export type TractionField = (x: number, y: number, nx: number, ny: number) => readonly [number, number];

// Gauss–Legendre points and weights on [−1, 1] (Abramowitz & Stegun 1964, Table 25.4)
const GL3_S = [-Math.sqrt(3 / 5), 0, Math.sqrt(3 / 5)];
const GL3_W = [5 / 9, 8 / 9, 5 / 9];
const GL5_S = [
  -0.906179845938664, -0.5384693101056831, 0, 0.5384693101056831, 0.906179845938664,
];
const GL5_W = [
  0.23692688505618908, 0.47862867049936647, 0.5688888888888889, 0.47862867049936647, 0.23692688505618908,
];

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
  const S = stride === 2 ? GL3_S : GL5_S;
  const W = stride === 2 ? GL3_W : GL5_W;
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

/**
 * Global load vector (whole thickness) of the model loads: tractions and pressures integrated
 * consistently over the selected edges, concentrated forces at the selected node.
 */
export function loadVector(
  mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride' | 'boundaryPiece'>,
  geom: Pick<PlateGeometry, 'pieces' | 'loops' | 'scale'>,
  section: Pick<ElasticSection, 'thickness'>,
  loads: readonly AnyLoad[],
): Float64Array {
  const f = new Float64Array(mesh.xy.length);
  loads.forEach((load, i) => {
    const keyPath = load.keyPath || `loads[${i}]`;
    const where = `${keyPath}.where`;
    if (load.kind === 'force') {
      if (load.where.kind !== 'point') {
        throw new FemError(
          `a concentrated force acts at a point; ${describeSelector(load.where)} is not one (use { point: [x, y] }, or a traction on an edge)`,
          where,
        );
      }
      const n = selectBoundary(mesh, geom, load.where, where).nodes[0];
      f[2 * n] += load.force[0];
      f[2 * n + 1] += load.force[1];
      return;
    }
    if (load.where.kind === 'point') {
      throw new FemError(`a ${load.kind} acts on boundary edges, not at a point; use a force for a concentrated load`, where);
    }
    const { edges } = selectBoundary(mesh, geom, load.where, where);
    if (load.kind === 'stress') {
      farFieldStressLoad(mesh, farFieldEdges(mesh, geom, load.where, edges), section.thickness, load, f);
    } else if (load.kind === 'pinForce') {
      pinForceLoad(mesh, edges, section.thickness, load.force, keyPath, f);
    } else if (load.kind === 'traction') {
      const t: readonly [number, number] = [load.traction[0], load.traction[1]];
      edgeTractionLoad(mesh, edges, section.thickness, () => t, f);
    } else {
      pressureLoad(mesh, edges, section.thickness, load.pressure, f);
    }
  });
  return f;
}

/** sum of the nodal forces in x and y */
export function appliedResultant(load: Float64Array): [number, number] {
  let fx = 0;
  let fy = 0;
  for (let i = 0; i < load.length; i += 2) {
    fx += load[i];
    fy += load[i + 1];
  }
  return [fx, fy];
}

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
