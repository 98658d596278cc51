/**
 * Exact mode-I Williams (1952) field for the L-shaped domain [−1, 1]² minus the quadrant
 * x > 0, y < 0 (Williams 1952 mode-I field on the L-shaped test domain):
 * Kolosov–Muskhelishvili potentials φ = z'^λ, ψ = B z'^λ in coordinates turned by −135°.
 */
export const LAMBDA_270 = 0.5444837368;
const ALPHA = (3 * Math.PI) / 2;
const ROT = (3 * Math.PI) / 4;

type C = [number, number];
const mul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
const cpow = (z: C, p: number): C => {
  const r = Math.hypot(z[0], z[1]);
  const t = Math.atan2(z[1], z[0]);
  const m = r ** p;
  return [m * Math.cos(p * t), m * Math.sin(p * t)];
};
const expi = (t: number): C => [Math.cos(t), Math.sin(t)];

/** B/A = −(λ e^{iβ₁} + e^{−iβ₁}) e^{−iβ₂}, β₁ = (λ − 1)α/2, β₂ = (λ + 1)α/2 */
export function williamsB(lambda = LAMBDA_270): C {
  const b1 = ((lambda - 1) * ALPHA) / 2;
  const b2 = ((lambda + 1) * ALPHA) / 2;
  const e1 = expi(b1);
  const inner: C = [lambda * e1[0] + e1[0], lambda * e1[1] - e1[1]];
  const r = mul(inner, expi(-b2));
  return [-r[0], -r[1]];
}

export function williamsStress(x: number, y: number): [number, number, number] {
  const lambda = LAMBDA_270;
  const B = williamsB()[0];
  const zr = mul([x, y], expi(-ROT));
  const zl = cpow(zr, lambda - 1); // z'^(λ−1)
  const zl2 = cpow(zr, lambda - 2);
  const phi1: C = [lambda * zl[0], lambda * zl[1]];
  const phi2: C = [lambda * (lambda - 1) * zl2[0], lambda * (lambda - 1) * zl2[1]];
  const sum = 4 * phi1[0];
  const t = mul([zr[0], -zr[1]], phi2);
  const dif: C = [2 * (t[0] + B * phi1[0]), 2 * (t[1] + B * phi1[1])];
  const sxxL = 0.5 * (sum - dif[0]);
  const syyL = 0.5 * (sum + dif[0]);
  const txyL = 0.5 * dif[1];
  const c = Math.cos(ROT);
  const s = Math.sin(ROT);
  return [
    sxxL * c * c + syyL * s * s - 2 * txyL * s * c,
    sxxL * s * s + syyL * c * c + 2 * txyL * s * c,
    (sxxL - syyL) * s * c + txyL * (c * c - s * s),
  ];
}

/** displacement for shear modulus μ and Kolosov constant κ: 2μ(u' + iv') = κφ − z' conj(φ') − conj(ψ) */
export function williamsDisplacement(x: number, y: number, mu: number, kappa: number): [number, number] {
  const lambda = LAMBDA_270;
  const B = williamsB()[0];
  const zr = mul([x, y], expi(-ROT));
  const phi = cpow(zr, lambda);
  const phi1 = cpow(zr, lambda - 1);
  const zc = mul(zr, [lambda * phi1[0], -lambda * phi1[1]]);
  const ur = (kappa * phi[0] - zc[0] - B * phi[0]) / (2 * mu);
  const vr = (kappa * phi[1] - zc[1] + B * phi[1]) / (2 * mu);
  const c = Math.cos(ROT);
  const s = Math.sin(ROT);
  return [ur * c - vr * s, ur * s + vr * c];
}
