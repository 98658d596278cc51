/**
 * A triangle mesh as flat typed arrays (DEVELOPERS.md: stages work on flat typed arrays).
 *
 * Local numbering of a 6-node triangle (LST); a 3-node triangle (CST) has only 0, 1, 2:
 *
 *        2
 *        | \
 *        5   4
 *        |     \
 *        0 --3-- 1
 *
 * Corner nodes are counter-clockwise. Node 3 is on edge 0–1, node 4 on 1–2, node 5 on 2–0.
 */
export interface Mesh {
  /** node n at [2n, 2n + 1] */
  xy: Float64Array;
  /** element e's nodes at [nodesPerElem·e … nodesPerElem·e + nodesPerElem − 1] */
  elemNodes: Uint32Array;
  nodesPerElem: 3 | 6;
  order: 1 | 2;
  /**
   * boundary edges, `edgeStride` = order + 1 entries each: [a, b] or [a, b, mid];
   * material on the left of a → b (same convention as the geometry's curves)
   */
  boundaryEdges: Uint32Array;
  edgeStride: 2 | 3;
  /** piece id (PlateGeometry.pieces index) of each boundary edge */
  boundaryPiece: Int32Array;
  /** element adjacent to each boundary edge */
  boundaryElem: Int32Array;
  /** number of corner (vertex) nodes; mid-side nodes come after them (ids ≥ nVertices) */
  nVertices: number;
}

export const NO_ELEM = -1;

/** element-size field: target edge length at a point */
export type SizeField = (x: number, y: number) => number;

export interface MeshOptions {
  sizeAt: SizeField;
  order: 1 | 2;
  /** points that must become mesh nodes (concentrated loads, point supports, site centres) */
  requiredPoints?: ReadonlyArray<readonly [number, number]>;
  /** minimum angle target in degrees for the refinement (default 28) */
  minAngleDeg?: number;
  /** safety cap on vertices; exceeding it is a MeshError naming the size that caused it */
  maxVertices?: number;
}

export interface MeshQuality {
  nodes: number;
  elements: number;
  order: 1 | 2;
  minAngleDeg: number;
  maxAngleDeg: number;
  area: number;
  minEdge: number;
  maxEdge: number;
}
