/**
 * Structured "mapped" meshes for FE-based recovery tests, independent of the mesher: a grid on
 * the unit square (u, v) pushed through a map to the physical domain, each cell split into two
 * triangles; LST mid-side nodes are mapped from the parameter mid-points, so they lie on the
 * true curve wherever the map is exact (circular holes and bores below).
 * Boundary sides in counter-clockwise parameter order: v = 0, u = 1, v = 1, u = 0; the map
 * must keep orientation so the material is on the left of every boundary edge.
 */
import type { PlateGeometry, BoundaryPiece } from '../../src/geometry/types.js';
import type { Mesh } from '../../src/mesh/types.js';

export type Side = 'v0' | 'u1' | 'v1' | 'u0';

export function mappedMesh(
  nu: number,
  nv: number,
  map: (u: number, v: number) => [number, number],
  order: 1 | 2,
  pieceOf: (side: Side, u: number, v: number) => number,
  gradeU: (t: number) => number = (t) => t,
): Mesh {
  const m = order === 2 ? 2 : 1; // lattice points per cell edge
  const NU = m * nu;
  const NV = m * nv;
  // odd lattice columns (LST mid-sides) sit halfway between their graded neighbours
  const uAt = (i: number) => (i % m === 0 ? gradeU(i / NU) : 0.5 * (gradeU((i - 1) / NU) + gradeU((i + 1) / NU)));
  // lattice node ids: vertices first (i, j both multiples of m), mids after
  const lattice = new Int32Array((NU + 1) * (NV + 1)).fill(-1);
  const L = (i: number, j: number) => j * (NU + 1) + i;
  const xy: number[] = [];
  let next = 0;
  for (let j = 0; j <= NV; j += m) {
    for (let i = 0; i <= NU; i += m) {
      lattice[L(i, j)] = next++;
      xy.push(...map(uAt(i), j / NV));
    }
  }
  const nVertices = next;
  const node = (i: number, j: number): number => {
    let id = lattice[L(i, j)];
    if (id < 0) {
      id = next++;
      lattice[L(i, j)] = id;
      xy.push(...map(uAt(i), j / NV));
    }
    return id;
  };
  const elemNodes: number[] = [];
  const tri = (a: [number, number], b: [number, number], c: [number, number]) => {
    elemNodes.push(node(...a), node(...b), node(...c));
    if (order === 2) {
      const mid = (p: [number, number], q: [number, number]) => node((p[0] + q[0]) / 2, (p[1] + q[1]) / 2);
      elemNodes.push(mid(a, b), mid(b, c), mid(c, a));
    }
  };
  for (let cj = 0; cj < nv; cj++) {
    for (let ci = 0; ci < nu; ci++) {
      const i0 = m * ci;
      const j0 = m * cj;
      const a: [number, number] = [i0, j0];
      const b: [number, number] = [i0 + m, j0];
      const c: [number, number] = [i0 + m, j0 + m];
      const d: [number, number] = [i0, j0 + m];
      if ((ci + cj) % 2 === 0) {
        tri(a, b, c);
        tri(a, c, d);
      } else {
        tri(a, b, d);
        tri(b, c, d);
      }
    }
  }
  const boundaryEdges: number[] = [];
  const boundaryPiece: number[] = [];
  const edge = (p: [number, number], q: [number, number], side: Side) => {
    boundaryEdges.push(node(...p), node(...q));
    if (order === 2) boundaryEdges.push(node((p[0] + q[0]) / 2, (p[1] + q[1]) / 2));
    boundaryPiece.push(pieceOf(side, uAt((p[0] + q[0]) / 2), (p[1] + q[1]) / 2 / NV));
  };
  for (let ci = 0; ci < nu; ci++) edge([m * ci, 0], [m * ci + m, 0], 'v0');
  for (let cj = 0; cj < nv; cj++) edge([NU, m * cj], [NU, m * cj + m], 'u1');
  for (let ci = nu; ci > 0; ci--) edge([m * ci, NV], [m * ci - m, NV], 'v1');
  for (let cj = nv; cj > 0; cj--) edge([0, m * cj], [0, m * cj - m], 'u0');
  // adjacent element of each boundary edge, by its end vertices
  const npe = order === 2 ? 6 : 3;
  const owner = new Map<string, number>();
  for (let e = 0; e < elemNodes.length / npe; e++) {
    for (let k = 0; k < 3; k++) owner.set(`${elemNodes[npe * e + k]},${elemNodes[npe * e + ((k + 1) % 3)]}`, e);
  }
  const stride = order + 1;
  const boundaryElem = boundaryPiece.map((_, k) => owner.get(`${boundaryEdges[stride * k]},${boundaryEdges[stride * k + 1]}`) ?? -1);
  return {
    xy: Float64Array.from(xy),
    elemNodes: Uint32Array.from(elemNodes),
    nodesPerElem: npe,
    order,
    boundaryEdges: Uint32Array.from(boundaryEdges),
    edgeStride: stride as 2 | 3,
    boundaryPiece: Int32Array.from(boundaryPiece),
    boundaryElem: Int32Array.from(boundaryElem),
    nVertices,
  };
}

/**
 * Quarter of a square plate [0, L]² with a circular hole of radius a at the origin.
 * u runs from the hole (0) to the square (1), v from θ = 0 (the x axis) to 90°.
 * Pieces: 0 hole arc, 1 edge x = L, 2 edge y = L, 3 symmetry edge x = 0, 4 symmetry edge y = 0.
 */
export function quarterHoleMesh(a: number, L: number, nRadial: number, nArc: number, order: 1 | 2, grade = 1.6): { mesh: Mesh; geometry: PlateGeometry } {
  const map = (u: number, v: number): [number, number] => {
    const th = (v * Math.PI) / 2;
    const ix = a * Math.cos(th);
    const iy = a * Math.sin(th);
    const [ox, oy] = th <= Math.PI / 4 ? [L, L * Math.tan(th)] : [L / Math.tan(th), L];
    return [ix + u * (ox - ix), iy + u * (oy - iy)];
  };
  const mesh = mappedMesh(
    nRadial,
    nArc,
    map,
    order,
    (side, _u, v) => (side === 'u0' ? 0 : side === 'v0' ? 4 : side === 'v1' ? 3 : v < 0.5 ? 1 : 2),
    (t) => t ** grade,
  );
  const piece = (id: number, curve: BoundaryPiece['curve'], role: BoundaryPiece['role'], radius: number): BoundaryPiece => ({
    id,
    curve,
    loop: 'outline',
    role,
    radius,
    keyPath: `piece[${id}]`,
  });
  const geometry: PlateGeometry = {
    pieces: [
      piece(0, { kind: 'arc', center: [0, 0], radius: a, startAngle: Math.PI / 2, sweep: -Math.PI / 2 }, 'circle', a),
      piece(1, { kind: 'line', from: [L, 0], to: [L, L] }, 'edge', 0),
      piece(2, { kind: 'line', from: [L, L], to: [0, L] }, 'edge', 0),
      piece(3, { kind: 'line', from: [0, L], to: [0, a] }, 'edge', 0),
      piece(4, { kind: 'line', from: [a, 0], to: [L, 0] }, 'edge', 0),
    ],
    loops: [{ id: 'outline', hole: false, pieces: [4, 1, 2, 3, 0], keyPath: 'plate.outline' }],
    corners: [],
    area: L * L - (Math.PI * a * a) / 4,
    bbox: { minX: 0, minY: 0, maxX: L, maxY: L },
    scale: Math.SQRT2 * L,
  };
  return { mesh, geometry };
}

/** Quarter annulus a ≤ r ≤ b, 0 ≤ θ ≤ 90°. Pieces: 0 bore, 1 outer arc, 2 edge y = 0, 3 edge x = 0. */
export function quarterRingMesh(a: number, b: number, nRadial: number, nArc: number, order: 1 | 2): { mesh: Mesh; geometry: PlateGeometry } {
  const map = (u: number, v: number): [number, number] => {
    const r = a + u * (b - a);
    const th = (v * Math.PI) / 2;
    return [r * Math.cos(th), r * Math.sin(th)];
  };
  const mesh = mappedMesh(nRadial, nArc, map, order, (side) => (side === 'u0' ? 0 : side === 'u1' ? 1 : side === 'v0' ? 2 : 3));
  const mk = (id: number, curve: BoundaryPiece['curve'], role: BoundaryPiece['role'], radius: number): BoundaryPiece => ({
    id,
    curve,
    loop: 'outline',
    role,
    radius,
    keyPath: `piece[${id}]`,
  });
  const geometry: PlateGeometry = {
    pieces: [
      mk(0, { kind: 'arc', center: [0, 0], radius: a, startAngle: Math.PI / 2, sweep: -Math.PI / 2 }, 'circle', a),
      mk(1, { kind: 'arc', center: [0, 0], radius: b, startAngle: 0, sweep: Math.PI / 2 }, 'circle', b),
      mk(2, { kind: 'line', from: [a, 0], to: [b, 0] }, 'edge', 0),
      mk(3, { kind: 'line', from: [0, b], to: [0, a] }, 'edge', 0),
    ],
    loops: [{ id: 'outline', hole: false, pieces: [2, 1, 3, 0], keyPath: 'plate.outline' }],
    corners: [],
    area: (Math.PI * (b * b - a * a)) / 4,
    bbox: { minX: 0, minY: 0, maxX: b, maxY: b },
    scale: Math.SQRT2 * b,
  };
  return { mesh, geometry };
}
