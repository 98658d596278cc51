/**
 * Load cases on one mesh (docs/model-format.md, "Load cases"): every case is a right-hand side of the
 * one factorisation (fem/solve.ts `solvePlateCases`), and every combination is superposed from the
 * case results — displacements, reactions, loads, Gauss-point stresses and the recovered field are all
 * linear in the loads (the Gauss stresses stay linear with a thermal strain too: σ = D(Bu − ε₀) of the
 * combination is the factored sum of the cases' σ), so a combination is never solved again. Only the
 * measure (von Mises, principal, …) is not linear: it is evaluated from the combined field.
 */
import type { Combination, Load, Support } from '../model/types.js';
import type { GaussStresses, Solution } from '../fem/types.js';
import { largestDisplacement } from '../fem/index.js';
import type { NodalStress } from '../recovery/types.js';

/** One load case as the pipeline solves it. */
export interface ProblemCase {
  name: string;
  loads: readonly Load[];
  /** the supports with this case's prescribed displacement values */
  supports: readonly Support[];
}

/** One case or combination solved on a mesh. */
export interface LoadSetLevel {
  name: string;
  kind: 'case' | 'combination';
  /** the combination's expression as written (combinations only) */
  expression?: string;
  solution: Solution;
  gauss: GaussStresses;
  field: NodalStress;
  /** the problem's measure per node, from `field` */
  nodal: Float64Array;
}

/** Σ factor·array over the terms (a new array). */
function sumOf(arrays: readonly Float64Array[], factors: readonly number[]): Float64Array {
  const out = new Float64Array(arrays[0].length);
  arrays.forEach((a, t) => {
    const k = factors[t];
    for (let i = 0; i < out.length; i++) out[i] += k * a[i];
  });
  return out;
}

/** Every Float64Array of `key` in the parts, or undefined when any part lacks it. */
function arraysOf<T>(parts: readonly T[], key: keyof T): Float64Array[] | undefined {
  const out = parts.map((p) => p[key]);
  return out.every((a) => a instanceof Float64Array) ? (out as Float64Array[]) : undefined;
}

/**
 * The factored sum of some objects' stress arrays: `stress`, and every other per-point linear array
 * the parts carry (the out-of-plane `szz`), the rest (positions, weights, method) taken from the first.
 */
function superposeStresses<T extends { stress: Float64Array }>(parts: readonly T[], factors: readonly number[]): T {
  const out = { ...parts[0] };
  for (const key of ['stress', 'szz'] as const) {
    const arrays = arraysOf(parts, key as keyof T);
    if (arrays) (out as Record<string, unknown>)[key] = sumOf(arrays, factors);
  }
  return out;
}

/** Σ factor·pair. */
function factoredSum(pairs: readonly (readonly [number, number])[], factors: readonly number[]): [number, number] {
  let a = 0, b = 0;
  pairs.forEach((p, t) => { a += factors[t] * p[0]; b += factors[t] * p[1]; });
  return [a, b];
}

/** The superposed solution Σ factor·case: u, reactions, loads and their sums; the factor data of the first. */
export function superposeSolutions(mesh: { xy: Float64Array }, parts: readonly Solution[], factors: readonly number[]): Solution {
  const u = sumOf(parts.map((p) => p.u), factors);
  const reaction = sumOf(parts.map((p) => p.reaction), factors);
  const load = sumOf(parts.map((p) => p.load), factors);
  const first = parts[0];
  return {
    ...first,
    u,
    reaction,
    load,
    // the factored sums of the cases' sums (linear; an axisymmetric section's are axial only)
    appliedSum: factoredSum(parts.map((p) => p.appliedSum), factors),
    reactionSum: factoredSum(parts.map((p) => p.reactionSum), factors),
    ...largestDisplacement(mesh.xy, u),
    residual: Math.max(...parts.map((p) => p.residual)),
    timings: { assembleS: 0, orderS: 0, factorS: 0, solveS: 0 },
  };
}

/** A combination of solved cases on one mesh: everything linear superposed, the measure from the combined field. */
export function combineLevel(
  mesh: { xy: Float64Array }, combination: Combination, cases: readonly LoadSetLevel[], measureOf: (field: NodalStress) => Float64Array,
): LoadSetLevel {
  const parts = combination.terms.map((t) => {
    const c = cases.find((s) => s.name === t.case);
    if (!c) throw new Error(`combination ${combination.name} names case ${t.case}, which was not solved`);
    return c;
  });
  const factors = combination.terms.map((t) => t.factor);
  const field = superposeStresses(parts.map((p) => p.field), factors);
  return {
    name: combination.name,
    kind: 'combination',
    expression: combination.expression,
    solution: superposeSolutions(mesh, parts.map((p) => p.solution), factors),
    gauss: superposeStresses(parts.map((p) => p.gauss), factors),
    field,
    nodal: measureOf(field),
  };
}
