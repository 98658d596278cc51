/**
 * pipeline/: model → problem → mesh → solve → recover, once for every caller (the commands, the
 * checks, the sweep, the benchmark, the study and the library API). DEVELOPERS.md, "The pipeline".
 */
export { problemOf, sectionOf, uniquePoints, SAME_POINT_RELATIVE, type Problem, type ProblemOptions } from './problem.js';
export { baseSizeField, meshAt, solveMesh, solveAt, solveProblem, estimateOf, type SolvedLevel, type MeshRequest } from './solve.js';
export { adaptiveSolve, type AdaptiveOptions, type AdaptiveCycle, type AdaptiveCycleResult, type AdaptiveResult } from './adapt.js';
export { checkLimits, defaultLimits, defaultFactorBytes, DEFAULT_MAX_DOFS, type SolveLimits } from './limits.js';
export { reuseStore, contentKey, objectKey, ReuseStore } from './reuse.js';
export { modelFromParts, type ModelParts } from './model-parts.js';
export { combineLevel, superposeSolutions, type LoadSetLevel, type ProblemCase } from './cases.js';
