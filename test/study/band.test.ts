import { describe, expect, it } from 'vitest';
import {
  BAND_RULES, ecaHoekstraBand, farFieldHalfWidth, finestSpread, fixedOrderFit, freeOrderFit, judgeSite,
} from '../../src/study/index.js';
import { seededRandom } from '../helpers/random.js';

/*
 * The least-squares band of L. Eça & M. Hoekstra, "A procedure for the estimation of the numerical
 * uncertainty of CFD calculations based on grid refinement studies", J. Comput. Phys. 262 (2014)
 * 104–130, with the choices of docs/study.md ("Bands"), and its coverage as a measured property.
 */
const ladder = (n: number, r = 2) => Array.from({ length: n }, (_, k) => Math.pow(r, -k));

describe('least-squares fits of the error expansion', () => {
  it('the two-term fit φ₀ + α₁h + α₂h² returns the limit of an exact two-term sequence, scatter 0', () => {
    const h = ladder(5);
    const fit = fixedOrderFit(h, h.map((x) => 5 + 0.3 * x + 0.7 * x * x), [1, 2], true);
    expect(fit.limit).toBeCloseTo(5, 12);
    expect(fit.scatter).toBeLessThan(1e-12);
  });
  it('the free-order fit recovers p = 1.37 and the limit of f = 2 − 0.4 h^1.37, weighted and not', () => {
    const h = ladder(6);
    for (const weighted of [false, true]) {
      const fit = freeOrderFit(h, h.map((x) => 2 - 0.4 * x ** 1.37), weighted);
      expect(fit.orders[0]).toBeCloseTo(1.37, 6);
      expect(fit.limit).toBeCloseTo(2, 8);
    }
  });
  it('standard deviation √(Σr²/(n − n_p)) of the unweighted fixed-order fit (Eça & Hoekstra 2014)', () => {
    // x = h/h₁ = 4, 3, 2, 1 and residuals δ(1, −1, −1, 1), orthogonal to 1 and x: the fit is exactly
    // 10 + 2x and U_s = √(4δ²/(4 − 2)) = δ√2
    const h = [4, 3, 2, 1], d = 0.01, res = [1, -1, -1, 1];
    const fit = fixedOrderFit(h, h.map((x, i) => 10 + 2 * x + d * res[i]), [1], false);
    expect(fit.limit).toBeCloseTo(10, 12);
    expect(fit.scatter).toBeCloseTo(d * Math.SQRT2, 12);
  });
});

describe('the band (Eça & Hoekstra 2014; Roache 1998 safety factors; docs/study.md)', () => {
  it('order inside the good range (0.5 ≤ p < 2.1 for LST) with small scatter: F_s = 1.25', () => {
    const h = ladder(5);
    const b = ecaHoekstraBand(h, h.map((x) => 1 + 0.05 * x ** 1.5), 2);
    expect(b.good).toBe(true);
    expect(b.safetyFactor).toBe(1.25);
    expect(b.value).toBeCloseTo(1, 8);
  });
  it('an observed order above the element\'s formal order is not used: fixed-order fits, F_s = 3', () => {
    const h = ladder(5);
    const b = ecaHoekstraBand(h, h.map((x) => 1 + 0.05 * x ** 3), 2);
    expect(b.observedOrder).toBeCloseTo(3, 5);
    expect(Math.max(...b.orderUsed)).toBeLessThanOrEqual(2);
    expect(b.safetyFactor).toBe(3);
    // the same sequence with CST (formal order 1): orders 0.5 and 1 only
    expect(Math.max(...ecaHoekstraBand(h, h.map((x) => 1 + 0.05 * x ** 3), 1).orderUsed)).toBeLessThanOrEqual(1);
  });
  it('a lucky small last step (orders 1.6 → 2.2 → 6.1) cannot buy a narrow band', () => {
    // increments 1, 2^−1.6, then 2^−2.2 and 2^−6.1 smaller: the finest-triple GCI would be ≈ 1e−5
    const d = [1, 2 ** -1.6];
    d.push(d[1] * 2 ** -2.2, d[1] * 2 ** -2.2 * 2 ** -6.1);
    const f = [430];
    for (const x of d) f.push(f[f.length - 1] + x);
    const b = ecaHoekstraBand(ladder(5), f, 2);
    expect(b.halfWidth).toBeGreaterThanOrEqual(finestSpread(f));
    expect(finestSpread(f)).toBeCloseTo(d[2] + d[3], 12);
  });
  it('never narrower than the spread of the finest three values', () => {
    const h = ladder(6);
    const f = h.map((x) => 7 + 0.01 * x * x);
    const b = ecaHoekstraBand(h, f, 2);
    expect(b.floored).toBe(true);
    expect(b.halfWidth).toBeCloseTo(f[3] - f[5], 12);
  });
  it('a flat ladder (a uniform stress) is settled with a zero band and no order', () => {
    const v = judgeSite(ladder(5), [5, 5, 5, 5, 5], 2, 2, 0);
    expect(v.verdict).toBe('converging');
    expect(v.estimate.value).toBe(5);
    expect(v.estimate.uncertainty).toBe(0);
    expect(Number.isNaN(v.estimate.observedOrder)).toBe(true);
  });
  it('refuses fewer than four levels (three use the documented fallback in judgeSite)', () => {
    expect(() => ecaHoekstraBand([1, 0.5, 0.25], [1, 2, 3], 2)).toThrow(/≥ 4 levels/);
  });
  it('three levels: Richardson with the order capped at p_f, F_s = 3, at least the spread of the three', () => {
    const h = [1, 0.5, 0.25];
    const f = h.map((x) => 2 + 0.1 * x ** 3);
    const v = judgeSite(h, f, 2, 2, 0);
    expect(v.verdict).toBe('converging');
    expect(v.reason).toContain('three levels only');
    const rich = (3 * Math.abs(f[2] - f[1])) / (2 ** 2 - 1);
    expect(v.estimate.uncertainty).toBeCloseTo(Math.max(rich, f[0] - f[2]), 12);
  });
});

describe('far-field term (docs/study.md, "Far field")', () => {
  it('F_s|Δ|/(c^p_f − 1) with c = 2, F_s = 3: |Δ| for LST, 3|Δ| for CST (Roache 1998, two grids)', () => {
    expect(BAND_RULES.farField.coarsening).toBe(2);
    expect(farFieldHalfWidth(-0.4, 2)).toBeCloseTo(0.4, 14);
    expect(farFieldHalfWidth(0.4, 1)).toBeCloseTo(1.2, 14);
  });
  it('is its own component and adds to the half-width', () => {
    const h = ladder(5);
    const f = h.map((x) => 100 + 2 * x ** 1.8);
    const without = judgeSite(h, f, 2, 2, 0);
    const withFar = judgeSite(h, f, 2, 2, 0, '', 0.3);
    expect(withFar.estimate.components?.farField).toBeCloseTo(0.3, 14);
    expect(withFar.estimate.uncertainty).toBeCloseTo(without.estimate.uncertainty + 0.3, 12);
    expect(withFar.reason).toMatch(/far field ± 0\.3/);
  });
  it('singular sites keep no value and no band, whatever the far field', () => {
    const h = ladder(5);
    const v = judgeSite(h, h.map((x) => 1.5 + x ** -0.455516), 2, 2, 0.455516, 're-entrant corner 270°', 0.5);
    expect(v.verdict).toBe('singular');
    expect(Number.isNaN(v.estimate.value) && Number.isNaN(v.estimate.uncertainty)).toBe(true);
    expect(v.estimate.components).toBeUndefined();
  });
});

/*
 * Coverage: synthetic ladders with a known limit (100), r = 2, 4–7 levels, coarsest h = 1, noise
 * N(0, (νd)²) with ν uniform in [0, 0.25] and d the finest clean increment. An undecided verdict
 * counts as a miss. Families (parameters are ours; the oscillating amplitude stays within what the
 * verdict accepts as oscillatory convergence, 1 % over the finest three levels):
 *   h^p        p ∈ [0.5, 2.1] (the good range of a second-order measure), error 1–10 % on the coarsest level
 *   h²+h⁵      second order with a fifth-order term up to as large on the coarsest level
 *   oscillating (−1)^k c h^p, p ∈ [1, 2.1], c 0.2–2 %
 *   slow       h^p (1 + d h), p ∈ [0.6, 1], |d| ≤ 0.25 (pre-asymptotic)
 *   CST h^p    p ∈ [0.5, 1.05], formal order 1
 * "True error" in the ratio is the finest level's |φ₁ − limit|: what the band is meant to cover.
 */
describe('coverage of the band on synthetic ladders with a known limit', () => {
  const rnd = seededRandom(20240601);
  const U = (a: number, b: number) => a + (b - a) * rnd();
  const sign = () => (rnd() < 0.5 ? -1 : 1);
  const gauss = () => Math.sqrt(-2 * Math.log(1 - rnd())) * Math.cos(2 * Math.PI * rnd());
  type Family = { name: string; order: 1 | 2; make(): (h: number, k: number) => number };
  const families: Family[] = [
    { name: 'h^p', order: 2, make: () => { const p = U(0.5, 2.1), c = U(0.01, 0.1) * sign(); return (x) => c * x ** p; } },
    { name: 'h²+h⁵', order: 2, make: () => { const c1 = U(0.01, 0.1) * sign(), c2 = c1 * U(-1, 1); return (x) => c1 * x * x + c2 * x ** 5; } },
    { name: 'oscillating', order: 2, make: () => { const p = U(1, 2.1), c = U(0.002, 0.02); return (x, k) => c * x ** p * (k % 2 ? 1 : -1); } },
    { name: 'slow', order: 2, make: () => { const p = U(0.6, 1), c = U(0.01, 0.05) * sign(), d = U(-0.25, 0.25); return (x) => c * x ** p * (1 + d * x); } },
    { name: 'CST h^p', order: 1, make: () => { const p = U(0.5, 1.05), c = U(0.01, 0.1) * sign(); return (x) => c * x ** p; } },
  ];
  const DRAWS = 400;
  const rows: { family: string; hit: boolean; decided: boolean; ratio: number }[] = [];
  for (const fam of families) {
    for (let t = 0; t < DRAWS; t++) {
      const n = 4 + Math.floor(rnd() * 4);
      const h = ladder(n);
      const g = fam.make();
      const clean = h.map((x, k) => g(x, k));
      const d = Math.abs(clean[n - 1] - clean[n - 2]);
      const nu = U(0, 0.25);
      const f = clean.map((v) => 100 * (1 + v + nu * d * gauss()));
      const v = judgeSite(h, f, 2, fam.order, 0);
      const decided = v.verdict === 'converging';
      rows.push({
        family: fam.name, decided,
        hit: decided && Math.abs(v.estimate.value - 100) <= v.estimate.uncertainty,
        ratio: decided ? v.estimate.uncertainty / Math.abs(f[n - 1] - 100) : Infinity,
      });
    }
  }
  const median = (a: number[]) => [...a].sort((x, y) => x - y)[Math.floor(a.length / 2)];

  it(`contains the limit in ≥ 95 % of ${families.length * DRAWS} draws (undecided = miss)`, () => {
    const rate = rows.filter((r) => r.hit).length / rows.length;
    expect(rate).toBeGreaterThanOrEqual(0.95);
    // every family on its own stays above 90 %
    for (const fam of families) {
      const fr = rows.filter((r) => r.family === fam.name);
      expect(fr.filter((r) => r.hit).length / fr.length, fam.name).toBeGreaterThanOrEqual(0.9);
    }
    // and a band that was given holds the limit (misses are undecided draws, not wrong bands)
    const decided = rows.filter((r) => r.decided);
    expect(decided.filter((r) => r.hit).length / decided.length).toBeGreaterThanOrEqual(0.99);
  });
  it('stays useful: median half-width / true error ≤ 10', () => {
    expect(median(rows.map((r) => r.ratio))).toBeLessThanOrEqual(10);
  });
});
