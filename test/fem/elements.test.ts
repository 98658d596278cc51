import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { elasticityMatrix, elementStiffnessCst, elementStiffnessLst } from '../../src/fem/index.js';

describe('elasticityMatrix', () => {
  // derived from the D matrices of any elasticity text, e.g.
  // Cook, Malkus, Plesha & Witt (2002)]: E = 210 000, ν = 0.3, printed to 3 decimals
  it('plane stress D11, D12, D33 for E = 210000, nu = 0.3', () => {
    const D = elasticityMatrix({ E: 210000, nu: 0.3, state: 'plane-stress' });
    expect(D[0]).toBeCloseTo(230769.231, 2);
    expect(D[1]).toBeCloseTo(69230.769, 2);
    expect(D[8]).toBeCloseTo(80769.231, 2);
    expect(D[2]).toBe(0);
    expect(D[3]).toBe(D[1]);
  });
  it('plane strain D11, D12, D33 for E = 210000, nu = 0.3', () => {
    const D = elasticityMatrix({ E: 210000, nu: 0.3, state: 'plane-strain' });
    expect(D[0]).toBeCloseTo(282692.308, 2);
    expect(D[1]).toBeCloseTo(121153.846, 2);
    expect(D[8]).toBeCloseTo(80769.231, 2);
  });
});

function eigenvalues(k: Float64Array, n: number): number[] {
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m.set(i, j, k[i * n + j]);
  return new EigenvalueDecomposition(m, { assumeSymmetric: true }).realEigenvalues.slice().sort((a, b) => a - b);
}

function rigidModes(xy: number[]): number[][] {
  const n = xy.length / 2;
  const tx: number[] = [], ty: number[] = [], rot: number[] = [];
  for (let i = 0; i < n; i++) {
    tx.push(1, 0);
    ty.push(0, 1);
    rot.push(-xy[2 * i + 1], xy[2 * i]);
  }
  return [tx, ty, rot];
}

const D = elasticityMatrix({ E: 1e6, nu: 0.25, state: 'plane-stress' });
const cstXY = [0.1, 0.2, 1.3, 0.4, 0.5, 1.1];
const lstStraight = [0, 0, 2, 0.3, 0.4, 1.5, 1, 0.15, 1.2, 0.9, 0.2, 0.75];
// same element with its mid-side nodes pushed off the chords (curved edges)
const lstCurved = [0, 0, 2, 0.3, 0.4, 1.5, 1.05, 0.05, 1.3, 1.0, 0.1, 0.8];

/*
 * Element checks of the patch test literature (Irons & Razzaque 1972; MacNeal & Harder 1985):
 * a free element's stiffness is symmetric, positive semi-definite with exactly three zero
 * eigenvalues (two translations and a rotation), and K times a rigid-body vector is zero.
 */
describe.each([
  ['CST', cstXY, 6, (xy: number[]) => elementStiffnessCst(xy, D, 0.01)],
  ['LST straight', lstStraight, 12, (xy: number[]) => elementStiffnessLst(xy, D, 0.01)],
  ['LST curved', lstCurved, 12, (xy: number[]) => elementStiffnessLst(xy, D, 0.01)],
] as const)('%s element stiffness', (_name, xy, n, stiffness) => {
  const k = stiffness([...xy]);
  const kMax = Math.max(...Array.from(k, Math.abs));
  it('is symmetric to round-off', () => {
    let asym = 0;
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) asym = Math.max(asym, Math.abs(k[i * n + j] - k[j * n + i]));
    expect(asym / kMax).toBeLessThan(1e-14);
  });
  it('has exactly three zero eigenvalues and the rest positive', () => {
    const ev = eigenvalues(k, n);
    const top = ev[n - 1];
    for (let i = 0; i < 3; i++) expect(Math.abs(ev[i]) / top).toBeLessThan(1e-12);
    expect(ev[3] / top).toBeGreaterThan(1e-6);
  });
  it('maps rigid translations and the rotation to zero force', () => {
    for (const mode of rigidModes([...xy])) {
      for (let i = 0; i < n; i++) {
        let s = 0;
        for (let j = 0; j < n; j++) s += k[i * n + j] * mode[j];
        expect(Math.abs(s) / kMax).toBeLessThan(1e-12);
      }
    }
  });
});

describe('CST stiffness against the closed form', () => {
  // right triangle (0,0), (1,0), (0,1), ν = 0, E = 1, t = 1: the K11 entry is
  // t·A·(b1² D11 + c1² D33) = ½ (1 + ½·1) = 0.75 with b1 = −1, c1 = −1 (Turner et al. 1956)
  it('K[0][0] of the unit right triangle', () => {
    const d = elasticityMatrix({ E: 1, nu: 0, state: 'plane-stress' });
    const k = elementStiffnessCst([0, 0, 1, 0, 0, 1], d, 1);
    expect(k[0]).toBeCloseTo(0.75, 14);
    // the same for a straight-sided LST carries total diagonal-block energy of a linear field:
    // u = x on the LST gives the same strain energy ½·uᵀKu = ½·E·A = 0.25 as on the CST
    const kl = elementStiffnessLst([0, 0, 1, 0, 0, 1, 0.5, 0, 0.5, 0.5, 0, 0.5], d, 1);
    const ux = [0, 0, 1, 0, 0, 0, 0.5, 0, 0.5, 0, 0, 0];
    let energy = 0;
    for (let i = 0; i < 12; i++) for (let j = 0; j < 12; j++) energy += 0.5 * ux[i] * kl[i * 12 + j] * ux[j];
    expect(energy).toBeCloseTo(0.25, 14);
  });
});
