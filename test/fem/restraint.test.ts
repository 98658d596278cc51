import { describe, expect, it } from 'vitest';
import { FemError, SolveError } from '../../src/errors.js';
import { solvePlate, type ElasticSection } from '../../src/fem/index.js';
import type { Mesh } from '../../src/mesh/types.js';
import type { Load, Support } from '../../src/model/types.js';
import { meshFromTriangles, rectangleGeometry, rectangleMesh } from './helpers/meshes.js';

const section: ElasticSection = { E: 200000, nu: 0.3, state: 'plane-stress', thickness: 5 };
const geometry = rectangleGeometry(0, 0, 100, 40);
const pull: Load[] = [{ kind: 'traction', where: { kind: 'x', value: 100 }, traction: [10, 0], keyPath: 'loads[0]' }];
const sup = (where: Support['where'], x: boolean, y: boolean, i: number): Support => ({ where, fix: { x, y }, keyPath: `supports[${i}]` });

function solveError(mesh: Mesh, supports: Support[]): SolveError {
  try {
    solvePlate({ mesh, geometry, section, supports, loads: pull });
  } catch (err) {
    if (err instanceof SolveError) return err;
    throw err;
  }
  throw new Error('expected a SolveError');
}

describe('rigid-body restraint is checked before factorising', () => {
  const mesh = rectangleMesh(0, 0, 100, 40, 5, 2, 2);
  it('no supports at all', () => {
    expect(solveError(mesh, []).message).toMatch(/not supported: it is free to move in x and in y and to rotate/);
  });
  it('only y fixed: free to move in x', () => {
    expect(solveError(mesh, [sup({ kind: 'y', value: 0 }, false, true, 0)]).message).toMatch(/free to move in x \(no support fixes x\)/);
  });
  it('only x fixed on one vertical line: free to move in y', () => {
    const e = solveError(mesh, [sup({ kind: 'x', value: 0 }, true, false, 0)]);
    expect(e.message).toMatch(/free to move in y \(no support fixes y\)/);
  });
  it('y fixed at one point only: free to move in x and to rotate about a point of x = 100', () => {
    const e = solveError(mesh, [sup({ kind: 'point', at: [100, 40] }, false, true, 0)]);
    expect(e.message).toMatch(/free to move in x \(no support fixes x\), and free to rotate about a point of the line x = 100/);
    expect(e.keyPath).toBe('supports');
  });
  it('one pinned point: free to rotate about it', () => {
    const e = solveError(mesh, [sup({ kind: 'point', at: [0, 0] }, true, true, 0)]);
    expect(e.message).toMatch(/free to rotate about \(0, 0\)/);
  });
  it('a pin and a roller pushing through the pin: free to rotate about the pin', () => {
    // roller at (100, 0) fixing x acts along the line y = 0 through the pin at (0, 0)
    const e = solveError(mesh, [sup({ kind: 'point', at: [0, 0] }, true, true, 0), sup({ kind: 'point', at: [100, 0] }, true, false, 1)]);
    expect(e.message).toMatch(/free to rotate about \(0, 0\)/);
  });
  it('x fixed on a horizontal line and y at one point: rotates about that point', () => {
    const e = solveError(mesh, [sup({ kind: 'y', value: 0 }, true, false, 0), sup({ kind: 'point', at: [40, 0] }, false, true, 1)]);
    expect(e.message).toMatch(/free to rotate about \(40, 0\)/);
  });
  it('a properly supported plate solves and balances', () => {
    const sol = solvePlate({
      mesh, geometry, section, loads: pull,
      supports: [sup({ kind: 'x', value: 0 }, true, false, 0), sup({ kind: 'point', at: [0, 0] }, false, true, 1)],
    });
    // uniform bar in tension: u(100) = σ L / E = 10·100/200000 (exact for any element, constant stress)
    expect(sol.maxDisplacement).toBeGreaterThan(0);
    let uMax = 0;
    for (let n = 0; n < sol.u.length / 2; n++) uMax = Math.max(uMax, sol.u[2 * n]);
    expect(uMax).toBeCloseTo(1000 / 200000, 14);
    expect(sol.appliedSum[0]).toBeCloseTo(10 * 40 * 5, 10);
    expect(Math.abs(sol.reactionSum[0] + sol.appliedSum[0]) / sol.appliedSum[0]).toBeLessThan(1e-9);
    expect(sol.residual).toBeLessThan(1e-12);
    expect(sol.nnzL).toBeGreaterThan(0);
  });
});

describe('input errors name the key path', () => {
  const mesh = rectangleMesh(0, 0, 100, 40, 5, 2, 1);
  it('a point support whose boundary point is no node is a FemError at supports[1].where', () => {
    let caught: unknown;
    try {
      solvePlate({ mesh, geometry, section, loads: pull, supports: [sup({ kind: 'x', value: 0 }, true, true, 0), sup({ kind: 'point', at: [50, 20] }, true, true, 1)] });
    } catch (err) {
      caught = err;
    }
    expect(caught).toBeInstanceOf(FemError);
    expect((caught as FemError).keyPath).toBe('supports[1].where');
    // (50, 20) means the boundary point nearest to it, (50, 0) (design §3); this hand mesh has no node there
    expect((caught as FemError).message).toMatch(/no node at point \(50, 0\), the boundary point nearest to \(50, 20\); nearest boundary node is \d+ at \(\d+, 0\) at distance 10/);
  });
  it('an inverted (clockwise) element is a FemError', () => {
    const bad = meshFromTriangles({ xy: [0, 0, 1, 0, 0, 1], tris: [0, 2, 1], order: 1, pieceOf: () => 0 });
    expect(() => solvePlate({ mesh: bad, geometry, section, loads: [], supports: [] })).toThrow(/inverted or degenerate/);
  });
  it('a Poisson ratio of 0.5 is a FemError at material.nu', () => {
    expect(() => solvePlate({ mesh, geometry, section: { ...section, nu: 0.5 }, loads: pull, supports: [] })).toThrow(FemError);
  });
});

describe('a part that is not held', () => {
  it('a second piece not connected to the supported one is reported with a node and its coordinates', () => {
    // two unit squares side by side sharing no node: the right one has no support
    const xy = [0, 0, 1, 0, 1, 1, 0, 1, 2, 0, 3, 0, 3, 1, 2, 1];
    const tris = [0, 1, 2, 0, 2, 3, 4, 5, 6, 4, 6, 7];
    const mesh = meshFromTriangles({ xy, tris, order: 1, pieceOf: () => 0 });
    const geom = rectangleGeometry(0, 0, 3, 1);
    let caught: unknown;
    try {
      solvePlate({
        mesh, geometry: geom, section, loads: [],
        supports: [sup({ kind: 'x', value: 0 }, true, true, 0)],
      });
    } catch (err) {
      caught = err;
    }
    expect(caught).toBeInstanceOf(SolveError);
    expect((caught as SolveError).message).toMatch(/not positive definite at node [4-7] \([23], [01]\), u_[xy]: part of the plate is not held/);
  });
});
