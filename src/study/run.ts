import { PeakwiseError, isPeakwiseError } from '../errors.js';
import { buildGeometry, closestOnCurve, pointInMaterial } from '../geometry/index.js';
import { meshQuality } from '../mesh/index.js';
import type { Mesh } from '../mesh/types.js';
import type { Model, Point } from '../model/types.js';
import { levelsRule, ratioRule, stressUnit } from '../model/index.js';
import type { Solution } from '../fem/types.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { NodalStress } from '../recovery/types.js';
import { buildPointLocator } from '../recovery/index.js';
import { baseSizeField, problemOf, solveAt, type SolveLimits, type SolvedLevel } from '../pipeline/index.js';
import type { LevelResult, SiteResult, StudyResult } from './types.js';
import { findSites, listedSitePoints, type SiteCandidate } from './sites.js';
import { levelSizeField, probeLevel, rosettePoints, NEIGHBOURHOOD_SIZES, type SiteProbe } from './ladder.js';
import { judgeSite } from './verdict.js';
import { BAND_RULES } from './band.js';
import { coarsenedOuterField } from './far-field.js';
import { boundaryEdgesAt } from './mesh-tools.js';
import { reportedSites } from './reported.js';
import { reportedPosition, siteProbe, siteReadouts, withPlateauExtent } from './site-readouts.js';
import { bodyFields, selectorWarnings } from '../fem/index.js';

export interface StudyOptions {
  levels?: number;
  ratio?: number;
  order?: 1 | 2;
  size?: number;
  /** progress: solves done of total, with a label */
  onProgress?(done: number, total: number, label: string): void;
  /** receives the first (model-size) solve, for field files and pictures */
  onBase?(base: BaseSolve): void;
  /** asked between solves; true stops the ladder, keeps the finished levels and sets `interrupted` */
  shouldStop?(): boolean;
  /** limits of every solve (dof cap, factor-memory cap, residual limit; default: none) */
  limits?: SolveLimits;
}

/** The first solve of a study at the model's own mesh size. */
export interface BaseSolve {
  mesh: Mesh;
  geometry: PlateGeometry;
  solution: Solution;
  field: NodalStress;
  /** the study measure per node */
  nodal: Float64Array;
}

const VERSION = '0.1.0';

/** Are the boundary pieces arriving at and leaving a node straight? (incoming, outgoing) */
function straightFacesAt(mesh: Mesh, geom: ReturnType<typeof buildGeometry>, node: number): [boolean, boolean] {
  const { incoming, outgoing } = boundaryEdgesAt(mesh, node);
  const isLine = (e: number[]) => e.length === 1 && geom.pieces[mesh.boundaryPiece[e[0]]].curve.kind === 'line';
  return [isLine(incoming), isLine(outgoing)];
}

/**
 * A seed point is used when it lies in the material at least h/2 from every boundary piece, or on a straight
 * piece at least h/2 from that piece's ends (never next to another feature).
 */
function seedFits(geom: ReturnType<typeof buildGeometry>, p: Point, h: number, site: Point): boolean {
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

function check(cond: boolean, message: string, keyPath: string): void {
  if (!cond) throw new PeakwiseError('study', message, keyPath);
}

/**
 * The convergence study (issue 5): first solve at the model size, sites, one refinement ladder shared by
 * all sites (level k: each site's local size h₀/ratio^k), SPR recovery, per-site convergence fits and verdicts.
 */
export function runStudy(model: Model, opts: StudyOptions = {}): StudyResult {
  const t0 = performance.now();
  const levels = opts.levels ?? model.study.levels;
  const ratio = opts.ratio ?? model.study.ratio;
  const order = opts.order ?? model.mesh.order;
  const size = opts.size ?? model.mesh.size;
  check(levelsRule(levels) === undefined, `study levels ${levelsRule(levels)}, got ${levels}`, 'study.levels');
  check(ratioRule(ratio) === undefined, `study ratio ${ratioRule(ratio)}, got ${ratio}`, 'study.ratio');
  check(order === 1 || order === 2, `mesh order must be 1 or 2, got ${order}`, 'mesh.order');
  check(size > 0, `mesh size must be > 0, got ${size}`, 'mesh.size');
  const measure = model.study.measure;
  const problem = problemOf(model, { size, order });
  const { geometry: geom, section } = problem;
  // body force and thermal strain of the body loads, for the reciprocal-work K (stress-intensity.ts)
  const body = bodyFields(section, problem.loads);
  // the listed sites are vertices of every mesh, the first included (the selector ends are already)
  const listed = listedSitePoints(model, geom, problem.requiredPoints);
  const warnings = selectorWarnings(model, geom);
  const base = baseSizeField(problem);
  const limits: SolveLimits = opts.limits ?? {};
  // one more solve after the ladder: the outer mesh coarsened, for the far-field term
  const total = 2 + levels;
  const progress = (done: number, label: string) => opts.onProgress?.(done, total, label);

  progress(0, 'first solve');
  const first = solveAt(problem, base, order, limits, { points: listed });
  opts.onBase?.({ mesh: first.mesh, geometry: geom, solution: first.solution, field: first.field, nodal: first.nodal });
  progress(1, 'sites');
  const cands = findSites({ model, geom, mesh: first.mesh, solution: first.solution, measure: first.nodal, baseSize: base, listed });
  const h0 = cands.map((c) => base(c.at[0], c.at[1]));
  const probes: SiteProbe[] = cands.map((site, i) => {
    let radius = NEIGHBOURHOOD_SIZES * h0[i];
    // keep neighbourhoods apart so one site's peak is never another's
    for (let j = 0; j < cands.length; j++) {
      if (j !== i) radius = Math.min(radius, 0.5 * Math.hypot(cands[j].at[0] - site.at[0], cands[j].at[1] - site.at[1]));
    }
    return siteProbe(site, radius, model, section);
  });
  const sitePoints = cands.map((c) => c.at);
  const straight = cands.map((c) => straightFacesAt(first.mesh, geom, c.node));
  const perSite: LevelResult[][] = cands.map(() => []);
  let stopped = '';
  let interrupted = false;
  let finest: SolvedLevel | undefined;
  for (let k = 0; k < levels && cands.length > 0; k++) {
    if (opts.shouldStop?.()) { interrupted = true; stopped = `interrupted after ${k} level${k === 1 ? '' : 's'}`; break; }
    let s: SolvedLevel;
    try {
      const seeds = cands.flatMap((c, i) => rosettePoints(c, h0[i] / Math.pow(ratio, k), straight[i]).filter((p) => seedFits(geom, p, h0[i] / Math.pow(ratio, k), c.at)));
      s = solveAt(problem, levelSizeField(base, cands, h0, ratio, k), order, limits, { points: [...sitePoints, ...seeds] });
    } catch (e) {
      if (k >= 1 && isPeakwiseError(e)) { stopped = `level ${k + 1} failed (${e.message}); fitted on ${k} levels`; break; }
      throw e;
    }
    const locator = buildPointLocator(s.mesh);
    probes.forEach((p, i) => {
      perSite[i].push(probeLevel(s.mesh, s.field, s.nodal, s.gauss, section, measure, p, h0[i] / Math.pow(ratio, k), s.solution.dofs, locator, s.solution.u, body));
    });
    progress(2 + k, `level ${k + 1} of ${levels}`);
    if (k === levels - 1) finest = s;
  }

  // far-field term (docs/study.md, "Far field"): the finest level again with everything outside the sites'
  // refined cores coarsened; the change of each peak is what the unrefined mesh, the same on every level,
  // contributes. Only solved when some site converges (the term belongs to converging bands alone).
  let farShift: number[] = [];
  let farShiftK: number[] = [];
  const kLast = (perSite[0]?.length ?? 0) - 1;
  const anyConverging = cands.some((c, i) => judgeSite(perSite[i].map((l) => l.h), perSite[i].map((l) => l.peak), ratio, order, c.theory).verdict === 'converging');
  // a stress intensity converges like a peak and gets the same far-field term
  const anyIntensity = probes.some((p) => p.intensity !== undefined);
  if (!interrupted && !stopped && kLast >= 2 && (anyConverging || anyIntensity) && !opts.shouldStop?.()) {
    try {
      const hk = h0.map((h) => h / Math.pow(ratio, kLast));
      const seeds = cands.flatMap((c, i) => rosettePoints(c, hk[i], straight[i]).filter((p) => seedFits(geom, p, hk[i], c.at)));
      const field = coarsenedOuterField(base, cands, h0, ratio, kLast, BAND_RULES.farField.coarsening);
      const s = solveAt(problem, field, order, limits, { points: [...sitePoints, ...seeds] });
      const locator = buildPointLocator(s.mesh);
      const far = probes.map((p, i) => probeLevel(s.mesh, s.field, s.nodal, s.gauss, section, measure, p, perSite[i][kLast].h, s.solution.dofs, locator, s.solution.u, body));
      farShift = far.map((l, i) => l.peak - perSite[i][kLast].peak);
      farShiftK = far.map((l, i) => (l.nsif ?? NaN) - (perSite[i][kLast].nsif ?? NaN));
    } catch (e) {
      if (!isPeakwiseError(e)) throw e;
    }
    progress(2 + levels, 'far field');
  }

  const stress = stressUnit(model.units);
  const perSiteResults: SiteResult[] = cands.map((c, i) => {
    const r = toSiteResult(`S${i + 1}`, c, perSite[i], ratio, order, probes[i], stress, model.units.length, stopped, farShift[i], farShiftK[i]);
    return finest ? withPlateauExtent(r, c, finest.mesh, finest.nodal) : r;
  });
  const sites: SiteResult[] = reportedSites(perSiteResults, { scale: geom.scale, yieldStress: model.material.yield });
  const q = meshQuality(first.mesh);
  return {
    tool: 'peakwise',
    version: VERSION,
    model: { title: model.title, file: model.file, ...(model.state === 'axisymmetric' ? { state: 'axisymmetric' as const } : {}) },
    units: { length: model.units.length, force: model.units.force, stress },
    mesh: { nodes: first.mesh.xy.length / 2, elements: first.mesh.elemNodes.length / first.mesh.nodesPerElem, order, minAngleDeg: q.minAngleDeg },
    solution: {
      dofs: first.solution.dofs,
      maxDisplacement: first.solution.maxDisplacement,
      reactionSum: first.solution.reactionSum,
      appliedSum: first.solution.appliedSum,
    },
    measure,
    ...(model.material.yield !== undefined ? { yieldStress: model.material.yield } : {}),
    sites,
    timings: { totalS: (performance.now() - t0) / 1000 },
    ...(interrupted ? { interrupted: true } : {}),
    ...(warnings.length > 0 ? { warnings: warnings.map((w) => `${w.keyPath}: ${w.message}`) } : {}),
  };
}

function toSiteResult(
  id: string, c: SiteCandidate, levels: LevelResult[], ratio: number, order: 1 | 2, probe: SiteProbe, stress: string, length: string, stopped: string,
  farShift?: number, farShiftK?: number,
): SiteResult {
  const v = judgeSite(levels.map((l) => l.h), levels.map((l) => l.peak), ratio, order, c.theory, c.theoryWhy, farShift);
  const last = levels[levels.length - 1];
  const readouts = siteReadouts(levels, probe, ratio, order, stress, length, farShiftK);
  const why = c.feature.kind === 'point-load' || c.feature.kind === 'point-support' ? `${c.theoryWhy}: ` : '';
  return {
    id,
    at: reportedPosition(c, last),
    feature: c.feature,
    levels,
    verdict: v.verdict,
    reason: why + v.reason + (stopped ? `; ${stopped}` : ''),
    ...(v.advice ? { advice: v.advice } : {}),
    estimate: v.estimate,
    growth: v.growth,
    readouts,
    history: v.history.map(({ finest, value, uncertainty, observedOrder }) => ({ finest, value, uncertainty, observedOrder })),
    ...(c.direction ? { direction: c.direction } : {}),
  };
}
