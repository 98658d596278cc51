/** Model stage: model file text → evaluated, validated Model (docs/model-format.md). */
export type * from './types.js';
export { parseModel, locate, formatModelError, pointKeyPath, type ParseOptions } from './parse.js';
export { stressUnit, stressToMPa, DEFAULT_UNITS, type UnitLabels } from './units.js';
export {
  evaluateExpression, parseExpression, evaluateTree, namesIn, ExpressionError, FUNCTIONS, CONSTANTS, RESERVED_NAMES,
  type ExpressionTree,
} from './expr.js';
export { formatPath, parsePath, joinPath, type PathSegment } from './keypath.js';
export { closest, editDistance, didYouMean } from './text.js';
export { boundingBox, shapeArea, MAX_ESTIMATED_TRIANGLES, MAX_MAGNITUDE, DEFAULT_STUDY } from './build.js';
export { MAX_ALIAS_COUNT, MAX_MODEL_CHARS } from './source.js';
export { STUDY_LEVELS, STUDY_RATIO, levelsRule, ratioRule } from './study-rules.js';
export { IMPLICIT_CASE, linearForm, loadCasesOf, hasCases } from './cases.js';
export { buildReported, reportedCaseRule, reportedTable } from './reported-values.js';
