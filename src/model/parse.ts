/**
 * The model stage's entry: text in, Model out. No file I/O — the CLI reads the file.
 */
import { MeshError, ModelError, type PeakwiseError } from '../errors.js';
import { buildModel } from './build.js';
import { firstIssueError, nearest } from './issues.js';
import { parsePath } from './keypath.js';
import { evaluateParams } from './params.js';
import { ModelFileSchema } from './schema.js';
import { readYaml } from './source.js';
import type { Model, SourcePosition } from './types.js';

export interface ParseOptions {
  /** parameter values that replace those in the file (sweeps); each must exist there */
  params?: Record<string, number>;
  /**
   * Reads a file the model refers to (imported outlines, displacement tables), given the path
   * as written in the model (relative to the model file's folder). Without it, such models
   * fail with a message naming the file.
   */
  readFile?: (path: string) => string;
}

/**
 * Parse, evaluate and validate a model file (docs/model-format.md). Throws ModelError whose
 * message is the part after the key path; `formatModelError` gives the full line.
 */
export function parseModel(text: string, file: string, options: ParseOptions = {}): Model {
  const source = readYaml(text);
  const checked = ModelFileSchema.safeParse(source.data, { reportInput: true });
  if (!checked.success) throw firstIssueError(checked.error, source.data, source);
  const locateValue = (keyPath: string): SourcePosition => nearest(source.valueAt, parsePath(keyPath));
  // zod's record drops a `__proto__` key silently; refuse it rather than lose a param
  const rawParams = (source.data as { params?: unknown }).params;
  if (rawParams && typeof rawParams === 'object' && Object.hasOwn(rawParams, '__proto__')) {
    const pos = locateValue('params.__proto__');
    throw new ModelError("'__proto__' cannot be a parameter name", 'params.__proto__', pos.line, pos.col);
  }
  const params = evaluateParams(checked.data.params ?? {}, options.params, locateValue);
  return buildModel(checked.data, file, params, source.valueAt, options.readFile);
}

/**
 * Best file position for a key path: the path itself, else the nearest parent recorded
 * in the model's source map (`loads[1].where.x` → `loads[1].where` → `loads[1]` → …).
 */
export function locate(model: Pick<Model, 'sourceMap'>, keyPath: string): SourcePosition {
  return nearest(model.sourceMap, parsePath(keyPath));
}

/**
 * The key path of the model entry that asks for a node at `at` (a point load or support, a
 * listed study site), for an error of a later stage that knows only the point. The nearest one
 * within rounding of the point (the mesher works about the plate's centre and adds it back).
 */
export function pointKeyPath(model: Pick<Model, 'loads' | 'supports' | 'study'>, at: readonly [number, number]): string | undefined {
  const tol = 1e-9 * Math.max(1, Math.abs(at[0]), Math.abs(at[1]));
  let best: string | undefined;
  let bestD = Infinity;
  const consider = (p: readonly [number, number], keyPath: string): void => {
    const d = Math.hypot(p[0] - at[0], p[1] - at[1]);
    if (d <= tol && d < bestD) { bestD = d; best = keyPath; }
  };
  model.loads.forEach((l, i) => { if ('where' in l && l.where.kind === 'point') consider(l.where.at, `${l.keyPath || `loads[${i}]`}.where.point`); });
  model.supports.forEach((s, i) => { if (s.where.kind === 'point') consider(s.where.at, `${s.keyPath || `supports[${i}]`}.where.point`); });
  if (Array.isArray(model.study.sites)) model.study.sites.forEach((p, i) => consider(p, `study.sites[${i}]`));
  return best;
}

/**
 * One line for the terminal: `models/x.yaml:12:7 loads[1].where: expected one of …`.
 * ModelErrors carry their own position; for errors of later stages pass the model so the
 * key path can be located.
 */
export function formatModelError(e: PeakwiseError, file: string, model?: Pick<Model, 'sourceMap'> & Partial<Pick<Model, 'loads' | 'supports' | 'study'>>): string {
  let pos: SourcePosition | undefined;
  // an error about a point (a required node outside the plate): the entry that asked for it
  const keyPath = e.keyPath ?? (e instanceof MeshError && e.at && model?.loads && model.supports && model.study
    ? pointKeyPath({ loads: model.loads, supports: model.supports, study: model.study }, e.at)
    : undefined);
  if (e instanceof ModelError && e.line !== undefined) pos = { line: e.line, col: e.col ?? 1 };
  else if (model && keyPath !== undefined) pos = locate(model, keyPath);
  const place = pos ? `${file}:${pos.line}:${pos.col}` : file;
  let message = e.message.replace(/\s*[\r\n]+\s*/g, ' ');
  // the other entry of a conflict (two supports on one dof): its line too
  if (model) for (const other of e.related ?? []) message += ` (${other} is at line ${locate(model, other).line})`;
  return keyPath ? `${place} ${keyPath}: ${message}` : `${place}: ${message}`;
}
