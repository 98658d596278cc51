/**
 * A recovered (continuous) stress field: one (σxx, σyy, τxy) per mesh node, interpolated over
 * each element with its shape functions. `szz` is the out-of-plane stress (0 in plane stress).
 */
export interface NodalStress {
  /** node n at [3n, 3n + 1, 3n + 2] = σxx, σyy, τxy */
  stress: Float64Array;
  /** σzz per node (plane strain: ν(σxx + σyy); plane stress: 0) */
  szz: Float64Array;
  method: 'average' | 'spr';
}

/** Zienkiewicz–Zhu error estimate. */
export interface ErrorEstimate {
  /** ‖e*‖²_T per element (energy norm squared, per unit thickness) */
  elemErrorSq: Float64Array;
  /** Σ ‖e*‖²_T */
  errorSq: number;
  /** ‖u_h‖²_E = ∫ σ_hᵀ D⁻¹ σ_h dA */
  energySq: number;
  /** η = ‖e*‖ / √(‖u_h‖² + ‖e*‖²), in percent */
  errorPercent: number;
}
