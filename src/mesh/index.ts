export type { Mesh, MeshOptions, MeshQuality, SizeField } from './types.js';
export { NO_ELEM } from './types.js';
export { meshPlate, DEFAULT_MIN_ANGLE_DEG, DEFAULT_MAX_VERTICES, SIZE_FACTOR } from './mesh.js';
export { sizeFieldFromSettings, gradedToward, CURVE_SEGMENT_ANGLE } from './sizefield.js';
export type { SizeSettings } from './sizefield.js';
export { meshQuality } from './quality.js';
export { validateMesh } from './validate.js';
export { findNode, elementNeighbors, nodeToElements } from './adjacency.js';
