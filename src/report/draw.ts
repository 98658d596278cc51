/**
 * Drawing helpers shared by the SVG pictures: the model → picture transform, compact number
 * output, boundary loops, the linear sub-triangles of an element, nice tick values.
 */
import type { Mesh } from '../mesh/types.js';

/** A window in model coordinates. */
export interface Box {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

/** Maps model (x up) to picture pixels (y down) with one uniform scale. */
export interface Frame {
  box: Box;
  /** pixels per model length unit */
  s: number;
  /** picture position of the box's top-left corner */
  ox: number;
  oy: number;
  width: number;
  height: number;
}

export function makeFrame(box: Box, maxWidth: number, maxHeight: number, ox: number, oy: number): Frame {
  const dx = Math.max(box.maxX - box.minX, 1e-300);
  const dy = Math.max(box.maxY - box.minY, 1e-300);
  const s = Math.min(maxWidth / dx, maxHeight / dy);
  return { box, s, ox, oy, width: dx * s, height: dy * s };
}

export function px(f: Frame, x: number): number {
  return f.ox + (x - f.box.minX) * f.s;
}

export function py(f: Frame, y: number): number {
  return f.oy + (f.box.maxY - y) * f.s;
}

/** Picture coordinate to 0.1 px, shortest text. */
export function c1(v: number): string {
  // the same text as String(Math.round(v * 10) / 10), built from whole numbers: a picture writes
  // hundreds of thousands of coordinates, and a small integer turns into text far faster than a
  // fraction does (the shortest decimal of t / 10 is t's digits with a point before the last one)
  const t = Math.round(v * 10);
  if (!(Math.abs(t) < 1e15)) return String(t / 10);
  const a = t < 0 ? -t : t;
  const whole = Math.floor(a / 10), tenth = a - 10 * whole;
  const body = tenth === 0 ? String(whole) : `${whole}.${tenth}`;
  return t < 0 ? `-${body}` : body;
}

export function meshBox(xy: Float64Array, extra?: { u: Float64Array; scale: number }): Box {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  const n = xy.length / 2;
  for (let i = 0; i < n; i++) {
    const x = xy[2 * i], y = xy[2 * i + 1];
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
    if (extra) {
      const xd = x + extra.scale * extra.u[2 * i], yd = y + extra.scale * extra.u[2 * i + 1];
      if (xd < minX) minX = xd;
      if (xd > maxX) maxX = xd;
      if (yd < minY) minY = yd;
      if (yd > maxY) maxY = yd;
    }
  }
  if (!(minX <= maxX)) return { minX: 0, minY: 0, maxX: 1, maxY: 1 };
  return { minX, minY, maxX, maxY };
}

/** Grows a box by a fraction of its larger side on every side. */
export function padBox(b: Box, fraction: number): Box {
  const d = Math.max(b.maxX - b.minX, b.maxY - b.minY) * fraction || 1;
  return { minX: b.minX - d, minY: b.minY - d, maxX: b.maxX + d, maxY: b.maxY + d };
}

/**
 * The linear triangles of the mesh as flat node triples `[a0, b0, c0, a1, …]`: the element itself
 * for CST, and the four corner/mid-node sub-triangles for LST (local numbering of mesh/types.ts):
 * (0,3,5) (3,1,4) (5,4,2) (3,4,5), all counter-clockwise.
 */
export function linearTriangles(mesh: Pick<Mesh, 'elemNodes' | 'nodesPerElem'>): Uint32Array {
  const en = mesh.elemNodes;
  if (mesh.nodesPerElem === 3) return Uint32Array.from(en.subarray(0, 3 * Math.floor(en.length / 3)));
  const nElems = Math.floor(en.length / 6);
  const tri = new Uint32Array(12 * nElems);
  for (let e = 0; e < nElems; e++) {
    const p = 6 * e, t = 12 * e;
    const n0 = en[p], n1 = en[p + 1], n2 = en[p + 2], n3 = en[p + 3], n4 = en[p + 4], n5 = en[p + 5];
    tri[t] = n0; tri[t + 1] = n3; tri[t + 2] = n5;
    tri[t + 3] = n3; tri[t + 4] = n1; tri[t + 5] = n4;
    tri[t + 6] = n5; tri[t + 7] = n4; tri[t + 8] = n2;
    tri[t + 9] = n3; tri[t + 10] = n4; tri[t + 11] = n5;
  }
  return tri;
}

/** Whether the axis-aligned box [x0, x1] × [y0, y1] meets the window `b`. */
export function meetsBox(b: Box, x0: number, y0: number, x1: number, y1: number): boolean {
  return x1 >= b.minX && x0 <= b.maxX && y1 >= b.minY && y0 <= b.maxY;
}

/** Whether linear triangle t (of `tri`) has a bounding box that meets the window. */
export function triangleMeetsBox(xy: Float64Array, tri: Uint32Array, t: number, box: Box): boolean {
  const a = tri[3 * t], b = tri[3 * t + 1], c = tri[3 * t + 2];
  const xa = xy[2 * a], xb = xy[2 * b], xc = xy[2 * c], ya = xy[2 * a + 1], yb = xy[2 * b + 1], yc = xy[2 * c + 1];
  return meetsBox(box, Math.min(xa, xb, xc), Math.min(ya, yb, yc), Math.max(xa, xb, xc), Math.max(ya, yb, yc));
}

/**
 * Boundary edges chained into loops of node ids (mid nodes included for LST, so curved edges
 * keep their mid point). Edges that do not close a loop come back as open chains.
 */
export function boundaryLoops(mesh: Pick<Mesh, 'boundaryEdges' | 'edgeStride'>): { nodes: number[]; closed: boolean }[] {
  const stride = mesh.edgeStride;
  const be = mesh.boundaryEdges;
  const nEdges = Math.floor(be.length / stride);
  const fromStart = new Map<number, number>();
  for (let e = 0; e < nEdges; e++) fromStart.set(be[stride * e], e);
  const used = new Uint8Array(nEdges);
  const loops: { nodes: number[]; closed: boolean }[] = [];
  for (let e0 = 0; e0 < nEdges; e0++) {
    if (used[e0]) continue;
    const nodes: number[] = [be[stride * e0]];
    let e = e0;
    let closed = false;
    for (;;) {
      used[e] = 1;
      if (stride === 3) nodes.push(be[stride * e + 2]);
      const end = be[stride * e + 1];
      if (end === nodes[0]) {
        closed = true;
        break;
      }
      nodes.push(end);
      const next = fromStart.get(end);
      if (next === undefined || used[next]) break;
      e = next;
    }
    loops.push({ nodes, closed });
  }
  return loops;
}

/** SVG path data for loops, optionally displaced by scale·u. */
export function loopsPath(
  f: Frame,
  xy: Float64Array,
  loops: { nodes: number[]; closed: boolean }[],
  displaced?: { u: Float64Array; scale: number },
): string {
  let d = '';
  for (const loop of loops) {
    loop.nodes.forEach((n, i) => {
      let x = xy[2 * n], y = xy[2 * n + 1];
      if (displaced) {
        x += displaced.scale * displaced.u[2 * n];
        y += displaced.scale * displaced.u[2 * n + 1];
      }
      d += `${i === 0 ? 'M' : i === 1 ? 'L' : ' '}${c1(px(f, x))} ${c1(py(f, y))}`;
    });
    if (loop.closed) d += 'Z';
  }
  return d;
}

/** About `count` round values spanning [lo, hi] (steps of 1, 2, 2.5 or 5 × 10^k). */
export function niceTicks(lo: number, hi: number, count: number): number[] {
  if (!(hi > lo)) return [lo];
  const raw = (hi - lo) / Math.max(1, count);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const ticks: number[] = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi + step * 1e-9; t += step) {
    ticks.push(Math.abs(t) < step * 1e-9 ? 0 : Number(t.toPrecision(12)));
  }
  return ticks;
}
