import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { runStudy } from '../../src/study/index.js';

/*
 * The hanger-rod demo (models/hanger-rod-shoulder.yaml): a stepped round bar in tension, D/d = 48/32 = 1.5,
 * shoulder fillet r = 3.2 (r/d = 0.1), as an axisymmetric section, through the unchanged study.
 */
const file = fileURLToPath(new URL('../../models/hanger-rod-shoulder.yaml', import.meta.url));
const text = readFileSync(file, 'utf8');
const nominal = 80000 / (Math.PI * 16 ** 2); // F / (π d²/4) = 99.47 MPa

/*
 * Chart value: W. D. Pilkey, Peterson's Stress Concentration Factors, 2nd ed. (1997), stepped round bar
 * in tension, in the polynomial form of Young & Budynas, Roark's Formulas for Stress and Strain, 7th ed.
 * (2002) Table 17.1 (square shoulder with fillet in a circular shaft, axial tension), 2 ≤ h/r ≤ 20:
 * C1 = 1.225 + 0.831√(h/r) − 0.010 h/r, C2 = −1.831 − 0.318√(h/r) − 0.049 h/r,
 * C3 = 2.236 − 0.522√(h/r) + 0.176 h/r, C4 = −0.630 + 0.009√(h/r) − 0.117 h/r,
 * Kt = C1 + C2 (2h/D) + C3 (2h/D)² + C4 (2h/D)³ — from memory, checked only against a third-party
 * reproduction of the table. h = 8, r = 3.2: Kt = 1.867.
 */
function chartKt(D: number, d: number, r: number): number {
  const h = (D - d) / 2, q = h / r, s = Math.sqrt(q), t = (2 * h) / D;
  const c1 = 1.225 + 0.831 * s - 0.010 * q;
  const c2 = -1.831 - 0.318 * s - 0.049 * q;
  const c3 = 2.236 - 0.522 * s + 0.176 * q;
  const c4 = -0.630 + 0.009 * s - 0.117 * q;
  return c1 + c2 * t + c3 * t * t + c4 * t * t * t;
}

describe('stepped shaft in tension, axisymmetric section', () => {
  it('fillet: converging verdict, Kt beside the chart value', () => {
    const model = parseModel(text, 'models/hanger-rod-shoulder.yaml');
    expect(model.state).toBe('axisymmetric');
    const result = runStudy(model, { levels: 3 });
    // axial balance of the whole revolution: the end traction carries the rod force
    expect(result.solution.appliedSum[1]).toBeCloseTo(80000, 6);
    expect(result.solution.reactionSum[1]).toBeCloseTo(-80000, 6);
    const fillet = result.sites.find((s) => s.feature.kind === 'fillet');
    expect(fillet).toBeDefined();
    expect(fillet!.verdict).toBe('converging');
    const kt = fillet!.estimate!.value / nominal;
    expect(chartKt(48, 32, 3.2)).toBeCloseTo(1.867, 3);
    // measured Kt = 2.114 (210.3 MPa, four levels; 2.11 with three), 13 % above the chart polynomial. Our own
    // checks put the element's error far lower (Goodier's cavity to 0.2 %, test/fem/axisymmetric.test.ts; the
    // same outline as a flat bar in plane stress gives 2.30 against the flat-bar polynomial of the same table,
    // 2.24), so the gap is the chart's: the band is wide on purpose and says only "the same concentration".
    expect(Math.abs(kt / chartKt(48, 32, 3.2) - 1)).toBeLessThan(0.16);
    // the band is narrow against the gap (measured ± 2.3 MPa, 1.1 %, at three levels; ± 0.54 MPa at four)
    expect(fillet!.estimate!.uncertainty).toBeLessThan(0.02 * fillet!.estimate!.value);
  });

  it('sharp shoulder (r = 0): a 270° free–free corner of the section, singular with q ≈ 0.456 (Williams 1952)', () => {
    const model = parseModel(text.replace(/^ {2}r: 3\.2 /m, '  r: 0   '), 'models/hanger-rod-shoulder.yaml');
    const result = runStudy(model, { levels: 5 });
    const corner = result.sites.find((s) => s.feature.kind === 'corner' && Math.hypot(s.at[0] - 16, s.at[1] - 60) < 1e-6);
    expect(corner).toBeDefined();
    expect(corner!.feature.interiorAngleDeg).toBeCloseTo(270, 6);
    expect(corner!.verdict).toBe('singular');
    // node /work/shared/tools/williams.mjs 270: λ = 0.544484, σ ∝ r^−0.455516 (free–free roots do not depend
    // on ν or the state; the section corner takes the plane-strain κ, docs/study.md)
    expect(corner!.growth!.theory).toBeCloseTo(0.455516, 4);
    // measured q = 0.509 over three levels, 0.479 over four, 0.460 over five (the excess of a short ladder, as
    // at the plates' L-corner): five levels, tolerance about 4× the measured 0.005
    expect(Math.abs(corner!.growth!.exponent - 0.455516)).toBeLessThan(0.02);
  });
});

/*
 * Concentrated forces in a section: off the axis a force is a ring load, locally a line load of the body
 * with the 1/ρ field of Flamant (1892), q = 1; on the axis it is a point force of the body, whose field
 * falls like 1/ρ² (Boussinesq 1885), q = 2. A solid cylinder pressed at the centre of its end face and
 * pushed radially by a ring load on its side.
 */
describe('point forces in an axisymmetric section', () => {
  it('on the axis: singular with q = 2 (Boussinesq); off the axis: q = 1 (Flamant)', () => {
    const model = parseModel(`
material: { E: 210000, nu: 0.3 }
state: axisymmetric
plate:
  outline: [[0, 0], [20, 0], [20, 40], [0, 40]]
supports:
  - { where: { y: 0 }, fix: [y] }
loads:
  - { where: { point: [0, 40] }, force: [0, -1000] }
  - { where: { point: [20, 20] }, force: [-1000, 0] }
mesh: { size: 4, order: 2 }
study: { levels: 3, measure: von-mises }
`, 'point-forces.yaml');
    const result = runStudy(model);
    const onAxis = result.sites.find((s) => s.at[0] === 0 && s.at[1] === 40);
    const ring = result.sites.find((s) => s.at[0] === 20 && s.at[1] === 20);
    expect(onAxis?.verdict).toBe('singular');
    expect(ring?.verdict).toBe('singular');
    expect(onAxis!.growth!.theory).toBe(2);
    expect(ring!.growth!.theory).toBe(1);
    // measured (four levels, h = 2 → 0.25): q = 2.000 and 1.011 — the peak is the nodal force over an element
    // area (on the axis, the revolved area ∝ h²) or length (off it)
    expect(Math.abs(onAxis!.growth!.exponent - 2)).toBeLessThan(0.1);
    expect(Math.abs(ring!.growth!.exponent - 1)).toBeLessThan(0.1);
  });
});

/*
 * How the Williams theory treats a corner of a section: as a plane-strain wedge (docs/study.md). The
 * clamped–free roots depend on κ, so a 90° clamped–free wedge (a face held in both directions meeting a
 * free face) tells the states apart: node /work/shared/tools/williams.mjs --bc=all [--plane-strain] --nu=0.3 90
 * prints λ = 0.711173 in plane strain and 0.758349 in plane stress; the section must take the first.
 */
describe('Williams theory at a corner of a section', () => {
  it('κ = 3 − 4ν, the plane-strain wedge', async () => {
    const { kolosovKappa } = await import('../../src/study/index.js');
    const { wedgeTheory } = await import('../../src/study/wedge-theory.js');
    expect(kolosovKappa(0.3, 'axisymmetric')).toBeCloseTo(1.8, 14);
    const axi = wedgeTheory(90, ['clamped', 'free'], 0.3, 'axisymmetric');
    const stress = wedgeTheory(90, ['clamped', 'free'], 0.3, 'plane-stress');
    expect(axi.lambda).toBeCloseTo(0.711173, 5);
    expect(stress.lambda).toBeCloseTo(0.758349, 5);
  });
});
