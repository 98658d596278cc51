/**
 * The reference element's quadrature rules integrate every monomial of their degree exactly and
 * are not exact one degree above. Exact values: on the unit right triangle
 * ∫∫ ξ^a η^b dξ dη = a! b! / (a + b + 2)! (the Dirichlet integral; e.g. Zienkiewicz & Taylor,
 * "The Finite Element Method", vol. 1, area-coordinate integration formula), and on [−1, 1]
 * ∫ s^k ds = 2/(k + 1) for even k, 0 for odd k.
 */
import { describe, expect, it } from 'vitest';
import { GAUSS_LEGENDRE_3, GAUSS_LEGENDRE_5, TRI_1, TRI_3, TRI_7, type EdgeRule, type TriangleRule } from '../../src/element/index.js';

const factorial = (n: number): number => (n <= 1 ? 1 : n * factorial(n - 1));
const triangleExact = (a: number, b: number): number => (factorial(a) * factorial(b)) / factorial(a + b + 2);
/** the rule's value of ∫∫ ξ^a η^b over the reference triangle: Σ w · f · |J|/2 with |J| = 1 */
function triangleRule(rule: TriangleRule, a: number, b: number): number {
  let s = 0;
  for (let q = 0; q < rule.w.length; q++) s += 0.5 * rule.w[q] * rule.xi[q] ** a * rule.eta[q] ** b;
  return s;
}
const edgeExact = (k: number): number => (k % 2 === 1 ? 0 : 2 / (k + 1));
function edgeRule(rule: EdgeRule, k: number): number {
  let s = 0;
  for (let g = 0; g < rule.w.length; g++) s += rule.w[g] * rule.s[g] ** k;
  return s;
}

describe('triangle rules: weights sum to 1, exact to their degree, not beyond', () => {
  for (const [name, rule] of [['TRI_1', TRI_1], ['TRI_3', TRI_3], ['TRI_7', TRI_7]] as const) {
    it(`${name} (degree ${rule.degree})`, () => {
      expect(rule.w.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 15);
      for (let q = 0; q < rule.w.length; q++) {
        expect(rule.xi[q]).toBeGreaterThan(0);
        expect(rule.eta[q]).toBeGreaterThan(0);
        expect(rule.xi[q] + rule.eta[q]).toBeLessThan(1);
      }
      for (let d = 0; d <= rule.degree; d++) {
        for (let a = 0; a <= d; a++) {
          // round-off of a handful of products: 1e-14 relative
          expect(Math.abs(triangleRule(rule, a, d - a) / triangleExact(a, d - a) - 1), `ξ^${a} η^${d - a}`).toBeLessThan(1e-14);
        }
      }
      // one degree above, some monomial is off by far more than round-off
      let worst = 0;
      const d = rule.degree + 1;
      for (let a = 0; a <= d; a++) worst = Math.max(worst, Math.abs(triangleRule(rule, a, d - a) / triangleExact(a, d - a) - 1));
      expect(worst).toBeGreaterThan(1e-4);
    });
  }
});

describe('Gauss–Legendre edge rules: weights sum to 2, exact to degree 2n − 1, not at 2n', () => {
  for (const [name, rule, n] of [['GAUSS_LEGENDRE_3', GAUSS_LEGENDRE_3, 3], ['GAUSS_LEGENDRE_5', GAUSS_LEGENDRE_5, 5]] as const) {
    it(name, () => {
      expect(rule.degree).toBe(2 * n - 1);
      expect(rule.w.reduce((a, b) => a + b, 0)).toBeCloseTo(2, 15);
      for (let k = 0; k <= rule.degree; k++) expect(Math.abs(edgeRule(rule, k) - edgeExact(k)), `s^${k}`).toBeLessThan(1e-15);
      expect(Math.abs(edgeRule(rule, 2 * n) / edgeExact(2 * n) - 1)).toBeGreaterThan(1e-3);
    });
  }
});
