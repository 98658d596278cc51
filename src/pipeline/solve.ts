/**
 * Problem → solved level: mesh the plate to a size field, solve, Gauss-point stresses, SPR
 * recovery. The one module of src/ that drives the mesher, the solver and the recovery
 * together; every command, the checks, the sweep, the benchmark, the study and the library call
 * it, so a change to the chain (a load kind, a limit, an element) is made here once.
 */
import { meshPlate, sizeFieldFromSettings } from '../mesh/index.js';
import type { Mesh, SizeField } from '../mesh/types.js';
import type { Point } from '../model/types.js';
import { gaussStresses, solvePlateCases } from '../fem/index.js';
import type { GaussStresses, Solution } from '../fem/types.js';
import { dofLimitError, estimateMeshSize } from '../fem/health.js';
import { estimateError, nodalMeasure, recoverSpr } from '../recovery/index.js';
import type { ErrorEstimate, NodalStress } from '../recovery/types.js';
import { checkLimits, type SolveLimits } from './limits.js';
import { SAME_POINT_RELATIVE, uniquePoints, type Problem } from './problem.js';
import { combineLevel, type LoadSetLevel } from './cases.js';
import { keptMesh, meshKey, reuseStore, stiffnessReuse } from './reuse.js';

/** One mesh of a problem, solved and recovered. */
export interface SolvedLevel {
  mesh: Mesh;
  solution: Solution;
  /** stresses at the elements' Gauss points */
  gauss: GaussStresses;
  /** SPR-recovered nodal stresses */
  field: NodalStress;
  /** the problem's measure per node, from `field` */
  nodal: Float64Array;
  /**
   * every load case, then every combination, solved on this mesh (one entry, the implicit case, for a
   * model without cases); `solution`, `gauss`, `field` and `nodal` above are those of the first entry
   */
  sets: LoadSetLevel[];
  /** seconds spent meshing (0 on a given mesh) and on Gauss stresses + recovery */
  timings: { meshS: number; recoverS: number };
}

/** What a mesh request may add to the size field and order. */
export interface MeshRequest {
  /** more points that must be nodes on this mesh (after the problem's own; deduplicated with them) */
  points?: readonly Point[];
  /** the mesher's minimum-angle target (default its own) */
  minAngleDeg?: number;
  /** the mesher's vertex cap (default its own) */
  maxVertices?: number;
  /**
   * skip the dof estimate before meshing (the count after meshing is still checked): for a caller
   * that has predicted the size itself, as the adaptive loop does
   */
  predicted?: boolean;
  /**
   * the size field `sizeAt` described as a content key of what it is made of beyond the problem's
   * geometry and mesh settings (`contentKey` of pipeline/reuse.ts; 'base' for `baseSizeField`): with
   * it, a warm process with reuse on takes the mesh kept by an earlier run with the same inputs.
   * Describe every input of the field; without it the mesh is always made afresh.
   */
  sizeKey?: string;
}

const now = (): number => performance.now() / 1000;

/** The size field of the problem's mesh settings (base size, local disks, curve resolution). */
export function baseSizeField(problem: Problem): SizeField {
  return sizeFieldFromSettings(problem.geometry, problem.meshSettings);
}

/**
 * Mesh the plate to `sizeAt`, honouring `limits.maxDofs` twice: on the estimate before meshing
 * (unless `request.predicted`) and on the count after.
 */
export function meshAt(problem: Problem, sizeAt: SizeField, order: 1 | 2, limits: SolveLimits = {}, request: MeshRequest = {}): Mesh {
  checkLimits(limits);
  const { maxDofs } = limits;
  const size = problem.meshSettings.size;
  const points = request.points && request.points.length > 0
    ? uniquePoints([...problem.requiredPoints, ...request.points], SAME_POINT_RELATIVE * problem.geometry.scale)
    : problem.requiredPoints;
  const make = (): Mesh => {
    if (maxDofs !== undefined && !request.predicted) {
      const est = estimateMeshSize(problem.geometry, sizeAt, order, 4 * maxDofs);
      if (est.dofs > maxDofs) throw dofLimitError(est.dofs, maxDofs, size, est.exceeded ? 'more-than' : 'estimated', narrowSide(problem));
    }
    return meshPlate(problem.geometry, {
      sizeAt,
      order,
      requiredPoints: points,
      ...(request.minAngleDeg !== undefined ? { minAngleDeg: request.minAngleDeg } : {}),
      ...(request.maxVertices !== undefined ? { maxVertices: request.maxVertices } : {}),
    });
  };
  // warm process (watch mode): the same inputs give the same mesh, kept from an earlier run; the dof
  // cap and its estimate rule are in the key, so a kept mesh passed the estimate as this one would
  const sizeKey = request.sizeKey;
  const mesh = reuseStore.enabled && sizeKey !== undefined
    ? keptMesh(meshKey(problem.geometry, problem.meshSettings, order, points, { ...request, sizeKey }, limits), limits, make)
    : make();
  if (maxDofs !== undefined && mesh.xy.length > maxDofs) throw dofLimitError(mesh.xy.length, maxDofs, size, 'counted', narrowSide(problem));
  return mesh;
}

/** The plate's narrow side, so the dof-cap message offers no size that leaves too few elements across. */
function narrowSide(problem: Problem): { narrow: number; lengthUnit: string } {
  const { minX, minY, maxX, maxY } = problem.geometry.bbox;
  return { narrow: Math.min(maxX - minX, maxY - minY), lengthUnit: problem.model.units.length };
}

/** Solve the problem on a given mesh (factor-memory cap and residual limit from `limits`), then recover. */
export function solveMesh(problem: Problem, mesh: Mesh, limits: SolveLimits = {}): SolvedLevel {
  checkLimits(limits);
  const solutions = solvePlateCases({
    mesh,
    geometry: problem.geometry,
    section: problem.section,
    supports: problem.supports,
    loads: problem.loads,
    ...(problem.prescribed ? { prescribed: problem.prescribed(mesh) } : {}),
    ...(problem.extraLoad ? { extraLoad: problem.extraLoad(mesh) } : {}),
    ...(limits.maxFactorBytes !== undefined ? { maxFactorBytes: limits.maxFactorBytes } : {}),
    ...(limits.residualLimit !== undefined ? { residualLimit: limits.residualLimit } : {}),
    ...(reuseStore.enabled ? { reuse: stiffnessReuse(mesh, problem.section, limits) } : {}),
  }, problem.cases);
  const t0 = now();
  const cases: LoadSetLevel[] = problem.cases.map((c, i) => {
    const solution = solutions[i];
    // the case's own loads: a temperature load's thermal strain is taken out of its stresses
    const gauss = gaussStresses(mesh, solution.u, problem.section, c.loads);
    const field = recoverSpr(mesh, gauss, problem.section);
    return { name: c.name, kind: 'case', solution, gauss, field, nodal: nodalMeasure(field, problem.measure) };
  });
  const sets = [...cases, ...problem.combinations.map((c) => combineLevel(mesh, c, cases, (f) => nodalMeasure(f, problem.measure)))];
  const recoverS = now() - t0;
  const { solution, gauss, field, nodal } = sets[0];
  return { mesh, solution, gauss, field, nodal, sets, timings: { meshS: 0, recoverS } };
}

/** Mesh to `sizeAt` at `order`, solve and recover: one level of a study, one cycle of the adaptive loop. */
export function solveAt(problem: Problem, sizeAt: SizeField, order: 1 | 2, limits: SolveLimits = {}, request: MeshRequest = {}): SolvedLevel {
  const t0 = now();
  const mesh = meshAt(problem, sizeAt, order, limits, request);
  const meshS = now() - t0;
  const level = solveMesh(problem, mesh, limits);
  level.timings.meshS = meshS;
  return level;
}

/** The problem solved once at its own mesh settings (what `peakwise solve` does). */
export function solveProblem(problem: Problem, limits: SolveLimits = {}): SolvedLevel {
  return solveAt(problem, baseSizeField(problem), problem.meshSettings.order, limits);
}

/** Zienkiewicz–Zhu error estimate of a solved level (recovery/estimate.ts). */
export function estimateOf(problem: Problem, level: Pick<SolvedLevel, 'mesh' | 'gauss' | 'field'>): ErrorEstimate {
  return estimateError(level.mesh, level.gauss, level.field, problem.section);
}
