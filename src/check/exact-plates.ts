/**
 * Plates whose whole outer boundary carries the exact displacements of a closed form, written as
 * ordinary `displace` expressions of x and y in the model file (docs/model-format.md). The elasticity
 * problem the FE model discretises then has the closed form as its exact solution — no truncation,
 * no finite-width correction — so a converging site's band must contain the closed form's peak over
 * the site's neighbourhood. Used by `peakwise check` and by the band tests (test/study/bands-real.test.ts).
 *
 * - Kirsch (1898): circular hole in a square, remote tension along x;
 * - Inglis (1913): elliptical hole in the confocal elliptical plate, tension across the long axis
 *   (field from Muskhelishvili's potentials, src/reference/inglis.ts);
 * - Lamé (1852): ring under bore pressure, the outer edge displaced radially.
 */
import { parseModel } from '../model/index.js';
import type { Model, Point } from '../model/types.js';
import { inglisField, kirschCartesian, kolosov, lameRing } from '../reference/index.js';
import { vonMises } from '../recovery/index.js';

export type PlaneStress = (x: number, y: number) => { sxx: number; syy: number; sxy: number };

export interface ExactPlate {
  name: string;
  /** the closed form, for the table's source column */
  source: string;
  model: Model;
  /** the exact stress field (the solution of the model's elasticity problem) */
  stress: PlaneStress;
  /** is (x, y) in the material (outside the hole, inside the outline)? */
  inMaterial(x: number, y: number): boolean;
  /** points on the hole edge, t ∈ [0, 1) once round */
  holeEdge(t: number): Point;
  /** the closed-form peak the concentration is known for (Kt·S) */
  kt: number;
}

const E = 200000, NU = 0.3, S = 100;
/** remote (or bore) stress of the exact plates: a site's value / this is its Kt */
export const EXACT_PLATE_STRESS = S;
const HEAD = `
units: { length: mm, force: N }
material: { E: ${E}, nu: ${NU} }
thickness: 1
state: plane-stress
`;
const num = (v: number) => v.toPrecision(17);

/**
 * Kirsch (1898) plate: hole a = 1 in a square of half-side 4, remote σxx = S = 100 MPa, the exact
 * displacements (Kirsch field, no rigid motion) on the four outer edges. Peak 3S at (0, ±a).
 */
export function kirschPlate(levels: number): ExactPlate {
  const a = 1, half = 4;
  const { mu, kappa } = kolosov(E, NU, 'plane-stress');
  const K = (S * a) / (8 * mu);
  // src/reference/kirsch.ts: u_x = K[(r/a)(κ+1)cos θ + 2(a/r)((1+κ)cos θ + cos 3θ) − 2(a/r)³cos 3θ], u_y likewise
  const r = 'hypot(x, y)', t = 'atan2(y, x)';
  const ux = `K*(${r}*kp*cos(${t}) + 2/${r}*(kp*cos(${t}) + cos(3*${t})) - 2/${r}^3*cos(3*${t}))`;
  const uy = `K*(${r}*km*sin(${t}) + 2/${r}*(k1*sin(${t}) + sin(3*${t})) - 2/${r}^3*sin(3*${t}))`;
  const model = parseModel(HEAD + `
title: Kirsch plate, exact displacements on the outline
params: { K: ${num(K)}, kp: ${num(kappa + 1)}, km: ${num(kappa - 3)}, k1: ${num(1 - kappa)} }
plate:
  outline: { rect: { center: [0, 0], width: ${2 * half}, height: ${2 * half} } }
  openings: [ { id: hole, circle: { center: [0, 0], radius: ${a} } } ]
supports:
  - { where: { outline: true }, displace: { x: "${ux}", y: "${uy}" } }
loads: []
mesh: { size: 1, order: 2, local: [ { near: [0, 0], size: 0.15, radius: 1.5 } ] }
study: { measure: von-mises, levels: ${levels} }
`, 'check-kirsch-exact.yaml');
  return {
    name: 'Kirsch hole, exact displacements',
    source: 'Kirsch 1898 (Z. VDI 42): σθ(a, 90°) = 3S',
    model,
    stress: (x, y) => kirschCartesian(S, a, x, y),
    inMaterial: (x, y) => Math.hypot(x, y) >= a && Math.abs(x) <= half && Math.abs(y) <= half,
    holeEdge: (u) => [a * Math.cos(2 * Math.PI * u), a * Math.sin(2 * Math.PI * u)],
    kt: 3,
  };
}

/** Chebyshev series Σ c_k T_k(X) (or Σ c_k U_k(X)) → monomial coefficients in X. */
function chebyshevToMonomial(c: number[], kind: 'T' | 'U'): number[] {
  const n = c.length;
  const out = new Array<number>(n).fill(0);
  let prev = [1], cur = kind === 'T' ? [0, 1] : [0, 2];
  const add = (p: number[], w: number) => p.forEach((v, j) => { out[j] += w * v; });
  add(prev, c[0]);
  if (n > 1) add(cur, c[1]);
  for (let k = 2; k < n; k++) {
    const next = new Array<number>(k + 1).fill(0);
    cur.forEach((v, j) => { next[j + 1] += 2 * v; });
    prev.forEach((v, j) => { next[j] -= v; });
    add(next, c[k]);
    prev = cur;
    cur = next;
  }
  return out;
}

/** Horner form of Σ m_j x^j over the non-zero parity (odd or even j), e.g. x*(c1 + x^2*(c3 + …)). */
function hornerParity(m: number[], odd: boolean): string {
  const cs: number[] = [];
  for (let j = odd ? 1 : 0; j < m.length; j += 2) cs.push(m[j]);
  let s = num(cs[cs.length - 1]);
  for (let i = cs.length - 2; i >= 0; i--) s = `${num(cs[i])} + x^2*(${s})`;
  return odd ? `x*(${s})` : `(${s})`;
}

/**
 * Inglis (1913) plate: elliptical hole a = 1 (along x, across the load), b = a/ratio, in the plate
 * bounded by the confocal ellipse of semi-axis ≈ 5a, tension S along y. On the outer ellipse
 * x = A cos η, y = B sin η the exact displacement is a short Fourier series in η (the field is a
 * rational function of ζ = ρ e^{iη}), hence a polynomial in x there: u_x = Σ a_k T_k(x/A),
 * u_y = (y/B) Σ b_k U_{k−1}(x/A). Peak Kt·S = (1 + 2a/b)S at (±a, 0).
 */
export function inglisPlate(ratio: number, levels: number): ExactPlate {
  const a = 1, b = a / ratio;
  const R = (a + b) / 2, m = (a - b) / (a + b);
  const rho = 5 / R; // outer semi-axis A = R(ρ + m/ρ) ≈ 5a
  const A = R * (rho + m / rho), B = R * (rho - m / rho);
  const N = 256;
  const ux: number[] = [], uy: number[] = [];
  for (let i = 0; i < N; i++) {
    const eta = (2 * Math.PI * i) / N;
    const f = inglisField(S, a, b, A * Math.cos(eta), B * Math.sin(eta), E, NU);
    ux.push(f.ux); uy.push(f.uy);
  }
  // Fourier coefficients (trapezoid rule, exact for the degrees kept); odd k only by symmetry
  const K = 15;
  const ca = new Array<number>(K + 1).fill(0), cb = new Array<number>(K + 1).fill(0);
  for (let k = 1; k <= K; k += 2) {
    let sa = 0, sb = 0;
    for (let i = 0; i < N; i++) {
      const eta = (2 * Math.PI * i) / N;
      sa += ux[i] * Math.cos(k * eta);
      sb += uy[i] * Math.sin(k * eta);
    }
    ca[k] = (2 * sa) / N;
    cb[k - 1] = (2 * sb) / N; // sin kη = sin η · U_{k−1}(cos η)
  }
  const mx = chebyshevToMonomial(ca, 'T').map((v, j) => v / Math.pow(A, j));
  const my = chebyshevToMonomial(cb, 'U').map((v, j) => v / Math.pow(A, j) / B);
  const exprX = hornerParity(mx, true);
  const exprY = `y*${hornerParity(my, false)}`;
  const model = parseModel(HEAD + `
title: Inglis plate a/b = ${ratio}, exact displacements on the confocal outline
plate:
  outline: { ellipse: { center: [0, 0], a: ${num(A)}, b: ${num(B)}, angle: 0 } }
  openings: [ { id: slot, ellipse: { center: [0, 0], a: ${a}, b: ${num(b)}, angle: 0 } } ]
supports:
  - { where: { outline: true }, displace: { x: "${exprX}", y: "${exprY}" } }
loads: []
mesh: { size: 1, order: 2, local: [ { near: [0, 0], size: ${num(b / 4)}, radius: ${1.3 * a} } ] }
study: { measure: von-mises, levels: ${levels} }
`, `check-inglis-${ratio}-exact.yaml`);
  return {
    name: `Inglis ellipse a/b = ${ratio}, exact displacements`,
    source: `Inglis 1913 (Trans. INA 55): Kt = 1 + 2a/b = ${1 + 2 * ratio}`,
    model,
    stress: (x, y) => inglisField(S, a, b, x, y, E, NU),
    inMaterial: (x, y) => (x / a) ** 2 + (y / b) ** 2 >= 1 && (x / A) ** 2 + (y / B) ** 2 <= 1,
    holeEdge: (u) => [a * Math.cos(2 * Math.PI * u), b * Math.sin(2 * Math.PI * u)],
    kt: 1 + 2 * ratio,
  };
}

/**
 * Lamé (1852) ring a = 1, b = 2 under bore pressure p = S: the pressure through the model's own load,
 * the outer edge displaced by the exact u_r(b). Von Mises on the bore √(σr² − σrσθ + σθ²) = 7/3·p,
 * the same all round: the study looks at the listed site (a, 0).
 */
export function lamePlate(levels: number): ExactPlate {
  const a = 1, b = 2, p = S;
  const ub = lameRing({ a, b, p }, b, E, NU, 'plane-stress').ur;
  const model = parseModel(HEAD + `
title: Lamé ring, bore pressure, exact displacement of the outer edge
params: { ub: ${num(ub)} }
plate:
  outline: { circle: { center: [0, 0], radius: ${b} } }
  openings: [ { id: bore, circle: { center: [0, 0], radius: ${a} } } ]
supports:
  - { where: { outline: true }, displace: { x: "ub*x/${b}", y: "ub*y/${b}" } }
loads:
  - { where: { opening: bore }, pressure: ${p} }
mesh: { size: 0.25, order: 2 }
study: { measure: von-mises, levels: ${levels}, sites: [[${a}, 0]] }
`, 'check-lame-exact.yaml');
  const bore = lameRing({ a, b, p }, a, E, NU, 'plane-stress');
  return {
    name: 'Lamé ring, exact outer displacement',
    source: 'Lamé 1852: σr = A − B/r², σθ = A + B/r²; von Mises on the bore = 7p/3',
    model,
    stress: (x, y) => {
      const rr = Math.hypot(x, y);
      const l = lameRing({ a, b, p }, rr, E, NU, 'plane-stress');
      const c = x / rr, s = y / rr;
      return { sxx: l.sr * c * c + l.st * s * s, syy: l.sr * s * s + l.st * c * c, sxy: (l.sr - l.st) * c * s };
    },
    inMaterial: (x, y) => Math.hypot(x, y) >= a && Math.hypot(x, y) <= b,
    holeEdge: (u) => [a * Math.cos(2 * Math.PI * u), a * Math.sin(2 * Math.PI * u)],
    kt: vonMises(bore.sr, bore.st, 0) / p,
  };
}

/**
 * The exact peak of the von Mises stress over a site's neighbourhood (the disk of `radius` about
 * `at`, in the material): the largest of the closed form over a dense polar grid and over the hole
 * edge inside the disk (where the concentration peaks), to ~1e-7 relative.
 */
export function exactNeighbourhoodPeak(plate: ExactPlate, at: Point, radius: number): number {
  let best = -Infinity;
  const take = (x: number, y: number) => {
    if (Math.hypot(x - at[0], y - at[1]) > radius || !plate.inMaterial(x, y)) return;
    const s = plate.stress(x, y);
    const v = vonMises(s.sxx, s.syy, s.sxy);
    if (v > best) best = v;
  };
  for (let i = 1; i <= 120; i++) {
    for (let j = 0; j < 360; j++) {
      const r = (radius * i) / 120, t = (2 * Math.PI * j) / 360;
      take(at[0] + r * Math.cos(t), at[1] + r * Math.sin(t));
    }
  }
  const M = 40000;
  for (let k = 0; k < M; k++) {
    const [x, y] = plate.holeEdge(k / M);
    // a hair outside the hole so the material test holds on the edge
    take(x * (1 + 1e-12), y * (1 + 1e-12));
  }
  return best;
}
