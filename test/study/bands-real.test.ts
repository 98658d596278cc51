import { describe, expect, it } from 'vitest';
import { EXACT_PLATE_STRESS, exactNeighbourhoodPeak, inglisPlate, kirschPlate, lamePlate, type ExactPlate } from '../../src/check/exact-plates.js';
import { evaluateExpression } from '../../src/model/expr.js';
import { parseModel } from '../../src/model/index.js';
import { inglisField, kirschDisplacement } from '../../src/reference/index.js';
import { runStudy, type SiteResult } from '../../src/study/index.js';

/*
 * Bands on problems with a known answer. The exact-displacement plates (src/check/exact-plates.ts)
 * carry the closed form's displacements on their whole outline, so the FE problem's exact solution is
 * the closed form: Kirsch (1898), Inglis (1913; field from Muskhelishvili's potentials) and Lamé (1852).
 * Each converging site's band must hold the closed-form peak over the site's own neighbourhood, and
 * stay useful (half-width ≤ 0.5 % of the value) at the default six levels.
 */
const displacementAt = (plate: ExactPlate, x: number, y: number): [number, number] => {
  const d = plate.model.supports[0].displace;
  if (d?.kind !== 'values' || typeof d.x !== 'object' || typeof d.y !== 'object') throw new Error('expression displacements expected');
  return [evaluateExpression(d.x.expression, { ...d.x.params, x, y }), evaluateExpression(d.y.expression, { ...d.y.params, x, y })];
};

describe('the outline expressions are the closed forms', () => {
  it('Kirsch (1898): the expressions equal the reference field on the square\'s edges', () => {
    const plate = kirschPlate(6);
    for (const [x, y] of [[4, 0.3], [-4, 2.2], [1.7, 4], [-3.1, -4], [4, -4]]) {
      const [ux, uy] = displacementAt(plate, x, y);
      const ref = kirschDisplacement(EXACT_PLATE_STRESS, 1, x, y, 200000, 0.3);
      expect(Math.abs(ux - ref.ux)).toBeLessThan(1e-12 * Math.hypot(ref.ux, ref.uy));
      expect(Math.abs(uy - ref.uy)).toBeLessThan(1e-12 * Math.hypot(ref.ux, ref.uy));
    }
  });
  it('Inglis (1913): the polynomial in x equals the field on the confocal outline to 1e−10', () => {
    const plate = inglisPlate(3, 6);
    const o = plate.model.plate.outline;
    if (o.kind !== 'ellipse') throw new Error('elliptical outline expected');
    for (let k = 0; k < 40; k++) {
      const eta = (2 * Math.PI * (k + 0.37)) / 40;
      const x = o.a * Math.cos(eta), y = o.b * Math.sin(eta);
      const [ux, uy] = displacementAt(plate, x, y);
      const ref = inglisField(EXACT_PLATE_STRESS, 1, 1 / 3, x, y, 200000, 0.3);
      const scale = Math.hypot(ref.ux, ref.uy);
      expect(Math.abs(ux - ref.ux) / scale).toBeLessThan(1e-10);
      expect(Math.abs(uy - ref.uy) / scale).toBeLessThan(1e-10);
    }
  });
});

function checkBands(plate: ExactPlate): SiteResult[] {
  const r = runStudy(plate.model);
  const conv = r.sites.filter((s) => s.verdict === 'converging');
  expect(conv.length, plate.name).toBeGreaterThan(0);
  for (const s of conv) {
    const exact = exactNeighbourhoodPeak(plate, s.at, s.levels[0].radius ?? 0);
    const { value, uncertainty } = s.estimate;
    expect(Math.abs(value - exact), `${plate.name} ${s.id}: ${value} ± ${uncertainty} against ${exact}`).toBeLessThanOrEqual(uncertainty);
    expect(uncertainty / value, `${plate.name} ${s.id}: half-width ${uncertainty}`).toBeLessThanOrEqual(0.005);
    // the parts add up, and the far field was assessed
    const c = s.estimate.components!;
    expect(c.discretisation + c.scatter + c.farField).toBeCloseTo(uncertainty, 12);
    expect(c.farField).toBeGreaterThanOrEqual(0);
  }
  return conv;
}

describe('exact-displacement plates at the default six levels: bands hold the closed form', () => {
  it('Kirsch hole (Kirsch 1898: 3S at (0, ±a))', () => {
    const conv = checkBands(kirschPlate(6));
    // both peaks of the hole edge are studied and converge
    expect(conv.filter((s) => Math.abs(Math.abs(s.at[1]) - 1) < 0.1).length).toBe(2);
  });
  it('Inglis ellipse a/b = 3 (Inglis 1913: Kt = 1 + 2a/b = 7 at (±a, 0))', () => {
    const conv = checkBands(inglisPlate(3, 6));
    expect(conv.filter((s) => Math.abs(Math.abs(s.at[0]) - 1) < 1e-6 && Math.abs(s.at[1]) < 1e-6).length).toBe(2);
  });
  it('Lamé ring (Lamé 1852: von Mises on the bore 7p/3)', () => {
    const conv = checkBands(lamePlate(6));
    expect(conv.length).toBe(1);
  });
});

/*
 * Strap with a central hole, d/W = 0.5, half-length 2W, uniform end tension S: K_tg = 4.3476 ± 0.0001
 * (independent FE computation with 9-node elements and Richardson extrapolation; Howland 1930 gives
 * 4.32 to three figures, from memory). The peaks at (±a, 0) with 4, 5 and 7 levels must hold K_tg·S
 * in their bands; with 3 levels the documented fallback applies (docs/study.md, "Bands": Richardson
 * with the order capped at 2, F_s = 3, at least the spread of the three peaks — or undecided).
 */
describe('strap with a central hole, d/W = 0.5 (issue acceptance)', () => {
  const S = 100, ktg = 4.3476, ktgU = 1e-4;
  const strap = (levels: number) => runStudy(parseModel(`
units: { length: mm, force: N }
material: { E: 200000, nu: 0.3 }
thickness: 1
state: plane-stress
title: strap with a central hole, d/W = 0.5
plate:
  outline: { rect: { center: [0, 0], width: 20, height: 80 } }
  openings: [ { id: hole, circle: { center: [0, 0], radius: 5 } } ]
supports:
  - { where: { point: [-10, -40] }, fix: [x, y] }
  - { where: { point: [10, -40] }, fix: [y] }
loads:
  - { where: { y: 40 }, traction: [0, ${S}] }
  - { where: { y: -40 }, traction: [0, ${-S}] }
mesh: { size: 2, order: 2 }
study: { measure: von-mises, levels: ${levels} }
`, 'strap.yaml'));
  const peaks = (levels: number) => {
    const r = strap(levels);
    // the site is the node of the first solve's peak; the peak is flat across (±a, 0) (the hoop
    // stress varies with the square of the angle there), so the node beside it may hold it: on the
    // 7-level ladder one site is 0.009 mm (0.1°) off the axis, where σ differs by about 1e−5 relative
    const p = r.sites.filter((s) => Math.abs(Math.hypot(s.at[0], s.at[1]) - 5) < 1e-4 && Math.abs(s.at[1]) < 0.05);
    expect(p.length).toBe(2);
    return p;
  };
  it.each([4, 5, 7])('%i levels: value ± half-width holds K_tg·S at both peaks', (levels) => {
    for (const s of peaks(levels)) {
      expect(s.verdict).toBe('converging');
      expect(Math.abs(s.estimate.value - ktg * S), `${s.estimate.value} ± ${s.estimate.uncertainty}`).toBeLessThanOrEqual(s.estimate.uncertainty + ktgU * S);
    }
  });
  it('3 levels: the fallback — a band with F_s = 3 that holds K_tg·S, or undecided', () => {
    for (const s of peaks(3)) {
      if (s.verdict === 'converging') {
        expect(s.reason).toContain('three levels only');
        expect(Math.abs(s.estimate.value - ktg * S)).toBeLessThanOrEqual(s.estimate.uncertainty + ktgU * S);
      } else {
        expect(s.verdict).toBe('undecided');
        expect(Number.isNaN(s.estimate.uncertainty)).toBe(true);
      }
    }
  });
});
