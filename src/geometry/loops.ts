/**
 * Turn one model shape (the outline or an opening) into a closed loop of boundary pieces,
 * oriented so that the material lies on the left of travel: the outline counter-clockwise,
 * openings clockwise. Polygon vertices with `round` > 0 become tangent circular arcs.
 */
import { GeometryError } from '../errors.js';
import type { PathPiece, Point, PolygonVertex, Shape } from '../model/types.js';
import type { Curve, PieceRole } from './types.js';
import { fmt, fmtPoint } from './format.js';
import { curveDoubleArea, curveLength } from './curves.js';
import { forEachOverlappingPair, leftOf, segmentMeetPoint, segmentsIntersect } from './predicates.js';

/** A piece before it gets its id. */
export interface PieceDraft {
  curve: Curve;
  role: PieceRole;
  radius: number;
  keyPath: string;
  /** key path of the model vertex at the end of this piece (names corners) */
  endVertexPath: string;
}

export interface LoopDraft {
  id: string;
  hole: boolean;
  keyPath: string;
  /** "the outline" or "opening pin (plate.openings[1])", for messages */
  label: string;
  /** polygon loops are the only ones that can cross themselves */
  polygon: boolean;
  pieces: PieceDraft[];
}

export interface LoopContext {
  id: string;
  hole: boolean;
  keyPath: string;
  label: string;
  /**
   * Shortest feature worth keeping (the clearance of the plate): edges shorter than this are
   * errors, fillets whose tangent length is shorter count as sharp corners, and a line left
   * shorter than this between two fillets is dropped.
   */
  minLength: number;
}

/** Turns below this (radians) count as straight: tangent junctions, collinear vertices. */
export const STRAIGHT_TURN = 1e-9;
/** Relative slack when deciding whether fillets fit an edge, and when a leftover line is nil. */
const FIT_SLACK = 1e-9;

function requirePositive(value: number, path: string, what: string): void {
  if (!(Number.isFinite(value) && value > 0)) {
    throw new GeometryError(`${path}: ${what} must be a positive number, got ${fmt(value)}`, path);
  }
}

function requireFinitePoint(p: Point, path: string): void {
  if (!(Number.isFinite(p[0]) && Number.isFinite(p[1]))) {
    throw new GeometryError(`${path}: point coordinates must be finite numbers, got [${p[0]}, ${p[1]}]`, path);
  }
}

export function buildShapeLoop(shape: Shape, ctx: LoopContext): LoopDraft {
  switch (shape.kind) {
    case 'circle': {
      requireFinitePoint(shape.center, `${ctx.keyPath}.circle.center`);
      requirePositive(shape.radius, `${ctx.keyPath}.circle.radius`, 'the circle radius');
      return circleLoop(shape.center, shape.radius, ctx);
    }
    case 'ellipse': {
      requireFinitePoint(shape.center, `${ctx.keyPath}.ellipse.center`);
      requirePositive(shape.a, `${ctx.keyPath}.ellipse.a`, 'the ellipse semi-axis a');
      requirePositive(shape.b, `${ctx.keyPath}.ellipse.b`, 'the ellipse semi-axis b');
      if (!Number.isFinite(shape.angleDeg)) {
        throw new GeometryError(`${ctx.keyPath}.ellipse.angle must be a finite number of degrees`, `${ctx.keyPath}.ellipse.angle`);
      }
      return ellipseLoop(shape.center, shape.a, shape.b, (shape.angleDeg * Math.PI) / 180, ctx);
    }
    case 'rect': {
      const base = `${ctx.keyPath}.rect`;
      requireFinitePoint(shape.center, `${base}.center`);
      requirePositive(shape.width, `${base}.width`, 'the rectangle width');
      requirePositive(shape.height, `${base}.height`, 'the rectangle height');
      const r = shape.round;
      if (!(Number.isFinite(r) && r >= 0)) {
        throw new GeometryError(`${base}.round: the corner radius must be 0 or more, got ${fmt(r)}`, `${base}.round`);
      }
      const maxRound = Math.min(shape.width, shape.height) / 2;
      if (r > maxRound * (1 + FIT_SLACK)) {
        throw new GeometryError(
          `${base}.round: corner radius ${fmt(r)} does not fit a ${fmt(shape.width)} × ${fmt(shape.height)} rectangle; ` +
            `it can be at most half the shorter side, ${fmt(maxRound)}`,
          `${base}.round`,
        );
      }
      const [cx, cy] = shape.center;
      const hw = shape.width / 2;
      const hh = shape.height / 2;
      const vertices: PolygonVertex[] = [
        { at: [cx - hw, cy - hh], round: r },
        { at: [cx + hw, cy - hh], round: r },
        { at: [cx + hw, cy + hh], round: r },
        { at: [cx - hw, cy + hh], round: r },
      ];
      // one shape: every piece and corner is named by the shape's own key path
      const loop = polygonLoop(vertices, ctx, () => ctx.keyPath, () => ctx.keyPath, () => ctx.keyPath, false);
      // a rectangle with round ≤ half its shorter side cannot touch itself: skip that check
      return { ...loop, polygon: false };
    }
    case 'polygon': {
      if (shape.pieces) return pathLoop(shape.pieces, ctx);
      const isOutline = !ctx.hole;
      const vertexPath = (i: number): string => (isOutline ? `${ctx.keyPath}[${i}]` : `${ctx.keyPath}.polygon[${i}]`);
      // outline edges and fillets are named by their vertex; opening pieces by the opening
      const piecePath = isOutline ? vertexPath : (): string => ctx.keyPath;
      return polygonLoop(shape.vertices, ctx, vertexPath, piecePath, piecePath, true);
    }
  }
}

/** Diagonal of the shape's bounding box, before any checks (NaN-safe: 0 for broken input). */
export function shapeExtent(shape: Shape): number {
  let d = 0;
  switch (shape.kind) {
    case 'circle':
      d = 2 * Math.SQRT2 * shape.radius;
      break;
    case 'ellipse':
      d = 2 * Math.SQRT2 * Math.max(shape.a, shape.b);
      break;
    case 'rect':
      d = Math.hypot(shape.width, shape.height);
      break;
    case 'polygon': {
      let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
      for (const v of shape.vertices) {
        minX = Math.min(minX, v.at[0]); maxX = Math.max(maxX, v.at[0]);
        minY = Math.min(minY, v.at[1]); maxY = Math.max(maxY, v.at[1]);
      }
      d = Math.hypot(maxX - minX, maxY - minY);
      break;
    }
  }
  return Number.isFinite(d) && d > 0 ? d : 0;
}

function circleLoop(center: Point, radius: number, ctx: LoopContext): LoopDraft {
  const s = ctx.hole ? -1 : 1;
  // two half circles meeting at the ends of the horizontal diameter: every piece then has two
  // distinct end points, which the mesher needs to split and constrain it
  const p0: Point = [center[0] + radius, center[1]];
  const p1: Point = [center[0] - radius, center[1]];
  const half = (startAngle: number, from: Point, to: Point): PieceDraft => ({
    curve: { kind: 'arc', center: [center[0], center[1]], radius, startAngle, sweep: s * Math.PI, from, to },
    role: 'circle',
    radius,
    keyPath: ctx.keyPath,
    endVertexPath: ctx.keyPath,
  });
  return {
    id: ctx.id, hole: ctx.hole, keyPath: ctx.keyPath, label: ctx.label,
    polygon: false,
    pieces: [half(0, p0, p1), half(Math.PI, p1, p0)],
  };
}

function ellipseLoop(center: Point, a: number, b: number, rotation: number, ctx: LoopContext): LoopDraft {
  const s = ctx.hole ? -1 : 1;
  const ux = a * Math.cos(rotation);
  const uy = a * Math.sin(rotation);
  // halves meet at the ends of the a axis
  const p0: Point = [center[0] + ux, center[1] + uy];
  const p1: Point = [center[0] - ux, center[1] - uy];
  const tipRadius = Math.min((b * b) / a, (a * a) / b);
  const half = (startParam: number, from: Point, to: Point): PieceDraft => ({
    curve: { kind: 'ellipse-arc', center: [center[0], center[1]], a, b, rotation, startParam, sweep: s * Math.PI, from, to },
    role: 'ellipse',
    radius: tipRadius,
    keyPath: ctx.keyPath,
    endVertexPath: ctx.keyPath,
  });
  return {
    id: ctx.id, hole: ctx.hole, keyPath: ctx.keyPath, label: ctx.label,
    polygon: false,
    pieces: [half(0, p0, p1), half(Math.PI, p1, p0)],
  };
}

/** Twice the signed (shoelace) area of a vertex ring. */
function doubleShoelace(pts: readonly Point[]): number {
  let sum = 0;
  const n = pts.length;
  const o = pts[0];
  for (let i = 1; i + 1 < n; i++) {
    const a = pts[i];
    const b = pts[i + 1];
    sum += (a[0] - o[0]) * (b[1] - o[1]) - (b[0] - o[0]) * (a[1] - o[1]);
  }
  return sum;
}

/**
 * Exact check that a raw polygon (before fillets) is simple: no two edges meet except neighbours
 * at their shared vertex, and no neighbour folds back onto the other.
 */
function checkPolygonSimple(pts: readonly Point[], ctx: LoopContext, vertexPath: (i: number) => string): void {
  const n = pts.length;
  const boxes = pts.map((a, i) => {
    const b = pts[(i + 1) % n];
    return { minX: Math.min(a[0], b[0]), minY: Math.min(a[1], b[1]), maxX: Math.max(a[0], b[0]), maxY: Math.max(a[1], b[1]) };
  });
  const crossing = (i: number, j: number, at: Point): GeometryError =>
    new GeometryError(
      `${ctx.keyPath}: ${ctx.label} crosses itself: the edge from ${vertexPath(i)} meets the edge from ${vertexPath(j)} near ${fmtPoint(at)}`,
      vertexPath(i),
    );
  // neighbours: the only legal common point is the shared vertex; a fold-back overlaps a length
  for (let i = 0; i < n; i++) {
    const a = pts[(i + n - 1) % n];
    const b = pts[i];
    const c = pts[(i + 1) % n];
    const ux = b[0] - a[0];
    const uy = b[1] - a[1];
    const vx = c[0] - b[0];
    const vy = c[1] - b[1];
    if (ux * vy - uy * vx === 0 && ux * vx + uy * vy < 0) throw crossing((i + n - 1) % n, i, b);
  }
  forEachOverlappingPair(boxes, 0, (i, j) => {
    const adjacent = j === i + 1 || (i === 0 && j === n - 1);
    if (adjacent) return;
    const a = pts[i];
    const b = pts[(i + 1) % n];
    const c = pts[j];
    const d = pts[(j + 1) % n];
    if (segmentsIntersect(a, b, c, d)) throw crossing(i, j, segmentMeetPoint(a, b, c, d));
  });
}

function polygonLoop(
  vertices: readonly PolygonVertex[],
  ctx: LoopContext,
  vertexPath: (i: number) => string,
  edgePath: (i: number) => string,
  filletPath: (i: number) => string,
  nameVertices: boolean,
): LoopDraft {
  const n = vertices.length;
  if (n < 3) {
    throw new GeometryError(
      `${ctx.keyPath}: ${ctx.label} has ${n} ${n === 1 ? 'vertex' : 'vertices'}; a polygon needs at least 3`,
      ctx.keyPath,
    );
  }
  const pts: Point[] = [];
  for (let i = 0; i < n; i++) {
    const v = vertices[i];
    const path = vertexPath(i);
    requireFinitePoint(v.at, path);
    if (!(Number.isFinite(v.round) && v.round >= 0)) {
      throw new GeometryError(`${path}.round: the fillet radius must be 0 or more, got ${fmt(v.round)}`, `${path}.round`);
    }
    pts.push([v.at[0], v.at[1]]);
  }
  for (let i = 0; i < n; i++) {
    const a = pts[i];
    const b = pts[(i + 1) % n];
    const j = (i + 1) % n;
    if (a[0] === b[0] && a[1] === b[1]) {
      throw new GeometryError(
        `${vertexPath(j)}: zero-length edge: the vertex repeats ${nameVertices ? vertexPath(i) : 'its neighbour'} at ${fmtPoint(a)}`,
        vertexPath(j),
      );
    }
    const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
    if (len < ctx.minLength) {
      throw new GeometryError(
        `${vertexPath(j)}: the edge from ${nameVertices ? vertexPath(i) : 'its neighbour'} is only ${fmt(len)} long, ` +
          `too short to resolve on a plate of this size (at least ${fmt(ctx.minLength)})`,
        vertexPath(j),
      );
    }
  }
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const p of pts) {
    minX = Math.min(minX, p[0]); maxX = Math.max(maxX, p[0]);
    minY = Math.min(minY, p[1]); maxY = Math.max(maxY, p[1]);
  }
  const diag = Math.hypot(maxX - minX, maxY - minY);
  // all vertices on one line (exact test), before the crossing test would call it a fold-back
  if (pts.every((p) => leftOf(pts[0], pts[1], p) === 0)) {
    throw new GeometryError(`${ctx.keyPath}: ${ctx.label} encloses no area: its vertices lie on one line`, ctx.keyPath);
  }
  checkPolygonSimple(pts, ctx, vertexPath);
  const area2 = doubleShoelace(pts);
  if (!(Math.abs(area2) > 1e-14 * diag * diag)) {
    throw new GeometryError(`${ctx.keyPath}: ${ctx.label} encloses (almost) no area`, ctx.keyPath);
  }

  // travel order: counter-clockwise for the outline, clockwise for an opening
  const wantPositive = !ctx.hole;
  const order = pts.map((_, i) => i);
  if (area2 > 0 !== wantPositive) order.reverse();

  // per travel position: signed turn τ and fillet tangent length L = r·tan(|τ|/2)
  const turn = new Float64Array(n);
  const tangentLength = new Float64Array(n);
  const dirIn: Point[] = [];
  const dirOut: Point[] = [];
  const edgeLen = new Float64Array(n); // edge from travel position j to j+1
  for (let j = 0; j < n; j++) {
    const a = pts[order[j]];
    const b = pts[order[(j + 1) % n]];
    edgeLen[j] = Math.hypot(b[0] - a[0], b[1] - a[1]);
  }
  for (let j = 0; j < n; j++) {
    const prev = pts[order[(j + n - 1) % n]];
    const v = pts[order[j]];
    const next = pts[order[(j + 1) % n]];
    const lin = edgeLen[(j + n - 1) % n];
    const lout = edgeLen[j];
    const din: Point = [(v[0] - prev[0]) / lin, (v[1] - prev[1]) / lin];
    const dout: Point = [(next[0] - v[0]) / lout, (next[1] - v[1]) / lout];
    dirIn.push(din);
    dirOut.push(dout);
    turn[j] = Math.atan2(din[0] * dout[1] - din[1] * dout[0], din[0] * dout[0] + din[1] * dout[1]);
    const r = vertices[order[j]].round;
    const L = r > 0 && Math.abs(turn[j]) > STRAIGHT_TURN ? r * Math.tan(Math.abs(turn[j]) / 2) : 0;
    // a fillet that changes the boundary by less than the clearance is a sharp corner
    tangentLength[j] = L > ctx.minLength ? L : 0;
  }
  // fit check, in input order so the message does not depend on the orientation
  const posOf = new Int32Array(n);
  for (let j = 0; j < n; j++) posOf[order[j]] = j;
  for (let i = 0; i < n; i++) {
    const j = posOf[i];
    const L = tangentLength[j];
    if (L === 0) continue;
    const jPrev = (j + n - 1) % n;
    const jNext = (j + 1) % n;
    const lenIn = edgeLen[jPrev];
    const lenOut = edgeLen[j];
    const availIn = lenIn - tangentLength[jPrev];
    const availOut = lenOut - tangentLength[jNext];
    const fitsIn = L <= availIn + Math.max(FIT_SLACK * lenIn, ctx.minLength);
    const fitsOut = L <= availOut + Math.max(FIT_SLACK * lenOut, ctx.minLength);
    if (!(fitsIn && fitsOut)) {
      const shared = tangentLength[jPrev] > 0 || tangentLength[jNext] > 0;
      const path = vertexPath(i);
      throw new GeometryError(
        `fillet radius ${fmt(vertices[i].round)} at ${path} does not fit: it needs ${fmt(L)} along each edge, ` +
          `the edges are only ${fmt(Math.max(0, availIn))} and ${fmt(Math.max(0, availOut))} long` +
          (shared ? ' (after the neighbouring fillets take their share)' : ''),
        path,
      );
    }
  }
  // tangent points; a vertex without fillet uses the vertex itself for both, so the two edges
  // meeting there share the very same numbers
  const t1: Point[] = [];
  const t2: Point[] = [];
  for (let j = 0; j < n; j++) {
    const v = pts[order[j]];
    const L = tangentLength[j];
    if (L === 0) {
      t1.push(v);
      t2.push(v);
    } else {
      t1.push([v[0] - dirIn[j][0] * L, v[1] - dirIn[j][1] * L]);
      t2.push([v[0] + dirOut[j][0] * L, v[1] + dirOut[j][1] * L]);
    }
  }
  // an edge eaten completely by its two fillets: the arcs meet, drop the line, one junction point
  const dropLine = new Uint8Array(n);
  for (let j = 0; j < n; j++) {
    const jn = (j + 1) % n;
    if (tangentLength[j] > 0 || tangentLength[jn] > 0) {
      if (edgeLen[j] - tangentLength[j] - tangentLength[jn] <= Math.max(FIT_SLACK * edgeLen[j], ctx.minLength)) {
        dropLine[j] = 1;
        t1[jn] = t2[j];
      }
    }
  }
  const pieces: PieceDraft[] = [];
  for (let j = 0; j < n; j++) {
    const o = order[j];
    const L = tangentLength[j];
    if (L > 0) {
      const r = vertices[o].round;
      const din = dirIn[j];
      const side = turn[j] > 0 ? 1 : -1; // centre on the left of travel for a left turn
      const from = t1[j];
      const center: Point = [from[0] - side * r * din[1], from[1] + side * r * din[0]];
      pieces.push({
        curve: {
          kind: 'arc', center, radius: r,
          startAngle: Math.atan2(from[1] - center[1], from[0] - center[0]),
          sweep: turn[j], from, to: t2[j],
        },
        role: 'fillet',
        radius: r,
        keyPath: filletPath(o),
        endVertexPath: vertexPath(o),
      });
    }
    if (!dropLine[j]) {
      const jn = (j + 1) % n;
      const on = order[jn];
      // edge k of the input joins vertex k and k+1 whichever way we travel it
      const inputEdge = on === (o + 1) % n ? o : on;
      pieces.push({
        curve: { kind: 'line', from: t2[j], to: t1[jn] },
        role: 'edge',
        radius: 0,
        keyPath: edgePath(inputEdge),
        endVertexPath: vertexPath(on),
      });
    }
  }
  return { id: ctx.id, hole: ctx.hole, keyPath: ctx.keyPath, label: ctx.label, polygon: true, pieces };
}

/** A curve run the other way: same points, t → 1 − t. */
function reversed(c: Curve): Curve {
  switch (c.kind) {
    case 'line':
      return { kind: 'line', from: c.to, to: c.from };
    case 'arc':
      return { ...c, startAngle: c.startAngle + c.sweep, sweep: -c.sweep, from: c.to, to: c.from };
    case 'ellipse-arc':
      return { ...c, startParam: c.startParam + c.sweep, sweep: -c.sweep, from: c.to, to: c.from };
  }
}

/**
 * An imported boundary (an SVG path): the pieces as they are, end to end, turned to the loop's
 * travel direction (signed area by Green's theorem, exact for arcs). Self-contact is checked by
 * buildGeometry like any polygon loop (`polygon: true`).
 */
function pathLoop(pieces: readonly PathPiece[], ctx: LoopContext): LoopDraft {
  const curves: Curve[] = pieces.map((p) => ({ ...p }));
  curves.forEach((c, k) => {
    if (!(curveLength(c) >= ctx.minLength)) {
      throw new GeometryError(
        `${ctx.keyPath}: piece ${k + 1} of ${ctx.label} is only ${fmt(curveLength(c))} long, too short to resolve on a plate of this size`,
        ctx.keyPath,
      );
    }
  });
  const o = curves[0].from ?? [0, 0];
  let area2 = 0;
  for (const c of curves) area2 += curveDoubleArea(c, o as Point);
  if (!(Math.abs(area2) > 0)) throw new GeometryError(`${ctx.keyPath}: ${ctx.label} encloses no area`, ctx.keyPath);
  const ordered = area2 > 0 === !ctx.hole ? curves : curves.reverse().map(reversed);
  return {
    id: ctx.id, hole: ctx.hole, keyPath: ctx.keyPath, label: ctx.label,
    polygon: true,
    pieces: ordered.map((curve) => ({
      curve,
      role: curve.kind === 'line' ? 'edge' : curve.kind === 'arc' ? (ctx.hole ? 'circle' : 'fillet') : 'ellipse',
      radius: curve.kind === 'line' ? 0 : curve.kind === 'arc' ? curve.radius : Math.min(curve.b ** 2 / curve.a, curve.a ** 2 / curve.b),
      keyPath: ctx.keyPath,
      endVertexPath: ctx.keyPath,
    })),
  };
}
