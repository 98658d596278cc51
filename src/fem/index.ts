export type { ElasticSection, GaussStresses, Solution } from './types.js';
export { elasticityMatrix, outOfPlaneStress } from './elasticity.js';
export { TRI3_ETA, TRI3_W, TRI3_XI, cstGradients, gatherElementXY, lstGradients, lstParametricDerivatives, lstShape } from './shape.js';
export { elementStiffnessCst, elementStiffnessLst } from './elements.js';
export { gaussStresses } from './stresses.js';
export { assembleStiffness, csrMultiply, stiffnessPattern, type StiffnessPattern } from './assembly.js';
export {
  SELECTOR_TOLERANCE, describeSelector, selectBoundary, nearestBoundaryPoint, pieceNearest, outlineFarPieces, farFieldEdges, selectorWarnings,
  type Selection, type BoundaryPointHit,
} from './selectors.js';
export { selectorVertices, verticesOfSelector } from './required-points.js';
export {
  appliedResultant,
  bodyForceLoad,
  edgeTractionLoad,
  loadVector,
  pressureLoad,
  type BodyForceField,
  type TractionField,
} from './loads.js';
export { checkRigidRestraint, supportedDofs } from './supports.js';
export { validateSolverMesh, validateSection } from './validate.js';
export { solvePlate, type PlateProblem, type PrescribedDisplacement } from './solve.js';
export { farFieldStressLoad } from './farfield.js';
export { pinForceLoad } from './pin-force.js';
export { prescribedFromSupports, interpolateTable, TABLE_TOLERANCE_RELATIVE, type PrescribedValue } from './prescribe.js';
