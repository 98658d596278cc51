import { TRI_3 } from '../element/index.js';
import { cstGradients, lstGradients } from './shape.js';

const scratchDx = new Float64Array(6);
const scratchDy = new Float64Array(6);

/**
 * Adds w·BᵀDB to the element stiffness `ke` (size (2n)², row-major, dof order u0, v0, u1, v1, …)
 * for n nodes with shape-function gradients dNdx, dNdy at one integration point.
 * Strain of a unit u_j: {∂N_j/∂x, 0, ∂N_j/∂y}; of a unit v_j: {0, ∂N_j/∂y, ∂N_j/∂x}.
 */
function addBtDB(
  n: number,
  dNdx: Float64Array,
  dNdy: Float64Array,
  D: Float64Array,
  w: number,
  ke: Float64Array,
): void {
  const nd = 2 * n;
  const D00 = D[0], D01 = D[1], D02 = D[2];
  const D10 = D[3], D11 = D[4], D12 = D[5];
  const D20 = D[6], D21 = D[7], D22 = D[8];
  for (let j = 0; j < n; j++) {
    const bx = dNdx[j];
    const by = dNdy[j];
    // stress of a unit u_j (s) and of a unit v_j (r)
    const s0 = D00 * bx + D02 * by, s1 = D10 * bx + D12 * by, s2 = D20 * bx + D22 * by;
    const r0 = D01 * by + D02 * bx, r1 = D11 * by + D12 * bx, r2 = D21 * by + D22 * bx;
    for (let i = 0; i < n; i++) {
      const ax = dNdx[i] * w;
      const ay = dNdy[i] * w;
      const row = 2 * i * nd;
      ke[row + 2 * j] += ax * s0 + ay * s2;
      ke[row + 2 * j + 1] += ax * r0 + ay * r2;
      ke[row + nd + 2 * j] += ay * s1 + ax * s2;
      ke[row + nd + 2 * j + 1] += ay * r1 + ax * r2;
    }
  }
}

/**
 * Stiffness of the constant-strain triangle (Turner, Clough, Martin & Topp, "Stiffness and
 * deflection analysis of complex structures", J. Aeronautical Sciences 23, 1956):
 * K = t·A·BᵀDB with the constant B. xy = [x0, y0, x1, y1, x2, y2] counter-clockwise.
 * Returns the 6×6 matrix (row-major) in `out`.
 */
export function elementStiffnessCst(
  xy: ArrayLike<number>,
  D: Float64Array,
  thickness: number,
  out: Float64Array = new Float64Array(36),
): Float64Array {
  out.fill(0);
  const twoA = cstGradients(xy, scratchDx, scratchDy);
  addBtDB(3, scratchDx, scratchDy, D, 0.5 * twoA * thickness, out);
  return out;
}

/**
 * Stiffness of the isoparametric 6-node triangle (LST), K = t ∫ BᵀDB dA, integrated with the
 * interior 3-point rule (exact for straight-sided elements; on curved elements the isoparametric
 * map makes the integrand rational and the rule is then an approximation of the same order).
 * xy = [x0, y0, …, x5, y5] in the local numbering of src/mesh/types.ts.
 * Returns the 12×12 matrix (row-major) in `out`.
 */
export function elementStiffnessLst(
  xy: ArrayLike<number>,
  D: Float64Array,
  thickness: number,
  out: Float64Array = new Float64Array(144),
): Float64Array {
  out.fill(0);
  for (let g = 0; g < TRI_3.w.length; g++) {
    const det = lstGradients(xy, TRI_3.xi[g], TRI_3.eta[g], scratchDx, scratchDy);
    // weight × |J|/2 (element/rules.ts convention)
    addBtDB(6, scratchDx, scratchDy, D, 0.5 * TRI_3.w[g] * det * thickness, out);
  }
  return out;
}
