/**
 * Convergence fits for a sequence of peaks on meshes refined by a constant ratio r.
 *
 * Richardson extrapolation with the observed order and Roache's Grid Convergence Index:
 * P. J. Roache, "Perspective: a method for uniform reporting of grid refinement studies", J. Fluids Eng. 116
 * (1994) 405–413; P. J. Roache, Verification and Validation in Computational Science and Engineering (1998);
 * safety factor F_s = 1.25 for three or more grids as adopted by ASME V&V 20-2009.
 * Convergence ratio R and its three classes: F. Stern, R. V. Wilson, H. W. Coleman & E. G. Paterson,
 * "Comprehensive approach to verification and validation of CFD simulations", J. Fluids Eng. 123 (2001) 793–802.
 */

export type ConvergenceClass = 'monotone' | 'oscillatory' | 'divergent' | 'flat';

export interface ThreeLevelFit {
  /** observed order p = ln(ε₃₂/ε₂₁)/ln r (negative when the increments grow: a singular peak gives −q) */
  p: number;
  /** convergence ratio R = ε₂₁/ε₃₂ */
  R: number;
  kind: ConvergenceClass;
  /** Richardson extrapolation f₁ + (f₁ − f₂)/(r^p − 1) (only meaningful for p > 0) */
  fExt: number;
  /** fine-grid GCI as a fraction of |f₁|: F_s |(f₁ − f₂)/f₁| / (r^p − 1) */
  gciFine: number;
  /** coarse-grid GCI as a fraction of |f₂| */
  gciCoarse: number;
  // (no "asymptotic ratio" GCI₂₃/(r^p GCI₁₂): with p observed from the same three values it equals
  // |f₁/f₂| identically, so it cannot tell an asymptotic triple from any other)
}

export const GCI_SAFETY_FACTOR = 1.25;

/**
 * Three-level fit, f1 on the finest mesh (h₁), f2 on h₂ = r h₁, f3 on h₃ = r² h₁.
 * ε₂₁ = f₂ − f₁, ε₃₂ = f₃ − f₂ (Roache 1998; Celik et al., J. Fluids Eng. 130 (2008) 078001).
 */
export function threeLevelFit(f1: number, f2: number, f3: number, r: number, Fs = GCI_SAFETY_FACTOR): ThreeLevelFit {
  if (!(r > 1)) throw new RangeError(`refinement ratio must be > 1, got ${r}`);
  const e21 = f2 - f1;
  const e32 = f3 - f2;
  if (e21 === 0 || e32 === 0) {
    return { p: NaN, R: e32 === 0 ? NaN : 0, kind: 'flat', fExt: f1, gciFine: 0, gciCoarse: 0 };
  }
  const R = e21 / e32;
  const kind: ConvergenceClass = R < 0 ? 'oscillatory' : R < 1 ? 'monotone' : 'divergent';
  // for oscillatory sequences the order uses |ε₃₂/ε₂₁| (Celik et al. 2008)
  const p = Math.log(Math.abs(e32 / e21)) / Math.log(r);
  const rp1 = Math.pow(r, p) - 1;
  const fExt = f1 + (f1 - f2) / rp1;
  const gciFine = (Fs * Math.abs(e21 / f1)) / rp1;
  const gciCoarse = (Fs * Math.abs(e32 / f2)) / rp1;
  return { p, R, kind, fExt, gciFine, gciCoarse };
}

/**
 * Observed order for a non-constant refinement ratio, by the fixed-point iteration of
 * Celik et al. (2008): p = |ln|ε₃₂/ε₂₁| + q(p)| / ln r₂₁, q(p) = ln((r₂₁^p − s)/(r₃₂^p − s)), s = sign(ε₃₂/ε₂₁).
 */
export function observedOrderVariableRatio(f1: number, f2: number, f3: number, r21: number, r32: number): number {
  const e21 = f2 - f1, e32 = f3 - f2;
  const s = Math.sign(e32 / e21);
  let p = Math.log(Math.abs(e32 / e21)) / Math.log(r21);
  for (let it = 0; it < 100; it++) {
    const q = Math.log((Math.pow(r21, p) - s) / (Math.pow(r32, p) - s));
    const pn = Math.abs(Math.log(Math.abs(e32 / e21)) + q) / Math.log(r21);
    if (!Number.isFinite(pn)) break;
    if (Math.abs(pn - p) < 1e-12) return pn;
    p = pn;
  }
  return p;
}

/** Least-squares line y = a + b x with the standard error of the slope (NaN with fewer than 3 points). */
export function lineFit(x: ArrayLike<number>, y: ArrayLike<number>): { intercept: number; slope: number; slopeSe: number } {
  const n = x.length;
  if (n < 2 || y.length !== n) throw new RangeError(`lineFit needs ≥ 2 matching points, got ${n} and ${y.length}`);
  let mx = 0, my = 0;
  for (let i = 0; i < n; i++) { mx += x[i]; my += y[i]; }
  mx /= n; my /= n;
  let sxx = 0, sxy = 0;
  for (let i = 0; i < n; i++) { sxx += (x[i] - mx) ** 2; sxy += (x[i] - mx) * (y[i] - my); }
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (y[i] - intercept - slope * x[i]) ** 2;
  const slopeSe = n > 2 ? Math.sqrt(ss / (n - 2) / sxx) : NaN;
  return { intercept, slope, slopeSe };
}

/** Slope of log|f| against log h (peak ∝ h^slope), with its standard error. */
export function logLogSlope(h: ArrayLike<number>, f: ArrayLike<number>): { slope: number; slopeSe: number } {
  const x = Array.from(h, (v) => Math.log(v));
  const y = Array.from(f, (v) => Math.log(Math.abs(v)));
  const { slope, slopeSe } = lineFit(x, y);
  return { slope, slopeSe };
}

/**
 * Growth exponent from the increments d_k = f_k − f_{k−1} of a sequence on h_k (coarse → fine). If
 * f = f₀ + C h^−q then d_k ∝ h_k^−q, so q = −slope of log|d_k| against log h_k: the regular part f₀ of the peak
 * drops out (the same reasoning that makes the three-grid order return q at a singular point; Roache 1998).
 * Returns q (> 0: growing increments, < 0: shrinking, −q is then the order of convergence), its standard error
 * (NaN with only two increments) and whether all increments share one sign.
 */
export function incrementExponent(h: ArrayLike<number>, f: ArrayLike<number>): { q: number; qSe: number; sameSign: boolean; sign: number } {
  const n = f.length;
  if (n < 3) throw new RangeError(`incrementExponent needs ≥ 3 levels, got ${n}`);
  const x: number[] = [], y: number[] = [];
  let sign = 0, sameSign = true;
  for (let k = 1; k < n; k++) {
    const d = f[k] - f[k - 1];
    const s = Math.sign(d);
    if (sign === 0) sign = s; else if (s !== sign) sameSign = false;
    // the increment belongs to the finer of its two meshes
    x.push(Math.log(h[k]));
    y.push(Math.log(Math.abs(d) || Number.MIN_VALUE));
  }
  const { slope, slopeSe } = lineFit(x, y);
  return { q: -slope, qSe: slopeSe, sameSign, sign };
}
