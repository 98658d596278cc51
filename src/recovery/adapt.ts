/**
 * Element sizes for the next mesh of an adaptive loop, from the Zienkiewicz–Zhu estimate of the
 * current one, and the DOFs such a mesh will have. The loop itself (mesh → solve → estimate →
 * remesh) is the pipeline's (src/pipeline/adapt.ts): recovery does not drive the mesher or the solver.
 */
import type { Mesh } from '../mesh/types.js';
import { cornerArea } from './element.js';
import type { ErrorEstimate } from './types.js';

/** h of an equilateral triangle with the element's area: the size the mesher's sizeAt means */
const EQUILATERAL = Math.sqrt(3) / 4;

/**
 * New element sizes from the Zienkiewicz–Zhu (1987) criterion: with m elements, target error
 * η_goal and ‖U‖² = ‖u_h‖² + ‖e*‖², the permissible element error is ē = η_goal·‖U‖/√m; an
 * element with ξ = ‖e*‖_T/ē gets h_new = h_T ξ^(−1/p), limited to the cap per cycle.
 * O. C. Zienkiewicz & J. Z. Zhu, IJNME 24 (1987) 337–357.
 */
export function zzElementSizes(
  mesh: Mesh,
  estimate: ErrorEstimate,
  goalPercent: number,
  cap: readonly [number, number] = [0.2, 2],
): Float64Array {
  const nElem = estimate.elemErrorSq.length;
  const p = mesh.order;
  const total = estimate.energySq + estimate.errorSq;
  const eBarSq = ((goalPercent / 100) ** 2 * total) / nElem;
  const out = new Float64Array(nElem);
  for (let e = 0; e < nElem; e++) {
    const hT = Math.sqrt(Math.abs(cornerArea(mesh, e)) / EQUILATERAL);
    const xiSq = estimate.elemErrorSq[e] / eBarSq;
    // ξ^(−1/p) = (ξ²)^(−1/(2p)); ξ = 0 (exact element) → the largest growth allowed
    const ratio = xiSq > 0 ? xiSq ** (-1 / (2 * p)) : cap[1];
    out[e] = hT * Math.min(cap[1], Math.max(cap[0], ratio));
  }
  return out;
}

/** DOFs of a mesh whose element sizes follow `vertexSize`, by the current mesh's DOFs per element. */
export function predictDofs(mesh: Mesh, vertexSize: Float64Array, dofsPerElement: number): number {
  const npe = mesh.nodesPerElem;
  const nElem = mesh.elemNodes.length / npe;
  let count = 0;
  for (let e = 0; e < nElem; e++) {
    const h = (vertexSize[mesh.elemNodes[npe * e]] + vertexSize[mesh.elemNodes[npe * e + 1]] + vertexSize[mesh.elemNodes[npe * e + 2]]) / 3;
    count += Math.abs(cornerArea(mesh, e)) / (EQUILATERAL * h * h);
  }
  return count * dofsPerElement;
}
