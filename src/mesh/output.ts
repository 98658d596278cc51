/** Turn the working triangulation into the flat `Mesh` of types.ts (order 1 or 2). */
import type { PlateGeometry } from '../geometry/types.js';
import type { Mesh } from './types.js';
import { curveXY, isCurved } from './curves.js';
import type { TriMesh } from './trimesh.js';
import { nextHalf } from './trimesh.js';

export function buildMeshOutput(m: TriMesh, geom: PlateGeometry, order: 1 | 2): Mesh {
  const nV = m.nV;
  const nT = m.nT;
  const tri = m.tri;
  const twin = m.twin;
  // boundary half-edges in order of piece, then curve parameter
  const bnd: number[] = [];
  for (let e = 0; e < 3 * nT; e++) if (twin[e] < 0) bnd.push(e);
  bnd.sort((p, q) => m.sPiece[p] - m.sPiece[q] || m.sT0[p] - m.sT0[q]);
  const nb = bnd.length;
  const boundaryPiece = new Int32Array(nb);
  const boundaryElem = new Int32Array(nb);
  for (let i = 0; i < nb; i++) {
    boundaryPiece[i] = m.sPiece[bnd[i]];
    boundaryElem[i] = (bnd[i] / 3) | 0;
  }
  if (order === 1) {
    const elemNodes = new Uint32Array(3 * nT);
    for (let i = 0; i < 3 * nT; i++) elemNodes[i] = tri[i];
    const boundaryEdges = new Uint32Array(2 * nb);
    for (let i = 0; i < nb; i++) {
      boundaryEdges[2 * i] = tri[bnd[i]];
      boundaryEdges[2 * i + 1] = tri[nextHalf(bnd[i])];
    }
    return {
      xy: m.xy.slice(0, 2 * nV), elemNodes, nodesPerElem: 3, order: 1,
      boundaryEdges, edgeStride: 2, boundaryPiece, boundaryElem, nVertices: nV,
    };
  }
  // order 2: one mid-side node per edge; on the true curve for boundary edges of arcs/ellipses
  const mid = new Int32Array(3 * nT);
  let nEdges = 0;
  for (let e = 0; e < 3 * nT; e++) if (twin[e] < 0 || twin[e] > e) nEdges++;
  const xy = new Float64Array(2 * (nV + nEdges));
  xy.set(m.xy.subarray(0, 2 * nV));
  let next = nV;
  const p = [0, 0];
  for (let e = 0; e < 3 * nT; e++) {
    const o = twin[e];
    if (o >= 0 && o < e) {
      mid[e] = mid[o];
      continue;
    }
    const a = tri[e];
    const b = tri[nextHalf(e)];
    const k = next++;
    mid[e] = k;
    if (o < 0 && isCurved(geom.pieces[m.sPiece[e]].curve)) {
      curveXY(geom.pieces[m.sPiece[e]].curve, 0.5 * (m.sT0[e] + m.sT1[e]), p);
      xy[2 * k] = p[0];
      xy[2 * k + 1] = p[1];
    } else {
      xy[2 * k] = 0.5 * (m.xy[2 * a] + m.xy[2 * b]);
      xy[2 * k + 1] = 0.5 * (m.xy[2 * a + 1] + m.xy[2 * b + 1]);
    }
  }
  const elemNodes = new Uint32Array(6 * nT);
  for (let t = 0; t < nT; t++) {
    elemNodes[6 * t] = tri[3 * t];
    elemNodes[6 * t + 1] = tri[3 * t + 1];
    elemNodes[6 * t + 2] = tri[3 * t + 2];
    elemNodes[6 * t + 3] = mid[3 * t];
    elemNodes[6 * t + 4] = mid[3 * t + 1];
    elemNodes[6 * t + 5] = mid[3 * t + 2];
  }
  const boundaryEdges = new Uint32Array(3 * nb);
  for (let i = 0; i < nb; i++) {
    const e = bnd[i];
    boundaryEdges[3 * i] = tri[e];
    boundaryEdges[3 * i + 1] = tri[nextHalf(e)];
    boundaryEdges[3 * i + 2] = mid[e];
  }
  return {
    xy, elemNodes, nodesPerElem: 6, order: 2,
    boundaryEdges, edgeStride: 3, boundaryPiece, boundaryElem, nVertices: nV,
  };
}
