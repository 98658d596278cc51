/**
 * element/: the reference triangle and the reference edge — shape functions of the 3- and 6-node
 * triangles with their derivatives, and the quadrature rules (one weight convention, rules.ts).
 * A leaf: it imports nothing from src/, so the mesh, fem and recovery stages all use it.
 */
export {
  cstShape, lstShape, cstParametricDerivatives, lstParametricDerivatives, shapeFunctions, shapeDerivatives, lstJacobian,
} from './shape.js';
export { TRI_1, TRI_3, TRI_7, GAUSS_LEGENDRE_3, GAUSS_LEGENDRE_5, type TriangleRule, type EdgeRule } from './rules.js';
