/**
 * The uncertainty band of a converging peak from a refinement ladder, by least-squares fits over
 * four or more levels:
 *
 *   L. Eça & M. Hoekstra, "A procedure for the estimation of the numerical uncertainty of CFD
 *   calculations based on grid refinement studies", J. Comput. Phys. 262 (2014) 104–130.
 *
 * Their procedure fits the error expansion φᵢ = φ₀ + α hᵢ^p (p free), and the fixed-order forms
 * φ₀ + α h, φ₀ + α h², φ₀ + α₁ h + α₂ h², each by ordinary and by weighted least squares (weights
 * ∝ 1/hᵢ, the finer levels count more), keeps the fit of smallest standard deviation U_s, and
 * takes the band of the finest value φ₁ as
 *
 *   U = F_s ε + U_s + |φ₁ − φ_fit(h₁)|                         when U_s < Δφ,
 *   U = 3 (U_s/Δφ) (ε + U_s + |φ₁ − φ_fit(h₁)|)                otherwise,
 *
 * with ε = |φ_fit(h₁) − φ₀| the fitted error of the finest level, Δφ = (φ_max − φ_min)/(n − 1)
 * the data range per step, and F_s = 1.25 only when the observed order lies in their "good" range
 * (0.5 ≤ p < 2.1 for a second-order quantity) and U_s < Δφ, F_s = 3 otherwise — their refinement of
 * Roache's rule (P. J. Roache, Verification and Validation in Computational Science and Engineering,
 * Hermosa 1998: F_s = 1.25 with three or more grids and a verified order, 3 with two grids or an
 * assumed one).
 *
 * Our choices (docs/study.md, "Bands"): the order used in the band is capped at the element's formal
 * order for stresses p_f (CST 1, LST 2): a fitted p > p_f is replaced by the fixed-order fits, so a
 * lucky small last step cannot buy a narrow band; the good range and the fixed orders are scaled
 * with p_f (good: p_f/4 ≤ p < 1.05·p_f; fixed orders p_f/2, p_f and both together); the band is never
 * narrower than the spread of the finest three levels' values.
 */
import { Matrix, solve } from 'ml-matrix';

export type FitForm = 'free' | 'fixed' | 'two-term';

/** One least-squares fit of the error expansion over the levels of a ladder. */
export interface LevelFit {
  form: FitForm;
  weighted: boolean;
  /** exponents of the error terms: [p] (free or fixed) or [p₁, p₂] (two-term) */
  orders: number[];
  /** extrapolated value φ₀ (h → 0) */
  limit: number;
  /** fitted values at the levels, coarse → fine */
  fitted: Float64Array;
  /** standard deviation of the fit U_s (NaN when the fit has no degree of freedom left) */
  scatter: number;
}

export interface BandEstimate {
  /** φ₀ of the selected fit (judgeSite centres the band on it when the free fit is good, else on φ₁) */
  value: number;
  /** half-width U: the band value ± U must contain the exact value */
  halfWidth: number;
  /** parts of U: F_s ε + |φ₁ − φ_fit(h₁)| (raised to the floor if that binds) and U_s */
  components: { discretisation: number; scatter: number };
  /** order of the free fit (NaN when it could not be fitted) */
  observedOrder: number;
  /** order(s) of the fit behind the band */
  orderUsed: number[];
  safetyFactor: number;
  fit: LevelFit;
  /** the spread of the finest three values, the smallest half-width allowed */
  floor: number;
  floored: boolean;
  /** the observed order lies in the good range and the scatter is small against the data range */
  good: boolean;
  /** levels used (the finest `levels` of the ladder) */
  levels: number;
}

/** Tunables of the band, in the paper's terms (scaled by the formal order p_f). */
export const BAND_RULES = {
  /** good range of the observed order, as fractions of p_f: Eça & Hoekstra's 0.5 ≤ p < 2.1 for p_f = 2 */
  goodOrderLow: 0.25,
  goodOrderHigh: 1.05,
  /** Eça & Hoekstra (2014) safety factors; Roache (1998) 1.25 / 3 */
  safetyGood: 1.25,
  safetyPoor: 3,
  /** range scanned for the free order */
  orderSearch: [0.05, 8] as const,
  /** finest levels entering the fits */
  window: 4,
  /**
   * The far-field term: the finest level solved again with everything outside the sites' refined
   * cores (background and graded transition, the same on every level) coarsened by `coarsening`
   * (far-field.ts); the change Δ of the peak gives the error of the ladder's own outer mesh by
   * two-grid Richardson with the formal order, Δ/(c^p_f − 1), times Roache's (1998) two-grid safety
   * factor `safety`.
   */
  farField: { coarsening: 2, safety: 3 },
} as const;

const sq = (v: number) => v * v;

/**
 * Weighted linear least squares y ≈ Σ c_j col_j with weights w (Σw = 1 not needed). Two columns in
 * closed form (the 1-D order search calls this a few hundred times), more through ml-matrix's QR.
 */
function linearFit(cols: Float64Array[], y: ArrayLike<number>, w: ArrayLike<number>): number[] {
  const n = y.length;
  if (cols.length === 2) {
    let s00 = 0, s01 = 0, s11 = 0, b0 = 0, b1 = 0;
    for (let i = 0; i < n; i++) {
      const a = cols[0][i], b = cols[1][i];
      s00 += w[i] * a * a; s01 += w[i] * a * b; s11 += w[i] * b * b;
      b0 += w[i] * a * y[i]; b1 += w[i] * b * y[i];
    }
    const det = s00 * s11 - s01 * s01;
    return [(b0 * s11 - b1 * s01) / det, (s00 * b1 - s01 * b0) / det];
  }
  const A = new Matrix(n, cols.length);
  const b = new Matrix(n, 1);
  for (let i = 0; i < n; i++) {
    const sw = Math.sqrt(w[i]);
    for (let j = 0; j < cols.length; j++) A.set(i, j, sw * cols[j][i]);
    b.set(i, 0, sw * y[i]);
  }
  return solve(A, b, true).to1DArray();
}

/** Eça & Hoekstra (2014) weights: ∝ 1/hᵢ, normalised to sum 1; or all equal. */
function fitWeights(h: readonly number[], weighted: boolean): Float64Array {
  const w = new Float64Array(h.length);
  let s = 0;
  for (let i = 0; i < h.length; i++) { w[i] = weighted ? 1 / h[i] : 1; s += w[i]; }
  for (let i = 0; i < h.length; i++) w[i] /= s;
  return w;
}

/**
 * Standard deviation of a fit with `params` parameters (Eça & Hoekstra 2014):
 * unweighted √(Σ rᵢ²/(n − n_p)), weighted √(n Σ wᵢ rᵢ² / ((n − n_p) Σ wᵢ)).
 */
function fitScatter(f: readonly number[], fitted: Float64Array, w: Float64Array, params: number): number {
  const n = f.length;
  if (n <= params) return NaN;
  let s = 0;
  for (let i = 0; i < n; i++) s += w[i] * sq(f[i] - fitted[i]);
  // w sums to 1: n·Σwr² is Σr² for equal weights
  return Math.sqrt((n * s) / (n - params));
}

/** Fit φ₀ + Σ α_j (h/h_finest)^{p_j} with the exponents given. */
export function fixedOrderFit(h: readonly number[], f: readonly number[], orders: readonly number[], weighted: boolean): LevelFit {
  const n = f.length;
  const hf = h[n - 1];
  const w = fitWeights(h, weighted);
  const cols = [new Float64Array(n).fill(1), ...orders.map((p) => Float64Array.from(h, (v) => Math.pow(v / hf, p)))];
  const c = linearFit(cols, f, w);
  const fitted = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let v = c[0];
    for (let j = 0; j < orders.length; j++) v += c[j + 1] * cols[j + 1][i];
    fitted[i] = v;
  }
  const form: FitForm = orders.length === 2 ? 'two-term' : 'fixed';
  return { form, weighted, orders: [...orders], limit: c[0], fitted, scatter: fitScatter(f, fitted, w, orders.length + 1) };
}

/**
 * Fit φ₀ + α h^p with p free: a scan of p over BAND_RULES.orderSearch (log-spaced) and a golden-section
 * refinement of the best bracket, with linear least squares for φ₀ and α at each p.
 */
export function freeOrderFit(h: readonly number[], f: readonly number[], weighted: boolean): LevelFit {
  const n = f.length;
  const w = fitWeights(h, weighted);
  const hf = h[n - 1];
  const ones = new Float64Array(n).fill(1);
  const x = new Float64Array(n);
  const residual = (p: number): number => {
    for (let i = 0; i < n; i++) x[i] = Math.pow(h[i] / hf, p);
    const [a, b] = linearFit([ones, x], f, w);
    let s = 0;
    for (let i = 0; i < n; i++) s += w[i] * sq(f[i] - a - b * x[i]);
    return s;
  };
  const [pLo, pHi] = BAND_RULES.orderSearch;
  const N = 64;
  const grid = Array.from({ length: N + 1 }, (_, k) => pLo * Math.pow(pHi / pLo, k / N));
  const vals = grid.map(residual);
  let k = 0;
  for (let i = 1; i <= N; i++) if (vals[i] < vals[k]) k = i;
  let a = grid[Math.max(0, k - 1)], b = grid[Math.min(N, k + 1)];
  const g = (Math.sqrt(5) - 1) / 2;
  let c = b - g * (b - a), d = a + g * (b - a);
  let fc = residual(c), fd = residual(d);
  for (let it = 0; it < 60 && b - a > 1e-10 * b; it++) {
    if (fc < fd) { b = d; d = c; fd = fc; c = b - g * (b - a); fc = residual(c); }
    else { a = c; c = d; fc = fd; d = a + g * (b - a); fd = residual(d); }
  }
  const p = fc < fd ? c : d;
  const fit = fixedOrderFit(h, f, [p], weighted);
  return { ...fit, form: 'free', scatter: fitScatter(f, fit.fitted, w, 3) };
}

/** The fit of smallest standard deviation (NaN scatter ranks last). */
function best(fits: LevelFit[]): LevelFit {
  const key = (s: number) => (Number.isFinite(s) ? s : Infinity);
  return fits.reduce((m, q) => (key(q.scatter) < key(m.scatter) ? q : m));
}

/** Largest difference among the finest three values (the band's floor). */
export function finestSpread(f: readonly number[]): number {
  const t = f.slice(-3);
  return Math.max(...t) - Math.min(...t);
}

/**
 * The band of the finest values of a ladder (n ≥ 4 levels; coarse → fine) for a quantity whose
 * formal order is `formalOrder`, by Eça & Hoekstra (2014) with the choices of the module comment.
 * Only the finest BAND_RULES.window levels enter the fits.
 */
export function ecaHoekstraBand(hAll: readonly number[], fAll: readonly number[], formalOrder: number): BandEstimate {
  if (fAll.length < 4 || hAll.length !== fAll.length) throw new RangeError(`the least-squares band needs ≥ 4 levels with sizes, got ${fAll.length} and ${hAll.length}`);
  const m = Math.min(fAll.length, BAND_RULES.window);
  const h = hAll.slice(-m), f = fAll.slice(-m);
  const n = f.length;
  const free = best([freeOrderFit(h, f, false), freeOrderFit(h, f, true)]);
  const p = free.orders[0];
  const good = p >= BAND_RULES.goodOrderLow * formalOrder && p < BAND_RULES.goodOrderHigh * formalOrder;
  let fit = free;
  if (!(good && p <= formalOrder)) {
    // outside the range, or faster than the element can guarantee: the fixed-order fits
    const lo = formalOrder / 2, hi = formalOrder;
    const cands: LevelFit[] = [];
    for (const weighted of [false, true]) {
      cands.push(fixedOrderFit(h, f, [lo], weighted), fixedOrderFit(h, f, [hi], weighted), fixedOrderFit(h, f, [lo, hi], weighted));
    }
    fit = best(cands);
  }
  const range = (Math.max(...f) - Math.min(...f)) / (n - 1);
  const us = Number.isFinite(fit.scatter) ? fit.scatter : 0;
  const smallScatter = us < range;
  const safetyFactor = good && smallScatter ? BAND_RULES.safetyGood : BAND_RULES.safetyPoor;
  const f1 = f[n - 1], fit1 = fit.fitted[n - 1];
  const eps = Math.abs(fit1 - fit.limit);
  const off = Math.abs(f1 - fit1);
  let discretisation: number, scatter: number;
  if (smallScatter || range === 0) {
    discretisation = safetyFactor * eps + off;
    scatter = us;
  } else {
    const k = (BAND_RULES.safetyPoor * us) / range;
    discretisation = k * (eps + off);
    scatter = k * us;
  }
  const floor = finestSpread(f);
  const floored = discretisation + scatter < floor;
  if (floored) discretisation = floor - scatter;
  return {
    value: fit.limit,
    halfWidth: discretisation + scatter,
    components: { discretisation, scatter },
    // a flat ladder has no order
    observedOrder: range === 0 ? NaN : p,
    orderUsed: fit.orders,
    safetyFactor,
    fit,
    floor,
    floored,
    good: good && smallScatter,
    levels: n,
  };
}

/**
 * Far-field half-width from the change Δ of the finest peak when the mesh outside the refined cores is
 * coarsened by c = BAND_RULES.farField.coarsening: F_s |Δ| / (c^p_f − 1), Richardson's two-grid error
 * of the finer (the ladder's own) outer mesh with the formal order p_f, F_s = 3 for a two-grid estimate
 * with an assumed order (Roache 1998).
 */
export function farFieldHalfWidth(shift: number, formalOrder: number): number {
  const { coarsening, safety } = BAND_RULES.farField;
  return (safety * Math.abs(shift)) / (Math.pow(coarsening, formalOrder) - 1);
}
