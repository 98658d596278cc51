/** Number and point formatting for geometry messages: six significant digits, no exponent noise. */
import type { Point } from '../model/types.js';

export function fmt(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  return String(Number(x.toPrecision(6)));
}

/**
 * Where the geometry being built sits: buildGeometry works about the plate's own centre (see
 * build.ts) and messages add it back, so a point is always named in the model's coordinates.
 */
let messageOrigin: Point = [0, 0];

/** Run `f` with points in messages shifted by `origin`. */
export function withMessageOrigin<T>(origin: Point, f: () => T): T {
  const before = messageOrigin;
  messageOrigin = origin;
  try {
    return f();
  } finally {
    messageOrigin = before;
  }
}

export function fmtPoint(p: Point): string {
  return `(${fmt(p[0] + messageOrigin[0])}, ${fmt(p[1] + messageOrigin[1])})`;
}
