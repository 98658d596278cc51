/**
 * The model stage's entry: text in, Model out. No file I/O — the CLI reads the file.
 */
import { ModelError, type PeakwiseError } from '../errors.js';
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
 * One line for the terminal: `models/x.yaml:12:7 loads[1].where: expected one of …`.
 * ModelErrors carry their own position; for errors of later stages pass the model so the
 * key path can be located.
 */
export function formatModelError(e: PeakwiseError, file: string, model?: Pick<Model, 'sourceMap'>): string {
  let pos: SourcePosition | undefined;
  if (e instanceof ModelError && e.line !== undefined) pos = { line: e.line, col: e.col ?? 1 };
  else if (model && e.keyPath !== undefined) pos = locate(model, e.keyPath);
  const place = pos ? `${file}:${pos.line}:${pos.col}` : file;
  const message = e.message.replace(/\s*[\r\n]+\s*/g, ' ');
  return e.keyPath ? `${place} ${e.keyPath}: ${message}` : `${place}: ${message}`;
}
