/**
 * The handlers of `peakwise solve` and `study` (`mesh` is mesh-command.ts): each reads the model, hands it to the
 * pipeline (src/pipeline) or the study, and writes what came back — named steps, no solving here.
 */
import { join } from 'node:path';
import { fieldCsv, reportHtml, studyTable } from '../report/index.js';
import { runStudyParallel, type BaseSolve } from '../study/index.js';
import type { TaskPool } from '../pipeline/pool.js';
import type { StudyResult } from '../study/types.js';
import {
  adaptiveSolve, estimateOf, problemOf, sectionOf, solveProblem, type AdaptiveCycle, type Problem, type SolveLimits,
} from '../pipeline/index.js';
import { healthWarnings } from '../fem/health.js';
import { selectorWarnings } from '../fem/index.js';
import { progressBar } from './progress.js';
import { recordedChecks } from './checks-record.js';
import { checkCutOptions, writeCutOutputs, type CutCliOptions } from './cut.js';
import { writeFileAtomic } from './io.js';
import { PeakwiseError } from '../errors.js';
import {
  StudyInterrupted, emitWarnings, fieldColumns, fmt, levelsOption, limitsOf, loadModel, modelWarnings, outDirFor, positiveNumber,
  ratioOption, stopRequested, studyJson, useColor, type CliContext, type CommonOptions,
} from './common.js';
import { exportSystem, solveRecord, solveReportRun, solveText, type SolveRun } from './solve-output.js';
import { writeStudyOutputs } from './study-output.js';
import { checkCaseOption, levelOfCase, loadSetNames } from './cases.js';
import { caseStudyResult } from '../study/index.js';

export { StudyInterrupted, setStopFlag, type CliContext, type CommonOptions } from './common.js';

export interface SolveOptions extends CommonOptions, CutCliOptions {
  exportMatrix?: string;
  exportLoad?: string;
  adapt?: string;
  maxDofs?: string;
  report?: boolean;
  case?: string;
}

/** One solve at the model's own mesh settings. */
function solveOnce(problem: Problem, limits: SolveLimits): SolveRun {
  const level = solveProblem(problem, limits);
  return { level, estimate: estimateOf(problem, level), meshS: level.timings.meshS };
}

/** The adaptive loop to `--adapt` percent, each cycle reported on stderr; a warning when it stops short. */
function solveAdaptive(problem: Problem, limits: Required<SolveLimits>, targetText: string, opts: SolveOptions): SolveRun {
  const target = positiveNumber(targetText, '--adapt');
  const say = (line: string): void => { if (!opts.json && !opts.quiet) process.stderr.write(line + '\n'); };
  const t0 = performance.now();
  const result = adaptiveSolve(problem, {
    targetPercent: target,
    shouldStop: stopRequested,
    onCycle: (c: AdaptiveCycle) => say(`  cycle ${c.cycle}: ${c.dofs} dofs, error ${c.errorPercent.toFixed(2)} %, max ${fmt(c.max)}`),
  }, limits);
  const t = result.solution.timings;
  const meshS = (performance.now() - t0) / 1000 - (t.assembleS + t.orderS + t.factorS + t.solveS);
  if (result.stoppedBy !== 'target' && result.stoppedBy !== 'stopped') {
    const why = result.stoppedBy === 'dofs' ? `dof cap (--max-dofs ${limits.maxDofs})` : result.stoppedBy === 'memory' ? 'factor memory cap' : 'cycle limit';
    process.stderr.write(`peakwise: warning: adaptive loop stopped by the ${why} at error ${result.estimate.errorPercent.toFixed(2)} % (target ${target} %)\n`);
  }
  return { level: result, estimate: result.estimate, meshS, cycles: result.cycles, ...(result.stoppedBy === 'stopped' ? { stopped: true } : {}) };
}

export async function runSolve(ctx: CliContext, file: string, opts: SolveOptions): Promise<void> {
  checkCutOptions(opts);
  const model = loadModel(ctx, file, opts);
  const outDir = outDirFor(file, opts, 'solve');
  const limits = limitsOf(opts);
  checkCaseOption(model, opts.case);
  const problem = problemOf(model);
  const solved = opts.adapt !== undefined ? solveAdaptive(problem, limits, opts.adapt, opts) : solveOnce(problem, limits);
  // with load cases, one case or combination is shown (--case, else the first)
  const level = levelOfCase(solved.level, opts.case);
  // the error estimate is of the case shown (the solve estimated the first)
  const run = opts.case === undefined || level.sets[0].name === opts.case ? { ...solved, level } : { ...solved, level, estimate: estimateOf(problem, level) };
  const record = solveRecord(problem, run, file);
  const names = loadSetNames(model);
  if (names.length > 0) { record.case = opts.case ?? names[0]; record.cases = names; }
  const { mesh, solution, field, nodal } = run.level;
  const protect = [file];
  writeFileAtomic(join(outDir, 'field.csv'), fieldCsv(mesh, solution.u, fieldColumns(model, field), { length: model.units.length, stress: record.units.stress }), protect);
  const cut = writeCutOutputs(outDir, opts, { model, mesh, geometry: problem.geometry, field }, protect);
  if (cut && !opts.json && !opts.quiet) process.stderr.write(`peakwise: stresses along the cut written to ${cut.file}\n`);
  if (opts.exportMatrix || opts.exportLoad) exportSystem(problem, run.level, { matrix: opts.exportMatrix, load: opts.exportLoad }, protect);
  if (opts.report) {
    const html = reportHtml({
      model, study: solveReportRun(record), mesh, geometry: problem.geometry, field: nodal, u: solution.u, mode: 'solve', checks: recordedChecks(),
      ...(cut ? { cut: cut.plot } : {}),
    });
    writeFileAtomic(join(outDir, 'report.html'), html, protect);
  }
  emitWarnings(record.warnings, opts);
  if (run.stopped && run.cycles) {
    const last = run.cycles[run.cycles.length - 1];
    process.stderr.write(`peakwise: interrupted: cycle ${last.cycle} (${last.dofs} dofs, error ${last.errorPercent.toFixed(2)} %) is written to ${outDir} (run.json has "interrupted": true)\n`);
    throw new StudyInterrupted();
  }
  process.stdout.write(opts.json ? JSON.stringify(record, null, 2) + '\n' : solveText(record, solution, outDir, useColor(opts), { model, geometry: problem.geometry, mesh }));
}

export interface StudyCliOptions extends CommonOptions, CutCliOptions {
  levels?: string;
  ratio?: string;
  maxDofs?: string;
  case?: string;
  jobs?: string;
}

/** `--jobs`: worker threads for the study's levels (default one per core; 1 = every level in this thread). */
export function jobsOption(text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const v = Number(text);
  if (!(text.trim() !== '' && Number.isInteger(v) && v >= 1 && v <= 256)) throw new PeakwiseError('usage', `--jobs must be a whole number from 1 to 256, got "${text}"`);
  return v;
}

/**
 * The study with a progress bar; the first solve is kept for the field files and the picture. The
 * levels run on `--jobs` worker threads (or the warm `pool` of watch mode).
 */
export async function studyWithProgress(
  model: Parameters<typeof runStudyParallel>[0], opts: StudyCliOptions, pool?: TaskPool,
): Promise<{ study: StudyResult; base: BaseSolve | undefined }> {
  const levels = levelsOption(opts.levels);
  const ratio = ratioOption(opts.ratio);
  const jobs = jobsOption(opts.jobs);
  const bar = progressBar(opts, 'solves');
  let base: BaseSolve | undefined;
  try {
    const study = await runStudyParallel(model, {
      ...(pool ? { pool } : jobs !== undefined ? { jobs } : {}),
      ...(levels !== undefined ? { levels } : {}),
      ...(ratio !== undefined ? { ratio } : {}),
      onProgress: (done, total, label) => bar.update(done, total, label),
      onBase: (b) => { base = b; },
      shouldStop: stopRequested,
      limits: limitsOf(opts),
    });
    return { study, base };
  } finally {
    bar.stop();
  }
}

export async function runStudy(ctx: CliContext, file: string, opts: StudyCliOptions, pool?: TaskPool): Promise<void> {
  checkCutOptions(opts);
  const model = loadModel(ctx, file, opts);
  checkCaseOption(model, opts.case);
  const outDir = outDirFor(file, opts, 'study');
  const { study, base } = await studyWithProgress(model, opts, pool);
  const warnings = modelWarnings(model, file, base ? selectorWarnings(model, base.geometry) : []);
  if (base) {
    warnings.push(...healthWarnings({ section: sectionOf(model), geometry: base.geometry, mesh: base.mesh, size: model.mesh.size, lengthUnit: model.units.length }));
  }
  emitWarnings(warnings, opts);
  if (warnings.length > 0) study.warnings = warnings;
  const cut = base ? writeCutOutputs(outDir, opts, { model, mesh: base.mesh, geometry: base.geometry, field: base.field }, [file]) : undefined;
  if (cut && !opts.json && !opts.quiet) process.stderr.write(`peakwise: stresses along the cut written to ${cut.file}\n`);
  writeStudyOutputs(model, study, base, outDir, file, cut?.plot);
  if (study.interrupted) {
    process.stderr.write(`peakwise: interrupted: the finished levels are written to ${outDir} (study.json has "interrupted": true)\n`);
    throw new StudyInterrupted();
  }
  // --case: that case's own StudyResult on stdout (study.json keeps every case and the envelope)
  const shown = opts.case !== undefined ? caseStudyResult(study, opts.case) ?? study : study;
  if (opts.json) {
    process.stdout.write(studyJson(shown) + '\n');
    return;
  }
  process.stdout.write(studyTable(shown, { color: useColor(opts) }) + '\n');
  process.stdout.write(`  results in ${outDir}: study.json, sites.csv, field.csv, report.html\n`);
}
