/**
 * Evaluation of the exact boundary curves: points, tangents, lengths, curvature, closest points,
 * bounding boxes. Parameter t runs over [0, 1]; at t = 0 and t = 1 every function returns the
 * curve's stored end points bitwise, so the junctions shared by neighbouring pieces stay exact.
 */
import type { Point } from '../model/types.js';
import type { Curve } from './types.js';

const TWO_PI = 2 * Math.PI;

/** Start point of a curve (the stored junction point where there is one). */
export function curveStart(c: Curve): Point {
  if (c.kind === 'line') return [c.from[0], c.from[1]];
  if (c.from) return [c.from[0], c.from[1]];
  return evalCurve(c, 0);
}

/** End point of a curve (the stored junction point where there is one). */
export function curveEnd(c: Curve): Point {
  if (c.kind === 'line') return [c.to[0], c.to[1]];
  if (c.to) return [c.to[0], c.to[1]];
  return evalCurve(c, 1);
}

function evalCurve(c: Curve, t: number): Point {
  switch (c.kind) {
    case 'line':
      return [c.from[0] + t * (c.to[0] - c.from[0]), c.from[1] + t * (c.to[1] - c.from[1])];
    case 'arc': {
      const phi = c.startAngle + t * c.sweep;
      return [c.center[0] + c.radius * Math.cos(phi), c.center[1] + c.radius * Math.sin(phi)];
    }
    case 'ellipse-arc': {
      const phi = c.startParam + t * c.sweep;
      const u = c.a * Math.cos(phi);
      const v = c.b * Math.sin(phi);
      const cr = Math.cos(c.rotation);
      const sr = Math.sin(c.rotation);
      return [c.center[0] + cr * u - sr * v, c.center[1] + sr * u + cr * v];
    }
  }
}

/** Point at parameter t ∈ [0, 1]. */
export function curvePoint(c: Curve, t: number): Point {
  if (t === 0) return curveStart(c);
  if (t === 1) return curveEnd(c);
  return evalCurve(c, t);
}

/** dP/dt (not normalised). */
export function curveDerivative(c: Curve, t: number): Point {
  switch (c.kind) {
    case 'line':
      return [c.to[0] - c.from[0], c.to[1] - c.from[1]];
    case 'arc': {
      const phi = c.startAngle + t * c.sweep;
      const k = c.radius * c.sweep;
      return [-k * Math.sin(phi), k * Math.cos(phi)];
    }
    case 'ellipse-arc': {
      const phi = c.startParam + t * c.sweep;
      const du = -c.a * Math.sin(phi) * c.sweep;
      const dv = c.b * Math.cos(phi) * c.sweep;
      const cr = Math.cos(c.rotation);
      const sr = Math.sin(c.rotation);
      return [cr * du - sr * dv, sr * du + cr * dv];
    }
  }
}

/** Unit tangent at t, in the direction of travel. */
export function curveTangent(c: Curve, t: number): Point {
  const d = curveDerivative(c, t);
  const len = Math.hypot(d[0], d[1]);
  return len > 0 ? [d[0] / len, d[1] / len] : [1, 0];
}

/**
 * Unit outward normal at t: material lies on the left of travel, so the outward normal is the
 * tangent turned clockwise by 90°.
 */
export function curveOutwardNormal(c: Curve, t: number): Point {
  const [tx, ty] = curveTangent(c, t);
  return [ty, -tx];
}

/** |dP/dt| of an ellipse arc at local parameter φ. */
function ellipseSpeed(a: number, b: number, sweep: number, phi: number): number {
  const s = Math.sin(phi);
  const co = Math.cos(phi);
  return Math.abs(sweep) * Math.sqrt(a * a * s * s + b * b * co * co);
}

// Gauss–Legendre nodes and weights on [-1, 1], computed once by Newton's method on P_n
// (Golub & Welsch would do as well; for n = 10 the classical Newton iteration is exact to rounding).
const GL_N = 10;
const GL_X = new Float64Array(GL_N);
const GL_W = new Float64Array(GL_N);
(function initGaussLegendre(): void {
  for (let i = 0; i < GL_N; i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (GL_N + 0.5));
    let dp = 0;
    for (let it = 0; it < 100; it++) {
      let p0 = 1;
      let p1 = x;
      for (let k = 2; k <= GL_N; k++) {
        const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      dp = (GL_N * (x * p1 - p0)) / (x * x - 1);
      const dx = p1 / dp;
      x -= dx;
      if (Math.abs(dx) < 1e-16) break;
    }
    GL_X[i] = x;
    GL_W[i] = 2 / ((1 - x * x) * dp * dp);
  }
})();

function gaussLegendre(f: (x: number) => number, lo: number, hi: number): number {
  const mid = 0.5 * (lo + hi);
  const half = 0.5 * (hi - lo);
  let sum = 0;
  for (let i = 0; i < GL_N; i++) sum += GL_W[i] * f(mid + half * GL_X[i]);
  return sum * half;
}

/** Adaptive Gauss–Legendre: halve a panel until two halves agree with the whole to `relTol`. */
function adaptiveIntegral(f: (x: number) => number, lo: number, hi: number, whole: number, relTol: number, depth: number): number {
  const mid = 0.5 * (lo + hi);
  const left = gaussLegendre(f, lo, mid);
  const right = gaussLegendre(f, mid, hi);
  const both = left + right;
  if (depth <= 0 || Math.abs(both - whole) <= relTol * Math.abs(both)) return both;
  return (
    adaptiveIntegral(f, lo, mid, left, relTol, depth - 1) + adaptiveIntegral(f, mid, hi, right, relTol, depth - 1)
  );
}

/** Arc length of an ellipse arc between local parameters t0 < t1 (fractions of the curve). */
function ellipseArcLength(c: Extract<Curve, { kind: 'ellipse-arc' }>, t0: number, t1: number): number {
  if (t1 <= t0) return 0;
  const f = (t: number): number => ellipseSpeed(c.a, c.b, c.sweep, c.startParam + t * c.sweep);
  // panels of at most 1/8 turn, then adapt: the integrand is analytic but sharply curved near the
  // ends of the major axis of a slender ellipse
  const panels = Math.max(1, Math.ceil((Math.abs(c.sweep) * (t1 - t0)) / (Math.PI / 4)));
  let sum = 0;
  for (let k = 0; k < panels; k++) {
    const lo = t0 + ((t1 - t0) * k) / panels;
    const hi = t0 + ((t1 - t0) * (k + 1)) / panels;
    sum += adaptiveIntegral(f, lo, hi, gaussLegendre(f, lo, hi), 1e-15, 30);
  }
  return sum;
}

/** Length of the curve (ellipse arcs by adaptive Gauss–Legendre quadrature). */
export function curveLength(c: Curve): number {
  switch (c.kind) {
    case 'line':
      return Math.hypot(c.to[0] - c.from[0], c.to[1] - c.from[1]);
    case 'arc':
      return c.radius * Math.abs(c.sweep);
    case 'ellipse-arc':
      return ellipseArcLength(c, 0, 1);
  }
}

/** Length of the part of the curve between parameters t0 ≤ t1. */
export function curveLengthBetween(c: Curve, t0: number, t1: number): number {
  if (c.kind === 'ellipse-arc') return ellipseArcLength(c, t0, t1);
  return curveLength(c) * (t1 - t0);
}

/**
 * Parameter t at which the arc length from the start equals `s` (clamped to [0, length]); the
 * mesher uses it to space nodes evenly along ellipse arcs.
 */
export function curveParamAtLength(c: Curve, s: number): number {
  const total = curveLength(c);
  if (!(total > 0)) return 0;
  if (s <= 0) return 0;
  if (s >= total) return 1;
  if (c.kind !== 'ellipse-arc') return s / total;
  // Newton on L(t) − s with bisection safeguard; L is monotone with derivative |dP/dt|
  let lo = 0;
  let hi = 1;
  let t = s / total;
  for (let it = 0; it < 60; it++) {
    const g = ellipseArcLength(c, 0, t) - s;
    if (g > 0) hi = t;
    else lo = t;
    if (Math.abs(g) <= 1e-14 * total) break;
    const speed = ellipseSpeed(c.a, c.b, c.sweep, c.startParam + t * c.sweep);
    let next = speed > 0 ? t - g / speed : 0.5 * (lo + hi);
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    t = next;
    if (hi - lo < 1e-16) break;
  }
  return t;
}

/** Radius of curvature at t; Infinity for a line. */
export function curveCurvatureRadius(c: Curve, t: number): number {
  switch (c.kind) {
    case 'line':
      return Infinity;
    case 'arc':
      return c.radius;
    case 'ellipse-arc': {
      const phi = c.startParam + t * c.sweep;
      const s = Math.sin(phi);
      const co = Math.cos(phi);
      const q = c.a * c.a * s * s + c.b * c.b * co * co;
      return (q * Math.sqrt(q)) / (c.a * c.b);
    }
  }
}

/** Upper bound on |dP/dt| over the curve (used for Lipschitz bounds in the clearance checks). */
export function curveSpeedBound(c: Curve): number {
  switch (c.kind) {
    case 'line':
      return Math.hypot(c.to[0] - c.from[0], c.to[1] - c.from[1]);
    case 'arc':
      return c.radius * Math.abs(c.sweep);
    case 'ellipse-arc':
      return Math.max(c.a, c.b) * Math.abs(c.sweep);
  }
}

/** Is angle φ within the swept range [start, start + sweep] (sweep signed)? Returns the fraction t or -1. */
function fractionInSweep(phi: number, start: number, sweep: number): number {
  if (sweep === 0) return -1;
  let s = ((phi - start) * Math.sign(sweep)) % TWO_PI;
  if (s < 0) s += TWO_PI;
  const mag = Math.abs(sweep);
  if (s <= mag) return s / mag;
  // wrap-around: the full turn case where s is just below 2π but sweep is exactly 2π
  if (mag >= TWO_PI) return s / mag;
  return -1;
}

export interface ClosestPoint {
  t: number;
  point: Point;
  distance: number;
}

/** Closest point of the curve (within its parameter range) to p. */
export function closestOnCurve(c: Curve, p: Point): ClosestPoint {
  switch (c.kind) {
    case 'line': {
      const dx = c.to[0] - c.from[0];
      const dy = c.to[1] - c.from[1];
      const len2 = dx * dx + dy * dy;
      let t = len2 > 0 ? ((p[0] - c.from[0]) * dx + (p[1] - c.from[1]) * dy) / len2 : 0;
      t = t <= 0 ? 0 : t >= 1 ? 1 : t;
      return withDistance(c, t, p);
    }
    case 'arc': {
      const rx = p[0] - c.center[0];
      const ry = p[1] - c.center[1];
      if (rx === 0 && ry === 0) return withDistance(c, 0, p);
      const t = fractionInSweep(Math.atan2(ry, rx), c.startAngle, c.sweep);
      if (t >= 0) return withDistance(c, t, p);
      const a = withDistance(c, 0, p);
      const b = withDistance(c, 1, p);
      return a.distance <= b.distance ? a : b;
    }
    case 'ellipse-arc':
      return closestOnEllipseArc(c, p);
  }
}

function withDistance(c: Curve, t: number, p: Point): ClosestPoint {
  const point = curvePoint(c, t);
  return { t, point, distance: Math.hypot(point[0] - p[0], point[1] - p[1]) };
}

/**
 * Closest point on an ellipse arc: sample ½|P(φ) − p|² densely enough to separate its local
 * minima, then polish the best few with Newton's method on the derivative, safeguarded by
 * bisection inside the bracketing samples (a Newton–bisection hybrid, as in rtsafe of Press et al.,
 * Numerical Recipes, 3rd ed. 2007, §9.4).
 */
function closestOnEllipseArc(c: Extract<Curve, { kind: 'ellipse-arc' }>, p: Point): ClosestPoint {
  const cr = Math.cos(c.rotation);
  const sr = Math.sin(c.rotation);
  const dx = p[0] - c.center[0];
  const dy = p[1] - c.center[1];
  // p in the ellipse's own axes
  const qx = cr * dx + sr * dy;
  const qy = -sr * dx + cr * dy;
  const { a, b, startParam, sweep } = c;
  const f = (t: number): number => {
    const phi = startParam + t * sweep;
    const ex = a * Math.cos(phi) - qx;
    const ey = b * Math.sin(phi) - qy;
    return 0.5 * (ex * ex + ey * ey);
  };
  // g = df/dt, h = d²f/dt²
  const g = (t: number): number => {
    const phi = startParam + t * sweep;
    const s = Math.sin(phi);
    const co = Math.cos(phi);
    return sweep * ((b * b - a * a) * s * co + a * qx * s - b * qy * co);
  };
  const h = (t: number): number => {
    const phi = startParam + t * sweep;
    return sweep * sweep * ((b * b - a * a) * Math.cos(2 * phi) + a * qx * Math.cos(phi) + b * qy * Math.sin(phi));
  };
  const n = Math.max(16, Math.ceil((64 * Math.abs(sweep)) / TWO_PI));
  const fs = new Float64Array(n + 1);
  for (let k = 0; k <= n; k++) fs[k] = f(k / n);
  // local minima of the samples, best first
  const minima: number[] = [];
  for (let k = 0; k <= n; k++) {
    const left = k > 0 ? fs[k - 1] : Infinity;
    const right = k < n ? fs[k + 1] : Infinity;
    if (fs[k] <= left && fs[k] <= right) minima.push(k);
  }
  minima.sort((i, j) => fs[i] - fs[j]);
  let bestT = 0;
  let bestF = Infinity;
  const consider = (t: number): void => {
    const v = f(t);
    if (v < bestF) {
      bestF = v;
      bestT = t;
    }
  };
  consider(0);
  consider(1);
  for (let m = 0; m < Math.min(3, minima.length); m++) {
    const k = minima[m];
    let lo = Math.max(0, (k - 1) / n);
    let hi = Math.min(1, (k + 1) / n);
    consider(k / n);
    const glo = g(lo);
    const ghi = g(hi);
    if (!(glo < 0 && ghi > 0)) continue; // minimum sits at an end of the arc: already considered
    let t = k / n;
    for (let it = 0; it < 60; it++) {
      const gt = g(t);
      if (gt === 0) break;
      if (gt < 0) lo = t;
      else hi = t;
      const ht = h(t);
      let next = ht > 0 ? t - gt / ht : 0.5 * (lo + hi);
      if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
      const step = Math.abs(next - t);
      t = next;
      if (step < 1e-16 || hi - lo < 1e-16) break;
    }
    consider(t);
  }
  const point = curvePoint(c, bestT);
  return { t: bestT, point, distance: Math.hypot(point[0] - p[0], point[1] - p[1]) };
}

export interface BBox {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

/** Exact axis-aligned bounding box of a curve. */
export function curveBBox(c: Curve): BBox {
  const s = curveStart(c);
  const e = curveEnd(c);
  const box: BBox = {
    minX: Math.min(s[0], e[0]),
    minY: Math.min(s[1], e[1]),
    maxX: Math.max(s[0], e[0]),
    maxY: Math.max(s[1], e[1]),
  };
  const grow = (pt: Point): void => {
    if (pt[0] < box.minX) box.minX = pt[0];
    if (pt[0] > box.maxX) box.maxX = pt[0];
    if (pt[1] < box.minY) box.minY = pt[1];
    if (pt[1] > box.maxY) box.maxY = pt[1];
  };
  let extremes: number[] = [];
  let start = 0;
  if (c.kind === 'arc') {
    extremes = [0, Math.PI / 2, Math.PI, (3 * Math.PI) / 2];
    start = c.startAngle;
  } else if (c.kind === 'ellipse-arc') {
    // dx/dφ = 0 and dy/dφ = 0 in the rotated frame
    const phiX = Math.atan2(-c.b * Math.sin(c.rotation), c.a * Math.cos(c.rotation));
    const phiY = Math.atan2(c.b * Math.cos(c.rotation), c.a * Math.sin(c.rotation));
    extremes = [phiX, phiX + Math.PI, phiY, phiY + Math.PI];
    start = c.startParam;
  }
  if (c.kind !== 'line') {
    for (const phi of extremes) {
      const t = fractionInSweep(phi, start, c.sweep);
      if (t > 0 && t < 1) grow(evalCurve(c, t));
    }
  }
  return box;
}

/**
 * Twice the signed area that the curve sweeps about the origin o: ∮ (x dy − y dx) over the piece,
 * written as the chord term (p0 − o) × (p1 − o) plus the exact segment between chord and curve
 * (circle: r²(Δφ − sin Δφ); ellipse: the affine image of it, ab(Δφ − sin Δφ)).
 */
export function curveDoubleArea(c: Curve, o: Point): number {
  const p0 = curveStart(c);
  const p1 = curveEnd(c);
  const chord = (p0[0] - o[0]) * (p1[1] - o[1]) - (p1[0] - o[0]) * (p0[1] - o[1]);
  switch (c.kind) {
    case 'line':
      return chord;
    case 'arc':
      return chord + c.radius * c.radius * (c.sweep - Math.sin(c.sweep));
    case 'ellipse-arc':
      return chord + c.a * c.b * (c.sweep - Math.sin(c.sweep));
  }
}
