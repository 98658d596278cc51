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
 */
export interface StiffnessPattern {
  n: number;
  nodeRowPtr: Int32Array;
  nodeCols: Int32Array;
  rowPtr: Int32Array;
  colIdx: Int32Array;
}

/** Builds the CSR pattern (full, both triangles, sorted columns) of the stiffness of `mesh`. */
export function stiffnessPattern(mesh: Pick<Mesh, 'xy' | 'elemNodes' | 'nodesPerElem'>): StiffnessPattern {
  const nNodes = mesh.xy.length / 2;
  const npe = mesh.nodesPerElem;
  const { elemNodes } = mesh;
  const nElem = elemNodes.length / npe;

  // node → elements
  const elemPtr = new Int32Array(nNodes + 1);
  for (let k = 0; k < elemNodes.length; k++) elemPtr[elemNodes[k] + 1]++;
  for (let n = 0; n < nNodes; n++) elemPtr[n + 1] += elemPtr[n];
  const elemList = new Int32Array(elemNodes.length);
  const fill = elemPtr.slice(0, nNodes);
  for (let e = 0; e < nElem; e++) {
    for (let i = 0; i < npe; i++) elemList[fill[elemNodes[npe * e + i]]++] = e;
  }

  // node adjacency: two passes with a marker (count, then fill and sort)
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
  const nodeCols = new Int32Array(nodeRowPtr[nNodes]);
  marker.fill(-1);
  for (let n = 0; n < nNodes; n++) {
    let q = nodeRowPtr[n];
    for (let p = elemPtr[n]; p < elemPtr[n + 1]; p++) {
      const base = npe * elemList[p];
      for (let i = 0; i < npe; i++) {
        const m = elemNodes[base + i];
        if (marker[m] !== n) {
          marker[m] = n;
          nodeCols[q++] = m;
        }
      }
    }
    nodeCols.subarray(nodeRowPtr[n], q).sort();
  }

  // dof level
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
  return { n: nDof, nodeRowPtr, nodeCols, rowPtr, colIdx };
}

/** position of node m in node n's sorted neighbour list, relative to the row start (binary search) */
function neighbourOffset(pattern: StiffnessPattern, n: number, m: number): number {
  const start = pattern.nodeRowPtr[n];
  let lo = start;
  let hi = pattern.nodeRowPtr[n + 1] - 1;
  const cols = pattern.nodeCols;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const c = cols[mid];
    if (c < m) lo = mid + 1;
    else if (c > m) hi = mid - 1;
    else return mid - start;
  }
  return -1;
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
  for (let e = 0; e < nElem; e++) {
    gatherElementXY(xy, elemNodes, npe, e, exy);
    if (axisymmetric) axisymmetricStiffness(exy, npe, D, ke);
    else if (npe === 3) elementStiffnessCst(exy, D, t, ke);
    else elementStiffnessLst(exy, D, t, ke);
    const base = npe * e;
    for (let i = 0; i < npe; i++) {
      const a = elemNodes[base + i];
      const ra = rowPtr[2 * a];
      const rb = rowPtr[2 * a + 1];
      for (let j = 0; j < npe; j++) {
        const o = 2 * neighbourOffset(pattern, a, elemNodes[base + j]);
        const k0 = 2 * i * nd + 2 * j;
        const k1 = k0 + nd;
        values[ra + o] += ke[k0];
        values[ra + o + 1] += ke[k0 + 1];
        values[rb + o] += ke[k1];
        values[rb + o + 1] += ke[k1 + 1];
      }
    }
  }
  return { n: pattern.n, rowPtr: pattern.rowPtr, colIdx: pattern.colIdx, values };
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
