import { describe, it, expect } from 'vitest';
import { buildGeometry } from '../../src/geometry/index.js';
import { L_POINTS, circle, ellipse, plate, poly, rect, rectPoints } from './fixtures.js';

// Areas are sums of a handful of closed-form terms, so they must agree to rounding: 1e-13 relative
// leaves room for about a hundred ulps of cancellation in the Green's theorem sum.
const REL = 1e-13;
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('exact plate area', () => {
  it('rectangle minus a circular hole: w·h − πr²', () => {
    // circle area πr² (Archimedes, Measurement of a Circle)
    const g = buildGeometry(plate(poly(rectPoints(0, 0, 800, 400)), circle(300, 150, 45)));
    expect(rel(g.area, 800 * 400 - Math.PI * 45 ** 2)).toBeLessThan(REL);
  });

  it('rectangle minus a rotated elliptical hole: w·h − πab', () => {
    // ellipse area πab (Archimedes, On Conoids and Spheroids, Prop. 4)
    for (const angle of [0, 30, 90, 137.5]) {
      const g = buildGeometry(plate(poly(rectPoints(-50, -20, 300, 160)), ellipse(100, 60, 40, 12, angle)));
      expect(rel(g.area, 300 * 160 - Math.PI * 40 * 12)).toBeLessThan(REL);
    }
  });

  it('rounded rectangle outline and opening: w·h − (4 − π)r²', () => {
    // each corner loses the square r² less the quarter disc πr²/4 [derived]
    const g = buildGeometry(plate(rect(10, 20, 240, 90, 15)));
    expect(rel(g.area, 240 * 90 - (4 - Math.PI) * 15 ** 2)).toBeLessThan(REL);
    const g2 = buildGeometry(plate(poly(rectPoints(0, 0, 800, 400)), rect(400, 200, 300, 150, 25)));
    expect(rel(g2.area, 800 * 400 - (300 * 150 - (4 - Math.PI) * 25 ** 2))).toBeLessThan(REL);
  });

  it('rectangle with round = half the shorter side is a stadium: πr² + 2r(h − 2r), no zero-length lines', () => {
    // stadium = two half discs plus the rectangle between them [derived]
    const r = 20;
    const g = buildGeometry(plate(rect(0, 0, 2 * r, 140, r)));
    expect(rel(g.area, Math.PI * r * r + 2 * r * (140 - 2 * r))).toBeLessThan(REL);
    const lines = g.pieces.filter((p) => p.curve.kind === 'line');
    expect(lines.length).toBe(2); // the two short sides vanished
    expect(g.pieces.length).toBe(6);
    // round = w/2 = h/2: a full disc made of four quarter arcs
    const disc = buildGeometry(plate(rect(0, 0, 2 * r, 2 * r, r)));
    expect(disc.pieces.length).toBe(4);
    expect(rel(disc.area, Math.PI * r * r)).toBeLessThan(REL);
  });

  it('L-bracket: a convex 90° fillet removes (1 − π/4)r², a re-entrant one adds (1 − π/4)r²', () => {
    // [derived] The fillet region is bounded by the two tangent segments (length r each at 90°)
    // and the arc: a square r × r less a quarter disc, (1 − π/4)r². At a convex corner that square
    // is material and the fillet cuts it away; at a re-entrant corner the square lies in the void
    // wedge, the arc's centre is in the void, and the fillet fills the square's corner with
    // material — the area grows by the same amount.
    const base = buildGeometry(plate(poly(L_POINTS))).area;
    expect(rel(base, 100 * 40 + 40 * 60)).toBeLessThan(REL);
    const r = 12;
    const convex = buildGeometry(plate(poly(L_POINTS, { 1: r }))).area;
    const reentrant = buildGeometry(plate(poly(L_POINTS, { 3: r }))).area;
    expect(Math.abs(convex - (base - (1 - Math.PI / 4) * r * r))).toBeLessThan(REL * base);
    expect(Math.abs(reentrant - (base + (1 - Math.PI / 4) * r * r))).toBeLessThan(REL * base);
  });

  it('fillet at a 60° corner removes r²(cot 30° − π/3)', () => {
    // [derived] kite of two right triangles r × r·cot(α/2) less the sector r²(π − α)/2, α = 60°
    const s = 100;
    const tri: Array<[number, number]> = [[0, 0], [s, 0], [s / 2, (s * Math.sqrt(3)) / 2]];
    const sharp = buildGeometry(plate(poly(tri))).area;
    expect(rel(sharp, (Math.sqrt(3) / 4) * s * s)).toBeLessThan(REL);
    const r = 7;
    const rounded = buildGeometry(plate(poly(tri, { 0: r, 1: r, 2: r }))).area;
    const removed = r * r * (1 / Math.tan(Math.PI / 6) - Math.PI / 3);
    expect(rel(rounded, sharp - 3 * removed)).toBeLessThan(REL);
  });

  it('one-shape outlines: disc and ellipse', () => {
    expect(rel(buildGeometry(plate(circle(5, -3, 50))).area, Math.PI * 2500)).toBeLessThan(REL);
    expect(rel(buildGeometry(plate(ellipse(0, 0, 50, 20, 45), circle(10, 0, 5))).area, Math.PI * (1000 - 25))).toBeLessThan(REL);
  });

  it('polygon opening: shoelace area subtracted whichever way it is written', () => {
    const notch: Array<[number, number]> = [[600, 50], [620, 50], [610, 80]];
    for (const pts of [notch, [...notch].reverse()]) {
      const g = buildGeometry(plate(poly(rectPoints(0, 0, 800, 400)), poly(pts)));
      expect(rel(g.area, 800 * 400 - 0.5 * 20 * 30)).toBeLessThan(REL);
    }
  });

  it('bbox and scale', () => {
    const g = buildGeometry(plate(poly(rectPoints(-10, 5, 30, 40))));
    expect(g.bbox).toEqual({ minX: -10, minY: 5, maxX: 20, maxY: 45 });
    expect(g.scale).toBeCloseTo(50, 12); // 3-4-5 triangle scaled by 10
    const c = buildGeometry(plate(circle(1, 2, 3)));
    expect(c.bbox.minX).toBeCloseTo(-2, 14);
    expect(c.bbox.maxY).toBeCloseTo(5, 14);
  });
});
