/** Queries on a built geometry: which pieces pass near a point, inside/outside, polylines for drawing. */
import { GeometryError } from '../errors.js';
import type { Point } from '../model/types.js';
import type { BoundaryPiece, PlateGeometry } from './types.js';
import { closestOnCurve, curvePoint, curveSpeedBound, curveStart } from './curves.js';
import { windingNumber } from './checks.js';

export interface PieceHit {
  piece: BoundaryPiece;
  /** parameter of the closest point on the piece */
  t: number;
  point: Point;
  distance: number;
}

/** Pieces passing within `tol` of p, nearest first. */
export function pieceAtPoint(geom: PlateGeometry, p: Point, tol: number): PieceHit[] {
  const hits: PieceHit[] = [];
  for (const piece of geom.pieces) {
    const c = closestOnCurve(piece.curve, p);
    if (c.distance <= tol) hits.push({ piece, t: c.t, point: c.point, distance: c.distance });
  }
  hits.sort((x, y) => x.distance - y.distance || x.piece.id - y.piece.id);
  return hits;
}

/**
 * Winding number of one loop about p: +1 inside the outline, −1 inside an opening (openings run
 * clockwise), 0 outside; exact for arcs and ellipse arcs. Undecided on the loop itself.
 */
export function loopWinding(geom: PlateGeometry, loopId: string, p: Point): number {
  const loop = geom.loops.find((l) => l.id === loopId);
  if (!loop) throw new GeometryError(`no boundary loop called '${loopId}'`);
  return windingNumber(loop.pieces.map((id) => geom.pieces[id].curve), p);
}

/** Is p inside the material (inside the outline and outside every opening)? Points on the boundary are undecided. */
export function pointInMaterial(geom: PlateGeometry, p: Point): boolean {
  let w = 0;
  for (const loop of geom.loops) w += windingNumber(loop.pieces.map((id) => geom.pieces[id].curve), p);
  return w !== 0;
}

/**
 * The loop as a closed polyline for drawing (first point not repeated at the end). Every piece
 * end point is included exactly; curves get chords no longer than `maxChord` and turning at most
 * 11.25° each, so small holes still look round.
 */
export function loopPolyline(geom: PlateGeometry, loopId: string, maxChord: number): Point[] {
  const loop = geom.loops.find((l) => l.id === loopId);
  if (!loop) throw new GeometryError(`no boundary loop called '${loopId}'`);
  if (!(maxChord > 0)) throw new GeometryError(`loopPolyline: maxChord must be > 0, got ${maxChord}`);
  const out: Point[] = [];
  for (const id of loop.pieces) {
    const c = geom.pieces[id].curve;
    out.push(curveStart(c));
    // speed bound × Δt bounds each chord's arc, so no chord exceeds maxChord even on a slender ellipse
    let m = Math.ceil(curveSpeedBound(c) / maxChord);
    if (c.kind !== 'line') m = Math.max(m, Math.ceil(Math.abs(c.sweep) / (Math.PI / 16)));
    m = Math.max(1, Math.min(m, 100000));
    for (let k = 1; k < m; k++) out.push(curvePoint(c, k / m));
  }
  return out;
}
