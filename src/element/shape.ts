/**
 * Shape functions of the 3-node (CST) and 6-node (LST) triangles on the reference triangle, and
 * their derivatives with respect to the reference coordinates (ξ, η). Area coordinates
 * L1 = 1 − ξ − η, L2 = ξ, L3 = η:
 *
 *        2              CST: N0 = L1, N1 = L2, N2 = L3
 *        | \            LST: N0 = L1(2L1 − 1)   N3 = 4 L1 L2
 *        5   4               N1 = L2(2L2 − 1)   N4 = 4 L2 L3
 *        |     \             N2 = L3(2L3 − 1)   N5 = 4 L3 L1
 *        0 --3-- 1      (local numbering of src/mesh/types.ts)
 *
 * The LST is isoparametric: the same functions map (ξ, η) to (x, y), so mid-side nodes placed on
 * a curve give an element with a curved (quadratic) edge.
 */

/** values of the three CST shape functions at (ξ, η) into N[0..2] */
export function cstShape(xi: number, eta: number, N: Float64Array): void {
  N[0] = 1 - xi - eta;
  N[1] = xi;
  N[2] = eta;
}

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

/** ∂N/∂ξ into dXi[0..2] and ∂N/∂η into dEta[0..2] of the CST (constant) */
export function cstParametricDerivatives(dXi: Float64Array, dEta: Float64Array): void {
  dXi[0] = -1;
  dXi[1] = 1;
  dXi[2] = 0;
  dEta[0] = -1;
  dEta[1] = 0;
  dEta[2] = 1;
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

/** Shape functions of a 3- or 6-node triangle at (ξ, η) into `N`. */
export function shapeFunctions(nodesPerElem: 3 | 6, xi: number, eta: number, N: Float64Array): void {
  if (nodesPerElem === 6) lstShape(xi, eta, N);
  else cstShape(xi, eta, N);
}

/** ∂N/∂ξ and ∂N/∂η of a 3- or 6-node triangle at (ξ, η). */
export function shapeDerivatives(nodesPerElem: 3 | 6, xi: number, eta: number, dXi: Float64Array, dEta: Float64Array): void {
  if (nodesPerElem === 6) lstParametricDerivatives(xi, eta, dXi, dEta);
  else cstParametricDerivatives(dXi, dEta);
}

/**
 * det J = ∂x/∂ξ ∂y/∂η − ∂x/∂η ∂y/∂ξ of the isoparametric 6-node map at (ξ, η), for node
 * coordinates ex[0..5], ey[0..5]; twice the local area scale (the reference triangle has area ½).
 */
export function lstJacobian(ex: ArrayLike<number>, ey: ArrayLike<number>, xi: number, eta: number, dXi: Float64Array, dEta: Float64Array): number {
  lstParametricDerivatives(xi, eta, dXi, dEta);
  let xXi = 0, xEta = 0, yXi = 0, yEta = 0;
  for (let i = 0; i < 6; i++) {
    xXi += dXi[i] * ex[i];
    yXi += dXi[i] * ey[i];
    xEta += dEta[i] * ex[i];
    yEta += dEta[i] * ey[i];
  }
  return xXi * yEta - xEta * yXi;
}
