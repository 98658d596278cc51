/**
 * Levels in parallel (issue 16 §1): the ladder's levels on worker threads give the serial study's
 * result byte for byte — the built binary's study.json (its one clock reading, timings.totalS,
 * masked), sites.csv and report.html — and the library's stop and failure paths keep the levels a
 * serial run would keep. Runs the compiled code (dist/): the library's workers load dist/study/study-worker.js, the binary's dist/bundle/study-worker.js.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { keptRun } from '../../src/study/parallel.js';
import type { TaskPool } from '../../src/pipeline/pool.js';
import { bin, root } from '../helpers/bin.js';

type StudyModule = typeof import('../../src/study/index.js');
type ModelModule = typeof import('../../src/model/index.js');

const modelFile = join(root, 'models', 'l-bracket-sharp.yaml');
const out = mkdtempSync(join(tmpdir(), 'peakwise-parallel-'));

function run(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [bin, ...args], { cwd: root, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' }, timeout: 240_000 }, (err, stdout, stderr) => {
      resolve({ code: err ? (typeof err.code === 'number' ? err.code : -1) : 0, stdout, stderr });
    });
  });
}

/** study.json with its one clock reading fixed */
const maskClock = (text: string): string => text.replace(/"totalS": [0-9.e+-]+/, '"totalS": 0');

afterAll(() => rmSync(out, { recursive: true, force: true }));

describe('the binary: --jobs 1, 2 and 3 write the same bytes', () => {
  it('study.json (clock masked), sites.csv and report.html of the L-bracket demo are identical', async () => {
    const runs: { json: string; csv: string; html: string }[] = [];
    for (const jobs of [1, 2, 3]) {
      const dir = join(out, `jobs${jobs}`);
      const r = await run(['study', modelFile, '--out', dir, '--quiet', '--jobs', String(jobs)]);
      expect(r.stderr).toBe('');
      expect(r.code).toBe(0);
      runs.push({
        json: maskClock(readFileSync(join(dir, 'study.json'), 'utf8')),
        csv: readFileSync(join(dir, 'sites.csv'), 'utf8'),
        html: readFileSync(join(dir, 'report.html'), 'utf8'),
      });
    }
    // the demo exercises every per-level path: six levels, singular and converging sites, the far-field
    // solve and the flat peaks' extents (from the finest level's boundary trace)
    const study = JSON.parse(runs[0].json) as { sites: { verdict: string; levels: unknown[]; extent?: unknown }[] };
    expect(study.sites.some((s) => s.verdict === 'singular')).toBe(true);
    expect(study.sites.some((s) => s.verdict === 'converging')).toBe(true);
    expect(study.sites.some((s) => s.extent !== undefined)).toBe(true);
    expect(study.sites.every((s) => s.levels.length === 6)).toBe(true);
    for (const r of runs.slice(1)) {
      expect(r.json).toBe(runs[0].json);
      expect(r.csv).toBe(runs[0].csv);
      expect(r.html).toBe(runs[0].html);
    }
  }, 300_000);

  it('--jobs must be a whole number from 1 to 256', async () => {
    const r = await run(['study', modelFile, '--out', join(out, 'bad'), '--quiet', '--jobs', '0']);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/--jobs must be a whole number from 1 to 256, got "0"/);
  });
});

describe('the library: stop requests and failed levels', () => {
  let S: StudyModule;
  let M: ModelModule;
  const text = readFileSync(modelFile, 'utf8');
  const model = () => M.parseModel(text, modelFile);
  let serial: ReturnType<StudyModule['runStudy']>;

  beforeAll(async () => {
    S = (await import(pathToFileURL(join(root, 'dist', 'study', 'index.js')).href)) as StudyModule;
    M = (await import(pathToFileURL(join(root, 'dist', 'model', 'index.js')).href)) as ModelModule;
    serial = S.runStudy(model());
  });

  it('a stop request keeps the finished levels: the kept run is the finest run of ≥ 3 (else the longest), each level the serial one', async () => {
    const finished: number[] = [];
    const stopped = await S.runStudyParallel(model(), {
      jobs: 2,
      onProgress: (_d, _t, label) => {
        const m = /^level (\d+) of/.exec(label);
        if (m) finished.push(Number(m[1]) - 1);
      },
      shouldStop: () => finished.length >= 2,
    });
    expect(stopped.interrupted).toBe(true);
    expect(finished.length).toBeGreaterThanOrEqual(2);
    const { from, to } = keptRun(finished);
    expect(to - from).toBeGreaterThanOrEqual(1);
    stopped.sites.forEach((site, i) => {
      // a level's readings do not depend on which worker ran it, nor on what ran beside it
      expect(site.levels).toEqual(serial.sites[i].levels.slice(from, to));
      expect(site.reason).toMatch(/interrupted/);
    });
  });

  it('a stop request before any level ends keeps no level and marks the study interrupted', async () => {
    const r = await S.runStudyParallel(model(), { jobs: 2, shouldStop: () => true });
    expect(r.interrupted).toBe(true);
    expect(r.sites.every((s) => s.levels.length === 0)).toBe(true);
  });

  it('a dof cap that the finer levels break ends the ladder where a serial run ends it, with the same words', async () => {
    const dofs = serial.sites[0].levels.map((l) => l.dofs);
    // between level 3 and level 4 (the cap is checked on an estimate before meshing and on the count after)
    const limits = { maxDofs: Math.round(0.5 * (dofs[2] + dofs[3])) };
    const one = S.runStudy(model(), { limits });
    const two = await S.runStudyParallel(model(), { jobs: 2, limits });
    expect(one.sites[0].levels.length).toBeLessThan(6);
    expect(one.sites[0].reason).toMatch(/failed .*fitted on \d levels/);
    expect(maskClock(JSON.stringify(two, null, 2))).toBe(maskClock(JSON.stringify(one, null, 2)));
  });
});

describe('memory limits hold for all workers together', () => {
  it('a level starts only while the running levels\' estimates and its own fit the factor-memory cap (or alone); the result is the serial one', async () => {
    const S = (await import(pathToFileURL(join(root, 'dist', 'study', 'index.js')).href)) as StudyModule;
    const M = (await import(pathToFileURL(join(root, 'dist', 'model', 'index.js')).href)) as ModelModule;
    const text = readFileSync(modelFile, 'utf8');
    const probe = S.prepareStudy(M.parseModel(text, modelFile));
    const est = S.levelEstimates(probe);
    // the estimates grow with the level (finer meshes, larger factors)
    for (let k = 1; k < est.length; k++) expect(est[k].bytes).toBeGreaterThan(est[k - 1].bytes);
    // room for the finest level alone, or for a few of the coarser ones together
    const limits = { maxFactorBytes: 1.2 * est[est.length - 1].bytes };
    const real = S.studyPool(3);
    const running = new Set<number>();
    const starts: { k: number; with: number[] }[] = [];
    const counting = {
      size: real.size,
      run(name: string, input: { k: number }) {
        starts.push({ k: input.k, with: [...running] });
        running.add(input.k);
        const r = real.run(name, input);
        return { result: r.result.finally(() => running.delete(input.k)), cancel: r.cancel };
      },
    } as unknown as TaskPool;
    let two;
    try {
      two = await S.runStudyParallel(M.parseModel(text, modelFile), { pool: counting, limits });
    } finally {
      await real.close();
    }
    const one = S.runStudy(M.parseModel(text, modelFile), { limits });
    expect(maskClock(JSON.stringify(two, null, 2))).toBe(maskClock(JSON.stringify(one, null, 2)));
    expect(starts.map((s) => s.k).sort()).toEqual([0, 1, 2, 3, 4, 5]);
    expect(starts[0].k).toBe(5); // finest first
    for (const s of starts) {
      const inFlight = [s.k, ...s.with].reduce((sum, k) => sum + est[k].bytes, 0);
      if (s.with.length > 0) expect(inFlight, `level ${s.k} beside ${s.with}`).toBeLessThanOrEqual(limits.maxFactorBytes);
    }
    // the budget shares out, it does not only serialise: some coarser levels ran side by side
    expect(starts.some((s) => s.with.length > 0)).toBe(true);
  }, 180_000);
});

describe('the kept run after a stop request', () => {
  it('prefers the finest run with the three levels a verdict needs, else the longest run, the finer on a tie', () => {
    expect(keptRun([])).toEqual({ from: 0, to: 0 });
    expect(keptRun([5, 4])).toEqual({ from: 4, to: 6 });
    expect(keptRun([0, 1, 2, 5])).toEqual({ from: 0, to: 3 });
    expect(keptRun([0, 1, 2, 4, 5, 6])).toEqual({ from: 4, to: 7 });
    expect(keptRun([0, 3, 4])).toEqual({ from: 3, to: 5 });
    expect(keptRun([1, 3])).toEqual({ from: 3, to: 4 });
  });
});

describe('a sweep shares the factor-memory cap among its workers', () => {
  it('with two workers each point gets half: a finest level that fits the whole cap but not half of it fails there', async () => {
    type SweepModule = typeof import('../../src/sweep/index.js');
    const S = (await import(pathToFileURL(join(root, 'dist', 'study', 'index.js')).href)) as StudyModule;
    const M = (await import(pathToFileURL(join(root, 'dist', 'model', 'index.js')).href)) as ModelModule;
    const W = (await import(pathToFileURL(join(root, 'dist', 'sweep', 'index.js')).href)) as SweepModule;
    const text = readFileSync(modelFile, 'utf8');
    // the load changes no mesh: both points have the same factors, the finest level's the largest. Its size as
    // the solver counts it (stored entries, with the supernodes' padding) is found by bisection on the cap
    const setup = S.prepareStudy(M.parseModel(text, modelFile), { levels: 3 });
    const finestFits = (cap: number): boolean => {
      try {
        S.studyLevel({ ...S.levelInput(setup, 2), limits: { maxFactorBytes: cap } }, setup.problem);
        return true;
      } catch (e) {
        if (e instanceof Error && /factorising/.test(e.message)) return false;
        throw e;
      }
    };
    let lo = 1, hi = 1 << 30;
    while (hi / lo > 1.005) { const mid = Math.sqrt(lo * hi); if (finestFits(mid)) hi = mid; else lo = mid; }
    // the whole cap holds the finest level (and so every solve); half of it does not
    const limits = { maxFactorBytes: 1.01 * hi };
    const axes = [{ name: 'tau', values: [6, 12] }];
    const alone = await W.runSweep(text, modelFile, axes, { levels: 3, jobs: 1, limits });
    for (const p of alone.points) expect(p.study.sites.every((s) => s.levels.length === 3)).toBe(true);
    let shared: Awaited<ReturnType<SweepModule['runSweep']>> | undefined;
    let failure = '';
    try {
      shared = await W.runSweep(text, modelFile, axes, { levels: 3, jobs: 2, limits });
    } catch (e) {
      failure = e instanceof Error ? e.message : String(e);
    }
    if (shared) {
      // the coarser solves fit half the cap: the finest level failed, the ladder kept the two below it
      for (const p of shared.points) {
        for (const s of p.study.sites) {
          expect(s.levels.length).toBeLessThan(3);
          expect(s.reason).toMatch(/level \d failed \(factorising .* above the .* allowed/);
        }
      }
    } else {
      // or even the first solve needs more than half: the point fails with the memory message
      expect(failure).toMatch(/factorising .* above the .* allowed/);
    }
  }, 240_000);
});
