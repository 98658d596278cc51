import { describe, expect, it } from 'vitest';
import { inglisField, kirschCartesian } from '../../src/reference/index.js';

/*
 * The elliptical-hole field of src/reference/inglis.ts (Muskhelishvili's potentials, recalled from
 * memory) checked against what defines Inglis' (1913) problem: a traction-free hole edge, the remote
 * uniaxial tension, Kt = 1 + 2a/b at the ends of a, and displacements whose strains give the
 * stresses by Hooke's law (plane stress). As b → a it must become Kirsch's (1898) field.
 */
const S = 100, E = 200000, nu = 0.3;

describe('Inglis field from the complex potentials', () => {
  it('Kt = 1 + 2a/b at (±a, 0) and σ = −S at (0, ±b) (Inglis 1913)', () => {
    for (const [a, b] of [[1, 0.5], [1, 1 / 3], [3, 2]]) {
      expect(inglisField(S, a, b, a * (1 + 1e-13), 0, E, nu).syy / S).toBeCloseTo(1 + (2 * a) / b, 9);
      expect(inglisField(S, a, b, 0, b * (1 + 1e-13), E, nu).sxx / S).toBeCloseTo(-1, 9);
    }
  });
  it('the hole edge is traction-free and the far field is σyy = S', () => {
    const a = 1, b = 0.5;
    let worst = 0;
    for (let k = 0; k < 72; k++) {
      const t = (2 * Math.PI * (k + 0.3)) / 72;
      const x = a * Math.cos(t) * (1 + 1e-13), y = b * Math.sin(t) * (1 + 1e-13);
      const f = inglisField(S, a, b, x, y, E, nu);
      const nx0 = Math.cos(t) / a, ny0 = Math.sin(t) / b, l = Math.hypot(nx0, ny0);
      const nx = nx0 / l, ny = ny0 / l;
      worst = Math.max(worst, Math.hypot(f.sxx * nx + f.sxy * ny, f.sxy * nx + f.syy * ny) / S);
    }
    expect(worst).toBeLessThan(1e-9);
    const far = inglisField(S, a, b, 3000, 4000, E, nu);
    expect(Math.abs(far.syy / S - 1)).toBeLessThan(1e-6);
    expect(Math.abs(far.sxx / S) + Math.abs(far.sxy / S)).toBeLessThan(1e-6);
  });
  it('strains of the displacement give the stresses (Hooke, plane stress), and there is no rigid motion', () => {
    const a = 1, b = 0.4, dh = 1e-5;
    for (const [x, y] of [[1.3, 0.2], [0.4, 0.9], [-2, 1.5], [2.5, -0.3]]) {
      const u = (px: number, py: number) => inglisField(S, a, b, px, py, E, nu);
      const exx = (u(x + dh, y).ux - u(x - dh, y).ux) / (2 * dh);
      const eyy = (u(x, y + dh).uy - u(x, y - dh).uy) / (2 * dh);
      const gxy = (u(x, y + dh).ux - u(x, y - dh).ux) / (2 * dh) + (u(x + dh, y).uy - u(x - dh, y).uy) / (2 * dh);
      const c = E / (1 - nu * nu);
      const f = u(x, y);
      expect(c * (exx + nu * eyy)).toBeCloseTo(f.sxx, 4);
      expect(c * (eyy + nu * exx)).toBeCloseTo(f.syy, 4);
      expect((E / (2 * (1 + nu))) * gxy).toBeCloseTo(f.sxy, 4);
    }
    // symmetric about both axes: u_x = 0 on x = 0, u_y = 0 on y = 0
    expect(Math.abs(inglisField(S, a, b, 0, 2, E, nu).ux)).toBeLessThan(1e-15);
    expect(Math.abs(inglisField(S, a, b, 2, 0, E, nu).uy)).toBeLessThan(1e-15);
  });
  it('a nearly circular hole gives Kirsch\'s (1898) field, turned by 90° (load along y)', () => {
    const f = inglisField(S, 1 + 1e-7, 1 - 1e-7, 1.3, 0.7, E, nu);
    // Kirsch's load runs along x: evaluate it at the point turned by −90°, (x, y) → (y, −x)
    const k = kirschCartesian(S, 1, 0.7, -1.3);
    expect(f.sxx).toBeCloseTo(k.syy, 4);
    expect(f.syy).toBeCloseTo(k.sxx, 4);
    expect(f.sxy).toBeCloseTo(-k.sxy, 4);
  });
});
