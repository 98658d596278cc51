import { FemError } from '../errors.js';
import { closestOnCurve, pointInMaterial } from '../geometry/index.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { Point, Selector, Support } from '../model/types.js';
import { SELECTOR_TOLERANCE, nearestBoundaryPoint } from './selectors.js';

/**
 * Where a straight line selector stops catching a straight boundary piece it lies along: the ends of the
 * overlap of the selector (the segment from a to b, or the whole line for `x`/`y`, sMin = −∞, sMax = ∞) with
 * every straight piece collinear with it (both piece ends within tol of the line). Only ends strictly inside
 * a piece are returned (a piece end is a mesh vertex already), projected onto the piece so that the mesher
 * sees them on the boundary. An `x`/`y` line catches collinear pieces whole, so it adds none; a `segment`
 * adds its own ends where they fall inside a piece.
 */
function lineOverlapEnds(geom: Pick<PlateGeometry, 'pieces'>, a: Point, b: Point, sMin: number, sMax: number, tol: number): Point[] {
  const dx = b[0] - a[0], dy = b[1] - a[1];
  const len = Math.hypot(dx, dy);
  const ux = dx / len, uy = dy / len;
  const offLine = (p: Point) => Math.abs((p[0] - a[0]) * uy - (p[1] - a[1]) * ux);
  const along = (p: Point) => ((p[0] - a[0]) * ux + (p[1] - a[1]) * uy) / len;
  const out: Point[] = [];
  for (const piece of geom.pieces) {
    const c = piece.curve;
    if (c.kind !== 'line' || offLine(c.from) > tol || offLine(c.to) > tol) continue;
    const s0 = Math.min(along(c.from), along(c.to)), s1 = Math.max(along(c.from), along(c.to));
    const lo = Math.max(s0, sMin), hi = Math.min(s1, sMax);
    if (!((hi - lo) * len > tol)) continue;
    for (const s of [lo, hi]) {
      if ((s - s0) * len <= tol || (s1 - s) * len <= tol) continue;
      out.push(closestOnCurve(c, [a[0] + s * dx, a[1] + s * dy]).point);
    }
  }
  return out;
}

/**
 * A point selector outside the material (beyond the outline, or inside an opening) farther than this
 * fraction of the plate size (geom.scale) from every boundary piece matches nothing: snapping it to the
 * boundary would load or hold a place the file does not name (docs/model-format.md, "Selectors"). A point
 * in the material, or outside it but this near, means the nearest boundary point, with a warning when it
 * is not on the boundary already (selectorWarnings).
 */
export const POINT_SNAP_FRACTION = 0.02;

/** A FemError naming the key when a point selector lies outside the material and off the boundary (POINT_SNAP_FRACTION). */
export function checkPointSelector(geom: PlateGeometry, where: Selector, keyPath?: string): void {
  if (where.kind !== 'point' || geom.pieces.length === 0) return;
  const hit = nearestBoundaryPoint(geom, where.at);
  if (hit.distance > POINT_SNAP_FRACTION * geom.scale && !pointInMaterial(geom, where.at)) {
    const f = (v: number) => Number(v.toPrecision(6));
    throw new FemError(
      `the point (${f(where.at[0])}, ${f(where.at[1])}) lies ${f(hit.distance)} from the nearest boundary point (${f(hit.point[0])}, ${f(hit.point[1])}), `
        + `outside the material and more than ${POINT_SNAP_FRACTION * 100} % of the plate size away: a point selector picks a point of the plate's boundary; move it onto the edge it is meant for`,
      keyPath === undefined ? undefined : `${keyPath}.where.point`,
    );
  }
}

/** The points one selector needs as mesh vertices (see selectorVertices). */
export function verticesOfSelector(geom: Pick<PlateGeometry, 'pieces' | 'loops' | 'scale'>, where: Selector): Point[] {
  const tol = SELECTOR_TOLERANCE * geom.scale;
  switch (where.kind) {
    case 'point': {
      // a point outside the material stays as written: the mesher refuses it, naming the entry
      const hit = nearestBoundaryPoint(geom, where.at);
      return [hit.distance > tol && !pointInMaterial(geom as PlateGeometry, where.at) ? [where.at[0], where.at[1]] : hit.point];
    }
    case 'segment':
      return lineOverlapEnds(geom, where.from, where.to, 0, 1, tol);
    case 'x':
      return lineOverlapEnds(geom, [where.value, 0], [where.value, 1], -Infinity, Infinity, tol);
    case 'y':
      return lineOverlapEnds(geom, [0, where.value], [1, where.value], -Infinity, Infinity, tol);
    default:
      // openings, the outline and pieces are whole pieces: their ends are vertices already
      return [];
  }
}

/**
 * Points that must be mesh vertices for the model's selectors (issue 12 §4), on every mesh of a solve or
 * study, like the geometry's own vertices: the boundary point a point selector means (nearestBoundaryPoint,
 * for forces and supports alike; a point outside the outline or inside an opening stays as written, and the
 * mesher refuses it naming the entry), and the ends of what a line selector catches — a segment ending inside a
 * boundary piece splits that piece there, so the support or load stops exactly at its end instead of at
 * whichever node the mesh happens to have nearby. Supports first, then loads; each point once (within 1e-9 of
 * the plate size).
 */
export function selectorVertices(
  model: {
    supports: readonly (Pick<Support, 'where'> & { keyPath?: string })[];
    /** every load; a body load (no selector) adds no point */
    loads: readonly { where?: Selector; keyPath?: string }[];
    fieldLoads?: readonly { where?: Selector; keyPath?: string }[];
  },
  geom: PlateGeometry,
): Point[] {
  for (const item of [...model.supports, ...model.loads, ...(model.fieldLoads ?? [])]) {
    if (item.where) checkPointSelector(geom, item.where, item.keyPath);
  }
  const out: Point[] = [];
  const same = 1e-9 * geom.scale;
  const add = (p: Point) => {
    if (!out.some((q) => Math.hypot(q[0] - p[0], q[1] - p[1]) <= same)) out.push(p);
  };
  for (const s of model.supports) for (const p of verticesOfSelector(geom, s.where)) add(p);
  for (const l of model.loads) if (l.where) for (const p of verticesOfSelector(geom, l.where)) add(p);
  for (const l of model.fieldLoads ?? []) if (l.where) for (const p of verticesOfSelector(geom, l.where)) add(p);
  return out;
}
