/**
 * Log–log convergence plot of one site: peak against element size h (finer to the right)
 * and, smaller, against degrees of freedom. Shows the levels, the fitted trend over the levels
 * the fit used, the theory slope as a dashed reference and, for a converging site, the
 * extrapolated value with its uncertainty band.
 */
import type { ReportedAssessment, SiteResult } from '../study/types.js';
import { VERDICT_RULES } from '../study/verdict.js';
import { c1, niceTicks } from './draw.js';
import { escapeXml, formatFixed, formatNumber } from './text.js';
import { BAND_LABEL, bandText } from './words.js';

export interface ConvergencePlotOptions {
  /** stress unit for the peak axis, e.g. "MPa" */
  units: string;
  /** length unit for the h axis, e.g. "mm" */
  lengthUnit?: string;
  /** name of the measure, e.g. "von Mises" (default "peak") */
  measure?: string;
  /**
   * how many of the finest levels the fit used (default: as the study fits them — the finest three
   * for a converging site, the finest `VERDICT_RULES.singularWindow` (4) for a singular or
   * undecided one, whose growth exponent comes from that window; all when fewer)
   */
  fitLevels?: number;
  /** values another analysis reported at this site (issue 15): a marker each at (size, value) */
  reported?: readonly Pick<ReportedAssessment, 'size' | 'value' | 'label' | 'keyPath' | 'finding'>[];
}

const FONT = "system-ui, -apple-system, 'Segoe UI', Roboto, sans-serif";
const INK = '#1f2933';
const POINT = '#3b3b98';
const FIT = '#d9480f';
const THEORY = '#52606d';
const BAND = '#2b8a3e';
const REPORTED = '#c2255c';

/** One axis: value → pixel, either logarithmic (all values > 0) or linear. */
interface Axis {
  log: boolean;
  lo: number;
  hi: number;
  p0: number;
  p1: number;
  at(v: number): number;
  ticks(): number[];
}

function makeAxis(values: number[], p0: number, p1: number, allowLog: boolean): Axis {
  // a loop, not Math.min(...values): a cut plot has up to 100 000 samples
  let lo = Infinity, hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (!(lo <= hi)) {
    lo = 1;
    hi = 10;
  }
  const log = allowLog && lo > 0;
  let a: number, b: number;
  if (log) {
    a = Math.log10(lo);
    b = Math.log10(hi);
    if (b - a < 1e-6) {
      a -= 0.01;
      b += 0.01;
    }
    const pad = (b - a) * 0.08;
    a -= pad;
    b += pad;
  } else {
    a = lo;
    b = hi;
    if (b - a < 1e-12 * Math.max(1, Math.abs(a))) {
      a -= Math.abs(a) * 0.01 || 1;
      b += Math.abs(b) * 0.01 || 1;
    }
    const pad = (b - a) * 0.08;
    a -= pad;
    b += pad;
  }
  const t = (v: number) => (log ? Math.log10(v) : v);
  return {
    log,
    lo: log ? 10 ** a : a,
    hi: log ? 10 ** b : b,
    p0,
    p1,
    at: (v: number) => p0 + ((t(v) - a) / (b - a)) * (p1 - p0),
    ticks: () => {
      if (log && b - a >= 0.5) {
        // decades only when the range is wide; otherwise 1-2-5 steps, or every digit
        const mantissas = b - a >= 3 ? [1] : b - a >= 1 ? [1, 2, 5] : [1, 2, 3, 4, 5, 6, 7, 8, 9];
        const out: number[] = [];
        for (let k = Math.floor(a); k <= Math.ceil(b); k++) {
          for (const m of mantissas) {
            const v = m * 10 ** k;
            if (Math.log10(v) >= a && Math.log10(v) <= b) out.push(Number(v.toPrecision(12)));
          }
        }
        if (out.length >= 2) return out;
      }
      return niceTicks(log ? 10 ** a : a, log ? 10 ** b : b, 4).filter((v) => !log || v > 0);
    },
  };
}

interface Panel {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** Tick text: 12000 → "12k", 1500000 → "1.5M"; others with 3–4 significant digits. */
function tickText(v: number, sig: number): string {
  const a = Math.abs(v);
  if (a >= 1e6) return `${formatNumber(v / 1e6, 3)}M`;
  if (a >= 1e4) return `${formatNumber(v / 1e3, 3)}k`;
  return formatNumber(v, sig);
}

/** Tick labels with just enough significant digits that neighbouring ticks read differently. */
function tickLabels(ticks: number[], minSig: number): string[] {
  for (let sig = minSig; sig <= 12; sig++) {
    const labels = ticks.map((t) => tickText(t, sig));
    if (new Set(labels).size === labels.length) return labels;
  }
  return ticks.map((t) => String(t));
}

function axesSvg(panel: Panel, ax: Axis, ay: Axis, xLabel: string, yLabel: string, small: boolean): string {
  const fs = small ? 9.5 : 10.5;
  const parts: string[] = [
    `<rect x="${panel.x}" y="${panel.y}" width="${panel.w}" height="${panel.h}" fill="#fbfcfd" stroke="#9aa5b1" stroke-width="0.8"/>`,
  ];
  // labels keep a minimum gap (their text width); tick marks and grid lines are always drawn
  let lastLabelX = -Infinity;
  const xTicks = ax.ticks();
  const xLabels = tickLabels(xTicks, 3);
  for (const [i, t] of xTicks.entries()) {
    const X = ax.at(t);
    if (X < panel.x - 0.5 || X > panel.x + panel.w + 0.5) continue;
    parts.push(
      `<line x1="${c1(X)}" x2="${c1(X)}" y1="${panel.y}" y2="${panel.y + panel.h}" stroke="#e4e7eb" stroke-width="0.7"/>`,
      `<line x1="${c1(X)}" x2="${c1(X)}" y1="${panel.y + panel.h}" y2="${panel.y + panel.h + 4}" stroke="${INK}" stroke-width="0.8"/>`,
    );
    const text = xLabels[i];
    if (Math.abs(X - lastLabelX) < 0.62 * fs * (text.length + 1.5)) continue;
    lastLabelX = X;
    parts.push(
      `<text x="${c1(X)}" y="${panel.y + panel.h + 15}" font-size="${fs}" text-anchor="middle" fill="${INK}">${escapeXml(text)}</text>`,
    );
  }
  let lastLabelY = -Infinity;
  const yTicks = ay.ticks();
  const yLabels = tickLabels(yTicks, 4);
  for (const [i, t] of yTicks.entries()) {
    const Y = ay.at(t);
    if (Y < panel.y - 0.5 || Y > panel.y + panel.h + 0.5) continue;
    parts.push(
      `<line x1="${panel.x}" x2="${panel.x + panel.w}" y1="${c1(Y)}" y2="${c1(Y)}" stroke="#e4e7eb" stroke-width="0.7"/>`,
      `<line x1="${panel.x - 4}" x2="${panel.x}" y1="${c1(Y)}" y2="${c1(Y)}" stroke="${INK}" stroke-width="0.8"/>`,
    );
    if (Math.abs(Y - lastLabelY) < 1.3 * fs) continue;
    lastLabelY = Y;
    parts.push(
      `<text x="${panel.x - 6}" y="${c1(Y + 3.5)}" font-size="${fs}" text-anchor="end" fill="${INK}">${escapeXml(yLabels[i])}</text>`,
    );
  }
  parts.push(
    `<text class="axis-label" x="${c1(panel.x + panel.w / 2)}" y="${panel.y + panel.h + 32}" font-size="${fs + 0.5}" text-anchor="middle" fill="${INK}">${escapeXml(xLabel)}</text>`,
    `<text class="axis-label" transform="translate(${panel.x - (small ? 40 : 52)} ${c1(panel.y + panel.h / 2)}) rotate(-90)" font-size="${fs + 0.5}" text-anchor="middle" fill="${INK}">${escapeXml(yLabel)}</text>`,
  );
  return parts.join('');
}

function polyline(points: [number, number][]): string {
  return points.map(([x, y], i) => `${i === 0 ? 'M' : 'L'}${c1(x)} ${c1(y)}`).join('');
}

/** Slope label text: the growth exponent q (singular, undecided) or the observed order p (converging). */
export function slopeLabel(site: SiteResult): string {
  if (site.verdict === 'converging') {
    // settled or oscillating sequences have no observed order (null in the JSON)
    return Number.isFinite(site.estimate.observedOrder) ? `observed order p = ${formatFixed(site.estimate.observedOrder, 2)}` : 'settled (no observed order)';
  }
  return `fitted q = ${formatFixed(site.growth.exponent, 2)}`;
}

export function convergencePlotSvg(site: SiteResult, opts: ConvergencePlotOptions): string {
  const units = opts.units;
  const L = opts.lengthUnit ?? '';
  const measure = opts.measure ?? 'peak';
  const levels = site.levels.filter((l) => l.h > 0 && Number.isFinite(l.peak));
  const width = 660, height = 330;
  const head = `<svg xmlns="http://www.w3.org/2000/svg" class="convergence-plot" data-site="${escapeXml(site.id)}" viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" font-family="${FONT}" role="img" aria-label="${escapeXml(`convergence of ${site.id}`)}">`;
  const title = `<text x="12" y="18" font-size="13" font-weight="600" fill="${INK}">${escapeXml(`${site.id}: ${measure} peak under refinement`)}</text>`;
  if (levels.length === 0) {
    return `${head}${title}<text x="12" y="60" font-size="12" fill="${INK}">No refinement levels were computed for this site.</text></svg>`;
  }
  const hs = levels.map((l) => l.h);
  const peaks = levels.map((l) => l.peak);
  const studyWindow = site.verdict === 'converging' ? 3 : VERDICT_RULES.singularWindow;
  const used = Math.min(levels.length, Math.max(2, opts.fitLevels ?? studyWindow));
  const fitSet = levels.slice(-used);
  const hFit0 = Math.max(...fitSet.map((l) => l.h)), hFit1 = Math.min(...fitSet.map((l) => l.h));
  const reported = (opts.reported ?? []).filter((r) => r.size > 0 && Number.isFinite(r.value));
  const hAll = [...hs, ...reported.map((r) => r.size)];
  const hMax = Math.max(...hAll), hMin = Math.min(...hAll);
  const finest = levels[levels.length - 1];
  const converging = site.verdict === 'converging';
  const est = site.estimate;

  // fitted trend, sampled in h over the levels the fit used
  const fitCurve: [number, number][] = [];
  const nSamples = 32;
  if (converging && Number.isFinite(est.value) && est.observedOrder > 0) {
    // peak(h) = value + c·h^p, c by least squares over the fitted levels with p fixed
    const p = est.observedOrder;
    let num = 0, den = 0;
    for (const l of fitSet) {
      const hp = l.h ** p;
      num += (l.peak - est.value) * hp;
      den += hp * hp;
    }
    const c = den > 0 ? num / den : 0;
    for (let i = 0; i <= nSamples; i++) {
      const h = hFit0 * (hFit1 / hFit0) ** (i / nSamples);
      fitCurve.push([h, est.value + c * h ** p]);
    }
  } else if (!converging && Number.isFinite(site.growth.exponent) && fitSet.every((l) => l.peak > 0)) {
    // log peak = b − q log h, b by least squares over the fitted levels with q fixed
    const q = site.growth.exponent;
    const b = fitSet.reduce((acc, l) => acc + Math.log(l.peak) + q * Math.log(l.h), 0) / fitSet.length;
    for (const h of [hFit0, hFit1]) fitCurve.push([h, Math.exp(b - q * Math.log(h))]);
  }
  // theory reference through the finest level, over the whole h range
  const theory = site.growth.theory;
  const theoryLine: [number, number][] =
    Number.isFinite(theory) && finest.peak > 0
      ? [hMax, hMin].map((h) => [h, finest.peak * (h / finest.h) ** -theory] as [number, number])
      : [];

  const yValues = [...peaks, ...fitCurve.map((p) => p[1]), ...theoryLine.map((p) => p[1]), ...reported.map((r) => r.value)];
  const band = converging && Number.isFinite(est.value) && Number.isFinite(est.uncertainty);
  if (band) yValues.push(est.value - Math.abs(est.uncertainty), est.value + Math.abs(est.uncertainty));
  const allowLogY = yValues.every((v) => v > 0);

  const main: Panel = { x: 72, y: 34, w: 330, h: 210 };
  // finer to the right: the h axis runs from hMax at the left to hMin at the right
  const axH = makeAxis([hMin, hMax], main.x + main.w, main.x, true);
  const ayMain = makeAxis(yValues, main.y + main.h, main.y, allowLogY);
  const parts: string[] = [head, title];
  parts.push(axesSvg(main, axH, ayMain, `element size h near the site${L ? ` (${L})` : ''}, finer →`, `${measure} (${units})`, false));

  const drawBand = (ax: Axis, ay: Axis, panel: Panel) => {
    if (!band) return '';
    const yTop = ay.at(est.value + Math.abs(est.uncertainty)), yBot = ay.at(est.value - Math.abs(est.uncertainty));
    const yMid = ay.at(est.value);
    return (
      `<rect class="uncertainty-band" x="${panel.x}" y="${c1(Math.min(yTop, yBot))}" width="${panel.w}" height="${c1(Math.max(0.8, Math.abs(yBot - yTop)))}" fill="${BAND}" fill-opacity="0.16"/>` +
      `<line class="extrapolated" x1="${panel.x}" x2="${panel.x + panel.w}" y1="${c1(yMid)}" y2="${c1(yMid)}" stroke="${BAND}" stroke-width="1.4"/>`
    );
  };
  parts.push(drawBand(axH, ayMain, main));
  if (theoryLine.length === 2) {
    parts.push(
      `<path class="theory-line" d="${polyline(theoryLine.map(([h, p]) => [axH.at(h), ayMain.at(p)]))}" fill="none" stroke="${THEORY}" stroke-width="1.3" stroke-dasharray="5 4"/>`,
    );
  }
  if (fitCurve.length >= 2) {
    parts.push(
      `<path class="fit-line" d="${polyline(fitCurve.map(([h, p]) => [axH.at(h), ayMain.at(p)]))}" fill="none" stroke="${FIT}" stroke-width="2"/>`,
    );
  }
  levels.forEach((l, i) => {
    const inFit = i >= levels.length - used;
    parts.push(
      `<circle class="level-point" cx="${c1(axH.at(l.h))}" cy="${c1(ayMain.at(l.peak))}" r="3.6" fill="${inFit ? POINT : '#fff'}" stroke="${POINT}" stroke-width="1.4"/>`,
    );
  });

  // reported values: a diamond of their own at (size, value)
  const diamond = (x: number, y: number, r: number) => `M${c1(x)} ${c1(y - r)}L${c1(x + r)} ${c1(y)}L${c1(x)} ${c1(y + r)}L${c1(x - r)} ${c1(y)}Z`;
  for (const r of reported) {
    parts.push(
      `<path class="reported-marker" data-finding="${escapeXml(r.finding)}" d="${diamond(axH.at(r.size), ayMain.at(r.value), 5.5)}" fill="${REPORTED}" fill-opacity="0.85" stroke="#fff" stroke-width="1"><title>${escapeXml(`${r.label ?? r.keyPath}: ${formatNumber(r.value)} ${units} at h = ${formatNumber(r.size)}${L ? ` ${L}` : ''}`)}</title></path>`,
    );
  }

  // legend and labels under the main panel
  const ly = main.y + main.h + 50;
  const slope = slopeLabel(site);
  const slopeValue = converging ? formatFixed(est.observedOrder, 2) : formatFixed(site.growth.exponent, 2);
  parts.push(
    `<g class="legend" font-size="10.5" fill="${INK}">` +
      `<circle cx="${main.x + 4}" cy="${ly - 4}" r="3.6" fill="${POINT}" stroke="${POINT}"/><circle cx="${main.x + 14}" cy="${ly - 4}" r="3.6" fill="#fff" stroke="${POINT}" stroke-width="1.4"/>` +
      `<text x="${main.x + 24}" y="${ly}">levels (filled: used in the fit)</text>` +
      (fitCurve.length >= 2 ? `<line x1="${main.x}" x2="${main.x + 18}" y1="${ly + 12}" y2="${ly + 12}" stroke="${FIT}" stroke-width="2"/>` : '') +
      `<text class="slope-label" data-value="${slopeValue}" x="${main.x + 24}" y="${ly + 16}">${escapeXml(slope)}</text>` +
      `<line x1="${main.x + 170}" x2="${main.x + 188}" y1="${ly + 12}" y2="${ly + 12}" stroke="${THEORY}" stroke-width="1.3" stroke-dasharray="5 4"/>` +
      `<text class="theory-label" x="${main.x + 194}" y="${ly + 16}">${escapeXml(theory > 0 ? `theory q = ${formatFixed(theory, 2)}` : 'theory: bounded (q = 0)')}</text>` +
      (band
        ? `<rect x="${main.x}" y="${ly + 22}" width="18" height="9" fill="${BAND}" fill-opacity="0.2" stroke="${BAND}" stroke-width="0.8"/>` +
          `<text class="estimate-label" x="${main.x + 24}" y="${ly + 31}">${escapeXml(`extrapolated ${bandText(est.value, est.uncertainty, units)} (${BAND_LABEL})`)}</text>`
        : '') +
      (reported.length > 0
        ? `<path d="${diamond(main.x + 300, ly - 4, 5)}" fill="${REPORTED}" fill-opacity="0.85"/>` +
          `<text class="reported-label" x="${main.x + 310}" y="${ly}">${escapeXml(reported.length === 1 ? 'reported by another analysis' : `${reported.length} values reported by another analysis`)}</text>`
        : '') +
      `</g>`,
  );

  // small panel: peak against degrees of freedom
  const side: Panel = { x: 490, y: 34, w: 150, h: 150 };
  const dofs = levels.map((l) => l.dofs).filter((d) => d > 0);
  if (dofs.length === levels.length) {
    const axD = makeAxis(dofs, side.x, side.x + side.w, true);
    const ySide = [...peaks];
    if (band) ySide.push(est.value - Math.abs(est.uncertainty), est.value + Math.abs(est.uncertainty));
    const ayD = makeAxis(ySide, side.y + side.h, side.y, ySide.every((v) => v > 0));
    parts.push(`<g class="dofs-panel">`);
    parts.push(axesSvg(side, axD, ayD, 'degrees of freedom', `${measure} (${units})`, true));
    parts.push(drawBand(axD, ayD, side));
    parts.push(
      `<path d="${polyline(levels.map((l) => [axD.at(l.dofs), ayD.at(l.peak)]))}" fill="none" stroke="${POINT}" stroke-width="1.1"/>`,
    );
    levels.forEach((l, i) => {
      // filled and hollow as in the main panel: the legend there covers both
      const inFit = i >= levels.length - used;
      parts.push(`<circle cx="${c1(axD.at(l.dofs))}" cy="${c1(ayD.at(l.peak))}" r="2.8" fill="${inFit ? POINT : '#fff'}" stroke="${POINT}" stroke-width="1.1"/>`);
    });
    parts.push(`</g>`);
  }
  parts.push('</svg>');
  return parts.join('');
}

/** A stress curve along a path for `cutPlotSvg`. */
export interface CutSeries {
  label: string;
  values: ArrayLike<number>;
  /** drawn dashed (a closed-form reference) */
  reference?: boolean;
  /** results of another analysis: drawn as markers joined by a thin line (issue 15 §5) */
  other?: boolean;
}

export interface CutPlotInput {
  title: string;
  /** arc length of each sample */
  s: ArrayLike<number>;
  series: CutSeries[];
  /** e.g. "arc length s (mm)" and "tangential stress (MPa)" */
  xLabel: string;
  yLabel: string;
}

/**
 * Linear plot of stresses against arc length along a `--cut`: the FE curves solid, closed-form
 * references dashed, with a legend of our own (short line samples and their labels below).
 */
export function cutPlotSvg(input: CutPlotInput): string {
  const W = 560, H = 300;
  const panel: Panel = { x: 72, y: 30, w: W - 72 - 18, h: H - 30 - 78 };
  const s = Array.from(input.s);
  const all: number[] = [];
  for (const ser of input.series) for (let i = 0; i < ser.values.length; i++) all.push(ser.values[i]);
  const ax = makeAxis(s, panel.x, panel.x + panel.w, false);
  const ay = makeAxis(all, panel.y + panel.h, panel.y, false);
  const colours = [POINT, FIT, BAND, THEORY];
  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" class="cut-plot" viewBox="0 0 ${W} ${H}" width="${W}" height="${H}" font-family="${FONT}" role="img" aria-label="${escapeXml(input.title)}">`,
    `<text x="${panel.x}" y="18" font-size="12" font-weight="600" fill="${INK}">${escapeXml(input.title)}</text>`,
    axesSvg(panel, ax, ay, input.xLabel, input.yLabel, false),
  ];
  input.series.forEach((ser, k) => {
    const colour = ser.reference ? THEORY : colours[k % colours.length];
    // a NaN sample (outside the mesh) breaks the curve instead of joining across it
    let d = '';
    let pen = false;
    for (let i = 0; i < s.length && i < ser.values.length; i++) {
      const v = ser.values[i];
      if (!Number.isFinite(v) || !Number.isFinite(s[i])) { pen = false; continue; }
      d += `${pen ? 'L' : 'M'}${c1(ax.at(s[i]))} ${c1(ay.at(v))}`;
      pen = true;
    }
    if (ser.other) {
      const col = REPORTED;
      parts.push(`<path class="other-line" d="${d}" fill="none" stroke="${col}" stroke-width="1" stroke-dasharray="2 2"/>`);
      const lx = panel.x + (k % 2) * 240, ly = H - 22 + Math.floor(k / 2) * 14;
      parts.push(
        `<path d="M${lx + 11} ${ly - 8}L${lx + 15} ${ly - 4}L${lx + 11} ${ly}L${lx + 7} ${ly - 4}Z" fill="${col}"/>`,
        `<text x="${lx + 28}" y="${ly}" font-size="10.5" fill="${INK}">${escapeXml(ser.label)}</text>`,
      );
      // a marker at every sample where the other analysis has a value, thinned to about 40
      const have = [];
      for (let i = 0; i < s.length && i < ser.values.length; i++) if (Number.isFinite(ser.values[i])) have.push(i);
      const step = Math.max(1, Math.ceil(have.length / 40));
      for (let j = 0; j < have.length; j += step) {
        const i = have[j];
        const X = ax.at(s[i]), Y = ay.at(ser.values[i]);
        parts.push(`<path class="other-marker" d="M${c1(X)} ${c1(Y - 3.5)}L${c1(X + 3.5)} ${c1(Y)}L${c1(X)} ${c1(Y + 3.5)}L${c1(X - 3.5)} ${c1(Y)}Z" fill="${col}"/>`);
      }
      return;
    }
    parts.push(`<path d="${d}" fill="none" stroke="${colour}" stroke-width="${ser.reference ? 1.3 : 1.6}"${ser.reference ? ' stroke-dasharray="5 3"' : ''}/>`);
    const lx = panel.x + (k % 2) * 240, ly = H - 22 + Math.floor(k / 2) * 14;
    parts.push(
      `<line x1="${lx}" x2="${lx + 22}" y1="${ly - 4}" y2="${ly - 4}" stroke="${colour}" stroke-width="1.6"${ser.reference ? ' stroke-dasharray="5 3"' : ''}/>`,
      `<text x="${lx + 28}" y="${ly}" font-size="10.5" fill="${INK}">${escapeXml(ser.label)}</text>`,
    );
  });
  parts.push('</svg>');
  return parts.join('');
}
