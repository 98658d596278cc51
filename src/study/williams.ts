import type { Cx } from '../reference/complex.js';
import { cdiv, cmul, csub } from '../reference/complex.js';

/**
 * Corner eigenvalues of a plane elastic wedge.
 * M. L. Williams, "Stress singularities resulting from various boundary conditions in angular corners of
 * plates in extension", J. Appl. Mech. 19 (1952) 526–528. Near the apex u ~ r^λ and σ ~ r^(λ−1); a root with
 * 0 < Re λ < 1 is a stress singularity. The characteristic equations (faces at θ = ±α/2, potentials
 * φ = A z^λ, ψ = B z^λ; the 4 × 4 boundary determinant factored symbolically, our own derivation):
 *
 *   free–free, symmetric:          sin(λα) + λ sin α = 0
 *   free–free, antisymmetric:      sin(λα) − λ sin α = 0     (λ = 1 is a rigid rotation: discarded)
 *   clamped–clamped, symmetric:    κ sin(λα) − λ sin α = 0
 *   clamped–clamped, antisymmetric: κ sin(λα) + λ sin α = 0
 *   free–clamped (no split):       κ² + 1 + 2κ cos(2λα) − 4λ² sin²α = 0
 *
 * λ = 0 is a trivial root of the first four and is discarded.
 */
export type WedgeFaces = 'free-free' | 'free-clamped' | 'clamped-clamped';

export interface WedgeRoot {
  re: number;
  im: number;
}

export interface WilliamsRoots {
  /** real part of the smallest root of the symmetric family (free–free, clamped–clamped) */
  symmetric?: number;
  /** real part of the smallest root of the antisymmetric family */
  antisymmetric?: number;
  /** real part of the smallest root over all families: the governing exponent */
  lambdaMin: number;
  /** the governing root when it is complex (oscillating singularity or oscillating decay) */
  complex?: WedgeRoot;
  /** the full governing roots per family */
  symmetricRoot?: WedgeRoot;
  antisymmetricRoot?: WedgeRoot;
  /** lambdaMin < 1: the stress is infinite at the apex */
  singular: boolean;
}

type Family = 'ff-sym' | 'ff-anti' | 'cc-sym' | 'cc-anti' | 'fc';

interface CharEq {
  f(l: Cx): Cx;
  df(l: Cx): Cx;
  trivial: number[];
}

const csin = (z: Cx): Cx => [Math.sin(z[0]) * Math.cosh(z[1]), Math.cos(z[0]) * Math.sinh(z[1])];
const ccos = (z: Cx): Cx => [Math.cos(z[0]) * Math.cosh(z[1]), -Math.sin(z[0]) * Math.sinh(z[1])];

function characteristic(family: Family, alpha: number, kappa: number): CharEq {
  const sa = Math.sin(alpha);
  switch (family) {
    case 'ff-sym':
    case 'ff-anti':
    case 'cc-sym':
    case 'cc-anti': {
      const k = family.startsWith('cc') ? kappa : 1;
      // sign s of the λ sin α term: + for ff-sym and cc-anti, − for ff-anti and cc-sym
      const s = family === 'ff-sym' || family === 'cc-anti' ? 1 : -1;
      return {
        f: (l) => {
          const v = csin([l[0] * alpha, l[1] * alpha]);
          return [k * v[0] + s * l[0] * sa, k * v[1] + s * l[1] * sa];
        },
        df: (l) => {
          const v = ccos([l[0] * alpha, l[1] * alpha]);
          return [k * alpha * v[0] + s * sa, k * alpha * v[1]];
        },
        trivial: family === 'ff-anti' ? [0, 1] : [0],
      };
    }
    case 'fc': {
      const s2 = sa * sa;
      return {
        f: (l) => {
          const c = ccos([2 * alpha * l[0], 2 * alpha * l[1]]);
          const l2 = cmul(l, l);
          return [kappa * kappa + 1 + 2 * kappa * c[0] - 4 * s2 * l2[0], 2 * kappa * c[1] - 4 * s2 * l2[1]];
        },
        df: (l) => {
          const s = csin([2 * alpha * l[0], 2 * alpha * l[1]]);
          return [-4 * kappa * alpha * s[0] - 8 * s2 * l[0], -4 * kappa * alpha * s[1] - 8 * s2 * l[1]];
        },
        trivial: [],
      };
    }
  }
}

/** f(λ)/Π(λ − t) over the trivial roots, on the real axis (continuous through each trivial root). */
function deflatedReal(eq: CharEq, x: number): number {
  let v = eq.f([x, 0])[0];
  for (const t of eq.trivial) v = Math.abs(x - t) < 1e-12 ? eq.df([x, 0])[0] : v / (x - t);
  return v;
}

/** Brent's method (R. P. Brent, Algorithms for Minimization without Derivatives, 1973, ch. 4) on [a, b]. */
export function brentRoot(g: (x: number) => number, a: number, b: number, tol = 1e-14): number {
  let fa = g(a), fb = g(b);
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (fa * fb > 0) throw new RangeError(`brentRoot: no sign change on [${a}, ${b}]`);
  let c = a, fc = fa, d = b - a, e = d;
  for (let it = 0; it < 200; it++) {
    if (fb * fc > 0) { c = a; fc = fa; d = b - a; e = d; }
    if (Math.abs(fc) < Math.abs(fb)) { a = b; b = c; c = a; fa = fb; fb = fc; fc = fa; }
    const tol1 = 2 * Number.EPSILON * Math.abs(b) + 0.5 * tol;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol1 || fb === 0) return b;
    if (Math.abs(e) >= tol1 && Math.abs(fa) > Math.abs(fb)) {
      let p: number, q: number;
      const s = fb / fa;
      if (a === c) { p = 2 * m * s; q = 1 - s; }
      else {
        const qq = fa / fc, r = fb / fc;
        p = s * (2 * m * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q; else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol1 * q), Math.abs(e * q))) { e = d; d = p / q; }
      else { d = m; e = d; }
    } else { d = m; e = d; }
    a = b; fa = fb;
    b += Math.abs(d) > tol1 ? d : m > 0 ? tol1 : -tol1;
    fb = g(b);
  }
  return b;
}

/**
 * Newton's iteration on f with implicit deflation of the roots already known (Maehly's form:
 * g'/g = f'/f − Σ 1/(λ − r_k)), so every start converges to a new root.
 */
function newtonDeflated(eq: CharEq, start: Cx, known: readonly Cx[]): Cx | undefined {
  let z: Cx = start;
  for (let it = 0; it < 80; it++) {
    const f = eq.f(z);
    const fn = Math.hypot(f[0], f[1]);
    if (!Number.isFinite(fn)) return undefined;
    let ratio = cdiv(eq.df(z), f); // f'/f
    for (const r of known) {
      const d = csub(z, r);
      const dd = d[0] * d[0] + d[1] * d[1];
      if (dd < 1e-28) return undefined;
      ratio = [ratio[0] - d[0] / dd, ratio[1] + d[1] / dd]; // − 1/(z − r)
    }
    const rr = ratio[0] * ratio[0] + ratio[1] * ratio[1];
    if (!(rr > 0)) return undefined;
    const step: Cx = [ratio[0] / rr, -ratio[1] / rr]; // 1/ratio
    z = [z[0] - step[0], z[1] - step[1]];
    if (Math.hypot(step[0], step[1]) < 1e-13 * Math.max(1, Math.hypot(z[0], z[1]))) return polish(eq, z);
  }
  return undefined;
}

/** a few plain Newton steps on the undeflated f */
function polish(eq: CharEq, z0: Cx): Cx {
  let z = z0;
  for (let it = 0; it < 6; it++) {
    const s = cdiv(eq.f(z), eq.df(z));
    if (!Number.isFinite(s[0]) || !Number.isFinite(s[1])) break;
    z = [z[0] - s[0], z[1] - s[1]];
    if (Math.hypot(s[0], s[1]) < 1e-15) break;
  }
  return z;
}

/** All roots of one family with 0 < Re λ ≤ reMax (Im ≥ 0 shown), sorted by real part. */
export function familyRoots(family: Family, alpha: number, kappa: number, reMax: number): WedgeRoot[] {
  const eq = characteristic(family, alpha, kappa);
  const found: Cx[] = [];
  const scale = Math.max(1, Math.PI / alpha);
  // 1) real roots: sign changes of the deflated function on a fine scan, then Brent
  const dx = 0.005 / scale;
  let x0 = 1e-6, g0 = deflatedReal(eq, x0);
  for (let x1 = x0 + dx; x1 <= reMax + dx; x1 += dx) {
    const g1 = deflatedReal(eq, x1);
    if (g0 === 0) found.push([x0, 0]);
    else if (g0 * g1 < 0) found.push([brentRoot((x) => deflatedReal(eq, x), x0, x1), 0]);
    x0 = x1; g0 = g1;
  }
  // 2) complex roots (and tangent real roots the scan cannot see): deflated Newton from a grid of starts
  const known: Cx[] = eq.trivial.map((t): Cx => [t, 0]);
  for (const r of found) known.push(r);
  const imMax = 3 * scale;
  const step = 0.3 * scale;
  for (let re = 0.15 * scale; re <= reMax; re += step) {
    for (let im = 0.1 * scale; im <= imMax; im += step) {
      const z = newtonDeflated(eq, [re, im], known);
      if (!z) continue;
      if (!(z[0] > 1e-9) || z[0] > 2 * reMax) continue;
      const zz: Cx = Math.abs(z[1]) < 1e-9 ? [z[0], 0] : [z[0], Math.abs(z[1])];
      if (known.some((k) => Math.hypot(k[0] - zz[0], k[1] - zz[1]) < 1e-8)) continue;
      if (eq.trivial.some((t) => Math.hypot(zz[0] - t, zz[1]) < 1e-7)) continue;
      found.push(zz);
      known.push(zz);
      if (zz[1] !== 0) known.push([zz[0], -zz[1]]);
      if (known.length > 80) break;
    }
  }
  return found
    .filter((z) => z[0] > 1e-9 && z[0] <= reMax && !eq.trivial.some((t) => Math.hypot(z[0] - t, z[1]) < 1e-7))
    .map((z) => ({ re: z[0], im: z[1] }))
    .sort((a, b) => a.re - b.re || a.im - b.im);
}

/**
 * Smallest Williams (1952) eigenvalues (Re λ > 0) of a wedge of interior (material) angle `alphaDeg`.
 * `kappa` is the Kolosov constant (only the clamped families depend on it).
 */
export function williamsRoots(alphaDeg: number, faces: WedgeFaces = 'free-free', kappa = (3 - 0.3) / 1.3): WilliamsRoots {
  // a pure function of its three arguments and some 10 ms of root finding a call: a study asks for the same
  // wedge at several sites and levels, a sweep or a watch at every point and rerun (String(x) is exact)
  const key = `${String(alphaDeg)}|${faces}|${String(kappa)}`;
  const known = rootsMemo.get(key);
  if (known) return structuredClone(known);
  const roots = computeWilliamsRoots(alphaDeg, faces, kappa);
  if (rootsMemo.size >= ROOTS_MEMO_SIZE) rootsMemo.delete(rootsMemo.keys().next().value as string);
  rootsMemo.set(key, roots);
  return structuredClone(roots);
}

/** Wedges remembered by williamsRoots (the oldest goes first beyond this many). */
const ROOTS_MEMO_SIZE = 256;
const rootsMemo = new Map<string, WilliamsRoots>();

function computeWilliamsRoots(alphaDeg: number, faces: WedgeFaces, kappa: number): WilliamsRoots {
  if (!(alphaDeg > 0 && alphaDeg <= 360)) throw new RangeError(`wedge angle must be in (0°, 360°], got ${alphaDeg}°`);
  if (!(kappa >= 1 && kappa <= 3)) throw new RangeError(`Kolosov constant κ must be in [1, 3], got ${kappa}`);
  const alpha = (alphaDeg * Math.PI) / 180;
  const reMax = Math.max(6, 10 / alpha);
  const first = (family: Family): WedgeRoot | undefined => familyRoots(family, alpha, kappa, reMax)[0];
  if (faces === 'free-clamped') {
    const r = first('fc');
    if (!r) throw new RangeError(`no free–clamped Williams root found below Re λ = ${reMax} at ${alphaDeg}°`);
    return { lambdaMin: r.re, ...(r.im !== 0 ? { complex: r } : {}), singular: r.re < 1 - 1e-9 };
  }
  const sym = first(faces === 'free-free' ? 'ff-sym' : 'cc-sym');
  const anti = first(faces === 'free-free' ? 'ff-anti' : 'cc-anti');
  const cands = [sym, anti].filter((r): r is WedgeRoot => r !== undefined);
  if (cands.length === 0) throw new RangeError(`no Williams root found below Re λ = ${reMax} at ${alphaDeg}°`);
  const gov = cands.reduce((a, b) => (b.re < a.re ? b : a));
  return {
    ...(sym ? { symmetric: sym.re, symmetricRoot: sym } : {}),
    ...(anti ? { antisymmetric: anti.re, antisymmetricRoot: anti } : {}),
    lambdaMin: gov.re,
    ...(gov.im !== 0 ? { complex: gov } : {}),
    singular: gov.re < 1 - 1e-9,
  };
}

/**
 * Kolosov constant: (3 − ν)/(1 + ν) in plane stress, 3 − 4ν in plane strain. An axisymmetric
 * section takes the plane-strain value: near a corner off the axis, at distances ρ ≪ r from it,
 * the hoop strain u_r/r is bounded while the in-plane strains grow like ρ^(λ−1), so the corner
 * field is the plane-strain wedge field (docs/study.md, "Axisymmetric sections").
 */
export function kolosovKappa(nu: number, state: 'plane-stress' | 'plane-strain' | 'axisymmetric'): number {
  return state === 'plane-stress' ? (3 - nu) / (1 + nu) : 3 - 4 * nu;
}
