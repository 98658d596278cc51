/**
 * Error measures against a known exact field, integrated element by element with the
 * 7-point degree-5 rule on the triangle (Radon 1948; as tabulated by Dunavant, IJNME 21, 1985)
 * through each element's own (isoparametric) map. Test code only.
 */
import { elasticityMatrix, gatherElementXY, lstGradients, lstShape, cstGradients } from '../../../src/fem/index.js';
import type { ElasticSection } from '../../../src/fem/index.js';
import type { Mesh } from '../../../src/mesh/types.js';

const a1 = 0.059715871789770, b1 = 0.470142064105115;
const a2 = 0.797426985353087, b2 = 0.101286507323456;
const w1 = 0.132394152788506, w2 = 0.125939180544827;
// area coordinates (L2, L3) = (ξ, η) and weights (summing to 1)
const RULE: Array<[number, number, number]> = [
  [1 / 3, 1 / 3, 0.225],
  [b1, b1, w1], [a1, b1, w1], [b1, a1, w1],
  [b2, b2, w2], [a2, b2, w2], [b2, a2, w2],
];

export type Field = (x: number, y: number) => [number, number, number];
export type Displacement = (x: number, y: number) => [number, number];

/**
 * energy norm of the error, ‖e‖_E = (∫ (ε − ε_h)ᵀ D (ε − ε_h) t dA)^½, and of the exact field,
 * with the exact strain {εx, εy, γxy}
 */
export function energyError(mesh: Mesh, u: Float64Array, section: ElasticSection, strain: Field): { error: number; norm: number } {
  const D = elasticityMatrix(section);
  const npe = mesh.nodesPerElem;
  const exy = new Float64Array(2 * npe);
  const dx = new Float64Array(6), dy = new Float64Array(6), N = new Float64Array(6);
  let err2 = 0, norm2 = 0;
  for (let e = 0; e < mesh.elemNodes.length / npe; e++) {
    gatherElementXY(mesh.xy, mesh.elemNodes, npe, e, exy);
    for (const [xi, eta, w] of RULE) {
      let det: number;
      let x = 0, y = 0;
      if (npe === 3) {
        det = cstGradients(exy, dx, dy);
        const L1 = 1 - xi - eta;
        x = L1 * exy[0] + xi * exy[2] + eta * exy[4];
        y = L1 * exy[1] + xi * exy[3] + eta * exy[5];
      } else {
        det = lstGradients(exy, xi, eta, dx, dy);
        lstShape(xi, eta, N);
        for (let i = 0; i < 6; i++) {
          x += N[i] * exy[2 * i];
          y += N[i] * exy[2 * i + 1];
        }
      }
      let ex = 0, ey = 0, g = 0;
      for (let i = 0; i < npe; i++) {
        const n = mesh.elemNodes[npe * e + i];
        ex += dx[i] * u[2 * n];
        ey += dy[i] * u[2 * n + 1];
        g += dy[i] * u[2 * n] + dx[i] * u[2 * n + 1];
      }
      const s = strain(x, y);
      const d = [s[0] - ex, s[1] - ey, s[2] - g];
      const wt = 0.5 * det * w * section.thickness;
      for (let i = 0; i < 3; i++) {
        for (let j = 0; j < 3; j++) {
          err2 += wt * d[i] * D[3 * i + j] * d[j];
          norm2 += wt * s[i] * D[3 * i + j] * s[j];
        }
      }
    }
  }
  return { error: Math.sqrt(err2), norm: Math.sqrt(norm2) };
}

/** L2 norm of the displacement error (∫ |u − u_h|² dA)^½ and of the exact field */
export function displacementL2Error(mesh: Mesh, u: Float64Array, exact: Displacement): { error: number; norm: number } {
  const npe = mesh.nodesPerElem;
  const exy = new Float64Array(2 * npe);
  const dx = new Float64Array(6), dy = new Float64Array(6), N = new Float64Array(6);
  let err2 = 0, norm2 = 0;
  for (let e = 0; e < mesh.elemNodes.length / npe; e++) {
    gatherElementXY(mesh.xy, mesh.elemNodes, npe, e, exy);
    for (const [xi, eta, w] of RULE) {
      let det: number;
      if (npe === 3) {
        det = cstGradients(exy, dx, dy);
        const L1 = 1 - xi - eta;
        N[0] = L1; N[1] = xi; N[2] = eta;
      } else {
        det = lstGradients(exy, xi, eta, dx, dy);
        lstShape(xi, eta, N);
      }
      let x = 0, y = 0, uh = 0, vh = 0;
      for (let i = 0; i < npe; i++) {
        const n = mesh.elemNodes[npe * e + i];
        x += N[i] * exy[2 * i];
        y += N[i] * exy[2 * i + 1];
        uh += N[i] * u[2 * n];
        vh += N[i] * u[2 * n + 1];
      }
      const [ue, ve] = exact(x, y);
      const wt = 0.5 * det * w;
      err2 += wt * ((ue - uh) ** 2 + (ve - vh) ** 2);
      norm2 += wt * (ue * ue + ve * ve);
    }
  }
  return { error: Math.sqrt(err2), norm: Math.sqrt(norm2) };
}

/** the node nearest to (x, y) */
export function nodeAt(mesh: Mesh, x: number, y: number): number {
  let best = 0, bestD = Infinity;
  for (let n = 0; n < mesh.xy.length / 2; n++) {
    const d = Math.hypot(mesh.xy[2 * n] - x, mesh.xy[2 * n + 1] - y);
    if (d < bestD) { bestD = d; best = n; }
  }
  return best;
}

/** observed rate log(e_coarse / e_fine) / log(h_coarse / h_fine) */
export function rate(eCoarse: number, eFine: number, ratio = 2): number {
  return Math.log(eCoarse / eFine) / Math.log(ratio);
}
