/** Adjacency of a mesh: nearest node, element neighbours across edges, elements around each node. */
import type { Mesh } from './types.js';
import { NO_ELEM } from './types.js';

/** index of the node nearest to p within tol, or −1 */
export function findNode(mesh: Pick<Mesh, 'xy'>, p: readonly [number, number], tol: number): number {
  const xy = mesh.xy;
  let best = -1;
  let bd = tol;
  for (let n = 0; n < xy.length / 2; n++) {
    const d = Math.hypot(xy[2 * n] - p[0], xy[2 * n + 1] - p[1]);
    if (d <= bd) {
      bd = d;
      best = n;
    }
  }
  return best;
}

/**
 * Neighbouring element across each edge: entry 3e + i is the element across local edge i of
 * element e (edge 0: nodes 0→1, edge 1: 1→2, edge 2: 2→0), NO_ELEM on the boundary.
 */
export function elementNeighbors(mesh: Pick<Mesh, 'elemNodes' | 'nodesPerElem' | 'nVertices'>): Int32Array {
  const { elemNodes: en, nodesPerElem: npe, nVertices: nV } = mesh;
  const nE = en.length / npe;
  // half-edges grouped by start vertex
  const start = new Int32Array(nV + 1);
  for (let e = 0; e < nE; e++) for (let i = 0; i < 3; i++) start[en[npe * e + i] + 1]++;
  for (let v = 0; v < nV; v++) start[v + 1] += start[v];
  const fill = start.slice(0, nV);
  const half = new Int32Array(3 * nE);
  for (let e = 0; e < nE; e++) for (let i = 0; i < 3; i++) half[fill[en[npe * e + i]]++] = 3 * e + i;
  const nb = new Int32Array(3 * nE).fill(NO_ELEM);
  for (let e = 0; e < nE; e++) {
    for (let i = 0; i < 3; i++) {
      const a = en[npe * e + i];
      const b = en[npe * e + ((i + 1) % 3)];
      // the twin runs b → a
      for (let k = start[b]; k < start[b + 1]; k++) {
        const h = half[k];
        const f = (h / 3) | 0;
        const j = h % 3;
        if (en[npe * f + ((j + 1) % 3)] === a) {
          nb[3 * e + i] = f;
          break;
        }
      }
    }
  }
  return nb;
}

/** elements touching each node (all nodes, mid-side included): elems[offsets[n] … offsets[n+1]−1] */
export function nodeToElements(mesh: Pick<Mesh, 'xy' | 'elemNodes' | 'nodesPerElem'>): { offsets: Int32Array; elems: Int32Array } {
  const { elemNodes: en, nodesPerElem: npe } = mesh;
  const nN = mesh.xy.length / 2;
  const nE = en.length / npe;
  const offsets = new Int32Array(nN + 1);
  for (let i = 0; i < en.length; i++) offsets[en[i] + 1]++;
  for (let n = 0; n < nN; n++) offsets[n + 1] += offsets[n];
  const fill = offsets.slice(0, nN);
  const elems = new Int32Array(en.length);
  for (let e = 0; e < nE; e++) for (let k = 0; k < npe; k++) elems[fill[en[npe * e + k]]++] = e;
  return { offsets, elems };
}
