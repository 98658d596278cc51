import { describe, expect, it } from 'vitest';
import { buildGeometry } from '../../src/geometry/index.js';
import { meshPlate, sizeFieldFromSettings } from '../../src/mesh/index.js';
import { parseModel } from '../../src/model/index.js';
import { formatBand, nsifText, siteAdvice, singularMaxWarning, singularPoints } from '../../src/report/index.js';
import type { SiteResult } from '../../src/study/types.js';
import { demoStudy } from './fixtures.js';

describe('formatBand: two significant digits in the band, the value to the same decimal place', () => {
  it('rounds as a practitioner writes a result with its band', () => {
    expect(formatBand(143.1234, 0.0044)).toEqual({ value: '143.1234', band: '0.0044' });
    expect(formatBand(434.799, 1.234)).toEqual({ value: '434.8', band: '1.2' });
    expect(formatBand(143.13136033526655, 0.004422111815998164)).toEqual({ value: '143.1314', band: '0.0044' });
    // bands of ten and more round the value to tens, hundreds…
    expect(formatBand(1234, 567)).toEqual({ value: '1230', band: '570' });
    // the band's rounding may carry into the next decade: 0.0996 → 0.10, two digits again
    expect(formatBand(3.14159, 0.0996)).toEqual({ value: '3.14', band: '0.10' });
    // true minus sign, no "−0.00"
    expect(formatBand(-12.3456, 0.012)).toEqual({ value: '−12.346', band: '0.012' });
    expect(formatBand(-0.0004, 0.012)).toEqual({ value: '0.000', band: '0.012' });
  });
  it('stops at 9 significant digits when the band is far below the value, and says n/a without a band', () => {
    expect(formatBand(141.66, 9.2e-6)).toEqual({ value: '141.66', band: '9.2e−6' });
    expect(formatBand(5, NaN)).toEqual({ value: '5', band: 'n/a' });
    expect(formatBand(5, 0)).toEqual({ value: '5', band: '0' });
  });
});

describe('readouts in words', () => {
  const [corner] = demoStudy().sites;
  it('K_I in the model units and in MPa·m^x, exactly 1000^x apart (N and mm)', () => {
    const text = nsifText(corner, { length: 'mm', force: 'N', stress: 'MPa' })!;
    // 812.5 MPa·mm^0.46 = 812.5 · 0.001^0.46 MPa·m^0.46 = 33.87 MPa·m^0.46
    expect(text).toBe(`812.5 MPa·mm^0.460 (${Number((812.5 / 1000 ** 0.46).toPrecision(4))} MPa·m^0.460)`);
  });
  it('a crack exponent reads √: MPa·√mm and MPa·√m = MPa·√mm / √1000', () => {
    const crack: SiteResult = { ...corner, feature: { ...corner.feature, lambda: 0.5 }, readouts: { nsif: 538.09, nsifUnits: 'MPa·mm^0.500' } };
    expect(nsifText(crack, { length: 'mm', force: 'N', stress: 'MPa' })).toBe(`538.1 MPa·√mm (${Number((538.09 / Math.sqrt(1000)).toPrecision(4))} MPa·√m)`);
    // units that are already MPa and m, or unknown ones, get no second figure
    expect(nsifText(crack, { length: 'm', force: 'MN', stress: 'MPa' })).toBe('538.1 MPa·√m');
    expect(nsifText(crack, { length: 'in', force: 'lbf', stress: 'psi' })).toBe('538.1 psi·√in');
  });
  it('advice follows what makes a site singular', () => {
    const clampEnd: SiteResult = { ...corner, feature: { ...corner.feature, interiorAngleDeg: 90, faceConditions: ['clamped', 'free'] } };
    expect(siteAdvice(clampEnd)).toMatch(/model the real support \(the bolts, the contact, the stiffness of the flange/);
    expect(siteAdvice(clampEnd)).toMatch(/rather than a radius/);
    const slit: SiteResult = { ...corner, feature: { ...corner.feature, interiorAngleDeg: 357.1 } };
    expect(siteAdvice(slit)).toMatch(/crack: it needs a fracture assessment/);
    expect(siteAdvice(corner)).toMatch(/model the real corner radius/);
  });
});

describe('a solve maximum at a singular point', () => {
  // the L-bracket of models/l-bracket-sharp.yaml: re-entrant corner (40, 40), clamped top edge y = 120
  const model = parseModel(`
units: { length: mm, force: N }
material: { E: 210000, nu: 0.3 }
thickness: 10
plate: { outline: [[0, 0], [120, 0], [120, 40], [40, 40], [40, 120], [0, 120]] }
supports: [{ where: { y: 120 }, fix: [x, y] }]
loads: [{ where: { x: 120 }, traction: [0, -6] }]
mesh: { size: 10, order: 2 }
`, 'l.yaml');
  const geometry = buildGeometry(model.plate);
  const mesh = meshPlate(geometry, { sizeAt: sizeFieldFromSettings(geometry, model.mesh), order: 2 });
  const warn = (at: [number, number]) => singularMaxWarning({ model, geometry, mesh, at, measure: 'von Mises stress' });

  it('lists the singular points theory gives (Williams 1952 for the corners)', () => {
    const pts = singularPoints(model, geometry);
    const at = pts.map((p) => p.at.join(',')).sort();
    // the 270° free corner and the two ends of the clamped edge; the convex free corners are not singular
    expect(at).toEqual(['0,120', '40,120', '40,40']);
    const corner = pts.find((p) => p.at[0] === 40 && p.at[1] === 40)!;
    expect(corner.q).toBeCloseTo(0.455516, 5); // 1 − λ, λ = 0.544484 (Williams 1952, free–free 270°)
    expect(corner.fromIdealisation).toBe(false);
    expect(pts.find((p) => p.at[1] === 120)!.fromIdealisation).toBe(true);
  });
  it('warns at the corner and at the end of the support, not in the middle of an edge', () => {
    expect(warn([40, 40])).toMatch(/re-entrant corner \(40, 40\) mm, 270°, faces free\/free: a singular point of the idealised geometry/);
    expect(warn([0, 120])).toMatch(/corner where a support ends .*idealised support/);
    expect(warn([80, 0])).toBeUndefined();
  });
});
