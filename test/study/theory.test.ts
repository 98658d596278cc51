import { describe, it, expect } from 'vitest';
import { theoryExponent, wedgeTheory } from '../../src/study/index.js';

const section = { nu: 0.3, state: 'plane-stress' as const };

describe('growth exponent theory per feature (Williams 1952; Flamant)', () => {
  it('re-entrant 270° free corner: q = 0.455516 (Williams 1952)', () => {
    expect(theoryExponent({ kind: 'corner', interiorAngleDeg: 270, radius: 0, faces: 'free-free', description: '' }, section)).toBeCloseTo(0.455516, 6);
  });
  it('fixed edge meeting a free one at 90°: q = 1 − 0.758349 (clamped–free, plane stress ν = 0.3)', () => {
    expect(wedgeTheory(90, ['clamped', 'free'], 0.3, 'plane-stress').q).toBeCloseTo(1 - 0.758349, 6);
  });
  it('roller (mirror) ending on a free straight edge is a crack tip: q = 0.5; a symmetry line meeting a free edge at 90° is not singular', () => {
    expect(wedgeTheory(180, ['sliding', 'free'], 0.3, 'plane-stress').q).toBeCloseTo(0.5, 9);
    expect(wedgeTheory(90, ['free', 'sliding'], 0.3, 'plane-stress').q).toBe(0);
  });
  it('concentrated load and point support: q = 1; fillet and opening edge: q = 0', () => {
    expect(theoryExponent({ kind: 'point-load', interiorAngleDeg: 180, radius: 0, description: '' }, section)).toBe(1);
    expect(theoryExponent({ kind: 'point-support', interiorAngleDeg: 90, radius: 0, description: '' }, section)).toBe(1);
    expect(theoryExponent({ kind: 'fillet', interiorAngleDeg: 180, radius: 2, description: '' }, section)).toBe(0);
    expect(theoryExponent({ kind: 'opening', interiorAngleDeg: 180, radius: 2, description: '' }, section)).toBe(0);
  });
});
