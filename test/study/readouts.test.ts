import { describe, it, expect } from 'vitest';
import {
  criticalDistance, pointMethod, lineMethod, lineAverage, notchStressIntensity, nsifUnits, hotSpotLinear,
  hotSpotQuadratic, hotSpotTypeB, extrapolateToZero, hotSpotPoints, tanhSinh,
} from '../../src/study/index.js';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('theory of critical distances (Taylor 2007)', () => {
  const crack = (r: number) => 1 / Math.sqrt(2 * Math.PI * r); // K = 1
  it('K = σ₀ = 1: L = 0.318310, PM and LM both return σ₀ (1e−12)', () => {
    const L = criticalDistance(1, 1);
    expect(L).toBeCloseTo(0.31831, 6);
    expect(Math.abs(pointMethod(crack, L) - 1)).toBeLessThan(1e-12);
    expect(Math.abs(lineMethod(crack, L) - 1)).toBeLessThan(1e-12);
  });
  it('σ = H r^(λ−1): PM = H (L/2)^(λ−1), LM = H (2L)^(λ−1)/λ', () => {
    for (const lambda of [0.544484, 0.5, 0.340317, 0.9]) {
      const H = 2.7, L = 0.8;
      const s = (r: number) => H * Math.pow(r, lambda - 1);
      expect(rel(pointMethod(s, L), H * Math.pow(L / 2, lambda - 1))).toBeLessThan(1e-12);
      expect(rel(lineMethod(s, L), (H * Math.pow(2 * L, lambda - 1)) / lambda)).toBeLessThan(1e-12);
    }
  });
  it('tanh-sinh integrates a smooth function to round-off: ∫₀^π sin = 2', () => {
    expect(Math.abs(tanhSinh(Math.sin, 0, Math.PI) - 2)).toBeLessThan(1e-13);
    expect(lineAverage(() => 4, 3)).toBeCloseTo(4, 13);
  });
});

describe('generalised notch stress intensity (Gross & Mendelson 1972)', () => {
  it('recovers K from σ = K/√(2π) r^(λ−1) (+ a higher term the line absorbs)', () => {
    const lambda = 0.544484, K = 3.2;
    const r = [0.01, 0.02, 0.03, 0.04, 0.05];
    const exact = r.map((x) => (K / Math.sqrt(2 * Math.PI)) * Math.pow(x, lambda - 1));
    expect(rel(notchStressIntensity(r, exact, lambda).K, K)).toBeLessThan(1e-12);
    // second term ∝ r^(λ₂ − 1) with λ₂ = 1.629 (Williams 1952, second free–free root at 270°) — small bias only
    const two = r.map((x, i) => exact[i] + 0.5 * Math.pow(x, 1.629257 - 1));
    expect(rel(notchStressIntensity(r, two, lambda).K, K)).toBeLessThan(0.01);
  });
  it('crack case: K_I with λ = 1/2; units stress·length^(1−λ)', () => {
    const r = [0.001, 0.002, 0.004];
    const s = r.map((x) => 0.574221 / Math.sqrt(2 * Math.PI * x)); // K of Tada, Paris & Irwin (2000), W = 1, a = 0.1
    expect(notchStressIntensity(r, s, 0.5).K).toBeCloseTo(0.574221, 12);
    expect(nsifUnits('MPa', 'mm', 0.544484)).toBe('MPa·mm^0.456');
  });
});

describe('hot-spot extrapolation (Hobbacher 2016, IIW)', () => {
  const t = 12;
  it('linear profile σ = 100 − 20x/t: exact weights give 100, rounded 1.67/0.67 give 100.04', () => {
    const s = (x: number) => 100 - (20 * x) / t;
    expect(hotSpotLinear(s(0.4 * t), s(t))).toBeCloseTo(100, 12);
    expect(Math.abs(hotSpotLinear(s(0.4 * t), s(t), true) - 100.04)).toBeLessThan(100.04 * 5e-4);
  });
  it('quadratic profile: 88.8, 77.05, 67.8 → 100 (1e−12); the linear rule gives 98.046', () => {
    const s = (x: number) => 100 - 30 * (x / t) + 5 * (x / t) ** 2;
    const [a, b, c] = hotSpotPoints('quadratic', t).map(s);
    expect(a).toBeCloseTo(88.8, 12);
    expect(b).toBeCloseTo(77.05, 12);
    expect(c).toBeCloseTo(67.8, 12);
    expect(rel(hotSpotQuadratic(a, b, c), 100)).toBeLessThan(1e-12);
    // the 98.046 of the notes is the rounded 1.67/0.67 rule; the exact weights give 98.000
    expect(hotSpotLinear(s(0.4 * t), s(t), true)).toBeCloseTo(98.046, 3);
    expect(hotSpotLinear(s(0.4 * t), s(t))).toBeCloseTo(98, 12);
  });
  it('type "b": σ = 100 − 2x + 0.05x² → 3σ₄ − 3σ₈ + σ₁₂ = 100; Lagrange weights agree', () => {
    const s = (x: number) => 100 - 2 * x + 0.05 * x * x;
    expect(hotSpotTypeB(s(4), s(8), s(12))).toBeCloseTo(100, 12);
    expect(extrapolateToZero([4, 8, 12], [s(4), s(8), s(12)])).toBeCloseTo(100, 12);
    expect(extrapolateToZero([0.4, 0.9, 1.4], [1, 0, 0])).toBeCloseTo(2.52, 12);
  });
});
