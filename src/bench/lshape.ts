/**
 * The classic L-shaped plate [−1, 1]² minus the quadrant x > 0, y < 0, loaded by an exact mode-I field of the
 * 270° corner (Williams 1952): exact tractions on the four outer edges (the re-entrant faces are
 * traction-free), the corner pinned and u_x fixed at (−1, 1) to its exact value. Used by the
 * benchmark to print energy-norm rates, and by the recovery tests with their own independent
 * field. E = 1, ν = 0.3, plane stress; exact strain energy U = 4.884754673, so the true
 * energy-norm error is ‖e‖² = 2U − ‖u_h‖² (Galerkin orthogonality: the constraints only remove
 * rigid-body motion).
 */
import { edgeTractionLoad } from '../fem/index.js';
import type { ElasticSection, GaussStresses } from '../fem/types.js';
import { buildGeometry } from '../geometry/index.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { Mesh } from '../mesh/types.js';
import type { Plate } from '../model/types.js';
import { energyNormSq } from '../recovery/index.js';
import { modelFromParts, problemOf, solveMesh, type Problem } from '../pipeline/index.js';

export const L_SECTION: ElasticSection = { E: 1, nu: 0.3, state: 'plane-stress', thickness: 1 };
/** exact strain energy of the domain for E = 1, ν = 0.3, integrated from the exact field independently of this code */
export const L_ENERGY = 4.884754673;

/** exact field: stress (σxx, σyy, τxy) and displacement (ux, uy) at a point */
export interface LField {
  stress(x: number, y: number): [number, number, number];
  displacement(x: number, y: number): [number, number];
}

const L_PLATE: Plate = {
  outline: { kind: 'polygon', vertices: ([[0, 0], [1, 0], [1, 1], [-1, 1], [-1, -1], [0, -1]] as [number, number][]).map((at) => ({ at, round: 0 })) },
  openings: [],
};

export function lGeometry(): PlateGeometry {
  return buildGeometry(L_PLATE);
}

/**
 * The L-plate as a pipeline problem: a model built in code (no supports or loads of its own)
 * whose per-mesh hooks apply the exact tractions and the three constraints of `field`.
 */
export function lProblem(field: LField, order: 1 | 2, size = 0.25): Problem {
  const { E, nu, state, thickness } = L_SECTION;
  const model = modelFromParts({ title: 'L-shaped plate, exact mode-I field', plate: L_PLATE, material: { E, nu }, state, thickness, size, order });
  return problemOf(model, { extraLoad: (mesh) => lTractions(mesh, field), prescribed: (mesh) => lConstraints(mesh, field) });
}

export function lTractions(mesh: Mesh, field: LField): Float64Array {
  const edges: number[] = [];
  const st = mesh.edgeStride;
  for (let k = 0; k < mesh.boundaryPiece.length; k++) {
    const a = mesh.boundaryEdges[st * k];
    const b = mesh.boundaryEdges[st * k + 1];
    const mx = 0.5 * (mesh.xy[2 * a] + mesh.xy[2 * b]);
    const my = 0.5 * (mesh.xy[2 * a + 1] + mesh.xy[2 * b + 1]);
    if (Math.abs(Math.abs(mx) - 1) < 1e-9 || Math.abs(Math.abs(my) - 1) < 1e-9) edges.push(k);
  }
  return edgeTractionLoad(mesh, edges, 1, (x, y, nx, ny) => {
    const [sxx, syy, sxy] = field.stress(x, y);
    return [sxx * nx + sxy * ny, sxy * nx + syy * ny];
  });
}

export function lConstraints(mesh: Mesh, field: LField): { dof: number; value: number }[] {
  const out: { dof: number; value: number }[] = [];
  for (let i = 0; i < mesh.xy.length / 2; i++) {
    const x = mesh.xy[2 * i];
    const y = mesh.xy[2 * i + 1];
    if (Math.hypot(x, y) < 1e-12) out.push({ dof: 2 * i, value: 0 }, { dof: 2 * i + 1, value: 0 });
    if (Math.hypot(x + 1, y - 1) < 1e-12) out.push({ dof: 2 * i, value: field.displacement(x, y)[0] });
  }
  if (out.length !== 3) throw new Error(`L-plate constraints: expected nodes at (0,0) and (−1,1), found ${out.length} dofs`);
  return out;
}

/** Solve the L-plate on a given mesh (e.g. the uniform ones of lshape-mesh.ts, with their own geometry). */
export function lSolve(mesh: Mesh, geometry: PlateGeometry, field: LField): { gauss: GaussStresses; dofs: number } {
  const { solution, gauss } = solveMesh({ ...lProblem(field, mesh.order), geometry }, mesh);
  return { gauss, dofs: solution.dofs };
}

export function lTrueError(gauss: GaussStresses): number {
  return Math.sqrt(Math.max(0, 2 * L_ENERGY - energyNormSq(gauss, L_SECTION)));
}

/** least-squares slope of log y against log x */
export function logSlope(x: number[], y: number[]): number {
  const lx = x.map(Math.log);
  const ly = y.map(Math.log);
  const mx = lx.reduce((a, b) => a + b, 0) / lx.length;
  const my = ly.reduce((a, b) => a + b, 0) / ly.length;
  let num = 0;
  let den = 0;
  for (let i = 0; i < lx.length; i++) {
    num += (lx[i] - mx) * (ly[i] - my);
    den += (lx[i] - mx) ** 2;
  }
  return num / den;
}
