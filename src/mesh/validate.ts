/** Mesh invariant checks (orientation, positive Jacobians, elements inside the plate, boundary cover, duplicate nodes). */
import type { PlateGeometry } from '../geometry/types.js';
import { TRI_3, lstJacobian } from '../element/index.js';
import type { Mesh } from './types.js';
import { NO_ELEM } from './types.js';
import { curveProject, curveXY } from './curves.js';
import { elementNeighbors, findNode } from './adjacency.js';
import { lstScratch, type LstScratch } from './quality.js';

/** points where a 6-node element's Jacobian must be positive: the 3-point rule's and the corners */
const JACOBIAN_CHECK_POINTS: [number, number][] = [...Array.from(TRI_3.xi, (xi, q): [number, number] => [xi, TRI_3.eta[q]]), [0, 0], [1, 0], [0, 1]];

/** det J of 6-node element e at (ξ, η) */
function lstDetJ(xy: Float64Array, en: Uint32Array, e: number, xi: number, eta: number, s: LstScratch): number {
  for (let k = 0; k < 6; k++) {
    const n = en[6 * e + k];
    s.ex[k] = xy[2 * n];
    s.ey[k] = xy[2 * n + 1];
  }
  return lstJacobian(s.ex, s.ey, xi, eta, s.dXi, s.dEta);
}

/** winding-number point-in-polygon on a fine polygon of each loop's true curves */
function loopPolygons(geom: PlateGeometry): Map<string, Float64Array> {
  const out = new Map<string, Float64Array>();
  const p = [0, 0];
  for (const loop of geom.loops) {
    const pts: number[] = [];
    for (const pid of loop.pieces) {
      const c = geom.pieces[pid].curve;
      const n = c.kind === 'line' ? 1 : 2048;
      for (let i = 0; i < n; i++) {
        curveXY(c, i / n, p);
        pts.push(p[0], p[1]);
      }
    }
    out.set(loop.id, Float64Array.from(pts));
  }
  return out;
}

function insidePolygon(poly: Float64Array, x: number, y: number): boolean {
  let inside = false;
  const n = poly.length / 2;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const xi = poly[2 * i], yi = poly[2 * i + 1], xj = poly[2 * j], yj = poly[2 * j + 1];
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

/** Invariant checks; returns a list of problems (empty when the mesh is valid). */
export function validateMesh(mesh: Mesh, geom: PlateGeometry): string[] {
  const problems: string[] = [];
  const { xy, elemNodes: en, nodesPerElem: npe } = mesh;
  const nE = en.length / npe;
  const nN = xy.length / 2;
  const tol = 1e-7 * geom.scale;
  const say = (s: string) => {
    if (problems.length < 50) problems.push(s);
  };
  for (let i = 0; i < en.length; i++) if (en[i] >= nN) say(`element ${(i / npe) | 0} refers to node ${en[i]} ≥ ${nN}`);
  if (problems.length) return problems;
  // orientation (and positive Jacobian at the Gauss points for order 2)
  const scratch = lstScratch();
  for (let e = 0; e < nE; e++) {
    const a = en[npe * e], b = en[npe * e + 1], c = en[npe * e + 2];
    const d = (xy[2 * b] - xy[2 * a]) * (xy[2 * c + 1] - xy[2 * a + 1]) - (xy[2 * b + 1] - xy[2 * a + 1]) * (xy[2 * c] - xy[2 * a]);
    if (!(d > 0)) say(`element ${e} is not counter-clockwise (2·area ${d})`);
    if (npe === 6) {
      for (const [xi, eta] of JACOBIAN_CHECK_POINTS) {
        if (!(lstDetJ(xy, en, e, xi, eta, scratch) > 0)) {
          say(`element ${e}: isoparametric Jacobian not positive at (${xi.toFixed(2)}, ${eta.toFixed(2)})`);
          break;
        }
      }
    }
  }
  // element centroids inside the plate
  const polys = loopPolygons(geom);
  for (let e = 0; e < nE; e++) {
    let cx = 0, cy = 0;
    for (let k = 0; k < 3; k++) {
      cx += xy[2 * en[npe * e + k]] / 3;
      cy += xy[2 * en[npe * e + k] + 1] / 3;
    }
    for (const loop of geom.loops) {
      const ins = insidePolygon(polys.get(loop.id)!, cx, cy);
      if (loop.hole && ins) say(`element ${e} (centroid ${cx}, ${cy}) lies inside opening ${loop.id}`);
      if (!loop.hole && !ins) say(`element ${e} (centroid ${cx}, ${cy}) lies outside the outline`);
    }
  }
  // boundary edges match element edges with material on the left
  const stride = mesh.edgeStride;
  const nb = mesh.boundaryEdges.length / stride;
  const nbr = elementNeighbors(mesh);
  let freeEdges = 0;
  for (let i = 0; i < nbr.length; i++) if (nbr[i] === NO_ELEM) freeEdges++;
  if (freeEdges !== nb) say(`${freeEdges} element edges have no neighbour but ${nb} boundary edges are listed`);
  for (let i = 0; i < nb; i++) {
    const a = mesh.boundaryEdges[stride * i], b = mesh.boundaryEdges[stride * i + 1];
    const e = mesh.boundaryElem[i];
    let ok = false;
    for (let k = 0; k < 3; k++) {
      if (en[npe * e + k] === a && en[npe * e + ((k + 1) % 3)] === b) {
        ok = nbr[3 * e + k] === NO_ELEM && (stride === 2 || en[npe * e + 3 + k] === mesh.boundaryEdges[3 * i + 2]);
      }
    }
    if (!ok) say(`boundary edge ${i} (${a}→${b}) is not a free counter-clockwise edge of element ${e}`);
  }
  // each piece covered: its edges chain from the curve's start to its end, nodes on the curve
  const byPiece = new Map<number, number[]>();
  for (let i = 0; i < nb; i++) {
    const pc = mesh.boundaryPiece[i];
    if (!byPiece.has(pc)) byPiece.set(pc, []);
    byPiece.get(pc)!.push(i);
  }
  const p = [0, 0];
  for (const piece of geom.pieces) {
    const edges = byPiece.get(piece.id) ?? [];
    if (edges.length === 0) {
      say(`boundary piece ${piece.id} (${piece.keyPath}) has no mesh edges`);
      continue;
    }
    const from = new Map<number, number>();
    for (const i of edges) from.set(mesh.boundaryEdges[stride * i], mesh.boundaryEdges[stride * i + 1]);
    curveXY(piece.curve, 0, p);
    const n0 = findNode(mesh, [p[0], p[1]], tol);
    curveXY(piece.curve, 1, p);
    const n1 = findNode(mesh, [p[0], p[1]], tol);
    if (n0 < 0 || n1 < 0) {
      say(`boundary piece ${piece.id} (${piece.keyPath}): no node at its end points`);
      continue;
    }
    let v = n0;
    let steps = 0;
    do {
      const w = from.get(v);
      if (w === undefined) break;
      v = w;
      steps++;
    } while (v !== n1 && steps <= edges.length);
    if (v !== n1 || steps !== edges.length) say(`boundary piece ${piece.id} (${piece.keyPath}) is not covered by one chain of edges (${steps} of ${edges.length})`);
    for (const i of edges) {
      for (let k = 0; k < stride; k++) {
        const nd = mesh.boundaryEdges[stride * i + k];
        const r = curveProject(piece.curve, xy[2 * nd], xy[2 * nd + 1]);
        if (r.dist > tol && (k < 2 || piece.curve.kind !== 'line')) say(`node ${nd} of boundary edge ${i} is ${r.dist} off piece ${piece.id}`);
      }
    }
  }
  // duplicate nodes: closer than round-off of the coordinates (tiny fillets may legitimately
  // put distinct nodes far closer than the on-curve tolerance)
  const dupTol = 1e-11 * geom.scale;
  const order = Array.from({ length: nN }, (_, i) => i).sort((i, j) => xy[2 * i] - xy[2 * j]);
  for (let k = 0; k < nN; k++) {
    const i = order[k];
    for (let l = k + 1; l < nN && xy[2 * order[l]] - xy[2 * i] <= dupTol; l++) {
      const j = order[l];
      if (Math.abs(xy[2 * j + 1] - xy[2 * i + 1]) <= dupTol) say(`nodes ${i} and ${j} coincide`);
    }
  }
  return problems;
}
