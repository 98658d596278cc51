/**
 * Nodal σzz from the Gauss-point σzz (contract 1 of this round, docs/recovery.md): recovered by the
 * same SPR (or averaging) as the in-plane components. Without a thermal part the plane-strain σzz is
 * ν(σxx + σyy) of the recovered stresses bit for bit, as before the Gauss σzz existed; any further part
 * (−EαΔT, or a σzz that is not ν(σxx + σyy) at all) is recovered on its own, and SPR reproduces a
 * field of the patch degree exactly (Zienkiewicz & Zhu, IJNME 33, 1992, Part 1).
 */
import { describe, expect, it } from 'vitest';
import { recoverAverage, recoverSpr } from '../../src/recovery/index.js';
import type { ElasticSection, GaussStresses } from '../../src/fem/types.js';
import { rectMesh, sampledGauss } from './hand-mesh.js';

const strain: ElasticSection = { E: 210_000, nu: 0.3, state: 'plane-strain', thickness: 1 };
const stress: ElasticSection = { ...strain, state: 'plane-stress' };

const field = (x: number, y: number) => [100 + 20 * x - 7 * y + 3 * x * y, -40 + 5 * y * y, 12 * x] as [number, number, number];

/** The same Gauss stresses with `extra(x, y)` added to σzz. */
function withExtra(g: GaussStresses, extra: (x: number, y: number) => number): GaussStresses {
  const szz = g.szz.slice();
  for (let k = 0; k < szz.length; k++) szz[k] += extra(g.xy[2 * k], g.xy[2 * k + 1]);
  return { ...g, szz };
}

describe('nodal σzz from the Gauss σzz', () => {
  it.each([1, 2] as const)('order %i, plane strain, no thermal part: σzz = ν(σxx + σyy) of the recovered field, bit for bit', (order) => {
    const mesh = rectMesh(6, 5, 3, 2, order, 0.4, 7);
    const g = sampledGauss(mesh, field, strain);
    for (const f of [recoverSpr(mesh, g, strain), recoverAverage(mesh, g, strain)]) {
      for (let n = 0; n < f.szz.length; n++) expect(f.szz[n]).toBe(strain.nu * (f.stress[3 * n] + f.stress[3 * n + 1]));
    }
  });

  it.each([1, 2] as const)('order %i, plane strain with a linear −EαΔT part: that part is reproduced at every node', (order) => {
    const mesh = rectMesh(6, 5, 3, 2, order, 0.4, 7);
    const thermal = (x: number, y: number) => -201.6 * (1 + 0.3 * x - 0.2 * y);
    const g = withExtra(sampledGauss(mesh, field, strain), thermal);
    const f = recoverSpr(mesh, g, strain);
    let worst = 0;
    for (let n = 0; n < f.szz.length; n++) {
      const x = mesh.xy[2 * n], y = mesh.xy[2 * n + 1];
      worst = Math.max(worst, Math.abs(f.szz[n] - strain.nu * (f.stress[3 * n] + f.stress[3 * n + 1]) - thermal(x, y)));
    }
    // round-off: SPR of degree ≥ 1 is exact for a linear field
    expect(worst / 201.6).toBeLessThan(1e-10);
  });

  it('plane stress with a σzz of its own (as an axisymmetric hoop stress would be): recovered like a stress component', () => {
    const mesh = rectMesh(6, 5, 3, 2, 2, 0.4, 9);
    const hoop = (x: number, y: number) => 50 + 4 * x * x - 3 * x * y + 2 * y;
    const g = withExtra(sampledGauss(mesh, field, stress), hoop);
    // the same SPR on σxx = hoop gives the same nodal values
    const asSxx = recoverSpr(mesh, sampledGauss(mesh, (x, y) => [hoop(x, y), 0, 0], stress), stress);
    const f = recoverSpr(mesh, g, stress);
    for (let n = 0; n < f.szz.length; n++) expect(f.szz[n]).toBeCloseTo(asSxx.stress[3 * n], 10);
    // and, quadratic, it is reproduced exactly by the LST's quadratic patches
    let worst = 0;
    for (let n = 0; n < f.szz.length; n++) worst = Math.max(worst, Math.abs(f.szz[n] - hoop(mesh.xy[2 * n], mesh.xy[2 * n + 1])));
    expect(worst / 50).toBeLessThan(1e-9);
  });

  it('plane stress without a σzz: 0 at every node', () => {
    const mesh = rectMesh(4, 4, 1, 1, 2);
    const f = recoverSpr(mesh, sampledGauss(mesh, field, stress), stress);
    expect(f.szz.every((v) => v === 0)).toBe(true);
  });
});
