import { PeakwiseError, isPeakwiseError } from '../errors.js';
import { meshQuality } from '../mesh/index.js';
import type { Mesh } from '../mesh/types.js';
import type { Model, Point, ReportedValue } from '../model/types.js';
import { levelsRule, ratioRule, stressUnit } from '../model/index.js';
import type { Solution } from '../fem/types.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { NodalStress } from '../recovery/types.js';
import { baseSizeField, problemOf, solveAt, type LoadSetLevel, type Problem, type SolveLimits, type SolvedLevel } from '../pipeline/index.js';
import type { CaseStudy, LevelResult, ReportedAssessment, SiteResult, StudyResult } from './types.js';
import { envelopeOf, envelopeSites, mergeSiteLists, peakOnRim } from './cases.js';
import { findSites, listedSitePoints, snapSitePoint, type SiteCandidate } from './sites.js';
import { probeLevel, LADDER_GRADING, NEIGHBOURHOOD_SIZES, type SiteProbe } from './ladder.js';
import { judgeSite } from './verdict.js';
import { BAND_RULES } from './band.js';
import { boundaryEdgesAt } from './mesh-tools.js';
import { reportedSites } from './reported.js';
import { reportedPosition, siteProbe, siteReadouts, withPlateauExtent } from './site-readouts.js';
import { studyLevel, type LevelInput, type LevelReadings } from './level.js';
import { selectorWarnings } from '../fem/index.js';
import { assessReported, matchReported, unmatchedPoints } from './other-analysis.js';
import { withCauseAdvice } from './advice.js';

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
  /** every load case and combination on this mesh (one entry without cases); the fields above are the first's */
  sets: LoadSetLevel[];
}

const VERSION = '0.1.0';

/** Are the boundary pieces arriving at and leaving a node straight? (incoming, outgoing) */
function straightFacesAt(mesh: Mesh, geom: PlateGeometry, node: number): [boolean, boolean] {
  const { incoming, outgoing } = boundaryEdgesAt(mesh, node);
  const isLine = (e: number[]) => e.length === 1 && geom.pieces[mesh.boundaryPiece[e[0]]].curve.kind === 'line';
  return [isLine(incoming), isLine(outgoing)];
}

function check(cond: boolean, message: string, keyPath: string): void {
  if (!cond) throw new PeakwiseError('study', message, keyPath);
}

/** A study up to its ladder: the settings, the problem, the first solve, the sites and their probes. */
export interface StudySetup {
  t0: number;
  model: Model;
  levels: number;
  ratio: number;
  order: 1 | 2;
  size: number;
  problem: Problem;
  limits: SolveLimits;
  warnings: ReturnType<typeof selectorWarnings>;
  first: SolvedLevel;
  cands: SiteCandidate[];
  h0: number[];
  probes: SiteProbe[];
  straight: [boolean, boolean][];
  /** solves in all: first, levels, far field */
  total: number;
  /** the base size field of the problem's mesh settings */
  base: (x: number, y: number) => number;
  /** values another analysis reported (issue 15), where each is studied, and the points studied only because of one */
  reportedValues: readonly ReportedValue[];
  reportedAt: Point[];
  added: Point[];
}

/** The ladder's outcome: the levels kept (consecutive, coarsest first) and why it ended early, if it did. */
export interface LadderOutcome {
  readings: LevelReadings[];
  /** '' when every level was solved; else the words added to each site's reason */
  stopped: string;
  interrupted: boolean;
}

/** Validate the settings, solve at the model size, find the sites and set up their probes. */
export function prepareStudy(model: Model, opts: StudyOptions = {}): StudySetup {
  const t0 = performance.now();
  const levels = opts.levels ?? model.study.levels;
  const ratio = opts.ratio ?? model.study.ratio;
  const order = opts.order ?? model.mesh.order;
  const size = opts.size ?? model.mesh.size;
  check(levelsRule(levels) === undefined, `study levels ${levelsRule(levels)}, got ${levels}`, 'study.levels');
  check(ratioRule(ratio) === undefined, `study ratio ${ratioRule(ratio)}, got ${ratio}`, 'study.ratio');
  check(order === 1 || order === 2, `mesh order must be 1 or 2, got ${order}`, 'mesh.order');
  check(size > 0, `mesh size must be > 0, got ${size}`, 'mesh.size');
  const problem = problemOf(model, { size, order });
  const { geometry: geom, section } = problem;
  // the listed sites are vertices of every mesh, the first included (the selector ends are already)
  const listed = listedSitePoints(model, geom, problem.requiredPoints);
  // values another analysis reported (issue 15): their points are vertices of the first mesh, so one far
  // from every found site can be studied where it is
  const reportedValues = model.reported ?? [];
  const reportedAt = reportedValues.map((r) => reportedPoint(geom, r, problem.requiredPoints));
  const warnings = selectorWarnings(model, geom);
  const base = baseSizeField(problem);
  const limits: SolveLimits = opts.limits ?? {};
  // one more solve after the ladder: the outer mesh coarsened, for the far-field term
  const total = 2 + levels;

  opts.onProgress?.(0, total, 'first solve');
  const first = solveAt(problem, base, order, limits, { points: [...listed, ...reportedAt], sizeKey: 'base' });
  opts.onBase?.({ mesh: first.mesh, geometry: geom, solution: first.solution, field: first.field, nodal: first.nodal, sets: first.sets });
  opts.onProgress?.(1, total, 'sites');
  // the sites of every case and combination, studied in all (docs/study.md, "Load cases and the envelope")
  const siteCtx = { model, geom, mesh: first.mesh, solution: first.solution, measure: first.nodal, baseSize: base, listed };
  const found = mergeSiteLists(first.sets.map((set) => findSites({ ...siteCtx, solution: set.solution, measure: set.nodal })), base);
  const { sites: cands, added } = withReportedSites(found, reportedValues, reportedAt, siteCtx, geom.scale);
  const h0 = cands.map((c) => base(c.at[0], c.at[1]));
  const probes: SiteProbe[] = cands.map((site, i) => {
    let radius = NEIGHBOURHOOD_SIZES * h0[i];
    // keep neighbourhoods apart so one site's peak is never another's
    for (let j = 0; j < cands.length; j++) {
      if (j !== i) radius = Math.min(radius, 0.5 * Math.hypot(cands[j].at[0] - site.at[0], cands[j].at[1] - site.at[1]));
    }
    return siteProbe(site, radius, model, section);
  });
  const straight = cands.map((c) => straightFacesAt(first.mesh, geom, c.node));
  return { t0, model, levels, ratio, order, size, problem, limits, warnings, first, cands, h0, probes, straight, total, base, reportedValues, reportedAt, added };
}

/** The plain-data input of level k (or of the far-field solve at level k). */
export function levelInput(setup: StudySetup, k: number, farFieldCoarsening?: number): LevelInput {
  const { model, size, order, limits, cands, probes, h0, straight, ratio, levels } = setup;
  return {
    model, size, order, limits, sites: cands, probes, h0, straight, ratio, k,
    ...(farFieldCoarsening !== undefined ? { farFieldCoarsening } : { trace: k === levels - 1 && cands.some((c) => c.plateau !== undefined) }),
  };
}

/** The ladder in this thread, coarsest level first; a stop request is honoured between two levels. */
export function serialLadder(setup: StudySetup, opts: StudyOptions): LadderOutcome {
  const { levels, cands, total } = setup;
  const readings: LevelReadings[] = [];
  for (let k = 0; k < levels && cands.length > 0; k++) {
    if (opts.shouldStop?.()) return { readings, interrupted: true, stopped: interruptedWords(0, k) };
    try {
      readings.push(studyLevel(levelInput(setup, k), setup.problem));
    } catch (e) {
      if (k >= 1 && isPeakwiseError(e)) return { readings, interrupted: false, stopped: failedWords(k, e.message) };
      throw e;
    }
    opts.onProgress?.(2 + k, total, `level ${k + 1} of ${levels}`);
  }
  return { readings, interrupted: false, stopped: '' };
}

/** The reason's words for a ladder that lost level k (0-based) and kept the k below it. */
export function failedWords(k: number, message: string): string {
  return `level ${k + 1} failed (${message}); fitted on ${k} levels`;
}

/** The reason's words for a ladder stopped by a request with levels from..to-1 (0-based) kept. */
export function interruptedWords(from: number, to: number): string {
  const n = to - from;
  if (from === 0) return `interrupted after ${n} level${n === 1 ? '' : 's'}`;
  return `interrupted: fitted on levels ${from + 1}–${to} (${n} level${n === 1 ? '' : 's'}) of the finished ones`;
}

/**
 * The convergence study (issue 5): first solve at the model size, sites, one refinement ladder shared by
 * all sites (level k: each site's local size h₀/ratio^k), SPR recovery, per-site convergence fits and verdicts.
 * Every level in this thread; `runStudyParallel` (parallel.ts) gives the same result with the levels on
 * worker threads.
 */
export function runStudy(model: Model, opts: StudyOptions = {}): StudyResult {
  const setup = prepareStudy(model, opts);
  return finishStudy(setup, serialLadder(setup, opts), opts);
}

/** After the ladder: the far-field solve (when it is wanted), the fits and verdicts, the result. */
export function finishStudy(setup: StudySetup, ladder: LadderOutcome, opts: StudyOptions = {}): StudyResult {
  const { model, levels, ratio, order, problem, cands, probes, first, warnings, t0, total, limits } = setup;
  const geom = problem.geometry;
  const measure = model.study.measure;
  const { readings, stopped, interrupted } = ladder;
  const sets = first.sets;
  // levels per load set (case or combination), per site
  const perSet: LevelResult[][][] = sets.map((_, j) => cands.map((_c, i) => readings.map((r) => r.perSet[j][i])));
  const finest = readings.find((r) => r.k === levels - 1)?.traces;

  // far-field term (docs/study.md, "Far field"): the finest level again with everything outside the sites'
  // refined cores coarsened; the change of each peak is what the unrefined mesh, the same on every level,
  // contributes. Only solved when some site converges (the term belongs to converging bands alone).
  const farShift: number[][] = sets.map(() => []);
  const farShiftK: number[][] = sets.map(() => []);
  const kLast = (perSet[0][0]?.length ?? 0) - 1;
  const anyConverging = perSet.some((perSite) => cands.some((c, i) => judgeSite(perSite[i].map((l) => l.h), perSite[i].map((l) => l.peak), ratio, order, c.theory).verdict === 'converging'));
  // a stress intensity converges like a peak and gets the same far-field term
  const anyIntensity = probes.some((p) => p.intensity !== undefined);
  if (!interrupted && !stopped && kLast >= 2 && (anyConverging || anyIntensity) && !opts.shouldStop?.()) {
    try {
      studyLevel(levelInput(setup, kLast, BAND_RULES.farField.coarsening), problem).perSet.forEach((far, j) => {
        const perSite = perSet[j];
        farShift[j] = far.map((l, i) => l.peak - perSite[i][kLast].peak);
        farShiftK[j] = far.map((l, i) => (l.nsif ?? NaN) - (perSite[i][kLast].nsif ?? NaN));
      });
    } catch (e) {
      if (!isPeakwiseError(e)) throw e;
    }
    opts.onProgress?.(2 + levels, total, 'far field');
  }

  const stress = stressUnit(model.units);
  const sitesOf = (j: number): SiteResult[] => {
    const perSiteResults: SiteResult[] = cands.map((c, i) => {
      const r = toSiteResult(`S${i + 1}`, c, perSet[j][i], ratio, order, probes[i], stress, model.units.length, stopped, farShift[j][i], farShiftK[j][i]);
      return finest ? withPlateauExtent(r, c, finest[j], finest[j].nodal) : r;
    });
    return reportedSites(perSiteResults, { scale: geom.scale, yieldStress: model.material.yield }).map(withCauseAdvice);
  };
  const summary = (solution: SolvedLevel['solution']): StudyResult['solution'] => ({
    dofs: solution.dofs, maxDisplacement: solution.maxDisplacement, reactionSum: solution.reactionSum, appliedSum: solution.appliedSum,
  });
  // with cases, every case and combination has its sites, and the study's own sites are the envelope
  const withCases = model.cases !== undefined && model.cases.length > 0;
  const caseStudies: CaseStudy[] = withCases
    ? sets.map((set, j) => ({ name: set.name, kind: set.kind, ...(set.expression ? { expression: set.expression } : {}), solution: summary(set.solution), sites: sitesOf(j) }))
    : [];
  const onRim = perSet.map((perSite) => perSite.map((lv, i) => peakOnRim(lv, cands[i].at)));
  const envelope = withCases ? envelopeOf(caseStudies, measure, onRim) : [];
  const sites: SiteResult[] = withCases ? envelopeSites(caseStudies, envelope) : sitesOf(0);
  // a reported value is set beside the sites of its case or combination (the envelope's without one)
  const setIndexOf = (r: ReportedValue): number => (withCases && r.case !== undefined ? Math.max(0, sets.findIndex((set) => set.name === r.case)) : 0);
  const reported = setup.reportedValues.length > 0 && !interrupted
    ? judgeReported(setup.reportedValues, setup.reportedAt, cands, (r) => (withCases && r.case !== undefined ? caseStudies[setIndexOf(r)].sites : sites), setIndexOf, setup.base, setup.added,
      { problem, order, limits, measure, stress, length: model.units.length, probes, section: problem.section })
    : undefined;
  const q = meshQuality(first.mesh);
  return {
    tool: 'peakwise',
    version: VERSION,
    model: { title: model.title, file: model.file, ...(model.state === 'axisymmetric' ? { state: 'axisymmetric' as const } : {}) },
    units: { length: model.units.length, force: model.units.force, stress },
    mesh: { nodes: first.mesh.xy.length / 2, elements: first.mesh.elemNodes.length / first.mesh.nodesPerElem, order, minAngleDeg: q.minAngleDeg },
    solution: summary(first.solution),
    measure,
    ...(model.material.yield !== undefined ? { yieldStress: model.material.yield } : {}),
    sites,
    ...(reported ? { reported } : {}),
    timings: { totalS: (performance.now() - t0) / 1000 },
    ...(interrupted ? { interrupted: true } : {}),
    ...(warnings.length > 0 ? { warnings: warnings.map((w) => `${w.keyPath}: ${w.message}`) } : {}),
    ...(withCases ? { cases: caseStudies, envelope } : {}),
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

/** Where a reported value is studied: snapSitePoint's rules, its errors naming the reported entry. */
function reportedPoint(geom: PlateGeometry, r: ReportedValue, vertices: readonly Point[]): Point {
  const keyPath = r.keyPath.includes(' (') ? r.keyPath : `${r.keyPath}.at`;
  try {
    return snapSitePoint(geom, r.at, keyPath, vertices);
  } catch (e) {
    if (isPeakwiseError(e)) throw new PeakwiseError('study', e.message.replace(/^listed site/, 'reported point').replace(/a site must be/, 'a reported value must be'), keyPath);
    throw e;
  }
}

/**
 * The found sites plus one listed site at every reported point far from all of them (issue 15 §2:
 * detection stays on), sorted as findSites sorts; a feature length never reaches past another site.
 */
function withReportedSites(
  found: SiteCandidate[], values: readonly ReportedValue[], at: readonly Point[], ctx: Parameters<typeof findSites>[0], scale: number,
): { sites: SiteCandidate[]; added: Point[] } {
  if (values.length === 0) return { sites: found, added: [] };
  const match = matchReported(at, values.map((v) => v.size), found, ctx.baseSize);
  const far = unmatchedPoints(at, match, 1e-9 * scale);
  if (far.length === 0) return { sites: found, added: [] };
  const extra = findSites({ ...ctx, model: { ...ctx.model, study: { ...ctx.model.study, sites: far } }, listed: far });
  const tol = 1e-6 * scale;
  const key = (v: number) => Math.round(v / tol);
  const all = [...found, ...extra].sort((a, b) => key(a.at[0]) - key(b.at[0]) || key(a.at[1]) - key(b.at[1]));
  const sites = all.map((c) => {
    let length = c.featureLength, why = c.featureLengthWhy;
    for (const o of all) {
      const d = Math.hypot(o.at[0] - c.at[0], o.at[1] - c.at[1]);
      if (o !== c && d < length) { length = d; why = `distance to the next site ${Number(d.toPrecision(4))}`; }
    }
    return length === c.featureLength ? c : { ...c, featureLength: length, featureLengthWhy: why };
  });
  return { sites, added: far };
}

interface JudgeContext {
  problem: Problem;
  order: 1 | 2;
  limits: SolveLimits;
  measure: Model['study']['measure'];
  stress: string;
  length: string;
  probes: SiteProbe[];
  section: Problem['section'];
}

/**
 * Each reported value against the site it belongs to (the nearest within the match tolerance; a far
 * point has its own listed site). With an element order other than the study's, our own solve of that
 * order at the reported size: the model's mesh with a cone of that size at the site.
 */
function judgeReported(
  values: readonly ReportedValue[], at: readonly Point[], cands: readonly SiteCandidate[],
  sitesOf: (r: ReportedValue) => readonly SiteResult[], setOf: (r: ReportedValue) => number,
  base: (x: number, y: number) => number, addedPoints: readonly Point[], j: JudgeContext,
): ReportedAssessment[] {
  const match = matchReported(at, values.map((v) => v.size), cands, base);
  const cache = new Map<string, number>();
  return values.map((r, i) => {
    const k = match[i];
    if (k < 0) throw new PeakwiseError('study', `reported point (${r.at[0]}, ${r.at[1]}) matched no site`, r.keyPath);
    const site = sitesOf(r)[k], cand = cands[k], set = setOf(r);
    const ownSolve = (h: number, ord: 1 | 2): number => {
      const id = `${k}:${h}:${ord}:${set}`;
      const hit = cache.get(id);
      if (hit !== undefined) return hit;
      const field = (x: number, y: number) => Math.min(Math.max(base(x, y), h), h + LADDER_GRADING * Math.hypot(x - cand.at[0], y - cand.at[1]));
      const s = solveAt(j.problem, field, ord, j.limits, { points: [cand.at] });
      const probe: SiteProbe = { ...j.probes[k], intensity: undefined };
      const own = s.sets[set];
      const v = probeLevel(s.mesh, own.field, own.nodal, own.gauss, j.section, j.measure, probe, h, s.solution.dofs).peak;
      cache.set(id, v);
      return v;
    };
    const same = 1e-9 * j.problem.geometry.scale;
    const added = addedPoints.some((p) => Math.hypot(p[0] - cand.at[0], p[1] - cand.at[1]) <= same);
    return assessReported(r, site, Math.hypot(site.at[0] - r.at[0], site.at[1] - r.at[1]), added, {
      order: j.order, measure: j.measure, units: { length: j.length, stress: j.stress }, ownSolve,
    });
  });
}
