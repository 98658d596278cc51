/**
 * Filled iso-bands over linear triangles. A scalar that varies linearly over a triangle is cut
 * by the level lines v = L_k into convex polygons, one per band it crosses (Sutherland & Hodgman,
 * "Reentrant polygon clipping", CACM 17(1), 1974, applied with the value as the clipping
 * function). Many narrow bands with colours from a continuous map give a fill that reads as a
 * smooth interpolation, not a flat colour per element.
 */
import { interpolateViridis } from 'd3-scale-chromatic';

/** Uniform band edges: n bands between lo and hi (n + 1 edges). */
export interface BandScale {
  lo: number;
  hi: number;
  n: number;
}

export function bandScale(lo: number, hi: number, n: number): BandScale {
  if (!(n >= 1) || !Number.isInteger(n)) throw new RangeError(`band count must be a positive integer, got ${n}`);
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) throw new RangeError(`band range must be finite, got [${lo}, ${hi}]`);
  if (hi < lo) [lo, hi] = [hi, lo];
  if (hi === lo) {
    // a constant field still needs a non-empty range; widen symmetrically
    const pad = Math.abs(lo) > 0 ? Math.abs(lo) * 1e-6 : 1e-12;
    lo -= pad;
    hi += pad;
  }
  return { lo, hi, n };
}

export function bandEdge(scale: BandScale, k: number): number {
  return scale.lo + ((scale.hi - scale.lo) * k) / scale.n;
}

/** Colour of band k: the perceptually uniform viridis map at the band's centre. */
export function bandColour(scale: BandScale, k: number): string {
  return colourAt((k + 0.5) / scale.n);
}

/** Map position t ∈ [0, 1] to a colour ("#rrggbb"). */
export function colourAt(t: number): string {
  return interpolateViridis(Math.min(1, Math.max(0, t)));
}

export function bandIndex(scale: BandScale, v: number): number {
  const k = Math.floor(((v - scale.lo) / (scale.hi - scale.lo)) * scale.n);
  return k < 0 ? 0 : k >= scale.n ? scale.n - 1 : k;
}

/** Receives one convex polygon of band k; coordinates in xs/ys[0 … count − 1] (scratch, copy if kept). */
export type BandSink = (k: number, xs: Float64Array, ys: Float64Array, count: number) => void;

// scratch polygons: a triangle clipped by two half-planes has at most 5 vertices
const ax = new Float64Array(8), ay = new Float64Array(8), av = new Float64Array(8);
const bx = new Float64Array(8), by = new Float64Array(8), bv = new Float64Array(8);

/** Clip polygon (sx, sy, sv, n) to v ≥ t (keepAbove) or v ≤ t, into (dx, dy, dv); returns count. */
function clip(
  sx: Float64Array, sy: Float64Array, sv: Float64Array, n: number, t: number, keepAbove: boolean,
  dx: Float64Array, dy: Float64Array, dv: Float64Array,
): number {
  let m = 0;
  for (let i = 0; i < n; i++) {
    const j = i + 1 === n ? 0 : i + 1;
    const vi = sv[i], vj = sv[j];
    const inI = keepAbove ? vi >= t : vi <= t;
    const inJ = keepAbove ? vj >= t : vj <= t;
    if (inI) {
      dx[m] = sx[i]; dy[m] = sy[i]; dv[m] = vi; m++;
    }
    if (inI !== inJ) {
      const f = (t - vi) / (vj - vi);
      dx[m] = sx[i] + f * (sx[j] - sx[i]);
      dy[m] = sy[i] + f * (sy[j] - sy[i]);
      dv[m] = t;
      m++;
    }
  }
  return m;
}

/**
 * Splits one linear triangle (corner positions and values) into its band polygons.
 * Values outside [lo, hi] fall into the first or last band.
 */
export function triangleBands(
  x0: number, y0: number, v0: number,
  x1: number, y1: number, v1: number,
  x2: number, y2: number, v2: number,
  scale: BandScale, sink: BandSink,
): void {
  const vmin = Math.min(v0, v1, v2), vmax = Math.max(v0, v1, v2);
  const kmin = bandIndex(scale, vmin), kmax = bandIndex(scale, vmax);
  ax[0] = x0; ay[0] = y0; av[0] = v0;
  ax[1] = x1; ay[1] = y1; av[1] = v1;
  ax[2] = x2; ay[2] = y2; av[2] = v2;
  if (kmin === kmax) {
    sink(kmin, ax, ay, 3);
    return;
  }
  // copy the source triangle once; each band clips from it
  const tx0 = x0, ty0 = y0, tx1 = x1, ty1 = y1, tx2 = x2, ty2 = y2;
  for (let k = kmin; k <= kmax; k++) {
    ax[0] = tx0; ay[0] = ty0; av[0] = v0;
    ax[1] = tx1; ay[1] = ty1; av[1] = v1;
    ax[2] = tx2; ay[2] = ty2; av[2] = v2;
    let n = 3;
    let px = ax, py = ay, pv = av;
    if (k > kmin) {
      n = clip(px, py, pv, n, bandEdge(scale, k), true, bx, by, bv);
      px = bx; py = by; pv = bv;
    }
    if (k < kmax && n > 0) {
      const [dx, dy, dv] = px === ax ? [bx, by, bv] : [ax, ay, av];
      n = clip(px, py, pv, n, bandEdge(scale, k + 1), false, dx, dy, dv);
      px = dx; py = dy; pv = dv;
    }
    if (n >= 3) sink(k, px, py, n);
  }
}
