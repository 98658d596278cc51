/** One verification case of `peakwise check`: a computed quantity against a closed form. */
export interface CheckResult {
  /** id of the case that produced this row (CHECK_CASES); set by runChecks */
  caseId?: string;
  /** short case name, e.g. "Kirsch hole: peak hoop stress" */
  name: string;
  /** published source of the reference value (author, year, equation or table) */
  source: string;
  /** what is compared, in words, with the error measure when it is not relative */
  quantity: string;
  reference: number;
  value: number;
  /** relative error |value − reference| / |reference| unless `quantity` states otherwise */
  error: number;
  tolerance: number;
  /**
   * rows that run a convergence study: the converging site's band (value ± halfWidth, in the units of
   * `value`) and whether it holds the reference within the reference's own stated uncertainty; every
   * converging site of the study counts (`inside` is false if any band misses its exact value)
   */
  band?: { value: number; halfWidth: number; referenceUncertainty: number; inside: boolean };
  pass: boolean;
  /** wall time of the case in seconds (shared solves are counted where they ran) */
  seconds?: number;
  /** set when the case could not run; the message of the failure */
  failure?: string;
}

/** A case definition: its identity and a function producing one or more results. */
export interface CheckCase {
  /** stable id used by `only` (e.g. "kirsch") */
  id: string;
  run(): CheckResult[];
}
