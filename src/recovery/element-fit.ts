import type { GaussStresses } from '../fem/types.js';

/**
 * The raw FE stress inside each element as a linear function of position, fitted to its Gauss
 * values: σh(x, y) = c0 + c1 (x − x̄) + c2 (y − ȳ) per component, about the mean x̄, ȳ of the
 * element's Gauss points. For the LST (3 Gauss points) the fit interpolates them, which is the
 * exact FE stress on a straight-sided element (strains of a quadratic displacement are linear);
 * for the CST (1 point) the field is the constant. More points: least squares.
 */
export interface ElementFields {
  /** element e: [9e … 9e + 8] = (c0, c1, c2) for σxx, then σyy, then τxy */
  coef: Float64Array;
  /** element e: [2e, 2e + 1] = x̄, ȳ */
  center: Float64Array;
}

export function fitElementFields(gauss: GaussStresses, nElem: number): ElementFields {
  const ng = gauss.nGauss;
  const coef = new Float64Array(9 * nElem);
  const center = new Float64Array(2 * nElem);
  const { xy, stress } = gauss;
  for (let e = 0; e < nElem; e++) {
    const k0 = ng * e;
    let cx = 0;
    let cy = 0;
    for (let g = 0; g < ng; g++) {
      cx += xy[2 * (k0 + g)];
      cy += xy[2 * (k0 + g) + 1];
    }
    cx /= ng;
    cy /= ng;
    center[2 * e] = cx;
    center[2 * e + 1] = cy;
    if (ng === 1) {
      coef[9 * e] = stress[3 * k0];
      coef[9 * e + 3] = stress[3 * k0 + 1];
      coef[9 * e + 6] = stress[3 * k0 + 2];
      continue;
    }
    // normal equations in centred coordinates: Σ dx = Σ dy = 0, so the constant decouples
    let sxx = 0;
    let sxy = 0;
    let syy = 0;
    for (let g = 0; g < ng; g++) {
      const dx = xy[2 * (k0 + g)] - cx;
      const dy = xy[2 * (k0 + g) + 1] - cy;
      sxx += dx * dx;
      sxy += dx * dy;
      syy += dy * dy;
    }
    const det = sxx * syy - sxy * sxy;
    for (let c = 0; c < 3; c++) {
      let mean = 0;
      let bx = 0;
      let by = 0;
      for (let g = 0; g < ng; g++) {
        const v = stress[3 * (k0 + g) + c];
        const dx = xy[2 * (k0 + g)] - cx;
        const dy = xy[2 * (k0 + g) + 1] - cy;
        mean += v;
        bx += v * dx;
        by += v * dy;
      }
      coef[9 * e + 3 * c] = mean / ng;
      coef[9 * e + 3 * c + 1] = (syy * bx - sxy * by) / det;
      coef[9 * e + 3 * c + 2] = (-sxy * bx + sxx * by) / det;
    }
  }
  return { coef, center };
}

/** σh of element e at (x, y) into out[0..2]. */
export function evalElementField(f: ElementFields, e: number, x: number, y: number, out: Float64Array): void {
  const dx = x - f.center[2 * e];
  const dy = y - f.center[2 * e + 1];
  const k = 9 * e;
  const c = f.coef;
  out[0] = c[k] + c[k + 1] * dx + c[k + 2] * dy;
  out[1] = c[k + 3] + c[k + 4] * dx + c[k + 5] * dy;
  out[2] = c[k + 6] + c[k + 7] * dx + c[k + 8] * dy;
}
