/**
 * The adaptive loop (`peakwise solve --adapt`): solve → SPR → ZZ estimate → new size field →
 * remesh, each cycle a `solveAt` of the pipeline, so it honours the same limits as one solve.
 */
import { MeshError } from '../errors.js';
import { LimitError } from '../fem/health.js';
import type { SizeField } from '../mesh/types.js';
import { meshSizeField, predictDofs, vertexSizesFromElements, zzElementSizes } from '../recovery/index.js';
import type { ErrorEstimate } from '../recovery/types.js';
import { DEFAULT_MAX_DOFS, checkLimits, type SolveLimits } from './limits.js';
import type { Problem } from './problem.js';
import { baseSizeField, estimateOf, solveAt, type SolvedLevel } from './solve.js';

export interface AdaptiveOptions {
  /** stop when the estimated relative energy-norm error η (percent) is at or below this */
  targetPercent: number;
  /** at most this many meshes (solves) */
  maxCycles?: number;
  /**
   * each cycle designs its mesh for η_goal = max(target, reduction · η_now), so the error falls
   * step by step and the singular zones get several rounds of refinement (default 0.4)
   */
  reduction?: number;
  /** per-cycle cap on the element size change, [shrink, grow] factors (default [0.2, 2]) */
  sizeChange?: readonly [number, number];
  /** size field of the first mesh (default: the problem's own mesh settings) */
  sizeAt0?: SizeField;
  /** mesher's minimum-angle target */
  minAngleDeg?: number;
  /** called after every solve with the cycle's summary and its full result */
  onCycle?: (cycle: AdaptiveCycle, result: AdaptiveCycleResult) => void;
  /**
   * let elements grow beyond the first mesh's size field where the error is small (default
   * false: the first field stays an upper bound, which keeps its curve resolution and local sizes)
   */
  allowCoarsening?: boolean;
  /** asked after every finished cycle: true ends the loop on that cycle ('stopped', e.g. Ctrl-C) */
  shouldStop?: () => boolean;
}

export interface AdaptiveCycle {
  cycle: number;
  dofs: number;
  errorPercent: number;
  /** largest nodal value of the problem's measure (recovered field) and where */
  max: number;
  maxAt: [number, number];
  nodes: number;
  elements: number;
  /** DOFs predicted for the next mesh (0 on the last cycle) */
  nextDofs: number;
}

export interface AdaptiveCycleResult extends SolvedLevel {
  estimate: ErrorEstimate;
}

export interface AdaptiveResult extends AdaptiveCycleResult {
  cycles: AdaptiveCycle[];
  /** 'dofs': the next mesh would pass the dof cap; 'memory': its factor the memory cap */
  stoppedBy: 'target' | 'dofs' | 'memory' | 'cycles' | 'stopped';
}

/**
 * Adaptive solve: until η ≤ target, or the next mesh is predicted (or counted) above the dof
 * cap, or its factor is above the memory cap, or maxCycles meshes have been solved. Each new
 * size field lives on the previous mesh (element sizes → smallest at each vertex, grading
 * limited, linear inside elements) and the mesher builds a fresh quality mesh from it. The first
 * mesh is checked against the limits like any solve (an error); a refined mesh that would pass
 * them ends the loop on the last good result. Always terminates: at most maxCycles solves.
 */
export function adaptiveSolve(problem: Problem, opts: AdaptiveOptions, limits: SolveLimits = {}): AdaptiveResult {
  checkLimits(limits);
  const maxDofs = limits.maxDofs ?? DEFAULT_MAX_DOFS;
  const maxCycles = opts.maxCycles ?? 12;
  const reduction = opts.reduction ?? 0.4;
  const cap = opts.sizeChange ?? [0.2, 2];
  if (!(opts.targetPercent > 0)) throw new RangeError(`target error must be > 0 %, got ${opts.targetPercent}`);
  if (!(Number.isInteger(maxCycles) && maxCycles >= 1)) throw new RangeError(`maxCycles must be an integer ≥ 1, got ${maxCycles}`);
  if (!(reduction > 0 && reduction < 1)) throw new RangeError(`reduction must lie in (0, 1), got ${reduction}`);
  if (!(cap[0] > 0 && cap[0] < 1 && cap[1] >= 1)) throw new RangeError(`sizeChange must be [shrink < 1, grow ≥ 1], got [${cap[0]}, ${cap[1]}]`);
  const order = problem.meshSettings.order;
  const first = opts.sizeAt0 ?? baseSizeField(problem);
  const cycleLimits: SolveLimits = { ...limits, maxDofs };
  // vertices ≈ DOFs / 2 (CST) or / 8 (LST); the mesher's cap is a generous safety net
  const maxVertices = Math.ceil((maxDofs / (order === 1 ? 2 : 8)) * 1.5) + 100;

  const cycles: AdaptiveCycle[] = [];
  // the mesher makes somewhat more elements than area / (√3/4 h²) (grading, boundary fit);
  // learn the factor from each mesh against its own prediction, starting from a typical 1.25
  let calibration = 1.25;
  let sizeAt = first;
  let last: AdaptiveCycleResult | undefined;
  for (let c = 0; ; c++) {
    let level: SolvedLevel;
    try {
      level = solveAt(problem, sizeAt, order, cycleLimits, {
        maxVertices,
        ...(opts.minAngleDeg !== undefined ? { minAngleDeg: opts.minAngleDeg } : {}),
        // a refined mesh was sized by the loop's own prediction below
        predicted: last !== undefined,
      });
    } catch (err) {
      // the first mesh is the user's; a refused refinement ends the loop on the last good one
      if (last && err instanceof LimitError) return { ...last, cycles, stoppedBy: err.limit };
      if (last && err instanceof MeshError) return { ...last, cycles, stoppedBy: 'dofs' };
      throw err;
    }
    const { mesh, solution } = level;
    const estimate = estimateOf(problem, level);
    last = { ...level, estimate };
    const values = level.nodal;
    let max = -Infinity;
    let maxNode = 0;
    for (let n = 0; n < values.length; n++) {
      if (values[n] > max) {
        max = values[n];
        maxNode = n;
      }
    }
    const nElem = mesh.elemNodes.length / mesh.nodesPerElem;
    if (c > 0 && cycles[c - 1].nextDofs > 0) calibration = Math.min(3, Math.max(0.5, (solution.dofs / cycles[c - 1].nextDofs) * calibration));
    const cycle: AdaptiveCycle = {
      cycle: c,
      dofs: solution.dofs,
      errorPercent: estimate.errorPercent,
      max,
      maxAt: [mesh.xy[2 * maxNode], mesh.xy[2 * maxNode + 1]],
      nodes: mesh.xy.length / 2,
      elements: nElem,
      nextDofs: 0,
    };
    cycles.push(cycle);
    let stoppedBy: AdaptiveResult['stoppedBy'] | undefined;
    if (estimate.errorPercent <= opts.targetPercent) stoppedBy = 'target';
    else if (c + 1 >= maxCycles) stoppedBy = 'cycles';
    else {
      const goal = Math.max(opts.targetPercent, reduction * estimate.errorPercent);
      const elemSize = zzElementSizes(mesh, estimate, goal, cap);
      const vertexSize = vertexSizesFromElements(mesh, elemSize);
      cycle.nextDofs = Math.round(calibration * predictDofs(mesh, vertexSize, solution.dofs / nElem));
      if (cycle.nextDofs > maxDofs) stoppedBy = 'dofs';
      else {
        const carried = meshSizeField(mesh, vertexSize);
        sizeAt = opts.allowCoarsening ? carried : (x, y) => Math.min(carried(x, y), first(x, y));
      }
    }
    opts.onCycle?.(cycle, last);
    if (!stoppedBy && opts.shouldStop?.()) stoppedBy = 'stopped';
    if (stoppedBy) return { ...last, cycles, stoppedBy };
  }
}
