import { describe, it, expect } from 'vitest';
import { bandColour, bandEdge, bandScale, colourAt, triangleBands } from '../../src/report/index.js';
import { luminance } from './xml.js';

/** Shoelace area of a polygon. */
function area(xs: ArrayLike<number>, ys: ArrayLike<number>, n: number): number {
  let a = 0;
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    a += xs[i] * ys[j] - xs[j] * ys[i];
  }
  return a / 2;
}

describe('iso-band splitting of a linear triangle', () => {
  // v = x on the triangle (0,0) (10,0) (0,10): the band [a, b] is the strip a ≤ x ≤ b
  const scale = bandScale(0, 10, 8);
  const polys: { k: number; xs: number[]; ys: number[] }[] = [];
  triangleBands(0, 0, 0, 10, 0, 10, 0, 10, 0, scale, (k, xs, ys, n) => {
    polys.push({ k, xs: Array.from(xs.subarray(0, n)), ys: Array.from(ys.subarray(0, n)) });
  });

  it('covers the triangle exactly once (band areas sum to the triangle area)', () => {
    const total = polys.reduce((a, p) => a + area(p.xs, p.ys, p.xs.length), 0);
    // exact: 10·10/2 = 50; the clipping is exact up to rounding
    expect(Math.abs(total - 50)).toBeLessThan(1e-9);
  });

  it('keeps every polygon inside its band (v = x stays within [edge k, edge k+1])', () => {
    expect(new Set(polys.map((p) => p.k)).size).toBe(8);
    for (const p of polys) {
      for (const x of p.xs) {
        expect(x).toBeGreaterThanOrEqual(bandEdge(scale, p.k) - 1e-12);
        expect(x).toBeLessThanOrEqual(bandEdge(scale, p.k + 1) + 1e-12);
      }
    }
  });

  it('gives each strip the area of the closed form: ∫ over a ≤ x ≤ b of (10 − x) dx', () => {
    for (const p of polys) {
      const a = bandEdge(scale, p.k), b = bandEdge(scale, p.k + 1);
      const exact = 10 * (b - a) - (b * b - a * a) / 2;
      expect(Math.abs(area(p.xs, p.ys, p.xs.length) - exact)).toBeLessThan(1e-9);
    }
  });

  it('puts a triangle inside one band in that band whole', () => {
    const hits: number[] = [];
    triangleBands(0, 0, 3.1, 1, 0, 3.2, 0, 1, 3.3, scale, (k, _x, _y, n) => hits.push(k, n));
    expect(hits).toEqual([2, 3]); // 3.1…3.3 lies in [2.5, 3.75)
  });
});

describe('band colours', () => {
  it('grow in luminance with the value (viridis is monotone in lightness)', () => {
    const scale = bandScale(-5, 7, 56);
    let prev = -1;
    for (let k = 0; k < scale.n; k++) {
      const l = luminance(bandColour(scale, k));
      expect(l).toBeGreaterThan(prev);
      prev = l;
    }
  });

  it('run from the dark to the light end of the map', () => {
    // viridis end colours #440154 and #fde725 (van der Walt & Smith, matplotlib colormap, 2015)
    expect(colourAt(0)).toBe('#440154');
    expect(colourAt(1)).toBe('#fde725');
  });
});
