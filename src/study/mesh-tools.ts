import type { Mesh } from '../mesh/types.js';
import type { Point } from '../model/types.js';

/** Nearest node to p among the vertex nodes (ids < nVertices). */
export function nearestVertex(mesh: Pick<Mesh, 'xy' | 'nVertices'>, p: Point): { node: number; distance: number } {
  let best = -1, bd = Infinity;
  for (let n = 0; n < mesh.nVertices; n++) {
    const d = Math.hypot(mesh.xy[2 * n] - p[0], mesh.xy[2 * n + 1] - p[1]);
    if (d < bd) { bd = d; best = n; }
  }
  return { node: best, distance: bd };
}

/** Vertex–vertex adjacency in CSR form (through the element corners). */
export function vertexNeighbours(mesh: Pick<Mesh, 'elemNodes' | 'nodesPerElem' | 'nVertices'>): { ptr: Int32Array; adj: Int32Array } {
  const nV = mesh.nVertices, npe = mesh.nodesPerElem;
  const nE = mesh.elemNodes.length / npe;
  const sets: Set<number>[] = Array.from({ length: nV }, () => new Set<number>());
  for (let e = 0; e < nE; e++) {
    const a = mesh.elemNodes[npe * e], b = mesh.elemNodes[npe * e + 1], c = mesh.elemNodes[npe * e + 2];
    sets[a].add(b).add(c); sets[b].add(a).add(c); sets[c].add(a).add(b);
  }
  const ptr = new Int32Array(nV + 1);
  for (let n = 0; n < nV; n++) ptr[n + 1] = ptr[n] + sets[n].size;
  const adj = new Int32Array(ptr[nV]);
  for (let n = 0; n < nV; n++) {
    let k = ptr[n];
    for (const m of [...sets[n]].sort((x, y) => x - y)) adj[k++] = m;
  }
  return { ptr, adj };
}

/** Boundary edges arriving at and leaving a node (material on the left of a → b). */
export function boundaryEdgesAt(mesh: Pick<Mesh, 'boundaryEdges' | 'edgeStride'>, node: number): { incoming: number[]; outgoing: number[] } {
  const s = mesh.edgeStride, be = mesh.boundaryEdges;
  const incoming: number[] = [], outgoing: number[] = [];
  for (let e = 0; e < be.length / s; e++) {
    if (be[s * e + 1] === node) incoming.push(e);
    if (be[s * e] === node) outgoing.push(e);
  }
  return { incoming, outgoing };
}

/** unit direction of boundary edge e (a → b) */
export function edgeDirection(mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride'>, e: number): Point {
  const s = mesh.edgeStride;
  const a = mesh.boundaryEdges[s * e], b = mesh.boundaryEdges[s * e + 1];
  const dx = mesh.xy[2 * b] - mesh.xy[2 * a], dy = mesh.xy[2 * b + 1] - mesh.xy[2 * a + 1];
  const l = Math.hypot(dx, dy);
  return [dx / l, dy / l];
}

/**
 * Interior (material) angle at a boundary node and the unit bisector pointing into the material, from the
 * arriving edge direction dIn and the leaving one dOut: material is on the left, so the wedge is swept by
 * turning dOut counter-clockwise until it meets −dIn.
 */
export function wedgeAt(dIn: Point, dOut: Point): { angleDeg: number; bisector: Point } {
  const back: Point = [-dIn[0], -dIn[1]];
  let ang = Math.atan2(dOut[0] * back[1] - dOut[1] * back[0], dOut[0] * back[0] + dOut[1] * back[1]);
  if (ang <= 1e-12) ang += 2 * Math.PI;
  const h = ang / 2;
  const c = Math.cos(h), s = Math.sin(h);
  return { angleDeg: (ang * 180) / Math.PI, bisector: [c * dOut[0] - s * dOut[1], s * dOut[0] + c * dOut[1]] };
}

/** Smallest interior angle of the elements' corner triangles, degrees. */
export function minAngleDeg(mesh: Pick<Mesh, 'xy' | 'elemNodes' | 'nodesPerElem'>): number {
  const npe = mesh.nodesPerElem, xy = mesh.xy;
  let best = 180;
  for (let e = 0; e < mesh.elemNodes.length / npe; e++) {
    const n = [mesh.elemNodes[npe * e], mesh.elemNodes[npe * e + 1], mesh.elemNodes[npe * e + 2]];
    for (let i = 0; i < 3; i++) {
      const o = n[i], p = n[(i + 1) % 3], q = n[(i + 2) % 3];
      const ax = xy[2 * p] - xy[2 * o], ay = xy[2 * p + 1] - xy[2 * o + 1];
      const bx = xy[2 * q] - xy[2 * o], by = xy[2 * q + 1] - xy[2 * o + 1];
      const a = (Math.atan2(Math.abs(ax * by - ay * bx), ax * bx + ay * by) * 180) / Math.PI;
      if (a < best) best = a;
    }
  }
  return best;
}
