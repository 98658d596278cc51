/**
 * `peakwise solve` after the solving: the record of one solve (what --json prints and what the
 * report shows), its terminal summary, and the optional exports of the free-dof system.
 */
import { join } from 'node:path';
import { stressUnit } from '../model/index.js';
import type { Mesh } from '../mesh/types.js';
import { meshQuality } from '../mesh/index.js';
import type { GaussStresses, Solution } from '../fem/types.js';
import { assembleStiffness, selectorWarnings, supportedDofs } from '../fem/index.js';
import { healthWarnings } from '../fem/health.js';
import { csrSubmatrix, matrixMarketChunks, vectorToMatrixMarket } from '../linalg/index.js';
import type { ErrorEstimate } from '../recovery/types.js';
import { vonMises } from '../recovery/index.js';
import type { AdaptiveCycle, Problem, SolvedLevel } from '../pipeline/index.js';
import { measureName, solveSummary, type ReportRun, type SolveSummaryInput } from '../report/index.js';
import { VERSION } from '../version.js';
import { roundToScale } from '../study/index.js';
import { fmt, modelWarnings } from './common.js';
import { writeFileAtomic } from './io.js';

/** One solve as solve.ts ended it: the last level, its error estimate, the adaptive cycles if any. */
export interface SolveRun {
  level: SolvedLevel;
  estimate: ErrorEstimate;
  /** seconds of meshing (all cycles of an adaptive run) */
  meshS: number;
  cycles?: AdaptiveCycle[];
  /** the adaptive loop ended on a stop request (Ctrl-C): the last finished cycle */
  stopped?: boolean;
}

/** What `peakwise solve --json` prints. */
export interface SolveRecord {
  tool: 'peakwise';
  version: string;
  model: { title: string; file: string };
  units: { length: string; force: string; stress: string };
  mesh: { nodes: number; elements: number; order: 1 | 2; minAngleDeg: number; maxAngleDeg: number; area: number };
  solution: {
    dofs: number; maxDisplacement: number; maxDisplacementAt: [number, number];
    reactionSum: [number, number]; appliedSum: [number, number]; residual: number;
    maxGaussVonMises: number; maxGaussVonMisesAt: [number, number];
  };
  stress: { measure: string; max: number; at: [number, number]; errorPercent: number };
  timings: { meshS: number; assembleS: number; orderS: number; factorS: number; solveS: number; recoverS: number };
  factor: { nnzL: number };
  warnings: string[];
  cycles?: { dofs: number; errorPercent: number; max: number }[];
}

/** Largest value of a nodal array and the node position where it occurs. */
export function nodalMax(mesh: Mesh, values: Float64Array): { value: number; at: [number, number]; node: number } {
  let best = -Infinity;
  let node = 0;
  for (let n = 0; n < values.length; n++) if (values[n] > best) { best = values[n]; node = n; }
  return { value: best, at: [mesh.xy[2 * node], mesh.xy[2 * node + 1]], node };
}

/** Largest Gauss-point von Mises stress (raw element values, before recovery; with the Gauss σzz). */
export function gaussMax(g: GaussStresses): { value: number; at: [number, number] } {
  let best = -Infinity;
  let k = 0;
  const n = g.weight.length;
  for (let i = 0; i < n; i++) {
    const v = vonMises(g.stress[3 * i], g.stress[3 * i + 1], g.stress[3 * i + 2], g.szz[i]);
    if (v > best) { best = v; k = i; }
  }
  return { value: best, at: [g.xy[2 * k], g.xy[2 * k + 1]] };
}

/** The record of a solve: mesh quality, solution figures, the peak of the measure, timings, warnings. */
export function solveRecord(problem: Problem, run: SolveRun, file: string): SolveRecord {
  const { model, geometry, section } = problem;
  const { mesh, solution, gauss, nodal } = run.level;
  const q = meshQuality(mesh);
  const peak = nodalMax(mesh, nodal);
  const gp = gaussMax(gauss);
  const t = solution.timings;
  const warnings = [...modelWarnings(model, file, selectorWarnings(model, geometry)), ...healthWarnings({ section, geometry, mesh, size: model.mesh.size, lengthUnit: model.units.length })];
  const at = (p: readonly [number, number]): [number, number] => [roundToScale(p[0], geometry.scale), roundToScale(p[1], geometry.scale)]; // no binary tails (issue 17)
  return {
    tool: 'peakwise',
    version: VERSION,
    model: { title: model.title, file },
    units: { ...model.units, stress: stressUnit(model.units) },
    mesh: { nodes: q.nodes, elements: q.elements, order: q.order, minAngleDeg: q.minAngleDeg, maxAngleDeg: q.maxAngleDeg, area: q.area },
    solution: {
      dofs: solution.dofs,
      maxDisplacement: solution.maxDisplacement,
      maxDisplacementAt: at(solution.maxDisplacementAt),
      reactionSum: solution.reactionSum,
      appliedSum: solution.appliedSum,
      residual: solution.residual,
      maxGaussVonMises: gp.value,
      maxGaussVonMisesAt: at(gp.at),
    },
    stress: { measure: problem.measure, max: peak.value, at: at(peak.at), errorPercent: run.estimate.errorPercent },
    timings: { meshS: run.meshS, assembleS: t.assembleS, orderS: t.orderS, factorS: t.factorS, solveS: t.solveS, recoverS: run.level.timings.recoverS },
    factor: { nnzL: solution.nnzL },
    warnings,
    ...(run.cycles ? { cycles: run.cycles.map((c) => ({ dofs: c.dofs, errorPercent: c.errorPercent, max: c.max })) } : {}),
  };
}

/** What the report shows of one solve: its figures and no sites (a solve judges none). */
export function solveReportRun(record: SolveRecord): ReportRun {
  const { version, model, units, mesh, solution, warnings } = record;
  return { version, model, units, mesh, solution, measure: record.stress.measure, sites: [], ...(warnings.length > 0 ? { warnings } : {}) };
}

/** The terminal summary of a solve. */
export function solveText(record: SolveRecord, solution: Solution, outDir: string, color: boolean, singularCheck?: SolveSummaryInput['singularCheck']): string {
  const { units, mesh, solution: s, stress, timings: t } = record;
  return solveSummary(
    {
      title: record.model.title,
      units,
      nodes: mesh.nodes,
      elements: mesh.elements,
      order: mesh.order,
      dofs: s.dofs,
      maxDisplacement: { value: s.maxDisplacement, at: s.maxDisplacementAt },
      reactionSum: s.reactionSum,
      appliedSum: s.appliedSum,
      maxStress: { measure: `${measureName(stress.measure)} (recovered)`, value: stress.max, at: stress.at },
      timings: { mesh: t.meshS, assemble: t.assembleS, order: t.orderS, factor: t.factorS, solve: t.solveS, recover: t.recoverS },
      errorPercent: stress.errorPercent,
      residual: s.residual,
      singularCheck,
      loadScale: solution.load.reduce((a, f) => a + Math.abs(f), 0),
      extraRows: [['max Gauss point', `von Mises ${fmt(s.maxGaussVonMises)} ${units.stress} at (${fmt(s.maxGaussVonMisesAt[0])}, ${fmt(s.maxGaussVonMisesAt[1])}) ${units.length}`]],
    },
    { color },
  ) + `  field written to ${join(outDir, 'field.csv')}\n`;
}

/** Free-dof stiffness and load (supported dofs eliminated, as the solver factorises them), as Matrix Market files. */
export function exportSystem(
  problem: Problem, level: Pick<SolvedLevel, 'mesh' | 'solution'>, files: { matrix?: string; load?: string }, protect: string[],
): void {
  const { mesh, solution } = level;
  const fixed = supportedDofs(mesh, problem.geometry, problem.supports);
  let nFree = 0;
  for (let i = 0; i < fixed.length; i++) if (!fixed[i]) nFree++;
  const keep = new Int32Array(nFree);
  for (let i = 0, k = 0; i < fixed.length; i++) if (!fixed[i]) keep[k++] = i;
  if (files.matrix) {
    const K = csrSubmatrix(assembleStiffness(mesh, problem.section), keep);
    writeFileAtomic(files.matrix, matrixMarketChunks(K), protect);
  }
  if (files.load) {
    const f = new Float64Array(nFree);
    for (let k = 0; k < nFree; k++) f[k] = solution.load[keep[k]];
    writeFileAtomic(files.load, vectorToMatrixMarket(f), protect);
  }
}

