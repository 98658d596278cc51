/**
 * Shape functions of the 3-node (CST) and 6-node (LST) triangles in the reference
 * coordinates (ξ, η), area coordinates L1 = 1 − ξ − η, L2 = ξ, L3 = η:
 *
 *        2              N0 = L1(2L1 − 1)   N3 = 4 L1 L2
 *        | \            N1 = L2(2L2 − 1)   N4 = 4 L2 L3
 *        5   4          N2 = L3(2L3 − 1)   N5 = 4 L3 L1
 *        |     \
 *        0 --3-- 1      (local numbering of src/mesh/types.ts)
 *
 * The LST is isoparametric: the same functions map (ξ, η) to (x, y), so mid-side nodes
 * placed on a curve give an element with a curved (quadratic) edge.
 */

/**
 * Interior 3-point rule on the reference triangle (area 1/2): points (1/6, 1/6), (2/3, 1/6),
 * (1/6, 2/3), weight 1/6 each. Exact for polynomials of degree 2 (Strang & Fix, "An Analysis of
 * the Finite Element Method", 1973, Table 4.1), hence exact for the stiffness BᵀDB of a
 * straight-sided LST, whose strains are linear.
 */
export const TRI3_XI = new Float64Array([1 / 6, 2 / 3, 1 / 6]);
export const TRI3_ETA = new Float64Array([1 / 6, 1 / 6, 2 / 3]);
export const TRI3_W = new Float64Array([1 / 6, 1 / 6, 1 / 6]);

/** values of the six LST shape functions at (ξ, η) into N[0..5] */
export function lstShape(xi: number, eta: number, N: Float64Array): void {
  const L1 = 1 - xi - eta;
  const L2 = xi;
  const L3 = eta;
  N[0] = L1 * (2 * L1 - 1);
  N[1] = L2 * (2 * L2 - 1);
  N[2] = L3 * (2 * L3 - 1);
  N[3] = 4 * L1 * L2;
  N[4] = 4 * L2 * L3;
  N[5] = 4 * L3 * L1;
}

/** ∂N/∂ξ into dXi[0..5] and ∂N/∂η into dEta[0..5] of the six LST shape functions at (ξ, η) */
export function lstParametricDerivatives(xi: number, eta: number, dXi: Float64Array, dEta: Float64Array): void {
  const L1 = 1 - xi - eta;
  const a = 4 * L1 - 1;
  dXi[0] = -a;
  dEta[0] = -a;
  dXi[1] = 4 * xi - 1;
  dEta[1] = 0;
  dXi[2] = 0;
  dEta[2] = 4 * eta - 1;
  dXi[3] = 4 * (L1 - xi);
  dEta[3] = -4 * xi;
  dXi[4] = 4 * eta;
  dEta[4] = 4 * xi;
  dXi[5] = -4 * eta;
  dEta[5] = 4 * (L1 - eta);
}

/**
 * Cartesian derivatives of the LST shape functions at (ξ, η) for an element with node
 * coordinates xy = [x0, y0, …, x5, y5]. Writes dNdx[0..5], dNdy[0..5]; returns det J
 * (twice the local area scale; positive for a counter-clockwise, untangled element).
 */
export function lstGradients(
  xy: ArrayLike<number>,
  xi: number,
  eta: number,
  dNdx: Float64Array,
  dNdy: Float64Array,
): number {
  // derivatives with respect to ξ (dNdx is used as scratch) and η (dNdy)
  lstParametricDerivatives(xi, eta, dNdx, dNdy);
  let j11 = 0;
  let j12 = 0;
  let j21 = 0;
  let j22 = 0;
  for (let i = 0; i < 6; i++) {
    const x = xy[2 * i];
    const y = xy[2 * i + 1];
    j11 += dNdx[i] * x; // ∂x/∂ξ
    j12 += dNdx[i] * y; // ∂y/∂ξ
    j21 += dNdy[i] * x; // ∂x/∂η
    j22 += dNdy[i] * y; // ∂y/∂η
  }
  const det = j11 * j22 - j12 * j21;
  const inv = 1 / det;
  for (let i = 0; i < 6; i++) {
    const dxi = dNdx[i];
    const deta = dNdy[i];
    dNdx[i] = (j22 * dxi - j12 * deta) * inv;
    dNdy[i] = (-j21 * dxi + j11 * deta) * inv;
  }
  return det;
}

/**
 * Constant Cartesian derivatives of the CST shape functions; returns twice the signed area.
 * dN_i/dx = (y_j − y_k)/2A, dN_i/dy = (x_k − x_j)/2A for (i, j, k) cyclic.
 */
export function cstGradients(xy: ArrayLike<number>, dNdx: Float64Array, dNdy: Float64Array): number {
  const x0 = xy[0];
  const y0 = xy[1];
  const x1 = xy[2];
  const y1 = xy[3];
  const x2 = xy[4];
  const y2 = xy[5];
  const twoA = (x1 - x0) * (y2 - y0) - (x2 - x0) * (y1 - y0);
  const inv = 1 / twoA;
  dNdx[0] = (y1 - y2) * inv;
  dNdx[1] = (y2 - y0) * inv;
  dNdx[2] = (y0 - y1) * inv;
  dNdy[0] = (x2 - x1) * inv;
  dNdy[1] = (x0 - x2) * inv;
  dNdy[2] = (x1 - x0) * inv;
  return twoA;
}

/** Gather the coordinates of element e's nodes into out[0 .. 2·nodesPerElem − 1]. */
export function gatherElementXY(
  xy: Float64Array,
  elemNodes: Uint32Array,
  nodesPerElem: number,
  e: number,
  out: Float64Array,
): void {
  const base = nodesPerElem * e;
  for (let i = 0; i < nodesPerElem; i++) {
    const n = elemNodes[base + i];
    out[2 * i] = xy[2 * n];
    out[2 * i + 1] = xy[2 * n + 1];
  }
}
