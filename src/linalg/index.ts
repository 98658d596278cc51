export type { Csr, Ordering, Symbolic, Factor, EliminationTree } from './types.js';
export { csrFromTriplets, csrMatVec, csrSubmatrix, csrGet, csrNormInf, isSymmetric, residualNorm, residualNorms, validateCsr } from './csr.js';
export { NotPositiveDefiniteError } from './errors.js';
export { amdOrder, type MinDegreeOptions } from './min-degree.js';
export { compressGraph, type NodeGraph } from './graph.js';
export {
  orderNatural,
  orderAmd,
  orderNestedDissection,
  chooseOrdering,
  chooseOrderingDetailed,
  predictNnzL,
  type OrderingChoice,
  type ChooseOrderingOptions,
  type NestedDissectionOptions,
} from './ordering.js';
export { eliminationTree, postorderTree, postorderedTree, columnCounts, symbolicFactor, type SupernodeOptions } from './symbolic.js';
export { nodeEliminationTree } from './node-tree.js';
export { factorKernels, releaseFactor, type FactorOptions } from './numeric.js';
export { wasmKernelsAvailable } from './wasm.js';
export { analyze, factorize, refactorize, solveFactor, solveFactorMany, solveSpd, type SpdSolution } from './solve.js';
export { toMatrixMarket, vectorToMatrixMarket, matrixMarketChunks } from './matrix-market.js';
