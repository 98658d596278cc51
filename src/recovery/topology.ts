import type { Mesh } from '../mesh/types.js';

/**
 * Small connectivity maps the recovery needs (kept here so this stage does not wait on the
 * mesher's helpers): elements around each node, boundary flags, the edge of each mid-side node.
 */

/** CSR map node → elements containing it (as any of its nodes). */
export interface NodeElements {
  start: Int32Array; // length nNodes + 1
  elems: Int32Array;
}

export function buildNodeElements(mesh: Pick<Mesh, 'xy' | 'elemNodes' | 'nodesPerElem'>, cornersOnly = false): NodeElements {
  const nNodes = mesh.xy.length >> 1;
  const npe = mesh.nodesPerElem;
  const nElem = mesh.elemNodes.length / npe;
  const take = cornersOnly ? 3 : npe;
  const start = new Int32Array(nNodes + 1);
  for (let e = 0; e < nElem; e++) for (let i = 0; i < take; i++) start[mesh.elemNodes[npe * e + i] + 1]++;
  for (let n = 0; n < nNodes; n++) start[n + 1] += start[n];
  const fill = start.slice(0, nNodes);
  const elems = new Int32Array(start[nNodes]);
  for (let e = 0; e < nElem; e++) for (let i = 0; i < take; i++) elems[fill[mesh.elemNodes[npe * e + i]]++] = e;
  return { start, elems };
}

/** 1 for every node on a boundary edge (ends and mid-side nodes), else 0. */
export function boundaryNodeFlags(mesh: Pick<Mesh, 'xy' | 'boundaryEdges'>): Uint8Array {
  const flags = new Uint8Array(mesh.xy.length >> 1);
  for (let i = 0; i < mesh.boundaryEdges.length; i++) flags[mesh.boundaryEdges[i]] = 1;
  return flags;
}

/** local corner pairs of the mid-side nodes 3, 4, 5 */
export const MID_EDGE: readonly (readonly [number, number])[] = [
  [0, 1],
  [1, 2],
  [2, 0],
];

export function elementCount(mesh: Pick<Mesh, 'elemNodes' | 'nodesPerElem'>): number {
  return mesh.elemNodes.length / mesh.nodesPerElem;
}
