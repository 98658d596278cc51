import type { Curve, PlateGeometry } from '../geometry/types.js';
import type { Mesh } from '../mesh/types.js';
import type { NodalStress } from './types.js';
import { checkField, checkMesh } from './validate.js';

/** Tangential normal stress along a boundary, in travel order (material on the left). */
export interface BoundaryStress {
  /** arc length from the start of the walk (sum of node-to-node chords) */
  s: Float64Array;
  x: Float64Array;
  y: Float64Array;
  /** σt = tᵀσt with t the unit tangent of the boundary curve at the node */
  st: Float64Array;
  /** mesh node of each sample */
  node: Int32Array;
  /** boundary piece of each sample */
  piece: Int32Array;
  /** separate runs when the selected pieces do not join up (0, 1, …) */
  run: Int32Array;
}

/** Unit tangent of a curve at (x, y), in the curve's direction of travel. */
function curveTangent(c: Curve, x: number, y: number, out: Float64Array): void {
  if (c.kind === 'line') {
    const dx = c.to[0] - c.from[0];
    const dy = c.to[1] - c.from[1];
    const l = Math.hypot(dx, dy);
    out[0] = dx / l;
    out[1] = dy / l;
    return;
  }
  if (c.kind === 'arc') {
    const rx = x - c.center[0];
    const ry = y - c.center[1];
    const l = Math.hypot(rx, ry);
    const sg = c.sweep >= 0 ? 1 : -1;
    out[0] = (-sg * ry) / l;
    out[1] = (sg * rx) / l;
    return;
  }
  const cr = Math.cos(c.rotation);
  const sr = Math.sin(c.rotation);
  const qx = cr * (x - c.center[0]) + sr * (y - c.center[1]);
  const qy = -sr * (x - c.center[0]) + cr * (y - c.center[1]);
  const phi = Math.atan2(qy / c.b, qx / c.a);
  const sg = c.sweep >= 0 ? 1 : -1;
  const tx = -c.a * Math.sin(phi) * sg;
  const ty = c.b * Math.cos(phi) * sg;
  const gx = cr * tx - sr * ty;
  const gy = sr * tx + cr * ty;
  const l = Math.hypot(gx, gy);
  out[0] = gx / l;
  out[1] = gy / l;
}

/** Tangents of two pieces closer than this (radians) count as one smooth curve at their joint. */
const SMOOTH_JOINT = 0.01;

/**
 * The tangential normal stress σt along a boundary loop (its id: 'outline' or an opening id) or
 * along a list of boundary pieces — the stress that a concentration factor Kt is read from at
 * openings, notches and fillets, where the normal and shear tractions vanish. Samples are the
 * boundary nodes (with the mid-side nodes for LST) in travel order; the tangent is that of the
 * exact geometry curve. At a sharp joint between two pieces the node is listed twice, once
 * with each piece's tangent (σt jumps there); closed loops end where they began.
 */
export function boundaryTangentialStress(
  mesh: Mesh,
  geom: PlateGeometry,
  field: Pick<NodalStress, 'stress' | 'szz'>,
  loopOrPieceIds: string | readonly number[],
): BoundaryStress {
  checkMesh(mesh);
  checkField(mesh, field);
  let pieces: readonly number[];
  if (typeof loopOrPieceIds === 'string') {
    const loop = geom.loops.find((l) => l.id === loopOrPieceIds);
    if (!loop) throw new RangeError(`no boundary loop '${loopOrPieceIds}' (have ${geom.loops.map((l) => l.id).join(', ')})`);
    pieces = loop.pieces;
  } else {
    pieces = loopOrPieceIds;
  }
  for (const p of pieces) if (!geom.pieces[p]) throw new RangeError(`no boundary piece ${p}`);
  const wanted = new Set(pieces);
  const stride = mesh.edgeStride;
  const nEdges = mesh.boundaryPiece.length;
  const edgeFrom = new Map<number, number>(); // start vertex → edge
  const ends = new Set<number>();
  for (let k = 0; k < nEdges; k++) {
    if (!wanted.has(mesh.boundaryPiece[k])) continue;
    edgeFrom.set(mesh.boundaryEdges[stride * k], k);
    ends.add(mesh.boundaryEdges[stride * k + 1]);
  }
  // open runs begin where no selected edge arrives; closed loops at the first piece's start
  const starts: number[] = [];
  for (const [a, k] of edgeFrom) if (!ends.has(a)) starts.push(k);
  const used = new Uint8Array(nEdges);
  const pieceStart = (pid: number): [number, number] => {
    const c = geom.pieces[pid].curve;
    if (c.kind === 'line') return c.from;
    if (c.kind === 'arc') return [c.center[0] + c.radius * Math.cos(c.startAngle), c.center[1] + c.radius * Math.sin(c.startAngle)];
    const px = c.a * Math.cos(c.startParam);
    const py = c.b * Math.sin(c.startParam);
    return [c.center[0] + Math.cos(c.rotation) * px - Math.sin(c.rotation) * py, c.center[1] + Math.sin(c.rotation) * px + Math.cos(c.rotation) * py];
  };
  const out = { s: [] as number[], x: [] as number[], y: [] as number[], st: [] as number[], node: [] as number[], piece: [] as number[], run: [] as number[] };
  const t = new Float64Array(2);
  const t2 = new Float64Array(2);
  const sigmaT = (n: number, tx: number, ty: number) =>
    field.stress[3 * n] * tx * tx + 2 * field.stress[3 * n + 2] * tx * ty + field.stress[3 * n + 1] * ty * ty;
  let run = 0;
  const walk = (first: number): void => {
    let s = 0;
    let px = NaN;
    let py = NaN;
    const push = (n: number, pid: number, tx: number, ty: number): void => {
      const x = mesh.xy[2 * n];
      const y = mesh.xy[2 * n + 1];
      if (!Number.isNaN(px)) s += Math.hypot(x - px, y - py);
      px = x;
      py = y;
      out.s.push(s);
      out.x.push(x);
      out.y.push(y);
      out.st.push(sigmaT(n, tx, ty));
      out.node.push(n);
      out.piece.push(pid);
      out.run.push(run);
    };
    let k: number | undefined = first;
    let prevPiece = -1;
    while (k !== undefined && !used[k]) {
      used[k] = 1;
      const pid = mesh.boundaryPiece[k];
      const curve = geom.pieces[pid].curve;
      const a = mesh.boundaryEdges[stride * k];
      const b = mesh.boundaryEdges[stride * k + 1];
      curveTangent(curve, mesh.xy[2 * a], mesh.xy[2 * a + 1], t);
      if (prevPiece < 0) {
        push(a, pid, t[0], t[1]);
      } else if (prevPiece !== pid) {
        // joint between pieces: smooth (e.g. a fillet's tangent point) → one sample, else two
        const prev = geom.pieces[prevPiece].curve;
        curveTangent(prev, mesh.xy[2 * a], mesh.xy[2 * a + 1], t2);
        const turn = Math.abs(Math.atan2(t2[0] * t[1] - t2[1] * t[0], t2[0] * t[0] + t2[1] * t[1]));
        if (turn >= SMOOTH_JOINT) push(a, pid, t[0], t[1]);
        else {
          const l = Math.hypot(t[0] + t2[0], t[1] + t2[1]);
          out.st[out.st.length - 1] = sigmaT(a, (t[0] + t2[0]) / l, (t[1] + t2[1]) / l);
        }
      }
      if (stride === 3) {
        const m = mesh.boundaryEdges[stride * k + 2];
        curveTangent(curve, mesh.xy[2 * m], mesh.xy[2 * m + 1], t);
        push(m, pid, t[0], t[1]);
      }
      curveTangent(curve, mesh.xy[2 * b], mesh.xy[2 * b + 1], t);
      push(b, pid, t[0], t[1]);
      prevPiece = pid;
      k = edgeFrom.get(b);
    }
    run++;
  };
  for (const k of starts) walk(k);
  // closed loops: start at the edge nearest the start of the first listed piece still unused
  for (;;) {
    let bestK = -1;
    let bestD = Infinity;
    for (const pid of pieces) {
      const [sx, sy] = pieceStart(pid);
      for (const [a, k] of edgeFrom) {
        if (used[k] || mesh.boundaryPiece[k] !== pid) continue;
        const d = Math.hypot(mesh.xy[2 * a] - sx, mesh.xy[2 * a + 1] - sy);
        if (d < bestD) {
          bestD = d;
          bestK = k;
        }
      }
      if (bestK >= 0) break;
    }
    if (bestK < 0) break;
    walk(bestK);
  }
  return {
    s: Float64Array.from(out.s),
    x: Float64Array.from(out.x),
    y: Float64Array.from(out.y),
    st: Float64Array.from(out.st),
    node: Int32Array.from(out.node),
    piece: Int32Array.from(out.piece),
    run: Int32Array.from(out.run),
  };
}
