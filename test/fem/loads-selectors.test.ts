import { describe, expect, it } from 'vitest';
import { FemError } from '../../src/errors.js';
import { appliedResultant, edgeTractionLoad, loadVector, pressureLoad, selectBoundary } from '../../src/fem/index.js';
import type { Load, Selector } from '../../src/model/types.js';
import { quarterAnnulusGeometry, quarterAnnulusMesh, rectangleGeometry, rectangleMesh } from './helpers/meshes.js';
import { edgesOfPieces } from './helpers/problems.js';

const rect = rectangleGeometry(0, 0, 4, 2);
const section = { thickness: 0.5 };

describe('selectBoundary', () => {
  const mesh = rectangleMesh(0, 0, 4, 2, 4, 2, 2);
  it('x = 4 takes the 2 right-hand edges and their 5 nodes (LST)', () => {
    const s = selectBoundary(mesh, rect, { kind: 'x', value: 4 }, 'loads[0].where');
    expect(s.edges.length).toBe(2);
    expect(s.nodes.length).toBe(5);
    for (const n of s.nodes) expect(mesh.xy[2 * n]).toBe(4);
  });
  it('a segment takes only the edges lying on it', () => {
    const s = selectBoundary(mesh, rect, { kind: 'segment', from: [0, 0], to: [2, 0] }, 'supports[0].where');
    expect(s.edges.length).toBe(2);
    for (const n of s.nodes) expect(mesh.xy[2 * n]).toBeLessThanOrEqual(2);
  });
  it('outline takes every boundary edge', () => {
    const s = selectBoundary(mesh, rect, { kind: 'outline' }, 'loads[0].where');
    expect(s.edges.length).toBe(mesh.boundaryPiece.length);
  });
  it('a point within tolerance snaps to its node', () => {
    const s = selectBoundary(mesh, rect, { kind: 'point', at: [4, 2 + 1e-9] }, 'loads[0].where');
    expect(s.nodes.length).toBe(1);
    expect([mesh.xy[2 * s.nodes[0]], mesh.xy[2 * s.nodes[0] + 1]]).toEqual([4, 2]);
  });
  it.each([
    [{ kind: 'point', at: [1.2, 0.3] }, /no node at point \(1\.2, 0\), the boundary point nearest to \(1\.2, 0\.3\); nearest boundary node is \d+ at \(1, 0\) at distance 0\.2 /],
    [{ kind: 'x', value: 3.3 }, /\{ x: 3\.3 \} matches no boundary edge/],
    [{ kind: 'opening', id: 'door' }, /no opening with id 'door' \(openings: none\)/],
  ] as Array<[Selector, RegExp]>)('%o that matches nothing is a FemError naming the key path', (selector, message) => {
    let caught: unknown;
    try {
      selectBoundary(mesh, rect, selector, 'loads[2].where');
    } catch (err) {
      caught = err;
    }
    expect(caught).toBeInstanceOf(FemError);
    expect((caught as FemError).keyPath).toBe('loads[2].where');
    expect((caught as FemError).message).toMatch(message);
  });
});

describe('consistent edge loads', () => {
  it('uniform traction on a straight 3-node edge splits 1/6, 2/3, 1/6 (LST)', () => {
    // consistent loads of a quadratic edge: ∫ N_i ds = ℓ/6, 2ℓ/3, ℓ/6 (e.g. Cook et al. 2002, §3.10)
    const mesh = rectangleMesh(0, 0, 4, 2, 1, 1, 2);
    const f = loadVector(mesh, rect, section, [
      { kind: 'traction', where: { kind: 'x', value: 4 }, traction: [3, 0], keyPath: 'loads[0]' },
    ]);
    const total = 3 * 2 * 0.5;
    const e = selectBoundary(mesh, rect, { kind: 'x', value: 4 }, 'w').edges[0];
    const [na, nb, nm] = [mesh.boundaryEdges[3 * e], mesh.boundaryEdges[3 * e + 1], mesh.boundaryEdges[3 * e + 2]];
    expect(f[2 * na]).toBeCloseTo(total / 6, 14);
    expect(f[2 * nb]).toBeCloseTo(total / 6, 14);
    expect(f[2 * nm]).toBeCloseTo((2 * total) / 3, 14);
    expect(appliedResultant(f)).toEqual([expect.closeTo(total, 13), 0]);
  });
  it('linearly varying traction on 2-node edges gives the trapezoid-rule nodal split', () => {
    // t_x = y on x = 4 over 0 ≤ y ≤ 2, t = 1: resultant ∫ y dy = 2, moment about y = 0: ∫ y² dy = 8/3
    const mesh = rectangleMesh(0, 0, 4, 2, 1, 4, 1);
    const edges = edgesOfPieces(mesh, [1]);
    const f = edgeTractionLoad(mesh, edges, 1, (_x, y) => [y, 0]);
    let fx = 0, m = 0;
    for (let n = 0; n < mesh.xy.length / 2; n++) {
      fx += f[2 * n];
      m += f[2 * n] * mesh.xy[2 * n + 1];
    }
    expect(fx).toBeCloseTo(2, 14);
    // consistent linear loads reproduce the moment of a linear traction exactly
    expect(m).toBeCloseTo(8 / 3, 14);
  });
  it('pressure on a curved LST arc: resultant p·(chord rotated), any element count', () => {
    // ∫ −p n ds = −p (Δy, −Δx) along the edge chain, exact for the quadratic edge map
    const mesh = quarterAnnulusMesh(1, 2, 2, 3, 2);
    const f = pressureLoad(mesh, edgesOfPieces(mesh, [3]), 1, 2.5);
    const [fx, fy] = appliedResultant(f);
    expect(fx).toBeCloseTo(2.5, 13);
    expect(fy).toBeCloseTo(2.5, 13);
    // the pressure pushes on the bore surface: forces point away from the centre
    for (let n = 0; n < mesh.xy.length / 2; n++) {
      expect(f[2 * n] * mesh.xy[2 * n] + f[2 * n + 1] * mesh.xy[2 * n + 1]).toBeGreaterThanOrEqual(-1e-15);
    }
  });
  it('a pressure on the outline of a rectangle sums to zero and points inward', () => {
    const mesh = rectangleMesh(0, 0, 4, 2, 2, 2, 1);
    const loads: Load[] = [{ kind: 'pressure', where: { kind: 'outline' }, pressure: 7, keyPath: 'loads[0]' }];
    const f = loadVector(mesh, rect, section, loads);
    const [fx, fy] = appliedResultant(f);
    expect(Math.abs(fx) + Math.abs(fy)).toBeLessThan(1e-12);
    const top = selectBoundary(mesh, rect, { kind: 'y', value: 2 }, 'w').nodes;
    let fyTop = 0;
    for (const n of top) fyTop += f[2 * n + 1];
    expect(fyTop).toBeCloseTo(-7 * 4 * 0.5, 12);
  });
  it('a concentrated force lands on its node, whole thickness', () => {
    const mesh = rectangleMesh(0, 0, 4, 2, 2, 2, 2);
    const f = loadVector(mesh, rect, section, [{ kind: 'force', where: { kind: 'point', at: [4, 2] }, force: [0, -1000], keyPath: 'loads[0]' }]);
    expect(appliedResultant(f)).toEqual([0, -1000]);
  });
  it('a force on a line selector is a FemError', () => {
    const mesh = rectangleMesh(0, 0, 4, 2, 2, 2, 1);
    expect(() => loadVector(mesh, rect, section, [{ kind: 'force', where: { kind: 'x', value: 4 }, force: [1, 0], keyPath: 'loads[1]' }])).toThrow(FemError);
  });
});

describe('hand-made geometry of the quarter ring', () => {
  it('is consistent with its mesh: the inner arc edges lie on r = a', () => {
    const mesh = quarterAnnulusMesh(1, 2, 2, 4, 2);
    const geom = quarterAnnulusGeometry(1, 2);
    expect(geom.pieces[3].curve.kind).toBe('arc');
    for (const e of edgesOfPieces(mesh, [3])) {
      for (let j = 0; j < 3; j++) {
        const n = mesh.boundaryEdges[3 * e + j];
        expect(Math.hypot(mesh.xy[2 * n], mesh.xy[2 * n + 1])).toBeCloseTo(1, 14);
      }
    }
  });
});
