/** Set-ups of the closed-form verification problems on the structured test meshes. */
import { edgeTractionLoad, solvePlate, type ElasticSection, type PrescribedDisplacement } from '../../../src/fem/index.js';
import type { Mesh } from '../../../src/mesh/types.js';
import type { Support } from '../../../src/model/types.js';
import { cantilever, kirsch } from './closed-form.js';
import { quarterHoleGeometry, quarterHoleMesh, rectangleGeometry, rectangleMesh } from './meshes.js';

/** boundary edges of the given pieces */
export function edgesOfPieces(mesh: Mesh, pieces: number[]): number[] {
  const out: number[] = [];
  for (let e = 0; e < mesh.boundaryPiece.length; e++) if (pieces.includes(mesh.boundaryPiece[e])) out.push(e);
  return out;
}

export const rollersOnAxes: Support[] = [
  { where: { kind: 'x', value: 0 }, fix: { x: true, y: false }, keyPath: 'supports[0]' },
  { where: { kind: 'y', value: 0 }, fix: { x: false, y: true }, keyPath: 'supports[1]' },
];

/**
 * Cantilever 0 ≤ x ≤ L, −D/2 ≤ y ≤ D/2 on an nx × ny structured mesh: the exact root
 * displacements of case (c) prescribed at every root node, the parabolic shear on the tip.
 */
export function solveCantilever(L: number, D: number, P: number, E: number, nu: number, nx: number, ny: number, order: 1 | 2) {
  const section: ElasticSection = { E, nu, state: 'plane-stress', thickness: 1 };
  const exact = cantilever(L, D, 1, P, E, nu);
  const mesh = rectangleMesh(0, -D / 2, L, D / 2, nx, ny, order);
  const geometry = rectangleGeometry(0, -D / 2, L, D / 2);
  const prescribed: PrescribedDisplacement[] = [];
  for (let n = 0; n < mesh.xy.length / 2; n++) {
    if (Math.abs(mesh.xy[2 * n]) < 1e-12 * L) {
      const [u, v] = exact.displacement(0, mesh.xy[2 * n + 1]);
      prescribed.push({ dof: 2 * n, value: u }, { dof: 2 * n + 1, value: v });
    }
  }
  const extraLoad = edgeTractionLoad(mesh, edgesOfPieces(mesh, [1]), 1, (x, y) => [0, exact.stress(x, y)[2]]);
  const solution = solvePlate({ mesh, geometry, section, supports: [], loads: [], prescribed, extraLoad });
  return { mesh, section, exact, solution };
}

/**
 * Kirsch quarter plate [0, R]² minus the hole r < a, exact Kirsch tractions t = σ·n on x = R
 * and y = R, symmetry rollers on both axes, hole free.
 */
export function solveKirschQuarter(a: number, R: number, S: number, E: number, nu: number, ns: number, nt: number, order: 1 | 2) {
  const section: ElasticSection = { E, nu, state: 'plane-stress', thickness: 1 };
  const exact = kirsch(a, S, E, nu);
  const mesh = quarterHoleMesh(a, R, ns, nt, order);
  const geometry = quarterHoleGeometry(a, R);
  const extraLoad = edgeTractionLoad(mesh, edgesOfPieces(mesh, [1, 2]), 1, (x, y, nx, ny) => {
    const [sx, sy, t] = exact.stress(x, y);
    return [sx * nx + t * ny, t * nx + sy * ny];
  });
  const solution = solvePlate({ mesh, geometry, section, supports: rollersOnAxes, loads: [], extraLoad });
  return { mesh, section, exact, solution };
}
