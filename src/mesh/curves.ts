/**
 * Small exact evaluation of the geometry's boundary curves (see src/geometry/types.ts for the
 * parametrisations). The mesher needs points, parameters of points and local curvature radii.
 */
import type { Curve } from '../geometry/types.js';

/** point on the curve at parameter t ∈ [0, 1], written into out[0], out[1] */
export function curveXY(c: Curve, t: number, out: Float64Array | number[]): void {
  switch (c.kind) {
    case 'line':
      out[0] = c.from[0] + t * (c.to[0] - c.from[0]);
      out[1] = c.from[1] + t * (c.to[1] - c.from[1]);
      return;
    case 'arc': {
      const phi = c.startAngle + t * c.sweep;
      out[0] = c.center[0] + c.radius * Math.cos(phi);
      out[1] = c.center[1] + c.radius * Math.sin(phi);
      return;
    }
    case 'ellipse-arc': {
      const phi = c.startParam + t * c.sweep;
      const lx = c.a * Math.cos(phi);
      const ly = c.b * Math.sin(phi);
      const cr = Math.cos(c.rotation);
      const sr = Math.sin(c.rotation);
      out[0] = c.center[0] + cr * lx - sr * ly;
      out[1] = c.center[1] + sr * lx + cr * ly;
      return;
    }
  }
}

/** |dP/dt| at t */
export function curveSpeed(c: Curve, t: number): number {
  switch (c.kind) {
    case 'line':
      return Math.hypot(c.to[0] - c.from[0], c.to[1] - c.from[1]);
    case 'arc':
      return c.radius * Math.abs(c.sweep);
    case 'ellipse-arc': {
      const phi = c.startParam + t * c.sweep;
      return Math.abs(c.sweep) * Math.hypot(c.a * Math.sin(phi), c.b * Math.cos(phi));
    }
  }
}

/** local radius of curvature at t (Infinity on lines) */
export function curvatureRadius(c: Curve, t: number): number {
  switch (c.kind) {
    case 'line':
      return Infinity;
    case 'arc':
      return c.radius;
    case 'ellipse-arc': {
      // ρ(φ) = (a² sin²φ + b² cos²φ)^{3/2} / (a b)
      const phi = c.startParam + t * c.sweep;
      const s = Math.sin(phi);
      const co = Math.cos(phi);
      const q = c.a * c.a * s * s + c.b * c.b * co * co;
      return (q * Math.sqrt(q)) / (c.a * c.b);
    }
  }
}

export function isCurved(c: Curve): boolean {
  return c.kind !== 'line';
}

/**
 * Parameter of the curve point nearest to (x, y) and its distance. Lines: projection;
 * arcs: polar angle; ellipses: Newton on the eccentric anomaly from a coarse scan.
 */
export function curveProject(c: Curve, x: number, y: number): { t: number; dist: number } {
  const p = [0, 0];
  if (c.kind === 'line') {
    const dx = c.to[0] - c.from[0];
    const dy = c.to[1] - c.from[1];
    const l2 = dx * dx + dy * dy;
    let t = l2 > 0 ? ((x - c.from[0]) * dx + (y - c.from[1]) * dy) / l2 : 0;
    t = Math.min(1, Math.max(0, t));
    curveXY(c, t, p);
    return { t, dist: Math.hypot(x - p[0], y - p[1]) };
  }
  if (c.kind === 'arc') {
    const ang = Math.atan2(y - c.center[1], x - c.center[0]);
    let t = angleParam(ang, c.startAngle, c.sweep);
    t = Math.min(1, Math.max(0, t));
    curveXY(c, t, p);
    const d0 = Math.hypot(x - p[0], y - p[1]);
    // the end points may be nearer when the angle falls outside the sweep
    const best = nearestOf(c, x, y, [t, 0, 1]);
    return d0 <= best.dist ? { t, dist: d0 } : best;
  }
  // ellipse: scan then refine by golden-section-free Newton on squared distance
  const n = 64;
  let bt = 0;
  let bd = Infinity;
  for (let i = 0; i <= n; i++) {
    curveXY(c, i / n, p);
    const d = (x - p[0]) ** 2 + (y - p[1]) ** 2;
    if (d < bd) {
      bd = d;
      bt = i / n;
    }
  }
  let lo = Math.max(0, bt - 1 / n);
  let hi = Math.min(1, bt + 1 / n);
  // ternary search: the squared distance is unimodal on a bracket this small
  for (let k = 0; k < 80; k++) {
    const m1 = lo + (hi - lo) / 3;
    const m2 = hi - (hi - lo) / 3;
    curveXY(c, m1, p);
    const d1 = (x - p[0]) ** 2 + (y - p[1]) ** 2;
    curveXY(c, m2, p);
    const d2 = (x - p[0]) ** 2 + (y - p[1]) ** 2;
    if (d1 < d2) hi = m2;
    else lo = m1;
  }
  const t = 0.5 * (lo + hi);
  curveXY(c, t, p);
  return { t, dist: Math.hypot(x - p[0], y - p[1]) };
}

function nearestOf(c: Curve, x: number, y: number, ts: number[]): { t: number; dist: number } {
  const p = [0, 0];
  let best = { t: 0, dist: Infinity };
  for (const t of ts) {
    curveXY(c, t, p);
    const d = Math.hypot(x - p[0], y - p[1]);
    if (d < best.dist) best = { t, dist: d };
  }
  return best;
}

/** parameter t of polar angle `ang` on an arc starting at `start` with signed `sweep` */
function angleParam(ang: number, start: number, sweep: number): number {
  const TAU = 2 * Math.PI;
  let d = ang - start;
  if (sweep >= 0) {
    d = ((d % TAU) + TAU) % TAU;
    // an angle just below start belongs to t ≈ 0, not t ≈ 2π/sweep
    if (d > sweep + 0.5 * (TAU - sweep)) d -= TAU;
    return d / sweep;
  }
  d = ((-d % TAU) + TAU) % TAU;
  if (d > -sweep + 0.5 * (TAU + sweep)) d -= TAU;
  return d / -sweep;
}

/** approximate curve length by 64-point composite Simpson (exact for lines and arcs) */
export function curveLen(c: Curve): number {
  if (c.kind !== 'ellipse-arc') return curveSpeed(c, 0);
  const n = 256;
  let s = curveSpeed(c, 0) + curveSpeed(c, 1);
  for (let i = 1; i < n; i++) s += (i % 2 ? 4 : 2) * curveSpeed(c, i / n);
  return (s / (3 * n));
}
