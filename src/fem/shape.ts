/**
 * Cartesian derivatives of the element shape functions: the reference functions and rules are
 * the element module's (src/element), these map them onto an element's own node coordinates.
 */
import { cstShape, lstParametricDerivatives, lstShape, type TriangleRule } from '../element/index.js';

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

/**
 * Shape functions N and their Cartesian derivatives at (ξ, η) of a 3- or 6-node element with node
 * coordinates `xy` (isoparametric map); returns det J.
 */
export function shapeAt(
  nodesPerElem: number, xy: ArrayLike<number>, xi: number, eta: number, N: Float64Array, dNdx: Float64Array, dNdy: Float64Array,
): number {
  if (nodesPerElem === 3) {
    cstShape(xi, eta, N);
    return cstGradients(xy, dNdx, dNdy);
  }
  lstShape(xi, eta, N);
  return lstGradients(xy, xi, eta, dNdx, dNdy);
}

/** What a visitor of forEachRulePoint sees at one integration point (scratch arrays, reused). */
export interface RulePoint {
  /** element and its node numbers' offset in elemNodes (nodesPerElem · e) */
  e: number;
  x: number;
  y: number;
  /** the rule's weight × |J|/2 (element/rules.ts convention): the area the point stands for */
  area: number;
  N: Float64Array;
  dNdx: Float64Array;
  dNdy: Float64Array;
}

/**
 * Every integration point of a rule in every element, in element order: its position through the
 * element's own map, its area weight, N and the Cartesian derivatives. The one loop the load
 * integrals (body force, thermal strain) share.
 */
export function forEachRulePoint(
  mesh: { xy: Float64Array; elemNodes: Uint32Array; nodesPerElem: number },
  rule: TriangleRule,
  visit: (p: RulePoint) => void,
): void {
  const npe = mesh.nodesPerElem;
  const exy = new Float64Array(2 * npe);
  const p: RulePoint = { e: 0, x: 0, y: 0, area: 0, N: new Float64Array(6), dNdx: new Float64Array(6), dNdy: new Float64Array(6) };
  const nElem = mesh.elemNodes.length / npe;
  for (let e = 0; e < nElem; e++) {
    gatherElementXY(mesh.xy, mesh.elemNodes, npe, e, exy);
    p.e = e;
    for (let g = 0; g < rule.w.length; g++) {
      const det = shapeAt(npe, exy, rule.xi[g], rule.eta[g], p.N, p.dNdx, p.dNdy);
      let x = 0;
      let y = 0;
      for (let i = 0; i < npe; i++) {
        x += p.N[i] * exy[2 * i];
        y += p.N[i] * exy[2 * i + 1];
      }
      p.x = x;
      p.y = y;
      p.area = 0.5 * rule.w[g] * det;
      visit(p);
    }
  }
}
