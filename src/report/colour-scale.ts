/**
 * The colour scale of a contour picture: which value range the colours span (with the top
 * capped when a singular peak would flatten the rest of the plate), and the colour bar that
 * shows it. The colours themselves come from isobands.ts.
 */
import type { Mesh } from '../mesh/types.js';
import { type Box, c1, linearTriangles, niceTicks } from './draw.js';
import { type BandScale, colourAt } from './isobands.js';
import { escapeXml, formatNumber } from './text.js';

/** The colour range chosen for a picture. */
export interface ColourRange {
  /** bottom and top of the colour scale */
  lo: number;
  hi: number;
  /** largest value in the window (above `hi` when capped) */
  max: number;
  /** whether the top was capped below the largest value */
  capped: boolean;
}

function rangeInWindow(xy: Float64Array, values: Float64Array, box: Box): [number, number] {
  let lo = Infinity, hi = -Infinity;
  for (let n = 0; n < values.length; n++) {
    const x = xy[2 * n], y = xy[2 * n + 1], v = values[n];
    if (x < box.minX || x > box.maxX || y < box.minY || y > box.maxY || !Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lo > hi) {
    for (let n = 0; n < values.length; n++) {
      const v = values[n];
      if (!Number.isFinite(v)) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  return lo > hi ? [0, 1] : [lo, hi];
}

/**
 * Area carried by the values of the window, binned in `bins` classes of equal width over
 * [lo, max]: each linear triangle gives a third of its area to each of its nodes that lies in
 * the window with a finite value.
 */
function areaByValueClass(
  xy: Float64Array, tri: Uint32Array, values: Float64Array, box: Box, lo: number, max: number, bins: number,
): { areaIn: Float64Array; total: number } {
  const areaIn = new Float64Array(bins);
  let total = 0;
  const nTri = tri.length / 3;
  for (let t = 0; t < nTri; t++) {
    const a = tri[3 * t], b = tri[3 * t + 1], c = tri[3 * t + 2];
    const w = Math.abs((xy[2 * b] - xy[2 * a]) * (xy[2 * c + 1] - xy[2 * a + 1]) - (xy[2 * c] - xy[2 * a]) * (xy[2 * b + 1] - xy[2 * a + 1])) / 6;
    for (let j = 0; j < 3; j++) {
      const n = tri[3 * t + j];
      const x = xy[2 * n], y = xy[2 * n + 1];
      if (!(x >= box.minX && x <= box.maxX && y >= box.minY && y <= box.maxY && Number.isFinite(values[n]))) continue;
      const k = Math.min(bins - 1, Math.floor(((values[n] - lo) / (max - lo)) * bins));
      areaIn[k] += w;
      total += w;
    }
  }
  return { areaIn, total };
}

/**
 * Colour range over the window. The top is capped at the area quantile `q` (nodal areas from
 * the linear triangles, values binned in 4096 classes) when the values above it stretch the
 * scale by more than a quarter: a singular peak then no longer turns the whole plate one colour.
 */
export function colourRange(
  mesh: Mesh, values: Float64Array, box: Box, q: number | false, tri: Uint32Array = linearTriangles(mesh),
): ColourRange {
  const [lo, max] = rangeInWindow(mesh.xy, values, box);
  if (q === false || !(q > 0 && q < 1) || !(max > lo)) return { lo, hi: max, max, capped: false };
  const bins = 4096;
  const { areaIn, total } = areaByValueClass(mesh.xy, tri, values, box, lo, max, bins);
  if (!(total > 0)) return { lo, hi: max, max, capped: false };
  let acc = 0;
  let k = 0;
  for (; k < bins; k++) {
    acc += areaIn[k];
    if (acc >= q * total) break;
  }
  const top = lo + ((k + 1) / bins) * (max - lo);
  if (max - top > 0.25 * (top - lo)) return { lo, hi: top, max, capped: true };
  return { lo, hi: max, max, capped: false };
}

/** The continuous colour bar: a slim rounded bar, ticks on its right, end values in bold. */
export function colourBarSvg(
  x: number, y: number, height: number, scale: BandScale, units: string, gradientId: string, capped = false,
): string {
  const w = 14;
  const stops: string[] = [];
  for (let i = 0; i <= 20; i++) {
    const t = i / 20;
    stops.push(`<stop offset="${t}" stop-color="${colourAt(t)}"/>`);
  }
  const valueY = (v: number) => y + height - ((v - scale.lo) / (scale.hi - scale.lo)) * height;
  const parts: string[] = [
    `<g class="colour-bar">`,
    `<defs><linearGradient id="${gradientId}" x1="0" y1="1" x2="0" y2="0">${stops.join('')}</linearGradient></defs>`,
    `<text class="bar-heading" x="${x}" y="${y - 14}" font-size="11" font-weight="600" fill="#222">${escapeXml(units)}</text>`,
    `<rect x="${x}" y="${y}" width="${w}" height="${height}" rx="4" fill="url(#${gradientId})" stroke="#333" stroke-width="0.6"/>`,
  ];
  const endLabel = (v: number, yy: number, cls: string, prefix = '') =>
    `<text class="${cls}" x="${x + w + 6}" y="${c1(yy + 4)}" font-size="11" font-weight="700" fill="#111">${escapeXml(prefix + formatNumber(v))}</text>`;
  parts.push(endLabel(scale.hi, y, 'bar-max', capped ? '≥ ' : ''), endLabel(scale.lo, y + height, 'bar-min'));
  if (capped) {
    // an open top: a small arrowhead above the bar says the scale continues beyond its end
    parts.push(`<path d="M${x} ${y - 2}L${x + w / 2} ${y - 8} ${x + w} ${y - 2}Z" fill="${colourAt(1)}" stroke="#333" stroke-width="0.6"/>`);
  }
  const minGap = 14;
  for (const t of niceTicks(scale.lo, scale.hi, 5)) {
    const ty = valueY(t);
    if (ty < y + minGap || ty > y + height - minGap) continue;
    parts.push(
      `<line x1="${x + w}" x2="${x + w + 4}" y1="${c1(ty)}" y2="${c1(ty)}" stroke="#333" stroke-width="0.8"/>`,
      `<text x="${x + w + 6}" y="${c1(ty + 4)}" font-size="10" fill="#444">${escapeXml(formatNumber(t))}</text>`,
    );
  }
  parts.push('</g>');
  return parts.join('');
}
