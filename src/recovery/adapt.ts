import { MeshError } from '../errors.js';
import { gaussStresses, solvePlate, type PrescribedDisplacement } from '../fem/index.js';
import type { ElasticSection, GaussStresses, Solution } from '../fem/types.js';
import type { PlateGeometry } from '../geometry/types.js';
import { meshPlate } from '../mesh/index.js';
import type { Mesh, SizeField } from '../mesh/types.js';
import type { AnyLoad, StressMeasure, Support } from '../model/types.js';
import { cornerArea } from './element.js';
import { estimateError } from './estimate.js';
import { nodalMeasure } from './invariants.js';
import { recoverSpr } from './recover.js';
import { meshSizeField, vertexSizesFromElements } from './sizefield.js';
import type { ErrorEstimate, NodalStress } from './types.js';

export interface AdaptiveInput {
  geometry: PlateGeometry;
  section: ElasticSection;
  supports: readonly Support[];
  loads: readonly AnyLoad[];
  order: 1 | 2;
  /** size field of the first mesh */
  sizeAt0: SizeField;
  requiredPoints?: ReadonlyArray<readonly [number, number]>;
  /** measure whose largest nodal value each cycle reports (default von Mises) */
  measure?: StressMeasure;
  /** per-mesh extra nodal forces (e.g. a traction field), passed to the solver */
  extraLoad?: (mesh: Mesh) => Float64Array;
  /** per-mesh prescribed displacements, passed to the solver */
  prescribed?: (mesh: Mesh) => readonly PrescribedDisplacement[];
  /** mesher's minimum-angle target */
  minAngleDeg?: number;
}

export interface AdaptiveOptions {
  /** stop when the estimated relative energy-norm error η (percent) is at or below this */
  targetPercent: number;
  /** never build a mesh predicted to exceed this many degrees of freedom */
  maxDofs?: number;
  /** at most this many meshes (solves) */
  maxCycles?: number;
  /**
   * each cycle designs its mesh for η_goal = max(target, reduction · η_now), so the error falls
   * step by step and the singular zones get several rounds of refinement (default 0.4)
   */
  reduction?: number;
  /** per-cycle cap on the element size change, [shrink, grow] factors (default [0.2, 2]) */
  sizeChange?: readonly [number, number];
  /** called after every solve with the cycle's summary and its full result */
  onCycle?: (cycle: AdaptiveCycle, result: AdaptiveCycleResult) => void;
  /**
   * let elements grow beyond the first mesh's size field where the error is small (default
   * false: the first field stays an upper bound, which keeps its curve resolution and local sizes)
   */
  allowCoarsening?: boolean;
}

export interface AdaptiveCycle {
  cycle: number;
  dofs: number;
  errorPercent: number;
  /** largest nodal value of the measure (recovered field) and where */
  max: number;
  maxAt: [number, number];
  nodes: number;
  elements: number;
  /** DOFs predicted for the next mesh (0 on the last cycle) */
  nextDofs: number;
}

export interface AdaptiveCycleResult {
  mesh: Mesh;
  solution: Solution;
  gauss: GaussStresses;
  field: NodalStress;
  estimate: ErrorEstimate;
}

export interface AdaptiveResult {
  cycles: AdaptiveCycle[];
  mesh: Mesh;
  solution: Solution;
  gauss: GaussStresses;
  field: NodalStress;
  estimate: ErrorEstimate;
  stoppedBy: 'target' | 'dofs' | 'cycles';
}

/** h of an equilateral triangle with the element's area: the size the mesher's sizeAt means */
const EQUILATERAL = Math.sqrt(3) / 4;

/**
 * New element sizes from the Zienkiewicz–Zhu (1987) criterion: with m elements, target error
 * η_goal and ‖U‖² = ‖u_h‖² + ‖e*‖², the permissible element error is ē = η_goal·‖U‖/√m; an
 * element with ξ = ‖e*‖_T/ē gets h_new = h_T ξ^(−1/p), limited to the cap per cycle.
 * O. C. Zienkiewicz & J. Z. Zhu, IJNME 24 (1987) 337–357.
 */
export function zzElementSizes(
  mesh: Mesh,
  estimate: ErrorEstimate,
  goalPercent: number,
  cap: readonly [number, number] = [0.2, 2],
): Float64Array {
  const nElem = estimate.elemErrorSq.length;
  const p = mesh.order;
  const total = estimate.energySq + estimate.errorSq;
  const eBarSq = ((goalPercent / 100) ** 2 * total) / nElem;
  const out = new Float64Array(nElem);
  for (let e = 0; e < nElem; e++) {
    const hT = Math.sqrt(Math.abs(cornerArea(mesh, e)) / EQUILATERAL);
    const xiSq = estimate.elemErrorSq[e] / eBarSq;
    // ξ^(−1/p) = (ξ²)^(−1/(2p)); ξ = 0 (exact element) → the largest growth allowed
    const ratio = xiSq > 0 ? xiSq ** (-1 / (2 * p)) : cap[1];
    out[e] = hT * Math.min(cap[1], Math.max(cap[0], ratio));
  }
  return out;
}

/** DOFs of a mesh whose element sizes follow `vertexSize`, by the current mesh's DOFs per element. */
function predictDofs(mesh: Mesh, vertexSize: Float64Array, dofsPerElement: number): number {
  const npe = mesh.nodesPerElem;
  const nElem = mesh.elemNodes.length / npe;
  let count = 0;
  for (let e = 0; e < nElem; e++) {
    const h = (vertexSize[mesh.elemNodes[npe * e]] + vertexSize[mesh.elemNodes[npe * e + 1]] + vertexSize[mesh.elemNodes[npe * e + 2]]) / 3;
    count += Math.abs(cornerArea(mesh, e)) / (EQUILATERAL * h * h);
  }
  return count * dofsPerElement;
}

/**
 * Adaptive solve: mesh → solve → SPR → ZZ estimate → new size field → remesh, until η ≤ target,
 * or the next mesh is predicted to exceed maxDofs, or maxCycles meshes have been solved. Each
 * new size field lives on the previous mesh (element sizes → smallest at each vertex, grading
 * limited, linear inside elements) and the mesher builds a fresh quality mesh from it.
 * Always terminates: at most maxCycles solves, and a mesh the mesher refuses for its vertex cap
 * ends the loop with 'dofs' on the last good result.
 */
export function adaptiveSolve(input: AdaptiveInput, opts: AdaptiveOptions): AdaptiveResult {
  const maxDofs = opts.maxDofs ?? 2_000_000;
  const maxCycles = opts.maxCycles ?? 12;
  const reduction = opts.reduction ?? 0.4;
  const cap = opts.sizeChange ?? [0.2, 2];
  if (!(opts.targetPercent > 0)) throw new RangeError(`target error must be > 0 %, got ${opts.targetPercent}`);
  if (!(maxDofs > 0)) throw new RangeError(`maxDofs must be > 0, got ${maxDofs}`);
  if (!(Number.isInteger(maxCycles) && maxCycles >= 1)) throw new RangeError(`maxCycles must be an integer ≥ 1, got ${maxCycles}`);
  if (!(reduction > 0 && reduction < 1)) throw new RangeError(`reduction must lie in (0, 1), got ${reduction}`);
  if (!(cap[0] > 0 && cap[0] < 1 && cap[1] >= 1)) throw new RangeError(`sizeChange must be [shrink < 1, grow ≥ 1], got [${cap[0]}, ${cap[1]}]`);
  const measure = input.measure ?? 'von-mises';
  // vertices ≈ DOFs / 2 (CST) or / 8 (LST); the mesher's cap is a generous safety net
  const maxVertices = Math.ceil((maxDofs / (input.order === 1 ? 2 : 8)) * 1.5) + 100;

  const cycles: AdaptiveCycle[] = [];
  // the mesher makes somewhat more elements than area / (√3/4 h²) (grading, boundary fit);
  // learn the factor from each mesh against its own prediction, starting from a typical 1.25
  let calibration = 1.25;
  let sizeAt = input.sizeAt0;
  let last: AdaptiveCycleResult | undefined;
  for (let c = 0; ; c++) {
    let mesh: Mesh;
    try {
      mesh = meshPlate(input.geometry, {
        sizeAt,
        order: input.order,
        requiredPoints: input.requiredPoints,
        minAngleDeg: input.minAngleDeg,
        maxVertices,
      });
    } catch (err) {
      // the first mesh is the user's; a refused refinement ends the loop on the last good one
      if (err instanceof MeshError && last) return { ...last, cycles, stoppedBy: 'dofs' };
      throw err;
    }
    // the prediction can fall short: a refined mesh that came out above the cap is not solved
    if (last && 2 * (mesh.xy.length / 2) > maxDofs) return { ...last, cycles, stoppedBy: 'dofs' };
    const solution = solvePlate({
      mesh,
      geometry: input.geometry,
      section: input.section,
      supports: input.supports,
      loads: input.loads,
      prescribed: input.prescribed?.(mesh),
      extraLoad: input.extraLoad?.(mesh),
    });
    const gauss = gaussStresses(mesh, solution.u, input.section);
    const field = recoverSpr(mesh, gauss, input.section);
    const estimate = estimateError(mesh, gauss, field, input.section);
    last = { mesh, solution, gauss, field, estimate };
    const values = nodalMeasure(field, measure);
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
        const first = input.sizeAt0;
        sizeAt = opts.allowCoarsening ? carried : (x, y) => Math.min(carried(x, y), first(x, y));
      }
    }
    opts.onCycle?.(cycle, last);
    if (stoppedBy) return { ...last, cycles, stoppedBy };
  }
}
