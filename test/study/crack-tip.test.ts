import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { runStudy, type SiteResult, type StudyResult } from '../../src/study/index.js';
import { feddersenCentreCrackK } from '../../src/check/crack.js';

/*
 * Centre crack of half-length a = 10 in a plate W = 1000 wide (2000 long), remote tension S = 100, plane stress.
 * Reference K_I = S√(πa)·√(sec(πa/W)) (Feddersen 1966, in Tada, Paris & Irwin, The Stress Analysis of Cracks
 * Handbook, 3rd ed. 2000, p. 2.2; Tada's polynomial factor differs by 1e-5 at 2a/W = 0.02) = 560.637.
 * Williams (1952): a crack tip is the 360° free–free wedge, λ = 1/2, so the peak grows like h^-0.5.
 */
const a = 10, S = 100, W = 1000;
const K_REF = feddersenCentreCrackK(S, a, W);

const head = `
units: { length: mm, force: N }
material: { E: 200000, nu: 0.3 }
thickness: 1
`;
const siteAt = (r: StudyResult, x: number, y: number): SiteResult => {
  const s = r.sites.find((p) => p.at[0] === x && p.at[1] === y);
  if (!s) throw new Error(`no site at (${x}, ${y}); sites: ${r.sites.map((p) => `${p.id} ${p.at}`).join(', ')}`);
  return s;
};

/** the half model on the symmetry line y = 0: rollers on the ligaments, the crack faces |x| < a free */
const halfModel = (extra = '') => `${head}
title: centre crack, upper half
plate:
  outline: [[-500, 0], [500, 0], [500, 1000], [-500, 1000]]
supports:
  - { where: { segment: [[${a}, 0], [500, 0]] }, fix: [y] }
  - { where: { segment: [[-500, 0], [-${a}, 0]] }, fix: [y] }
  - { where: { point: [500, 0] }, fix: [x] }
loads:
  - { where: { y: 1000 }, traction: [0, ${S}] }
mesh: { size: 100, order: 2, local: [ { near: [0, 0], size: 2, radius: 15 } ] }
${extra}`;

/** the whole plate, the crack a slender diamond opening (tip angle 0.01°: λ = 0.5 to 1e-12) */
const fullModel = `${head}
title: centre crack, whole plate
plate:
  outline: [[-500, -1000], [500, -1000], [500, 1000], [-500, 1000]]
  openings:
    - { id: crack, polygon: [[-${a}, 0], [0, -0.001], [${a}, 0], [0, 0.001]] }
supports:
  - { where: { point: [-500, -1000] }, fix: [x, y] }
  - { where: { point: [500, -1000] }, fix: [y] }
loads:
  - { where: { y: 1000 }, traction: [0, ${S}] }
  - { where: { y: -1000 }, traction: [0, -${S}] }
mesh: { size: 100, order: 2, local: [ { near: [0, 0], size: 2, radius: 15 } ] }
`;

function expectCrackTip(s: SiteResult): void {
  // Williams (1952): q = 1 − λ = 0.5; ±0.02 (we measure 0.505 ± 0.001)
  expect(s.verdict).toBe('singular');
  expect(Math.abs(s.growth.exponent - 0.5)).toBeLessThan(0.02);
  const K = s.readouts.nsif!, u = s.readouts.nsifUncertainty!;
  expect(s.readouts.nsifUnits).toBe('MPa·mm^0.500');
  // within 0.3 % of the handbook value (we measure −0.02 %), and the band contains it
  expect(Math.abs(K / K_REF - 1)).toBeLessThan(0.003);
  expect(Number.isFinite(u)).toBe(true);
  expect(Math.abs(K - K_REF)).toBeLessThanOrEqual(u);
  // the band stays useful: below 0.3 % of K
  expect(u).toBeLessThan(0.003 * K);
}

describe('centre crack on a symmetry line (issue 12 §4–7)', () => {
  // the opening stress as the measure, and a critical distance L = (1/π)(ΔK_th/Δσ₀)² = 4 (Taylor 2007)
  const r = runStudy(parseModel(halfModel('study: { measure: syy, readouts: { critical: { deltaKth: "250*sqrt(4*pi)", deltaSigma0: 250 } } }'), 'half.yaml'), { levels: 5 });
  it('the roller ends are mesh vertices: the sites are at (±a, 0) exactly, crack tips by the mirror rule', () => {
    const s = siteAt(r, a, 0);
    expect(s.feature.kind).toBe('support-edge');
    expect(s.feature.faceConditions).toEqual(['free', 'sliding']);
    expect(s.growth.theory).toBeCloseTo(0.5, 9);
    for (const l of s.levels) expect(l.peakAt).toEqual([a, 0]);
    siteAt(r, -a, 0);
  });
  it('readouts follow the ligament (the bisector of the mirrored 360° wedge), K_I within 0.3 % with its band', () => {
    const s = siteAt(r, a, 0);
    expect(s.direction).toEqual([1, 0]);
    expectCrackTip(s);
    expectCrackTip(siteAt(r, -a, 0));
  });
  it('the readout distance is tied to the crack: 0.05 × the free face (2a), stated beside the readouts', () => {
    const s = siteAt(r, a, 0);
    expect(s.readouts.distance).toBe(0.05 * 2 * a);
    expect(s.readouts.distanceRule).toBe('0.05 × shorter face 20');
    expect(s.readouts.lineLength).toBe(4 * s.readouts.distance!);
    expect(s.readouts.nsifRadii).toEqual([a / 2, a]);
  });
  it('critical distance: point method at L/2 and line method over 2L against the Westergaard stress', () => {
    // Westergaard (1939) / Irwin (1957), infinite plate: σyy(r) = S(a + r)/√(r(2a + r)) ahead of the tip, so
    // σyy(L/2) and the mean over 2L, S√(2L(2a + 2L))/(2L), are closed forms (the width changes them by 3e-4).
    // We measure −0.4 % and −1.2 % (the line mean takes the FE field's deficit in the first elements at the tip):
    // tolerances 1 % and 3 %.
    const s = siteAt(r, a, 0);
    const L = 4;
    expect(s.readouts.criticalDistance).toBeCloseTo(L, 12);
    const pm = (S * (a + L / 2)) / Math.sqrt((L / 2) * (2 * a + L / 2));
    const lm = (S * Math.sqrt(2 * L * (2 * a + 2 * L))) / (2 * L);
    expect(Math.abs(s.readouts.pointMethod! / pm - 1)).toBeLessThan(0.01);
    expect(Math.abs(s.readouts.lineMethod! / lm - 1)).toBeLessThan(0.03);
  });
});

describe('centre crack, whole plate (issue 12 §6)', () => {
  const r = runStudy(parseModel(fullModel, 'full.yaml'), { levels: 5 });
  it('both tips singular with q ≈ 0.5 and K_I within 0.3 % of the handbook value, band containing it', () => {
    for (const x of [-a, a]) {
      const s = siteAt(r, x, 0);
      expect(s.feature.kind).toBe('corner');
      expectCrackTip(s);
    }
    // the diamond's blunt 180.01° corners (q = 1.3e-4 by Williams) are no sites
    expect(r.sites.map((s) => s.at)).toEqual([[-a, 0], [a, 0]]);
  });
});
