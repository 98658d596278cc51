import type { GaussStresses, ElasticSection } from '../fem/types.js';
import type { Mesh } from '../mesh/types.js';
import type { NodalStress } from './types.js';

/**
 * Entry checks of the recovery stage. The inputs come from other stages, so a mismatch is a
 * programming error (TypeError for a wrong shape, RangeError for a bad value), not a user mistake.
 */
export function checkMesh(mesh: Mesh): number {
  const npe = mesh.nodesPerElem;
  if (npe !== 3 && npe !== 6) throw new TypeError(`mesh.nodesPerElem must be 3 or 6, got ${String(npe)}`);
  if ((npe === 3) !== (mesh.order === 1)) throw new TypeError(`mesh.order ${mesh.order} does not match nodesPerElem ${npe}`);
  if (mesh.elemNodes.length % npe !== 0) throw new TypeError(`mesh.elemNodes length ${mesh.elemNodes.length} is not a multiple of ${npe}`);
  const nElem = mesh.elemNodes.length / npe;
  if (nElem === 0) throw new RangeError('mesh has no elements');
  return nElem;
}

export function checkGauss(mesh: Mesh, gauss: GaussStresses): number {
  const nElem = checkMesh(mesh);
  const ng = gauss.nGauss;
  if (!(Number.isInteger(ng) && ng >= 1)) throw new TypeError(`gauss.nGauss must be a positive integer, got ${ng}`);
  if (ng === 2) throw new RangeError('gauss.nGauss = 2 cannot define a linear stress field in a triangle');
  const nPts = ng * nElem;
  if (gauss.xy.length !== 2 * nPts || gauss.stress.length !== 3 * nPts || gauss.weight.length !== nPts || gauss.szz?.length !== nPts) {
    throw new TypeError(
      `gauss arrays do not match ${nElem} elements × ${ng} points (xy ${gauss.xy.length}, stress ${gauss.stress.length}, weight ${gauss.weight.length}, szz ${gauss.szz?.length})`,
    );
  }
  return nElem;
}

export function checkSection(section: ElasticSection): void {
  if (!(section.E > 0)) throw new RangeError(`section.E must be > 0, got ${section.E}`);
  if (!(section.nu > -1 && section.nu < 0.5)) throw new RangeError(`section.nu must lie in (−1, 0.5), got ${section.nu}`);
}

export function checkField(mesh: Mesh, field: Pick<NodalStress, 'stress' | 'szz'>): void {
  const nNodes = mesh.xy.length >> 1;
  if (field.stress.length !== 3 * nNodes || field.szz.length !== nNodes) {
    throw new TypeError(`nodal stress arrays (${field.stress.length}, ${field.szz.length}) do not match ${nNodes} nodes`);
  }
}
