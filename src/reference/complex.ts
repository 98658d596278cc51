/** Minimal complex arithmetic on [re, im] pairs for the Kolosov–Muskhelishvili fields. */
export type Cx = readonly [number, number];

export const cx = (re: number, im = 0): Cx => [re, im];
export const cadd = (a: Cx, b: Cx): Cx => [a[0] + b[0], a[1] + b[1]];
export const csub = (a: Cx, b: Cx): Cx => [a[0] - b[0], a[1] - b[1]];
export const cmul = (a: Cx, b: Cx): Cx => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
export const cscale = (a: Cx, s: number): Cx => [a[0] * s, a[1] * s];
export const cconj = (a: Cx): Cx => [a[0], -a[1]];
export function cdiv(a: Cx, b: Cx): Cx {
  const d = b[0] * b[0] + b[1] * b[1];
  return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
}
/** e^{iθ} */
export const cexpi = (theta: number): Cx => [Math.cos(theta), Math.sin(theta)];
/** principal branch z^p for real p (cut along the negative real axis) */
export function cpow(z: Cx, p: number): Cx {
  const r = Math.hypot(z[0], z[1]);
  if (r === 0) return [0, 0];
  const t = Math.atan2(z[1], z[0]);
  const m = Math.pow(r, p);
  return [m * Math.cos(p * t), m * Math.sin(p * t)];
}
