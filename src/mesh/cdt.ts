/**
 * Initial constrained Delaunay triangulation of the boundary points: `delaunator` triangulates
 * the convex hull, `@kninnug/constrainautor` (Sloan 1993 style edge flipping) recovers the
 * segments, then a flood fill bounded by the segments keeps only the plate's triangles.
 */
import Delaunator from 'delaunator';
import ConstrainautorModule from '@kninnug/constrainautor';
import type { PlateGeometry } from '../geometry/types.js';
import { MeshError } from '../errors.js';
import type { BoundaryPoints } from './boundary.js';
import { splitSegmentsOnCurve } from './boundary.js';
import { TriMesh, V_JUNCTION } from './trimesh.js';

// The package ships TypeScript source typed as a CommonJS module while Node loads its ESM build;
// take the class from either shape.
type ConstrainautorCtor = new (
  del: { coords: ArrayLike<number>; triangles: Uint32Array; halfedges: Int32Array },
  edges?: readonly [number, number][],
) => { constrainOne(a: number, b: number): number };
const Constrainautor = ((ConstrainautorModule as unknown as { default?: unknown }).default ??
  ConstrainautorModule) as unknown as ConstrainautorCtor;

/**
 * Triangulate and recover the segments. The segment-recovery library can give up on nearly
 * degenerate configurations (points almost on a segment); the segment it failed on is then
 * split at its curve mid-parameter and the whole boundary is triangulated again.
 */
export function initialTriangulation(geom: PlateGeometry, b: BoundaryPoints, vCapHint: number): TriMesh {
  for (let attempt = 0; ; attempt++) {
    const r = tryTriangulate(geom, b, vCapHint);
    if (r instanceof TriMesh) return r;
    if (attempt >= 24) {
      const piece = geom.pieces[b.segPiece[r.segment]];
      throw new MeshError(
        `could not recover the plate boundary near ${piece.keyPath} (${r.message}); ` +
          `two boundary pieces probably come closer than the boundary segment sag — refine mesh.size near them`,
        piece.keyPath,
      );
    }
    splitSegmentsOnCurve(geom, b, [r.segment], true);
  }
}

function tryTriangulate(geom: PlateGeometry, b: BoundaryPoints, vCapHint: number): TriMesh | { segment: number; message: string } {
  const n = b.piece.length;
  const coords = Float64Array.from(b.xy);
  let del: Delaunator<ArrayLike<number>>;
  try {
    del = new Delaunator(coords);
  } catch (e) {
    throw new MeshError(`Delaunay triangulation of ${n} boundary points failed: ${(e as Error).message}`);
  }
  const ns = b.segA.length;
  const con = new Constrainautor(del);
  for (let s = 0; s < ns; s++) {
    try {
      con.constrainOne(b.segA[s], b.segB[s]);
    } catch (e) {
      return { segment: s, message: (e as Error).message };
    }
  }
  // segment lookup by directed end points
  const segOf = new Map<number, number>();
  for (let s = 0; s < ns; s++) segOf.set(b.segA[s] * n + b.segB[s], s);

  const dt = del.triangles;
  const dh = del.halfedges;
  const nt = (dt.length / 3) | 0;
  // delaunator triangles are clockwise (y up); ours are counter-clockwise: (v0, v2, v1),
  // and delaunator half-edge 3t + j maps to our 3t + (2 − j) (same edge, reversed)
  const tri = new Int32Array(3 * nt);
  const twin = new Int32Array(3 * nt);
  for (let t = 0; t < nt; t++) {
    for (let j = 0; j < 3; j++) {
      const e = 3 * t + j;
      const mine = 3 * t + (2 - j);
      // our half-edge `mine` runs from the end of delaunator's e to its start
      tri[mine] = dt[j === 2 ? 3 * t : e + 1];
      const o = dh[e];
      twin[mine] = o < 0 ? -1 : 3 * ((o / 3) | 0) + (2 - (o % 3));
    }
  }
  // flood fill from the left side of every segment, never across a segment
  const state = new Int8Array(nt); // 0 unknown, 1 inside, −1 outside
  const stack: number[] = [];
  const isSeg = (u: number, v: number) => segOf.has(u * n + v) || segOf.has(v * n + u);
  for (let e = 0; e < 3 * nt; e++) {
    const u = tri[e];
    const v = tri[e % 3 === 2 ? e - 2 : e + 1];
    const t = (e / 3) | 0;
    if (segOf.has(u * n + v)) {
      if (state[t] === -1) throw new MeshError('boundary orientation is inconsistent (a loop is not closed or crosses another)', 'plate');
      if (state[t] === 0) {
        state[t] = 1;
        stack.push(t);
      }
    }
  }
  while (stack.length) {
    const t = stack.pop()!;
    for (let j = 0; j < 3; j++) {
      const e = 3 * t + j;
      const o = twin[e];
      if (o < 0) continue;
      if (isSeg(tri[e], tri[j === 2 ? e - 2 : e + 1])) continue;
      const ot = (o / 3) | 0;
      if (state[ot] === 0) {
        state[ot] = 1;
        stack.push(ot);
      }
    }
  }
  const newId = new Int32Array(nt).fill(-1);
  let nIn = 0;
  for (let t = 0; t < nt; t++) if (state[t] === 1) newId[t] = nIn++;
  if (nIn === 0) throw new MeshError('no triangle lies inside the plate outline', 'plate.outline');

  const vCap = Math.max(2 * n, vCapHint);
  const m = new TriMesh(vCap, 2 * vCap + 16);
  for (let i = 0; i < n; i++) m.addVertex(b.xy[2 * i], b.xy[2 * i + 1], b.piece[i] === -2 ? V_JUNCTION : b.piece[i], b.t[i]);
  m.ensureTris(nIn);
  for (let t = 0; t < nt; t++) {
    const T = newId[t];
    if (T < 0) continue;
    for (let j = 0; j < 3; j++) {
      const e = 3 * t + j;
      const E = 3 * T + j;
      m.tri[E] = tri[e];
      const o = twin[e];
      const ot = o < 0 ? -1 : newId[(o / 3) | 0];
      const u = tri[e];
      const v = tri[j === 2 ? e - 2 : e + 1];
      const s = segOf.get(u * n + v);
      if (s !== undefined) {
        m.twin[E] = -1;
        m.sPiece[E] = b.segPiece[s];
        m.sT0[E] = b.segT0[s];
        m.sT1[E] = b.segT1[s];
      } else if (ot < 0) {
        throw new MeshError('the plate boundary is not closed: an inside triangle borders the outside without a segment', 'plate');
      } else m.twin[E] = 3 * ot + (o % 3);
    }
  }
  m.nT = nIn;
  // every segment must border exactly one inside triangle
  let nBoundary = 0;
  for (let e = 0; e < 3 * nIn; e++) if (m.twin[e] < 0) nBoundary++;
  if (nBoundary !== ns) {
    throw new MeshError(`boundary recovery left ${ns - nBoundary} segment(s) without an inside triangle; check that openings lie inside the outline`, 'plate.openings');
  }
  // mark acute input corners (sharper than 60°)
  const cornerKey = new Map<string, number>();
  for (let i = 0; i < n; i++) if (b.piece[i] === -2) cornerKey.set(`${b.xy[2 * i]},${b.xy[2 * i + 1]}`, i);
  for (const c of geom.corners) {
    if (c.interiorAngleDeg < 60) {
      const v = cornerKey.get(`${c.at[0]},${c.at[1]}`);
      if (v !== undefined) m.vAcute[v] = 1;
    }
  }
  return m;
}
