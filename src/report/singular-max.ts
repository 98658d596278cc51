/**
 * Whether the maximum of one solve sits at a point where the idealised model is singular, and the
 * warning that says so. One solve cannot tell a real concentration from a singularity (the study
 * does that by refining), but theory alone already flags the usual suspects: a sharp corner whose
 * Williams (1952) exponent is below 1 for its face conditions (a re-entrant free corner, a corner
 * where a support ends), the end of a supported stretch of a straight edge, a concentrated force and
 * a point support (Flamant, σ ∝ 1/r). The terminal summary of `solve` and the solve page of the
 * report both print the same sentence.
 */
import type { PlateGeometry, BoundaryPiece } from '../geometry/types.js';
import type { Mesh } from '../mesh/types.js';
import type { Model, Point, Support } from '../model/types.js';
import type { FaceCondition } from '../study/types.js';
import { wedgeTheory } from '../study/wedge-theory.js';
import { formatFixed, formatNumber, stripControl } from './text.js';
import { nearestBoundaryPoint } from '../fem/index.js';

/** A point the idealised model makes singular. */
export interface SingularPoint {
  at: Point;
  /** words: "the re-entrant corner (40, 40) mm, 270°, faces free/free" */
  what: string;
  /** growth exponent q of the peak under refinement (peak ∝ h^−q) */
  q: number;
  /** the singularity comes from an idealised support or point load rather than the geometry */
  fromIdealisation: boolean;
}

function onSegment(p: Point, a: Point, b: Point, tol: number): boolean {
  const dx = b[0] - a[0], dy = b[1] - a[1];
  const L2 = dx * dx + dy * dy;
  const t = L2 > 0 ? Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / L2)) : 0;
  return Math.hypot(p[0] - (a[0] + t * dx), p[1] - (a[1] + t * dy)) <= tol;
}

function pieceEnds(piece: BoundaryPiece): [Point, Point] | undefined {
  const c = piece.curve;
  if (c.kind === 'line') return [c.from, c.to];
  return c.from && c.to ? [c.from, c.to] : undefined;
}

/** Whether a support selector covers a whole boundary piece. */
function covers(support: Support, piece: BoundaryPiece, tol: number, geometry: PlateGeometry): boolean {
  const w = support.where;
  switch (w.kind) {
    case 'outline':
      return piece.loop === 'outline';
    case 'opening':
      return piece.loop === w.id;
    case 'point':
      return false;
    case 'piece':
      return nearestBoundaryPoint(geometry, w.at).piece === piece.id;
    default: {
      if (piece.curve.kind !== 'line') return false;
      const [a, b] = [piece.curve.from, piece.curve.to];
      if (w.kind === 'x') return Math.abs(a[0] - w.value) <= tol && Math.abs(b[0] - w.value) <= tol;
      if (w.kind === 'y') return Math.abs(a[1] - w.value) <= tol && Math.abs(b[1] - w.value) <= tol;
      return onSegment(a, w.from, w.to, tol) && onSegment(b, w.from, w.to, tol);
    }
  }
}

/**
 * Condition of a face held in x (`fx`) and/or y (`fy`), as the study reads it (docs/study.md): free,
 * clamped (both directions held, or the tangential one only, or a prescribed motion) or sliding (only
 * the normal held: a roller or symmetry line).
 */
function condition(fx: boolean, fy: boolean, moved: boolean, piece: BoundaryPiece): FaceCondition {
  if (!fx && !fy) return 'free';
  if ((fx && fy) || moved || piece.curve.kind !== 'line') return 'clamped';
  const { from, to } = piece.curve;
  const tx = Math.abs(to[0] - from[0]), ty = Math.abs(to[1] - from[1]);
  // held along the normal only: x held on an edge running in y, or y held on an edge running in x
  return (fx && ty > tx) || (fy && tx > ty) ? 'sliding' : 'clamped';
}

/** Condition of one face from all the supports that cover it. */
function faceOf(model: Model, piece: BoundaryPiece, tol: number, geometry: PlateGeometry): FaceCondition {
  let fx = false, fy = false, moved = false;
  for (const s of model.supports) {
    if (!covers(s, piece, tol, geometry)) continue;
    fx ||= s.fix.x;
    fy ||= s.fix.y;
    moved ||= s.displace !== undefined;
  }
  return condition(fx, fy, moved, piece);
}

const pt = (p: Point, L: string) => `(${formatNumber(p[0])}, ${formatNumber(p[1])}) ${stripControl(L)}`.trimEnd();

/** Every point of the model that theory flags as singular (see the file comment). */
export function singularPoints(model: Model, geometry: PlateGeometry): SingularPoint[] {
  const tol = 1e-6 * geometry.scale;
  const L = model.units.length;
  const out: SingularPoint[] = [];
  for (const c of geometry.corners) {
    const faces: [FaceCondition, FaceCondition] = [faceOf(model, geometry.pieces[c.pieceIn], tol, geometry), faceOf(model, geometry.pieces[c.pieceOut], tol, geometry)];
    const th = wedgeTheory(c.interiorAngleDeg, faces, model.material.nu, model.state);
    if (!(th.q > 0)) continue;
    const held = faces.some((f) => f !== 'free');
    const kind = held ? 'corner where a support ends' : c.interiorAngleDeg > 180 ? 're-entrant corner' : 'corner';
    out.push({
      at: c.at, q: th.q, fromIdealisation: held,
      what: `the ${kind} ${pt(c.at, L)}, ${formatNumber(c.interiorAngleDeg, 4)}°, faces ${faces.join('/')}`,
    });
  }
  // ends of a supported stretch in the middle of a straight edge
  for (const s of model.supports) {
    if (s.where.kind !== 'segment') continue;
    for (const end of [s.where.from, s.where.to]) {
      if (geometry.corners.some((c) => Math.hypot(c.at[0] - end[0], c.at[1] - end[1]) <= tol)) continue;
      const piece = geometry.pieces.find((p) => { const e = pieceEnds(p); return e !== undefined && p.curve.kind === 'line' && onSegment(end, e[0], e[1], tol); });
      if (!piece) continue;
      const face = condition(s.fix.x, s.fix.y, s.displace !== undefined, piece);
      if (face === 'free') continue;
      const th = wedgeTheory(180, [face, 'free'], model.material.nu, model.state);
      if (th.q > 0) out.push({ at: end, q: th.q, fromIdealisation: true, what: `the end of the supported edge at ${pt(end, L)} (${face}/free)` });
    }
  }
  for (const l of model.loads) {
    if (l.kind === 'force' && l.where.kind === 'point') out.push({ at: l.where.at, q: 1, fromIdealisation: true, what: `the concentrated force at ${pt(l.where.at, L)}` });
  }
  for (const s of model.supports) {
    if (s.where.kind === 'point') out.push({ at: s.where.at, q: 1, fromIdealisation: true, what: `the point support at ${pt(s.where.at, L)} (singular where it carries force)` });
  }
  return out;
}

/** Longest element edge at the mesh node nearest `at`: how close "at the point" can be resolved. */
function localEdge(mesh: Mesh, at: Point): number {
  const xy = mesh.xy, en = mesh.elemNodes, npe = mesh.nodesPerElem;
  let node = 0, best = Infinity;
  for (let n = 0; n < xy.length / 2; n++) {
    const d = Math.hypot(xy[2 * n] - at[0], xy[2 * n + 1] - at[1]);
    if (d < best) { best = d; node = n; }
  }
  let edge = 0;
  for (let e = 0; e < en.length / npe; e++) {
    let has = false;
    for (let i = 0; i < npe; i++) if (en[npe * e + i] === node) has = true;
    if (!has) continue;
    for (let i = 0; i < 3; i++) {
      const a = en[npe * e + i], b = en[npe * e + ((i + 1) % 3)];
      edge = Math.max(edge, Math.hypot(xy[2 * b] - xy[2 * a], xy[2 * b + 1] - xy[2 * a + 1]));
    }
  }
  return edge;
}

/**
 * The warning for a solve whose maximum lies within one local element size of a singular point,
 * or undefined. `measure` names the stress ("von Mises stress").
 */
export function singularMaxWarning(
  input: { model: Model; geometry: PlateGeometry; mesh: Mesh; at: Point; measure: string },
): string | undefined {
  const { model, geometry, mesh, at } = input;
  const reach = Math.max(1e-6 * geometry.scale, 1.01 * localEdge(mesh, at));
  let hit: SingularPoint | undefined;
  let dBest = Infinity;
  for (const p of singularPoints(model, geometry)) {
    const d = Math.hypot(p.at[0] - at[0], p.at[1] - at[1]);
    if (d <= reach && d < dBest) { hit = p; dBest = d; }
  }
  if (!hit) return undefined;
  const cause = hit.fromIdealisation
    ? 'a singularity of the idealised support or load, not of the real part'
    : 'a singular point of the idealised geometry';
  return (
    `the maximum ${stripControl(input.measure)} sits at ${hit.what}: ${cause} (theory: the peak grows like h^−${formatFixed(hit.q, 2)} as the mesh is refined), ` +
    `so this maximum is not a stress and will rise with every finer mesh; run peakwise study for each site's verdict and readouts`
  );
}
