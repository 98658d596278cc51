import type { PlateGeometry } from '../geometry/types.js';
import { closestOnCurve, curveCurvatureRadius } from '../geometry/index.js';
import type { Mesh, SizeField } from '../mesh/types.js';
import type { Model, Point } from '../model/types.js';
import type { Solution } from '../fem/types.js';
import { selectBoundary } from '../fem/index.js';
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
  /** unit direction into the material for the readouts (bisector at corners, inward normal on edges) */
  direction?: Point;
  /** measure at the node on the first mesh */
  firstPeak: number;
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
} as const;

interface Ctx {
  model: Model;
  geom: PlateGeometry;
  mesh: Mesh;
  solution: Solution;
  measure: Float64Array;
  baseSize: SizeField;
}

const BIT_X = 1, BIT_Y = 2;

function faceCondition(fix: number, dir: Point): FaceCondition {
  if (fix === 0) return 'free';
  if (fix === (BIT_X | BIT_Y)) return 'clamped';
  // one direction fixed: a roller if that direction is (close to) the face normal
  const along = fix === BIT_X ? Math.abs(dir[0]) : Math.abs(dir[1]);
  return along < 0.2 ? 'sliding' : 'clamped';
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
  const features: SiteCandidate[] = [];
  const cornerNodes = new Set<number>();

  // boundary wedge at a node from its mesh edges: angle, bisector, face conditions
  const wedgeOfNode = (node: number) => {
    const { incoming, outgoing } = boundaryEdgesAt(mesh, node);
    if (incoming.length !== 1 || outgoing.length !== 1) return undefined;
    const dIn = edgeDirection(mesh, incoming[0]), dOut = edgeDirection(mesh, outgoing[0]);
    const w = wedgeAt(dIn, dOut);
    const faces: [FaceCondition, FaceCondition] = [faceCondition(bits[incoming[0]], dIn), faceCondition(bits[outgoing[0]], dOut)];
    return { ...w, faces, pieces: [mesh.boundaryPiece[incoming[0]], mesh.boundaryPiece[outgoing[0]]] as [number, number] };
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
    return { th, feature, direction: w?.bisector };
  };

  // (1) sharp corners of the geometry
  for (const c of geom.corners) {
    const { node, distance } = nearestVertex(mesh, c.at);
    if (distance > tol) continue;
    cornerNodes.add(node);
    const w = wedgeOfNode(node);
    const faces = w?.faces ?? ['free', 'free'];
    const where = c.loop === 'outline' ? 'the outline' : `opening ${c.loop}`;
    const { th, feature, direction } = wedgeFeature(node, c.at, c.interiorAngleDeg, faces, 'corner', where);
    if (th.q <= 0) continue;
    features.push({ at: c.at, node, feature, theory: th.q, theoryWhy: th.why, lambdaOpening: th.lambdaOpening, direction, firstPeak: measure[node], origin: 'feature' });
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
    const { th, feature, direction } = wedgeFeature(node, at, w.angleDeg, w.faces, 'support-edge', '');
    if (th.q <= 0) continue;
    features.push({ at, node, feature, theory: th.q, theoryWhy: `support ending on a free edge: ${th.why}`, lambdaOpening: th.lambdaOpening, direction, firstPeak: measure[node], origin: 'feature' });
  }

  // (3) point loads and (4) point supports that carry force
  const pointSite = (p: Point, kind: 'point-load' | 'point-support', why: string) => {
    const { node } = nearestVertex(mesh, p);
    const at: Point = [mesh.xy[2 * node], mesh.xy[2 * node + 1]];
    const w = wedgeOfNode(node);
    const prev = features.findIndex((f) => f.node === node);
    const cand: SiteCandidate = {
      at, node, theory: 1, theoryWhy: why, direction: w?.bisector, firstPeak: measure[node], origin: 'feature',
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
    const { node } = nearestVertex(mesh, sp.where.at);
    // only the components this support fixes (a line support through the same node carries the others)
    const r = Math.hypot(sp.fix.x ? ctx.solution.reaction[2 * node] : 0, sp.fix.y ? ctx.solution.reaction[2 * node + 1] : 0);
    if (r > SITE_RULES.forceFraction * fTotal) pointSite(sp.where.at, 'point-support', 'point support');
  }

  const classify = (node: number): Omit<SiteCandidate, 'origin'> => {
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
    return { at, node, theory: 0, theoryWhy: '', firstPeak: measure[node], feature, direction: w.bisector };
  };

  let sites: SiteCandidate[];
  if (model.study.sites !== 'auto') {
    sites = model.study.sites.map((p) => {
      const { node } = nearestVertex(mesh, p);
      const h = ctx.baseSize(p[0], p[1]);
      const f = features.find((c) => Math.hypot(c.at[0] - mesh.xy[2 * node], c.at[1] - mesh.xy[2 * node + 1]) <= 0.5 * h);
      return f ? { ...f, origin: 'listed' as const } : { ...classify(node), origin: 'listed' as const };
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
    for (const n of maxima) {
      const x = mesh.xy[2 * n], y = mesh.xy[2 * n + 1];
      const r = SITE_RULES.mergeSizes * ctx.baseSize(x, y);
      if (sites.some((sp) => Math.hypot(sp.at[0] - x, sp.at[1] - y) < r)) continue;
      sites.push({ ...classify(n), origin: 'maximum' });
    }
  }
  const key = (v: number) => Math.round(v / tol);
  sites.sort((a, b) => key(a.at[0]) - key(b.at[0]) || key(a.at[1]) - key(b.at[1]));
  return sites;
}
