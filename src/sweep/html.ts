/**
 * sweep.html: one self-contained page (inline CSS and SVG, no scripts). For every site family a
 * plot of its value against the first varied parameter, one line per combination of the other
 * parameters. Converging points are filled discs with their discretisation band as a bar;
 * undecided points (the last peak) hollow squares; singular points, which have no value (their
 * peak keeps rising and is not a stress), hollow triangles in a strip of their own below the value
 * axis, never joined to the valued points.
 */
import { CAUTION, bandText, escapeXml, formatNumber } from '../report/index.js';
import { memberAt } from './match.js';
import type { SiteFamily, SweepResult } from './types.js';
import type { SiteResult } from '../study/types.js';

const W = 520;
const H = 300;
const M = { left: 64, right: 16, top: 16, bottom: 44 };
const SERIES_COLOURS = ['#1c5d99', '#b35c1e', '#3d7a3d', '#7b3f8c', '#8c6d1f', '#2f7f7f'];

/** About `count` round tick values across [lo, hi] (steps 1, 2, 2.5, 5 × 10^k). */
export function roundTicks(lo: number, hi: number, count = 5): number[] {
  if (!(hi > lo)) return [lo];
  const raw = (hi - lo) / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  for (let k = Math.ceil(lo / step - 1e-9); k * step <= hi + 1e-9 * step; k++) out.push(Number((k * step).toPrecision(12)));
  return out;
}

/** Tick text with just enough significant digits that neighbouring ticks read differently. */
export function tickLabel(t: number, ticks: readonly number[]): string {
  for (let sig = 3; sig < 12; sig++) {
    const texts = ticks.map((v) => formatNumber(v, sig));
    if (new Set(texts).size === texts.length) return formatNumber(t, sig);
  }
  return formatNumber(t, 12);
}

interface PlotPoint {
  x: number;
  y: number;
  u: number;
  verdict: SiteResult['verdict'];
  title: string;
}

function marker(p: PlotPoint, X: number, Y: number, colour: string, yPx: (v: number) => number): string {
  const t = `<title>${escapeXml(p.title)}</title>`;
  if (p.verdict === 'converging') {
    const bar = Number.isFinite(p.u) && p.u > 0
      ? `<line x1="${X}" x2="${X}" y1="${yPx(p.y - p.u).toFixed(1)}" y2="${yPx(p.y + p.u).toFixed(1)}" stroke="${colour}" stroke-width="1.5"/>`
      : '';
    return `${bar}<circle cx="${X}" cy="${Y}" r="4.5" fill="${colour}">${t}</circle>`;
  }
  if (p.verdict === 'singular') {
    return `<path d="M${X} ${(Y - 6).toFixed(1)} L${(X + 5.5).toFixed(1)} ${(Y + 4).toFixed(1)} L${(X - 5.5).toFixed(1)} ${(Y + 4).toFixed(1)} Z" fill="#fff" stroke="${colour}" stroke-width="2">${t}</path>`;
  }
  return `<rect x="${(X - 4).toFixed(1)}" y="${(Y - 4).toFixed(1)}" width="8" height="8" fill="#fff" stroke="${colour}" stroke-width="2">${t}</rect>`;
}

/** Height of the strip under the value axis where singular points sit (they have no value). */
const SINGULAR_STRIP = 46;

/** The plotted points of one family, one list per combination of the other parameters. */
function familySeries(sweep: Pick<SweepResult, 'axes' | 'points'>, family: SiteFamily, stressUnit: string): Map<string, PlotPoint[]> {
  const xAxis = sweep.axes[0];
  const others = sweep.axes.slice(1);
  const series = new Map<string, PlotPoint[]>();
  for (const point of sweep.points) {
    const m = memberAt(family, point.index);
    if (!m) continue;
    const site = point.study.sites[m.site];
    const label = others.map((a) => `${a.name} = ${formatNumber(point.params[a.name])}`).join(', ');
    const where = `${xAxis.name} = ${formatNumber(point.params[xAxis.name])}${label ? ', ' + label : ''}: ${site.id} ${site.verdict}`;
    const singular = site.verdict === 'singular';
    const list = series.get(label) ?? [];
    list.push({
      x: point.params[xAxis.name],
      // a singular site has no value (its peak is not a stress): it is drawn apart, in the strip
      y: singular ? NaN : site.estimate.value,
      u: site.estimate.uncertainty,
      verdict: site.verdict,
      title: singular
        ? `${where}, no value (the peak is not a stress); q = ${formatNumber(site.growth.exponent, 3)}`
        : site.verdict === 'converging'
          ? `${where}, ${bandText(site.estimate.value, site.estimate.uncertainty, stressUnit)} (discretisation band)`
          : `${where}, last peak ${formatNumber(site.estimate.value)} ${stressUnit} (unsettled)`,
    });
    series.set(label, list);
  }
  return series;
}

/** Dashed line through the valued points of one series, broken where a singular point intervenes. */
function valueLine(pts: PlotPoint[], xPx: (v: number) => number, yPx: (v: number) => number): string {
  const runs: PlotPoint[][] = [[]];
  for (const p of pts) {
    if (p.verdict === 'singular' || !Number.isFinite(p.y)) runs.push([]);
    else runs[runs.length - 1].push(p);
  }
  return runs
    .filter((r) => r.length > 1)
    .map((r) => r.map((p, i) => `${i === 0 ? 'M' : 'L'}${xPx(p.x).toFixed(1)} ${yPx(p.y).toFixed(1)}`).join(' '))
    .join(' ');
}

/**
 * The SVG plot of one family: converging and undecided points on the value axis, singular points
 * apart in a strip below it (a singular peak is not a stress, so it has no place on that axis).
 */
export function familyPlotSvg(sweep: Pick<SweepResult, 'axes' | 'points'>, family: SiteFamily, stressUnit: string): string {
  const xAxis = sweep.axes[0];
  const series = familySeries(sweep, family, stressUnit);
  const everything = [...series.values()].flat();
  const valued = everything.filter((p) => p.verdict !== 'singular' && Number.isFinite(p.y));
  const singular = everything.filter((p) => p.verdict === 'singular');
  if (valued.length === 0 && singular.length === 0) return '';
  const strip = singular.length > 0 ? SINGULAR_STRIP : 0;
  const valueBottom = H - M.bottom - strip;
  let x0 = Math.min(...everything.map((p) => p.x));
  let x1 = Math.max(...everything.map((p) => p.x));
  if (!(x1 > x0)) { x0 -= 1; x1 += 1; }
  const padX = 0.04 * (x1 - x0);
  x0 -= padX;
  x1 += padX;
  const xPx = (v: number) => M.left + ((v - x0) / (x1 - x0)) * (W - M.left - M.right);
  const parts: string[] = [];
  let yPx = (_v: number) => (M.top + valueBottom) / 2;
  if (valued.length > 0) {
    let y0 = Math.min(...valued.map((p) => p.y - (p.verdict === 'converging' && Number.isFinite(p.u) ? p.u : 0)));
    let y1 = Math.max(...valued.map((p) => p.y + (p.verdict === 'converging' && Number.isFinite(p.u) ? p.u : 0)));
    // a nearly flat family should look flat: the value axis spans at least 2 % of the largest value
    const minSpan = 0.02 * Math.max(Math.abs(y0), Math.abs(y1)) || 1;
    if (y1 - y0 < minSpan) { const mid = 0.5 * (y0 + y1); y0 = mid - minSpan / 2; y1 = mid + minSpan / 2; }
    const padY = 0.06 * (y1 - y0);
    y0 -= padY;
    y1 += padY;
    yPx = (v: number) => valueBottom - ((v - y0) / (y1 - y0)) * (valueBottom - M.top);
    const yTicks = roundTicks(y0, y1);
    for (const t of yTicks) {
      const Y = yPx(t).toFixed(1);
      parts.push(`<line x1="${M.left - 4}" x2="${M.left}" y1="${Y}" y2="${Y}" stroke="#52606d"/><line x1="${M.left}" x2="${W - M.right}" y1="${Y}" y2="${Y}" stroke="#eef1f4"/><text x="${M.left - 7}" y="${Y}" dy="0.35em" text-anchor="end">${escapeXml(tickLabel(t, yTicks))}</text>`);
    }
  } else {
    parts.push(`<text x="${(M.left + W - M.right) / 2}" y="${(M.top + valueBottom) / 2}" text-anchor="middle" fill="#52606d">no converged or unsettled value at any point</text>`);
  }
  parts.unshift(`<rect x="${M.left}" y="${M.top}" width="${W - M.left - M.right}" height="${valueBottom - M.top}" fill="none" stroke="#9aa5b1"/>`);
  const stripY = valueBottom + strip - 11; // triangles under the strip's label
  if (strip > 0) {
    parts.push(
      `<rect class="singular-strip" x="${M.left}" y="${valueBottom + 8}" width="${W - M.left - M.right}" height="${strip - 8}" fill="#fff0f6" stroke="#d6a2bd"/>` +
      `<text x="${M.left + 6}" y="${valueBottom + 19}" font-size="9.5" fill="#8a1c5c">singular: no value (the peak is not a stress)</text>`,
    );
  }
  const xTicks = roundTicks(x0, x1);
  for (const t of xTicks) {
    const X = xPx(t).toFixed(1);
    parts.push(`<line x1="${X}" x2="${X}" y1="${H - M.bottom}" y2="${H - M.bottom + 4}" stroke="#52606d"/><text x="${X}" y="${H - M.bottom + 16}" text-anchor="middle">${escapeXml(tickLabel(t, xTicks))}</text>`);
  }
  parts.push(`<text x="${(M.left + W - M.right) / 2}" y="${H - 8}" text-anchor="middle">${escapeXml(xAxis.name)}</text>`);
  parts.push(`<text transform="translate(14 ${(M.top + valueBottom) / 2}) rotate(-90)" text-anchor="middle">value (${escapeXml(stressUnit)})</text>`);
  let k = 0;
  for (const [, pts] of series) {
    const colour = SERIES_COLOURS[k++ % SERIES_COLOURS.length];
    const sorted = [...pts].sort((a, b) => a.x - b.x);
    const path = valueLine(sorted, xPx, yPx);
    if (path) parts.push(`<path d="${path}" fill="none" stroke="${colour}" stroke-width="1.2" stroke-dasharray="4 3"/>`);
    for (const p of sorted) {
      const X = Number(xPx(p.x).toFixed(1));
      const Y = p.verdict === 'singular' ? stripY : Number(yPx(p.y).toFixed(1));
      if (p.verdict === 'singular' || Number.isFinite(p.y)) parts.push(marker(p, X, Y, colour, yPx));
    }
  }
  return `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${W} ${H}" width="${W}" height="${H}" font-size="11" font-family="system-ui, sans-serif" role="img" aria-label="${escapeXml(family.id)} value against ${escapeXml(xAxis.name)}">${parts.join('')}</svg>`;
}

const PAGE_CSS = `
body { margin: 0 auto; max-width: 980px; padding: 20px 26px 40px; color: #1f2933; font: 14px/1.5 system-ui, sans-serif; }
h1 { font-size: 22px; margin: 4px 0; } h2 { font-size: 17px; margin: 24px 0 6px; border-bottom: 1px solid #d9e2ec; }
.caution { border-left: 4px solid #b7791f; background: #fffaf0; padding: 6px 10px; }
.key span { margin-right: 18px; white-space: nowrap; } table { border-collapse: collapse; font-variant-numeric: tabular-nums; }
td, th { padding: 3px 8px; border-bottom: 1px solid #e4e7eb; text-align: left; } .muted { color: #52606d; }
svg { max-width: 100%; height: auto; }`;

const KEY = `<p class="key"><span><svg width="12" height="12"><circle cx="6" cy="6" r="4.5" fill="#1c5d99"/></svg> converging: value, bar ± discretisation band</span>` +
  `<span><svg width="14" height="12"><path d="M7 1 L12.5 11 L1.5 11 Z" fill="#fff" stroke="#1c5d99" stroke-width="2"/></svg> singular: no value (the peak keeps rising and is not a stress), drawn apart below the value axis</span>` +
  `<span><svg width="12" height="12"><rect x="2" y="2" width="8" height="8" fill="#fff" stroke="#1c5d99" stroke-width="2"/></svg> undecided: last peak, not settled</span></p>`;

/** The whole page. */
export function sweepHtml(sweep: SweepResult, stressUnit: string): string {
  const title = escapeXml(sweep.model.title);
  const lengthUnit = sweep.points[0]?.study.units.length ?? '';
  const axes = sweep.axes.map((a) => `${escapeXml(a.name)} = ${a.values.map((v) => formatNumber(v)).join(', ')}`).join('; ');
  const sections = sweep.families.map((f) => {
    const rows = sweep.points.map((p) => {
      const m = memberAt(f, p.index);
      const params = sweep.axes.map((a) => `<td>${escapeXml(formatNumber(p.params[a.name]))}</td>`).join('');
      if (!m) return `<tr>${params}<td colspan="4" class="muted">no site here</td></tr>`;
      const s = p.study.sites[m.site];
      const value = s.verdict === 'converging'
        ? `${bandText(s.estimate.value, s.estimate.uncertainty, '')}${s.aboveYield ? ' (above yield)' : ''}`
        : s.verdict === 'singular' ? `no value (the peak is not a stress); q = ${formatNumber(s.growth.exponent, 3)} (theory ${formatNumber(s.growth.theory, 3)})` : `last peak ${formatNumber(s.estimate.value)} (unsettled)`;
      const point = s.readouts.atDistance !== undefined ? `${formatNumber(s.readouts.atDistance)} at r = ${formatNumber(s.readouts.distance)} ${lengthUnit}` : '—';
      return `<tr>${params}<td>${escapeXml(s.id)} ${escapeXml(s.feature.kind)}</td><td>${escapeXml(s.verdict)}</td><td>${escapeXml(value)}</td><td>${escapeXml(point)}</td></tr>`;
    }).join('');
    const head = sweep.axes.map((a) => `<th>${escapeXml(a.name)}</th>`).join('');
    return `<section><h2>${escapeXml(f.id)}: ${escapeXml(f.featureClass)} near (${escapeXml(formatNumber(f.at[0]))}, ${escapeXml(formatNumber(f.at[1]))})</h2>` +
      familyPlotSvg(sweep, f, stressUnit) +
      `<table><thead><tr>${head}<th>site</th><th>verdict</th><th>value ± discretisation band (${escapeXml(stressUnit)})</th><th>point: stress at r (${escapeXml(stressUnit)})</th></tr></thead><tbody>${rows}</tbody></table></section>`;
  }).join('\n');
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${title}: parameter sweep</title><style>${PAGE_CSS}</style></head>
<body><header><p class="muted">peakwise ${escapeXml(sweep.version)} · parameter sweep</p><h1>${title}</h1>
<p>${axes} — ${sweep.points.length} points.</p>
<p class="caution">${escapeXml(CAUTION)}</p></header>
<p class="muted">Sites are followed from point to point by feature and location (a fillet continues the corner it rounds); the family names F1, F2, … are the sweep's own. A singular site has no value, its peak being no stress: it is drawn apart, and its stress at a distance (the point readout) is in the table.</p>
${KEY}
${sections}
</body></html>
`;
}
