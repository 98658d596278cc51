/**
 * Element-size fields h(x, y): the target edge length at a point.
 *
 * A field is the lower envelope of "cones" h_f + g·dist(x, f) around features f (a local
 * disk, a curved boundary piece, a refinement point) and the plate's base size. A lower
 * envelope of cones of slope g is itself g-Lipschitz, so sizes grow by at most g per unit
 * distance away from every small feature — the smooth-grading rule of the mesh issue.
 */
import type { Point } from '../model/types.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { SizeField } from './types.js';
import { curvatureRadius, curveLen, curveXY } from './curves.js';
import { MeshError } from '../errors.js';
import { buildBoxGrid, gridCell } from '../geometry/box-grid.js';

/** chord rule: a segment subtending ≤ 0.2 rad deviates ≤ 0.5 % of the radius (1 − cos 0.1 = 0.005) */
export const CURVE_SEGMENT_ANGLE = 2 * Math.acos(0.995);

export interface SizeSettings {
  size: number;
  local: ReadonlyArray<{ near: readonly [number, number] | Point; size: number; radius: number }>;
}

/**
 * Size field of a model's `mesh` block: min of the base size, the local disks (their size
 * inside the radius, growing with slope `grading` outside), the curve resolution of every arc
 * and ellipse (≈ 0.2 × local radius of curvature, so the chord rule holds), each spreading with
 * slope `grading`.
 */
export function sizeFieldFromSettings(geom: PlateGeometry, settings: SizeSettings, grading = 0.3): SizeField {
  if (!(settings.size > 0) || !Number.isFinite(settings.size)) {
    throw new MeshError(`mesh.size must be a positive number, got ${settings.size}`, 'mesh.size');
  }
  if (!(grading > 0)) throw new MeshError(`size grading must be > 0, got ${grading}`);
  if (geom.local) {
    // built about the plate's centre, like the geometry the mesher meshes (see PlateGeometry.local)
    const o = geom.local.origin;
    const local = settings.local.map((l) => ({ ...l, near: [l.near[0] - o[0], l.near[1] - o[1]] as Point }));
    return framed(sizeFieldFromSettings(geom.local.geometry, { size: settings.size, local }, grading), o);
  }
  const h0 = settings.size;
  const g = grading;
  // disks: cx, cy, radius, size
  const disks: number[] = [];
  settings.local.forEach((l, i) => {
    if (!(l.size > 0) || !(l.radius >= 0)) {
      throw new MeshError(`local size must be > 0 and radius ≥ 0, got size ${l.size}, radius ${l.radius}`, `mesh.local[${i}]`);
    }
    if (l.size < h0) disks.push(l.near[0], l.near[1], l.radius, l.size);
  });
  // circular arcs: cx, cy, R, h, startAngle, sweep, end-point coordinates (x0, y0, x1, y1)
  const arcs: number[] = [];
  // ellipse arcs, sampled: per group [cx, cy, bounding radius, min h, first chunk, end chunk]
  const groups: number[] = [];
  // samples: x, y, h
  const samples: number[] = [];
  // runs of CHUNK consecutive samples of one arc: [cx, cy, bounding radius, min h, first sample, end sample]
  const chunks: number[] = [];
  const p = [0, 0];
  for (const piece of geom.pieces) {
    const c = piece.curve;
    if (c.kind === 'arc') {
      const h = CURVE_SEGMENT_ANGLE * c.radius;
      if (h >= h0) continue;
      const a0 = c.startAngle;
      const a1 = c.startAngle + c.sweep;
      arcs.push(c.center[0], c.center[1], c.radius, h, a0, c.sweep,
        c.center[0] + c.radius * Math.cos(a0), c.center[1] + c.radius * Math.sin(a0),
        c.center[0] + c.radius * Math.cos(a1), c.center[1] + c.radius * Math.sin(a1));
    } else if (c.kind === 'ellipse-arc') {
      // samples spaced about the local size so the envelope error stays ≤ g·h/2
      const len = curveLen(c);
      const rhoMin = Math.min(c.a, c.b) ** 2 / Math.max(c.a, c.b);
      const n = Math.min(400, Math.max(8, Math.ceil(len / (CURVE_SEGMENT_ANGLE * rhoMin * 2))));
      const first = samples.length;
      let hMin = Infinity;
      for (let i = 0; i <= n; i++) {
        const t = i / n;
        const h = CURVE_SEGMENT_ANGLE * curvatureRadius(c, t);
        if (h >= h0) continue;
        curveXY(c, t, p);
        samples.push(p[0], p[1], h);
        hMin = Math.min(hMin, h);
      }
      if (samples.length > first) {
        const firstChunk = chunks.length / 6;
        for (let i = first; i < samples.length; i += 3 * CHUNK) chunkOf(samples, i, Math.min(samples.length, i + 3 * CHUNK), h0 / g, chunks);
        groups.push(c.center[0], c.center[1], Math.max(c.a, c.b), hMin, firstChunk, chunks.length / 6);
      }
    }
  }
  const nd = disks.length / 4;
  const na = arcs.length / 10;
  const ng = groups.length / 6;
  // Bucket every feature by the box outside which it cannot lower the size below h0 (its
  // "reach": a cone of slope g starting at h_f rises to h0 within (h0 − h_f)/g), so that a query
  // visits only the features near it: with many openings the size field would otherwise cost
  // O(openings) per call and meshing O(openings²). The minimum does not depend on the order in
  // which features are visited, so the field is the same function as without the index.
  const boxes = new Float64Array(4 * (nd + na + ng));
  const put = (item: number, cx: number, cy: number, rx: number, ry: number): void => {
    // a relative margin so that rounding never moves a feature's effect outside its box
    const mx = rx * (1 + 1e-9) + 1e-12 * Math.abs(cx), my = ry * (1 + 1e-9) + 1e-12 * Math.abs(cy);
    boxes[4 * item] = cx - mx; boxes[4 * item + 1] = cy - my; boxes[4 * item + 2] = cx + mx; boxes[4 * item + 3] = cy + my;
  };
  for (let k = 0; k < nd; k++) {
    const reach = disks[4 * k + 2] + (h0 - disks[4 * k + 3]) / g;
    put(k, disks[4 * k], disks[4 * k + 1], reach, reach);
  }
  for (let k = 0; k < na; k++) {
    // the whole circle's box: every point the arc's distance is measured to lies on the circle
    const reach = arcs[10 * k + 2] + (h0 - arcs[10 * k + 3]) / g;
    put(nd + k, arcs[10 * k], arcs[10 * k + 1], reach, reach);
  }
  for (let k = 0; k < ng; k++) {
    let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
    for (let i = chunks[6 * groups[6 * k + 4] + 4]; i < chunks[6 * groups[6 * k + 5] - 1]; i += 3) {
      const reach = (h0 - samples[i + 2]) / g;
      x0 = Math.min(x0, samples[i] - reach); x1 = Math.max(x1, samples[i] + reach);
      y0 = Math.min(y0, samples[i + 1] - reach); y1 = Math.max(y1, samples[i + 1] + reach);
    }
    put(nd + na + k, 0.5 * (x0 + x1), 0.5 * (y0 + y1), 0.5 * (x1 - x0), 0.5 * (y1 - y0));
  }
  const grid = buildBoxGrid(boxes);
  const TAU = 2 * Math.PI;
  /** the size feature `item` asks for at (x, y), or h when it asks for no less */
  const lower = (item: number, x: number, y: number, h: number): number => {
    if (item < nd) {
      const i = 4 * item;
      const d = Math.hypot(x - disks[i], y - disks[i + 1]) - disks[i + 2];
      const hi = d > 0 ? disks[i + 3] + g * d : disks[i + 3];
      return hi < h ? hi : h;
    }
    if (item < nd + na) {
      const i = 10 * (item - nd);
      const dx = x - arcs[i];
      const dy = y - arcs[i + 1];
      const R = arcs[i + 2];
      const hArc = arcs[i + 3];
      const r = Math.sqrt(dx * dx + dy * dy);
      // the distance to the arc is at least |r − R| (distance to the full circle): cull first
      const dCircle = Math.abs(r - R);
      if (hArc + g * dCircle >= h) return h;
      const sweep = arcs[i + 5];
      let d = dCircle;
      if (Math.abs(sweep) < TAU - 1e-12 && !angleWithin(Math.atan2(dy, dx), arcs[i + 4], sweep)) {
        d = Math.min(Math.hypot(x - arcs[i + 6], y - arcs[i + 7]), Math.hypot(x - arcs[i + 8], y - arcs[i + 9]));
      }
      const hi = hArc + g * d;
      return hi < h ? hi : h;
    }
    const k = 6 * (item - nd - na);
    const dl = Math.hypot(x - groups[k], y - groups[k + 1]) - groups[k + 2];
    if (groups[k + 3] + g * Math.max(0, dl) >= h) return h;
    for (let j = 6 * groups[k + 4], end = 6 * groups[k + 5]; j < end; j += 6) {
      // a run whose every sample asks for at least h is passed over: the minimum is the same
      const dc = Math.hypot(x - chunks[j], y - chunks[j + 1]) - chunks[j + 2];
      if (chunks[j + 3] + g * (dc > 0 ? dc : 0) >= h) continue;
      for (let i = chunks[j + 4]; i < chunks[j + 5]; i += 3) {
        const hi = samples[i + 2] + g * Math.hypot(x - samples[i], y - samples[i + 1]);
        if (hi < h) h = hi;
      }
    }
    return h;
  };
  const { large, start, items } = grid;
  return (x: number, y: number): number => {
    let h = h0;
    for (let k = 0; k < large.length; k++) h = lower(large[k], x, y, h);
    const c = gridCell(grid, x, y);
    if (c < 0) return h;
    for (let k = start[c]; k < start[c + 1]; k++) h = lower(items[k], x, y, h);
    return h;
  };
}

/** Consecutive samples of an ellipse arc looked at together by the size field. */
const CHUNK = 8;

/**
 * Append the run of samples [from, to) (x, y, h triples) to `chunks` as its box centre, a radius
 * that reaches every sample, its least h, from and to. The radius is widened by a hair (relative,
 * and `slack`·1e-9 absolute, slack = h₀/g) so that rounding never lets a run be passed over that
 * holds a sample asking for less.
 */
function chunkOf(samples: readonly number[], from: number, to: number, slack: number, chunks: number[]): void {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity, hMin = Infinity;
  for (let i = from; i < to; i += 3) {
    x0 = Math.min(x0, samples[i]); x1 = Math.max(x1, samples[i]);
    y0 = Math.min(y0, samples[i + 1]); y1 = Math.max(y1, samples[i + 1]);
    hMin = Math.min(hMin, samples[i + 2]);
  }
  const cx = 0.5 * (x0 + x1), cy = 0.5 * (y0 + y1);
  let r = 0;
  for (let i = from; i < to; i += 3) r = Math.max(r, Math.hypot(samples[i] - cx, samples[i + 1] - cy));
  chunks.push(cx, cy, r * (1 + 1e-9) + 1e-9 * slack, hMin, from, to);
}

function angleWithin(ang: number, start: number, sweep: number): boolean {
  const TAU = 2 * Math.PI;
  if (sweep >= 0) {
    const d = (((ang - start) % TAU) + TAU) % TAU;
    return d <= sweep;
  }
  const d = (((start - ang) % TAU) + TAU) % TAU;
  return d <= -sweep;
}

/** min(base, hNear + grading·|x − p|): a size field refined toward the point p */
export function gradedToward(base: SizeField, p: readonly [number, number] | Point, hNear: number, grading = 0.25): SizeField {
  if (!(hNear > 0)) throw new MeshError(`size near a refinement point must be > 0, got ${hNear}`);
  const frame = FRAMES.get(base);
  if (frame) return framed(gradedToward(frame.field, [p[0] - frame.origin[0], p[1] - frame.origin[1]], hNear, grading), frame.origin);
  const px = p[0];
  const py = p[1];
  return (x: number, y: number): number => {
    const hp = hNear + grading * Math.hypot(x - px, y - py);
    const hb = base(x, y);
    return hp < hb ? hp : hb;
  };
}

/**
 * Size fields that have a twin about a plate's centre (PlateGeometry.local): the mesher evaluates
 * the twin at its local coordinates, so the mesh is the same wherever the plate sits.
 */
const FRAMES = new WeakMap<SizeField, { origin: Point; field: SizeField }>();

function framed(field: SizeField, origin: Point): SizeField {
  const [ox, oy] = origin;
  const outer: SizeField = (x, y) => field(x - ox, y - oy);
  FRAMES.set(outer, { origin, field });
  return outer;
}

/** `sizeAt` in coordinates about `origin`: its registered twin when it has one, else a shifted call. */
export function sizeFieldAbout(sizeAt: SizeField, origin: Point): SizeField {
  const frame = FRAMES.get(sizeAt);
  if (frame && frame.origin[0] === origin[0] && frame.origin[1] === origin[1]) return frame.field;
  const [ox, oy] = origin;
  return (x, y) => sizeAt(x + ox, y + oy);
}
