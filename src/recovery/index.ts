export type { NodalStress, ErrorEstimate } from './types.js';
export { principal, vonMises, tresca, maxShear, inPlaneMaxShear, measureValue, nodalMeasure } from './invariants.js';
export type { PrincipalStresses } from './invariants.js';
export { recoverAverage, recoverSpr } from './recover.js';
