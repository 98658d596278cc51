import { describe, it, expect } from 'vitest';
import { williamsRoots, kolosovKappa } from '../../src/study/index.js';

// Williams (1952), J. Appl. Mech. 19, 526–528; values: roots of the characteristic equations found
// independently of this code
// (derived by complex Newton with deflation, cross-checked with a 30-digit solver).
const TOL = 1e-6;

describe('Williams (1952) free–free roots', () => {
  it('270°: 0.544484 symmetric, 0.908529 antisymmetric', () => {
    const r = williamsRoots(270, 'free-free');
    expect(Math.abs(r.symmetric! - 0.544484)).toBeLessThan(TOL);
    expect(Math.abs(r.antisymmetric! - 0.908529)).toBeLessThan(TOL);
    expect(r.lambdaMin).toBeCloseTo(0.544484, 6);
    expect(r.singular).toBe(true);
  });
  it('360° (crack): 0.5 for both families', () => {
    const r = williamsRoots(360);
    expect(Math.abs(r.symmetric! - 0.5)).toBeLessThan(1e-9);
    expect(Math.abs(r.antisymmetric! - 0.5)).toBeLessThan(1e-9);
  });
  it('180°: no singularity (λ = 1 mode I, 2 mode II)', () => {
    const r = williamsRoots(180);
    expect(r.singular).toBe(false);
    expect(r.symmetric!).toBeCloseTo(1, 9);
    expect(r.antisymmetric!).toBeCloseTo(2, 9);
  });
  const table: [number, number, number][] = [
    [200, 0.818696, 1.630525], [210, 0.751975, 1.485812], [225, 0.673583, 1.302086], [240, 0.615731, 1.148913],
    [250, 0.586279, 1.060215], [300, 0.512221, 0.730901], [315, 0.50501, 0.659702], [330, 0.501453, 0.598192],
    [345, 0.500179, 0.545254],
  ];
  it.each(table)('%d°: mode I %f, mode II %f', (a, l1, l2) => {
    const r = williamsRoots(a);
    expect(Math.abs(r.symmetric! - l1)).toBeLessThan(TOL);
    expect(Math.abs(r.antisymmetric! - l2)).toBeLessThan(TOL);
  });
  it('mode II is not singular at α ≤ 250° and becomes singular past 257.4534° (tan α = α)', () => {
    for (const a of [200, 225, 250, 257]) expect(williamsRoots(a).antisymmetric!).toBeGreaterThan(1);
    expect(williamsRoots(258).antisymmetric!).toBeLessThan(1);
  });
  it('convex corners: 90° complex roots 2.739593 ± 1.119025i and 4.808251 ± 1.463928i; 150° gives 1.533860', () => {
    const r = williamsRoots(90);
    expect(r.symmetricRoot!.re).toBeCloseTo(2.739593, 6);
    expect(r.symmetricRoot!.im).toBeCloseTo(1.119025, 6);
    expect(r.antisymmetricRoot!.re).toBeCloseTo(4.808251, 6);
    expect(r.antisymmetricRoot!.im).toBeCloseTo(1.463928, 6);
    expect(r.singular).toBe(false);
    expect(williamsRoots(150).symmetric!).toBeCloseTo(1.53386, 6);
  });
});

describe('Williams (1952) clamped faces (independent roots, ν = 0.3)', () => {
  const ps = kolosovKappa(0.3, 'plane-stress');
  const pe = kolosovKappa(0.3, 'plane-strain');
  it('κ = 2.076923 plane stress, 1.8 plane strain', () => {
    expect(ps).toBeCloseTo(2.076923, 6);
    expect(pe).toBeCloseTo(1.8, 12);
  });
  it('clamped–free 90°: 0.758349 (plane stress), 0.711173 (plane strain)', () => {
    expect(Math.abs(williamsRoots(90, 'free-clamped', ps).lambdaMin - 0.758349)).toBeLessThan(TOL);
    expect(Math.abs(williamsRoots(90, 'free-clamped', pe).lambdaMin - 0.711173)).toBeLessThan(TOL);
  });
  it('clamped–free 180°: 0.5 ± i ln κ/(2π) (oscillating singularity)', () => {
    for (const k of [ps, pe]) {
      const r = williamsRoots(180, 'free-clamped', k);
      expect(r.lambdaMin).toBeCloseTo(0.5, 9);
      expect(r.complex!.im).toBeCloseTo(Math.log(k) / (2 * Math.PI), 9);
    }
  });
  it('clamped–free 270°: 0.340317 ± 0.061698i', () => {
    const r = williamsRoots(270, 'free-clamped', ps);
    expect(Math.abs(r.complex!.re - 0.340317)).toBeLessThan(TOL);
    expect(Math.abs(r.complex!.im - 0.061698)).toBeLessThan(TOL);
  });
  it('clamped–clamped 270°: 0.744462 sym, 0.604044 anti (plane stress); 0.759042, 0.595156 (plane strain)', () => {
    const a = williamsRoots(270, 'clamped-clamped', ps);
    expect(Math.abs(a.symmetric! - 0.744462)).toBeLessThan(TOL);
    expect(Math.abs(a.antisymmetric! - 0.604044)).toBeLessThan(TOL);
    const b = williamsRoots(270, 'clamped-clamped', pe);
    expect(Math.abs(b.symmetric! - 0.759042)).toBeLessThan(TOL);
    expect(Math.abs(b.antisymmetric! - 0.595156)).toBeLessThan(TOL);
  });
  it('clamped–clamped 90°: 1.490456 and 2.825794 ± 0.560420i, no singularity; 180°: 1 and 1', () => {
    const a = williamsRoots(90, 'clamped-clamped', ps);
    expect(a.symmetric!).toBeCloseTo(1.490456, 6);
    expect(a.antisymmetricRoot!.re).toBeCloseTo(2.825794, 6);
    expect(a.antisymmetricRoot!.im).toBeCloseTo(0.56042, 6);
    expect(a.singular).toBe(false);
    const b = williamsRoots(180, 'clamped-clamped', ps);
    expect(b.lambdaMin).toBeCloseTo(1, 9);
    expect(b.singular).toBe(false);
  });
  it('rejects angles outside (0°, 360°]', () => {
    expect(() => williamsRoots(400)).toThrow(RangeError);
  });
});

// williamsRoots remembers each wedge it has solved (a pure function of its arguments): a second call
// must give the same roots, as a copy of its own, whatever the caller did to the first.
describe('remembered wedges', () => {
  it('a repeated wedge gives equal roots in a new object', () => {
    const a = williamsRoots(250, 'free-clamped', 2.2);
    const first = structuredClone(a);
    a.lambdaMin = -1;
    if (a.complex) a.complex.re = -1;
    const b = williamsRoots(250, 'free-clamped', 2.2);
    expect(b).toEqual(first);
    expect(b).not.toBe(a);
  });
});
