import { SolveError } from '../errors.js';

/**
 * The matrix is not (numerically) positive definite: a pivot came out zero, negative, or
 * tiny against the original diagonal entry. For a stiffness matrix this means the structure
 * can move without straining (a mechanism or a missing support). `dof` is the index of the
 * failing row in the ORIGINAL (unpermuted) numbering, so the caller can name the motion.
 */
export class NotPositiveDefiniteError extends SolveError {
  readonly dof: number;
  readonly pivot: number;
  readonly diagonal: number;
  constructor(dof: number, pivot: number, diagonal: number) {
    super(
      `matrix not positive definite at dof ${dof}: pivot ${pivot.toPrecision(3)} against diagonal ${diagonal.toPrecision(3)}`,
    );
    this.name = 'NotPositiveDefiniteError';
    this.dof = dof;
    this.pivot = pivot;
    this.diagonal = diagonal;
  }
}
