import { describe, it, expect } from 'vitest';
import {
  kirschPolar, kirschCartesian, kirschDisplacement, kirschHoopAtEdge, lameRing, inglisKt, inglisKtFromRadius,
  heywoodKtn, heywoodKtg, howlandKtg, petersonFitKtn, roarkKtn, grossToNet, cantileverStress, cantileverDisplacement,
  cantileverTipDeflection, flamantStress, lShapeModeIField, wedgeModeIB,
} from '../../src/reference/index.js';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('Kirsch (1898) circular hole', () => {
  it('hoop stress 3S at θ = 90° and −S at θ = 0 on the edge', () => {
    expect(kirschPolar(1, 1, 1, Math.PI / 2).stt).toBeCloseTo(3, 12);
    expect(kirschPolar(1, 1, 1, 0).stt).toBeCloseTo(-1, 12);
    // hole edge traction-free
    const e = kirschPolar(2, 1.5, 1.5, 0.7);
    expect(Math.abs(e.srr) + Math.abs(e.srt)).toBeLessThan(1e-14);
  });
  it('Cartesian form equals the rotated polar form (derived)', () => {
    for (const [x, y] of [[1.3, 0.4], [-2, 3], [0.2, -1.7]]) {
      const r = Math.hypot(x, y), t = Math.atan2(y, x);
      const p = kirschPolar(1, 1, r, t);
      const c = Math.cos(t), s = Math.sin(t);
      const sxx = p.srr * c * c + p.stt * s * s - 2 * p.srt * s * c;
      const syy = p.srr * s * s + p.stt * c * c + 2 * p.srt * s * c;
      const sxy = (p.srr - p.stt) * s * c + p.srt * (c * c - s * s);
      const k = kirschCartesian(1, 1, x, y);
      expect(k.sxx).toBeCloseTo(sxx, 12);
      expect(k.syy).toBeCloseTo(syy, 12);
      expect(k.sxy).toBeCloseTo(sxy, 12);
    }
  });
  it('decay table on θ = 90°: 1.219 at r = 2a, 1.022 at 5a (Kirsch 1898, evaluated by hand)', () => {
    expect(kirschCartesian(1, 1, 0, 2).sxx).toBeCloseTo(1.219, 3);
    expect(kirschCartesian(1, 1, 0, 5).sxx).toBeCloseTo(1.022, 3);
    expect(kirschCartesian(1, 1, 2, 0).syy).toBeCloseTo(0.031, 3);
  });
  it('displacements: u_x(a,0) = 3Sa/E, u_y(0,a) = −Sa/E, u_x(5a,0) = 5.52480 Sa/E (ν = 0.3)', () => {
    expect(kirschDisplacement(1, 1, 1, 0, 1, 0.3).ux).toBeCloseTo(3, 10);
    expect(kirschDisplacement(1, 1, 0, 1, 1, 0.3).uy).toBeCloseTo(-1, 10);
    expect(kirschDisplacement(1, 1, 5, 0, 1, 0.3).ux).toBeCloseTo(5.5248, 4);
    expect(kirschDisplacement(1, 1, 0, 5, 1, 0.3).uy).toBeCloseTo(-1.7648, 4);
  });
  it('biaxial superposition: pure shear ±4S, equal biaxial 2S', () => {
    expect(kirschHoopAtEdge(1, -1, Math.PI / 2)).toBeCloseTo(4, 12);
    expect(kirschHoopAtEdge(1, 1, 0.3)).toBeCloseTo(2, 12);
  });
});

describe('Lamé (1852) ring a = 1, b = 2, p = 1, E = 1000, ν = 0.3 (Timoshenko & Goodier 1970)', () => {
  it('plane stress', () => {
    const a = lameRing({ a: 1, b: 2, p: 1 }, 1, 1000, 0.3);
    expect(a.sr).toBeCloseTo(-1, 12);
    expect(a.st).toBeCloseTo(5 / 3, 12);
    expect(rel(a.ur, 1.966667e-3)).toBeLessThan(1e-6);
    expect(rel(lameRing({ a: 1, b: 2, p: 1 }, 1.25, 1000, 0.3).ur, 1.678333e-3)).toBeLessThan(1e-6);
    expect(lameRing({ a: 1, b: 2, p: 1 }, 1.5, 1000, 0.3).sr).toBeCloseTo(-0.259259, 6);
  });
  it('plane strain: u_r(1) = 1.906667e−3, u_r(2) = 1.213333e−3, σ_z = 0.2', () => {
    const a = lameRing({ a: 1, b: 2, p: 1 }, 1, 1000, 0.3, 'plane-strain');
    expect(rel(a.ur, 1.906667e-3)).toBeLessThan(1e-6);
    expect(a.sz).toBeCloseTo(0.2, 12);
    expect(rel(lameRing({ a: 1, b: 2, p: 1 }, 2, 1000, 0.3, 'plane-strain').ur, 1.213333e-3)).toBeLessThan(1e-6);
  });
});

describe('Inglis (1913) and the finite-width strip', () => {
  it('Kt = 1 + 2a/b: 3, 5, 7, 11', () => {
    expect([1, 2, 3, 5].map((r) => inglisKt(r, 1))).toEqual([3, 5, 7, 11]);
    expect(inglisKtFromRadius(3, 1 / 3)).toBeCloseTo(7, 12); // ρ = b²/a
  });
  it('Heywood (1952) formula K_tn = 2 + (1 − d/W)³ (from memory)', () => {
    expect(heywoodKtn(0.1)).toBeCloseTo(2.729, 3);
    expect(heywoodKtg(0.5)).toBeCloseTo(4.25, 3);
    expect(petersonFitKtn(0.3)).toBeCloseTo(2.358, 3);
    expect(roarkKtn(0.4)).toBeCloseTo(2.236, 3);
    expect(grossToNet(4.348, 0.5)).toBeCloseTo(2.174, 3);
  });
  it('Howland (1930) interpolation hits the table and lies between neighbours', () => {
    expect(howlandKtg(0.2)).toBeCloseTo(3.14, 12);
    expect(howlandKtg(0)).toBeCloseTo(3, 12);
    const v = howlandKtg(0.05);
    expect(v).toBeGreaterThan(3);
    expect(v).toBeLessThan(3.03);
    expect(() => howlandKtg(0.6)).toThrow(RangeError);
  });
});

describe('Timoshenko & Goodier cantilever, case (c) (Augarde & Deeks 2008)', () => {
  const c = { L: 10, D: 1, t: 1, P: 1, E: 1000, nu: 0.3 };
  it('tip deflection 4.0275 and 0.0089 for the second beam', () => {
    expect(cantileverTipDeflection(c)).toBeCloseTo(4.0275, 10);
    expect(-cantileverDisplacement(c, 10, 0).uy).toBeCloseTo(4.0275, 10);
    expect(cantileverTipDeflection({ L: 48, D: 12, t: 1, P: 1000, E: 3e7, nu: 0.3 })).toBeCloseTo(0.0089, 10);
  });
  it('root fibre 60, σ_xx(L/2, D/2) = 30, τ_max 1.5, u(L, D/2) = 0.3, u(0, ±D/2) = 0', () => {
    expect(cantileverStress(c, 0, 0.5).sxx).toBeCloseTo(60, 12);
    expect(cantileverStress(c, 5, 0.5).sxx).toBeCloseTo(30, 12);
    expect(cantileverStress(c, 3, 0).sxy).toBeCloseTo(-1.5, 12);
    expect(cantileverDisplacement(c, 10, 0.5).ux).toBeCloseTo(0.3, 12);
    expect(cantileverDisplacement(c, 0, -0.5).ux).toBeCloseTo(0, 14);
  });
});

describe('Flamant point load on a half-plane', () => {
  it('σ_r = −2P/(πtr) under the load; the resultant over a half-circle equals the load', () => {
    const s = flamantStress(1000, 10, 0, -2);
    expect(s.syy).toBeCloseTo((-2 * 1000) / (Math.PI * 10 * 2), 12);
    // equilibrium: ∫ σ·n ds over the half circle r = R (n outward radial) times t balances P
    const R = 3, t = 10, n = 2000;
    let fy = 0;
    for (let i = 0; i < n; i++) {
      const phi = -Math.PI + ((i + 0.5) / n) * Math.PI; // lower half
      const x = R * Math.cos(phi), y = R * Math.sin(phi);
      const st = flamantStress(1000, t, x, y);
      fy += (st.sxy * Math.cos(phi) + st.syy * Math.sin(phi)) * R * (Math.PI / n) * t;
    }
    // traction on the cut from the outside material: the material inside carries −P
    expect(fy).toBeCloseTo(1000, 3);
  });
});

describe('Williams mode-I field on the L domain (Williams 1952, derived)', () => {
  it('B/A = 0.8387713994', () => {
    const B = wedgeModeIB(270, 0.5444837368);
    expect(B[0]).toBeCloseTo(0.8387713994, 9);
    expect(Math.abs(B[1])).toBeLessThan(1e-9);
  });
  it('point values of the table', () => {
    const table: [number, number, number[]][] = [
      [1, 1, [0.6885594, 3.28504506, 1.09665863, 0.3070793, 0.45421017]],
      [-1, 1, [-0.77007486, 0.77007486, 0.92993561, 0.92993561, 0.1782013]],
      [-1, -1, [-3.28504506, -0.6885594, 0.3070793, 1.09665863, 0.45421017]],
      [0.5, 0.5, [0.4721016, 2.25234749, 1.50381884, 0.42108969, 0.62284634]],
    ];
    for (const [x, y, v] of table) {
      const f = lShapeModeIField(x, y);
      const got = [f.ux, f.uy, f.sxx, f.syy, f.sxy];
      for (let i = 0; i < 5; i++) expect(got[i]).toBeCloseTo(v[i], 7);
    }
  });
  it('faces y = 0 (x > 0) and x = 0 (y < 0) are traction-free', () => {
    const a = lShapeModeIField(0.37, 0);
    expect(Math.abs(a.syy) + Math.abs(a.sxy)).toBeLessThan(1e-9);
    const b = lShapeModeIField(0, -0.61);
    expect(Math.abs(b.sxx) + Math.abs(b.sxy)).toBeLessThan(1e-9);
  });
});
