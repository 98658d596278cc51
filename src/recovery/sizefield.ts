import type { Mesh, SizeField } from '../mesh/types.js';
import { buildPointLocator } from './locate.js';
import { buildNodeElements } from './topology.js';

/**
 * A size field carried by an existing mesh: one target size per vertex, interpolated linearly
 * over the element containing the query point (corner values, reference coordinates of the
 * locator). Points the mesh does not cover (just outside a curved boundary chord, or beyond it)
 * take the size of the nearest vertex.
 */
export function meshSizeField(mesh: Mesh, vertexSize: Float64Array): SizeField {
  const locator = buildPointLocator(mesh);
  const npe = mesh.nodesPerElem;
  const nV = mesh.nVertices;
  // uniform buckets of vertices for the nearest-vertex fallback
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (let v = 0; v < nV; v++) {
    minX = Math.min(minX, mesh.xy[2 * v]);
    maxX = Math.max(maxX, mesh.xy[2 * v]);
    minY = Math.min(minY, mesh.xy[2 * v + 1]);
    maxY = Math.max(maxY, mesh.xy[2 * v + 1]);
  }
  const side = Math.max(1, Math.ceil(Math.sqrt(nV / 4)));
  const cw = Math.max(maxX - minX, 1e-300) / side;
  const ch = Math.max(maxY - minY, 1e-300) / side;
  const cellOf = (x: number, y: number): [number, number] => [
    Math.min(side - 1, Math.max(0, Math.floor((x - minX) / cw))),
    Math.min(side - 1, Math.max(0, Math.floor((y - minY) / ch))),
  ];
  const start = new Int32Array(side * side + 1);
  for (let v = 0; v < nV; v++) {
    const [i, j] = cellOf(mesh.xy[2 * v], mesh.xy[2 * v + 1]);
    start[j * side + i + 1]++;
  }
  for (let c = 0; c < side * side; c++) start[c + 1] += start[c];
  const fill = start.slice(0, side * side);
  const items = new Int32Array(nV);
  for (let v = 0; v < nV; v++) {
    const [i, j] = cellOf(mesh.xy[2 * v], mesh.xy[2 * v + 1]);
    items[fill[j * side + i]++] = v;
  }
  const nearest = (x: number, y: number): number => {
    const [ci, cj] = cellOf(x, y);
    let best = -1;
    let bestD = Infinity;
    for (let ring = 0; ring <= side; ring++) {
      for (let j = cj - ring; j <= cj + ring; j++) {
        for (let i = ci - ring; i <= ci + ring; i++) {
          if (i < 0 || j < 0 || i >= side || j >= side) continue;
          if (Math.max(Math.abs(i - ci), Math.abs(j - cj)) !== ring) continue;
          for (let q = start[j * side + i]; q < start[j * side + i + 1]; q++) {
            const v = items[q];
            const d = Math.hypot(mesh.xy[2 * v] - x, mesh.xy[2 * v + 1] - y);
            if (d < bestD) {
              bestD = d;
              best = v;
            }
          }
        }
      }
      // a hit in ring k is final once ring k + 1 has also been searched
      if (best >= 0 && ring > 0) break;
    }
    return best;
  };
  return (x: number, y: number): number => {
    const hit = locator.locate(x, y);
    if (hit) {
      const k = npe * hit.elem;
      const l1 = 1 - hit.xi - hit.eta;
      return (
        l1 * vertexSize[mesh.elemNodes[k]] + hit.xi * vertexSize[mesh.elemNodes[k + 1]] + hit.eta * vertexSize[mesh.elemNodes[k + 2]]
      );
    }
    const v = nearest(x, y);
    return v >= 0 ? vertexSize[v] : vertexSize[0];
  };
}

/**
 * Element sizes → vertex sizes: the smallest size of the elements around each vertex, then
 * limited so it grows by at most `grading` per unit distance along mesh edges
 * (h_v ≤ h_w + g·|vw|, a few Gauss–Seidel sweeps), which keeps the next mesh's grading smooth.
 */
export function vertexSizesFromElements(mesh: Mesh, elemSize: Float64Array, grading = 0.5, sweeps = 6): Float64Array {
  const npe = mesh.nodesPerElem;
  const nV = mesh.nVertices;
  const h = new Float64Array(nV).fill(Infinity);
  const nElem = elemSize.length;
  for (let e = 0; e < nElem; e++) {
    for (let i = 0; i < 3; i++) {
      const v = mesh.elemNodes[npe * e + i];
      if (elemSize[e] < h[v]) h[v] = elemSize[e];
    }
  }
  const n2e = buildNodeElements(mesh, true);
  for (let s = 0; s < sweeps; s++) {
    let changed = false;
    const order = s % 2 === 0 ? 1 : -1;
    for (let k = 0; k < nV; k++) {
      const v = order > 0 ? k : nV - 1 - k;
      for (let q = n2e.start[v]; q < n2e.start[v + 1]; q++) {
        const e = n2e.elems[q];
        for (let i = 0; i < 3; i++) {
          const w = mesh.elemNodes[npe * e + i];
          if (w === v) continue;
          const lim = h[w] + grading * Math.hypot(mesh.xy[2 * v] - mesh.xy[2 * w], mesh.xy[2 * v + 1] - mesh.xy[2 * w + 1]);
          if (lim < h[v]) {
            h[v] = lim;
            changed = true;
          }
        }
      }
    }
    if (!changed) break;
  }
  return h;
}
