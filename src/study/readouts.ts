/**
 * Mesh-independent readouts for singular sites: stress at a distance, averaged stress, generalised notch
 * stress intensity, and weld hot-spot extrapolation. All take the stress as a function of the distance r
 * from the site (sampled from a recovered FE field by the caller) or as sampled values.
 */

/**
 * Double-exponential (tanh-sinh) quadrature of f over [a, b]; exact to about 1e−14 for integrands with
 * integrable end-point singularities such as r^(λ−1). H. Takahasi & M. Mori, "Double exponential formulas for
 * numerical integration", Publ. RIMS Kyoto Univ. 9 (1974) 721–741.
 */
export function tanhSinh(f: (x: number) => number, a: number, b: number, levels = 7): number {
  const c = (a + b) / 2, hw = (b - a) / 2;
  let h = 1;
  const term = (t: number) => {
    const u = (Math.PI / 2) * Math.sinh(t);
    const cu = Math.cosh(u);
    const w = ((Math.PI / 2) * Math.cosh(t)) / (cu * cu);
    const x = Math.tanh(u);
    // distance to the nearer end computed without cancellation: 1 − tanh u = 2/(e^{2u} + 1)
    const dEnd = 1 / (Math.exp(2 * Math.abs(u)) + 1) * 2;
    if (dEnd * hw === 0) return 0;
    const xa = x > 0 ? b - hw * dEnd : a + hw * dEnd;
    const v = f(xa);
    return Number.isFinite(v) ? w * v : 0;
  };
  // t up to 4.5 (u ≈ 70): an r^(λ−1) end singularity decays like e^{−2uλ}, negligible there for λ ≥ 0.25
  const tMax = 4.5;
  let sum = term(0);
  for (let t = h; t <= tMax; t += h) sum += term(t) + term(-t);
  let est = sum * h;
  for (let l = 1; l <= levels; l++) {
    h /= 2;
    for (let t = h; t <= tMax; t += 2 * h) sum += term(t) + term(-t);
    const next = sum * h;
    if (Math.abs(next - est) <= 1e-15 * Math.abs(next)) return next * hw;
    est = next;
  }
  return est * hw;
}

/** Critical distance L = (1/π)(K_c/σ₀)² (Taylor 2007; for fatigue use ΔK_th and Δσ₀). */
export function criticalDistance(toughness: number, strength: number): number {
  return (toughness / strength) ** 2 / Math.PI;
}

/**
 * Point method of the theory of critical distances: the stress at r = L/2 from the notch root.
 * D. Taylor, The Theory of Critical Distances: A New Perspective in Fracture Mechanics, Elsevier (2007).
 */
export function pointMethod(sigmaAt: (r: number) => number, L: number): number {
  return sigmaAt(L / 2);
}

/** Line method (Taylor 2007): the mean of the stress over 0 ≤ r ≤ 2L. */
export function lineMethod(sigmaAt: (r: number) => number, L: number): number {
  return lineAverage(sigmaAt, 2 * L);
}

/** Mean of σ(r) over 0 ≤ r ≤ length (tanh-sinh, so an r^(λ−1) singularity at r = 0 is fine). */
export function lineAverage(sigmaAt: (r: number) => number, length: number): number {
  return tanhSinh(sigmaAt, 0, length) / length;
}

/** Mean of sampled values over [0, R] by the trapezoidal rule (for FE samples that stay finite at r = 0). */
export function sampledAverage(r: ArrayLike<number>, sigma: ArrayLike<number>): number {
  let s = 0;
  for (let i = 1; i < r.length; i++) s += 0.5 * (sigma[i] + sigma[i - 1]) * (r[i] - r[i - 1]);
  return s / (r[r.length - 1] - r[0]);
}

/**
 * Generalised notch stress intensity K = lim_{r→0} √(2π) r^(1−λ) σ_θθ(r, 0) on the bisector.
 * J. B. Gross & A. Mendelson, "Plane elastostatic analysis of V-notched plates", Int. J. Fracture Mech. 8
 * (1972) 267–276. For λ = 1/2 it is the crack-tip K_I. The samples σ(r_i) are turned into
 * K(r_i) = √(2π) r_i^(1−λ) σ(r_i) and extrapolated to r = 0 by a least-squares line in r (the next term of the
 * expansion adds O(r^(λ₂−λ₁)) which the line absorbs over a short range).
 * Units: stress·length^(1−λ).
 */
export function notchStressIntensity(
  r: ArrayLike<number>, sigma: ArrayLike<number>, lambda: number,
): { K: number; Kmean: number; spread: number } {
  const n = r.length;
  if (n < 2) throw new RangeError(`notch stress intensity needs ≥ 2 samples, got ${n}`);
  const ks: number[] = [];
  for (let i = 0; i < n; i++) ks.push(Math.sqrt(2 * Math.PI) * Math.pow(r[i], 1 - lambda) * sigma[i]);
  let mr = 0, mk = 0;
  for (let i = 0; i < n; i++) { mr += r[i]; mk += ks[i]; }
  mr /= n; mk /= n;
  let srr = 0, srk = 0;
  for (let i = 0; i < n; i++) { srr += (r[i] - mr) ** 2; srk += (r[i] - mr) * (ks[i] - mk); }
  const slope = srr > 0 ? srk / srr : 0;
  const K = mk - slope * mr;
  const spread = Math.max(...ks) - Math.min(...ks);
  return { K, Kmean: mk, spread };
}

/** Units of the notch stress intensity: stress·length^(1−λ), e.g. "MPa·mm^0.455". */
export function nsifUnits(stress: string, length: string, lambda: number): string {
  return `${stress}·${length}^${(1 - lambda).toFixed(3)}`;
}

/** Lagrange extrapolation of the values y at the read-out points x to x = 0. */
export function extrapolateToZero(x: readonly number[], y: readonly number[]): number {
  if (x.length !== y.length || x.length < 1) throw new RangeError('extrapolateToZero: need matching, non-empty x and y');
  let s = 0;
  for (let j = 0; j < x.length; j++) {
    let w = 1;
    for (let k = 0; k < x.length; k++) if (k !== j) w *= (0 - x[k]) / (x[j] - x[k]);
    s += w * y[j];
  }
  return s;
}

/**
 * Structural hot-spot stress, weld toe on a plate surface (type "a"), linear rule through the read-out points
 * 0.4t and 1.0t: exact weights 5/3 and −2/3; the rounded 1.67/−0.67 of the IIW text with `rounded`.
 * A. Hobbacher, Recommendations for Fatigue Design of Welded Joints and Components, IIW-2259-15 (2016)
 * [from memory for the coefficients; the exact weights are the Lagrange extrapolation].
 */
export function hotSpotLinear(s04t: number, s10t: number, rounded = false): number {
  return rounded ? 1.67 * s04t - 0.67 * s10t : (5 / 3) * s04t - (2 / 3) * s10t;
}

/** Hot-spot stress, quadratic rule through 0.4t, 0.9t, 1.4t: 2.52 σ₀.₄ − 2.24 σ₀.₉ + 0.72 σ₁.₄ (Hobbacher 2016). */
export function hotSpotQuadratic(s04t: number, s09t: number, s14t: number): number {
  return 2.52 * s04t - 2.24 * s09t + 0.72 * s14t;
}

/** Hot-spot stress, toe on a plate edge (type "b"), quadratic rule through 4, 8, 12 mm: 3σ₄ − 3σ₈ + σ₁₂ (Hobbacher 2016). */
export function hotSpotTypeB(s4: number, s8: number, s12: number): number {
  return 3 * s4 - 3 * s8 + s12;
}

/** Read-out distances of the hot-spot rules for a plate of thickness t. */
export function hotSpotPoints(rule: 'linear' | 'quadratic' | 'type-b', t: number): number[] {
  return rule === 'linear' ? [0.4 * t, 1.0 * t] : rule === 'quadratic' ? [0.4 * t, 0.9 * t, 1.4 * t] : [4, 8, 12];
}
