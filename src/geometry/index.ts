/** Geometry stage: exact plate boundary (pieces, loops, corners, area) and curve utilities. */
export type { Curve, PieceRole, BoundaryPiece, Loop, Corner, PlateGeometry } from './types.js';
export { buildGeometry, CLEARANCE_RELATIVE, MIN_DIGITS_LEFT } from './build.js';
export {
  curvePoint,
  curveStart,
  curveEnd,
  curveDerivative,
  curveTangent,
  curveOutwardNormal,
  curveLength,
  curveLengthBetween,
  curveParamAtLength,
  curveCurvatureRadius,
  closestOnCurve,
  curveBBox,
  curveDoubleArea,
  type ClosestPoint,
  type BBox,
} from './curves.js';
export { buildBoxGrid, gridCell, forEachNearBox, type BoxGrid } from './box-grid.js';
export { pieceAtPoint, pointInMaterial, loopWinding, loopPolyline, type PieceHit } from './query.js';
