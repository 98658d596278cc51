/** meshPlate: the mesh stage's entry point. */
import type { PlateGeometry } from '../geometry/types.js';
import type { Mesh, MeshOptions } from './types.js';
import { GeometryError, MeshError } from '../errors.js';
import { crossingSegments, discretiseBoundary, splitSegmentsOnCurve } from './boundary.js';
import { initialTriangulation } from './cdt.js';
import { refineMesh } from './refine.js';
import { buildMeshOutput } from './output.js';
import { INSERT_REJECTED, V_FREE } from './trimesh.js';
import type { TriMesh } from './trimesh.js';
import { curveLen } from './curves.js';
import { sizeFieldAbout } from './sizefield.js';

export const DEFAULT_MIN_ANGLE_DEG = 28;
export const DEFAULT_MAX_VERTICES = 3_000_000;
/** a triangle is split when its longest edge exceeds this multiple of the local size */
export const SIZE_FACTOR = 1.45;

/**
 * Mesh a plate: boundary discretisation, constrained Delaunay triangulation, Delaunay
 * refinement to the size field and angle target, then mid-side nodes for order 2.
 */
export function meshPlate(geom: PlateGeometry, opts: MeshOptions): Mesh {
  if (typeof opts.sizeAt !== 'function') throw new MeshError('mesh options need a sizeAt(x, y) function');
  if (opts.order !== 1 && opts.order !== 2) throw new MeshError(`mesh order must be 1 or 2, got ${String(opts.order)}`, 'mesh.order');
  const minAngleDeg = opts.minAngleDeg ?? DEFAULT_MIN_ANGLE_DEG;
  if (!(minAngleDeg > 0 && minAngleDeg <= 34)) {
    throw new MeshError(`minimum angle target must be in (0°, 34°], got ${minAngleDeg}°`);
  }
  const maxVertices = opts.maxVertices ?? DEFAULT_MAX_VERTICES;
  if (!(maxVertices >= 3)) throw new MeshError(`maxVertices must be ≥ 3, got ${maxVertices}`);
  if (!geom || !Array.isArray(geom.pieces) || geom.pieces.length === 0 || !Array.isArray(geom.loops) || geom.loops.length === 0) {
    throw new MeshError('plate geometry has no boundary pieces');
  }
  if (!(geom.scale > 0)) throw new MeshError(`plate geometry scale must be > 0, got ${geom.scale}`);
  if (!geom.local) return meshAbout(geom, opts, minAngleDeg, maxVertices, [0, 0]);
  // mesh the copy about the plate's centre, then move the nodes to where the plate is: the mesh
  // is then the same wherever the plate sits (up to the rounding of that last addition)
  const { origin, geometry } = geom.local;
  const [ox, oy] = origin;
  const local = meshAbout(geometry, {
    ...opts,
    sizeAt: sizeFieldAbout(opts.sizeAt, origin),
    requiredPoints: (opts.requiredPoints ?? []).map(([x, y]) => [x - ox, y - oy] as const),
  }, minAngleDeg, maxVertices, origin);
  for (let k = 0; k < local.xy.length; k += 2) {
    local.xy[k] += ox;
    local.xy[k + 1] += oy;
  }
  return local;
}

function meshAbout(geom: PlateGeometry, opts: MeshOptions, minAngleDeg: number, maxVertices: number, origin: readonly [number, number]): Mesh {
  const tol = 1e-9 * geom.scale;
  for (const piece of geom.pieces) {
    const len = curveLen(piece.curve);
    if (!(len > 1e-9 * geom.scale)) {
      throw new GeometryError(
        `${piece.keyPath}: boundary piece of length ${len.toPrecision(3)} is too short to mesh on a plate of size ${geom.scale.toPrecision(4)} (a fillet or edge that small should be left out)`,
        piece.keyPath,
      );
    }
  }
  const required = opts.requiredPoints ?? [];

  const b = discretiseBoundary(geom, opts.sizeAt, required, tol, origin);
  // chords of neighbouring curves can cross where the curves do not: split them until clear
  for (let round = 0; ; round++) {
    const bad = crossingSegments(b);
    if (bad.length === 0) break;
    const allCurved = splitSegmentsOnCurve(geom, b, bad);
    if (!allCurved || round > 12) {
      const s = bad[0];
      const piece = geom.pieces[b.segPiece[s]];
      const other = geom.pieces[b.segPiece[bad[bad.length - 1]]];
      throw new GeometryError(
        `boundary pieces cross or touch: ${piece.keyPath} (${piece.loop}) and ${other.keyPath} (${other.loop})`,
        piece.keyPath,
      );
    }
  }
  const m = initialTriangulation(geom, b, Math.min(maxVertices, estimateVertices(geom, opts.sizeAt) + b.piece.length));
  for (const [x, y] of b.interior) insertRequired(m, x, y, tol, origin);
  refineMesh(m, geom, { sizeAt: opts.sizeAt, minAngleDeg, maxVertices, sizeFactor: SIZE_FACTOR, origin });
  return buildMeshOutput(m, geom, opts.order);
}

function insertRequired(m: TriMesh, x: number, y: number, tol: number, origin: readonly [number, number]): void {
  const point: [number, number] = [x + origin[0], y + origin[1]];
  const at = `(${Number(point[0].toPrecision(12))}, ${Number(point[1].toPrecision(12))})`;
  for (let v = 0; v < m.nV; v++) {
    if (Math.hypot(m.xy[2 * v] - x, m.xy[2 * v + 1] - y) <= tol) return;
  }
  let found = -1;
  for (let t = 0; t < m.nT && found < 0; t++) {
    const a = m.tri[3 * t], b = m.tri[3 * t + 1], c = m.tri[3 * t + 2];
    if (m.orientP(a, b, x, y) >= 0 && m.orientP(b, c, x, y) >= 0 && m.orientP(c, a, x, y) >= 0) found = t;
  }
  if (found < 0) throw new MeshError(`required point ${at} lies outside the plate (not inside the outline, or inside an opening)`, undefined, point);
  const p = m.addVertex(x, y, V_FREE, 0);
  if (m.insertVertex(p, found, -1, false) === INSERT_REJECTED) {
    m.popVertex();
    throw new MeshError(`required point ${at} could not be inserted (too close to the boundary?)`, undefined, point);
  }
}

/**
 * Vertex count the refinement will reach, from the size field sampled on a 48 × 48 grid over
 * the bounding box (an equilateral triangle of edge f·h has area √3/4·(f·h)²; a triangulation has
 * about half as many vertices as triangles). Used only to size the arrays once.
 */
function estimateVertices(geom: PlateGeometry, sizeAt: (x: number, y: number) => number): number {
  const { minX, minY, maxX, maxY } = geom.bbox;
  const n = 48;
  const dx = (maxX - minX) / n;
  const dy = (maxY - minY) / n;
  let tris = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const h = SIZE_FACTOR * sizeAt(minX + (i + 0.5) * dx, minY + (j + 0.5) * dy);
      if (h > 0 && Number.isFinite(h)) tris += (dx * dy) / ((Math.sqrt(3) / 4) * h * h);
    }
  }
  const fill = geom.area / Math.max((maxX - minX) * (maxY - minY), 1e-300);
  // 1.2, not the 0.5 of "half as many vertices as triangles": refined triangles are smaller than
  // the size bound (measured: vertices = 0.87–1.14 × tris on the demos and a 300 000-vertex
  // plate), and every growth of the arrays copies all of them (0.13 s at 300 000 vertices)
  return Math.ceil(1.2 * tris * Math.min(1, fill * 1.1)) + 64;
}
