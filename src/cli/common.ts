/**
 * What every command shares: the run context for error messages, the common options, colours,
 * the stop flag, warnings, reading the model with the command-line overrides, the limits of the
 * options, and the field columns written to field.csv.
 */
import { join } from 'node:path';
import { PeakwiseError } from '../errors.js';
import type { Model, ModelWarning } from '../model/types.js';
import { levelsRule, parseModel, ratioRule } from '../model/index.js';
import type { NodalStress } from '../recovery/types.js';
import { nodalMeasure } from '../recovery/index.js';
import { defaultLimits, type SolveLimits } from '../pipeline/index.js';
import { modelName, readModelText } from './io.js';
import { inputFile, inputsOfRun, modelInputReader, noteInput } from './inputs.js';
import { checkTargetFile, openOutputSet } from './output-set.js';
import { parseMaxDofs } from './options.js';
import { nearestPosition, plain } from './report-error.js';

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

export function positiveNumber(text: string, option: string): number {
  const v = Number(text);
  if (!Number.isFinite(v) || v <= 0) throw new PeakwiseError('usage', `${option} must be a positive number, got "${text}"`);
  return v;
}

/**
 * A numeric option checked by the one rule the model key uses (model/study-rules.ts), so `--levels`
 * and `study.levels`, `--ratio` and `study.ratio` can never disagree.
 */
function ruleOption(option: string, blank: string, rule: (v: number) => string | undefined) {
  return (text: string | undefined): number | undefined => {
    if (text === undefined) return undefined;
    const v = Number(text);
    const broken = text.trim() === '' ? blank : rule(v);
    if (broken !== undefined) throw new PeakwiseError('usage', `${option} ${broken}, got "${text}"`);
    return v;
  };
}

/** `--levels` of study and sweep, by the rule of the model's `study.levels`. */
export const levelsOption = ruleOption('--levels', 'must be a whole number', levelsRule);

/** `--ratio` of study and sweep, by the rule of the model's `study.ratio`. */
export const ratioOption = ruleOption('--ratio', 'must be a number', ratioRule);

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

/**
 * The limits of a command: `--max-dofs` (default 2 000 000), half of this machine's memory for
 * one factor, the residual limit. One object, handed whole to solve, adapt, study and sweep.
 */
export function limitsOf(opts: { maxDofs?: string }): Required<SolveLimits> {
  return defaultLimits(opts.maxDofs !== undefined ? parseMaxDofs(opts.maxDofs) : undefined);
}

/** Read, parse and apply the command-line overrides. */
export function loadModel(ctx: CliContext, file: string, opts: CommonOptions, params?: Record<string, number>): Model {
  ctx.file = file;
  const text = readModelText(file);
  // files the model refers to (outlines, displacement tables) sit beside it; every file read is
  // an input of the run: never an output target, part of the run id (src/cli/inputs.ts)
  noteInput(inputFile(file, 'model file', text));
  const { readFile } = modelInputReader(file);
  const model = parseModel(text, file, params ? { params, readFile } : { readFile });
  ctx.model = model;
  refuseOutputsOntoInputs(opts);
  if (opts.order !== undefined) model.mesh.order = opts.order === '1' ? 1 : 2;
  if (opts.size !== undefined) model.mesh.size = positiveNumber(opts.size, '--size');
  return model;
}

/**
 * Open the run's result folder (src/cli/output-set.ts): folder rules on real paths, the folder
 * made, its lock taken; writes into it then become files of one stamped result set, completed by
 * run.json when the command ends (main.ts).
 */
export function outDirFor(file: string, opts: CommonOptions, command: string): string {
  const outDir = opts.out ?? join('out', modelName(file));
  openOutputSet({
    outDir,
    modelFile: file,
    inputs: inputsOfRun(),
    identity: { command, model: file, inputs: inputsOfRun(), options: opts as Record<string, unknown> },
    notice: (line) => emitWarnings([line], opts),
  });
  return outDir;
}

/** Explicit output files (--svg, --export-matrix, --export-load) are checked against the inputs before any work. */
function refuseOutputsOntoInputs(opts: CommonOptions): void {
  const o = opts as Record<string, unknown>;
  for (const [key, option] of [['svg', '--svg'], ['exportMatrix', '--export-matrix'], ['exportLoad', '--export-load']] as const) {
    const target = o[key];
    if (typeof target === 'string') checkTargetFile(target, `${option} ${target}`);
  }
}

/**
 * field.csv columns of a recovered field: σxx, σyy, τxy, σzz in plane strain, von Mises. In an
 * axisymmetric section x, y are r, z, the first three are σr, σz, τrz and `stheta` is the hoop stress.
 */
export function fieldColumns(model: Pick<Model, 'state'>, field: NodalStress): Record<string, Float64Array> {
  const n = field.stress.length / 3;
  const sxx = new Float64Array(n), syy = new Float64Array(n), sxy = new Float64Array(n);
  for (let i = 0; i < n; i++) { sxx[i] = field.stress[3 * i]; syy[i] = field.stress[3 * i + 1]; sxy[i] = field.stress[3 * i + 2]; }
  const columns: Record<string, Float64Array> = { sxx, syy, sxy };
  if (model.state === 'plane-strain') columns.szz = field.szz;
  if (model.state === 'axisymmetric') columns.stheta = field.szz;
  columns.von_mises = nodalMeasure(field, 'von-mises');
  return columns;
}

export function fmt(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e5 || a < 1e-3) return v.toExponential(3);
  return Number(v.toPrecision(5)).toString();
}

/** A study stopped by Ctrl-C after writing what it had: the CLI exits with status 130. */
export class StudyInterrupted extends PeakwiseError {
  constructor() {
    super('study', 'interrupted');
    this.name = 'StudyInterrupted';
  }
}

/** study.json text: NaN (an undefined uncertainty) is written as null. */
export function studyJson(value: unknown): string {
  return JSON.stringify(value, (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? null : v), 2);
}
