/** Queries on a built geometry: which pieces pass near a point, inside/outside, polylines for drawing. */
import { GeometryError } from '../errors.js';
import type { Point } from '../model/types.js';
import type { BoundaryPiece, Curve, PlateGeometry } from './types.js';
import { closestOnCurve, curveBBox, curvePoint, curveSpeedBound, curveStart } from './curves.js';
import { buildBoxGrid } from './box-grid.js';
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

/**
 * Is p inside the material (inside the outline and outside every opening)? Points on the boundary
 * are undecided. The winding number is summed over the pieces that cross a ray from p (only those
 * contribute to Sunday's crossing count, see windingNumber), found in a bucket grid of the pieces
 * along the shortest of the four axis rays: a query costs the pieces near that ray, not all of
 * them, so a plate with many openings or a long outline of many points stays fast.
 */
export function pointInMaterial(geom: PlateGeometry, p: Point): boolean {
  return materialLocator(geom)(p) !== 0;
}

const LOCATORS = new WeakMap<PlateGeometry, (p: Point) => number>();

/** Rotations that take the ray direction +x, +y, −x, −y onto +x (exact on coordinates). */
const TURNS: readonly ((q: Point) => Point)[] = [
  (q) => [q[0], q[1]],
  (q) => [q[1], -q[0]],
  (q) => [-q[0], -q[1]],
  (q) => [-q[1], q[0]],
];
const TURN_ANGLE = [0, -Math.PI / 2, Math.PI, Math.PI / 2];

function turnCurve(c: Curve, k: number): Curve {
  const turn = TURNS[k];
  if (c.kind === 'line') return { kind: 'line', from: turn(c.from), to: turn(c.to) };
  const ends = { ...(c.from ? { from: turn(c.from) } : {}), ...(c.to ? { to: turn(c.to) } : {}) };
  if (c.kind === 'arc') return { ...c, center: turn(c.center), startAngle: c.startAngle + TURN_ANGLE[k], ...ends };
  return { ...c, center: turn(c.center), rotation: c.rotation + TURN_ANGLE[k], ...ends };
}

function materialLocator(geom: PlateGeometry): (p: Point) => number {
  const cached = LOCATORS.get(geom);
  if (cached) return cached;
  const locate = windingLocator(geom.pieces.map((piece) => piece.curve));
  LOCATORS.set(geom, locate);
  return locate;
}

/**
 * The winding number about p of closed chains of curves (one or more loops), as
 * `windingNumber` gives it, through a bucket grid of the curves: only those along the shortest
 * axis ray from p are visited.
 */
export function windingLocator(all: readonly Curve[]): (p: Point) => number {
  const n = all.length;
  const boxes = new Float64Array(4 * n);
  all.forEach((c, i) => {
    const b = curveBBox(c);
    boxes.set([b.minX, b.minY, b.maxX, b.maxY], 4 * i);
  });
  const grid = buildBoxGrid(boxes);
  const turned: Curve[][] = [0, 1, 2, 3].map((k) => all.map((c) => turnCurve(c, k)));
  const stamp = new Int32Array(n);
  let visit = 0;
  const one: Curve[] = [all[0]];
  const locate = (p: Point): number => {
    visit++;
    const { nx, ny, cw, ch } = grid;
    const fi = Math.floor((p[0] - grid.minX) / cw), fj = Math.floor((p[1] - grid.minY) / ch);
    // cells a ray crosses in each direction (0 when it misses the grid's row or column)
    const inRow = fj >= 0 && fj < ny, inCol = fi >= 0 && fi < nx;
    const cells = [
      inRow ? nx - Math.max(0, fi) : 0, inCol ? ny - Math.max(0, fj) : 0,
      inRow ? Math.min(nx - 1, fi) + 1 : 0, inCol ? Math.min(ny - 1, fj) + 1 : 0,
    ];
    let k = 0;
    for (let d = 1; d < 4; d++) if (cells[d] < cells[k]) k = d;
    const curves = turned[k];
    const q = TURNS[k](p);
    let w = 0;
    const add = (id: number): void => {
      if (stamp[id] === visit) return;
      stamp[id] = visit;
      one[0] = curves[id];
      w += windingNumber(one, q);
    };
    for (let m = 0; m < grid.large.length; m++) add(grid.large[m]);
    if (cells[k] > 0) {
      const step = k === 0 || k === 1 ? 1 : -1;
      const horizontal = k === 0 || k === 2;
      let i = Math.min(nx - 1, Math.max(0, fi)), j = Math.min(ny - 1, Math.max(0, fj));
      for (let c = 0; c < cells[k]; c++) {
        const cell = i * ny + j;
        for (let m = grid.start[cell]; m < grid.start[cell + 1]; m++) add(grid.items[m]);
        if (horizontal) i += step;
        else j += step;
      }
    }
    // the turned frame reverses no orientation (rotations), so the count is the same integer
    return w;
  };
  return locate;
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
