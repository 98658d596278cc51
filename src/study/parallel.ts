/**
 * The study with its ladder's levels on worker threads (docs/study.md, "Levels in parallel"). The
 * first solve (sites, pictures) and the far-field solve stay in this thread; every level runs the
 * same pure function (level.ts) a serial study runs, on a clone of the same inputs, so a full run
 * gives the serial result bit for bit whatever worker ran which level.
 *
 * - Order: finest level first (the longest), then the next finest, so the last level to finish is
 *   a short one and the workers end together.
 * - Failure: a level that fails ends the ladder below it, as in a serial run (which never reaches
 *   the levels above): the levels finer than the lowest failed one are given up and the result
 *   keeps levels 1 … k, with the same words; a failure of level 1, or a bug, is thrown.
 * - Stop request: polled while levels run; the running levels are given up, the finished ones
 *   kept, and the fit uses the finest run of consecutive finished levels that has at least three
 *   levels (what a verdict needs), else the longest run (the finer one on a tie).
 * - Default: with `jobs` not given, a short ladder (AUTO_PARALLEL_DOFS) stays in this thread.
 * - Memory: the limits hold for all workers together. Each level's dofs are estimated from its size
 *   field before it starts (the same estimate the pipeline checks against the dof cap), its factor
 *   bytes from the first solve's factor scaled by n·ln n; a level is started only while the running
 *   levels' estimates plus its own stay within `maxDofs` and `maxFactorBytes`, or when no other level
 *   runs. Each solve is still checked against the whole limits by itself, as in a serial run, so the
 *   admission changes when a level runs, never its numbers.
 */
import { availableParallelism } from 'node:os';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { isPeakwiseError, PeakwiseError } from '../errors.js';
import type { Model } from '../model/types.js';
import { estimateMeshSize, factorBytes } from '../fem/health.js';
import { baseSizeField, type SolveLimits } from '../pipeline/index.js';
import { PoolCancelled, TaskPool, type PoolRun } from '../pipeline/pool.js';
import type { StudyResult } from './types.js';
import { levelSizeField } from './ladder.js';
import { LEVEL_TASK, type LevelReadings } from './level.js';
import { failedWords, finishStudy, interruptedWords, levelInput, prepareStudy, runStudy, serialLadder, type LadderOutcome, type StudyOptions, type StudySetup } from './run.js';

/**
 * The compiled worker next to this file; absent when running from the TypeScript sources. Its name
 * is unique over the whole program so that the same URL finds it in tsc's dist/study/ and in the
 * bundle's flat dist/bundle/ (DEVELOPERS.md, "Build").
 */
export const STUDY_WORKER_URL = new URL('./study-worker.js', import.meta.url);

/** Levels a convergence verdict needs (verdict.ts: fewer leave a site undecided). */
const FIT_LEVELS = 3;

/** How often a stop request is looked for while levels run, ms. */
const STOP_POLL_MS = 25;

export interface ParallelStudyOptions extends StudyOptions {
  /** worker threads for the levels (1 runs the serial study in this thread); default: see runStudyParallel */
  jobs?: number;
  /** a pool to use (kept open: watch mode keeps its workers warm); otherwise one is made and closed */
  pool?: TaskPool;
}

/** A pool of study workers (the levels' function by name); throws a clear message when dist/ is not built. */
export function studyPool(jobs: number = availableParallelism()): TaskPool {
  if (!existsSync(fileURLToPath(STUDY_WORKER_URL))) {
    throw new PeakwiseError('usage', `the study worker ${fileURLToPath(STUDY_WORKER_URL)} is missing: build with \`npm run build\`, or use one job`);
  }
  return new TaskPool(STUDY_WORKER_URL, jobs);
}

/**
 * Below this many estimated dofs over all levels, a study left to choose (`jobs` not given) solves
 * its levels in this thread: each worker thread loads and compiles the mesher, the solver and the
 * recovery afresh (a few tenths of a second of CPU each), which a short ladder does not win back.
 * A rule of our own, from timing the demo ladders (7–33k dofs a level) with one and two workers.
 */
export const AUTO_PARALLEL_DOFS = 300_000;

/**
 * `runStudy` with the levels on worker threads. `jobs` given: that many (1 runs the serial study in
 * this thread); a `pool`: its workers (kept open); neither: one per core when the ladder is
 * estimated at AUTO_PARALLEL_DOFS or more, else serial. Resolves to the serial study's result.
 */
export async function runStudyParallel(model: Model, opts: ParallelStudyOptions = {}): Promise<StudyResult> {
  const jobs = opts.pool?.size ?? opts.jobs;
  if (jobs !== undefined && !(Number.isInteger(jobs) && jobs >= 1)) throw new PeakwiseError('usage', `jobs must be a whole number ≥ 1, got ${jobs}`);
  if (jobs === 1 && !opts.pool) return runStudy(model, opts);
  // a pool asked for is started before the first solve, so the workers load their modules while this thread works
  let pool = opts.pool ?? (jobs !== undefined ? studyPool(jobs) : undefined);
  try {
    const setup = prepareStudy(model, opts);
    if (!pool) {
      const cores = availableParallelism();
      const total = levelEstimates(setup).reduce((sum, e) => sum + e.dofs, 0);
      if (cores < 2 || total < AUTO_PARALLEL_DOFS) return finishStudy(setup, serialLadder(setup, opts), opts);
      pool = studyPool(cores);
    }
    const ladder = await parallelLadder(setup, pool, opts);
    return finishStudy(setup, ladder, opts);
  } finally {
    if (pool && !opts.pool) await pool.close();
  }
}

/** Estimated dofs and factor bytes of each level (for the admission rule), from the first solve. */
export function levelEstimates(setup: StudySetup): { dofs: number; bytes: number }[] {
  const { problem, cands, h0, ratio, order, first, limits } = setup;
  const base = baseSizeField(problem);
  const d0 = Math.max(first.solution.dofs, 2);
  const b0 = factorBytes(first.solution.nnzL);
  const stop = limits.maxDofs !== undefined ? 4 * limits.maxDofs : Infinity;
  return Array.from({ length: setup.levels }, (_, k) => {
    const dofs = Math.max(estimateMeshSize(problem.geometry, levelSizeField(base, cands, h0, ratio, k), order, stop).dofs, d0);
    return { dofs, bytes: b0 * (dofs / d0) * Math.max(1, Math.log(dofs) / Math.log(d0)) };
  });
}

/** The run of consecutive finished levels the fit uses after a stop request (see the file's note). */
export function keptRun(finished: readonly number[]): { from: number; to: number } {
  const set = new Set(finished);
  const runs: { from: number; to: number }[] = [];
  for (const k of [...set].sort((a, b) => a - b)) {
    const last = runs[runs.length - 1];
    if (last && last.to === k) last.to = k + 1;
    else runs.push({ from: k, to: k + 1 });
  }
  if (runs.length === 0) return { from: 0, to: 0 };
  const enough = runs.filter((r) => r.to - r.from >= FIT_LEVELS);
  if (enough.length > 0) return enough[enough.length - 1];
  let best = runs[0];
  for (const r of runs) if (r.to - r.from >= best.to - best.from) best = r;
  return best;
}

type Settled = { k: number; ok: true; value: LevelReadings } | { k: number; ok: false; error: unknown };

async function parallelLadder(setup: StudySetup, pool: TaskPool, opts: StudyOptions): Promise<LadderOutcome> {
  const { levels, cands, total, limits } = setup;
  if (cands.length === 0) return { readings: [], stopped: '', interrupted: false };
  const estimates = limitsBind(limits) ? levelEstimates(setup) : undefined;
  const pending: number[] = Array.from({ length: levels }, (_, i) => levels - 1 - i); // finest first
  const running = new Map<number, { run: PoolRun<LevelReadings>; settled: Promise<Settled> }>();
  const done = new Map<number, LevelReadings>();
  let lowestFailed = Infinity;
  let failure: unknown;
  let interrupted = false;

  const fits = (k: number): boolean => {
    if (running.size === 0 || !estimates) return true;
    let dofs = estimates[k].dofs, bytes = estimates[k].bytes;
    for (const j of running.keys()) { dofs += estimates[j].dofs; bytes += estimates[j].bytes; }
    return (limits.maxDofs === undefined || dofs <= limits.maxDofs) && (limits.maxFactorBytes === undefined || bytes <= limits.maxFactorBytes);
  };
  const admit = (): void => {
    while (running.size < pool.size) {
      const i = pending.findIndex(fits);
      if (i < 0) return;
      const [k] = pending.splice(i, 1);
      const run = pool.run<LevelReadings>(LEVEL_TASK, levelInput(setup, k));
      const settled = run.result.then((value): Settled => ({ k, ok: true, value }), (error: unknown): Settled => ({ k, ok: false, error }));
      running.set(k, { run, settled });
    }
  };
  /** give up the levels above the lowest failed one: a serial run would never reach them */
  const dropAbove = (kf: number): void => {
    for (let i = pending.length - 1; i >= 0; i--) if (pending[i] > kf) pending.splice(i, 1);
    for (const [k, r] of running) if (k > kf) { r.run.cancel(); running.delete(k); }
  };

  admit();
  while (running.size > 0) {
    let timer: ReturnType<typeof setTimeout> | undefined;
    const tick = opts.shouldStop ? new Promise<undefined>((resolve) => { timer = setTimeout(() => resolve(undefined), STOP_POLL_MS); }) : undefined;
    const next = await Promise.race([...[...running.values()].map((r) => r.settled), ...(tick ? [tick] : [])]);
    if (timer) clearTimeout(timer);
    if (next !== undefined) {
      running.delete(next.k);
      if (next.ok) {
        done.set(next.k, next.value);
        opts.onProgress?.(2 + done.size, total, `level ${next.k + 1} of ${levels}`);
      } else if (!(next.error instanceof PoolCancelled) && next.k < lowestFailed) {
        lowestFailed = next.k;
        failure = next.error;
        dropAbove(next.k);
      }
    }
    if (opts.shouldStop?.()) {
      interrupted = true;
      for (const r of running.values()) r.run.cancel();
      running.clear();
      break;
    }
    admit();
  }

  if (interrupted) {
    const below = [...done.keys()].filter((k) => k < lowestFailed);
    const { from, to } = keptRun(below);
    const readings = Array.from({ length: to - from }, (_, i) => done.get(from + i)!);
    return { readings, interrupted: true, stopped: interruptedWords(from, to) };
  }
  if (lowestFailed < Infinity) {
    if (lowestFailed === 0 || !isPeakwiseError(failure)) throw failure;
    const readings = Array.from({ length: lowestFailed }, (_, k) => done.get(k)!);
    return { readings, interrupted: false, stopped: failedWords(lowestFailed, (failure as Error).message) };
  }
  return { readings: Array.from({ length: levels }, (_, k) => done.get(k)!), interrupted: false, stopped: '' };
}

/** Do the limits bound anything the admission rule must share out? */
function limitsBind(limits: SolveLimits): boolean {
  return limits.maxDofs !== undefined || limits.maxFactorBytes !== undefined;
}
