/** peakwise library entry: the same functions the CLI uses. */
export * from './errors.js';
export type * from './model/types.js';
export type * from './geometry/types.js';
export type * from './mesh/types.js';
export type * from './linalg/types.js';
export type * from './fem/types.js';
export type * from './recovery/types.js';
export type * from './study/types.js';
