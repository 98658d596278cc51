import { describe, expect, it } from 'vitest';
import { assessReported, matchReported, unmatchedPoints, valueAtSize, OTHER_ANALYSIS_RULES } from '../../src/study/other-analysis.js';
import type { SiteResult } from '../../src/study/types.js';
import type { ReportedValue } from '../../src/model/types.js';

/** A site whose ladder follows a law exactly (h = 1, 1/2, …, 1/16). */
function site(law: (h: number) => number, verdict: SiteResult['verdict'], extra: Partial<SiteResult> = {}): SiteResult {
  const levels = [1, 0.5, 0.25, 0.125, 0.0625].map((h) => ({ h, dofs: 100 / h, peak: law(h), peakAt: [0, 0] as [number, number] }));
  return {
    id: 'S1', at: [0, 0], feature: { kind: 'edge', interiorAngleDeg: 180, radius: 0, description: 'edge' }, levels, verdict,
    reason: 'test ladder', estimate: { value: NaN, uncertainty: NaN, observedOrder: NaN }, growth: { exponent: NaN, exponentUncertainty: NaN, theory: 0 },
    readouts: {}, ...extra,
  };
}
const rep = (value: number, size: number, extra: Partial<ReportedValue> = {}): ReportedValue => ({ at: [0, 0], value, size, measure: 'von-mises', keyPath: 'reported[0]', ...extra });
const ctx = { order: 2 as const, measure: 'von-mises' as const, units: { length: 'mm', stress: 'MPa' } };

describe('our value at another mesh\'s size (issue 15 §3)', () => {
  const q = 0.4;
  const singular = site((h) => 100 * h ** -q, 'singular', { growth: { exponent: q, exponentUncertainty: 0, theory: q } });
  it('interpolation in log h is exact for a power law, inside the ladder', () => {
    for (const h of [0.8, 0.3, 0.07]) {
      const v = valueAtSize(singular, h, 2);
      expect('value' in v && v.value).toBeCloseTo(100 * h ** -q, 9);
    }
  });
  it('outside the ladder: the fitted law with a warning, up to the stated factor; refused beyond it', () => {
    const lim = OTHER_ANALYSIS_RULES.extrapolationLimit;
    const out = valueAtSize(singular, 1.5, 2, 'mm');
    expect('value' in out && out.value).toBeCloseTo(100 * 1.5 ** -q, 9);
    expect('warning' in out && out.warning).toMatch(/1\.5× beyond the coarsest level/);
    expect(valueAtSize(singular, 0.0625 / (0.99 * lim), 2)).toHaveProperty('from', 'extrapolated');
    expect(valueAtSize(singular, 1.01 * lim, 2)).toHaveProperty('refused');
    expect(valueAtSize(singular, 0.0625 / (1.01 * lim), 2)).toHaveProperty('refused');
  });
  it('converging: the law φ₀ + αh^p through the end level, p capped at the element order', () => {
    const conv = site((h) => 200 - 10 * h ** 2, 'converging', { estimate: { value: 200, uncertainty: 0.1, observedOrder: 2 } });
    const v = valueAtSize(conv, 1.6, 2);
    expect('value' in v && v.value).toBeCloseTo(200 - 10 * 1.6 ** 2, 9);
  });
});

describe('what a reported value is worth', () => {
  const conv = site((h) => 200 - 20 * h ** 2, 'converging', { estimate: { value: 200, uncertainty: 0.2, observedOrder: 2 } });
  it('converging and on our curve: % low, and the sizes for 1, 2 and 5 % from the error law h^p', () => {
    // at h = 1 our ladder says 180: 10 % low; error ∝ h²: 5 % at 1/√2, 2 % at √0.2, 1 % at √0.1
    const a = assessReported(rep(180, 1), conv, 0, false, ctx);
    expect(a.finding).toBe('low');
    expect(a.words).toMatch(/^≈ 10 % low/);
    expect(a.neededSize!.map((n) => n.size)).toEqual([Math.sqrt(0.1), Math.sqrt(0.2), Math.sqrt(0.5)].map((v) => expect.closeTo(v, 12)));
  });
  it('more than band + tolerance from our value at that size: the models differ, said first', () => {
    const a = assessReported(rep(1.2 * 180, 1), conv, 0, false, ctx);
    expect(a.finding).toBe('models-differ');
    expect(a.words).toMatch(/^the models differ at this spot/);
    expect(a.converged).toBeUndefined();
  });
  it('inside the converged band: converged, no size needed', () => {
    const a = assessReported(rep(200.1, 0.0625), conv, 0, false, ctx);
    expect(a.finding).toBe('converged');
    expect(a.neededSize!.every((n) => n.size === null)).toBe(true);
  });
  it('undecided: what is needed to tell; another measure: not compared', () => {
    const und = site((h) => 100 + Math.sin(10 * h), 'undecided', { advice: 'add levels' });
    const a = assessReported(rep(100, 0.5), und, 0, false, ctx);
    expect(a.finding).toBe('undecided');
    expect(a.words).toMatch(/To tell: add levels$/);
    expect(assessReported(rep(100, 0.5, { measure: 'sxx' }), und, 0, false, ctx).finding).toBe('not-compared');
  });
});

describe('matching a reported point to a site', () => {
  it('nearest within 3 × the larger of the local and the reported size; far points once each', () => {
    const sites = [{ at: [0, 0] as [number, number] }, { at: [10, 0] as [number, number] }];
    const m = matchReported([[1, 0], [8.5, 0], [5, 0], [5, 1e-12]], [0.1, 0.1, 0.1, 0.1], sites, () => 0.5);
    expect(m).toEqual([0, 1, -1, -1]);
    expect(unmatchedPoints([[1, 0], [8.5, 0], [5, 0], [5, 1e-12]], m, 1e-9)).toEqual([[5, 0]]);
    // a coarse other mesh widens the tolerance
    expect(matchReported([[5, 0]], [2], sites, () => 0.5)).toEqual([0]);
  });
});
