import { FemError } from '../errors.js';
import type { Mesh } from '../mesh/types.js';
import { TRI_3 } from '../element/index.js';
import { cstGradients, gatherElementXY, lstGradients } from './shape.js';
import type { ElasticSection } from './types.js';

/** Checks the material and thickness once at the stage entry. */
export function validateSection(section: ElasticSection): void {
  const { E, nu, thickness, state } = section;
  if (!(Number.isFinite(E) && E > 0)) throw new FemError(`Young's modulus E must be a positive number, got ${E}`, 'material.E');
  const nuMax = 0.5;
  if (!(Number.isFinite(nu) && nu > -1 && nu < nuMax)) {
    throw new FemError(`Poisson's ratio nu must lie in (-1, 0.5), got ${nu}`, 'material.nu');
  }
  if (!(Number.isFinite(thickness) && thickness > 0)) throw new FemError(`thickness must be > 0, got ${thickness}`, 'thickness');
  if (state !== 'plane-stress' && state !== 'plane-strain' && state !== 'axisymmetric') {
    throw new FemError(`state must be plane-stress, plane-strain or axisymmetric, got ${String(state)}`, 'state');
  }
  const { density, expansion } = section;
  if (density !== undefined && !(Number.isFinite(density) && density > 0)) {
    throw new FemError(`density must be a positive number, got ${density}`, 'material.density');
  }
  if (expansion !== undefined && !Number.isFinite(expansion)) {
    throw new FemError(`thermal expansion coefficient must be a finite number, got ${expansion}`, 'material.expansion');
  }
}

/**
 * Checks the mesh arrays once: lengths, node ids in range, every node used by an element,
 * every element with a positive Jacobian at its integration points (counter-clockwise, untangled).
 */
export function validateSolverMesh(mesh: Mesh): void {
  const npe = mesh.nodesPerElem;
  if (!((npe === 3 && mesh.order === 1) || (npe === 6 && mesh.order === 2))) {
    throw new FemError(`mesh has ${npe} nodes per element with order ${mesh.order}; expected 3 with order 1 or 6 with order 2`);
  }
  if (mesh.edgeStride !== mesh.order + 1) throw new FemError(`mesh edgeStride ${mesh.edgeStride} does not match order ${mesh.order}`);
  const nNodes = mesh.xy.length / 2;
  if (!Number.isInteger(nNodes) || nNodes === 0) throw new FemError(`mesh has ${mesh.xy.length} coordinates; expected a positive even number`);
  if (mesh.elemNodes.length % npe !== 0 || mesh.elemNodes.length === 0) {
    throw new FemError(`mesh has ${mesh.elemNodes.length} element node entries, not a positive multiple of ${npe}`);
  }
  const nEdges = mesh.boundaryEdges.length / mesh.edgeStride;
  if (!Number.isInteger(nEdges) || mesh.boundaryPiece.length !== nEdges) {
    throw new FemError(`mesh boundary arrays disagree: ${mesh.boundaryEdges.length} edge entries, ${mesh.boundaryPiece.length} piece ids`);
  }
  const used = new Uint8Array(nNodes);
  for (let k = 0; k < mesh.elemNodes.length; k++) {
    const n = mesh.elemNodes[k];
    if (n >= nNodes) throw new FemError(`element ${Math.floor(k / npe)} refers to node ${n}; the mesh has ${nNodes} nodes`);
    used[n] = 1;
  }
  for (let k = 0; k < mesh.boundaryEdges.length; k++) {
    if (mesh.boundaryEdges[k] >= nNodes) throw new FemError(`boundary edge ${Math.floor(k / mesh.edgeStride)} refers to node ${mesh.boundaryEdges[k]}; the mesh has ${nNodes} nodes`);
  }
  for (let n = 0; n < nNodes; n++) {
    if (!used[n]) throw new FemError(`node ${n} at (${mesh.xy[2 * n]}, ${mesh.xy[2 * n + 1]}) belongs to no element`);
  }
  const exy = new Float64Array(2 * npe);
  const dx = new Float64Array(6);
  const dy = new Float64Array(6);
  const nElem = mesh.elemNodes.length / npe;
  for (let e = 0; e < nElem; e++) {
    gatherElementXY(mesh.xy, mesh.elemNodes, npe, e, exy);
    let detMin: number;
    if (npe === 3) detMin = cstGradients(exy, dx, dy);
    else {
      detMin = Infinity;
      for (let g = 0; g < TRI_3.w.length; g++) detMin = Math.min(detMin, lstGradients(exy, TRI_3.xi[g], TRI_3.eta[g], dx, dy));
    }
    if (!(detMin > 0)) {
      throw new FemError(
        `element ${e} (first node at (${exy[0]}, ${exy[1]})) is inverted or degenerate (Jacobian ${detMin}); corner nodes must run counter-clockwise`,
      );
    }
  }
}
