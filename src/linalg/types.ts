/**
 * Compressed sparse row matrix. For the symmetric stiffness we keep BOTH triangles
 * (full pattern) so a matrix–vector product is one loop; the factorisation reads what it needs.
 * Column indices within each row are sorted ascending and unique.
 */
export interface Csr {
  n: number;
  rowPtr: Int32Array; // length n + 1
  colIdx: Int32Array; // length nnz
  values: Float64Array; // length nnz
}

/** Fill-reducing permutation: perm[k] = original index placed at position k; iperm its inverse. */
export interface Ordering {
  perm: Int32Array;
  iperm: Int32Array;
  method: 'natural' | 'amd' | 'nested-dissection';
}

/** Symbolic analysis of a permuted matrix: elimination tree and column counts of L. */
export interface Symbolic {
  n: number;
  ordering: Ordering;
  parent: Int32Array;
  colCounts: Int32Array;
  nnzL: number;
}

/** Numeric factor P A Pᵀ = L Lᵀ. Layout is the solver's business; it exposes nnzL and solve. */
export interface Factor {
  n: number;
  nnzL: number;
  symbolic: Symbolic;
}
