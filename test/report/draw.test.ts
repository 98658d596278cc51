import { describe, it, expect } from 'vitest';
import { c1 } from '../../src/report/draw.js';

// c1 writes picture coordinates to a tenth of a pixel from whole numbers (fast); its text must be
// what JavaScript's own shortest decimal of the rounded value gives.
describe('c1: a coordinate to a tenth', () => {
  it('matches String(Math.round(v · 10) / 10) on edge cases and on a spread of magnitudes', () => {
    const values = [0, -0, 0.04, -0.04, 0.05, -0.05, -0.06, 0.95, -0.95, 9.95, -1.25, 99.95, 123456.75, 1e14, -1e14, 1e16, 1e22, -1e22, NaN, Infinity, -Infinity, 5e-324];
    let seed = 20261204;
    for (let k = 0; k < 20000; k++) {
      seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
      const u = seed / 4294967296;
      values.push((u - 0.5) * 10 ** (k % 9));
    }
    for (const v of values) expect(c1(v)).toBe(String(Math.round(v * 10) / 10));
    expect(c1(-0.04)).toBe('0');
    expect(c1(-1.26)).toBe('-1.3');
    expect(c1(2.05)).toBe(String(Math.round(2.05 * 10) / 10));
  });
});
