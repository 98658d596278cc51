/**
 * The study with load cases (docs/study.md, "Load cases and the envelope"): the envelope's governing
 * choice on constructed results where the answer is known, and a small plate studied in two cases whose
 * results must scale exactly with the load (linear elasticity: the same meshes, sites and fits, every
 * stress times the load ratio), so the larger case governs every site.
 */
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { caseStudyResult, envelopeOf, runStudy } from '../../src/study/index.js';
import type { SiteResult } from '../../src/study/types.js';
import { holePlateModel } from '../helpers/hole-plate.js';

function site(id: string, verdict: SiteResult['verdict'], value: number, atDistance?: number): SiteResult {
  return {
    id, at: [0, 0], feature: { kind: 'corner', interiorAngleDeg: 270, radius: 0, description: '' },
    levels: [{ h: 1, dofs: 10, peak: 2 * Math.abs(value), peakAt: [0, 0], radius: 1 }],
    verdict, reason: '', estimate: { value, uncertainty: 0.01, observedOrder: 2 },
    growth: { exponent: 0, exponentUncertainty: 0, theory: 0 },
    readouts: atDistance === undefined ? {} : { atDistance },
  };
}

describe('envelope: the governing case', () => {
  it('takes the largest converged value, the largest readout at a singular site, the finest peak where undecided', () => {
    const a = { name: 'a', sites: [site('S1', 'converging', 100), site('S2', 'singular', 0, 50), site('S3', 'undecided', 10)] };
    const b = { name: 'b', sites: [site('S1', 'converging', 120), site('S2', 'singular', 0, 30), site('S3', 'undecided', 4)] };
    const env = envelopeOf([a, b], 'von-mises');
    expect(env.map((e) => [e.site, e.governing, e.value, e.basis])).toEqual([
      ['S1', 'b', 120, 'converged value'],
      ['S2', 'a', 50, 'readout at distance'],
      // undecided: the finest peak (2·|value| here), a: 20 against b: 8
      ['S3', 'a', 20, 'finest peak'],
    ]);
    expect(env[0].byMagnitude).toBe(false);
  });

  it('compares signed measures by magnitude, and only then', () => {
    const tension = { name: 'tension', sites: [site('S1', 'converging', 100)] };
    const compression = { name: 'compression', sites: [site('S1', 'converging', -150)] };
    expect(envelopeOf([tension, compression], 'sxx')[0]).toMatchObject({ governing: 'compression', value: -150, byMagnitude: true });
    // max-principal is compared by value: the larger tension governs
    expect(envelopeOf([tension, compression], 'max-principal')[0]).toMatchObject({ governing: 'tension', byMagnitude: false });
  });

  it('a value whose peak is on the rim of the neighbourhood governs only when every value is', () => {
    const own = { name: 'own', sites: [site('S1', 'converging', 80)] };
    const rim = { name: 'rim', sites: [site('S1', 'converging', 130)] };
    expect(envelopeOf([own, rim], 'von-mises', [[false], [true]])[0].governing).toBe('own');
    expect(envelopeOf([own, rim], 'von-mises', [[true], [true]])[0].governing).toBe('rim');
  });
});

describe('a plate with a hole in two cases', () => {
  const text = holePlateModel('plate with a hole, pulled lightly and hard', `
cases:
  light: [ { where: { x: 100 }, traction: [10, 0] } ]
  hard: [ { where: { x: 100 }, traction: [30, 0] } ]
combinations:
  sum: "light + hard"
mesh: { size: 8, order: 2 }
study: { levels: 3 }
`);
  const study = runStudy(parseModel(text, 'plate.yaml'));

  it('studies the same sites in every case, and every result scales with the load', () => {
    const [light, hard, sum] = study.cases!;
    expect([light.name, hard.name, sum.name]).toEqual(['light', 'hard', 'sum']);
    expect(light.sites.length).toBeGreaterThan(0);
    light.sites.forEach((s, i) => {
      for (const [other, k] of [[hard, 3], [sum, 4]] as const) {
        const o = other.sites[i];
        expect(o.id).toBe(s.id);
        expect(o.verdict).toBe(s.verdict);
        // same meshes, fields times k: the peaks and the fitted value scale to round-off (measured 2e-14 and 5e-14 relative)
        o.levels.forEach((l, j) => expect(Math.abs(l.peak / (k * s.levels[j].peak) - 1)).toBeLessThan(2e-13));
        if (s.verdict === 'converging') expect(Math.abs(o.estimate.value / (k * s.estimate.value) - 1)).toBeLessThan(5e-13);
      }
    });
  });

  it('the combination governs every site (4 × light), and the study shows each site from it', () => {
    for (const e of study.envelope!) expect(e.governing).toBe('sum');
    study.sites.forEach((s) => expect(s.case).toBe('sum'));
    // one case's own result: its sites, its solve, no envelope
    const hard = caseStudyResult(study, 'hard')!;
    expect(hard.envelope).toBeUndefined();
    expect(hard.solution.appliedSum[0]).toBeCloseTo(30 * 60, 9);
    expect(hard.sites.every((s) => s.case === 'hard')).toBe(true);
    expect(caseStudyResult(study, 'nothing')).toBeUndefined();
  });
});
