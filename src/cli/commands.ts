import { readFileSync } from 'node:fs';
import { dirname, isAbsolute, join } from 'node:path';
import pc from 'picocolors';
import { PeakwiseError } from '../errors.js';
import type { Model, ModelWarning } from '../model/types.js';
import { parseModel } from '../model/index.js';
import { buildGeometry } from '../geometry/index.js';
import { meshPlate, meshQuality, sizeFieldFromSettings } from '../mesh/index.js';
import { type CutPlotInput, fieldCsv, measureName, meshSvg, reportHtml, solveSummary, sitesCsv, studyTable } from '../report/index.js';
import { runStudy as runStudyStage, type BaseSolve } from '../study/index.js';
import type { StudyResult } from '../study/types.js';
import { progressBar } from './progress.js';
import { recordedChecks } from './checks-record.js';
import type { Mesh } from '../mesh/types.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { ElasticSection, GaussStresses, Solution } from '../fem/types.js';
import type { ErrorEstimate, NodalStress } from '../recovery/types.js';
import { assembleStiffness, gaussStresses, selectorVertices, selectorWarnings, solvePlate, supportedDofs } from '../fem/index.js';
import { adaptiveSolve, estimateError, nodalMeasure, recoverSpr, vonMises, type AdaptiveCycle } from '../recovery/index.js';
import { csrSubmatrix, matrixMarketChunks, vectorToMatrixMarket } from '../linalg/index.js';
import { stressUnit } from '../model/index.js';
import { VERSION } from '../version.js';
import { checkCutOptions, writeCutOutputs, type CutCliOptions } from './cut.js';
import { modelName, prepareOutDir, readModelText, writeFileAtomic } from './io.js';
import { plain, nearestPosition } from './report-error.js';
import { totalmem } from 'node:os';
import { dofLimitError, estimateMeshSize, healthWarnings } from '../fem/health.js';

/** What the error printer needs to know about the run so far. */
export interface CliContext {
  file: string | undefined;
  model: Model | undefined;
}

export interface CommonOptions {
  out?: string;
  json?: boolean;
  order?: string;
  size?: string;
  quiet?: boolean;
  color?: boolean;
}

function positiveNumber(text: string, option: string): number {
  const v = Number(text);
  if (!Number.isFinite(v) || v <= 0) throw new PeakwiseError('usage', `${option} must be a positive number, got "${text}"`);
  return v;
}

export function useColor(opts: CommonOptions): boolean {
  if (opts.color === false) return false;
  if (process.env.NO_COLOR !== undefined && process.env.NO_COLOR !== '') return false;
  return process.stdout.isTTY === true;
}

/**
 * Stop requests (Ctrl-C) reach a study between two solves through this flag: the CLI's signal
 * handler sets it (from the main thread, through shared memory when the study runs in a worker).
 */
let stopFlag: Int32Array | undefined;
export function setStopFlag(flag: Int32Array): void {
  stopFlag = flag;
}
export function stopRequested(): boolean {
  return stopFlag !== undefined && Atomics.load(stopFlag, 0) !== 0;
}

/** Default memory cap for one factor: half of this machine's memory. */
export function defaultFactorBytes(): number {
  return 0.5 * totalmem();
}

/** Model hints (e.g. E in other units), and `extra` ones found later (selectorWarnings), as `file:line:col key: message`. */
export function modelWarnings(model: Model, file: string, extra: readonly ModelWarning[] = []): string[] {
  return [...(model.warnings ?? []), ...extra].map((w) => {
    const pos = nearestPosition(model, w.keyPath);
    return `${file}${pos ? `:${pos.line}:${pos.col}` : ''} ${w.keyPath}: ${w.message}`;
  });
}

/** Warnings go to stderr, one line each, unless --quiet (they still reach --json output). */
export function emitWarnings(warnings: readonly string[], opts: CommonOptions): void {
  if (opts.quiet) return;
  for (const w of warnings) process.stderr.write(`peakwise: warning: ${plain(w)}\n`);
}

/** Cap on dofs from --max-dofs (default 2 000 000). */
export function maxDofsOf(opts: { maxDofs?: string }): number {
  return opts.maxDofs !== undefined ? Math.floor(positiveNumber(opts.maxDofs, '--max-dofs')) : 2_000_000;
}

/** Read, parse and apply the command-line overrides. */
export function loadModel(ctx: CliContext, file: string, opts: CommonOptions, params?: Record<string, number>): Model {
  ctx.file = file;
  const text = readModelText(file);
  // files the model refers to (outlines, displacement tables) sit beside it
  const readFile = (path: string): string => readFileSync(isAbsolute(path) ? path : join(dirname(file), path), 'utf8');
  const model = parseModel(text, file, params ? { params, readFile } : { readFile });
  ctx.model = model;
  if (opts.order !== undefined) model.mesh.order = opts.order === '1' ? 1 : 2;
  if (opts.size !== undefined) model.mesh.size = positiveNumber(opts.size, '--size');
  return model;
}

/** Points that must be mesh nodes: what point selectors mean and where line selectors end (each once). */
export function requiredPointsOf(model: Model, geometry: PlateGeometry): [number, number][] {
  return selectorVertices(model, geometry);
}

export function outDirFor(file: string, opts: CommonOptions): string {
  return prepareOutDir(opts.out ?? join('out', modelName(file)), file);
}

export async function runMesh(ctx: CliContext, file: string, opts: CommonOptions & { svg?: string }): Promise<void> {
  const model = loadModel(ctx, file, opts);
  const geometry = buildGeometry(model.plate);
  const sizeAt = sizeFieldFromSettings(geometry, model.mesh);
  const t0 = performance.now();
  const mesh = meshPlate(geometry, { sizeAt, order: model.mesh.order, requiredPoints: requiredPointsOf(model, geometry) });
  const meshS = (performance.now() - t0) / 1000;
  const q = meshQuality(mesh);
  if (opts.svg) writeFileAtomic(opts.svg, meshSvg(mesh, geometry, { title: model.title }), [file]);
  if (opts.json) {
    process.stdout.write(
      JSON.stringify(
        {
          mesh: {
            nodes: q.nodes,
            elements: q.elements,
            order: q.order,
            minAngleDeg: q.minAngleDeg,
            maxAngleDeg: q.maxAngleDeg,
            area: q.area,
            exactArea: geometry.area,
            minEdge: q.minEdge,
            maxEdge: q.maxEdge,
          },
          timings: { meshS },
        },
        null,
        2,
      ) + '\n',
    );
    return;
  }
  const c = useColor(opts) ? pc : pc.createColors(false);
  const L = model.units.length;
  const lines = [
    c.bold(plain(model.title)),
    `  nodes      ${q.nodes}`,
    `  elements   ${q.elements} (${q.order === 2 ? '6-node LST' : '3-node CST'})`,
    `  angles     min ${q.minAngleDeg.toFixed(1)}°, max ${q.maxAngleDeg.toFixed(1)}°`,
    `  area       ${fmt(q.area)} ${plain(L)}² (exact ${fmt(geometry.area)}, ${((q.area / geometry.area - 1) * 100).toFixed(4)} %)`,
    `  edge sizes ${fmt(q.minEdge)} … ${fmt(q.maxEdge)} ${plain(L)}`,
    `  time       ${(meshS * 1000).toFixed(0)} ms`,
  ];
  if (opts.svg) lines.push(`  picture    ${opts.svg}`);
  process.stdout.write(lines.join('\n') + '\n');
}

export function fmt(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e5 || a < 1e-3) return v.toExponential(3);
  return Number(v.toPrecision(5)).toString();
}

export interface SolveOptions extends CommonOptions, CutCliOptions {
  exportMatrix?: string;
  exportLoad?: string;
  adapt?: string;
  maxDofs?: string;
  report?: boolean;
}

export function sectionOf(model: Model): ElasticSection {
  return { E: model.material.E, nu: model.material.nu, state: model.state, thickness: model.thickness };
}

/** Largest value of a nodal array and the node position where it occurs. */
export function nodalMax(mesh: Mesh, values: Float64Array): { value: number; at: [number, number]; node: number } {
  let best = -Infinity;
  let node = 0;
  for (let n = 0; n < values.length; n++) if (values[n] > best) { best = values[n]; node = n; }
  return { value: best, at: [mesh.xy[2 * node], mesh.xy[2 * node + 1]], node };
}

export async function runSolve(ctx: CliContext, file: string, opts: SolveOptions): Promise<void> {
  checkCutOptions(opts);
  const model = loadModel(ctx, file, opts);
  const outDir = outDirFor(file, opts);
  const section = sectionOf(model);
  const geometry = buildGeometry(model.plate);
  const sizeAt0 = sizeFieldFromSettings(geometry, model.mesh);
  const requiredPoints = requiredPointsOf(model, geometry);
  const measure = model.study.measure;
  const maxDofs = maxDofsOf(opts);
  const color = useColor(opts);
  const t0 = performance.now();
  let mesh: Mesh;
  let solution: Solution;
  let gauss: GaussStresses;
  let field: NodalStress;
  let estimate: ErrorEstimate;
  let meshS: number;
  let cycles: AdaptiveCycle[] | undefined;
  let stoppedBy: string | undefined;
  if (opts.adapt !== undefined) {
    const target = positiveNumber(opts.adapt, '--adapt');
    const say = (line: string): void => { if (!opts.json && !opts.quiet) process.stderr.write(line + '\n'); };
    const result = adaptiveSolve(
      { geometry, section, supports: model.supports, loads: [...model.loads, ...(model.fieldLoads ?? [])], order: model.mesh.order, sizeAt0, requiredPoints, measure },
      {
        targetPercent: target,
        maxDofs,
        onCycle: (c: AdaptiveCycle) => say(`  cycle ${c.cycle}: ${c.dofs} dofs, error ${c.errorPercent.toFixed(2)} %, max ${fmt(c.max)}`),
      },
    );
    ({ mesh, solution, gauss, field, estimate, cycles, stoppedBy } = result);
    meshS = (performance.now() - t0) / 1000 - sumTimings(solution);
    if (stoppedBy !== 'target') {
      process.stderr.write(
        `peakwise: warning: adaptive loop stopped by the ${stoppedBy === 'dofs' ? `dof cap (--max-dofs ${maxDofs})` : 'cycle limit'} at error ${estimate.errorPercent.toFixed(2)} % (target ${target} %)\n`,
      );
    }
  } else {
    const est = estimateMeshSize(geometry, sizeAt0, model.mesh.order, 4 * maxDofs);
    if (est.dofs > maxDofs) throw dofLimitError(est.dofs, maxDofs, model.mesh.size, est.exceeded ? 'more-than' : 'estimated');
    mesh = meshPlate(geometry, { sizeAt: sizeAt0, order: model.mesh.order, requiredPoints });
    meshS = (performance.now() - t0) / 1000;
    if (mesh.xy.length > maxDofs) throw dofLimitError(mesh.xy.length, maxDofs, model.mesh.size, 'counted');
    solution = solvePlate({ mesh, geometry, section, supports: model.supports, maxFactorBytes: defaultFactorBytes(), loads: [...model.loads, ...(model.fieldLoads ?? [])] });
    gauss = gaussStresses(mesh, solution.u, section);
    field = recoverSpr(mesh, gauss, section);
    estimate = estimateError(mesh, gauss, field, section);
  }
  const tr = performance.now();
  const vm = nodalMeasure(field, 'von-mises');
  const chosen = measure === 'von-mises' ? vm : nodalMeasure(field, measure);
  const recoverS = (performance.now() - tr) / 1000;
  const peak = nodalMax(mesh, chosen);
  const gp = gaussMax(gauss);
  const q = meshQuality(mesh);

  const sxx = new Float64Array(mesh.xy.length / 2);
  const syy = new Float64Array(sxx.length);
  const sxy = new Float64Array(sxx.length);
  for (let n = 0; n < sxx.length; n++) {
    sxx[n] = field.stress[3 * n];
    syy[n] = field.stress[3 * n + 1];
    sxy[n] = field.stress[3 * n + 2];
  }
  const columns: Record<string, Float64Array> = { sxx, syy, sxy };
  if (model.state === 'plane-strain') columns.szz = field.szz;
  columns.von_mises = vm;
  writeFileAtomic(join(outDir, 'field.csv'), fieldCsv(mesh, solution.u, columns), [file]);
  const cut = writeCutOutputs(outDir, opts, { model, mesh, geometry, field }, [file]);
  if (cut && !opts.json && !opts.quiet) process.stderr.write(`peakwise: stresses along the cut written to ${cut.file}\n`);
  if (opts.exportMatrix || opts.exportLoad) exportSystem(model, mesh, geometry, section, solution, opts, file);
  if (opts.report) {
    const q0 = meshQuality(mesh);
    const oneSolve: StudyResult = {
      tool: 'peakwise',
      version: VERSION,
      model: { title: model.title, file },
      units: { ...model.units, stress: stressUnit(model.units) },
      mesh: { nodes: q0.nodes, elements: q0.elements, order: q0.order, minAngleDeg: q0.minAngleDeg },
      solution: { dofs: solution.dofs, maxDisplacement: solution.maxDisplacement, reactionSum: solution.reactionSum, appliedSum: solution.appliedSum },
      measure,
      sites: [],
    };
    writeFileAtomic(join(outDir, 'report.html'), reportHtml({ model, study: oneSolve, mesh, geometry, field: chosen, u: solution.u, mode: 'solve', checks: recordedChecks(), ...(cut ? { cut: cut.plot } : {}) }), [file]);
  }

  const warnings = [...modelWarnings(model, file, selectorWarnings(model, geometry)), ...healthWarnings({ section, geometry, mesh, size: model.mesh.size, lengthUnit: model.units.length })];
  emitWarnings(warnings, opts);
  const stressUnitLabel = stressUnit(model.units);
  const timings = { meshS, assembleS: solution.timings.assembleS, orderS: solution.timings.orderS, factorS: solution.timings.factorS, solveS: solution.timings.solveS, recoverS };
  if (opts.json) {
    const out: Record<string, unknown> = {
      tool: 'peakwise',
      version: VERSION,
      model: { title: model.title, file },
      units: { ...model.units, stress: stressUnitLabel },
      mesh: { nodes: q.nodes, elements: q.elements, order: q.order, minAngleDeg: q.minAngleDeg, maxAngleDeg: q.maxAngleDeg, area: q.area },
      solution: {
        dofs: solution.dofs,
        maxDisplacement: solution.maxDisplacement,
        maxDisplacementAt: solution.maxDisplacementAt,
        reactionSum: solution.reactionSum,
        appliedSum: solution.appliedSum,
        residual: solution.residual,
        maxGaussVonMises: gp.value,
        maxGaussVonMisesAt: gp.at,
      },
      stress: { measure, max: peak.value, at: peak.at, errorPercent: estimate.errorPercent },
      timings,
      factor: { nnzL: solution.nnzL },
      warnings,
    };
    if (cycles) out.cycles = cycles.map((c) => ({ dofs: c.dofs, errorPercent: c.errorPercent, max: c.max }));
    process.stdout.write(JSON.stringify(out, null, 2) + '\n');
  } else {
    process.stdout.write(
      solveSummary(
        {
          title: model.title,
          units: { ...model.units, stress: stressUnitLabel },
          nodes: q.nodes,
          elements: q.elements,
          order: q.order,
          dofs: solution.dofs,
          maxDisplacement: { value: solution.maxDisplacement, at: solution.maxDisplacementAt },
          reactionSum: solution.reactionSum,
          appliedSum: solution.appliedSum,
          maxStress: { measure: `${measureName(measure)} (recovered)`, value: peak.value, at: peak.at },
          timings: { mesh: meshS, assemble: timings.assembleS, order: timings.orderS, factor: timings.factorS, solve: timings.solveS, recover: recoverS },
          errorPercent: estimate.errorPercent,
          residual: solution.residual,
          loadScale: solution.load.reduce((a, f) => a + Math.abs(f), 0),
          extraRows: [['max Gauss point', `von Mises ${fmt(gp.value)} ${stressUnitLabel} at (${fmt(gp.at[0])}, ${fmt(gp.at[1])}) ${model.units.length}`]],
        },
        { color },
      ) + `  field written to ${join(outDir, 'field.csv')}\n`,
    );
  }
}

function sumTimings(s: Solution): number {
  return s.timings.assembleS + s.timings.orderS + s.timings.factorS + s.timings.solveS;
}

/** Largest Gauss-point von Mises stress (raw element values, before recovery). */
function gaussMax(g: GaussStresses): { value: number; at: [number, number] } {
  let best = -Infinity;
  let k = 0;
  const n = g.weight.length;
  for (let i = 0; i < n; i++) {
    const v = vonMises(g.stress[3 * i], g.stress[3 * i + 1], g.stress[3 * i + 2], 0);
    if (v > best) { best = v; k = i; }
  }
  return { value: best, at: [g.xy[2 * k], g.xy[2 * k + 1]] };
}

/** Free-dof stiffness and load (supported dofs eliminated, as the solver factorises them). */
function exportSystem(model: Model, mesh: Mesh, geometry: PlateGeometry, section: ElasticSection, solution: Solution, opts: SolveOptions, file: string): void {
  const fixed = supportedDofs(mesh, geometry, model.supports);
  let nFree = 0;
  for (let i = 0; i < fixed.length; i++) if (!fixed[i]) nFree++;
  const keep = new Int32Array(nFree);
  for (let i = 0, k = 0; i < fixed.length; i++) if (!fixed[i]) keep[k++] = i;
  if (opts.exportMatrix) {
    const K = csrSubmatrix(assembleStiffness(mesh, section), keep);
    writeFileAtomic(opts.exportMatrix, matrixMarketChunks(K), [file]);
  }
  if (opts.exportLoad) {
    const f = new Float64Array(nFree);
    for (let k = 0; k < nFree; k++) f[k] = solution.load[keep[k]];
    writeFileAtomic(opts.exportLoad, vectorToMatrixMarket(f), [file]);
  }
}

export interface StudyCliOptions extends CommonOptions, CutCliOptions {
  levels?: string;
  ratio?: string;
  maxDofs?: string;
}


export async function runStudy(ctx: CliContext, file: string, opts: StudyCliOptions): Promise<void> {
  checkCutOptions(opts);
  const model = loadModel(ctx, file, opts);
  const outDir = outDirFor(file, opts);
  const levels = opts.levels !== undefined ? Number(opts.levels) : undefined;
  const ratio = opts.ratio !== undefined ? Number(opts.ratio) : undefined;
  if (levels !== undefined && !(Number.isInteger(levels) && levels >= 2 && levels <= 12)) throw new PeakwiseError('usage', `--levels must be an integer from 2 to 12, got "${opts.levels}"`);
  if (ratio !== undefined && !(ratio > 1 && ratio <= 4)) throw new PeakwiseError('usage', `--ratio must be a number above 1 and at most 4, got "${opts.ratio}"`);
  const maxDofs = maxDofsOf(opts);
  const bar = progressBar(opts, 'solves');
  let base: BaseSolve | undefined;
  let study: StudyResult;
  try {
    study = runStudyStage(model, {
      ...(levels !== undefined ? { levels } : {}),
      ...(ratio !== undefined ? { ratio } : {}),
      onProgress: (done, total, label) => bar.update(done, total, label),
      onBase: (b) => { base = b; },
      shouldStop: stopRequested,
      maxDofs,
      maxFactorBytes: defaultFactorBytes(),
    });
  } finally {
    bar.stop();
  }
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
  if (opts.json) {
    process.stdout.write(studyJson(study) + '\n');
    return;
  }
  process.stdout.write(studyTable(study, { color: useColor(opts) }) + '\n');
  process.stdout.write(`  results in ${outDir}: study.json, sites.csv, field.csv, report.html\n`);
}

/** A study stopped by Ctrl-C after writing what it had: the CLI exits with status 130. */
export class StudyInterrupted extends PeakwiseError {
  constructor() {
    super('study', 'interrupted');
    this.name = 'StudyInterrupted';
  }
}

/** study.json text: NaN (an undefined uncertainty) is written as null. */
export function studyJson(study: StudyResult): string {
  return JSON.stringify(study, (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? null : v), 2);
}

function writeStudyOutputs(model: Model, study: StudyResult, base: BaseSolve | undefined, outDir: string, file: string, cut?: CutPlotInput): void {
  const protect = [file];
  writeFileAtomic(join(outDir, 'study.json'), studyJson(study) + '\n', protect);
  writeFileAtomic(join(outDir, 'sites.csv'), sitesCsv(study), protect);
  if (base) {
    const { mesh, field, solution } = base;
    const n = mesh.xy.length / 2;
    const sxx = new Float64Array(n), syy = new Float64Array(n), sxy = new Float64Array(n);
    for (let i = 0; i < n; i++) { sxx[i] = field.stress[3 * i]; syy[i] = field.stress[3 * i + 1]; sxy[i] = field.stress[3 * i + 2]; }
    const columns: Record<string, Float64Array> = { sxx, syy, sxy };
    if (model.state === 'plane-strain') columns.szz = field.szz;
    columns.von_mises = nodalMeasure(field, 'von-mises');
    writeFileAtomic(join(outDir, 'field.csv'), fieldCsv(mesh, solution.u, columns), protect);
    writeFileAtomic(join(outDir, 'report.html'), reportHtml({ model, study, mesh, geometry: base.geometry, field: base.nodal, u: solution.u, checks: recordedChecks(), ...(cut ? { cut } : {}) }), protect);
  }
}
