/**
 * Issue 19, class 9: small inputs that used to pass without a word. (CSV cells in hexadecimal,
 * binary or with `_` are in test/model/svg-import.test.ts.)
 */
import { describe, expect, it } from 'vitest';
import { ModelError, PeakwiseError } from '../../src/errors.js';
import { parseModel } from '../../src/model/index.js';
import { recover, solve } from '../../src/index.js';
import { sampleCut } from '../../src/sweep/cut.js';

const model = (extra: string, units = 'mm', thickness = '5') => parseModel([
  `units: { length: ${units}, force: N }`,
  'material: { E: 210000, nu: 0.3 }', `thickness: ${thickness}`,
  'plate:', '  outline: [[0, 0], [120, 0], [120, 50], [0, 50]]', '  openings: [ { id: bore, circle: { center: [60, 25], radius: 8 } } ]',
  'supports: [ { where: { x: 0 }, fix: [x, y] } ]',
  'loads: [ { where: { x: 120 }, traction: [20, 0] } ]',
  'mesh: { size: 8 }', extra,
].join('\n'), 'plate.yaml');

describe('readout distance', () => {
  it('larger than the plate (its bounding-box diagonal, 130 mm) is an error at the key', () => {
    let caught: unknown;
    try {
      model('study: { readouts: { distance: 131 } }');
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(ModelError);
    expect((caught as ModelError).keyPath).toBe('study.readouts.distance');
    expect((caught as ModelError).line).toBe(10);
    // 120 × 50 plate: √(120² + 50²) = 130
    expect((caught as ModelError).message).toContain('readout distance 131 mm is larger than the plate (120 × 50 mm, 130 mm across)');
  });
  it('within the plate it is kept', () => {
    expect(model('study: { readouts: { distance: 2 } }').study.readouts.distance).toBe(2);
  });
});

describe('thickness implausible for the length unit', () => {
  const warning = (units: string, t: string) => model('', units, t).warnings?.find((w) => w.keyPath === 'thickness')?.message;
  it('warns like E does: 10 m (meant mm), 0.01 mm (meant m)', () => {
    expect(warning('m', '10')).toBe("thickness 10 m is 10000 mm, outside the usual range of plates (0.05 mm to 5 m); check that it is in m, the model's length unit");
    expect(warning('mm', '0.01')).toContain('thickness 0.01 mm is 0.01 mm, outside the usual range');
  });
  it('is quiet for ordinary plates, and for unknown length units', () => {
    expect(warning('mm', '5')).toBeUndefined();
    expect(warning('in', '0.5')).toBeUndefined();
    expect(warning('m', '0.012')).toBeUndefined();
    expect(warning('furlong', '1000')).toBeUndefined();
  });
});

describe('cut line entirely outside the plate', () => {
  const r = recover(solve(model('')));
  it('is an error, not a table of blanks', () => {
    expect(() => sampleCut(r.mesh, r.field, [130, 0], [130, 50], 11)).toThrow(PeakwiseError);
    expect(() => sampleCut(r.mesh, r.field, [130, 0], [130, 50], 11)).toThrow('none of its 11 sample points lies in the plate');
    // wholly inside the bore
    expect(() => sampleCut(r.mesh, r.field, [58, 25], [62, 25], 5)).toThrow('crosses only an opening');
  });
  it('a line partly outside keeps its inside samples', () => {
    const t = sampleCut(r.mesh, r.field, [100, 25], [140, 25], 5);
    expect(t.samples.map((s) => Number.isFinite(s.sxx))).toEqual([true, true, true, false, false]);
  });
});
