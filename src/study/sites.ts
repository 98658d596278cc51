import type { PlateGeometry } from '../geometry/types.js';
import { PeakwiseError } from '../errors.js';
import { closestOnCurve, curveCurvatureRadius, curveEnd, curveStart, loopWinding, pointInMaterial } from '../geometry/index.js';
import type { Mesh, SizeField } from '../mesh/types.js';
import type { Model, Point } from '../model/types.js';
import type { Solution } from '../fem/types.js';
import { nearestBoundaryPoint, selectBoundary } from '../fem/index.js';
import type { FaceCondition, SiteFeature } from './types.js';
import { wedgeTheory } from './wedge-theory.js';
import { boundaryEdgesAt, edgeDirection, nearestVertex, vertexNeighbours, wedgeAt } from './mesh-tools.js';

/** A site before refinement: where, what, and what theory expects there. */
export interface SiteCandidate {
  at: Point;
  node: number;
  feature: SiteFeature;
  /** predicted growth exponent q (0: none) and the words behind it */
  theory: number;
  theoryWhy: string;
  /** λ of the opening family, for the notch stress intensity (corners only) */
  lambdaOpening?: number;
  /**
   * unit direction into the material for the readouts: the bisector at corners, the inward normal on edges;
   * where one face is a mirror (sliding), the bisector of the mirrored wedge, i.e. along that face
   */
  direction?: Point;
  /** unit bisector of the real wedge at a boundary site, into the material (the refinement rosette spans it) */
  bisector?: Point;
  /** measure at the node on the first mesh */
  firstPeak: number;
  /**
   * length of the feature (docs/study.md, "Readout distance"): at a wedge or on an edge the shorter face
   * (from the site along the boundary to the next corner, piece end or support end: a crack's length on a
   * symmetry line, a notch's depth), on a curve at most its radius of curvature, never more than the distance
   * to the nearest other site; inside the plate the distance to the boundary
   */
  featureLength: number;
  /** words for featureLength, e.g. "shorter face 20" */
  featureLengthWhy: string;
  /** the free–free (or mirrored free–free) wedge whose stress intensity is read here (singular corners and crack tips) */
  intensity?: {
    alphaDeg: number; lambda: number; mirrorFactor: number; bisector: Point;
    /** distance from the apex to the nearest boundary other than the wedge's two faces */
    clearance?: number;
  };
  /**
   * a maximum flat along the boundary on the first mesh (within SITE_RULES.plateauFraction): the boundary
   * nodes it spans, in order along the boundary (the polyline through them is refined like the site itself
   * at every level), and whether it closes round its loop
   */
  plateau?: { points: Point[]; closed: boolean };
  /** why the site was picked */
  origin: 'feature' | 'maximum' | 'listed';
}

/** Rules of the site search (docs/study.md). */
export const SITE_RULES = {
  /** a local maximum is a site when ≥ this × the median of the measure over the vertex nodes */
  thresholdOverMedian: 1.3,
  /** maxima closer than this many local element sizes merge (the stronger one stays) */
  mergeSizes: 3,
  /** a support or load point carries force when |R| > this × the total applied force */
  forceFraction: 1e-6,
  /**
   * a listed site within this × the plate size (bounding-box diagonal) of the boundary goes onto the true
   * curve, and onto a corner, piece end or selector end within the same distance
   */
  snapFraction: 1e-4,
  /**
   * maxima joined along the boundary by nodes within this fraction of the larger one, on the first mesh, are
   * one flat peak (a plateau), not several sites placed by the noise of that mesh
   */
  plateauFraction: 0.02,
  /**
   * a corner or support end is a site when theory predicts a growth exponent of at least this: below it the
   * peak would rise by under 10 % over twelve halvings (an obtuse 180.01° corner, the middle of a thin slit)
   */
  minTheoryQ: 0.01,
} as const;

interface Ctx {
  model: Model;
  geom: PlateGeometry;
  mesh: Mesh;
  solution: Solution;
  measure: Float64Array;
  baseSize: SizeField;
  /** the listed sites after snapSitePoint (default: model.study.sites as written) */
  listed?: readonly Point[];
}

/**
 * Where a listed site (`study.sites[i]`) is studied (issue 12 §4): a point within SITE_RULES.snapFraction × the
 * plate size of the boundary goes onto the true curve, and onto a piece end (corner) or one of `vertices`
 * (selector ends, point-selector targets) within that distance; a point inside the material stays as
 * written. A point outside the outline or inside an opening is a study error naming the key — never moved.
 */
export function snapSitePoint(geom: PlateGeometry, p: Point, keyPath: string, vertices: readonly Point[] = []): Point {
  const tol = SITE_RULES.snapFraction * geom.scale;
  const fmt = (v: number) => String(Number(v.toPrecision(6)));
  for (const v of vertices) if (Math.hypot(v[0] - p[0], v[1] - p[1]) <= tol) return [v[0], v[1]];
  const hit = nearestBoundaryPoint(geom, p);
  if (hit.piece >= 0 && hit.distance <= tol) {
    const c = geom.pieces[hit.piece].curve;
    for (const end of [curveStart(c), curveEnd(c)]) if (Math.hypot(end[0] - p[0], end[1] - p[1]) <= tol) return [end[0], end[1]];
    return hit.point;
  }
  if (!pointInMaterial(geom, p)) {
    const inside = geom.loops.find((l) => l.hole && loopWinding(geom, l.id, p) !== 0);
    const where = inside ? `inside opening ${inside.id}` : 'outside the plate outline';
    throw new PeakwiseError('study', `listed site (${fmt(p[0])}, ${fmt(p[1])}) lies ${where}; a site must be in the material or on its boundary`, keyPath);
  }
  return [p[0], p[1]];
}

/** The listed sites of a model, each through snapSitePoint (keys `study.sites[i]`); [] for `auto`. */
export function listedSitePoints(model: Pick<Model, 'study'>, geom: PlateGeometry, vertices: readonly Point[] = []): Point[] {
  if (model.study.sites === 'auto') return [];
  return model.study.sites.map((p, i) => snapSitePoint(geom, p, `study.sites[${i}]`, vertices));
}

const BIT_X = 1, BIT_Y = 2;

function faceCondition(fix: number, dir: Point, straight: boolean): FaceCondition {
  if (fix === 0) return 'free';
  if (fix === (BIT_X | BIT_Y)) return 'clamped';
  // one direction fixed: a mirror (symmetry line, roller) when the face is straight and that direction is its
  // normal; otherwise the support restrains a mix of normal and tangential motion: treated as clamped
  const along = fix === BIT_X ? Math.abs(dir[0]) : Math.abs(dir[1]);
  return straight && along < 1e-6 ? 'sliding' : 'clamped';
}

/**
 * Readout direction at a boundary wedge (issue 12 §5): with exactly one sliding face whose mirror image fits
 * (2α ≤ 360°), the bisector of the mirrored wedge — the sliding face itself, away from the apex (on a
 * symmetry line through a crack tip: the ligament); otherwise the bisector of the wedge.
 */
function readoutDirection(w: { bisector: Point; angleDeg: number; dIn: Point; dOut: Point }, faces: readonly [FaceCondition, FaceCondition]): Point {
  const [a, b] = faces;
  if (2 * w.angleDeg > 360 + 1e-9) return w.bisector;
  if (a === 'sliding' && b !== 'sliding') return [-w.dIn[0], -w.dIn[1]];
  if (b === 'sliding' && a !== 'sliding') return [w.dOut[0], w.dOut[1]];
  return w.bisector;
}

/** Boundary-edge support bits (x = 1, y = 2) from every support with a line/loop selector. */
function edgeSupportBits(ctx: Ctx): Uint8Array {
  const { mesh, geom, model } = ctx;
  const bits = new Uint8Array(mesh.boundaryEdges.length / mesh.edgeStride);
  model.supports.forEach((s) => {
    if (s.where.kind === 'point') return;
    const sel = selectBoundary(mesh, geom, s.where, `${s.keyPath}.where`);
    const b = (s.fix.x ? BIT_X : 0) | (s.fix.y ? BIT_Y : 0);
    for (const e of sel.edges) bits[e] |= b;
  });
  return bits;
}

function totalForce(sol: Solution): number {
  let f = 0, r = 0;
  for (let n = 0; n < sol.load.length / 2; n++) {
    f += Math.hypot(sol.load[2 * n], sol.load[2 * n + 1]);
    r += Math.hypot(sol.reaction[2 * n], sol.reaction[2 * n + 1]);
  }
  return Math.max(f, r / 2);
}

/** Sum of reaction magnitudes over the vertex nodes within `radius` of p. */
function reactionNear(ctx: Ctx, p: Point, radius: number): number {
  const { mesh, solution } = ctx;
  let s = 0;
  for (let n = 0; n < mesh.xy.length / 2; n++) {
    if (Math.hypot(mesh.xy[2 * n] - p[0], mesh.xy[2 * n + 1] - p[1]) > radius) continue;
    s += Math.hypot(solution.reaction[2 * n], solution.reaction[2 * n + 1]);
  }
  return s;
}

function median(v: Float64Array, n: number): number {
  const a = Array.from(v.subarray(0, n)).sort((x, y) => x - y);
  return a.length === 0 ? 0 : a.length % 2 ? a[(a.length - 1) / 2] : 0.5 * (a[a.length / 2 - 1] + a[a.length / 2]);
}

const fmtAngle = (a: number) => `${Math.round(a * 10) / 10}°`;

/** A site before its feature length is known (findSites fills it in once every site is found). */
type SiteDraft = Omit<SiteCandidate, 'featureLength' | 'featureLengthWhy'>;

/** Boundary edge leaving and arriving at each node (−1: none), for walks along the boundary. */
function boundaryLinks(mesh: Mesh): { out: Int32Array; into: Int32Array } {
  const s = mesh.edgeStride, n = mesh.xy.length / 2;
  const out = new Int32Array(n).fill(-1), into = new Int32Array(n).fill(-1);
  for (let e = 0; e < mesh.boundaryEdges.length / s; e++) {
    out[mesh.boundaryEdges[s * e]] = e;
    into[mesh.boundaryEdges[s * e + 1]] = e;
  }
  return { out, into };
}

/**
 * The sites of a first solve (issue 5 §1–2): every feature theory flags as singular (sharp corners with
 * λ < 1 for their face conditions, supported-edge ends that do work, point loads, point supports that carry
 * force), then the local maxima of the recovered measure above 1.3 × its median over the vertex nodes, merged
 * within 3 local element sizes. Or the model's `study.sites` points. Sorted by x, then y.
 */
export function findSites(ctx: Ctx): SiteCandidate[] {
  const { model, geom, mesh, measure } = ctx;
  const { nu, state } = { nu: model.material.nu, state: model.state };
  const tol = 1e-6 * geom.scale;
  const bits = edgeSupportBits(ctx);
  const fTotal = totalForce(ctx.solution);
  const carries = (p: Point, radius: number) => reactionNear(ctx, p, radius) > SITE_RULES.forceFraction * fTotal;
  const features: SiteDraft[] = [];
  const cornerNodes = new Set<number>();

  // boundary wedge at a node from its mesh edges: angle, bisector, face conditions
  const wedgeOfNode = (node: number) => {
    const { incoming, outgoing } = boundaryEdgesAt(mesh, node);
    if (incoming.length !== 1 || outgoing.length !== 1) return undefined;
    const dIn = edgeDirection(mesh, incoming[0]), dOut = edgeDirection(mesh, outgoing[0]);
    const w = wedgeAt(dIn, dOut);
    const straight = (e: number) => geom.pieces[mesh.boundaryPiece[e]]?.curve.kind === 'line';
    const faces: [FaceCondition, FaceCondition] = [
      faceCondition(bits[incoming[0]], dIn, straight(incoming[0])), faceCondition(bits[outgoing[0]], dOut, straight(outgoing[0])),
    ];
    return { ...w, dIn, dOut, faces, pieces: [mesh.boundaryPiece[incoming[0]], mesh.boundaryPiece[outgoing[0]]] as [number, number] };
  };

  const wedgeFeature = (node: number, at: Point, angleDeg: number, faces: [FaceCondition, FaceCondition], kind: 'corner' | 'support-edge', where: string) => {
    const h = ctx.baseSize(at[0], at[1]);
    // a supported face that carries no force acts like a free one (docs/study.md, face conditions)
    let f = faces;
    if (f.some((c) => c !== 'free') && !carries(at, 1.5 * h)) f = ['free', 'free'];
    const th = wedgeTheory(angleDeg, f, nu, state);
    const w = wedgeOfNode(node);
    const bothPlain = f.every((c) => c === 'free' || c === 'clamped');
    const facesWord = bothPlain
      ? (f[0] === f[1] ? (f[0] === 'free' ? 'free-free' : 'clamped-clamped') : 'free-clamped') as SiteFeature['faces']
      : undefined;
    const feature: SiteFeature = {
      kind, interiorAngleDeg: angleDeg, radius: 0, faceConditions: f, lambda: th.lambda,
      ...(facesWord ? { faces: facesWord } : {}),
      description: kind === 'corner'
        ? `${angleDeg > 180 + 1e-6 ? 're-entrant' : 'convex'} corner of ${where}, ${fmtAngle(angleDeg)}, faces ${f[0]}/${f[1]}`
        : `end of a supported edge (${f[0]}/${f[1]}, ${fmtAngle(angleDeg)})`,
    };
    const direction = w ? readoutDirection(w, f) : undefined;
    // stress intensity of the (mirrored) free–free wedge: free faces, or one mirror whose image fits
    const nSliding = f.filter((c) => c === 'sliding').length;
    const plainFree = f.every((c) => c === 'free' || c === 'sliding') && nSliding <= 1 && (nSliding === 0 || 2 * angleDeg <= 360 + 1e-9);
    const intensity = plainFree && direction && th.lambdaOpening < 1 - 1e-9
      ? { alphaDeg: nSliding ? Math.min(2 * angleDeg, 360) : angleDeg, lambda: th.lambdaOpening, mirrorFactor: nSliding ? Math.min(2 * angleDeg, 360) / angleDeg : 1, bisector: direction }
      : undefined;
    return { th, feature, direction, intensity, bisector: w?.bisector };
  };

  // (1) sharp corners of the geometry
  for (const c of geom.corners) {
    const { node, distance } = nearestVertex(mesh, c.at);
    if (distance > tol) continue;
    cornerNodes.add(node);
    const w = wedgeOfNode(node);
    const faces = w?.faces ?? ['free', 'free'];
    const where = c.loop === 'outline' ? 'the outline' : `opening ${c.loop}`;
    const { th, feature, direction, intensity, bisector } = wedgeFeature(node, c.at, c.interiorAngleDeg, faces, 'corner', where);
    if (th.q < SITE_RULES.minTheoryQ) continue;
    features.push({ at: c.at, node, feature, theory: th.q, theoryWhy: th.why, lambdaOpening: th.lambdaOpening, direction, bisector, ...(intensity ? { intensity } : {}), firstPeak: measure[node], origin: 'feature' });
  }

  // (2) ends of supported edges on a smooth boundary (corner ends are handled above)
  const s = mesh.edgeStride;
  const nEdges = mesh.boundaryEdges.length / s;
  const endNodes = new Set<number>();
  for (let e = 0; e < nEdges; e++) {
    if (bits[e] === 0) continue;
    for (const node of [mesh.boundaryEdges[s * e], mesh.boundaryEdges[s * e + 1]]) {
      if (cornerNodes.has(node) || endNodes.has(node)) continue;
      const { incoming, outgoing } = boundaryEdgesAt(mesh, node);
      if (incoming.length === 1 && outgoing.length === 1 && bits[incoming[0]] !== bits[outgoing[0]]) endNodes.add(node);
    }
  }
  for (const node of [...endNodes].sort((a, b) => a - b)) {
    const at: Point = [mesh.xy[2 * node], mesh.xy[2 * node + 1]];
    const w = wedgeOfNode(node)!;
    const { th, feature, direction, intensity, bisector } = wedgeFeature(node, at, w.angleDeg, w.faces, 'support-edge', '');
    if (th.q < SITE_RULES.minTheoryQ) continue;
    features.push({ at, node, feature, theory: th.q, theoryWhy: `support ending on a free edge: ${th.why}`, lambdaOpening: th.lambdaOpening, direction, bisector, ...(intensity ? { intensity } : {}), firstPeak: measure[node], origin: 'feature' });
  }

  // (3) point loads and (4) point supports that carry force
  // a point selector means the boundary point nearest its point (a mesh vertex: selectorVertices)
  const pointNode = (p: Point) => nearestVertex(mesh, nearestBoundaryPoint(geom, p).point).node;
  const pointSite = (p: Point, kind: 'point-load' | 'point-support', why: string) => {
    const node = pointNode(p);
    const at: Point = [mesh.xy[2 * node], mesh.xy[2 * node + 1]];
    const w = wedgeOfNode(node);
    const prev = features.findIndex((f) => f.node === node);
    // in an axisymmetric section a force at a point off the axis is a ring load (locally a line load, the
    // 1/ρ Flamant field); on the axis it is a point force of the body: Boussinesq's field, σ ∝ 1/ρ² (q = 2)
    const onAxis = model.state === 'axisymmetric' && Math.abs(at[0]) <= tol;
    const cand: SiteDraft = {
      at, node, theory: onAxis ? 2 : 1, theoryWhy: onAxis ? `${why} on the axis (a point force of the body: Boussinesq 1885, σ ∝ 1/ρ²)` : why,
      direction: w?.bisector, bisector: w?.bisector, firstPeak: measure[node], origin: 'feature',
      feature: { kind, interiorAngleDeg: w?.angleDeg ?? 0, radius: 0, description: why },
    };
    if (prev >= 0) features[prev] = cand; // the 1/r field of a point force dominates any wedge there
    else features.push(cand);
  };
  for (const l of model.loads) {
    if (l.kind === 'force' && l.where.kind === 'point' && Math.hypot(l.force[0], l.force[1]) > 0) pointSite(l.where.at, 'point-load', 'concentrated load');
  }
  for (const sp of model.supports) {
    if (sp.where.kind !== 'point') continue;
    const node = pointNode(sp.where.at);
    // only the components this support fixes (a line support through the same node carries the others)
    const r = Math.hypot(sp.fix.x ? ctx.solution.reaction[2 * node] : 0, sp.fix.y ? ctx.solution.reaction[2 * node + 1] : 0);
    if (r > SITE_RULES.forceFraction * fTotal) pointSite(sp.where.at, 'point-support', 'point support');
  }

  const classify = (node: number): Omit<SiteDraft, 'origin'> => {
    const at: Point = [mesh.xy[2 * node], mesh.xy[2 * node + 1]];
    const w = wedgeOfNode(node);
    if (!w) {
      return { at, node, theory: 0, theoryWhy: '', firstPeak: measure[node], feature: { kind: 'interior', interiorAngleDeg: 0, radius: 0, description: 'inside the plate' } };
    }
    // prefer a curved piece at the node (a symmetry cut through a hole edge makes a corner, not a notch)
    const pieces = w.pieces.map((id) => geom.pieces[id]);
    const curved = pieces.find((p) => p.role !== 'edge');
    let feature: SiteFeature;
    if (curved) {
      let radius = curved.radius;
      if (curved.curve.kind === 'ellipse-arc') radius = curveCurvatureRadius(curved.curve, closestOnCurve(curved.curve, at).t);
      const kind = curved.role === 'fillet' ? 'fillet' : 'opening';
      feature = {
        kind, interiorAngleDeg: 180, radius,
        description: kind === 'fillet' ? `fillet, radius ${radius.toPrecision(4)}` : `edge of ${curved.loop === 'outline' ? 'the outline' : `opening ${curved.loop}`} (${curved.role}, radius ${radius.toPrecision(4)})`,
      };
    } else if (cornerNodes.has(node)) {
      feature = { kind: 'corner', interiorAngleDeg: w.angleDeg, radius: 0, faceConditions: w.faces, description: `corner, ${fmtAngle(w.angleDeg)} (not singular for its faces)` };
    } else {
      feature = { kind: 'edge', interiorAngleDeg: 180, radius: 0, description: 'straight edge' };
    }
    return { at, node, theory: 0, theoryWhy: '', firstPeak: measure[node], feature, direction: readoutDirection(w, w.faces), bisector: w.bisector };
  };

  // the boundary nodes joined to a boundary maximum by nodes within plateauFraction of it (first mesh)
  const links = boundaryLinks(mesh);
  const se = mesh.edgeStride;
  const plateauAt = (n: number): { nodes: number[]; length: number; closed: boolean } | undefined => {
    if (links.out[n] < 0 || links.into[n] < 0) return undefined;
    const floor = (1 - SITE_RULES.plateauFraction) * measure[n];
    const ahead: number[] = [], behind: number[] = [];
    let length = 0, closed = false;
    const step = (m: number, forward: boolean) => {
      const e = forward ? links.out[m] : links.into[m];
      return e < 0 ? -1 : mesh.boundaryEdges[se * e + (forward ? 1 : 0)];
    };
    const dist = (a: number, b: number) => Math.hypot(mesh.xy[2 * a] - mesh.xy[2 * b], mesh.xy[2 * a + 1] - mesh.xy[2 * b + 1]);
    for (const forward of [true, false]) {
      const list = forward ? ahead : behind;
      let m = n;
      for (;;) {
        const next = step(m, forward);
        if (next < 0 || !(measure[next] >= floor)) break;
        if (next === n || (!forward && ahead.includes(next))) { closed = true; length += dist(m, next); break; }
        length += dist(m, next);
        list.push(next);
        m = next;
      }
      if (closed) break;
    }
    // in order along the boundary
    return { nodes: [...behind.reverse(), n, ...ahead], length, closed };
  };

  let sites: SiteDraft[];
  if (model.study.sites !== 'auto') {
    // a listed point is studied exactly where it is (snapSitePoint put it on the boundary, a corner or a
    // selector end when it was meant to be there); on a feature it takes that feature's classification
    const same = 1e-9 * geom.scale;
    sites = (ctx.listed ?? model.study.sites).map((p) => {
      const { node, distance } = nearestVertex(mesh, p);
      const f = features.find((c) => Math.hypot(c.at[0] - p[0], c.at[1] - p[1]) <= same);
      if (f) return { ...f, origin: 'listed' as const };
      const c = classify(node);
      if (distance <= same) return { ...c, origin: 'listed' as const };
      // not a vertex of this mesh (a mesh built without the listed points): an interior point as written
      return { ...c, at: [p[0], p[1]] as Point, feature: { kind: 'interior', interiorAngleDeg: 0, radius: 0, description: 'inside the plate' }, direction: undefined, origin: 'listed' as const };
    });
  } else {
    sites = [...features];
    const nV = mesh.nVertices;
    const med = median(measure, nV);
    const threshold = SITE_RULES.thresholdOverMedian * med;
    const { ptr, adj } = vertexNeighbours(mesh);
    const maxima: number[] = [];
    for (let n = 0; n < nV; n++) {
      const v = measure[n];
      if (!(v >= threshold) || v <= 0) continue;
      let isMax = true;
      for (let k = ptr[n]; k < ptr[n + 1]; k++) if (measure[adj[k]] > v) { isMax = false; break; }
      if (isMax) maxima.push(n);
    }
    maxima.sort((a, b) => measure[b] - measure[a] || a - b);
    const onPlateau = new Set<number>();
    for (const n of maxima) {
      const x = mesh.xy[2 * n], y = mesh.xy[2 * n + 1];
      const r = SITE_RULES.mergeSizes * ctx.baseSize(x, y);
      if (onPlateau.has(n) || sites.some((sp) => Math.hypot(sp.at[0] - x, sp.at[1] - y) < r)) continue;
      const flat = plateauAt(n);
      const site: SiteDraft = { ...classify(n), origin: 'maximum' };
      if (flat && flat.length >= 2 * r) {
        for (const m of flat.nodes) onPlateau.add(m);
        site.plateau = { points: flat.nodes.map((m): Point => [mesh.xy[2 * m], mesh.xy[2 * m + 1]]), closed: flat.closed };
      }
      sites.push(site);
    }
  }
  const key = (v: number) => Math.round(v / tol);
  sites.sort((a, b) => key(a.at[0]) - key(b.at[0]) || key(a.at[1]) - key(b.at[1]));

  // feature length of each site: walk both ways along the boundary to the next corner, piece end, support
  // end or other site; on a curve at most its radius; never beyond the nearest other site
  const siteNodes = new Set(sites.map((c) => c.node));
  const walk = (start: number, forward: boolean, faceEdges?: Set<number>): number => {
    let m = start, length = 0;
    for (let guard = 0; guard < mesh.xy.length; guard++) {
      const e = forward ? links.out[m] : links.into[m];
      if (e < 0) return length;
      faceEdges?.add(e);
      const next = mesh.boundaryEdges[se * e + (forward ? 1 : 0)];
      length += Math.hypot(mesh.xy[2 * next] - mesh.xy[2 * m], mesh.xy[2 * next + 1] - mesh.xy[2 * m + 1]);
      const e2 = forward ? links.out[next] : links.into[next];
      if (next === start || siteNodes.has(next) || e2 < 0 || bits[e2] !== bits[e]) return length;
      // the face goes on through a junction of two straight pieces that turns by under 1° (a slender slit's
      // middle), and ends at any other junction of pieces
      if (mesh.boundaryPiece[e2] !== mesh.boundaryPiece[e]) {
        const straight = geom.pieces[mesh.boundaryPiece[e2]].curve.kind === 'line' && geom.pieces[mesh.boundaryPiece[e]].curve.kind === 'line';
        const d1 = edgeDirection(mesh, e), d2 = edgeDirection(mesh, e2);
        if (!straight || d1[0] * d2[0] + d1[1] * d2[1] < Math.cos(Math.PI / 180)) return length;
      }
      m = next;
    }
    return length;
  };
  // distance from p to the nearest boundary edge not in `faces` (chords through the mid-side node)
  const clearance = (p: Point, faces: Set<number>): number => {
    let d = Infinity;
    const seg = (a: number, b: number) => {
      const ax = mesh.xy[2 * a], ay = mesh.xy[2 * a + 1], dx = mesh.xy[2 * b] - ax, dy = mesh.xy[2 * b + 1] - ay;
      const l2 = dx * dx + dy * dy;
      const t = l2 > 0 ? Math.min(1, Math.max(0, ((p[0] - ax) * dx + (p[1] - ay) * dy) / l2)) : 0;
      d = Math.min(d, Math.hypot(p[0] - ax - t * dx, p[1] - ay - t * dy));
    };
    for (let e = 0; e < mesh.boundaryEdges.length / se; e++) {
      if (faces.has(e)) continue;
      const a = mesh.boundaryEdges[se * e], b = mesh.boundaryEdges[se * e + 1];
      if (se === 3) { seg(a, mesh.boundaryEdges[se * e + 2]); seg(mesh.boundaryEdges[se * e + 2], b); } else seg(a, b);
    }
    return d;
  };
  return sites.map((c): SiteCandidate => {
    let length = Infinity, why = '';
    const take = (v: number, w: string) => { if (v < length) { length = v; why = w; } };
    const onBoundary = links.out[c.node] >= 0 && links.into[c.node] >= 0 && Math.hypot(mesh.xy[2 * c.node] - c.at[0], mesh.xy[2 * c.node + 1] - c.at[1]) <= tol;
    const faces = new Set<number>();
    if (onBoundary) {
      take(Math.min(walk(c.node, true, faces), walk(c.node, false, faces)), 'shorter face');
      if (c.feature.radius > 0) take(c.feature.radius, 'radius of curvature');
    } else {
      let d = Infinity;
      for (const piece of geom.pieces) d = Math.min(d, closestOnCurve(piece.curve, c.at).distance);
      take(d, 'distance to the boundary');
    }
    for (const o of sites) {
      if (o !== c) take(Math.hypot(o.at[0] - c.at[0], o.at[1] - c.at[1]), 'distance to the next site');
    }
    if (!Number.isFinite(length) || !(length > 0)) { length = ctx.baseSize(c.at[0], c.at[1]); why = 'local element size'; }
    // the stress intensity's annulus must not reach a boundary other than the wedge's own faces
    const intensity = c.intensity && onBoundary ? { ...c.intensity, clearance: clearance(c.at, faces) } : c.intensity;
    return { ...c, ...(intensity ? { intensity } : {}), featureLength: length, featureLengthWhy: `${why} ${Number(length.toPrecision(4))}` };
  });
}
