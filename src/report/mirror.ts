/**
 * The mirrored view of an axisymmetric section (issue 18, report): the meridian section and its
 * image about the axis r = 0, as one mesh for the contour picture — what a cut through the body
 * along its axis shows. Vertices first (the section's, then the image's), mid-side nodes after
 * them, as src/mesh/types.ts asks; the image's elements and boundary edges run the other way
 * round so the material stays on the left.
 */
import type { Mesh } from '../mesh/types.js';

export function mirroredSection(mesh: Mesh, values: Float64Array): { mesh: Mesh; values: Float64Array } {
  const N = mesh.xy.length / 2;
  const nV = mesh.nVertices;
  const id = (n: number, image: boolean): number =>
    n < nV ? (image ? nV + n : n) : (image ? 2 * nV + (N - nV) + (n - nV) : 2 * nV + (n - nV));
  const xy = new Float64Array(4 * N);
  const v = new Float64Array(2 * N);
  for (let n = 0; n < N; n++) {
    for (const image of [false, true]) {
      const k = id(n, image);
      xy[2 * k] = image ? -mesh.xy[2 * n] : mesh.xy[2 * n];
      xy[2 * k + 1] = mesh.xy[2 * n + 1];
      v[k] = values[n];
    }
  }
  const npe = mesh.nodesPerElem;
  const nElem = mesh.elemNodes.length / npe;
  // reversed orientation: corners 0, 2, 1; mid nodes of the edges 0–2, 2–1, 1–0 (local 5, 4, 3)
  const flip = npe === 3 ? [0, 2, 1] : [0, 2, 1, 5, 4, 3];
  const elemNodes = new Uint32Array(2 * nElem * npe);
  for (let e = 0; e < nElem; e++) {
    for (let i = 0; i < npe; i++) {
      elemNodes[npe * e + i] = id(mesh.elemNodes[npe * e + i], false);
      elemNodes[npe * (nElem + e) + i] = id(mesh.elemNodes[npe * e + flip[i]], true);
    }
  }
  const st = mesh.edgeStride;
  const nEdges = mesh.boundaryEdges.length / st;
  const boundaryEdges = new Uint32Array(2 * nEdges * st);
  const boundaryPiece = new Int32Array(2 * nEdges);
  const boundaryElem = new Int32Array(2 * nEdges);
  for (let k = 0; k < nEdges; k++) {
    const a = mesh.boundaryEdges[st * k], b = mesh.boundaryEdges[st * k + 1];
    boundaryEdges[st * k] = id(a, false);
    boundaryEdges[st * k + 1] = id(b, false);
    boundaryEdges[st * (nEdges + k)] = id(b, true);
    boundaryEdges[st * (nEdges + k) + 1] = id(a, true);
    if (st === 3) {
      boundaryEdges[st * k + 2] = id(mesh.boundaryEdges[st * k + 2], false);
      boundaryEdges[st * (nEdges + k) + 2] = id(mesh.boundaryEdges[st * k + 2], true);
    }
    boundaryPiece[k] = boundaryPiece[nEdges + k] = mesh.boundaryPiece[k];
    boundaryElem[k] = mesh.boundaryElem[k];
    boundaryElem[nEdges + k] = mesh.boundaryElem[k] + nElem;
  }
  return {
    mesh: { xy, elemNodes, nodesPerElem: npe, order: mesh.order, boundaryEdges, edgeStride: st, boundaryPiece, boundaryElem, nVertices: 2 * nV },
    values: v,
  };
}
