/**
 * One limits object, honoured the same way by a solve, the adaptive loop, the study and the
 * sweep (issue 13 deliverable 2), and one rule for the study's levels and ratio in the loader,
 * the command line and the study.
 */
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { runStudy } from '../../src/study/index.js';
import { runSweep } from '../../src/sweep/index.js';
import { LimitError } from '../../src/fem/health.js';
import { adaptiveSolve, checkLimits, problemOf, solveProblem } from '../../src/pipeline/index.js';
import { farFieldPlateText, runCli } from './helpers.js';

const text = farFieldPlateText(true);
const model = () => parseModel(text, 'far-field-plate.yaml');

function limitOf(f: () => unknown): string | undefined {
  try {
    f();
  } catch (e) {
    if (e instanceof LimitError) return e.limit;
    throw e;
  }
  return undefined;
}

describe('limits', () => {
  it('are validated once: a limit that is not a positive number is refused', () => {
    expect(() => checkLimits({ maxDofs: 0 })).toThrow(/maxDofs must be a whole number > 0/);
    expect(() => checkLimits({ maxFactorBytes: -1 })).toThrow(/maxFactorBytes/);
    expect(() => solveProblem(problemOf(model()), { residualLimit: Number.NaN })).toThrow(/residualLimit/);
  });

  it('a solve refuses a mesh above the dof cap (before meshing) and a factor above the memory cap', () => {
    const problem = problemOf(model());
    const dofs = solveProblem(problem).solution.dofs;
    expect(limitOf(() => solveProblem(problem, { maxDofs: Math.floor(dofs / 4) }))).toBe('dofs');
    expect(limitOf(() => solveProblem(problem, { maxFactorBytes: 1024 }))).toBe('memory');
    expect(limitOf(() => solveProblem(problem, { maxDofs: 4 * dofs, maxFactorBytes: 1e12 }))).toBeUndefined();
  });

  it('the adaptive loop honours the factor-memory cap: on the first mesh an error, on a refined one a stop', () => {
    const problem = problemOf(model());
    expect(limitOf(() => adaptiveSolve(problem, { targetPercent: 0.1 }, { maxFactorBytes: 1024 }))).toBe('memory');
    const free = adaptiveSolve(problem, { targetPercent: 0.1, maxCycles: 2 });
    expect(free.cycles).toHaveLength(2);
    // room for the first factor (stored ≈ 1.25 nnz(L), 10 bytes an entry) but not for a mesh of twice the dofs
    const first = solveProblem(problem).solution.nnzL;
    const capped = adaptiveSolve(problem, { targetPercent: 0.1, maxCycles: 2 }, { maxFactorBytes: 10 * 1.6 * first });
    expect(capped.stoppedBy).toBe('memory');
    expect(capped.cycles).toHaveLength(1);
  });

  it('the study and the sweep pass them to every solve', async () => {
    expect(limitOf(() => runStudy(model(), { limits: { maxDofs: 200 } }))).toBe('dofs');
    expect(limitOf(() => runStudy(model(), { limits: { maxFactorBytes: 1024 } }))).toBe('memory');
    await expect(runSweep(text, 'far-field-plate.yaml', [{ name: 'r', values: [8] }], { jobs: 0, limits: { maxDofs: 200 } })).rejects.toThrow(/degrees of freedom.*above --max-dofs 200/);
  });
});

describe('study levels and ratio: one rule', () => {
  const withStudy = (s: string) => text.replace('study: { levels: 3 }', `study: ${s}`);

  it('the loader, the study and the command line accept 1 level and refuse 13, with the same words', async () => {
    expect(parseModel(withStudy('{ levels: 1 }'), 'a.yaml').study.levels).toBe(1);
    expect(() => parseModel(withStudy('{ levels: 13 }'), 'a.yaml')).toThrow(/refinement levels must be a whole number from 1 to 12, got 13/);
    expect(() => runStudy(model(), { levels: 13 })).toThrow(/study levels must be a whole number from 1 to 12, got 13/);
    const r = await runCli(['study', 'models/l-bracket-sharp.yaml', '--levels', '13', '--quiet']);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/--levels must be a whole number from 1 to 12, got "13"/);
  });

  it('a one-level study runs and leaves every site undecided (three levels are needed for a verdict)', () => {
    const r = runStudy(model(), { levels: 1 });
    expect(r.sites.length).toBeGreaterThan(0);
    for (const s of r.sites) {
      expect(s.levels).toHaveLength(1);
      expect(s.verdict).toBe('undecided');
    }
  });

  it('the loader, the study and the command line accept a ratio of 4 and refuse 5, with the same words', async () => {
    expect(parseModel(withStudy('{ ratio: 4 }'), 'a.yaml').study.ratio).toBe(4);
    expect(() => parseModel(withStudy('{ ratio: 5 }'), 'a.yaml')).toThrow(/refinement ratio must be > 1 \(the size shrinks by this factor per level\) and at most 4, got 5/);
    expect(() => runStudy(model(), { ratio: 5 })).toThrow(/study ratio must be > 1 .* and at most 4, got 5/);
    const r = await runCli(['sweep', 'models/l-bracket-sharp.yaml', '--vary', 'r=0,2', '--ratio', '5', '--quiet']);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/--ratio must be > 1 .* and at most 4, got "5"/);
  });
});
