import type { ElasticSection, GaussStresses } from '../fem/types.js';
import type { Mesh } from '../mesh/types.js';
import { complianceForm, revolvedComplianceForm } from './compliance.js';
import { TRI_3, TRI_7, type TriangleRule } from '../element/index.js';
import { ElementScratch } from './element.js';
import { evalElementField, fitElementFields } from './element-fit.js';
import type { ErrorEstimate, NodalStress } from './types.js';
import { checkField, checkGauss, checkSection } from './validate.js';

/** A reference stress field (σxx, σyy, τxy) at a point, e.g. a closed-form solution. */
export type StressFunction = (x: number, y: number) => readonly [number, number, number];

/**
 * ∫_T (σa − σh)ᵀ D⁻¹ (σa − σh) dA for every element, where σh is the element's raw FE stress
 * (linear through its Gauss values, see element-fit.ts) and σa is given per quadrature point
 * by `other`. The rule is exact for the integrand on straight elements: 3 points (degree 2)
 * for the CST, 7 points (degree 5; the LST integrand is of degree 4) for the LST.
 */
function elementDifferenceSq(
  mesh: Mesh,
  gauss: GaussStresses,
  section: ElasticSection,
  other: (e: number, N: Float64Array, x: number, y: number, out: Float64Array) => void,
  otherHoop?: (e: number, N: Float64Array) => number,
): Float64Array {
  const nElem = checkGauss(mesh, gauss);
  checkSection(section);
  const form = complianceForm(section);
  const fields = fitElementFields(gauss, nElem);
  // an axisymmetric section with a recovered hoop stress: the 3-D form with σθ, weighted by r
  const hoop = section.state === 'axisymmetric' && otherHoop ? hoopFields(gauss, nElem) : undefined;
  const form4 = hoop ? revolvedComplianceForm(section) : undefined;
  const th = new Float64Array(3);
  const rule: TriangleRule = mesh.order === 1 ? TRI_3 : TRI_7;
  const s = new ElementScratch(mesh.nodesPerElem);
  const m = new Float64Array(6);
  const sh = new Float64Array(3);
  const sa = new Float64Array(3);
  const out = new Float64Array(nElem);
  for (let e = 0; e < nElem; e++) {
    s.load(mesh, e);
    let sum = 0;
    for (let q = 0; q < rule.w.length; q++) {
      const J = s.map(rule.xi[q], rule.eta[q], m);
      evalElementField(fields, e, m[0], m[1], sh);
      other(e, s.N, m[0], m[1], sa);
      // weight × |J|/2 (element/rules.ts convention)
      if (hoop && form4 && otherHoop) {
        evalElementField(hoop, e, m[0], m[1], th);
        sum += 0.5 * Math.abs(J) * rule.w[q] * m[0] * form4(sa[0] - sh[0], sa[1] - sh[1], sa[2] - sh[2], otherHoop(e, s.N) - th[0]);
      } else sum += 0.5 * Math.abs(J) * rule.w[q] * form(sa[0] - sh[0], sa[1] - sh[1], sa[2] - sh[2]);
    }
    out[e] = sum;
  }
  return out;
}

/** ‖u_h‖²_E = ∫ σhᵀ D⁻¹ σh dA, with the solver's own Gauss points and weights. */
export function energyNormSq(gauss: GaussStresses, section: ElasticSection): number {
  const form = complianceForm(section);
  let energy = 0;
  if (section.state === 'axisymmetric') {
    // per radian of the revolved body: σᵀD⁻¹σ with σθ, weighted by r (the 2π cancels in η)
    const form4 = revolvedComplianceForm(section);
    for (let k = 0; k < gauss.weight.length; k++) {
      energy += gauss.weight[k] * gauss.xy[2 * k] * form4(gauss.stress[3 * k], gauss.stress[3 * k + 1], gauss.stress[3 * k + 2], gauss.szz[k]);
    }
    return energy;
  }
  for (let k = 0; k < gauss.weight.length; k++) {
    energy += gauss.weight[k] * form(gauss.stress[3 * k], gauss.stress[3 * k + 1], gauss.stress[3 * k + 2]);
  }
  return energy;
}

function summarise(elemErrorSq: Float64Array, energySq: number): ErrorEstimate {
  let errorSq = 0;
  for (let e = 0; e < elemErrorSq.length; e++) errorSq += elemErrorSq[e];
  const denom = energySq + errorSq;
  return { elemErrorSq, errorSq, energySq, errorPercent: denom > 0 ? 100 * Math.sqrt(errorSq / denom) : 0 };
}

/**
 * Zienkiewicz–Zhu error estimate: the recovered field σ* stands in for the exact stress,
 * ‖e*‖²_T = ∫_T (σ* − σh)ᵀ D⁻¹ (σ* − σh) dA, and η = ‖e*‖ / √(‖u_h‖² + ‖e*‖²) in percent.
 * O. C. Zienkiewicz & J. Z. Zhu, "A simple error estimator and adaptive procedure for practical
 * engineering analysis", IJNME 24 (1987) 337–357; with SPR as the recovery, Part 2 of
 * "The superconvergent patch recovery and a posteriori error estimates", IJNME 33 (1992) 1365–1382.
 * σ* is interpolated over each element with its own shape functions. Energies are per unit thickness.
 */
export function estimateError(mesh: Mesh, gauss: GaussStresses, nodal: NodalStress, section: ElasticSection): ErrorEstimate {
  checkField(mesh, nodal);
  const npe = mesh.nodesPerElem;
  const star = nodal.stress;
  const elemErrorSq = elementDifferenceSq(mesh, gauss, section, (e, N, _x, _y, out) => {
    let a = 0;
    let b = 0;
    let c = 0;
    for (let i = 0; i < npe; i++) {
      const n = mesh.elemNodes[npe * e + i];
      a += N[i] * star[3 * n];
      b += N[i] * star[3 * n + 1];
      c += N[i] * star[3 * n + 2];
    }
    out[0] = a;
    out[1] = b;
    out[2] = c;
  }, (e, N) => {
    let t = 0;
    for (let i = 0; i < npe; i++) t += N[i] * nodal.szz[mesh.elemNodes[npe * e + i]];
    return t;
  });
  return summarise(elemErrorSq, energyNormSq(gauss, section));
}

/** The raw element field of the Gauss-point σzz (σθ of a section), fitted like the other components (slot 0). */
function hoopFields(gauss: GaussStresses, nElem: number) {
  const n = gauss.weight.length;
  const stress = new Float64Array(3 * n);
  for (let k = 0; k < n; k++) stress[3 * k] = gauss.szz[k];
  return fitElementFields({ ...gauss, stress }, nElem);
}

/**
 * The true energy-norm error against a known stress field (a closed-form solution):
 * ‖e‖²_T = ∫_T (σ_exact − σh)ᵀ D⁻¹ (σ_exact − σh) dA, in the same form as `estimateError`, so the
 * effectivity index is √(estimate.errorSq / exact.errorSq). The quadrature is exact only for
 * polynomial σ_exact; for smooth fields its error is far below the discretisation error.
 */
export function exactError(mesh: Mesh, gauss: GaussStresses, section: ElasticSection, exact: StressFunction): ErrorEstimate {
  const elemErrorSq = elementDifferenceSq(mesh, gauss, section, (_e, _N, x, y, out) => {
    const v = exact(x, y);
    out[0] = v[0];
    out[1] = v[1];
    out[2] = v[2];
  });
  return summarise(elemErrorSq, energyNormSq(gauss, section));
}
