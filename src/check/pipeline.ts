/**
 * The product pipeline as the check cases use it: a Model built in code → `problemOf` →
 * `solveProblem` (mesh at the model's size settings → solve → Gauss stresses → SPR), the same
 * calls as `peakwise solve`. Extra inputs the model file cannot express (exact traction fields of
 * a closed form, prescribed displacements) ride on the problem as per-mesh hooks.
 */
import type { PlateGeometry } from '../geometry/types.js';
import type { Mesh } from '../mesh/types.js';
import type { Model, Point } from '../model/types.js';
import { edgeTractionLoad, type PrescribedDisplacement } from '../fem/index.js';
import type { ElasticSection, GaussStresses, Solution } from '../fem/types.js';
import type { NodalStress } from '../recovery/types.js';
import { modelFromParts, problemOf, solveProblem, type ModelParts } from '../pipeline/index.js';

export type CaseModelInput = ModelParts;

/** A complete Model object built in code (no file behind it). */
export const caseModel: (input: CaseModelInput) => Model = modelFromParts;

export interface Solved {
  model: Model;
  geometry: PlateGeometry;
  mesh: Mesh;
  section: ElasticSection;
  solution: Solution;
  gauss: GaussStresses;
  field: NodalStress;
}

/** Cartesian stress (σxx, σyy, τxy) of a closed form at a point. */
export type StressField = (x: number, y: number) => { sxx: number; syy: number; sxy: number };

export interface SolveExtras {
  /** points that must be mesh nodes (besides the model's point supports and loads) */
  requiredPoints?: Point[];
  /** the closed-form stress whose traction t = σ·n is applied on the chosen boundary edges */
  exactTraction?: { stress: StressField; onEdge(x: number, y: number): boolean };
  /** displacements prescribed at nodes picked from the mesh once it exists */
  prescribe?(mesh: Mesh): PrescribedDisplacement[];
}

/** Nodal forces of the traction σ·n of a closed-form stress on the boundary edges `onEdge` picks. */
function exactTractionLoad(mesh: Mesh, thickness: number, traction: NonNullable<SolveExtras['exactTraction']>): Float64Array {
  const { stress, onEdge } = traction;
  const edges: number[] = [];
  const st = mesh.edgeStride;
  for (let k = 0; k < mesh.boundaryPiece.length; k++) {
    const a = mesh.boundaryEdges[st * k], b = mesh.boundaryEdges[st * k + 1];
    const mx = 0.5 * (mesh.xy[2 * a] + mesh.xy[2 * b]);
    const my = 0.5 * (mesh.xy[2 * a + 1] + mesh.xy[2 * b + 1]);
    if (onEdge(mx, my)) edges.push(k);
  }
  return edgeTractionLoad(mesh, edges, thickness, (x, y, nx, ny) => {
    const s = stress(x, y);
    return [s.sxx * nx + s.sxy * ny, s.sxy * nx + s.syy * ny];
  });
}

export function solveModel(model: Model, extras: SolveExtras = {}): Solved {
  const traction = extras.exactTraction;
  const problem = problemOf(model, {
    ...(extras.requiredPoints ? { points: extras.requiredPoints } : {}),
    ...(traction ? { extraLoad: (mesh: Mesh) => exactTractionLoad(mesh, model.thickness, traction) } : {}),
    ...(extras.prescribe ? { prescribed: extras.prescribe } : {}),
  });
  const { mesh, solution, gauss, field } = solveProblem(problem);
  return { model, geometry: problem.geometry, mesh, section: problem.section, solution, gauss, field };
}

/** The mesh node closest to (x, y). */
export function nearestNode(mesh: Pick<Mesh, 'xy'>, x: number, y: number): number {
  let best = 0;
  let bestD = Infinity;
  for (let n = 0; n < mesh.xy.length / 2; n++) {
    const d = Math.hypot(mesh.xy[2 * n] - x, mesh.xy[2 * n + 1] - y);
    if (d < bestD) {
      bestD = d;
      best = n;
    }
  }
  return best;
}

/** Every node within `tol` of a predicate line, as node ids. */
export function nodesWhere(mesh: Pick<Mesh, 'xy'>, test: (x: number, y: number) => boolean): number[] {
  const out: number[] = [];
  for (let n = 0; n < mesh.xy.length / 2; n++) if (test(mesh.xy[2 * n], mesh.xy[2 * n + 1])) out.push(n);
  return out;
}

export function relError(value: number, reference: number): number {
  return Math.abs(value - reference) / Math.abs(reference);
}
