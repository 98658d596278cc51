/**
 * peakwise library entry: the same functions the CLI uses, plus a few typed conveniences that
 * chain them (`loadModel → mesh → solve → recover`, `study`, `sweep`). Everything here is pure
 * except `loadModel`, which reads a file, and `sweep`, which starts worker threads. docs/api.md
 * has a worked example.
 */
import { readFileSync } from 'node:fs';
import { PeakwiseError } from './errors.js';
import type { Model, Point } from './model/types.js';
import type { Mesh } from './mesh/types.js';
import type { PlateGeometry } from './geometry/types.js';
import type { ElasticSection, GaussStresses, Solution } from './fem/types.js';
import type { ErrorEstimate, NodalStress } from './recovery/types.js';
import type { StudyResult } from './study/types.js';
import type { SweepResult, VaryAxis } from './sweep/types.js';
import { parseModel, type ParseOptions } from './model/index.js';
import { buildGeometry } from './geometry/index.js';
import { meshPlate, sizeFieldFromSettings } from './mesh/index.js';
import { gaussStresses, selectorVertices, solvePlate } from './fem/index.js';
import { estimateError, nodalMeasure, recoverSpr } from './recovery/index.js';
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
export { solvePlate, gaussStresses, assembleStiffness, appliedResultant, selectorVertices, type PlateProblem } from './fem/index.js';
export { analyze, factorize, solveFactor, solveSpd, residualNorm, toMatrixMarket } from './linalg/index.js';
export {
  recoverSpr, recoverAverage, estimateError, nodalMeasure, measureValue, principal, vonMises, tresca,
  buildPointLocator, stressAt, boundaryTangentialStress, adaptiveSolve,
  type PointLocator, type PointStress, type BoundaryStress, type AdaptiveOptions, type AdaptiveResult,
} from './recovery/index.js';
export { runStudy, findSites, williamsRoots, wedgeTheory, type StudyOptions, type BaseSolve } from './study/index.js';
export { studyTable, sitesCsv, fieldCsv, reportHtml, meshSvg, contourSvg, convergencePlotSvg, CAUTION } from './report/index.js';
export { kirschPolar, kirschCartesian, lameRing, inglisKt } from './reference/index.js';
export {
  runSweep, parseVary, expandRange, cartesian, matchSites, sweepCsv, sweepHtml, pointKey,
  type SweepOptions, type PointCache, type PointOutcome,
} from './sweep/index.js';
export { sampleCut, openingCut, cutCsv, parseCutSpec, type CutSample, type CutSpec, type CutTable } from './sweep/cut.js';

/**
 * Read and parse a model file (this one does file I/O; `parseModel(text, file)` is the pure form).
 * `options.params` overrides parameters of the file, as a sweep does.
 */
export function loadModel(file: string, options: ParseOptions = {}): Model {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (e) {
    throw new PeakwiseError('io', `${file}: cannot be read (${(e as NodeJS.ErrnoException).code ?? 'error'})`);
  }
  return parseModel(text, file, options);
}

/** Points that must be mesh nodes: what point selectors mean and where line selectors end (selectorVertices). */
function requiredPoints(model: Model, geometry: PlateGeometry): Point[] {
  return selectorVertices(model, geometry);
}

export interface Meshed {
  model: Model;
  geometry: PlateGeometry;
  mesh: Mesh;
}

/** Build the plate geometry and mesh it with the model's size settings (`mesh.size`, `mesh.local`, `mesh.order`). */
export function mesh(model: Model, opts: { size?: number; order?: 1 | 2 } = {}): Meshed {
  const geometry = buildGeometry(model.plate);
  const sizeAt = sizeFieldFromSettings(geometry, { ...model.mesh, size: opts.size ?? model.mesh.size });
  const m = meshPlate(geometry, { sizeAt, order: opts.order ?? model.mesh.order, requiredPoints: requiredPoints(model, geometry) });
  return { model, geometry, mesh: m };
}

export interface Solved extends Meshed {
  section: ElasticSection;
  solution: Solution;
}

/** Mesh (unless given a `mesh()` result) and solve once: displacements, reactions, residual. */
export function solve(input: Model | Meshed, opts: { size?: number; order?: 1 | 2 } = {}): Solved {
  const meshed = 'mesh' in input && 'geometry' in input && 'model' in input ? input : mesh(input as Model, opts);
  const { model } = meshed;
  const section: ElasticSection = { E: model.material.E, nu: model.material.nu, state: model.state, thickness: model.thickness };
  const solution = solvePlate({
    mesh: meshed.mesh, geometry: meshed.geometry, section, supports: model.supports,
    loads: [...model.loads, ...(model.fieldLoads ?? [])],
  });
  return { ...meshed, section, solution };
}

export interface Recovered extends Solved {
  gauss: GaussStresses;
  /** SPR-recovered nodal stresses */
  field: NodalStress;
  /** Zienkiewicz–Zhu error estimate of the solve */
  estimate: ErrorEstimate;
  /** the model's study measure per node (von Mises unless the model says otherwise) */
  nodal: Float64Array;
}

/** Gauss-point stresses, SPR nodal field, error estimate and the study measure of a solve. */
export function recover(solved: Solved): Recovered {
  const gauss = gaussStresses(solved.mesh, solved.solution.u, solved.section);
  const field = recoverSpr(solved.mesh, gauss, solved.section);
  const estimate = estimateError(solved.mesh, gauss, field, solved.section);
  return { ...solved, gauss, field, estimate, nodal: nodalMeasure(field, solved.model.study.measure) };
}

/** The convergence study of a model (verdict per site); the same as `peakwise study`. */
export function study(model: Model, opts: StudyOptions = {}): StudyResult {
  return runStudy(model, opts);
}

/**
 * The study repeated over parameter values, on worker threads (from the built package; pass
 * `jobs: 0` to stay in this thread). `vary` is `{ r: [0, 2, 4] }`, a list of axes, or `--vary`
 * strings such as `'r=0:2:20'`. Returns every point's study and the site families.
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
