/**
 * Uniform triangulation of the L-shaped domain [−1, 1]² minus the quadrant x > 0, y < 0,
 * n cells per unit length, each square cell split in two (alternating diagonals), CST or LST.
 * Pieces: 0 face y = 0 (x > 0), 1 edge x = 1, 2 edge y = 1, 3 edge x = −1, 4 edge y = −1, 5 face x = 0 (y < 0).
 */
import type { BoundaryPiece, PlateGeometry } from '../geometry/types.js';
import type { Mesh } from '../mesh/types.js';

export function lShapeMesh(n: number, order: 1 | 2): { mesh: Mesh; geometry: PlateGeometry } {
  const m = order;
  const N = 2 * n * m; // lattice intervals across [−1, 1]
  const coord = (i: number) => -1 + (2 * i) / N;
  const keep = (ci: number, cj: number) => !(ci >= n && cj < n); // cell (ci, cj) in a 2n × 2n grid
  const id = new Int32Array((N + 1) * (N + 1)).fill(-1);
  const xy: number[] = [];
  let next = 0;
  const used = new Uint8Array((N + 1) * (N + 1));
  for (let cj = 0; cj < 2 * n; cj++) for (let ci = 0; ci < 2 * n; ci++) {
    if (!keep(ci, cj)) continue;
    for (let dj = 0; dj <= m; dj++) for (let di = 0; di <= m; di++) used[(cj * m + dj) * (N + 1) + ci * m + di] = 1;
  }
  // vertices first, then mid-side nodes
  for (const wantVertex of [true, false]) {
    for (let j = 0; j <= N; j++) for (let i = 0; i <= N; i++) {
      const isVertex = i % m === 0 && j % m === 0;
      if (isVertex !== wantVertex || !used[j * (N + 1) + i]) continue;
      id[j * (N + 1) + i] = next++;
      xy.push(coord(i), coord(j));
    }
  }
  let nVertices = 0;
  for (let j = 0; j <= N; j += m) for (let i = 0; i <= N; i += m) if (used[j * (N + 1) + i]) nVertices++;
  const node = (i: number, j: number) => id[j * (N + 1) + i];
  const elemNodes: number[] = [];
  const tri = (a: [number, number], b: [number, number], c: [number, number]) => {
    elemNodes.push(node(...a), node(...b), node(...c));
    if (order === 2) {
      const mid = (p: [number, number], q: [number, number]) => node((p[0] + q[0]) / 2, (p[1] + q[1]) / 2);
      elemNodes.push(mid(a, b), mid(b, c), mid(c, a));
    }
  };
  for (let cj = 0; cj < 2 * n; cj++) for (let ci = 0; ci < 2 * n; ci++) {
    if (!keep(ci, cj)) continue;
    const i0 = m * ci;
    const j0 = m * cj;
    const a: [number, number] = [i0, j0];
    const b: [number, number] = [i0 + m, j0];
    const c: [number, number] = [i0 + m, j0 + m];
    const d: [number, number] = [i0, j0 + m];
    // diagonals pointing away from the re-entrant corner in every quadrant look alike
    if ((ci + cj) % 2 === 0) {
      tri(a, b, c);
      tri(a, c, d);
    } else {
      tri(a, b, d);
      tri(b, c, d);
    }
  }
  // boundary: directed element edges without a twin
  const npe = order === 2 ? 6 : 3;
  const half = new Map<string, [number, number, number, number]>();
  const nElem = elemNodes.length / npe;
  for (let e = 0; e < nElem; e++) {
    for (let k = 0; k < 3; k++) {
      const p = elemNodes[npe * e + k];
      const q = elemNodes[npe * e + ((k + 1) % 3)];
      half.set(`${p},${q}`, [p, q, order === 2 ? elemNodes[npe * e + 3 + k] : -1, e]);
    }
  }
  const boundaryEdges: number[] = [];
  const boundaryPiece: number[] = [];
  const boundaryElem: number[] = [];
  for (const [key, [p, q, mid, e]] of half) {
    if (half.has(`${q},${p}`)) continue;
    void key;
    boundaryEdges.push(p, q);
    if (order === 2) boundaryEdges.push(mid);
    const mx = 0.5 * (xy[2 * p] + xy[2 * q]);
    const my = 0.5 * (xy[2 * p + 1] + xy[2 * q + 1]);
    const eps = 1e-12;
    const piece =
      Math.abs(my) < eps && mx > 0 ? 0 : Math.abs(mx - 1) < eps ? 1 : Math.abs(my - 1) < eps ? 2 : Math.abs(mx + 1) < eps ? 3 : Math.abs(my + 1) < eps ? 4 : 5;
    boundaryPiece.push(piece);
    boundaryElem.push(e);
  }
  const line = (pid: number, from: [number, number], to: [number, number]): BoundaryPiece => ({
    id: pid,
    curve: { kind: 'line', from, to },
    loop: 'outline',
    role: 'edge',
    radius: 0,
    keyPath: `plate.outline[${pid}]`,
  });
  const geometry: PlateGeometry = {
    pieces: [line(0, [0, 0], [1, 0]), line(1, [1, 0], [1, 1]), line(2, [1, 1], [-1, 1]), line(3, [-1, 1], [-1, -1]), line(4, [-1, -1], [0, -1]), line(5, [0, -1], [0, 0])],
    loops: [{ id: 'outline', hole: false, pieces: [0, 1, 2, 3, 4, 5], keyPath: 'plate.outline' }],
    corners: [{ at: [0, 0], interiorAngleDeg: 270, loop: 'outline', pieceIn: 5, pieceOut: 0, keyPath: 'plate.outline[0]' }],
    area: 3,
    bbox: { minX: -1, minY: -1, maxX: 1, maxY: 1 },
    scale: 2 * Math.SQRT2,
  };
  return {
    mesh: {
      xy: Float64Array.from(xy),
      elemNodes: Uint32Array.from(elemNodes),
      nodesPerElem: npe,
      order,
      boundaryEdges: Uint32Array.from(boundaryEdges),
      edgeStride: order === 2 ? 3 : 2,
      boundaryPiece: Int32Array.from(boundaryPiece),
      boundaryElem: Int32Array.from(boundaryElem),
      nVertices,
    },
    geometry,
  };
}
