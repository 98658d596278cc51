/**
 * Several right-hand sides on one factor (issue 14 part B): the block sweeps (groups of twelve, eight or
 * four, a short group padded with zero sides) do each column's arithmetic in the order of the single solve, so every
 * result must equal `solveFactor` of its side bit for bit; and each solves A x = b (residual check).
 */
import { describe, expect, it } from 'vitest';
import { analyze, factorize, residualNorm, residualNorms, solveFactor, solveFactorMany } from '../../src/linalg/index.js';
import { gridKronecker, seededRandom } from './helpers.js';

describe('solveFactorMany', () => {
  const { A, rowXY } = gridKronecker(30, 20);
  const F = factorize(A, analyze(A, undefined, { rowXY }));
  const rand = seededRandom(7);
  const sides = Array.from({ length: 21 }, () => Float64Array.from({ length: A.n }, () => rand() - 0.5));

  for (const m of [0, 1, 2, 3, 4, 5, 8, 9, 11, 12, 13, 21]) {
    it(`${m} sides equal ${m} single solves bit for bit`, () => {
      const many = solveFactorMany(F, sides.slice(0, m));
      expect(many.length).toBe(m);
      many.forEach((x, r) => expect(Array.from(x)).toEqual(Array.from(solveFactor(F, sides[r]))));
    });
  }

  it('each result solves its system, and the residuals agree with one-at-a-time residuals', () => {
    const xs = solveFactorMany(F, sides);
    const together = residualNorms(A, xs, sides);
    xs.forEach((x, r) => {
      expect(together[r]).toBe(residualNorm(A, x, sides[r]));
      // a well-conditioned grid matrix: measured about 1e-16
      expect(together[r]).toBeLessThan(1e-13);
    });
  });

  it('refuses a side of the wrong length or with a non-finite entry, naming the side', () => {
    expect(() => solveFactorMany(F, [sides[0], new Float64Array(3)])).toThrow(/right-hand side 1 has length 3/);
    const bad = Float64Array.from(sides[0]);
    bad[5] = NaN;
    expect(() => solveFactorMany(F, [sides[0], sides[1], bad])).toThrow(/right-hand side 2, entry 5/);
  });
});
