import { describe, expect, it } from 'vitest';
import { isAboveYield, reportedSites, roundToScale } from '../../src/study/index.js';
import type { SiteResult } from '../../src/study/types.js';

/* The reported form of a study's sites (issue 17): rounded coordinates and the yield flag. */
function site(verdict: SiteResult['verdict'], value: number, at: [number, number] = [0, 0]): SiteResult {
  return {
    id: 'S1', at, verdict, reason: '', readouts: {},
    feature: { kind: 'fillet', interiorAngleDeg: 0, radius: 8, description: '' },
    levels: [{ h: 1, dofs: 10, peak: value, peakAt: at }],
    estimate: { value, uncertainty: 0.1, observedOrder: 2 },
    growth: { exponent: 0, exponentUncertainty: 0, theory: 0 },
  };
}

describe('roundToScale', () => {
  it('drops the binary tail at 1e-9 of the plate size (decimal step 1e-7 for a 170 mm plate)', () => {
    expect(roundToScale(59.999999999999865, 170)).toBe(60);
    expect(roundToScale(90.33900000000001, 170)).toBe(90.339);
    expect(roundToScale(-2.0000000000000004e-14, 170)).toBe(0);
    expect(Object.is(roundToScale(-1e-12, 170), 0)).toBe(true); // no −0
    // a real difference of 3e-7 survives, 3e-8 does not (step 1e-7)
    expect(roundToScale(12.0000003, 170)).toBe(12.0000003);
    expect(roundToScale(12.00000003, 170)).toBe(12);
    // a 1.7 m plate in m: step 1e-9, so mm-level detail is kept exactly
    expect(roundToScale(0.0305000000000001, 1.7)).toBe(0.0305);
  });
  it('passes non-finite values and a missing scale through', () => {
    expect(roundToScale(NaN, 10)).toBeNaN();
    expect(roundToScale(1 / 3, 0)).toBe(1 / 3);
  });
});

describe('yield flag', () => {
  it('flags a converged value above the yield stress, by magnitude', () => {
    expect(isAboveYield(site('converging', 400), 355)).toBe(true);
    expect(isAboveYield(site('converging', -400), 355)).toBe(true);
    expect(isAboveYield(site('converging', 355), 355)).toBe(false);
    expect(isAboveYield(site('converging', 400), undefined)).toBe(false);
  });
  it('never flags a singular or undecided site (no converged value)', () => {
    expect(isAboveYield(site('singular', 4000), 355)).toBe(false);
    expect(isAboveYield(site('undecided', 4000), 355)).toBe(false);
  });
  it('reportedSites sets aboveYield only where it applies and rounds at and peakAt', () => {
    const out = reportedSites([site('converging', 400, [59.999999999999865, 40]), site('converging', 100)], { scale: 170, yieldStress: 355 });
    expect(out[0].aboveYield).toBe(true);
    expect('aboveYield' in out[1]).toBe(false);
    expect(out[0].at).toEqual([60, 40]);
    expect(out[0].levels[0].peakAt).toEqual([60, 40]);
  });
});
