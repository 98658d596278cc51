import { describe, it, expect } from 'vitest';
import { principal, vonMises, tresca, maxShear, measureValue, nodalMeasure } from '../../src/recovery/index.js';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

// Values derived by hand, formulas from Timoshenko & Goodier (1970) and
// Cook, Malkus, Plesha & Witt (2002). The table gives 4 decimals for the rounded entries, so
// those are compared with closed forms evaluated independently here, and to the table to 1e-6.
describe('stress invariants (Timoshenko & Goodier 1970)', () => {
  it('principal stresses and angle of (100, −50, 40)', () => {
    const p = principal(100, -50, 40);
    expect(rel(p.s1, 110)).toBeLessThan(1e-12); // 25 + √(75² + 40²) = 25 + 85
    expect(rel(p.s2, -60)).toBeLessThan(1e-12);
    // θp = ½ atan(80/150): exact value, and the table's 14.0362°
    expect(rel(p.angle, 0.5 * Math.atan(80 / 150))).toBeLessThan(1e-12);
    expect(Math.abs((p.angle * 180) / Math.PI - 14.0362)).toBeLessThan(5e-5);
  });

  it('von Mises and Tresca of (100, −50, 40), plane stress', () => {
    // √(σ1² − σ1σ2 + σ2²) with σ1 = 110, σ2 = −60: √(12100 + 6600 + 3600) = √22300
    expect(rel(vonMises(100, -50, 40), Math.sqrt(22300))).toBeLessThan(1e-12);
    expect(Math.abs(vonMises(100, -50, 40) - 149.3318)).toBeLessThan(5e-5);
    expect(rel(tresca(100, -50, 40), 170)).toBeLessThan(1e-12);
    expect(rel(maxShear(100, -50, 40), 85)).toBeLessThan(1e-12);
  });

  it('(80, 30, 0): von Mises 70, Tresca 80 — the out-of-plane zero governs Tresca', () => {
    expect(rel(vonMises(80, 30, 0), 70)).toBeLessThan(1e-12);
    expect(rel(tresca(80, 30, 0), 80)).toBeLessThan(1e-12);
    expect(rel(maxShear(80, 30, 0), 40)).toBeLessThan(1e-12);
  });

  it('plane strain: σzz enters von Mises and Tresca', () => {
    // Lamé bore (Lamé 1852) in plane strain, ν = 0.3: σr = −1, σθ = 5/3, σz = 0.2.
    // On the x axis σxx = σr, σyy = σθ. vm = √(½[(−1 − 5/3)² + (5/3 − 0.2)² + (0.2 + 1)²])
    const sr = -1;
    const st = 5 / 3;
    const sz = 0.3 * (sr + st);
    expect(rel(sz, 0.2)).toBeLessThan(1e-12);
    const vm = Math.sqrt(0.5 * ((sr - st) ** 2 + (st - sz) ** 2 + (sz - sr) ** 2));
    expect(rel(vonMises(sr, st, 0, sz), vm)).toBeLessThan(1e-12);
    expect(rel(tresca(sr, st, 0, sz), st - sr)).toBeLessThan(1e-12);
    // rotating the same state by 30° must not change an invariant
    const c = Math.cos(Math.PI / 6);
    const s = Math.sin(Math.PI / 6);
    const sxx = sr * c * c + st * s * s;
    const syy = sr * s * s + st * c * c;
    const sxy = (sr - st) * s * c;
    expect(rel(vonMises(sxx, syy, sxy, sz), vm)).toBeLessThan(1e-12);
    expect(rel(measureValue('tresca', sxx, syy, sxy, sz), st - sr)).toBeLessThan(1e-12);
    expect(rel(measureValue('max-principal', sxx, syy, sxy, sz), st)).toBeLessThan(1e-12);
  });

  it('measureValue and nodalMeasure pick the named component', () => {
    expect(measureValue('sxx', 1, 2, 3)).toBe(1);
    expect(measureValue('syy', 1, 2, 3)).toBe(2);
    expect(measureValue('sxy', 1, 2, 3)).toBe(3);
    const field = { stress: Float64Array.of(100, -50, 40, 80, 30, 0), szz: new Float64Array(2) };
    const vm = nodalMeasure(field, 'von-mises');
    expect(rel(vm[0], Math.sqrt(22300))).toBeLessThan(1e-12);
    expect(rel(vm[1], 70)).toBeLessThan(1e-12);
  });
});
