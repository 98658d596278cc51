import { describe, expect, it } from 'vitest';
import { ModelError } from '../../src/errors.js';
import { parseModel } from '../../src/model/index.js';

const minimal = `
material: { E: 210000, nu: 0.3 }
thickness: 10
plate:
  outline: [[0, 0], [100, 0], [100, 50], [0, 50]]
supports:
  - { where: { x: 0 }, fix: [x, y] }
loads:
  - { where: { x: 100 }, traction: [10, 0] }
`;
function fails(text: string): ModelError {
  try {
    parseModel(text, 'm.yaml');
  } catch (e) {
    expect(e).toBeInstanceOf(ModelError);
    return e as ModelError;
  }
  throw new Error('expected a ModelError');
}

describe('the piece selector (issue 12 §9)', () => {
  it('reads { piece: [x, y] } for loads and supports, with expressions', () => {
    const m = parseModel(minimal.replace('{ x: 100 }', '{ piece: ["w", 25] }').replace('{ x: 0 }', '{ piece: [0, 20] }') + 'params: { w: 100 }\n', 'm.yaml');
    expect(m.loads[0]).toHaveProperty('where', { kind: 'piece', at: [100, 25] });
    expect(m.supports[0].where).toEqual({ kind: 'piece', at: [0, 20] });
  });
  it('cannot carry a concentrated force (a force needs a point)', () => {
    const e = fails(minimal.replace('{ x: 100 }, traction: [10, 0]', '{ piece: [100, 25] }, force: [10, 0]'));
    expect(e.keyPath).toBe('loads[0].where');
    expect(e.message).toContain('a concentrated force needs a point selector');
  });
});

describe('study.readouts.critical (Taylor 2007: L = (1/π)(ΔK_th/Δσ₀)²)', () => {
  it('computes L from deltaKth and deltaSigma0', () => {
    const m = parseModel(`${minimal}study: { readouts: { critical: { deltaKth: 180, deltaSigma0: 250 } } }\n`, 'm.yaml');
    // (180/250)²/π = 0.165012…
    expect(m.study.readouts.critical).toEqual({ length: (180 / 250) ** 2 / Math.PI, deltaKth: 180, deltaSigma0: 250 });
    expect(m.study.readouts.distance).toBeUndefined();
  });
  it('takes L as given', () => {
    const m = parseModel(`${minimal}study: { readouts: { distance: 0.5, critical: { length: 0.2 } } }\n`, 'm.yaml');
    expect(m.study.readouts).toEqual({ distance: 0.5, critical: { length: 0.2 } });
  });
  const cases: Array<[string, string, string, string]> = [
    ['both forms', '{ length: 0.2, deltaKth: 180 }', 'study.readouts.critical.deltaKth', 'either as length or as deltaKth and deltaSigma0, not both'],
    ['half of the pair', '{ deltaKth: 180 }', 'study.readouts.critical', 'deltaSigma0 is missing'],
    ['empty', '{}', 'study.readouts.critical', 'expected length, or deltaKth and deltaSigma0'],
    ['negative', '{ deltaKth: 180, deltaSigma0: -250 }', 'study.readouts.critical.deltaSigma0', 'must be > 0'],
    ['longer than the plate', '{ deltaKth: 18000, deltaSigma0: 250 }', 'study.readouts.critical.deltaKth', 'is longer than the plate'],
    ['a typo', '{ deltaK: 180, deltaSigma0: 250 }', 'study.readouts.critical.deltaK', "unknown key 'deltaK'"],
  ];
  for (const [name, critical, keyPath, fragment] of cases) {
    it(`refuses ${name}, naming the key`, () => {
      const e = fails(`${minimal}study: { readouts: { critical: ${critical} } }\n`);
      expect(e.keyPath).toBe(keyPath);
      expect(e.message).toContain(fragment);
    });
  }
});
