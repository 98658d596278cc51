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
  /** index of the support that prescribes it */
  support: number;
}

/** Default table tolerance: this fraction of the plate's bounding-box diagonal. */
export const TABLE_TOLERANCE_RELATIVE = 0.02;

type MeshPart = Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride' | 'boundaryPiece'>;
type GeomPart = Pick<PlateGeometry, 'pieces' | 'loops' | 'scale'>;

function fmt(v: number): string {
  return String(Number(v.toPrecision(6)) + 0);
}

/**
 * The displacements of the supports that carry `displace` (issue 9), per dof, in list order.
 * supportedDofs already marks those dofs fixed (the model sets `fix` for every prescribed
 * component); `supportConstraints` merges both and refuses conflicting values.
 */
export function prescribedFromSupports(mesh: MeshPart, geom: GeomPart, supports: readonly Support[]): PrescribedValue[] {
  const out: PrescribedValue[] = [];
  supports.forEach((s, i) => {
    if (s.displace) for (const p of supportValues(mesh, geom, s, i)) out.push(p);
  });
  return out;
}

/** The dofs one support holds and their values: 0 for `fix`, the displacement for `displace`. */
function supportValues(mesh: MeshPart, geom: GeomPart, s: Support, i: number): PrescribedValue[] {
  const out: PrescribedValue[] = [];
  const keyPath = s.keyPath || `supports[${i}]`;
  const sel = selectBoundary(mesh, geom, s.where, `${keyPath}.where`);
  if (!s.displace) {
    for (const n of sel.nodes) {
      if (s.fix.x) out.push({ dof: 2 * n, value: 0, support: i });
      if (s.fix.y) out.push({ dof: 2 * n + 1, value: 0, support: i });
    }
    return out;
  }
  if (s.displace.kind === 'values') {
    const comps: [0 | 1, DisplacementValue | undefined][] = [[0, s.displace.x], [1, s.displace.y]];
    for (const [c, v] of comps) {
      if (v === undefined) continue;
      for (const n of sel.nodes) out.push({ dof: 2 * n + c, value: valueAt(v, mesh.xy[2 * n], mesh.xy[2 * n + 1], `${keyPath}.displace`), support: i });
    }
    return out;
  }
  const tol = s.displace.tolerance ?? TABLE_TOLERANCE_RELATIVE * geom.scale;
  const u = interpolateTable(mesh, sel.edges, s.displace.rows, tol, s.displace.file, `${keyPath}.displace.table`);
  for (const [n, ux, uy] of u) {
    out.push({ dof: 2 * n, value: ux, support: i });
    out.push({ dof: 2 * n + 1, value: uy, support: i });
  }
  return out;
}

/** The dofs the supports hold and the value each is held at (0 for `fix`). */
export interface SupportConstraints {
  /** 1 at every held dof */
  fixed: Uint8Array;
  /** the prescribed value at each held dof (0 elsewhere) */
  value: Float64Array;
}

/**
 * Every dof the supports hold, with its value, refusing a dof that two supports hold at different
 * values (a `fix` and a non-zero `displace`, or two `displace` that differ): one of them would
 * silently win and the stresses would depend on the order of the list. Values that agree to
 * 1e-9 of the largest prescribed displacement count as equal (expressions evaluated at one node
 * may differ by rounding); repeating a value is fine.
 */
export function supportConstraints(mesh: MeshPart, geom: GeomPart, supports: readonly Support[]): SupportConstraints {
  const nDof = mesh.xy.length;
  const fixed = new Uint8Array(nDof);
  const value = new Float64Array(nDof);
  const owner = new Int32Array(nDof).fill(-1);
  // selectors in list order, so a selector that matches nothing is reported in that order
  const held: PrescribedValue[] = [];
  supports.forEach((s, i) => {
    for (const p of supportValues(mesh, geom, s, i)) held.push(p);
  });
  let largest = 0;
  for (const p of held) largest = Math.max(largest, Math.abs(p.value));
  const tol = 1e-9 * largest;
  const keyOf = (i: number): string => supports[i].keyPath || `supports[${i}]`;
  for (const { dof, value: v, support } of held) {
    const first = owner[dof];
    if (first < 0) {
      owner[dof] = support;
      fixed[dof] = 1;
      value[dof] = v;
    } else if (first !== support && !(Math.abs(value[dof] - v) <= tol)) {
      throw conflictError(mesh, dof, first, value[dof], support, v, supports, keyOf);
    }
  }
  return { fixed, value };
}

function conflictError(
  mesh: MeshPart, dof: number, first: number, firstValue: number, second: number, secondValue: number,
  supports: readonly Support[], keyOf: (i: number) => string,
): FemError {
  const n = dof >> 1;
  const comp = dof % 2 === 0 ? 'u_x' : 'u_y';
  const at = `(${fmt(mesh.xy[2 * n])}, ${fmt(mesh.xy[2 * n + 1])})`;
  const says = (i: number, v: number) => (supports[i].displace ? `${keyOf(i)} prescribes ${comp} = ${fmt(v)}` : `${keyOf(i)} fixes it (${comp} = 0)`);
  return new FemError(
    `two supports hold ${comp} of the node at ${at} at different values: ${says(first, firstValue)}, ${says(second, secondValue)}; `
      + 'one would silently win and the stresses would depend on the order of the list. '
      + 'Give both the same value there, or narrow one selector (a segment that stops short of that node)',
    keyOf(second),
    [keyOf(first)],
  );
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
