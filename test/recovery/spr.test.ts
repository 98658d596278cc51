import { describe, it, expect } from 'vitest';
import { recoverSpr, recoverAverage } from '../../src/recovery/index.js';
import type { ElasticSection } from '../../src/fem/types.js';
import { rectMesh, sampledGauss } from './hand-mesh.js';

const steel: ElasticSection = { E: 210_000, nu: 0.3, state: 'plane-stress', thickness: 1 };

function maxNodalError(stress: Float64Array, xy: Float64Array, fn: (x: number, y: number) => [number, number, number]): number {
  let err = 0;
  for (let n = 0; n < xy.length / 2; n++) {
    const ex = fn(xy[2 * n], xy[2 * n + 1]);
    for (let c = 0; c < 3; c++) err = Math.max(err, Math.abs(stress[3 * n + c] - ex[c]));
  }
  return err;
}

// Zienkiewicz & Zhu (1992), IJNME 33, Part 1: a least-squares fit of a complete polynomial of
// degree p reproduces any field of degree ≤ p exactly (Zienkiewicz & Zhu 1992, "property a test can
// rely on"); the boundary nodes take values of the same polynomials, so they are exact too.
describe('SPR polynomial reproduction', () => {
  it('CST: a constant stress is recovered exactly at every node', () => {
    const mesh = rectMesh(7, 5, 3, 2, 1, 0.5, 11);
    const fn = () => [120, -35, 17] as [number, number, number];
    const field = recoverSpr(mesh, sampledGauss(mesh, fn), steel);
    expect(maxNodalError(field.stress, mesh.xy, fn) / 120).toBeLessThan(1e-8);
    expect(field.method).toBe('spr');
  });

  it('CST: a linear field sampled at centroids is also reproduced (patch fit of degree 1)', () => {
    const mesh = rectMesh(6, 6, 1, 1, 1, 0.6, 3);
    const fn = (x: number, y: number) => [10 + 3 * x - 2 * y, 4 * y, -x + 0.5] as [number, number, number];
    const field = recoverSpr(mesh, sampledGauss(mesh, fn), steel);
    expect(maxNodalError(field.stress, mesh.xy, fn)).toBeLessThan(1e-8 * 10);
  });

  it('LST: pure bending σxx = M y / I (Timoshenko & Goodier 1970) is recovered exactly', () => {
    // beam of depth 2c = 1, length 8, bending moment M per unit thickness: σxx = M y / I, I = (2c)³/12
    const L = 8;
    const D = 1;
    const M = 5;
    const I = D ** 3 / 12;
    const mesh = rectMesh(16, 3, L, D, 2, 0.4, 7);
    // shift so the neutral axis y = 0 is the beam's mid-depth
    const fn = (x: number, y: number) => [(M * (y - D / 2)) / I, 0, 0] as [number, number, number];
    const gauss = sampledGauss(mesh, fn);
    const field = recoverSpr(mesh, gauss, steel);
    const peak = (M * (D / 2)) / I;
    expect(maxNodalError(field.stress, mesh.xy, fn) / peak).toBeLessThan(1e-8);
  });

  it('LST: a general linear field is reproduced on a coarse 2×1 mesh (boundary-only patches)', () => {
    const mesh = rectMesh(2, 1, 2, 1, 2, 0, 1);
    const fn = (x: number, y: number) => [1 + x, 2 - 3 * y, x * 0.5 + y] as [number, number, number];
    const field = recoverSpr(mesh, sampledGauss(mesh, fn), steel);
    expect(maxNodalError(field.stress, mesh.xy, fn)).toBeLessThan(1e-8);
  });

  it('a lone element still gets a field: linear for the LST, its constant for the CST', () => {
    for (const order of [1, 2] as const) {
      const base = rectMesh(1, 1, 1, 1, order);
      const npe = base.nodesPerElem;
      // keep only the first triangle (nodes keep their ids; unused nodes simply get no value)
      const mesh = { ...base, elemNodes: base.elemNodes.slice(0, npe) };
      const fn = (x: number, y: number) => (order === 2 ? [2 + x - y, 3 * y, -x] : [5, -1, 2]) as [number, number, number];
      const field = recoverSpr(mesh, sampledGauss(mesh, fn), steel);
      for (let i = 0; i < npe; i++) {
        const n = mesh.elemNodes[i];
        const e = fn(mesh.xy[2 * n], mesh.xy[2 * n + 1]);
        for (let k = 0; k < 3; k++) expect(Math.abs(field.stress[3 * n + k] - e[k])).toBeLessThan(1e-10);
      }
    }
  });

  it('plane strain: σzz = ν(σxx + σyy) at each node (Hooke\'s law, plane strain)', () => {
    const mesh = rectMesh(4, 4, 1, 1, 1, 0.3, 5);
    const fn = () => [-1, 5 / 3, 0] as [number, number, number];
    const strain = { ...steel, state: 'plane-strain' as const };
    const field = recoverSpr(mesh, sampledGauss(mesh, fn, strain), strain);
    for (const szz of field.szz) expect(Math.abs(szz - 0.2)).toBeLessThan(1e-12);
  });
});

describe('nodal averaging', () => {
  it('LST: the element fields extrapolated to nodes and averaged reproduce a linear field', () => {
    // each element's Gauss values are exact samples of the linear field, so the element's own
    // linear fit is exact and so is any weighted average of the values at a node
    const mesh = rectMesh(5, 4, 2, 1, 2, 0.5, 9);
    const fn = (x: number, y: number) => [3 * x - y, 1 + 2 * y, 0.25 * x] as [number, number, number];
    const field = recoverAverage(mesh, sampledGauss(mesh, fn), steel);
    expect(maxNodalError(field.stress, mesh.xy, fn)).toBeLessThan(1e-10);
    expect(field.method).toBe('average');
  });

  it('CST: a node takes the area-weighted mean of its elements\' constants', () => {
    // unit square split by the diagonal (0,0)–(1,1): element centroids at x = 2/3 and 1/3
    const mesh = rectMesh(1, 1, 1, 1, 1);
    const field = recoverAverage(mesh, sampledGauss(mesh, (x) => [x, 0, 0]), steel);
    const expected = [0.5, 2 / 3, 1 / 3, 0.5]; // nodes (0,0), (1,0), (0,1), (1,1); equal areas
    expected.forEach((v, n) => expect(Math.abs(field.stress[3 * n] - v)).toBeLessThan(1e-15));
  });
});
