import { FemError } from '../errors.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { Mesh } from '../mesh/types.js';
import { ExpressionError, evaluateExpression } from '../model/index.js';
import type { DisplacementValue, Support } from '../model/types.js';
import { selectBoundary } from './selectors.js';

/** A prescribed displacement: dof 2n is u_x of node n, 2n + 1 is u_y. */
export interface PrescribedValue {
  dof: number;
  value: number;
}

/** Default table tolerance: this fraction of the plate's bounding-box diagonal. */
export const TABLE_TOLERANCE_RELATIVE = 0.02;

type MeshPart = Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride' | 'boundaryPiece'>;
type GeomPart = Pick<PlateGeometry, 'pieces' | 'loops' | 'scale'>;

function fmt(v: number): string {
  return String(Number(v.toPrecision(6)) + 0);
}

/**
 * The non-zero displacements of the supports that carry `displace` (issue 9), per dof.
 * supportedDofs already marks those dofs fixed (the model sets `fix` for every prescribed
 * component); the solver then imposes these values there.
 */
export function prescribedFromSupports(mesh: MeshPart, geom: GeomPart, supports: readonly Support[]): PrescribedValue[] {
  const out: PrescribedValue[] = [];
  supports.forEach((s, i) => {
    if (!s.displace) return;
    const keyPath = s.keyPath || `supports[${i}]`;
    const sel = selectBoundary(mesh, geom, s.where, `${keyPath}.where`);
    if (s.displace.kind === 'values') {
      const comps: [0 | 1, DisplacementValue | undefined][] = [[0, s.displace.x], [1, s.displace.y]];
      for (const [c, v] of comps) {
        if (v === undefined) continue;
        for (const n of sel.nodes) out.push({ dof: 2 * n + c, value: valueAt(v, mesh.xy[2 * n], mesh.xy[2 * n + 1], `${keyPath}.displace`) });
      }
      return;
    }
    const tol = s.displace.tolerance ?? TABLE_TOLERANCE_RELATIVE * geom.scale;
    const u = interpolateTable(mesh, sel.edges, s.displace.rows, tol, s.displace.file, `${keyPath}.displace.table`);
    for (const [n, ux, uy] of u) {
      out.push({ dof: 2 * n, value: ux });
      out.push({ dof: 2 * n + 1, value: uy });
    }
  });
  return out;
}

function valueAt(v: DisplacementValue, x: number, y: number, keyPath: string): number {
  if (typeof v === 'number') return v;
  try {
    return evaluateExpression(v.expression, { ...v.params, x, y });
  } catch (e) {
    if (e instanceof ExpressionError) {
      throw new FemError(`displacement '${v.expression}' at the node (${fmt(x)}, ${fmt(y)}): ${e.message}`, keyPath);
    }
    throw e;
  }
}

/**
 * Table values along the selected boundary: the selected edges are chained in travel order
 * (open chains and closed loops), every node gets its arc length s along its chain (along the
 * chords, mid-side nodes included), every table point within `tol` of a chain its projection's
 * arc length, and each node the linear interpolation in s between the table points before and
 * after it (periodic on a closed loop; the end value beyond the last table point of an open chain).
 * A node farther than `tol` from every table point is an error naming the file.
 */
export function interpolateTable(
  mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride'>,
  edges: ArrayLike<number>,
  rows: readonly number[],
  tol: number,
  file: string,
  keyPath: string,
): [number, number, number][] {
  const { xy, boundaryEdges } = mesh;
  const stride = mesh.edgeStride;
  const nRows = rows.length / 4;
  // chains: follow a → b
  const next = new Map<number, number>(); // start vertex node → edge
  const hasIn = new Set<number>();
  for (let k = 0; k < edges.length; k++) {
    const e = edges[k];
    next.set(boundaryEdges[stride * e], e);
    hasIn.add(boundaryEdges[stride * e + 1]);
  }
  const used = new Set<number>();
  const chains: { nodes: number[]; s: number[]; closed: boolean; length: number }[] = [];
  const walk = (start: number) => {
    const nodes = [start];
    const s = [0];
    let at = start;
    let len = 0;
    let closed = false;
    for (;;) {
      const e = next.get(at);
      if (e === undefined || used.has(e)) break;
      used.add(e);
      const a = boundaryEdges[stride * e];
      const b = boundaryEdges[stride * e + 1];
      const d = Math.hypot(xy[2 * b] - xy[2 * a], xy[2 * b + 1] - xy[2 * a + 1]);
      if (stride === 3) {
        const m = boundaryEdges[stride * e + 2];
        nodes.push(m);
        s.push(len + Math.hypot(xy[2 * m] - xy[2 * a], xy[2 * m + 1] - xy[2 * a + 1]));
      }
      len += d;
      if (b === start) {
        closed = true;
        break;
      }
      nodes.push(b);
      s.push(len);
      at = b;
    }
    chains.push({ nodes, s, closed, length: len });
  };
  for (const start of next.keys()) if (!hasIn.has(start)) walk(start);
  for (const start of next.keys()) if (!used.has(next.get(start)!)) walk(start);

  const out: [number, number, number][] = [];
  for (const chain of chains) {
    // project the table points onto the chain's chords (vertex to vertex, in order)
    const proj: { s: number; ux: number; uy: number }[] = [];
    for (let r = 0; r < nRows; r++) {
      const px = rows[4 * r], py = rows[4 * r + 1];
      let best = Infinity;
      let bestS = 0;
      const verts = chain.nodes.map((n, i) => ({ n, s: chain.s[i] }));
      const ring = chain.closed ? [...verts, { n: chain.nodes[0], s: chain.length }] : verts;
      for (let i = 0; i + 1 < ring.length; i++) {
        const a = ring[i], b = ring[i + 1];
        const ax = xy[2 * a.n], ay = xy[2 * a.n + 1];
        const dx = xy[2 * b.n] - ax, dy = xy[2 * b.n + 1] - ay;
        const l2 = dx * dx + dy * dy;
        let t = l2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / l2 : 0;
        t = Math.min(1, Math.max(0, t));
        const d = Math.hypot(px - ax - t * dx, py - ay - t * dy);
        if (d < best) {
          best = d;
          bestS = a.s + t * (b.s - a.s);
        }
      }
      if (best <= tol) proj.push({ s: bestS, ux: rows[4 * r + 2], uy: rows[4 * r + 3] });
    }
    proj.sort((p, q) => p.s - q.s);
    for (let i = 0; i < chain.nodes.length; i++) {
      const n = chain.nodes[i];
      const x = xy[2 * n], y = xy[2 * n + 1];
      let dMin = Infinity;
      for (let r = 0; r < nRows; r++) dMin = Math.min(dMin, Math.hypot(rows[4 * r] - x, rows[4 * r + 1] - y));
      if (!(dMin <= tol) || proj.length === 0) {
        throw new FemError(
          `${file}: the boundary node at (${fmt(x)}, ${fmt(y)}) is ${fmt(dMin)} from the nearest table point, farther than the tolerance ${fmt(tol)}; ` +
            'the table does not cover the selected boundary (add points there, or set displace.tolerance)',
          keyPath,
        );
      }
      out.push([n, ...interpolate(proj, chain.s[i], chain.closed ? chain.length : 0)]);
    }
  }
  return out;
}

/** Linear interpolation in s; `period` > 0 wraps around a closed loop. */
function interpolate(p: readonly { s: number; ux: number; uy: number }[], s: number, period: number): [number, number] {
  const hi = p.findIndex((q) => q.s >= s);
  let lo: { s: number; ux: number; uy: number };
  let up: { s: number; ux: number; uy: number };
  if (hi === 0 && p[0].s === s) return [p[0].ux, p[0].uy];
  if (period > 0) {
    if (hi < 0) {
      lo = p[p.length - 1];
      up = { ...p[0], s: p[0].s + period };
    } else if (hi === 0) {
      lo = { ...p[p.length - 1], s: p[p.length - 1].s - period };
      up = p[0];
    } else {
      lo = p[hi - 1];
      up = p[hi];
    }
  } else {
    if (hi < 0) return [p[p.length - 1].ux, p[p.length - 1].uy];
    if (hi === 0) return [p[0].ux, p[0].uy];
    lo = p[hi - 1];
    up = p[hi];
  }
  const span = up.s - lo.s;
  const w = span > 0 ? (s - lo.s) / span : 0;
  return [lo.ux + w * (up.ux - lo.ux), lo.uy + w * (up.uy - lo.uy)];
}
