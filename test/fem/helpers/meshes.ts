/**
 * Structured test meshes in the Mesh shape of src/mesh/types.ts, with matching hand-made
 * PlateGeometry objects so the selectors work. Test code only: small, clear, not fast.
 */
import type { Curve, PlateGeometry, BoundaryPiece } from '../../../src/geometry/types.js';
import type { Mesh } from '../../../src/mesh/types.js';
import type { Point } from '../../../src/model/types.js';

export type Diagonal = 'a' | 'b';

export interface TriangleMeshInput {
  /** vertex coordinates, flat */
  xy: number[];
  /** counter-clockwise triangles (vertex ids) */
  tris: number[];
  order: 1 | 2;
  /** where the mid-side node of edge a–b goes (default: the straight midpoint) */
  mid?: (a: number, b: number) => Point;
  /** boundary piece of the boundary edge a → b (material on the left) */
  pieceOf: (a: number, b: number) => number;
}

/** Builds the Mesh arrays from vertices and triangles; mid-side nodes get ids ≥ nVertices. */
export function meshFromTriangles(input: TriangleMeshInput): Mesh {
  const nV = input.xy.length / 2;
  const nT = input.tris.length / 3;
  const xy: number[] = input.xy.slice();
  const edgeMid = new Map<number, number>();
  const edgeCount = new Map<number, number>();
  const key = (a: number, b: number): number => (a < b ? a * nV + b : b * nV + a);
  for (let t = 0; t < nT; t++) {
    for (let k = 0; k < 3; k++) {
      const a = input.tris[3 * t + k];
      const b = input.tris[3 * t + ((k + 1) % 3)];
      edgeCount.set(key(a, b), (edgeCount.get(key(a, b)) ?? 0) + 1);
    }
  }
  const npe = input.order === 1 ? 3 : 6;
  const elemNodes = new Uint32Array(npe * nT);
  const bEdges: number[] = [];
  const bPiece: number[] = [];
  const bElem: number[] = [];
  for (let t = 0; t < nT; t++) {
    const c = [input.tris[3 * t], input.tris[3 * t + 1], input.tris[3 * t + 2]];
    for (let k = 0; k < 3; k++) elemNodes[npe * t + k] = c[k];
    for (let k = 0; k < 3; k++) {
      const a = c[k];
      const b = c[(k + 1) % 3];
      let m = -1;
      if (input.order === 2) {
        const kk = key(a, b);
        m = edgeMid.get(kk) ?? -1;
        if (m < 0) {
          const p = input.mid
            ? input.mid(a, b)
            : [(input.xy[2 * a] + input.xy[2 * b]) / 2, (input.xy[2 * a + 1] + input.xy[2 * b + 1]) / 2];
          m = xy.length / 2;
          xy.push(p[0], p[1]);
          edgeMid.set(kk, m);
        }
        elemNodes[npe * t + 3 + k] = m;
      }
      if (edgeCount.get(key(a, b)) === 1) {
        bEdges.push(a, b);
        if (m >= 0) bEdges.push(m);
        bPiece.push(input.pieceOf(a, b));
        bElem.push(t);
      }
    }
  }
  return {
    xy: Float64Array.from(xy),
    elemNodes,
    nodesPerElem: npe,
    order: input.order,
    boundaryEdges: Uint32Array.from(bEdges),
    edgeStride: input.order === 1 ? 2 : 3,
    boundaryPiece: Int32Array.from(bPiece),
    boundaryElem: Int32Array.from(bElem),
    nVertices: nV,
  };
}

export interface MappedMeshOptions {
  nx: number;
  ny: number;
  order: 1 | 2;
  /** (s, t) ∈ [0, 1]² → plane, with a positive Jacobian */
  map: (s: number, t: number) => Point;
  diagonal?: Diagonal | 'alternate';
  /**
   * piece of a boundary edge on side 0 (t = 0), 1 (s = 1), 2 (t = 1) or 3 (s = 0),
   * given the parameter midpoint of the edge
   */
  pieceOf: (side: number, sMid: number, tMid: number) => number;
}

/**
 * A mapped structured mesh: the unit square cut into nx × ny cells, each split into two
 * right triangles, pushed through `map`. Mid-side nodes sit at the images of the parameter
 * midpoints, so on a polar map they lie on the true circle.
 */
export function mappedMesh(opt: MappedMeshOptions): Mesh {
  const { nx, ny } = opt;
  const st: number[] = [];
  const xy: number[] = [];
  const id = (i: number, j: number): number => j * (nx + 1) + i;
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const s = i / nx;
      const t = j / ny;
      st.push(s, t);
      const p = opt.map(s, t);
      xy.push(p[0], p[1]);
    }
  }
  const tris: number[] = [];
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const p00 = id(i, j), p10 = id(i + 1, j), p11 = id(i + 1, j + 1), p01 = id(i, j + 1);
      const d = opt.diagonal ?? 'a';
      const useA = d === 'a' || (d === 'alternate' && (i + j) % 2 === 0);
      if (useA) tris.push(p00, p10, p11, p00, p11, p01);
      else tris.push(p00, p10, p01, p10, p11, p01);
    }
  }
  const eps = 1e-12;
  return meshFromTriangles({
    xy,
    tris,
    order: opt.order,
    mid: (a, b) => opt.map((st[2 * a] + st[2 * b]) / 2, (st[2 * a + 1] + st[2 * b + 1]) / 2),
    pieceOf: (a, b) => {
      const sa = st[2 * a], ta = st[2 * a + 1], sb = st[2 * b], tb = st[2 * b + 1];
      const sm = (sa + sb) / 2, tm = (ta + tb) / 2;
      let side = -1;
      if (ta < eps && tb < eps) side = 0;
      else if (sa > 1 - eps && sb > 1 - eps) side = 1;
      else if (ta > 1 - eps && tb > 1 - eps) side = 2;
      else if (sa < eps && sb < eps) side = 3;
      if (side < 0) throw new Error('boundary edge off the parameter square');
      return opt.pieceOf(side, sm, tm);
    },
  });
}

function geometryFrom(curves: Curve[], roles: BoundaryPiece['role'][], area: number, bbox: PlateGeometry['bbox']): PlateGeometry {
  const pieces: BoundaryPiece[] = curves.map((curve, id) => ({
    id,
    curve,
    loop: 'outline',
    role: roles[id],
    radius: curve.kind === 'arc' ? curve.radius : 0,
    keyPath: `plate.outline[${id}]`,
  }));
  return {
    pieces,
    loops: [{ id: 'outline', hole: false, pieces: pieces.map((p) => p.id), keyPath: 'plate.outline' }],
    corners: [],
    area,
    bbox,
    scale: Math.hypot(bbox.maxX - bbox.minX, bbox.maxY - bbox.minY),
  };
}

/** rectangle [x0, x1] × [y0, y1]: pieces 0 bottom, 1 right, 2 top, 3 left */
export function rectangleGeometry(x0: number, y0: number, x1: number, y1: number): PlateGeometry {
  const line = (from: Point, to: Point): Curve => ({ kind: 'line', from, to });
  return geometryFrom(
    [line([x0, y0], [x1, y0]), line([x1, y0], [x1, y1]), line([x1, y1], [x0, y1]), line([x0, y1], [x0, y0])],
    ['edge', 'edge', 'edge', 'edge'],
    (x1 - x0) * (y1 - y0),
    { minX: x0, minY: y0, maxX: x1, maxY: y1 },
  );
}

/** structured rectangle mesh of nx × ny cells, each split into two triangles */
export function rectangleMesh(
  x0: number, y0: number, x1: number, y1: number, nx: number, ny: number, order: 1 | 2, diagonal: Diagonal | 'alternate' = 'a',
): Mesh {
  return mappedMesh({
    nx, ny, order, diagonal,
    map: (s, t) => [x0 + s * (x1 - x0), y0 + t * (y1 - y0)],
    pieceOf: (side) => side,
  });
}

/**
 * Quarter annulus a ≤ r ≤ b, 0 ≤ θ ≤ π/2: pieces 0 (y = 0), 1 (outer arc r = b),
 * 2 (x = 0), 3 (inner arc r = a, travelled clockwise so the material is on the left).
 */
export function quarterAnnulusGeometry(a: number, b: number): PlateGeometry {
  return geometryFrom(
    [
      { kind: 'line', from: [a, 0], to: [b, 0] },
      { kind: 'arc', center: [0, 0], radius: b, startAngle: 0, sweep: Math.PI / 2 },
      { kind: 'line', from: [0, b], to: [0, a] },
      { kind: 'arc', center: [0, 0], radius: a, startAngle: Math.PI / 2, sweep: -Math.PI / 2 },
    ],
    ['edge', 'circle', 'edge', 'circle'],
    (Math.PI / 4) * (b * b - a * a),
    { minX: 0, minY: 0, maxX: b, maxY: b },
  );
}

/** mapped quarter-annulus mesh: nr cells through the wall, nt around; mid-side nodes on the true circles */
export function quarterAnnulusMesh(a: number, b: number, nr: number, nt: number, order: 1 | 2, diagonal: Diagonal | 'alternate' = 'a'): Mesh {
  return mappedMesh({
    nx: nr, ny: nt, order, diagonal,
    map: (s, t) => {
      const r = a + s * (b - a);
      const th = (t * Math.PI) / 2;
      return [r * Math.cos(th), r * Math.sin(th)];
    },
    pieceOf: (side) => [0, 1, 2, 3][side],
  });
}

/**
 * Quarter of a square plate [0, R]² with a circular hole of radius a at the origin:
 * pieces 0 (y = 0), 1 (x = R), 2 (y = R), 3 (x = 0), 4 (hole arc, clockwise).
 */
export function quarterHoleGeometry(a: number, R: number): PlateGeometry {
  return geometryFrom(
    [
      { kind: 'line', from: [a, 0], to: [R, 0] },
      { kind: 'line', from: [R, 0], to: [R, R] },
      { kind: 'line', from: [R, R], to: [0, R] },
      { kind: 'line', from: [0, R], to: [0, a] },
      { kind: 'arc', center: [0, 0], radius: a, startAngle: Math.PI / 2, sweep: -Math.PI / 2 },
    ],
    ['edge', 'edge', 'edge', 'edge', 'circle'],
    R * R - (Math.PI / 4) * a * a,
    { minX: 0, minY: 0, maxX: R, maxY: R },
  );
}

/**
 * Mapped mesh of quarterHoleGeometry: s runs from the hole to the square's edge along the ray
 * at angle θ = t·π/2, graded toward the hole by the smooth map w = (e^{βs} − 1)/(e^β − 1)
 * (a power s^γ would make dw/ds vanish at the hole and shift the LST mid-side nodes off the
 * middle there, like a quarter-point element); nt must be even so the corner (R, R) is a node.
 */
export function quarterHoleMesh(a: number, R: number, ns: number, nt: number, order: 1 | 2, grading = 1.5): Mesh {
  if (nt % 2 !== 0) throw new Error('nt must be even');
  return mappedMesh({
    nx: ns, ny: nt, order, diagonal: 'alternate',
    map: (s, t) => {
      const th = (t * Math.PI) / 2;
      const c = Math.cos(th), sn = Math.sin(th);
      const outer: Point = th <= Math.PI / 4 ? [R, R * Math.tan(th)] : [R / Math.tan(th), R];
      const w = grading > 0 ? Math.expm1(grading * s) / Math.expm1(grading) : s;
      return [a * c + w * (outer[0] - a * c), a * sn + w * (outer[1] - a * sn)];
    },
    pieceOf: (side, _s, tm) => (side === 0 ? 0 : side === 1 ? (tm < 0.5 ? 1 : 2) : side === 2 ? 3 : 4),
  });
}

/**
 * MacNeal & Harder (1985) membrane patch: rectangle 0.24 × 0.12 with interior nodes
 * (0.04, 0.02), (0.18, 0.03), (0.16, 0.08), (0.08, 0.08); five quadrilaterals, each split
 * into two triangles along diagonal 'a' (first to third node) or 'b' (second to fourth).
 * Vertices 0–3 are the rectangle corners, 4–7 the interior nodes.
 */
export function macNealHarderPatch(order: 1 | 2, diagonal: Diagonal): Mesh {
  const xy = [0, 0, 0.24, 0, 0.24, 0.12, 0, 0.12, 0.04, 0.02, 0.18, 0.03, 0.16, 0.08, 0.08, 0.08];
  const quads = [
    [4, 5, 6, 7],
    [0, 1, 5, 4],
    [1, 2, 6, 5],
    [2, 3, 7, 6],
    [3, 0, 4, 7],
  ];
  const tris: number[] = [];
  for (const [p, q, r, s] of quads) {
    if (diagonal === 'a') tris.push(p, q, r, p, r, s);
    else tris.push(p, q, s, q, r, s);
  }
  const sideOf = (a: number, b: number): number => {
    const key = `${Math.min(a, b)}-${Math.max(a, b)}`;
    return ({ '0-1': 0, '1-2': 1, '2-3': 2, '0-3': 3 } as Record<string, number>)[key] ?? -1;
  };
  return meshFromTriangles({ xy, tris, order, pieceOf: sideOf });
}
