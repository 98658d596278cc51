export type { ElasticSection, GaussStresses, Solution } from './types.js';
export { elasticityMatrix, outOfPlaneStress } from './elasticity.js';
export { cstGradients, gatherElementXY, lstGradients } from './shape.js';
// the reference element's shape functions, for callers that reached them through fem
export { lstParametricDerivatives, lstShape } from '../element/index.js';
export { elementStiffnessCst, elementStiffnessLst } from './elements.js';
export { gaussStresses } from './stresses.js';
export { assembleStiffness, csrMultiply, stiffnessPattern, type StiffnessPattern } from './assembly.js';
export {
  SELECTOR_TOLERANCE, describeSelector, selectBoundary, nearestBoundaryPoint, pieceNearest, outlineFarPieces, farFieldEdges, selectorWarnings,
  type Selection, type BoundaryPointHit,
} from './selectors.js';
export { selectorVertices, verticesOfSelector } from './required-points.js';
export { appliedResultant, loadVector } from './loads.js';
export { edgeTractionLoad, pressureLoad, type TractionField } from './edge-load.js';
export { bodyForceLoad, type BodyForceField } from './body-load.js';
export { bodyFields, temperatureField, thermalLoad, thermalStrainPerDegree, type BodyFields, type TemperatureField } from './thermal.js';
export { checkRigidRestraint, supportedDofs } from './supports.js';
export { validateSolverMesh, validateSection } from './validate.js';
export { solvePlate, solvePlateCases, largestDisplacement, type PlateProblem, type PlateCase, type PrescribedDisplacement, type KeptStiffness, type StiffnessReuse, type CsrRows } from './solve.js';
export { farFieldStressLoad } from './farfield.js';
export { pinForceLoad } from './pin-force.js';
export { prescribedFromSupports, supportConstraints, interpolateTable, TABLE_TOLERANCE_RELATIVE, type PrescribedValue, type SupportConstraints } from './prescribe.js';
export {
  axisymmetricMatrix, axisymmetricStiffness, axisymmetricGaussStresses, axisymmetricThermalLoad, holdAxisNodes, checkAxialRestraint, REVOLUTION,
} from './axisymmetric.js';
export { revolvedTractionLoad, revolvedPressureLoad, revolvedBodyLoad } from './axisymmetric-loads.js';
