/**
 * Solving the hand-built test meshes with the solver stage: exact tractions from a closed-form
 * stress field on chosen boundary pieces, symmetry by prescribed zero displacements.
 */
import { edgeTractionLoad, gaussStresses, solvePlate } from '../../src/fem/index.js';
import type { ElasticSection, GaussStresses, Solution } from '../../src/fem/types.js';
import type { PlateGeometry } from '../../src/geometry/types.js';
import type { Mesh } from '../../src/mesh/types.js';

export type Stress3 = (x: number, y: number) => readonly [number, number, number];

/** Kirsch (1898) stress around a circular hole of radius a in uniaxial σxx = S, Cartesian form
 * (Kirsch 1898). */
export function kirschStress(S: number, a: number): Stress3 {
  return (x, y) => {
    const r2 = x * x + y * y;
    const th = Math.atan2(y, x);
    const q = (a * a) / r2;
    const c2 = Math.cos(2 * th);
    const c4 = Math.cos(4 * th);
    const s2 = Math.sin(2 * th);
    const s4 = Math.sin(4 * th);
    return [
      S * (1 - q * (1.5 * c2 + c4) + 1.5 * q * q * c4),
      S * (-q * (0.5 * c2 - c4) - 1.5 * q * q * c4),
      S * (-q * (0.5 * s2 + s4) + 1.5 * q * q * s4),
    ];
  };
}

/** Lamé (1852): σr = A − B/r², σθ = A + B/r² for internal pressure p (Timoshenko & Goodier 1970). */
export function lameStress(p: number, a: number, b: number): Stress3 {
  const A = (p * a * a) / (b * b - a * a);
  const B = (p * a * a * b * b) / (b * b - a * a);
  return (x, y) => {
    const r2 = x * x + y * y;
    const sr = A - B / r2;
    const st = A + B / r2;
    const c = x * x / r2;
    const s = y * y / r2;
    const cs = (x * y) / r2;
    return [sr * c + st * s, sr * s + st * c, (sr - st) * cs];
  };
}

export interface FeRun {
  solution: Solution;
  gauss: GaussStresses;
  dofs: number;
}

export function solveExact(
  mesh: Mesh,
  geometry: PlateGeometry,
  section: ElasticSection,
  exact: Stress3,
  loadedPieces: number[],
  symmetry: { xZeroOn: (x: number, y: number) => boolean; yZeroOn: (x: number, y: number) => boolean },
): FeRun {
  const edges: number[] = [];
  for (let k = 0; k < mesh.boundaryPiece.length; k++) if (loadedPieces.includes(mesh.boundaryPiece[k])) edges.push(k);
  const extraLoad = edgeTractionLoad(mesh, edges, section.thickness, (x, y, nx, ny) => {
    const [sxx, syy, sxy] = exact(x, y);
    return [sxx * nx + sxy * ny, sxy * nx + syy * ny];
  });
  const prescribed: { dof: number; value: number }[] = [];
  for (let n = 0; n < mesh.xy.length / 2; n++) {
    const x = mesh.xy[2 * n];
    const y = mesh.xy[2 * n + 1];
    if (symmetry.xZeroOn(x, y)) prescribed.push({ dof: 2 * n, value: 0 });
    if (symmetry.yZeroOn(x, y)) prescribed.push({ dof: 2 * n + 1, value: 0 });
  }
  const solution = solvePlate({ mesh, geometry, section, supports: [], loads: [], prescribed, extraLoad });
  return { solution, gauss: gaussStresses(mesh, solution.u, section), dofs: solution.dofs };
}
