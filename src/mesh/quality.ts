/** Mesh metrics: node and element counts, angles, edge lengths, area (checks: validate.ts; adjacency: adjacency.ts). */
import { TRI_3, lstJacobian } from '../element/index.js';
import type { Mesh, MeshQuality } from './types.js';

/**
 * Angles use corner nodes only. Area is Σ ∫ det J over each element: exact for straight-sided
 * triangles, and for order 2 the isoparametric Jacobian integrated by the element module's
 * 3-point rule TRI_3 (degree 2, exact for the quadratic det J of a 6-node triangle), so curved
 * edges count their bulge.
 */
export function meshQuality(mesh: Mesh): MeshQuality {
  const { xy, elemNodes, nodesPerElem: npe } = mesh;
  const nE = elemNodes.length / npe;
  let minA = Infinity;
  let maxA = 0;
  let area = 0;
  let minEdge = Infinity;
  let maxEdge = 0;
  const scratch = lstScratch();
  for (let e = 0; e < nE; e++) {
    const a = elemNodes[npe * e], b = elemNodes[npe * e + 1], c = elemNodes[npe * e + 2];
    const ax = xy[2 * a], ay = xy[2 * a + 1], bx = xy[2 * b], by = xy[2 * b + 1], cx = xy[2 * c], cy = xy[2 * c + 1];
    const la = Math.hypot(bx - cx, by - cy), lb = Math.hypot(cx - ax, cy - ay), lc = Math.hypot(ax - bx, ay - by);
    minEdge = Math.min(minEdge, la, lb, lc);
    maxEdge = Math.max(maxEdge, la, lb, lc);
    const angA = angleAt(ax, ay, bx, by, cx, cy);
    const angB = angleAt(bx, by, cx, cy, ax, ay);
    const angC = Math.PI - angA - angB;
    minA = Math.min(minA, angA, angB, angC);
    maxA = Math.max(maxA, angA, angB, angC);
    if (npe === 3) area += 0.5 * ((bx - ax) * (cy - ay) - (by - ay) * (cx - ax));
    else area += lstArea(xy, elemNodes, e, scratch);
  }
  const deg = 180 / Math.PI;
  return {
    nodes: xy.length / 2, elements: nE, order: mesh.order,
    minAngleDeg: nE ? minA * deg : 0, maxAngleDeg: maxA * deg, area,
    minEdge: nE ? minEdge : 0, maxEdge,
  };
}

function angleAt(px: number, py: number, qx: number, qy: number, rx: number, ry: number): number {
  const ux = qx - px, uy = qy - py, vx = rx - px, vy = ry - py;
  return Math.atan2(Math.abs(ux * vy - uy * vx), ux * vx + uy * vy);
}

/** Scratch of lstArea: node coordinates and shape-function derivatives of one 6-node element. */
export interface LstScratch { ex: Float64Array; ey: Float64Array; dXi: Float64Array; dEta: Float64Array }

export function lstScratch(): LstScratch {
  return { ex: new Float64Array(6), ey: new Float64Array(6), dXi: new Float64Array(6), dEta: new Float64Array(6) };
}

/** Area of 6-node element e: ∫ det J dξ dη over the reference triangle = Σ w_q · det J_q / 2 (element/rules.ts convention). */
export function lstArea(xy: Float64Array, en: Uint32Array, e: number, scratch: LstScratch = lstScratch()): number {
  const { ex, ey, dXi, dEta } = scratch;
  for (let k = 0; k < 6; k++) {
    const n = en[6 * e + k];
    ex[k] = xy[2 * n];
    ey[k] = xy[2 * n + 1];
  }
  let area = 0;
  for (let q = 0; q < TRI_3.w.length; q++) area += 0.5 * TRI_3.w[q] * lstJacobian(ex, ey, TRI_3.xi[q], TRI_3.eta[q], dXi, dEta);
  return area;
}
