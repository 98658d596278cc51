/** Mesh checks and adjacency helpers used by tests, the CLI and the recovery stage. */
import type { PlateGeometry } from '../geometry/types.js';
import type { Mesh, MeshQuality } from './types.js';
import { NO_ELEM } from './types.js';
import { curveProject, curveXY } from './curves.js';

/**
 * Angles use corner nodes only. Area is Σ ∫ det J over each element: exact for straight-sided
 * triangles, and for order 2 the isoparametric Jacobian integrated by the 3-point Gauss rule
 * (Strang & Fix 1973; degree 2, exact for the quadratic det J of a 6-node triangle), so curved
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
    else area += lstArea(xy, elemNodes, e);
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

/** 3-point Gauss rule on the triangle, points at the edge midpoints' barycentric (2/3,1/6,1/6) */
const GAUSS3 = [
  [2 / 3, 1 / 6],
  [1 / 6, 2 / 3],
  [1 / 6, 1 / 6],
];

/** det J of the 6-node triangle at (ξ, η) */
function lstDetJ(xy: Float64Array, en: Uint32Array, e: number, xi: number, eta: number): number {
  const L1 = 1 - xi - eta;
  // dN/dξ and dN/dη for nodes 0..5 (0 at ξ=η=0, 1 at ξ=1, 2 at η=1)
  const dxi = [-(4 * L1 - 1), 4 * xi - 1, 0, 4 * (L1 - xi), 4 * eta, -4 * eta];
  const deta = [-(4 * L1 - 1), 0, 4 * eta - 1, -4 * xi, 4 * xi, 4 * (L1 - eta)];
  let x1 = 0, x2 = 0, y1 = 0, y2 = 0;
  for (let k = 0; k < 6; k++) {
    const n = en[6 * e + k];
    x1 += dxi[k] * xy[2 * n];
    y1 += dxi[k] * xy[2 * n + 1];
    x2 += deta[k] * xy[2 * n];
    y2 += deta[k] * xy[2 * n + 1];
  }
  return x1 * y2 - x2 * y1;
}

function lstArea(xy: Float64Array, en: Uint32Array, e: number): number {
  let s = 0;
  for (const [xi, eta] of GAUSS3) s += lstDetJ(xy, en, e, xi, eta);
  return s / 6;
}

/** index of the node nearest to p within tol, or −1 */
export function findNode(mesh: Pick<Mesh, 'xy'>, p: readonly [number, number], tol: number): number {
  const xy = mesh.xy;
  let best = -1;
  let bd = tol;
  for (let n = 0; n < xy.length / 2; n++) {
    const d = Math.hypot(xy[2 * n] - p[0], xy[2 * n + 1] - p[1]);
    if (d <= bd) {
      bd = d;
      best = n;
    }
  }
  return best;
}

/**
 * Neighbouring element across each edge: entry 3e + i is the element across local edge i of
 * element e (edge 0: nodes 0→1, edge 1: 1→2, edge 2: 2→0), NO_ELEM on the boundary.
 */
export function elementNeighbors(mesh: Pick<Mesh, 'elemNodes' | 'nodesPerElem' | 'nVertices'>): Int32Array {
  const { elemNodes: en, nodesPerElem: npe, nVertices: nV } = mesh;
  const nE = en.length / npe;
  // half-edges grouped by start vertex
  const start = new Int32Array(nV + 1);
  for (let e = 0; e < nE; e++) for (let i = 0; i < 3; i++) start[en[npe * e + i] + 1]++;
  for (let v = 0; v < nV; v++) start[v + 1] += start[v];
  const fill = start.slice(0, nV);
  const half = new Int32Array(3 * nE);
  for (let e = 0; e < nE; e++) for (let i = 0; i < 3; i++) half[fill[en[npe * e + i]]++] = 3 * e + i;
  const nb = new Int32Array(3 * nE).fill(NO_ELEM);
  for (let e = 0; e < nE; e++) {
    for (let i = 0; i < 3; i++) {
      const a = en[npe * e + i];
      const b = en[npe * e + ((i + 1) % 3)];
      // the twin runs b → a
      for (let k = start[b]; k < start[b + 1]; k++) {
        const h = half[k];
        const f = (h / 3) | 0;
        const j = h % 3;
        if (en[npe * f + ((j + 1) % 3)] === a) {
          nb[3 * e + i] = f;
          break;
        }
      }
    }
  }
  return nb;
}

/** elements touching each node (all nodes, mid-side included): elems[offsets[n] … offsets[n+1]−1] */
export function nodeToElements(mesh: Pick<Mesh, 'xy' | 'elemNodes' | 'nodesPerElem'>): { offsets: Int32Array; elems: Int32Array } {
  const { elemNodes: en, nodesPerElem: npe } = mesh;
  const nN = mesh.xy.length / 2;
  const nE = en.length / npe;
  const offsets = new Int32Array(nN + 1);
  for (let i = 0; i < en.length; i++) offsets[en[i] + 1]++;
  for (let n = 0; n < nN; n++) offsets[n + 1] += offsets[n];
  const fill = offsets.slice(0, nN);
  const elems = new Int32Array(en.length);
  for (let e = 0; e < nE; e++) for (let k = 0; k < npe; k++) elems[fill[en[npe * e + k]]++] = e;
  return { offsets, elems };
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
  for (let e = 0; e < nE; e++) {
    const a = en[npe * e], b = en[npe * e + 1], c = en[npe * e + 2];
    const d = (xy[2 * b] - xy[2 * a]) * (xy[2 * c + 1] - xy[2 * a + 1]) - (xy[2 * b + 1] - xy[2 * a + 1]) * (xy[2 * c] - xy[2 * a]);
    if (!(d > 0)) say(`element ${e} is not counter-clockwise (2·area ${d})`);
    if (npe === 6) {
      for (const [xi, eta] of [...GAUSS3, [0, 0], [1, 0], [0, 1]]) {
        if (!(lstDetJ(xy, en, e, xi, eta) > 0)) {
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
