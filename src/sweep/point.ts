/**
 * One sweep point: re-parse the model text with the point's parameters and run the study. Also the
 * point key (for resuming) and the JSON form results travel in between threads and files.
 */
import { createHash } from 'node:crypto';
import { parseModel, boundingBox } from '../model/index.js';
import { runStudy } from '../study/index.js';
import type { StudyResult } from '../study/types.js';
import type { SolveLimits } from '../pipeline/index.js';
import { VERSION } from '../version.js';
import type { SweepStudyOptions } from './types.js';

/** What a worker needs for one point (plain data: it crosses a thread boundary). */
export interface PointTask {
  index: number;
  text: string;
  file: string;
  params: Record<string, number>;
  options: SweepStudyOptions;
  /** limits of every solve (they decide whether a point fails, not its numbers: not part of the key) */
  limits?: SolveLimits;
}

export interface PointOutcome {
  study: StudyResult;
  /** outline bounding-box diagonal */
  scale: number;
  seconds: number;
}

/** Key-sorted copy, so {a, b} and {b, a} hash alike. */
function sorted<T extends Record<string, unknown>>(o: T): T {
  return Object.fromEntries(Object.keys(o).sort().filter((k) => o[k] !== undefined).map((k) => [k, o[k]])) as T;
}

/** sha256 (hex) of the model text, the point's parameters, the study options and the tool version. */
export function pointKey(text: string, params: Record<string, number>, options: SweepStudyOptions): string {
  const payload = JSON.stringify({ version: VERSION, text, params: sorted(params), options: sorted(options as Record<string, unknown>) });
  return createHash('sha256').update(payload).digest('hex');
}

/** Run one point in this thread. Throws the stage's PeakwiseError for a bad point. */
export function runPoint(task: Omit<PointTask, 'index'>): PointOutcome {
  const t0 = performance.now();
  const model = parseModel(task.text, task.file, { params: task.params });
  const box = boundingBox(model.plate.outline);
  const study = runStudy(model, { ...task.options, ...(task.limits ? { limits: task.limits } : {}) });
  return { study, scale: Math.hypot(box.width, box.height), seconds: (performance.now() - t0) / 1000 };
}

/** Keys whose numbers may be undefined (NaN) in a study; JSON writes them as null. */
const NUMBER_KEYS = new Set([
  'value', 'uncertainty', 'observedOrder', 'exponent', 'exponentUncertainty', 'theory',
  'atDistance', 'distance', 'average', 'nsif', 'lineAverage', 'lineLength', 'peak', 'h',
  'nsifUncertainty', 'criticalDistance', 'pointMethod', 'lineMethod',
]);

/** JSON text of a value with NaN and ±∞ as null (study.json's convention). */
export function toJson(value: unknown, space?: number): string {
  return JSON.stringify(value, (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? null : v), space);
}

/** Parse JSON written by `toJson`, turning null back into NaN where a study holds a number. */
export function fromJson<T>(text: string): T {
  return JSON.parse(text, (k, v: unknown) => (v === null && NUMBER_KEYS.has(k) ? NaN : v)) as T;
}
