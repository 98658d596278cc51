import { FemError } from '../errors.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { Mesh } from '../mesh/types.js';
import type { Selector } from '../model/types.js';

/** relative tolerance of selectors: a node matches a line or point within this · geometry scale */
export const SELECTOR_TOLERANCE = 1e-6;

export interface Selection {
  /** boundary edge indices (into mesh.boundaryEdges / edgeStride); empty for a point selector */
  edges: Int32Array;
  /** distinct node ids touched by the selection, ascending */
  nodes: Int32Array;
}

function fmt(v: number): string {
  return String(Number(v.toPrecision(6)));
}

/** the selector written the way the model file spells it, for messages */
export function describeSelector(selector: Selector): string {
  switch (selector.kind) {
    case 'x':
      return `{ x: ${fmt(selector.value)} }`;
    case 'y':
      return `{ y: ${fmt(selector.value)} }`;
    case 'segment':
      return `{ segment: [[${fmt(selector.from[0])}, ${fmt(selector.from[1])}], [${fmt(selector.to[0])}, ${fmt(selector.to[1])}]] }`;
    case 'opening':
      return `{ opening: ${selector.id} }`;
    case 'outline':
      return '{ outline: true }';
    case 'point':
      return `{ point: [${fmt(selector.at[0])}, ${fmt(selector.at[1])}] }`;
  }
}

/** distance from (px, py) to the segment a–b */
function distanceToSegment(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax;
  const dy = by - ay;
  const len2 = dx * dx + dy * dy;
  let s = len2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / len2 : 0;
  if (s < 0) s = 0;
  else if (s > 1) s = 1;
  return Math.hypot(px - ax - s * dx, py - ay - s * dy);
}

function nodesOfEdges(mesh: Pick<Mesh, 'boundaryEdges' | 'edgeStride'>, edges: Int32Array): Int32Array {
  const stride = mesh.edgeStride;
  const all = new Int32Array(edges.length * stride);
  let k = 0;
  for (let i = 0; i < edges.length; i++) {
    for (let j = 0; j < stride; j++) all[k++] = mesh.boundaryEdges[stride * edges[i] + j];
  }
  all.sort();
  let m = 0;
  for (let i = 0; i < all.length; i++) if (i === 0 || all[i] !== all[i - 1]) all[m++] = all[i];
  return all.slice(0, m);
}

/**
 * The boundary edges and nodes a selector picks (docs/model-format.md, `where`). Lines (`x`, `y`, `segment`)
 * take every boundary edge whose nodes all lie on them within SELECTOR_TOLERANCE · geom.scale;
 * `opening` and `outline` take every edge of that loop; `point` takes the nearest node, which
 * must lie within the tolerance (the mesher places required points as nodes).
 * A selector that matches nothing is a FemError naming keyPath.
 */
export function selectBoundary(
  mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride' | 'boundaryPiece'>,
  geom: Pick<PlateGeometry, 'pieces' | 'loops' | 'scale'>,
  selector: Selector,
  keyPath: string,
): Selection {
  const tol = SELECTOR_TOLERANCE * geom.scale;
  const { xy, boundaryEdges } = mesh;
  const stride = mesh.edgeStride;
  const nEdges = boundaryEdges.length / stride;

  if (selector.kind === 'point') {
    const [px, py] = selector.at;
    let best = -1;
    let bestD = Infinity;
    for (let n = 0; n < xy.length / 2; n++) {
      const d = Math.hypot(xy[2 * n] - px, xy[2 * n + 1] - py);
      if (d < bestD) {
        bestD = d;
        best = n;
      }
    }
    if (best < 0 || bestD > tol) {
      const near = best < 0 ? 'the mesh has no nodes' : `nearest is node ${best} at (${fmt(xy[2 * best])}, ${fmt(xy[2 * best + 1])}) at distance ${fmt(bestD)}`;
      throw new FemError(`no node at point (${fmt(px)}, ${fmt(py)}); ${near} (tolerance ${fmt(tol)})`, keyPath);
    }
    return { edges: new Int32Array(0), nodes: Int32Array.of(best) };
  }

  const picked = new Int32Array(nEdges);
  let count = 0;
  if (selector.kind === 'opening' || selector.kind === 'outline') {
    const loopId = selector.kind === 'outline' ? 'outline' : selector.id;
    const loop = geom.loops.find((l) => l.id === loopId && (selector.kind === 'outline' ? !l.hole : true));
    if (!loop) {
      const openings = geom.loops.filter((l) => l.hole).map((l) => l.id);
      throw new FemError(
        selector.kind === 'outline'
          ? 'the geometry has no outline loop'
          : `no opening with id '${loopId}' (openings: ${openings.length ? openings.join(', ') : 'none'})`,
        keyPath,
      );
    }
    const inLoop = new Uint8Array(geom.pieces.length);
    for (const p of loop.pieces) inLoop[p] = 1;
    for (let e = 0; e < nEdges; e++) {
      const piece = mesh.boundaryPiece[e];
      if (piece >= 0 && inLoop[piece]) picked[count++] = e;
    }
  } else {
    for (let e = 0; e < nEdges; e++) {
      let on = true;
      for (let j = 0; j < stride && on; j++) {
        const n = boundaryEdges[stride * e + j];
        const x = xy[2 * n];
        const y = xy[2 * n + 1];
        if (selector.kind === 'x') on = Math.abs(x - selector.value) <= tol;
        else if (selector.kind === 'y') on = Math.abs(y - selector.value) <= tol;
        else on = distanceToSegment(x, y, selector.from[0], selector.from[1], selector.to[0], selector.to[1]) <= tol;
      }
      if (on) picked[count++] = e;
    }
  }
  if (count === 0) {
    throw new FemError(`${describeSelector(selector)} matches no boundary edge of the mesh`, keyPath);
  }
  const edges = picked.slice(0, count);
  return { edges, nodes: nodesOfEdges(mesh, edges) };
}
