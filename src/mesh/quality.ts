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
  // The smallest angle of a mesh is the largest cotangent over its corners (cot falls from +∞ to
  // −∞ over (0, π)), the largest the smallest: a pass of products and one division per corner
  // finds both corners, and only those two go through atan2 (a mesh command of 600 000 triangles
  // spent more time here in trigonometry than the refinement spends on its last 10 % of points).
  let maxCot = -Infinity, minCot = Infinity;
  let minAt = -1, maxAt = -1;
  let area = 0;
  let minEdge2 = Infinity;
  let maxEdge2 = 0;
  const scratch = lstScratch();
  for (let e = 0; e < nE; e++) {
    const a = elemNodes[npe * e], b = elemNodes[npe * e + 1], c = elemNodes[npe * e + 2];
    const ax = xy[2 * a], ay = xy[2 * a + 1], bx = xy[2 * b], by = xy[2 * b + 1], cx = xy[2 * c], cy = xy[2 * c + 1];
    const ux = bx - ax, uy = by - ay, vx = cx - ax, vy = cy - ay, wx = cx - bx, wy = cy - by;
    const la = wx * wx + wy * wy, lb = vx * vx + vy * vy, lc = ux * ux + uy * uy;
    minEdge2 = Math.min(minEdge2, la, lb, lc);
    maxEdge2 = Math.max(maxEdge2, la, lb, lc);
    const cross = Math.abs(ux * vy - uy * vx);
    // cotangents at a, b, c: dot of the two edges leaving the corner over |cross|
    const cotA = (ux * vx + uy * vy) / cross;
    const cotB = (-ux * wx - uy * wy) / cross;
    const cotC = (vx * wx + vy * wy) / cross;
    // a degenerate triangle (cross = 0) has angles 0 and π: it holds both extremes
    const flat = !(cross > 0);
    const hi = flat ? Infinity : Math.max(cotA, cotB, cotC), lo = flat ? -Infinity : Math.min(cotA, cotB, cotC);
    if (hi > maxCot || minAt < 0) { maxCot = hi; minAt = e; }
    if (lo < minCot || maxAt < 0) { minCot = lo; maxAt = e; }
    if (npe === 3) area += 0.5 * ((bx - ax) * (cy - ay) - (by - ay) * (cx - ax));
    else area += lstArea(xy, elemNodes, e, scratch);
  }
  const deg = 180 / Math.PI;
  return {
    nodes: xy.length / 2, elements: nE, order: mesh.order,
    minAngleDeg: nE ? cornerAngles(xy, elemNodes, npe, minAt)[0] * deg : 0,
    maxAngleDeg: nE ? cornerAngles(xy, elemNodes, npe, maxAt)[1] * deg : 0,
    area,
    minEdge: nE ? Math.sqrt(minEdge2) : 0, maxEdge: Math.sqrt(maxEdge2),
  };
}

/** The smallest and largest corner angle of element e (radians). */
function cornerAngles(xy: Float64Array, elemNodes: Uint32Array, npe: number, e: number): [number, number] {
  const a = elemNodes[npe * e], b = elemNodes[npe * e + 1], c = elemNodes[npe * e + 2];
  const ax = xy[2 * a], ay = xy[2 * a + 1], bx = xy[2 * b], by = xy[2 * b + 1], cx = xy[2 * c], cy = xy[2 * c + 1];
  const angA = angleAt(ax, ay, bx, by, cx, cy);
  const angB = angleAt(bx, by, cx, cy, ax, ay);
  const angC = Math.PI - angA - angB;
  return [Math.min(angA, angB, angC), Math.max(angA, angB, angC)];
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
