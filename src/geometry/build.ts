/**
 * buildGeometry: the plate of the model → exact boundary pieces, loops, corners and area, with
 * every check that the mesher relies on (no crossings, no touching loops, openings inside the
 * outline and not inside each other).
 */
import { GeometryError } from '../errors.js';
import type { Plate, Point, Shape } from '../model/types.js';
import { boundingBox } from '../model/index.js';
import type { BoundaryPiece, Corner, Curve, Loop, PlateGeometry } from './types.js';
import { curveBBox, curveDoubleArea, curveEnd, curveLength, curveStart, curveTangent, type BBox } from './curves.js';
import { buildShapeLoop, shapeExtent, STRAIGHT_TURN, type LoopDraft } from './loops.js';
import { boxesOverlap, pieceContact, unionBox, windingNumber } from './checks.js';
import { forEachOverlappingPair } from './predicates.js';
import { buildBoxGrid, forEachNearBox } from './box-grid.js';
import { windingLocator } from './query.js';
import { fmt, fmtPoint, withMessageOrigin } from './format.js';

/**
 * Two loops (or two non-neighbouring pieces of one loop) must stay this far apart, relative to
 * the plate's bounding-box diagonal. Closer than that they count as touching: no mesh could
 * resolve the gap.
 */
export const CLEARANCE_RELATIVE = 1e-8;

/**
 * Significant decimal digits that must be left for the plate after its distance from the origin
 * takes its share of a double's 15.95: below this, node coordinates (which the solver and the
 * selectors use as they are, far from 0) resolve the plate to worse than 1 part in 10⁹ of its
 * size, the clearance and selector tolerances (1e-8 and 1e-9 of it) stop working, and stresses
 * drift (measured: see docs/reliability.md, "Coordinates far from the origin").
 */
export const MIN_DIGITS_LEFT = 9;

/**
 * Build the plate's exact boundary. Every coordinate is first taken relative to the centre of
 * the outline's bounding box and the checks run there (sums and differences of small numbers);
 * the result is moved back, and keeps the centred copy in `local` for the mesher.
 */
export function buildGeometry(plate: Plate): PlateGeometry {
  if (!plate || typeof plate.outline !== 'object' || plate.outline === null || !Array.isArray(plate.openings)) {
    throw new GeometryError('plate: expected an outline shape and a list of openings', 'plate');
  }
  const origin = plateOrigin(plate.outline);
  if (origin[0] === 0 && origin[1] === 0) return buildAt(plate);
  const local = withMessageOrigin(origin, () => buildAt(translatePlate(plate, origin)));
  return { ...translateGeometry(local, origin), local: { origin, geometry: local } };
}

/**
 * The centre of the outline's bounding box ([0, 0] for broken input, left to the checks), after
 * refusing coordinates so far from it that too few digits are left for the plate itself.
 */
function plateOrigin(outline: Shape): Point {
  const box = boundingBox(outline);
  const values = [box.minX, box.minY, box.width, box.height];
  if (!values.every(Number.isFinite) || !(box.width >= 0 && box.height >= 0)) return [0, 0];
  const size = Math.hypot(box.width, box.height);
  const far = Math.max(Math.abs(box.minX), Math.abs(box.minY), Math.abs(box.minX + box.width), Math.abs(box.minY + box.height));
  if (size > 0 && far > 0) {
    // a double carries 52 bits after the leading one: 15.95 decimal digits
    const left = Math.log10(size / (far * 2 ** -52));
    if (left < MIN_DIGITS_LEFT) {
      throw new GeometryError(
        `plate.outline: the plate is ${fmt(size)} across but lies ${far >= 1e6 ? far.toExponential(2).replace('e+', 'e') : fmt(far)} from the origin; `
          + `a number keeps 15.9 significant digits, ${(15.95 - left).toFixed(1)} of them go to that distance, leaving ${Math.max(0, left).toFixed(1)} `
          + `for the plate (peakwise needs ${MIN_DIGITS_LEFT}); move the model's coordinates near 0 (subtract a point of the plate from every coordinate)`,
        'plate.outline',
      );
    }
  }
  return [box.minX + box.width / 2, box.minY + box.height / 2];
}

const shiftPoint = (p: Point, o: Point): Point => [p[0] - o[0], p[1] - o[1]];

function translateShape(shape: Shape, o: Point): Shape {
  switch (shape.kind) {
    case 'circle': case 'ellipse': case 'rect':
      return { ...shape, center: shiftPoint(shape.center, o) };
    case 'polygon': {
      const moved: Shape = { ...shape, vertices: shape.vertices.map((v) => ({ ...v, at: shiftPoint(v.at, o) })) };
      if (shape.pieces) {
        moved.pieces = shape.pieces.map((p) => (p.kind === 'line'
          ? { ...p, from: shiftPoint(p.from, o), to: shiftPoint(p.to, o) }
          : { ...p, center: shiftPoint(p.center, o), from: shiftPoint(p.from, o), to: shiftPoint(p.to, o) }));
      }
      return moved;
    }
  }
}

function translatePlate(plate: Plate, o: Point): Plate {
  return {
    ...plate,
    outline: translateShape(plate.outline, o),
    openings: plate.openings.map((op) => ({ ...op, shape: op.shape && typeof op.shape === 'object' ? translateShape(op.shape, o) : op.shape })),
  };
}

/** The geometry moved by +o (built about the origin, handed out where the plate is). */
function translateGeometry(g: PlateGeometry, o: Point): PlateGeometry {
  const back = (p: Point): Point => [p[0] + o[0], p[1] + o[1]];
  const curve = (c: Curve): Curve => {
    if (c.kind === 'line') return { ...c, from: back(c.from), to: back(c.to) };
    const moved = { ...c, center: back(c.center) };
    if (c.from) moved.from = back(c.from);
    if (c.to) moved.to = back(c.to);
    return moved;
  };
  return {
    ...g,
    pieces: g.pieces.map((p) => ({ ...p, curve: curve(p.curve) })),
    corners: g.corners.map((c) => ({ ...c, at: back(c.at) })),
    bbox: { minX: g.bbox.minX + o[0], minY: g.bbox.minY + o[1], maxX: g.bbox.maxX + o[0], maxY: g.bbox.maxY + o[1] },
  };
}

function buildAt(plate: Plate): PlateGeometry {
  const drafts: LoopDraft[] = [];
  // the outline's own extent sets the clearance while the loops are built (openings lie inside it)
  const minLength = CLEARANCE_RELATIVE * shapeExtent(plate.outline);
  // imported shapes name their file in every message (issue 9)
  const from = (shape: Plate['outline']): string => (shape.kind === 'polygon' && shape.source ? ` (read from ${shape.source})` : '');
  drafts.push(buildShapeLoop(plate.outline, { id: 'outline', hole: false, keyPath: 'plate.outline', label: `the outline${from(plate.outline)}`, minLength }));
  const seen = new Map<string, string>();
  for (let k = 0; k < plate.openings.length; k++) {
    const op = plate.openings[k];
    const keyPath = op.keyPath || `plate.openings[${k}]`;
    if (op.id === 'outline') {
      throw new GeometryError(`${keyPath}: an opening cannot be called 'outline'; that name means the outer boundary`, `${keyPath}.id`);
    }
    const before = seen.get(op.id);
    if (before !== undefined) {
      throw new GeometryError(`${keyPath}: opening id '${op.id}' is already used by ${before}`, `${keyPath}.id`);
    }
    seen.set(op.id, keyPath);
    drafts.push(buildShapeLoop(op.shape, { id: op.id, hole: true, keyPath, label: `opening ${op.id}${from(op.shape)}`, minLength }));
  }

  // ids, boxes, scale
  const pieces: BoundaryPiece[] = [];
  const pieceBoxes: BBox[] = [];
  const loopPieceIds: number[][] = [];
  for (const d of drafts) {
    const ids: number[] = [];
    for (const p of d.pieces) {
      const id = pieces.length;
      pieces.push({ id, curve: p.curve, loop: d.id, role: p.role, radius: p.radius, keyPath: p.keyPath });
      pieceBoxes.push(curveBBox(p.curve));
      ids.push(id);
    }
    loopPieceIds.push(ids);
  }
  const loopBoxes = loopPieceIds.map((ids) => unionBox(ids.map((i) => pieceBoxes[i])));
  const bbox = unionBox(pieceBoxes);
  const scale = Math.hypot(bbox.maxX - bbox.minX, bbox.maxY - bbox.minY);
  const tol = CLEARANCE_RELATIVE * scale;

  // 1. each polygon loop keeps clear of itself (fillets can reach across a narrow gap)
  drafts.forEach((d, li) => {
    if (d.polygon) checkLoopClear(d, loopPieceIds[li], pieces, pieceBoxes, tol);
  });
  // 2. openings against the outline: no contact, and inside it (the outline's pieces in a
  // bucket grid, so a long outline and many openings do not meet pairwise)
  const outlineIds = loopPieceIds[0];
  const outlineGrid = buildBoxGrid(Float64Array.from(outlineIds.flatMap((i) => [pieceBoxes[i].minX, pieceBoxes[i].minY, pieceBoxes[i].maxX, pieceBoxes[i].maxY])));
  const outlineWinding = windingLocator(outlineIds.map((i) => pieces[i].curve));
  const nearSeen = new Uint8Array(outlineIds.length);
  for (let li = 1; li < drafts.length; li++) {
    const d = drafts[li];
    const box = loopBoxes[li];
    const near: number[] = [];
    forEachNearBox(outlineGrid, box.minX, box.minY, box.maxX, box.maxY, tol, nearSeen, (k) => near.push(outlineIds[k]));
    const hit = loopsContact(near, loopPieceIds[li], pieces, pieceBoxes, tol);
    if (hit) {
      throw new GeometryError(
        `${d.keyPath}: ${d.label} crosses or touches the outline near ${fmtPoint(hit)}; ` +
          'an opening must lie wholly inside the plate (cut a notch into an edge as part of plate.outline)',
        d.keyPath,
      );
    }
    const probe = curveStart(pieces[loopPieceIds[li][0]].curve);
    if (outlineWinding(probe) === 0) {
      throw new GeometryError(`${d.keyPath}: ${d.label} lies outside the outline`, d.keyPath);
    }
  }
  // 3. openings against each other: no contact, no nesting
  const openingBoxes = loopBoxes.slice(1);
  forEachOverlappingPair(openingBoxes, tol, (i, j) => {
    const la = i + 1;
    const lb = j + 1;
    const hit = loopsContact(loopPieceIds[la], loopPieceIds[lb], pieces, pieceBoxes, tol);
    const a = drafts[la];
    const b = drafts[lb];
    if (hit) {
      throw new GeometryError(
        `${a.keyPath}: ${a.label} overlaps or touches ${b.label} (${b.keyPath}) near ${fmtPoint(hit)}`,
        a.keyPath,
      );
    }
    const curvesOf = (l: number) => loopPieceIds[l].map((id) => pieces[id].curve);
    const probeA = curveStart(pieces[loopPieceIds[la][0]].curve);
    const probeB = curveStart(pieces[loopPieceIds[lb][0]].curve);
    if (windingNumber(curvesOf(lb), probeA) !== 0) {
      throw new GeometryError(`${a.keyPath}: ${a.label} lies inside ${b.label} (${b.keyPath})`, a.keyPath);
    }
    if (windingNumber(curvesOf(la), probeB) !== 0) {
      throw new GeometryError(`${b.keyPath}: ${b.label} lies inside ${a.label} (${a.keyPath})`, b.keyPath);
    }
  });

  // loops, corners, area
  const loops: Loop[] = drafts.map((d, li) => ({ id: d.id, hole: d.hole, pieces: loopPieceIds[li], keyPath: d.keyPath }));
  const corners: Corner[] = [];
  drafts.forEach((d, li) => {
    const ids = loopPieceIds[li];
    for (let k = 0; k < ids.length; k++) {
      const pin = pieces[ids[k]];
      const pout = pieces[ids[(k + 1) % ids.length]];
      const u = curveTangent(pin.curve, 1);
      const v = curveTangent(pout.curve, 0);
      const turn = Math.atan2(u[0] * v[1] - u[1] * v[0], u[0] * v[0] + u[1] * v[1]);
      if (Math.abs(turn) <= STRAIGHT_TURN) continue;
      corners.push({
        at: curveEnd(pin.curve),
        // material on the left: a left turn by τ leaves the material an angle of π − τ
        interiorAngleDeg: ((Math.PI - turn) * 180) / Math.PI,
        loop: d.id,
        pieceIn: pin.id,
        pieceOut: pout.id,
        keyPath: d.pieces[k].endVertexPath,
      });
    }
  });
  // Green's theorem about the box centre (smaller terms, less cancellation)
  const origin: Point = [0.5 * (bbox.minX + bbox.maxX), 0.5 * (bbox.minY + bbox.maxY)];
  let area2 = 0;
  for (const p of pieces) area2 += curveDoubleArea(p.curve, origin);
  return {
    pieces,
    loops,
    corners,
    area: 0.5 * area2,
    bbox: { minX: bbox.minX, minY: bbox.minY, maxX: bbox.maxX, maxY: bbox.maxY },
    scale,
  };
}

function checkLoopClear(d: LoopDraft, ids: number[], pieces: BoundaryPiece[], boxes: BBox[], tol: number): void {
  const n = ids.length;
  if (n < 4) return; // every pair of pieces are neighbours
  const local = ids.map((id) => boxes[id]);
  // prefix sums of piece lengths: pieces joined by a stretch of boundary shorter than a few
  // clearances are as good as neighbours — they come that close by construction, not by mistake
  const lengths = ids.map((id) => curveLength(pieces[id].curve));
  const prefix = new Float64Array(n + 1);
  for (let k = 0; k < n; k++) prefix[k + 1] = prefix[k] + lengths[k];
  const total = prefix[n];
  forEachOverlappingPair(local, tol, (i, j) => {
    if (j === i + 1 || (i === 0 && j === n - 1)) return; // neighbours meet at their junction by construction
    const between = prefix[j] - prefix[i + 1]; // pieces strictly between i and j going forward
    const around = total - (prefix[j + 1] - prefix[i]); // and going the other way
    if (Math.min(between, around) <= 4 * tol) return;
    const hit = pieceContact(pieces[ids[i]].curve, pieces[ids[j]].curve, tol);
    if (hit) {
      throw new GeometryError(
        `${d.keyPath}: ${d.label} crosses or touches itself near ${fmtPoint(hit)} ` +
          `(between ${describePiece(pieces[ids[i]])} and ${describePiece(pieces[ids[j]])})`,
        pieces[ids[i]].keyPath,
      );
    }
  });
}

function describePiece(p: BoundaryPiece): string {
  const what = p.role === 'fillet' ? 'the fillet' : p.role === 'edge' ? 'the edge' : `the ${p.role}`;
  return `${what} at ${p.keyPath}`;
}

function loopsContact(a: number[], b: number[], pieces: BoundaryPiece[], boxes: BBox[], tol: number): Point | null {
  for (const i of a) {
    for (const j of b) {
      if (!boxesOverlap(boxes[i], boxes[j], tol)) continue;
      const hit = pieceContact(pieces[i].curve, pieces[j].curve, tol);
      if (hit) return hit;
    }
  }
  return null;
}
