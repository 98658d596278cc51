/**
 * The mesher's view of the boundary curves: thin adapters over the geometry stage's exact curve
 * evaluation (which returns the stored junction points bitwise at t = 0 and 1, so pieces that
 * meet share a vertex exactly), in the shapes the mesher's loops want.
 */
import type { Curve } from '../geometry/types.js';
import { closestOnCurve, curveCurvatureRadius, curveDerivative, curveLength, curvePoint } from '../geometry/curves.js';

/** point on the curve at parameter t ∈ [0, 1], written into out[0], out[1] */
export function curveXY(c: Curve, t: number, out: Float64Array | number[]): void {
  const p = curvePoint(c, t);
  out[0] = p[0];
  out[1] = p[1];
}

/** |dP/dt| at t */
export function curveSpeed(c: Curve, t: number): number {
  const d = curveDerivative(c, t);
  return Math.hypot(d[0], d[1]);
}

/** local radius of curvature at t (Infinity on lines) */
export function curvatureRadius(c: Curve, t: number): number {
  return curveCurvatureRadius(c, t);
}

export function isCurved(c: Curve): boolean {
  return c.kind !== 'line';
}

/** parameter of the curve point nearest to (x, y) and its distance */
export function curveProject(c: Curve, x: number, y: number): { t: number; dist: number } {
  const r = closestOnCurve(c, [x, y]);
  return { t: r.t, dist: r.distance };
}

export function curveLen(c: Curve): number {
  return curveLength(c);
}
