/**
 * Hand-built meshes for the recovery tests: a structured rectangle split into triangles (with
 * optional jitter of the interior nodes), CST or LST, in the layout of src/mesh/types.ts.
 * Independent of the mesher so the recovery can be checked on its own.
 */
import type { ElasticSection, GaussStresses } from '../../src/fem/types.js';
import type { Mesh } from '../../src/mesh/types.js';
import { seededRandom as rng } from '../helpers/random.js';

export { rng };

export function rectMesh(nx: number, ny: number, W: number, H: number, order: 1 | 2, jitter = 0, seed = 1): Mesh {
  const rand = rng(seed);
  const nV = (nx + 1) * (ny + 1);
  const vx: number[] = [];
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      let x = (i / nx) * W;
      let y = (j / ny) * H;
      if (i > 0 && i < nx && j > 0 && j < ny) {
        x += (rand() - 0.5) * jitter * (W / nx);
        y += (rand() - 0.5) * jitter * (H / ny);
      }
      vx.push(x, y);
    }
  }
  const id = (i: number, j: number) => j * (nx + 1) + i;
  const tris: number[][] = [];
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const a = id(i, j);
      const b = id(i + 1, j);
      const c = id(i + 1, j + 1);
      const d = id(i, j + 1);
      // alternate diagonals so vertex patches differ in shape
      if ((i + j) % 2 === 0) {
        tris.push([a, b, c], [a, c, d]);
      } else {
        tris.push([a, b, d], [b, c, d]);
      }
    }
  }
  const xy = [...vx];
  const mid = new Map<string, number>();
  const midOf = (a: number, b: number): number => {
    const key = a < b ? `${a},${b}` : `${b},${a}`;
    let m = mid.get(key);
    if (m === undefined) {
      m = xy.length / 2;
      xy.push(0.5 * (xy[2 * a] + xy[2 * b]), 0.5 * (xy[2 * a + 1] + xy[2 * b + 1]));
      mid.set(key, m);
    }
    return m;
  };
  const npe = order === 1 ? 3 : 6;
  const elemNodes: number[] = [];
  for (const [a, b, c] of tris) {
    elemNodes.push(a, b, c);
    if (order === 2) elemNodes.push(midOf(a, b), midOf(b, c), midOf(c, a));
  }
  // boundary counter-clockwise: bottom (piece 0), right (1), top (2), left (3)
  const loop: [number, number, number][] = [];
  for (let i = 0; i < nx; i++) loop.push([id(i, 0), id(i + 1, 0), 0]);
  for (let j = 0; j < ny; j++) loop.push([id(nx, j), id(nx, j + 1), 1]);
  for (let i = nx; i > 0; i--) loop.push([id(i, ny), id(i - 1, ny), 2]);
  for (let j = ny; j > 0; j--) loop.push([id(0, j), id(0, j - 1), 3]);
  const elemOfEdge = new Map<string, number>();
  tris.forEach(([a, b, c], e) => {
    elemOfEdge.set(`${a},${b}`, e);
    elemOfEdge.set(`${b},${c}`, e);
    elemOfEdge.set(`${c},${a}`, e);
  });
  const boundaryEdges: number[] = [];
  const boundaryPiece: number[] = [];
  const boundaryElem: number[] = [];
  for (const [a, b, piece] of loop) {
    boundaryEdges.push(a, b);
    if (order === 2) boundaryEdges.push(midOf(a, b));
    boundaryPiece.push(piece);
    boundaryElem.push(elemOfEdge.get(`${a},${b}`) ?? -1);
  }
  return {
    xy: Float64Array.from(xy),
    elemNodes: Uint32Array.from(elemNodes),
    nodesPerElem: npe,
    order,
    boundaryEdges: Uint32Array.from(boundaryEdges),
    edgeStride: order === 2 ? 3 : 2,
    boundaryPiece: Int32Array.from(boundaryPiece),
    boundaryElem: Int32Array.from(boundaryElem),
    nVertices: nV,
  };
}

export type StressFn = (x: number, y: number) => [number, number, number];

/**
 * Gauss stresses sampled from a given stress function: CST at the centroid (1 point), LST at
 * the three interior points (1/6, 1/6, 2/3) of the straight-sided triangle; σzz from `section`
 * (plane stress when absent).
 */
export function sampledGauss(mesh: Mesh, fn: StressFn, section?: Pick<ElasticSection, 'nu' | 'state'>): GaussStresses {
  const npe = mesh.nodesPerElem;
  const nElem = mesh.elemNodes.length / npe;
  const pts: [number, number, number][] =
    mesh.order === 1
      ? [[1 / 3, 1 / 3, 1 / 3]]
      : [
          [2 / 3, 1 / 6, 1 / 6],
          [1 / 6, 2 / 3, 1 / 6],
          [1 / 6, 1 / 6, 2 / 3],
        ];
  const ng = pts.length;
  const xy = new Float64Array(2 * ng * nElem);
  const stress = new Float64Array(3 * ng * nElem);
  const weight = new Float64Array(ng * nElem);
  for (let e = 0; e < nElem; e++) {
    const n = [0, 1, 2].map((i) => mesh.elemNodes[npe * e + i]);
    const X = n.map((k) => mesh.xy[2 * k]);
    const Y = n.map((k) => mesh.xy[2 * k + 1]);
    const area = 0.5 * ((X[1] - X[0]) * (Y[2] - Y[0]) - (X[2] - X[0]) * (Y[1] - Y[0]));
    pts.forEach(([l0, l1, l2], g) => {
      const k = ng * e + g;
      const x = l0 * X[0] + l1 * X[1] + l2 * X[2];
      const y = l0 * Y[0] + l1 * Y[1] + l2 * Y[2];
      xy[2 * k] = x;
      xy[2 * k + 1] = y;
      stress.set(fn(x, y), 3 * k);
      weight[k] = area / ng;
    });
  }
  // σzz of a mechanical field: ν(σxx + σyy) in plane strain, 0 otherwise (fem/stresses.ts)
  const szz = new Float64Array(ng * nElem);
  if (section?.state === 'plane-strain') for (let k = 0; k < szz.length; k++) szz[k] = section.nu * (stress[3 * k] + stress[3 * k + 1]);
  return { nGauss: ng, xy, stress, weight, szz };
}
