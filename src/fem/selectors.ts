import { FemError } from '../errors.js';
import { closestOnCurve, curveEnd, curvePoint, curveStart, loopPolyline, pointInMaterial } from '../geometry/index.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { Mesh } from '../mesh/types.js';
import type { AnyLoad, ModelWarning, Point, Selector, Support } from '../model/types.js';

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
    case 'piece':
      return `{ piece: [${fmt(selector.at[0])}, ${fmt(selector.at[1])}] }`;
  }
}

/** A point of the boundary: where, on which piece (PlateGeometry.pieces index) at which parameter, how far from the query. */
export interface BoundaryPointHit {
  point: Point;
  piece: number;
  t: number;
  distance: number;
}

/**
 * The boundary point nearest p over every piece of the geometry (the target of a point selector, design §3).
 * A point within SELECTOR_TOLERANCE · scale of a piece end is that end exactly (the junction is a mesh vertex
 * already; a vertex a hair's breadth from it would only spoil the mesh). Ties go to the lower piece id.
 */
export function nearestBoundaryPoint(geom: Pick<PlateGeometry, 'pieces' | 'scale'>, p: Point): BoundaryPointHit {
  const tol = SELECTOR_TOLERANCE * geom.scale;
  let best: BoundaryPointHit = { point: [p[0], p[1]], piece: -1, t: 0, distance: Infinity };
  for (const piece of geom.pieces) {
    const c = closestOnCurve(piece.curve, p);
    if (c.distance < best.distance) best = { point: c.point, piece: piece.id, t: c.t, distance: c.distance };
  }
  if (best.piece < 0) return best;
  const curve = geom.pieces[best.piece].curve;
  for (const [end, t] of [[curveStart(curve), 0], [curveEnd(curve), 1]] as const) {
    if (Math.hypot(end[0] - best.point[0], end[1] - best.point[1]) <= tol) {
      return { point: [end[0], end[1]], piece: best.piece, t, distance: Math.hypot(end[0] - p[0], end[1] - p[1]) };
    }
  }
  return best;
}

/**
 * The boundary piece a `{ piece: [x, y] }` selector means: the one nearest the point. A point about as near
 * to two pieces (within the selector tolerance: a corner, a junction) is ambiguous and a FemError naming keyPath.
 */
export function pieceNearest(geom: Pick<PlateGeometry, 'pieces' | 'scale'>, p: Point, keyPath: string): number {
  const tol = SELECTOR_TOLERANCE * geom.scale;
  const d = geom.pieces.map((piece) => closestOnCurve(piece.curve, p).distance);
  let best = -1;
  for (let i = 0; i < d.length; i++) if (best < 0 || d[i] < d[best]) best = i;
  if (best < 0) throw new FemError('the geometry has no boundary pieces', keyPath);
  const rival = d.findIndex((v, i) => i !== best && v <= d[best] + tol);
  if (rival >= 0) {
    const name = (i: number) => `${geom.pieces[i].keyPath} (${geom.pieces[i].role})`;
    throw new FemError(
      `{ piece: [${fmt(p[0])}, ${fmt(p[1])}] } is as near to ${name(Math.min(best, rival))} as to ${name(Math.max(best, rival))}; `
        + 'give a point on (or nearer to) the one piece you mean, away from its ends',
      keyPath,
    );
  }
  return best;
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
 * `opening` and `outline` take every edge of that loop; `piece` every edge of the boundary piece nearest
 * its point; `point` the boundary vertex at the boundary point nearest to it (nearestBoundaryPoint), which
 * must lie within the tolerance (a point outside the outline or inside an opening is an error) — `selectorVertices` gives the mesher those points as required vertices,
 * for forces and supports alike, so an interior node is never picked.
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
    const hit = geom.pieces.length > 0 ? nearestBoundaryPoint(geom, selector.at) : undefined;
    if (hit && hit.distance > tol && geom.loops.length > 0 && !pointInMaterial(geom as PlateGeometry, selector.at)) {
      throw new FemError(`point (${fmt(selector.at[0])}, ${fmt(selector.at[1])}) lies outside the plate (not inside the outline, or inside an opening)`, keyPath);
    }
    const target = hit ? hit.point : selector.at;
    const [px, py] = target;
    let best = -1;
    let bestD = Infinity;
    // boundary vertices only (the two ends of each boundary edge)
    for (let e = 0; e < nEdges; e++) {
      for (let j = 0; j < 2; j++) {
        const n = boundaryEdges[stride * e + j];
        const d = Math.hypot(xy[2 * n] - px, xy[2 * n + 1] - py);
        if (d < bestD || (d === bestD && n < best)) {
          bestD = d;
          best = n;
        }
      }
    }
    if (best < 0 || bestD > tol) {
      const near = best < 0 ? 'the mesh has no boundary nodes' : `nearest boundary node is ${best} at (${fmt(xy[2 * best])}, ${fmt(xy[2 * best + 1])}) at distance ${fmt(bestD)}`;
      const moved = px !== selector.at[0] || py !== selector.at[1] ? `, the boundary point nearest to (${fmt(selector.at[0])}, ${fmt(selector.at[1])})` : '';
      throw new FemError(`no node at point (${fmt(px)}, ${fmt(py)})${moved}; ${near} (tolerance ${fmt(tol)}; mesh with selectorVertices as required points)`, keyPath);
    }
    return { edges: new Int32Array(0), nodes: Int32Array.of(best) };
  }

  const picked = new Int32Array(nEdges);
  let count = 0;
  if (selector.kind === 'piece') {
    const piece = pieceNearest(geom, selector.at, keyPath);
    for (let e = 0; e < nEdges; e++) if (mesh.boundaryPiece[e] === piece) picked[count++] = e;
  } else if (selector.kind === 'opening' || selector.kind === 'outline') {
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

/** Convex hull of points, counter-clockwise (A. M. Andrew, "Another efficient algorithm for convex hulls in two dimensions", Inf. Process. Lett. 9 (1979) 216–219). */
function convexHull(points: readonly Point[]): Point[] {
  const p = [...points].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  if (p.length < 3) return p;
  const cross = (o: Point, a: Point, b: Point) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
  const lower: Point[] = [], upper: Point[] = [];
  for (const q of p) {
    while (lower.length >= 2 && cross(lower[lower.length - 2], lower[lower.length - 1], q) <= 0) lower.pop();
    lower.push(q);
  }
  for (let i = p.length - 1; i >= 0; i--) {
    const q = p[i];
    while (upper.length >= 2 && cross(upper[upper.length - 2], upper[upper.length - 1], q) <= 0) upper.pop();
    upper.push(q);
  }
  return lower.slice(0, -1).concat(upper.slice(0, -1));
}

/**
 * The outline's far edges (issue 12 §10): the outline pieces that lie on its convex hull. A piece with a point
 * deeper inside the hull than SELECTOR_TOLERANCE · scale (7 points across it; curves drawn with chords of at
 * most scale/400) is a notch, slit or crack face, a re-entrant edge or fillet: a far-field stress does not act
 * there. Convex arcs bulge out of the hull of their chords and count as far edges.
 */
export function outlineFarPieces(geom: Pick<PlateGeometry, 'pieces' | 'loops' | 'scale'>): Set<number> {
  const outline = geom.loops.find((l) => !l.hole);
  const far = new Set<number>();
  if (!outline) return far;
  const hull = convexHull(loopPolyline(geom as PlateGeometry, outline.id, geom.scale / 400));
  const tol = SELECTOR_TOLERANCE * geom.scale;
  // depth of p inside the hull: the smallest distance to its edges' lines, ≤ 0 outside
  const depth = (p: Point) => {
    let d = Infinity;
    for (let i = 0; i < hull.length; i++) {
      const a = hull[i], b = hull[(i + 1) % hull.length];
      const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
      if (len === 0) continue;
      d = Math.min(d, ((b[0] - a[0]) * (p[1] - a[1]) - (b[1] - a[1]) * (p[0] - a[0])) / len);
    }
    return d;
  };
  for (const id of outline.pieces) {
    const c = geom.pieces[id].curve;
    let inside = false;
    for (let k = 1; k <= 7 && !inside; k++) inside = depth(curvePoint(c, k / 8)) > tol;
    if (!inside) far.add(id);
  }
  return far;
}

/**
 * The edges a far-field stress load acts on: on `{ outline: true }`, only the outline's far edges
 * (outlineFarPieces) — on a notch, slit or crack face the traction σ·n of the uncracked plate would undo the
 * notch (the plate would carry the uniform state and nothing else); any other selector as it selects.
 */
export function farFieldEdges(mesh: Pick<Mesh, 'boundaryPiece'>, geom: Pick<PlateGeometry, 'pieces' | 'loops' | 'scale'>, where: Selector, edges: Int32Array): Int32Array {
  if (where.kind !== 'outline') return edges;
  const far = outlineFarPieces(geom);
  const kept = edges.filter((e) => far.has(mesh.boundaryPiece[e]));
  return kept.length > 0 ? kept : edges;
}

/** A load as the selector checks see it: its selector, absent for a body load (gravity, spin, temperature). */
export interface SelectedLoad {
  kind: string;
  keyPath: string;
  where?: Selector;
}

/**
 * Selector warnings that need the geometry (issue 12 §4, §10), with the key they concern: a point selector whose
 * point is off the boundary (the nearest boundary point is used), and a far-field stress on the outline that
 * leaves notch, slit or crack faces free — or, selected explicitly, loads them.
 */
export function selectorWarnings(
  model: { supports: readonly Pick<Support, 'where' | 'keyPath'>[]; loads: readonly SelectedLoad[]; fieldLoads?: readonly SelectedLoad[] },
  geom: Pick<PlateGeometry, 'pieces' | 'loops' | 'scale'>,
): ModelWarning[] {
  const out: ModelWarning[] = [];
  const tol = SELECTOR_TOLERANCE * geom.scale;
  const all = [...model.supports.map((s) => ({ ...s, kind: 'support' as const })), ...model.loads, ...(model.fieldLoads ?? [])];
  for (const item of all) {
    // body loads (gravity, spin, temperature) select nothing
    if (item.where?.kind !== 'point') continue;
    const hit = nearestBoundaryPoint(geom, item.where.at);
    if (hit.distance > tol && pointInMaterial(geom as PlateGeometry, item.where.at)) {
      out.push({
        keyPath: `${item.keyPath}.where`,
        message: `the point (${fmt(item.where.at[0])}, ${fmt(item.where.at[1])}) is not on the boundary; the nearest boundary point (${fmt(hit.point[0])}, ${fmt(hit.point[1])}), ${fmt(hit.distance)} away, is used`,
      });
    }
  }
  let far: Set<number> | undefined;
  for (const l of [...model.loads, ...(model.fieldLoads ?? [])]) {
    if (l.kind !== 'stress' || l.where === undefined) continue;
    far ??= outlineFarPieces(geom);
    const outline = geom.loops.find((lp) => !lp.hole);
    const faces = (outline?.pieces ?? []).filter((id) => !far!.has(id));
    if (faces.length === 0) continue;
    const names = [...new Set(faces.map((id) => geom.pieces[id].keyPath))].join(', ');
    if (l.where.kind === 'outline') {
      out.push({
        keyPath: l.keyPath,
        message: `the far-field stress acts on the outline's far edges only: ${faces.length} face${faces.length === 1 ? '' : 's'} inside its convex hull (notch, slit or crack faces: ${names}) stay free; select them explicitly to load them`,
      });
    } else if (l.where.kind === 'piece' || l.where.kind === 'segment' || l.where.kind === 'x' || l.where.kind === 'y') {
      const w = l.where;
      const onFace = faces.some((id) => {
        const c = geom.pieces[id].curve;
        const mid = curvePoint(c, 0.5);
        if (w.kind === 'piece') return pieceNearest(geom, w.at, l.keyPath) === id;
        if (w.kind === 'x') return Math.abs(mid[0] - w.value) <= tol && Math.abs(curveStart(c)[0] - w.value) <= tol;
        if (w.kind === 'y') return Math.abs(mid[1] - w.value) <= tol && Math.abs(curveStart(c)[1] - w.value) <= tol;
        return distanceToSegment(mid[0], mid[1], w.from[0], w.from[1], w.to[0], w.to[1]) <= tol;
      });
      if (onFace) {
        out.push({
          keyPath: l.keyPath,
          message: 'the far-field stress lands on a face inside the outline\'s convex hull (a notch, slit or crack face): that face carries σ·n of the uncracked plate, which cancels the notch; select only the far edges if it should be free',
        });
      }
    }
  }
  return out;
}
