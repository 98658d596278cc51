/** Number and point formatting for geometry messages: six significant digits, no exponent noise. */
import type { Point } from '../model/types.js';

export function fmt(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  return String(Number(x.toPrecision(6)));
}

export function fmtPoint(p: Point): string {
  return `(${fmt(p[0])}, ${fmt(p[1])})`;
}
