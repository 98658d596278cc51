import { describe, it, expect } from 'vitest';
import { GeometryError } from '../../src/errors.js';
import { buildGeometry } from '../../src/geometry/index.js';
import type { Plate } from '../../src/model/types.js';
import { L_POINTS, circle, ellipse, plate, poly, rect, rectPoints } from './fixtures.js';

/** Build, expect a GeometryError whose message contains every fragment; return it. */
function fails(p: Plate, ...fragments: string[]): GeometryError {
  let caught: unknown;
  try {
    buildGeometry(p);
  } catch (e) {
    caught = e;
  }
  expect(caught).toBeInstanceOf(GeometryError);
  const err = caught as GeometryError;
  for (const f of fragments) expect(err.message).toContain(f);
  return err;
}

const box = poly(rectPoints(0, 0, 200, 100));

describe('geometry errors name the feature', () => {
  it('a polygon with fewer than 3 vertices', () => {
    const e = fails(plate(poly([[0, 0], [1, 0]])), 'plate.outline', '2 vertices', 'at least 3');
    expect(e.keyPath).toBe('plate.outline');
  });

  it('a collinear outline encloses no area', () => {
    fails(plate(poly([[0, 0], [1, 1], [3, 3], [2, 2]])), 'plate.outline', 'no area');
  });

  it('a zero-length edge (a vertex repeated)', () => {
    const e = fails(plate(poly([[0, 0], [10, 0], [10, 0], [10, 10], [0, 10]])), 'plate.outline[2]', 'zero-length edge', 'plate.outline[1]');
    expect(e.keyPath).toBe('plate.outline[2]');
    fails(plate(box, poly([[10, 10], [20, 10], [20, 20], [10, 10]])), 'plate.openings[0].polygon[0]', 'zero-length edge');
  });

  it('a self-intersecting outline (bow tie) and opening', () => {
    fails(plate(poly([[0, 0], [10, 10], [10, 0], [0, 10]])), 'plate.outline', 'crosses itself', 'plate.outline[0]', 'plate.outline[2]', '(5, 5)');
    fails(plate(box, poly([[50, 50], [70, 70], [70, 50], [50, 70]])), 'plate.openings[0]', 'opening h0', 'crosses itself');
    // a vertex touching another edge also counts
    fails(plate(poly([[0, 0], [20, 0], [20, 20], [10, 0], [0, 20]])), 'crosses itself', '(10, 0)');
    // an edge folding back on its neighbour
    fails(plate(poly([[0, 0], [20, 0], [10, 0], [10, 10]])), 'crosses itself');
  });

  it('openings that overlap or touch each other, whatever their shapes', () => {
    fails(plate(box, circle(50, 50, 10), circle(65, 50, 10)), 'plate.openings[0]', 'opening h0', 'overlaps or touches opening h1', 'plate.openings[1]');
    // exactly tangent circles touch
    fails(plate(box, circle(50, 50, 10), circle(70, 50, 10)), 'overlaps or touches');
    fails(plate(box, ellipse(50, 50, 30, 5, 0), circle(85, 50, 6)), 'overlaps or touches');
    fails(plate(box, rect(100, 50, 40, 20, 5), circle(121, 50, 3)), 'overlaps or touches');
    fails(plate(box, rect(100, 50, 40, 20), poly([[120, 45], [130, 45], [130, 55]])), 'overlaps or touches');
    // a slender rotated ellipse whose tip reaches into a circle
    const tilt = 35;
    const tip: [number, number] = [100 + 30 * Math.cos((tilt * Math.PI) / 180), 50 + 30 * Math.sin((tilt * Math.PI) / 180)];
    fails(plate(box, ellipse(100, 50, 30, 1, tilt), circle(tip[0] + 4.9, tip[1], 5)), 'overlaps or touches');
    // but 0.1 clear of it is fine
    expect(() => buildGeometry(plate(box, ellipse(100, 50, 30, 1, tilt), circle(tip[0] + 5.1, tip[1], 5)))).not.toThrow();
  });

  it('an opening that crosses or touches the outline, or lies outside it', () => {
    const e = fails(plate(box, circle(195, 50, 10)), 'plate.openings[0]', 'opening h0', 'crosses or touches the outline');
    expect(e.keyPath).toBe('plate.openings[0]');
    fails(plate(box, circle(190, 50, 10)), 'crosses or touches the outline', '(200, 50)');
    fails(plate(box, circle(300, 50, 10)), 'plate.openings[0]', 'lies outside the outline');
    // a hole in the notch of an L-bracket: inside the outline's box, outside its material
    fails(plate(poly(L_POINTS), circle(70, 70, 10)), 'lies outside the outline');
    // an opening that contains the whole outline
    fails(plate(poly(rectPoints(0, 0, 10, 10)), circle(5, 5, 50)), 'plate.openings[0]');
  });

  it('an opening nested inside another opening', () => {
    fails(plate(box, rect(100, 50, 80, 60), circle(100, 50, 5)), 'plate.openings[1]', 'opening h1 lies inside opening h0', 'plate.openings[0]');
    fails(plate(box, circle(100, 50, 5), ellipse(100, 50, 40, 30, 10)), 'plate.openings[0]', 'opening h0 lies inside opening h1');
  });

  it('a fillet that does not fit its corner', () => {
    // square 30 × 100: a radius 40 fillet needs 40 along the 30 long edge
    const e = fails(
      plate(poly(rectPoints(0, 0, 100, 30), { 3: 40 })),
      'fillet radius 40 at plate.outline[3] does not fit: it needs 40 along each edge, the edges are only 100 and 30 long',
    );
    expect(e.keyPath).toBe('plate.outline[3]');
    // two fillets sharing the 30 long edge: 20 + 20 > 30, the neighbour's share counts
    fails(
      plate(poly(rectPoints(0, 0, 100, 30), { 1: 20, 2: 20 })),
      'fillet radius 20 at plate.outline[1] does not fit',
      'the edges are only 100 and 10 long',
      'neighbouring fillets',
    );
    // the same in a clockwise polygon opening
    fails(plate(box, poly(rectPoints(50, 40, 30, 20).reverse(), { 1: 25 })), 'fillet radius 25 at plate.openings[0].polygon[1] does not fit');
    fails(plate(box, rect(100, 50, 40, 20, 11)), 'plate.openings[0].rect.round', 'at most half the shorter side, 10');
  });

  it('a fillet that fits its edges but sweeps across a slot', () => {
    // a 2 wide slot cut in from the left edge ends 5 short of the right edge; a radius 30 fillet at
    // the top-right corner passes x = 91.4 at the slot's height (70 + √(30² − 21²)), inside the slot
    const pts: Array<[number, number]> = [[0, 0], [100, 0], [100, 100], [0, 100], [0, 92], [95, 92], [95, 90], [0, 90]];
    expect(() => buildGeometry(plate(poly(pts, { 2: 5 })))).not.toThrow();
    fails(plate(poly(pts, { 2: 30 })), 'plate.outline: the outline crosses or touches itself', 'the fillet at plate.outline[2]');
  });

  it('non-positive or non-finite sizes', () => {
    fails(plate(box, circle(50, 50, 0)), 'plate.openings[0].circle.radius', 'positive');
    fails(plate(box, circle(50, 50, -3)), 'plate.openings[0].circle.radius');
    fails(plate(box, ellipse(50, 50, 10, 0)), 'plate.openings[0].ellipse.b');
    fails(plate(box, ellipse(50, 50, -1, 2)), 'plate.openings[0].ellipse.a');
    fails(plate(box, rect(50, 50, -1, 2)), 'plate.openings[0].rect.width');
    fails(plate(box, rect(50, 50, 10, 0)), 'plate.openings[0].rect.height');
    fails(plate(circle(0, 0, Number.NaN)), 'plate.outline.circle.radius');
    fails(plate(poly(rectPoints(0, 0, 10, 10), { 1: -2 })), 'plate.outline[1].round');
  });

  it('opening ids must be unique and must not be "outline"', () => {
    const p = plate(box, circle(50, 50, 5), circle(150, 50, 5));
    p.openings[1].id = 'h0';
    fails(p, 'plate.openings[1]', "'h0'", 'plate.openings[0]');
    const q = plate(box, circle(50, 50, 5));
    q.openings[0].id = 'outline';
    fails(q, 'plate.openings[0]', 'outline');
  });
});
