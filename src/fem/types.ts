import type { Material, PlaneState } from '../model/types.js';

export interface ElasticSection extends Material {
  state: PlaneState;
  thickness: number;
}

/**
 * Stresses at the Gauss points of every element: `nGauss` points per element
 * (1 for CST, 3 for LST). Point g of element e is at index k = nGauss·e + g:
 * xy[2k, 2k+1], stress[3k..3k+2] = (σxx, σyy, τxy), weight[k] = |J|·w (area weight, no thickness),
 * szz[k] = σzz, the out-of-plane normal stress: 0 in plane stress, ν(σxx + σyy) − EαΔT in plane
 * strain (εzz = 0 with the thermal strain αΔT of a temperature load). Every invariant uses it.
 * The stresses are those in the material: total strain minus thermal strain (fem/thermal.ts).
 */
export interface GaussStresses {
  nGauss: number;
  xy: Float64Array;
  stress: Float64Array;
  weight: Float64Array;
  szz: Float64Array;
}

/** Result of one linear solve. */
export interface Solution {
  /** displacement, node n: [2n, 2n + 1] */
  u: Float64Array;
  /** reaction force at each dof (0 where free), whole thickness */
  reaction: Float64Array;
  /** external nodal forces (whole thickness) */
  load: Float64Array;
  /** 1 at every dof fixed by a support or a prescribed displacement, 0 where free (added by fem) */
  fixed: Uint8Array;
  dofs: number;
  freeDofs: number;
  appliedSum: [number, number];
  reactionSum: [number, number];
  maxDisplacement: number;
  maxDisplacementAt: [number, number];
  nnzL: number;
  /** ‖K u − f‖∞ / (‖K‖∞ ‖u‖∞ + ‖f‖∞) on the free dofs */
  residual: number;
  timings: { assembleS: number; orderS: number; factorS: number; solveS: number };
}
