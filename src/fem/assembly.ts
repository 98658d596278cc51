import type { Csr } from '../linalg/types.js';
import type { Mesh } from '../mesh/types.js';
import { axisymmetricMatrix, axisymmetricStiffness } from './axisymmetric.js';
import { elasticityMatrix } from './elasticity.js';
import { elementStiffnessCst, elementStiffnessLst } from './elements.js';
import { gatherElementXY } from './shape.js';
import type { ElasticSection } from './types.js';

/**
 * Sparsity of the global stiffness, computed once per mesh from the connectivity.
 * Node level: node n's neighbours (itself included) are nodeCols[nodeRowPtr[n] .. nodeRowPtr[n+1]),
 * sorted ascending. Dof level (2 dofs per node, u then v): each node pair is a 2×2 block, so
 * rows 2n and 2n+1 share the same sorted column list {2m, 2m+1 : m neighbour of n}.
 * `elemOffsets` says where each element's node pairs land: for element e and local nodes i, j,
 * elemOffsets[npe²·e + npe·i + j] is the place of node j in node i's sorted neighbour list
 * (relative to the start of that list), so assembly writes by position without searching.
 */
export interface StiffnessPattern {
  n: number;
  nodeRowPtr: Int32Array;
  nodeCols: Int32Array;
  rowPtr: Int32Array;
  colIdx: Int32Array;
  elemOffsets: Int32Array;
}

/**
 * Builds the CSR pattern (full, both triangles, sorted columns) of the stiffness of `mesh`. The steps
 * are small functions of their own: V8 compiles a long function with many loops once per loop on its
 * first call (on-stack replacement), which makes the first, cold call of one big function slow.
 */
export function stiffnessPattern(mesh: Pick<Mesh, 'xy' | 'elemNodes' | 'nodesPerElem'>): StiffnessPattern {
  const nNodes = mesh.xy.length / 2;
  const npe = mesh.nodesPerElem;
  const { elemNodes } = mesh;
  const { elemPtr, elemList } = nodeElements(elemNodes, npe, nNodes);
  const nodeRowPtr = neighbourCounts(elemNodes, npe, nNodes, elemPtr, elemList);
  const { nodeCols, elemOffsets } = neighbourRows(elemNodes, npe, nNodes, elemPtr, elemList, nodeRowPtr);
  const { rowPtr, colIdx } = dofRows(nNodes, nodeRowPtr, nodeCols);
  return { n: 2 * nNodes, nodeRowPtr, nodeCols, rowPtr, colIdx, elemOffsets };
}

/** node → elements: the elements of node n are elemList[elemPtr[n] .. elemPtr[n+1]), ascending */
function nodeElements(elemNodes: Mesh['elemNodes'], npe: number, nNodes: number): { elemPtr: Int32Array; elemList: Int32Array } {
  const nElem = elemNodes.length / npe;
  const elemPtr = new Int32Array(nNodes + 1);
  for (let k = 0; k < elemNodes.length; k++) elemPtr[elemNodes[k] + 1]++;
  for (let n = 0; n < nNodes; n++) elemPtr[n + 1] += elemPtr[n];
  const elemList = new Int32Array(elemNodes.length);
  const fill = elemPtr.slice(0, nNodes);
  for (let e = 0; e < nElem; e++) {
    for (let i = 0; i < npe; i++) elemList[fill[elemNodes[npe * e + i]]++] = e;
  }
  return { elemPtr, elemList };
}

/** row pointers of the node adjacency (each node's distinct neighbours, itself included), by a marker */
function neighbourCounts(elemNodes: Mesh['elemNodes'], npe: number, nNodes: number, elemPtr: Int32Array, elemList: Int32Array): Int32Array {
  const marker = new Int32Array(nNodes).fill(-1);
  const nodeRowPtr = new Int32Array(nNodes + 1);
  for (let n = 0; n < nNodes; n++) {
    let deg = 0;
    for (let p = elemPtr[n]; p < elemPtr[n + 1]; p++) {
      const base = npe * elemList[p];
      for (let i = 0; i < npe; i++) {
        const m = elemNodes[base + i];
        if (marker[m] !== n) {
          marker[m] = n;
          deg++;
        }
      }
    }
    nodeRowPtr[n + 1] = nodeRowPtr[n] + deg;
  }
  return nodeRowPtr;
}

/**
 * The sorted neighbour lists and every element pair's place in them. A row is filled in order of first
 * sight: seen[m] is m's place there (valid while marker[m] === n), and each element's pairs take those
 * places; the row is then sorted and the places renamed.
 */
function neighbourRows(
  elemNodes: Mesh['elemNodes'], npe: number, nNodes: number, elemPtr: Int32Array, elemList: Int32Array, nodeRowPtr: Int32Array,
): { nodeCols: Int32Array; elemOffsets: Int32Array } {
  let maxDeg = 0;
  for (let n = 0; n < nNodes; n++) maxDeg = Math.max(maxDeg, nodeRowPtr[n + 1] - nodeRowPtr[n]);
  const nodeCols = new Int32Array(nodeRowPtr[nNodes]);
  const marker = new Int32Array(nNodes).fill(-1);
  const seen = new Int32Array(nNodes);
  const npe2 = npe * npe;
  const elemOffsets = new Int32Array(npe2 * (elemNodes.length / npe));
  const firstSight = new Int32Array(maxDeg); // of the entry at each sorted place
  const sortedPlace = new Int32Array(maxDeg); // of the entry first seen at each place
  for (let n = 0; n < nNodes; n++) {
    const r0 = nodeRowPtr[n];
    let q = r0;
    for (let p = elemPtr[n]; p < elemPtr[n + 1]; p++) {
      const e = elemList[p];
      const base = npe * e;
      const at = pairRow(elemNodes, npe, e, n);
      for (let j = 0; j < npe; j++) {
        const m = elemNodes[base + j];
        if (marker[m] !== n) {
          marker[m] = n;
          seen[m] = q - r0;
          nodeCols[q++] = m;
        }
        elemOffsets[at + j] = seen[m];
      }
    }
    sortRow(nodeCols, r0, q - r0, firstSight, sortedPlace);
    for (let p = elemPtr[n]; p < elemPtr[n + 1]; p++) {
      const at = pairRow(elemNodes, npe, elemList[p], n);
      for (let j = 0; j < npe; j++) elemOffsets[at + j] = sortedPlace[elemOffsets[at + j]];
    }
  }
  return { nodeCols, elemOffsets };
}

/** Where element e's pairs of row node n start in elemOffsets: npe²·e + npe·(n's place in e). */
function pairRow(elemNodes: Mesh['elemNodes'], npe: number, e: number, n: number): number {
  let li = 0;
  while (elemNodes[npe * e + li] !== n) li++;
  return npe * npe * e + npe * li;
}

/** Insertion sort of one row (tens of entries); sortedPlace[k] is then the new place of the entry that was at k. */
function sortRow(cols: Int32Array, r0: number, deg: number, firstSight: Int32Array, sortedPlace: Int32Array): void {
  for (let a = 0; a < deg; a++) firstSight[a] = a;
  for (let a = 1; a < deg; a++) {
    const c = cols[r0 + a], w = firstSight[a];
    let b = a - 1;
    while (b >= 0 && cols[r0 + b] > c) {
      cols[r0 + b + 1] = cols[r0 + b];
      firstSight[b + 1] = firstSight[b];
      b--;
    }
    cols[r0 + b + 1] = c;
    firstSight[b + 1] = w;
  }
  for (let a = 0; a < deg; a++) sortedPlace[firstSight[a]] = a;
}

/** dof level: rows 2n and 2n+1 take node n's neighbour list, each neighbour m as columns 2m, 2m+1 */
function dofRows(nNodes: number, nodeRowPtr: Int32Array, nodeCols: Int32Array): { rowPtr: Int32Array; colIdx: Int32Array } {
  const nDof = 2 * nNodes;
  const rowPtr = new Int32Array(nDof + 1);
  for (let n = 0; n < nNodes; n++) {
    const deg = nodeRowPtr[n + 1] - nodeRowPtr[n];
    rowPtr[2 * n] = 4 * nodeRowPtr[n];
    rowPtr[2 * n + 1] = 4 * nodeRowPtr[n] + 2 * deg;
  }
  rowPtr[nDof] = 4 * nodeRowPtr[nNodes];
  const colIdx = new Int32Array(rowPtr[nDof]);
  for (let n = 0; n < nNodes; n++) {
    const deg = nodeRowPtr[n + 1] - nodeRowPtr[n];
    const r0 = rowPtr[2 * n];
    const r1 = rowPtr[2 * n + 1];
    for (let k = 0; k < deg; k++) {
      const m = nodeCols[nodeRowPtr[n] + k];
      colIdx[r0 + 2 * k] = 2 * m;
      colIdx[r0 + 2 * k + 1] = 2 * m + 1;
      colIdx[r1 + 2 * k] = 2 * m;
      colIdx[r1 + 2 * k + 1] = 2 * m + 1;
    }
  }
  return { rowPtr, colIdx };
}

/**
 * Global stiffness K (whole thickness: element matrices are multiplied by t; an axisymmetric
 * section: the whole revolution, thickness unused) written into
 * the pattern by position. The returned Csr shares rowPtr/colIdx with the pattern.
 */
export function assembleStiffness(
  mesh: Pick<Mesh, 'xy' | 'elemNodes' | 'nodesPerElem'>,
  section: ElasticSection,
  pattern: StiffnessPattern = stiffnessPattern(mesh),
): Csr {
  // an axisymmetric section: ring elements for the whole revolution (fem/axisymmetric.ts)
  const axisymmetric = section.state === 'axisymmetric';
  const D = axisymmetric ? axisymmetricMatrix(section) : elasticityMatrix(section);
  const npe = mesh.nodesPerElem;
  const nd = 2 * npe;
  const { elemNodes, xy } = mesh;
  const nElem = elemNodes.length / npe;
  const values = new Float64Array(pattern.colIdx.length);
  const { rowPtr } = pattern;
  const exy = new Float64Array(2 * npe);
  const ke = new Float64Array(nd * nd);
  const t = section.thickness;
  const offsets = pattern.elemOffsets;
  if (offsets.length !== npe * npe * nElem) throw new RangeError(`stiffness pattern has places for ${offsets.length / (npe * npe)} elements; the mesh has ${nElem}`);
  // the element loop stays short and calls small functions: each is optimised on its own after a few
  // hundred calls, where one long loop body waits for the whole function's on-stack replacement
  for (let e = 0; e < nElem; e++) {
    gatherElementXY(xy, elemNodes, npe, e, exy);
    if (axisymmetric) axisymmetricStiffness(exy, npe, D, ke);
    else if (npe === 3) elementStiffnessCst(exy, D, t, ke);
    else elementStiffnessLst(exy, D, t, ke);
    addByPlace(values, rowPtr, offsets, elemNodes, npe, e, ke);
  }
  return { n: pattern.n, rowPtr: pattern.rowPtr, colIdx: pattern.colIdx, values };
}

/** Adds element e's matrix `ke` into the values, each node pair at its place from the pattern. */
function addByPlace(values: Float64Array, rowPtr: Int32Array, offsets: Int32Array, elemNodes: Mesh['elemNodes'], npe: number, e: number, ke: Float64Array): void {
  const nd = 2 * npe;
  const base = npe * e;
  for (let i = 0; i < npe; i++) {
    const a = elemNodes[base + i];
    const ra = rowPtr[2 * a];
    const rb = rowPtr[2 * a + 1];
    const at = npe * npe * e + npe * i;
    for (let j = 0; j < npe; j++) {
      const o = 2 * offsets[at + j];
      const k0 = 2 * i * nd + 2 * j;
      const k1 = k0 + nd;
      values[ra + o] += ke[k0];
      values[ra + o + 1] += ke[k0 + 1];
      values[rb + o] += ke[k1];
      values[rb + o + 1] += ke[k1 + 1];
    }
  }
}

/** y = K x for a CSR matrix (full pattern) */
export function csrMultiply(K: Csr, x: Float64Array, y: Float64Array = new Float64Array(K.n)): Float64Array {
  const { rowPtr, colIdx, values } = K;
  for (let i = 0; i < K.n; i++) {
    let s = 0;
    for (let p = rowPtr[i]; p < rowPtr[i + 1]; p++) s += values[p] * x[colIdx[p]];
    y[i] = s;
  }
  return y;
}
