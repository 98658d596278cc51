import { describe, it, expect } from 'vitest';
import { threeLevelFit, observedOrderVariableRatio, logLogSlope, incrementExponent, judgeSite } from '../../src/study/index.js';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('Richardson + GCI arithmetic (Roache 1998; a worked triple, checked by hand from the formulas)', () => {
  it('0.97050, 0.96854, 0.96178, r = 2 → p = 1.786170, f_ext = 0.971300, GCI₁₂ = 0.1031 %, GCI₂₃ = 0.3562 %', () => {
    const f = threeLevelFit(0.9705, 0.96854, 0.96178, 2);
    expect(rel(f.p, 1.78617)).toBeLessThan(1e-6);
    expect(rel(f.fExt, 0.9713)).toBeLessThan(1e-6);
    expect(Math.abs(f.gciFine * 100 - 0.1031)).toBeLessThan(5e-5); // printed to 4 digits
    expect(Math.abs(f.gciCoarse * 100 - 0.3562)).toBeLessThan(5e-5);
    expect(f.kind).toBe('monotone');
  });
  it('synthetic singular f = h^−0.455516 (h = 1, 1/2, 1/4) → p = −0.455516 and R > 1 (divergent; Stern et al. 2001)', () => {
    const f = (h: number) => Math.pow(h, -0.455516);
    const fit = threeLevelFit(f(0.25), f(0.5), f(1), 2);
    expect(rel(fit.p, -0.455516)).toBeLessThan(1e-9);
    expect(fit.R).toBeGreaterThan(1);
    expect(fit.kind).toBe('divergent');
  });
  it('oscillatory sequence has R < 0', () => {
    expect(threeLevelFit(1.0, 1.01, 0.98, 2).kind).toBe('oscillatory');
  });
  it('Celik et al. (2008) variable-ratio order reduces to the constant-ratio one and recovers a known p', () => {
    const g = (h: number) => 2 + 0.3 * h ** 1.5;
    expect(observedOrderVariableRatio(g(1), g(2), g(4), 2, 2)).toBeCloseTo(1.5, 10);
    expect(observedOrderVariableRatio(g(1), g(1.5), g(2.7), 1.5, 1.8)).toBeCloseTo(1.5, 8);
  });
});

describe('log–log and increment exponents', () => {
  it('pure power law: slope = −q exactly, zero scatter', () => {
    const h = [1, 0.5, 0.25, 0.125];
    const s = logLogSlope(h, h.map((x) => 3 * x ** -0.4));
    expect(s.slope).toBeCloseTo(-0.4, 12);
    expect(s.slopeSe).toBeLessThan(1e-12);
  });
  it('increments remove the regular part: f = 5 + 2h^−0.5 gives q = 0.5 exactly', () => {
    const h = [1, 0.5, 0.25, 0.125, 0.0625];
    const inc = incrementExponent(h, h.map((x) => 5 + 2 * x ** -0.5));
    expect(inc.q).toBeCloseTo(0.5, 12);
    expect(inc.sameSign).toBe(true);
  });
});

describe('verdict rules (docs/study.md)', () => {
  const h = [1, 0.5, 0.25, 0.125, 0.0625];
  it('synthetic singular sequence h^−0.4555 + regular part → singular with q = 0.4555', () => {
    const v = judgeSite(h, h.map((x) => 1.5 + x ** -0.455516), 2, 2, 0.455516, 're-entrant corner 270°');
    expect(v.verdict).toBe('singular');
    expect(v.growth.exponent).toBeCloseTo(0.455516, 9);
    expect(v.reason).toContain('as theory predicts');
    // no value is offered for a singular site (no fake Kt): its peak is not a stress
    expect(Number.isNaN(v.estimate.value)).toBe(true);
  });
  it('converging sequence f = 3 + 0.2 h² → converging to 3 with p = 2, exact extrapolation, band the finest spread', () => {
    const f = h.map((x) => 3 + 0.2 * x * x);
    const v = judgeSite(h, f, 2, 2, 0);
    expect(v.verdict).toBe('converging');
    // least-squares φ₀ + αh^p over the finest four levels (Eça & Hoekstra 2014) recovers the limit
    expect(v.estimate.value).toBeCloseTo(3, 9);
    expect(v.estimate.observedOrder).toBeCloseTo(2, 6);
    // 1.25·ε (ε = 0.2·h₁²) is below the floor, so the band is the spread of the finest three peaks
    expect(v.estimate.uncertainty).toBeCloseTo(f[2] - f[4], 9);
    expect(v.estimate.components?.discretisation).toBeCloseTo(f[2] - f[4], 9);
    // no far-field solve in a unit call: the component is "not assessed", not zero
    expect(Number.isNaN(v.estimate.components?.farField)).toBe(true);
    expect(v.reason).toContain('far field not assessed');
    // the three-grid GCI history still shrinks level after level
    for (let k = 1; k < v.history.length; k++) expect(v.history[k].uncertainty).toBeLessThan(v.history[k - 1].uncertainty);
  });
  it('converging where theory predicts a singularity: says so', () => {
    const v = judgeSite(h, h.map((x) => 3 + 0.2 * x * x), 2, 2, 0.4555, 're-entrant corner 270°');
    expect(v.verdict).toBe('converging');
    expect(v.reason).toContain('theory predicts a singularity');
  });
  it('singular with a different exponent than theory: says they disagree', () => {
    const v = judgeSite(h, h.map((x) => x ** -0.25), 2, 2, 0.5, 'crack tip');
    expect(v.verdict).toBe('singular');
    expect(v.reason).toContain('disagrees');
  });
  it('oscillating sequence → undecided, reason "oscillating"', () => {
    const v = judgeSite(h, [3.1, 2.9, 3.08, 2.93, 3.06], 2, 2, 0);
    expect(v.verdict).toBe('undecided');
    expect(v.reason).toMatch(/^oscillating/);
    expect(v.advice).toBeTruthy();
  });
  it('shrinking oscillation within 1 % → converging, the band at least the spread of the finest three (Stern et al. 2001 class)', () => {
    // finest three: 691.91, 691.34 (R = ε21/ε32 = (691.34 − 691.91)/(691.91 − 690.44) = −0.39)
    const v = judgeSite(h, [673.87, 687.53, 690.44, 691.91, 691.34], 2, 2, 0);
    expect(v.verdict).toBe('converging');
    expect(v.reason).toContain('oscillations');
    expect(v.estimate.uncertainty).toBeGreaterThanOrEqual(691.91 - 690.44 - 1e-12);
    // the band holds every one of the finest three peaks
    for (const p of [690.44, 691.91, 691.34]) expect(Math.abs(p - v.estimate.value)).toBeLessThanOrEqual(v.estimate.uncertainty);
  });
  it('swings that do not shrink but stay within 1 % → converging, and the reason says so', () => {
    // finest three 125.36, 126.15, 125.22: R = (125.22 − 126.15)/(126.15 − 125.36) = −1.18
    const v = judgeSite(h, [110.46, 124.09, 125.36, 126.15, 125.22], 2, 1, 0);
    expect(v.verdict).toBe('converging');
    expect(v.reason).toContain('not yet shrinking');
    expect(v.estimate.uncertainty).toBeGreaterThanOrEqual(126.15 - 125.22 - 1e-12);
    for (const p of [125.36, 126.15, 125.22]) expect(Math.abs(p - v.estimate.value)).toBeLessThanOrEqual(v.estimate.uncertainty);
  });
  it('the same oscillation where theory predicts a singularity stays undecided', () => {
    const v = judgeSite(h, [673.87, 687.53, 690.44, 691.91, 691.34], 2, 2, 0.4555, 're-entrant corner 270°');
    expect(v.verdict).toBe('undecided');
  });
  it('three rising levels where theory predicts a bounded stress → undecided, not singular', () => {
    const h3 = [1, 0.5, 0.25];
    const rising = h3.map((x) => 1.5 + x ** -0.455516);
    const v = judgeSite(h3, rising, 2, 2, 0);
    expect(v.verdict).toBe('undecided');
    expect(v.reason).toContain('theory predicts a bounded stress');
    // the same three levels at a 270° corner (Williams 1952: q = 0.4555) are read as singular
    expect(judgeSite(h3, rising, 2, 2, 0.455516, 're-entrant corner 270°').verdict).toBe('singular');
  });
  it('two levels → undecided, too few levels', () => {
    const v = judgeSite([1, 0.5], [3, 3.1], 2, 2, 0);
    expect(v.verdict).toBe('undecided');
    expect(v.reason).toContain('too few levels');
  });
  it('very slow convergence (p = 0.3) → undecided, not yet asymptotic', () => {
    const v = judgeSite(h, h.map((x) => 3 - x ** 0.3), 2, 2, 0);
    expect(v.verdict).toBe('undecided');
    expect(v.reason).toContain('not yet asymptotic');
  });
});
