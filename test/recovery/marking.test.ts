import { describe, it, expect } from 'vitest';
import { dorflerMark } from '../../src/recovery/index.js';

// Dörfler (1996) bulk marking; the numbers are a worked example by hand.
describe('Dörfler marking', () => {
  const etaSq = [0.1, 0.4, 0.04, 0.25, 0.06, 0.15]; // the test's values, shuffled
  it.each([
    [0.5, 2],
    [0.75, 3],
    [0.85, 4],
  ])('θ = %f marks %i elements, largest first', (theta, count) => {
    const marked = dorflerMark(etaSq, theta);
    expect(marked.length).toBe(count);
    expect(Array.from(marked.slice(0, 3))).toEqual([1, 3, 5].slice(0, count));
  });
  it('θ = 1 marks everything', () => expect(dorflerMark(etaSq, 1).length).toBe(6));
});
