import type { Mesh } from '../mesh/types.js';
import { shapeDerivatives, shapeFunctions } from '../element/index.js';

/**
 * Element-level helpers of the recovery stage: the corner area and the isoparametric map of an
 * element (forward and inverse). Shape functions and quadrature rules are the reference
 * element's (src/element).
 *
 * Local numbering (mesh/types.ts): corners 0, 1, 2 counter-clockwise; 3 on 0–1, 4 on 1–2, 5 on 2–0.
 * Reference triangle (ξ, η): node 0 at (0, 0), 1 at (1, 0), 2 at (0, 1); L1 = 1 − ξ − η, L2 = ξ, L3 = η.
 */

/** Area of the straight triangle through the three corner nodes (positive counter-clockwise). */
export function cornerArea(mesh: Pick<Mesh, 'xy' | 'elemNodes' | 'nodesPerElem'>, e: number): number {
  const { xy, elemNodes } = mesh;
  const k = mesh.nodesPerElem * e;
  const a = elemNodes[k];
  const b = elemNodes[k + 1];
  const c = elemNodes[k + 2];
  return 0.5 * ((xy[2 * b] - xy[2 * a]) * (xy[2 * c + 1] - xy[2 * a + 1]) - (xy[2 * c] - xy[2 * a]) * (xy[2 * b + 1] - xy[2 * a + 1]));
}

/**
 * Scratch for isoparametric evaluation of one element: node coordinates, shape functions and
 * derivatives. One per call site, refilled per element (no allocation in loops).
 */
export class ElementScratch {
  readonly npe: 3 | 6;
  readonly ex: Float64Array;
  readonly ey: Float64Array;
  readonly N: Float64Array;
  readonly dXi: Float64Array;
  readonly dEta: Float64Array;
  /** x, y, ∂x/∂ξ, ∂x/∂η, ∂y/∂ξ, ∂y/∂η of the last `map` call made by `inverseMap` */
  readonly m6 = new Float64Array(6);
  constructor(npe: 3 | 6) {
    this.npe = npe;
    this.ex = new Float64Array(npe);
    this.ey = new Float64Array(npe);
    this.N = new Float64Array(npe);
    this.dXi = new Float64Array(npe);
    this.dEta = new Float64Array(npe);
  }
  load(mesh: Pick<Mesh, 'xy' | 'elemNodes'>, e: number): void {
    const k = this.npe * e;
    for (let i = 0; i < this.npe; i++) {
      const n = mesh.elemNodes[k + i];
      this.ex[i] = mesh.xy[2 * n];
      this.ey[i] = mesh.xy[2 * n + 1];
    }
  }
  /** Fills N at (ξ, η); returns the Jacobian determinant and writes x, y into `out`. */
  map(xi: number, eta: number, out: Float64Array): number {
    shapeFunctions(this.npe, xi, eta, this.N);
    shapeDerivatives(this.npe, xi, eta, this.dXi, this.dEta);
    let x = 0;
    let y = 0;
    let xXi = 0;
    let xEta = 0;
    let yXi = 0;
    let yEta = 0;
    for (let i = 0; i < this.npe; i++) {
      x += this.N[i] * this.ex[i];
      y += this.N[i] * this.ey[i];
      xXi += this.dXi[i] * this.ex[i];
      xEta += this.dEta[i] * this.ex[i];
      yXi += this.dXi[i] * this.ey[i];
      yEta += this.dEta[i] * this.ey[i];
    }
    out[0] = x;
    out[1] = y;
    out[2] = xXi;
    out[3] = xEta;
    out[4] = yXi;
    out[5] = yEta;
    return xXi * yEta - xEta * yXi;
  }
}

/**
 * Inverse isoparametric map by Newton's method from the straight-triangle guess. Writes (ξ, η)
 * into `out`; returns false when Newton does not settle (badly curved element).
 */
export function inverseMap(s: ElementScratch, x: number, y: number, out: Float64Array): boolean {
  // straight-triangle guess from the corners
  const x0 = s.ex[0];
  const y0 = s.ey[0];
  const a = s.ex[1] - x0;
  const b = s.ex[2] - x0;
  const c = s.ey[1] - y0;
  const d = s.ey[2] - y0;
  const det = a * d - b * c;
  let xi = (d * (x - x0) - b * (y - y0)) / det;
  let eta = (-c * (x - x0) + a * (y - y0)) / det;
  if (s.npe === 6) {
    const m = s.m6;
    const tol = 1e-13 * (Math.abs(a) + Math.abs(b) + Math.abs(c) + Math.abs(d));
    let ok = false;
    for (let it = 0; it < 20; it++) {
      const J = s.map(xi, eta, m);
      const rx = x - m[0];
      const ry = y - m[1];
      const dxi = (m[5] * rx - m[3] * ry) / J;
      const deta = (-m[4] * rx + m[2] * ry) / J;
      xi += dxi;
      eta += deta;
      if (Math.abs(rx) + Math.abs(ry) <= tol) {
        ok = true;
        break;
      }
    }
    if (!ok || !Number.isFinite(xi) || !Number.isFinite(eta)) return false;
  }
  out[0] = xi;
  out[1] = eta;
  return true;
}
