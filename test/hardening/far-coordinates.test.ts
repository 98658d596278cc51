/**
 * Issue 19, class 8: coordinates far from the origin. The geometry is built and meshed about the
 * centre of the outline's bounding box (PlateGeometry.local), so a plate 1e6 away meshes exactly
 * as it does at the origin and gives the same stresses to rounding; a plate so far away that
 * fewer than MIN_DIGITS_LEFT significant digits remain for it is refused with the count.
 */
import { describe, expect, it } from 'vitest';
import { GeometryError } from '../../src/errors.js';
import { buildGeometry, MIN_DIGITS_LEFT } from '../../src/geometry/index.js';
import { gaussStresses } from '../../src/fem/index.js';
import { parseModel } from '../../src/model/index.js';
import { solveModel } from '../fem/issue9-helpers.js';

/** A 100 × 100 plate with a central hole and a filleted notch, placed at (X, Y). */
const plateAt = (X: number, Y: number) => parseModel(`
material: { E: 210000, nu: 0.3 }
thickness: 2
params: { X: ${X}, Y: ${Y} }
plate:
  outline:
    - [X, Y]
    - [X + 100, Y]
    - [X + 100, Y + 100]
    - { at: [X + 60, Y + 100], round: 4 }
    - [X + 50, Y + 80]
    - { at: [X + 40, Y + 100], round: 4 }
    - [X, Y + 100]
  openings: [ { id: hole, circle: { center: [X + 50, Y + 40], radius: 10 } } ]
supports:
  - { where: { x: X }, fix: [x] }
  - { where: { point: [X, Y] }, fix: [y] }
loads:
  - { where: { x: X + 100 }, traction: [100, 0] }
mesh: { size: 8, local: [ { near: [X + 50, Y + 40], size: 1, radius: 15 } ] }
`, 'far.yaml');

describe('a plate far from the origin', () => {
  it('1e6 away: the same mesh and the same stresses as at the origin, to ~1e-9', () => {
    const near = solveModel(plateAt(0, 0));
    const far = solveModel(plateAt(1e6, -2e6));
    expect(far.mesh.elemNodes).toEqual(near.mesh.elemNodes);
    let dx = 0;
    for (let n = 0; n < near.mesh.xy.length / 2; n++) {
      dx = Math.max(dx, Math.abs(far.mesh.xy[2 * n] - 1e6 - near.mesh.xy[2 * n]), Math.abs(far.mesh.xy[2 * n + 1] + 2e6 - near.mesh.xy[2 * n + 1]));
    }
    // nodes differ only by the rounding of adding the offset: half an ulp of 2e6 is 2.3e-10
    expect(dx).toBeLessThanOrEqual(2.4e-10);
    const section = { E: 210000, nu: 0.3, state: 'plane-stress' as const };
    const sNear = gaussStresses(near.mesh, near.solution.u, section).stress;
    const sFar = gaussStresses(far.mesh, far.solution.u, section).stress;
    let peak = 0, diff = 0;
    for (let k = 0; k < sNear.length; k++) {
      peak = Math.max(peak, Math.abs(sNear[k]));
      diff = Math.max(diff, Math.abs(sFar[k] - sNear[k]));
    }
    // a node moved by δ changes the strains by about δ/h (h ≥ 0.5 here); measured 6.5e-10 of the
    // peak, so 2e-9 (before the plate was meshed about its centre: 2e-3, a different mesh)
    expect(diff / peak).toBeLessThan(2e-9);
  });

  it('1e14 away: refused, saying how many digits are left for the plate', () => {
    let caught: unknown;
    try {
      buildGeometry(plateAt(1e14, 1e14).plate);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(GeometryError);
    const e = caught as GeometryError;
    expect(e.keyPath).toBe('plate.outline');
    // 15.95 − log10(1e14 / 141.4) − … : log10(141.4 / (1.000001e14 · 2⁻⁵²)) = 3.8
    expect(e.message).toContain('lies 1.00e14 from the origin');
    expect(e.message).toContain('leaving 3.8 for the plate');
    expect(e.message).toContain(`peakwise needs ${MIN_DIGITS_LEFT}`);
  });

  it('the limit sits between 1e8 and 1e9 for a 100 mm plate (9 digits)', () => {
    expect(() => buildGeometry(plateAt(1e8, 0).plate)).not.toThrow();
    expect(() => buildGeometry(plateAt(1e9, 0).plate)).toThrow(/leaving 8\.8 for the plate/);
  });

  it('messages name points in the model coordinates, not about the plate centre', () => {
    const crossing = parseModel(`
material: { E: 210000, nu: 0.3 }
thickness: 2
plate: { outline: [[1000, 1000], [1100, 1100], [1100, 1000], [1000, 1100]] }
supports: [ { where: { x: 1000 }, fix: [x, y] } ]
loads: [ { where: { x: 1100 }, traction: [1, 0] } ]
`, 'bowtie.yaml');
    expect(() => buildGeometry(crossing.plate)).toThrow('near (1050, 1050)');
  });
});
