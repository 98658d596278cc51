/**
 * Runs a sweep: the points of the cartesian product, each a full study, on a pool of worker
 * threads (one per core by default), reusing the results an optional cache already holds. The
 * cache is how the CLI resumes from `<out>/points/*.json`; this module itself touches no files
 * except loading the compiled worker script.
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { ModelError, PeakwiseError, type ErrorStage } from '../errors.js';
import { parseModel } from '../model/index.js';
import { VERSION } from '../version.js';
import { matchSites } from './match.js';
import { fromJson, pointKey, runPoint, toJson, type PointOutcome, type PointTask } from './point.js';
import type { SweepPoint, SweepResult, SweepStudyOptions, VaryAxis } from './types.js';
import { cartesian } from './values.js';
import type { WorkerReply } from './sweep-worker.js';
import { checkLimits, type SolveLimits } from '../pipeline/index.js';

/** Where finished points are kept between runs (the CLI's is a folder of JSON files). */
export interface PointCache {
  get(key: string): PointOutcome | undefined;
  put(key: string, params: Record<string, number>, outcome: PointOutcome): void;
}

export interface SweepOptions extends SweepStudyOptions {
  /** worker threads; default one per core. 0 runs every point in this thread. */
  jobs?: number;
  cache?: PointCache;
  /** after each point: points done (reused included), total, estimated seconds left (NaN at first) */
  onProgress?(done: number, total: number, secondsLeft: number): void;
  /** asked before each new point is handed out; true stops the sweep after the running points */
  shouldStop?(): boolean;
  /** limits of every solve of every point (dof cap, factor-memory cap, residual limit; default: none) */
  limits?: SolveLimits;
  /**
   * Run only the points of one shard: point i (0-based, in cartesian order) belongs to shard
   * i mod count. The result then holds that shard's points; their point files, together with those
   * of the other shards, make the whole sweep (docs/sweep.md, "Spreading a sweep over machines").
   */
  shard?: Shard;
}

/** Shard `index` (0-based) of `count`. */
export interface Shard {
  index: number;
  count: number;
}

/** `k/n` (k from 1 to n) as a shard, or a usage error naming the option. */
export function parseShard(text: string, option = '--shard'): Shard {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  const k = m ? Number(m[1]) : NaN;
  const n = m ? Number(m[2]) : NaN;
  if (!(Number.isSafeInteger(n) && n >= 1 && n <= 100_000 && Number.isSafeInteger(k) && k >= 1 && k <= n)) {
    throw new PeakwiseError('usage', `${option} must be k/n with whole numbers 1 ≤ k ≤ n ≤ 100000 (shard k of n), got "${text}"`);
  }
  return { index: k - 1, count: n };
}

/**
 * The compiled worker next to this file; absent when running from the TypeScript sources. Its name
 * is unique over the whole program so that the same URL finds it in tsc's dist/sweep/ and in the
 * bundle's flat dist/bundle/ (DEVELOPERS.md, "Build").
 */
export const WORKER_URL = new URL('./sweep-worker.js', import.meta.url);

function paramsText(params: Record<string, number>): string {
  return Object.entries(params).map(([k, v]) => `${k} = ${v}`).join(', ');
}

function pointError(params: Record<string, number>, e: WorkerReply & { type: 'error' }): Error {
  const { stage, message, keyPath, line, col, ours } = e.error;
  const text = `sweep point ${paramsText(params)}: ${message}`;
  if (!ours) return new Error(text);
  if (stage === 'model') return new ModelError(text, keyPath, line, col);
  return new PeakwiseError(stage as ErrorStage, text, keyPath);
}

function withPointContext(params: Record<string, number>, e: unknown): unknown {
  if (e instanceof ModelError) return new ModelError(`sweep point ${paramsText(params)}: ${e.message}`, e.keyPath, e.line, e.col);
  if (e instanceof PeakwiseError) return new PeakwiseError(e.stage, `sweep point ${paramsText(params)}: ${e.message}`, e.keyPath);
  return e;
}

/**
 * Run the study of `text` at every combination of `axes`. The first combination is parsed here
 * first, so an unknown parameter name or a bad value fails before any thread starts. A point that
 * fails stops the sweep with that point's error (finished points stay in the cache).
 */
export async function runSweep(text: string, file: string, axes: VaryAxis[], opts: SweepOptions = {}): Promise<SweepResult> {
  const t0 = performance.now();
  const combos = cartesian(axes);
  const options: SweepStudyOptions = {};
  if (opts.levels !== undefined) options.levels = opts.levels;
  if (opts.ratio !== undefined) options.ratio = opts.ratio;
  if (opts.order !== undefined) options.order = opts.order;
  if (opts.size !== undefined) options.size = opts.size;
  const limits = opts.limits ? checkLimits({ ...opts.limits }) : undefined;
  let title: string;
  try {
    title = parseModel(text, file, { params: combos[0] }).title;
  } catch (e) {
    throw withPointContext(combos[0], e);
  }
  const points: (SweepPoint | undefined)[] = new Array(combos.length);
  const pending: PointTask[] = [];
  let done = 0;
  const shard = opts.shard;
  if (shard && !(Number.isInteger(shard.count) && shard.count >= 1 && Number.isInteger(shard.index) && shard.index >= 0 && shard.index < shard.count)) {
    throw new PeakwiseError('usage', `shard ${shard.index + 1} of ${shard.count} does not exist`);
  }
  const mine = (index: number): boolean => !shard || index % shard.count === shard.index;
  const total = combos.filter((_p, i) => mine(i)).length;
  combos.forEach((params, index) => {
    if (!mine(index)) return;
    const key = pointKey(text, params, options);
    const hit = opts.cache?.get(key);
    if (hit) {
      points[index] = { index, params, key, scale: hit.scale, study: hit.study, reused: true, seconds: 0 };
      done++;
    } else {
      pending.push({ index, text, file, params, options, ...(limits ? { limits } : {}) });
    }
  });
  const reused = done;
  const jobs = Math.max(0, Math.min(opts.jobs ?? availableParallelism(), pending.length));
  // the factor-memory cap holds for the workers together: each point's studies get an equal share
  // (a point is a whole study, solved level after level in its worker; docs/sweep.md, "Threads and memory")
  if (jobs > 1 && limits?.maxFactorBytes !== undefined) {
    for (const t of pending) t.limits = { ...limits, maxFactorBytes: limits.maxFactorBytes / jobs };
  }
  let computeS = 0;
  let computed = 0;
  const tStart = performance.now();
  const finish = (task: PointTask, outcome: PointOutcome): void => {
    const key = pointKey(text, task.params, options);
    opts.cache?.put(key, task.params, outcome);
    points[task.index] = { index: task.index, params: task.params, key, scale: outcome.scale, study: outcome.study, reused: false, seconds: outcome.seconds };
    done++;
    computed++;
    computeS += outcome.seconds;
    // time left: the wall time per computed point so far, times the points still to do
    const perPoint = (performance.now() - tStart) / 1000 / computed;
    opts.onProgress?.(done, total, perPoint * (total - done));
  };
  opts.onProgress?.(done, total, NaN);
  if (pending.length > 0 && jobs === 0) {
    for (const task of pending) {
      if (opts.shouldStop?.()) break;
      let outcome: PointOutcome;
      try {
        // through the JSON text, as a worker's reply and a point file are: a point computed here
        // and one read back must be the same value, so that a resumed sweep, or one merged from
        // shards, writes the same files as one run
        outcome = fromJson<PointOutcome>(toJson(runPoint(task)));
      } catch (e) {
        throw withPointContext(task.params, e);
      }
      finish(task, outcome);
    }
  } else if (pending.length > 0) {
    if (!existsSync(fileURLToPath(WORKER_URL))) {
      throw new PeakwiseError('usage', `the sweep worker ${fileURLToPath(WORKER_URL)} is missing: build with \`npm run build\`, or pass jobs: 0 to run in this thread`);
    }
    await runPool(pending, jobs, finish, opts.shouldStop);
  }
  void computeS;
  const finished = points.filter((p): p is SweepPoint => p !== undefined);
  const interrupted = finished.length < total;
  return {
    tool: 'peakwise',
    version: VERSION,
    model: { title, file },
    axes,
    points: finished,
    families: matchSites(finished),
    reused,
    totalS: (performance.now() - t0) / 1000,
    ...(interrupted ? { interrupted: true } : {}),
  };
}

/** Hand tasks to `jobs` workers, one at a time each; reject on the first failed point. */
function runPool(tasks: PointTask[], jobs: number, finish: (task: PointTask, outcome: PointOutcome) => void, shouldStop?: () => boolean): Promise<void> {
  return new Promise((resolve, reject) => {
    const queue = tasks.slice();
    const byIndex = new Map(tasks.map((t) => [t.index, t]));
    const workers: Worker[] = [];
    let running = 0;
    let failed = false;
    const stopping = new Set<Worker>();
    const stop = (w: Worker): void => {
      stopping.add(w);
      void w.terminate();
    };
    const stopAll = (): void => {
      for (const w of workers) stop(w);
    };
    const feed = (w: Worker): void => {
      if (shouldStop?.()) queue.length = 0;
      const next = queue.shift();
      if (!next) {
        stop(w);
        if (running === 0 && !failed) resolve();
        return;
      }
      running++;
      w.postMessage(next);
    };
    for (let j = 0; j < jobs; j++) {
      const w = new Worker(WORKER_URL);
      workers.push(w);
      w.on('message', (reply: WorkerReply) => {
        running--;
        if (failed) return;
        const task = byIndex.get(reply.index)!;
        if (reply.type === 'error') {
          failed = true;
          stopAll();
          reject(pointError(task.params, reply));
          return;
        }
        try {
          finish(task, fromJson<PointOutcome>(reply.json));
        } catch (e) {
          failed = true;
          stopAll();
          reject(e);
          return;
        }
        feed(w);
      });
      w.on('exit', (code) => {
        if (failed || stopping.has(w)) return;
        failed = true;
        stopAll();
        reject(new Error(`a sweep worker stopped unexpectedly (exit code ${code})`));
      });
      w.on('error', (e) => {
        if (failed) return;
        failed = true;
        stopAll();
        reject(e);
      });
      feed(w);
    }
  });
}
