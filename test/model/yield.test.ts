import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { modelErrorOf } from './helpers.js';

/* material.yield (issue 17): optional, > 0, in the model's stress units, with a unit-mix warning. */
const plate = (material: string) => `
material: ${material}
thickness: 10
plate: { outline: [[0, 0], [100, 0], [100, 50], [0, 50]] }
supports: [{ where: { x: 0 }, fix: [x, y] }]
loads: [{ where: { x: 100 }, traction: [10, 0] }]
`;

const failure = (text: string) => modelErrorOf(text, 'y.yaml');

describe('material.yield', () => {
  it('is absent unless given, and read as a number or an expression', () => {
    expect(parseModel(plate('{ E: 210000, nu: 0.3 }'), 'y.yaml').material).toEqual({ E: 210000, nu: 0.3 });
    expect(parseModel(plate('{ E: 210000, nu: 0.3, yield: 355 }'), 'y.yaml').material).toEqual({ E: 210000, nu: 0.3, yield: 355 });
    expect(parseModel(plate('{ E: 210000, nu: 0.3, yield: "355 * 0.9" }'), 'y.yaml').material.yield).toBeCloseTo(319.5, 12);
  });
  it('must be > 0, with the key and the value in the message', () => {
    const e = failure(plate('{ E: 210000, nu: 0.3, yield: 0 }'));
    expect(e.keyPath).toBe('material.yield');
    expect(e.message).toMatch(/yield stress must be > 0, got 0 MPa/);
    expect(failure(plate('{ E: 210000, nu: 0.3, yield: -5 }')).keyPath).toBe('material.yield');
  });
  it('a yield above 5 % of E (a likely unit mix) is a warning, not an error', () => {
    // 355 MPa steel yield written in Pa against E in MPa: 3.55e8 / 2.1e5 far above any solid's yield strain
    const m = parseModel(plate('{ E: 210000, nu: 0.3, yield: 355000000 }'), 'y.yaml');
    expect(m.warnings?.map((w) => w.keyPath)).toContain('material.yield');
    expect(parseModel(plate('{ E: 210000, nu: 0.3, yield: 355 }'), 'y.yaml').warnings).toBeUndefined();
  });
  it('an unknown material key names yield among the allowed ones', () => {
    expect(failure(plate('{ E: 210000, nu: 0.3, fy: 355 }')).message).toMatch(/yield/);
  });
});
