/**
 * peakwise library entry: the same functions the CLI uses, plus a few typed conveniences that
 * chain them (`loadModel → mesh → solve → recover`, `study`, `sweep`). Everything here is pure
 * except `loadModel`, which reads a file, and `sweep`, which starts worker threads. docs/api.md
 * has a worked example.
 */
import { readFileSync } from 'node:fs';
import { dirname, isAbsolute, join } from 'node:path';
import { PeakwiseError } from './errors.js';
import type { Model } from './model/types.js';
import type { Mesh } from './mesh/types.js';
import type { PlateGeometry } from './geometry/types.js';
import type { ElasticSection, GaussStresses, Solution } from './fem/types.js';
import type { ErrorEstimate, NodalStress } from './recovery/types.js';
import type { StudyResult } from './study/types.js';
import type { SweepResult, VaryAxis } from './sweep/types.js';
import { parseModel, type ParseOptions } from './model/index.js';
import { baseSizeField, estimateOf, meshAt, problemOf, solveMesh, type Problem, type SolveLimits } from './pipeline/index.js';
import { runStudy, type StudyOptions } from './study/index.js';
import { parseVary, runSweep, type SweepOptions } from './sweep/index.js';

export * from './errors.js';
export { VERSION } from './version.js';
export type * from './model/types.js';
export type * from './geometry/types.js';
export type * from './mesh/types.js';
export type * from './linalg/types.js';
export type * from './fem/types.js';
export type * from './recovery/types.js';
export type * from './study/types.js';
export type * from './sweep/types.js';

// the stages' main functions, as the CLI calls them
export { parseModel, formatModelError, stressUnit, type ParseOptions } from './model/index.js';
export { buildGeometry, pointInMaterial } from './geometry/index.js';
export { meshPlate, meshQuality, validateMesh, sizeFieldFromSettings } from './mesh/index.js';
export { solvePlate, solvePlateCases, gaussStresses, assembleStiffness, appliedResultant, selectorVertices, selectorWarnings, type PlateProblem } from './fem/index.js';
export { axisymmetricStiffness, axisymmetricGaussStresses, revolvedTractionLoad, revolvedPressureLoad } from './fem/index.js';
export { analyze, factorize, solveFactor, solveSpd, residualNorm, toMatrixMarket } from './linalg/index.js';
export {
  recoverSpr, recoverAverage, estimateError, nodalMeasure, measureValue, principal, vonMises, tresca,
  buildPointLocator, stressAt, boundaryTangentialStress,
  type PointLocator, type PointStress, type BoundaryStress,
} from './recovery/index.js';
export {
  problemOf, sectionOf, baseSizeField, meshAt, solveMesh, solveAt, solveProblem, estimateOf, adaptiveSolve, modelFromParts,
  checkLimits, defaultLimits, DEFAULT_MAX_DOFS,
  type Problem, type ProblemOptions, type SolvedLevel, type MeshRequest, type SolveLimits, type ModelParts,
  type AdaptiveOptions, type AdaptiveCycle, type AdaptiveResult, type LoadSetLevel,
} from './pipeline/index.js';
export { runStudy, runStudyParallel, findSites, williamsRoots, wedgeTheory, caseStudyResult, envelopeOf, type StudyOptions, type ParallelStudyOptions, type BaseSolve } from './study/index.js';
export { loadCasesOf, linearForm } from './model/index.js';
export { studyTable, sitesCsv, fieldCsv, reportHtml, meshSvg, contourSvg, convergencePlotSvg, CAUTION, bandText, formatBand } from './report/index.js';
export { kirschPolar, kirschCartesian, lameRing, inglisKt } from './reference/index.js';
export {
  runSweep, parseVary, expandRange, cartesian, matchSites, sweepCsv, sweepHtml, pointKey,
  type SweepOptions, type PointCache, type PointOutcome,
} from './sweep/index.js';
export { sampleCut, openingCut, cutCsv, parseCutSpec, type CutSample, type CutSpec, type CutTable } from './sweep/cut.js';

/**
 * Read and parse a model file (this one does file I/O; `parseModel(text, file)` is the pure form).
 * `options.params` overrides parameters of the file, as a sweep does; files the model imports
 * (SVG or point outlines, displacement tables) are read relative to it, as the CLI reads them.
 */
export function loadModel(file: string, options: ParseOptions = {}): Model {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (e) {
    throw new PeakwiseError('io', `${file}: cannot be read (${(e as NodeJS.ErrnoException).code ?? 'error'})`);
  }
  // files the model refers to (outlines, displacement tables) sit beside it, as for the CLI
  const readFile = (path: string): string => readFileSync(isAbsolute(path) ? path : join(dirname(file), path), 'utf8');
  return parseModel(text, file, { readFile, ...options });
}

/** Overrides of the model's mesh settings, and the limits of the solve. */
export interface SolveRequest {
  size?: number;
  order?: 1 | 2;
  limits?: SolveLimits;
}

export interface Meshed {
  model: Model;
  /** what the pipeline solves: geometry, section, supports, every load, required points */
  problem: Problem;
  geometry: PlateGeometry;
  mesh: Mesh;
}

/** Build the plate geometry and mesh it with the model's size settings (`mesh.size`, `mesh.local`, `mesh.order`). */
export function mesh(model: Model, opts: SolveRequest = {}): Meshed {
  const problem = problemOf(model, { ...(opts.size !== undefined ? { size: opts.size } : {}), ...(opts.order !== undefined ? { order: opts.order } : {}) });
  const m = meshAt(problem, baseSizeField(problem), problem.meshSettings.order, opts.limits);
  return { model, problem, geometry: problem.geometry, mesh: m };
}

export interface Solved extends Meshed {
  section: ElasticSection;
  solution: Solution;
  gauss: GaussStresses;
  /** SPR-recovered nodal stresses */
  field: NodalStress;
  /** the model's study measure per node (von Mises unless the model says otherwise) */
  nodal: Float64Array;
}

/** Mesh (unless given a `mesh()` result), solve once and recover: displacements, reactions, residual, stresses. */
export function solve(input: Model | Meshed, opts: SolveRequest = {}): Solved {
  const meshed = 'problem' in input && 'mesh' in input ? input : mesh(input, opts);
  const { mesh: m, solution, gauss, field, nodal } = solveMesh(meshed.problem, meshed.mesh, opts.limits);
  return { ...meshed, mesh: m, section: meshed.problem.section, solution, gauss, field, nodal };
}

export interface Recovered extends Solved {
  /** Zienkiewicz–Zhu error estimate of the solve */
  estimate: ErrorEstimate;
}

/** A solve with its Zienkiewicz–Zhu error estimate. */
export function recover(solved: Solved): Recovered {
  return { ...solved, estimate: estimateOf(solved.problem, solved) };
}

/** The convergence study of a model (verdict per site); the same as `peakwise study`. */
export function study(model: Model, opts: StudyOptions = {}): StudyResult {
  return runStudy(model, opts);
}

/**
 * The study repeated over parameter values, on worker threads (from the built package; pass
 * `jobs: 0` to stay in this thread). `vary` is `{ r: [0, 2, 4] }`, a list of axes, or `--vary`
 * strings such as `'r=0..20 by 2'`. Returns every point's study and the site families.
 */
export function sweep(modelText: string, file: string, vary: Record<string, number[]> | VaryAxis[] | string[], opts: SweepOptions = {}): Promise<SweepResult> {
  let axes: VaryAxis[];
  if (Array.isArray(vary)) {
    axes = vary.map((v) => (typeof v === 'string' ? parseVary(v) : v));
  } else {
    axes = Object.entries(vary).map(([name, values]) => ({ name, values: [...values] }));
  }
  return runSweep(modelText, file, axes, opts);
}
