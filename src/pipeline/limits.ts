/**
 * The limits every solve honours, as one object passed whole from the caller (CLI options, a
 * sweep's workers, the library) down to each mesh and factorisation: `solve`, `solve --adapt`,
 * `study` and `sweep` check them the same way (docs/method.md, "Limits").
 */
import { totalmem } from 'node:os';
import { PeakwiseError } from '../errors.js';
import { RESIDUAL_LIMIT } from '../fem/health.js';

export interface SolveLimits {
  /**
   * cap on the degrees of freedom of one mesh: checked on an estimate from the size field before
   * meshing and on the count after (undefined: no cap; the adaptive loop then uses DEFAULT_MAX_DOFS)
   */
  maxDofs?: number;
  /** cap on the bytes of one Cholesky factor, checked after the symbolic analysis (undefined: none) */
  maxFactorBytes?: number;
  /** largest accepted scaled residual of a solve (undefined: RESIDUAL_LIMIT, 1e-8) */
  residualLimit?: number;
}

/** The command line's default dof cap (`--max-dofs`), and the adaptive loop's when none is given. */
export const DEFAULT_MAX_DOFS = 2_000_000;

/** Default memory cap for one factor: half of this machine's memory. */
export function defaultFactorBytes(): number {
  return 0.5 * totalmem();
}

/** The command line's limits: the dof cap given (or 2 000 000), half the machine's memory, the residual limit. */
export function defaultLimits(maxDofs = DEFAULT_MAX_DOFS): Required<SolveLimits> {
  return checkLimits({ maxDofs, maxFactorBytes: defaultFactorBytes(), residualLimit: RESIDUAL_LIMIT }) as Required<SolveLimits>;
}

/**
 * The one validation of a limits object (the pipeline's entry calls it before any work): every
 * limit given must be a positive number, `maxDofs` a whole one. Returns the same object.
 */
export function checkLimits(limits: SolveLimits): SolveLimits {
  const bad = (name: string, value: unknown, rule: string): never => {
    throw new PeakwiseError('usage', `limit ${name} must be ${rule}, got ${String(value)}`);
  };
  if (limits.maxDofs !== undefined && !(Number.isInteger(limits.maxDofs) && limits.maxDofs > 0)) bad('maxDofs', limits.maxDofs, 'a whole number > 0');
  if (limits.maxFactorBytes !== undefined && !(limits.maxFactorBytes > 0)) bad('maxFactorBytes', limits.maxFactorBytes, 'a number of bytes > 0');
  if (limits.residualLimit !== undefined && !(limits.residualLimit > 0)) bad('residualLimit', limits.residualLimit, 'a number > 0');
  return limits;
}
