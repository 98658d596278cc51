/**
 * One level of a study's ladder as a pure function of plain data: the model, the sites found on the
 * first solve, the level number → the readings of every site on that level (peak, readouts, stress
 * intensity), the level's dofs and factor size, and for the finest level the boundary trace a flat
 * peak's extent is measured on. The same function runs in the study's own thread (serial) or in a
 * worker of the pool (src/pipeline/pool.ts, by the name LEVEL_TASK), so a level's numbers do not
 * depend on where it ran: its inputs arrive by structured clone, which copies every number exactly,
 * and nothing is carried from one level to the next.
 */
import { closestOnCurve, pointInMaterial } from '../geometry/index.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { Mesh } from '../mesh/types.js';
import type { Model, Point } from '../model/types.js';
import { buildPointLocator, type PointHit, type PointLocator } from '../recovery/index.js';
import { baseSizeField, contentKey, objectKey, problemOf, reuseStore, solveAt, type Problem, type SolveLimits } from '../pipeline/index.js';
import { factorBytes } from '../fem/health.js';
import { bodyFields, type BodyFields } from '../fem/index.js';
import { combinedBodyFields } from './cases.js';
import type { LevelResult } from './types.js';
import type { SiteCandidate } from './sites.js';
import { levelSizeField, probeLevel, rosettePoints, type SiteProbe } from './ladder.js';
import { coarsenedOuterField } from './far-field.js';

/** The name the level function is registered under in the study's worker (src/study/study-worker.ts). */
export const LEVEL_TASK = 'study-level';

/** Everything one level needs, as plain data. */
export interface LevelInput {
  model: Model;
  /** the study's mesh size and order (the model's, or the caller's overrides) */
  size: number;
  order: 1 | 2;
  limits: SolveLimits;
  sites: SiteCandidate[];
  probes: SiteProbe[];
  /** each site's level-0 size */
  h0: number[];
  /** are the faces arriving at / leaving each site straight (rosette seeds on them) */
  straight: [boolean, boolean][];
  ratio: number;
  /** the level, 0 = coarsest */
  k: number;
  /** set for the far-field solve: the finest level with everything outside the sites' cores coarsened by this factor */
  farFieldCoarsening?: number;
  /** return the boundary trace (the finest level, when a site has a flat peak) */
  trace?: boolean;
}

/** The boundary of a mesh with the measure at its nodes, renumbered onto the boundary nodes alone. */
export interface BoundaryTrace extends Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride'> {
  nodal: Float64Array;
}

/** What a level gives back: small, whatever the mesh size. */
export interface LevelReadings {
  k: number;
  /** per load set (every case, then every combination; one without cases), one reading per site in the sites' order */
  perSet: LevelResult[][];
  dofs: number;
  /** bytes of the level's Cholesky factor, from nnz(L) (fem/health.ts factorBytes; the cap counts the padded storage) */
  factorBytes: number;
  /** per load set, the boundary trace of its measure (the finest level, when a site has a flat peak) */
  traces?: BoundaryTrace[];
}

/**
 * A seed point is used when it lies in the material at least h/2 from every boundary piece, or on a straight
 * piece at least h/2 from that piece's ends (never next to another feature).
 */
export function seedFits(geom: PlateGeometry, p: Point, h: number, site: Point): boolean {
  const tol = 1e-9 * geom.scale;
  let onLine = false;
  for (const piece of geom.pieces) {
    const c = closestOnCurve(piece.curve, p);
    if (c.distance <= tol) {
      if (piece.curve.kind !== 'line') return false;
      const a = piece.curve.from, b = piece.curve.to;
      const ends = [a, b].filter((e) => Math.hypot(e[0] - site[0], e[1] - site[1]) > tol);
      if (ends.some((e) => Math.hypot(e[0] - p[0], e[1] - p[1]) < 0.5 * h)) return false;
      onLine = true;
    } else if (c.distance < 0.5 * h) {
      // near a piece that does not pass through the site itself
      const passes = closestOnCurve(piece.curve, site).distance <= tol;
      if (!passes) return false;
    }
  }
  return onLine || pointInMaterial(geom, p);
}

/** The boundary edges of `mesh` and the nodes on them (in order of first use), with `nodal` there. */
export function boundaryTrace(mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride'>, nodal: Float64Array): BoundaryTrace {
  const index = new Map<number, number>();
  const edges = new Uint32Array(mesh.boundaryEdges.length);
  for (let i = 0; i < edges.length; i++) {
    const n = mesh.boundaryEdges[i];
    let m = index.get(n);
    if (m === undefined) { m = index.size; index.set(n, m); }
    edges[i] = m;
  }
  const xy = new Float64Array(2 * index.size), values = new Float64Array(index.size);
  for (const [n, m] of index) { xy[2 * m] = mesh.xy[2 * n]; xy[2 * m + 1] = mesh.xy[2 * n + 1]; values[m] = nodal[n]; }
  return { xy, boundaryEdges: edges, edgeStride: mesh.edgeStride, nodal: values };
}

/** The study's problem of an input (the same for every level: `problemOf` is a pure function of the model). */
export function levelProblem(input: Pick<LevelInput, 'model' | 'size' | 'order'>): Problem {
  return problemOf(input.model, { size: input.size, order: input.order });
}

/**
 * The body force and thermal strain of every load set's body loads, for the reciprocal-work K
 * (stress-intensity.ts): each case's own, and a combination's the factored sums of its cases' (K is
 * linear in them). In the order of the solved level's sets.
 */
export function loadSetBodyFields(problem: Problem): BodyFields[] {
  const caseBody = problem.cases.map((c) => bodyFields(problem.section, c.loads));
  return [
    ...caseBody,
    ...problem.combinations.map((c) => combinedBodyFields(c.terms.map((t) => caseBody[problem.cases.findIndex((pc) => pc.name === t.case)]), c.terms.map((t) => t.factor))),
  ];
}

/**
 * What a level's size field is made of beyond the problem's geometry and mesh settings, as a key for
 * reuse in a warm process (pipeline/reuse.ts): each site's position and flat-peak extent (all that
 * levelSizeField and coarsenedOuterField read of a site), h₀, the ratio, the level and the far-field
 * coarsening. The rosette seeds are in the mesh request's points, which the key holds as well.
 */
export function levelSizeKey(input: Pick<LevelInput, 'sites' | 'h0' | 'ratio' | 'k' | 'farFieldCoarsening'>): string {
  return contentKey('study-level', input.sites.map((c) => [c.at, c.plateau ?? null]), input.h0, input.ratio, input.k, input.farFieldCoarsening ?? null);
}

/**
 * Mesh, solve and read one level (or the far-field solve) of the ladder. `problem` may be passed when
 * already built. In a warm process with reuse on (watch mode, pipeline/reuse.ts) the readings are kept
 * under the content key of the whole input — the function is pure in it — so a rerun whose level
 * inputs are all the same (a comment-only save) reads them back; a hit keeps the level's mesh and
 * factor in use as well. What is kept and handed out is a structured clone, as a pool worker's answer.
 */
export function studyLevel(input: LevelInput, problem: Problem = levelProblem(input)): LevelReadings {
  if (!reuseStore.enabled) return readLevel(input, problem);
  const kept = reuseStore.kept(contentKey('study-level-readings', input), 'level', () => structuredClone(readLevel(input, problem)), readingsSize, input.limits);
  return structuredClone(kept);
}

/** Answers a kept locator remembers at most (a level's probes ask a few thousand points). */
const LOCATOR_MEMO = 16_384;

/**
 * The point locator of a mesh in a warm process: kept with the mesh (pipeline/reuse.ts), and
 * remembering its answers, which depend on the mesh and the point alone — a load-only rerun reads its
 * probes at the same points of the same meshes (each answer is handed out as a copy).
 */
function keptLocator(mesh: Mesh, limits: SolveLimits): PointLocator {
  const nElem = mesh.elemNodes.length / mesh.nodesPerElem;
  return reuseStore.kept(contentKey('point-locator', objectKey(mesh)), 'locator', () => {
    const inner = buildPointLocator(mesh);
    const memo = new Map<string, PointHit | null>();
    return {
      locate(x: number, y: number): PointHit | null {
        // Object.is keeps -0 apart from 0: the key is the point's exact coordinates
        const key = `${Object.is(x, -0) ? '-0' : x},${Object.is(y, -0) ? '-0' : y}`;
        let hit = memo.get(key);
        if (hit === undefined) {
          hit = inner.locate(x, y);
          if (memo.size < LOCATOR_MEMO) memo.set(key, hit);
        }
        return hit && { elem: hit.elem, xi: hit.xi, eta: hit.eta };
      },
    };
  }, () => ({ bytes: 32 * nElem + 160 * LOCATOR_MEMO, dofs: 0 }), limits);
}

/** Bytes of a level's readings (the traces' arrays, and a generous allowance per reading). */
function readingsSize(r: LevelReadings): { bytes: number; dofs: number } {
  let bytes = 4096 * r.perSet.reduce((n, set) => n + set.length, 0);
  for (const t of r.traces ?? []) bytes += t.xy.byteLength + t.boundaryEdges.byteLength + t.nodal.byteLength;
  return { bytes, dofs: 0 };
}

function readLevel(input: LevelInput, problem: Problem): LevelReadings {
  const { sites, probes, h0, straight, ratio, k, order, limits } = input;
  const geom = problem.geometry;
  const base = baseSizeField(problem);
  const hk = h0.map((h) => h / Math.pow(ratio, k));
  const seeds = sites.flatMap((c, i) => rosettePoints(c, hk[i], straight[i]).filter((p) => seedFits(geom, p, hk[i], c.at)));
  const field = input.farFieldCoarsening !== undefined
    ? coarsenedOuterField(base, sites, h0, ratio, k, input.farFieldCoarsening)
    : levelSizeField(base, sites, h0, ratio, k);
  const s = solveAt(problem, field, order, limits, {
    points: [...sites.map((c) => c.at), ...seeds],
    ...(reuseStore.enabled ? { sizeKey: levelSizeKey(input) } : {}),
  });
  const locator = reuseStore.enabled ? keptLocator(s.mesh, limits) : buildPointLocator(s.mesh);
  const body = loadSetBodyFields(problem);
  const perSet = s.sets.map((set, j) => probes.map((p, i) =>
    probeLevel(s.mesh, set.field, set.nodal, set.gauss, problem.section, input.model.study.measure, p, hk[i], s.solution.dofs, locator, set.solution.u, body[j])));
  return {
    k,
    perSet,
    dofs: s.solution.dofs,
    factorBytes: factorBytes(s.solution.nnzL),
    ...(input.trace ? { traces: s.sets.map((set) => boundaryTrace(s.mesh, set.nodal)) } : {}),
  };
}
