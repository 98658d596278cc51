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
  /**
   * Elimination tree of P A Pᵀ for exactly this perm (which is then a postorder), when the
   * ordering routine computed it on the way (added by linalg; `symbolicFactor` then skips
   * recomputing it). Left out by hand-made orderings.
   */
  tree?: EliminationTree;
}

/** Elimination tree of a postordered P A Pᵀ with the column counts of L (diagonal included). */
export interface EliminationTree {
  /** the permutation the tree belongs to (postordered) */
  perm: Int32Array;
  parent: Int32Array;
  colCounts: Int32Array;
  /** Σ colCounts */
  nnzL: number;
}

/** Symbolic analysis of a permuted matrix: elimination tree and column counts of L. */
export interface Symbolic {
  n: number;
  ordering: Ordering;
  parent: Int32Array;
  colCounts: Int32Array;
  nnzL: number;
  /**
   * Supernodes (added by linalg): columns superStart[s] … superStart[s+1]-1 of the permuted
   * matrix share one row structure superRows[superRowPtr[s] … superRowPtr[s+1]-1] (the
   * diagonal block's rows first, ascending). Values of s sit in a dense column-major panel
   * of (rows × cols) starting at Factor.values[superValPtr[s]].
   */
  nSuper: number;
  superStart: Int32Array;
  superRowPtr: Int32Array;
  superRows: Int32Array;
  superValPtr: Float64Array;
  /** supernode of each permuted column */
  superOfCol: Int32Array;
  /** entries stored in the panels (≥ nnzL when supernodes were amalgamated) */
  nnzStored: number;
  /** floating point operations of the numeric factorisation (multiply-adds count 2) */
  flops: number;
}

/** Numeric factor P A Pᵀ = L Lᵀ. Layout is the solver's business; it exposes nnzL and solve. */
export interface Factor {
  n: number;
  nnzL: number;
  symbolic: Symbolic;
  /** supernodal panels of L, laid out as Symbolic.superValPtr says (added by linalg) */
  values: Float64Array;
}
