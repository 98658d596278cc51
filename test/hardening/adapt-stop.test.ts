/**
 * `solve --adapt` and Ctrl-C (issue 19, class 2): the adaptive loop asks `shouldStop` after every
 * finished cycle and ends on that cycle. The binary's side (worker, SIGINT, files written, exit
 * 130) is in output-safety.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { adaptiveSolve, type AdaptiveCycleResult } from '../../src/pipeline/index.js';
import { lProblem } from '../recovery/lshape-setup.js';

const input = lProblem(1, 0.3);

describe('adaptive loop stop requests', () => {
  it('a stop after cycle 1 returns exactly the result of cycle 1 of the uninterrupted loop', () => {
    const full: AdaptiveCycleResult[] = [];
    const whole = adaptiveSolve(input, { targetPercent: 0.01, maxCycles: 3, onCycle: (_c, r) => full.push(r) }, { maxDofs: 6000 });
    expect(whole.cycles.length).toBe(3);
    let asked = 0;
    const stopped = adaptiveSolve(input, { targetPercent: 0.01, maxCycles: 3, shouldStop: () => ++asked >= 2 }, { maxDofs: 6000 });
    expect(stopped.stoppedBy).toBe('stopped');
    expect(stopped.cycles.length).toBe(2);
    expect(asked).toBe(2); // asked once per finished cycle, never before the first one
    // the loop is deterministic: the kept result is the full run's second mesh and solution
    expect(stopped.solution.dofs).toBe(full[1].solution.dofs);
    expect(Array.from(stopped.solution.u)).toEqual(Array.from(full[1].solution.u));
    expect(stopped.estimate.errorPercent).toBe(whole.cycles[1].errorPercent);
  });
  it('a stop requested before the first cycle ends still keeps that first cycle', () => {
    const res = adaptiveSolve(input, { targetPercent: 0.01, shouldStop: () => true });
    expect(res.stoppedBy).toBe('stopped');
    expect(res.cycles.length).toBe(1);
  });
  it('reaching the target wins over a stop request on the same cycle', () => {
    const res = adaptiveSolve(input, { targetPercent: 99, shouldStop: () => true });
    expect(res.stoppedBy).toBe('target');
  });
});
