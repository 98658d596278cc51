/**
 * Load cases and combinations in the model file (docs/model-format.md, "Load cases"): the cases' loads
 * and displacement values, combination factors from linear expressions, and every refusal with its key path.
 */
import { describe, expect, it } from 'vitest';
import { ModelError } from '../../src/errors.js';
import { linearForm, loadCasesOf, parseModel } from '../../src/model/index.js';

const HEAD = `
title: strip with cases
params: { F: 100, g: 2 }
material: { E: 200000, nu: 0.3 }
thickness: 1
plate: { outline: [[0, 0], [100, 0], [100, 20], [0, 20]] }
`;
const SUPPORTS = `
supports:
  - { where: { x: 0 }, fix: [x, y] }
  - { id: jack, where: { x: 100 }, displace: [0, null] }
`;
const CASES = `
cases:
  dead: [ { where: { y: 20 }, traction: [0, -1] } ]
  pull: { loads: [ { where: { point: [100, 10] }, force: [F, 0] } ], displace: { jack: [0.01, null] } }
`;

function modelError(text: string): ModelError {
  try {
    parseModel(text, 'cases.yaml');
  } catch (e) {
    if (e instanceof ModelError) return e;
    throw e;
  }
  throw new Error('expected a ModelError');
}

describe('load cases', () => {
  it('reads each case with its own loads and displacement values; every case holds the same dofs', () => {
    const m = parseModel(HEAD + SUPPORTS + CASES + 'combinations: { uls: "1.35*dead + 1.5*pull", half: "(dead - pull)/g" }\n', 'cases.yaml');
    expect(m.cases!.map((c) => c.name)).toEqual(['dead', 'pull']);
    expect(m.cases![0].loads.map((l) => l.keyPath)).toEqual(['cases.dead[0]']);
    expect(m.cases![1].loads.map((l) => l.keyPath)).toEqual(['cases.pull.loads[0]']);
    // a case that does not name the jack holds it at zero; pull gives its own value
    expect(m.cases![0].supports[1].displace).toEqual({ kind: 'values', x: 0 });
    expect(m.cases![1].supports[1].displace).toEqual({ kind: 'values', x: 0.01 });
    // Model.loads holds every case's loads (where loads act: nodes, sites)
    expect(m.loads.length).toBe(2);
    expect(m.combinations).toEqual([
      { name: 'uls', expression: '1.35*dead + 1.5*pull', terms: [{ case: 'dead', factor: 1.35 }, { case: 'pull', factor: 1.5 }], keyPath: 'combinations.uls' },
      { name: 'half', expression: '(dead - pull)/g', terms: [{ case: 'dead', factor: 0.5 }, { case: 'pull', factor: -0.5 }], keyPath: 'combinations.half' },
    ]);
  });

  it('a model without cases is one implicit case of its loads and supports', () => {
    const m = parseModel(HEAD + SUPPORTS + 'loads: [ { where: { x: 100 }, traction: [1, 0] } ]\n', 'one.yaml');
    expect(m.cases).toBeUndefined();
    const cases = loadCasesOf(m);
    expect(cases.length).toBe(1);
    expect(cases[0].loads).toBe(m.loads);
    expect(cases[0].supports).toBe(m.supports);
  });

  const refusals: [string, string, string, string][] = [
    ['top-level loads beside cases', HEAD + SUPPORTS + CASES + 'loads: [ { where: { x: 100 }, traction: [1, 0] } ]\n', 'loads', 'every load belongs to a case'],
    ['combinations without cases', HEAD + SUPPORTS + 'loads: [ { where: { x: 100 }, traction: [1, 0] } ]\ncombinations: { a: "2*b" }\n', 'combinations', 'add cases'],
    ['a case prescribing a direction the support leaves free', HEAD + SUPPORTS + 'cases:\n  a: { displace: { jack: [0.1, 0.2] } }\n', 'cases.a.displace.jack', 'every case holds the same dofs'],
    ['a case giving values to a fixed support', HEAD + 'supports:\n  - { id: wall, where: { x: 0 }, fix: [x, y] }\ncases:\n  a: { loads: [ { where: { x: 100 }, traction: [1, 0] } ], displace: { wall: [0.1, 0] } }\n', 'cases.a.displace.wall', 'holds with fix'],
    ['an unknown support id', HEAD + SUPPORTS + 'cases:\n  a: { displace: { jak: [0.1, null] } }\n', 'cases.a.displace.jak', 'did you mean'],
    ['a non-zero support value with cases', HEAD + 'supports:\n  - { where: { x: 0 }, fix: [x, y] }\n  - { id: jack, where: { x: 100 }, displace: [0.1, null] }\n' + CASES, 'supports[1].displace', 'counted once per case'],
    ['a case with nothing in it', HEAD + SUPPORTS + 'cases:\n  a: { loads: [] }\n', 'cases.a', 'no loads'],
    ['a case name that is a param', HEAD + SUPPORTS + 'cases:\n  F: [ { where: { x: 100 }, traction: [1, 0] } ]\n', 'cases.F', 'also a param'],
    ['a case name with a minus', HEAD + SUPPORTS + 'cases:\n  side-pull: [ { where: { x: 100 }, traction: [1, 0] } ]\n', 'cases.side-pull', 'side_pull'],
    ['a combination named like a case', HEAD + SUPPORTS + CASES + 'combinations: { dead: "2*pull" }\n', 'combinations.dead', 'also a case'],
    ['a product of cases', HEAD + SUPPORTS + CASES + 'combinations: { c: "dead*pull" }\n', 'combinations.c', 'multiplies cases together'],
    ['a case to a power', HEAD + SUPPORTS + CASES + 'combinations: { c: "dead^2" }\n', 'combinations.c', 'power'],
    ['division by a case', HEAD + SUPPORTS + CASES + 'combinations: { c: "1/dead" }\n', 'combinations.c', 'divides by a case'],
    ['a function of a case', HEAD + SUPPORTS + CASES + 'combinations: { c: "abs(dead)" }\n', 'combinations.c', 'not linear'],
    ['a constant term', HEAD + SUPPORTS + CASES + 'combinations: { c: "dead + 1" }\n', 'combinations.c', 'constant term'],
    ['an unknown case name', HEAD + SUPPORTS + CASES + 'combinations: { c: "1.35*daed" }\n', 'combinations.c', "did you mean 'dead'"],
    ['a load error inside a case', HEAD + SUPPORTS + 'cases:\n  a: [ { where: { x: 100 }, traction: [1] } ]\n', 'cases.a[0].traction', 'point'],
  ];
  for (const [what, text, keyPath, fragment] of refusals) {
    it(`refuses ${what} at ${keyPath}`, () => {
      const e = modelError(text);
      expect(e.keyPath).toBe(keyPath);
      expect(e.message).toContain(fragment);
    });
  }
});

describe('linear form of a combination', () => {
  it('collects factors through parentheses, params, functions of constants and repeated names', () => {
    const f = linearForm('1.35*(dead + 0.5*w) - w/4 + sqrt(4)*dead + k*w', ['dead', 'w'], { k: 3 });
    expect(f.get('dead')).toBeCloseTo(3.35, 14);
    expect(f.get('w')).toBeCloseTo(1.35 * 0.5 - 0.25 + 3, 14);
  });
});
