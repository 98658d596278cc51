/**
 * Values another analysis reported (issue 15; docs/other-analysis.md): each goes to the studied site it
 * belongs to, or is studied as a listed point of its own when it is far from every site, and is then
 * judged against that site's refinement ladder — is the other number converged, low or high, dependent
 * on its mesh, or from a different model?
 *
 * Our value at the other mesh's element size h is read off the ladder by interpolation in log h (log of
 * the peak too when positive, which is exact for a power law); outside the ladder the site's fitted law
 * carries it (φ₀ + α h^p at a converging site, C h^-q at a singular one, the end trend otherwise) with a
 * warning, up to OTHER_ANALYSIS_RULES.extrapolationLimit times beyond the ladder's ends, and no further.
 */
import { isPeakwiseError } from '../errors.js';
import type { Point, ReportedValue, StressMeasure } from '../model/types.js';
import type { ReportedAssessment, SiteResult } from './types.js';
import type { SiteCandidate } from './sites.js';

/** The stated rules of the comparison (docs/other-analysis.md explains each). */
export const OTHER_ANALYSIS_RULES = {
  /**
   * a reported point belongs to a site within this many local element sizes (the larger of the model's
   * size there and the reported size), the radius within which nearby maxima merge into one site
   */
  matchSizes: 3,
  /**
   * the "typical edge length" of two meshes is known only to this factor (common practice: edge lengths
   * of one mesh at one spot spread by about ±25 %); our value's band at size h is its change over
   * h/f … h·f
   */
  sizeFactor: 1.25,
  /**
   * stated tolerance beyond that band before "the models differ": two programs' element formulations,
   * stress recovery (nodal averaging vs SPR) and mesh patterns differ by a few per cent at one size
   * (common practice)
   */
  tolerance: 0.05,
  /**
   * a size up to this factor outside the ladder (one halving of the usual ratio) is extrapolated with the
   * fitted law, beyond it refused: the law is fitted where the ladder is, and coarser meshes are seldom
   * in its asymptotic range
   */
  extrapolationLimit: 2,
  /** the accuracies the needed element sizes are given for, per cent */
  percents: [1, 2, 5] as const,
} as const;

/** Our value at one element size, or why there is none. */
export type ValueAtSize =
  | { value: number; from: 'ladder' | 'extrapolated'; warning?: string }
  | { refused: string };

const g = (v: number) => String(Number(v.toPrecision(4)));
const pct = (v: number) => String(Number((100 * v).toPrecision(2)));

/**
 * The site's peak at element size h from its ladder: interpolated in log h inside [h_finest, h_coarsest],
 * extrapolated with the fitted law up to OTHER_ANALYSIS_RULES.extrapolationLimit beyond, refused further.
 */
export function valueAtSize(site: Pick<SiteResult, 'levels' | 'verdict' | 'estimate' | 'growth'>, h: number, formalOrder: 1 | 2, lengthUnit = ''): ValueAtSize {
  const levels = site.levels.filter((l) => l.h > 0 && Number.isFinite(l.peak));
  const n = levels.length;
  if (n === 0) return { refused: 'the site has no refinement levels' };
  const L = lengthUnit ? ` ${lengthUnit}` : '';
  const hMax = levels[0].h, hMin = levels[n - 1].h;
  const tolH = 1e-9 * hMax;
  if (h <= hMax + tolH && h >= hMin - tolH) {
    if (n === 1) return { value: levels[0].peak, from: 'ladder' };
    let k = 0;
    while (k < n - 2 && levels[k + 1].h > h) k++;
    const a = levels[k], b = levels[k + 1];
    const t = Math.min(1, Math.max(0, (Math.log(a.h) - Math.log(h)) / (Math.log(a.h) - Math.log(b.h))));
    const value = a.peak > 0 && b.peak > 0 ? Math.exp((1 - t) * Math.log(a.peak) + t * Math.log(b.peak)) : (1 - t) * a.peak + t * b.peak;
    return { value, from: 'ladder' };
  }
  const coarser = h > hMax;
  const factor = coarser ? h / hMax : hMin / h;
  const limit = OTHER_ANALYSIS_RULES.extrapolationLimit;
  const span = `the ladder runs from h = ${g(hMax)} to ${g(hMin)}${L}`;
  if (factor > limit) {
    const fix = coarser
      ? `start the ladder coarser (mesh.size or mesh.local near this point at least ${g(h / limit)}${L})`
      : 'add refinement levels (study.levels)';
    return { refused: `size ${g(h)}${L} is ${g(factor)}× ${coarser ? 'coarser than the coarsest' : 'finer than the finest'} level (${span}); beyond ${limit}× the fitted law is not trusted: ${fix}` };
  }
  // the law through the ladder's end level (continuous there), with the fitted exponent
  const end = coarser ? levels[0] : levels[n - 1];
  let value: number, law: string;
  const est = site.estimate;
  if (site.verdict === 'converging' && Number.isFinite(est.value)) {
    // the order capped at the element's formal order, as in the band (band.ts): coarser meshes converge no faster
    const p = Number.isFinite(est.observedOrder) && est.observedOrder > 0 ? Math.min(est.observedOrder, formalOrder) : formalOrder;
    value = est.value + (end.peak - est.value) * (h / end.h) ** p;
    law = `φ₀ + αh^${g(p)}`;
  } else if (site.verdict === 'singular' && Number.isFinite(site.growth.exponent) && end.peak > 0) {
    const q = site.growth.exponent;
    value = end.peak * (h / end.h) ** -q;
    law = `C h^-${g(q)}`;
  } else {
    // undecided: the trend of the ladder's end segment, linear in log h
    const [a, b] = coarser ? [levels[0], levels[Math.min(1, n - 1)]] : [levels[Math.max(0, n - 2)], levels[n - 1]];
    const slope = a.h === b.h ? 0 : (a.peak - b.peak) / (Math.log(a.h) - Math.log(b.h));
    value = b.peak + slope * (Math.log(h) - Math.log(b.h));
    law = 'the trend of the end of the ladder';
  }
  return {
    value, from: 'extrapolated',
    warning: `size ${g(h)}${L} lies ${g(factor)}× ${coarser ? 'beyond the coarsest' : 'beyond the finest'} level (${span}): our value there is extrapolated with ${law}`,
  };
}

/** Our value at h with its band: the largest change over h/f … h·f (f = OTHER_ANALYSIS_RULES.sizeFactor). */
export function bandedValueAtSize(site: Pick<SiteResult, 'levels' | 'verdict' | 'estimate' | 'growth'>, h: number, formalOrder: 1 | 2, lengthUnit = ''): (ValueAtSize & { band?: number }) {
  const at = valueAtSize(site, h, formalOrder, lengthUnit);
  if ('refused' in at) return at;
  const f = OTHER_ANALYSIS_RULES.sizeFactor;
  let band = 0;
  for (const hh of [h / f, h * f]) {
    const o = valueAtSize(site, hh, formalOrder);
    if (!('refused' in o)) band = Math.max(band, Math.abs(o.value - at.value));
  }
  return { ...at, band };
}

/**
 * Which site each reported point belongs to: the nearest site within OTHER_ANALYSIS_RULES.matchSizes ×
 * max(local model size, reported size); -1 when none is that close (the point is then studied itself).
 */
export function matchReported(points: readonly Point[], sizes: readonly number[], sites: readonly Pick<SiteCandidate, 'at'>[], localSize: (x: number, y: number) => number): number[] {
  return points.map((p, i) => {
    const tol = OTHER_ANALYSIS_RULES.matchSizes * Math.max(localSize(p[0], p[1]), sizes[i]);
    let best = -1, bestD = Infinity;
    sites.forEach((s, j) => {
      const d = Math.hypot(s.at[0] - p[0], s.at[1] - p[1]);
      if (d <= tol && d < bestD) { best = j; bestD = d; }
    });
    return best;
  });
}

/** The points of `points` with no site, one per spot (points closer than `same` count once). */
export function unmatchedPoints(points: readonly Point[], match: readonly number[], same: number): Point[] {
  const out: Point[] = [];
  points.forEach((p, i) => {
    if (match[i] >= 0) return;
    if (out.some((q) => Math.hypot(q[0] - p[0], q[1] - p[1]) <= same)) return;
    out.push([p[0], p[1]]);
  });
  return out;
}

/** Our own solve at the reported size with the reported element order: the site's peak there. */
export type OwnSolve = (h: number, order: 1 | 2) => number;

export interface AssessContext {
  /** the study's element order and measure */
  order: 1 | 2;
  measure: StressMeasure;
  units: { length: string; stress: string };
  /** solves the model once at size h near the site with that order (used when `order` differs from the study's) */
  ownSolve?: OwnSolve;
}

/**
 * Order of the error law φ − φ₀ ∝ h^p the other mesh follows near its size, for the sizes it needs: with the
 * study's elements the ladder's observed order; with other elements the order our own solves of that order
 * show between the reported size and half of it. Either is capped at that element's formal order (CST 1,
 * LST 2; a coarse mesh converges no faster) and taken as that order when it cannot be measured; at least a
 * quarter of it, so that a stalled pair of solves cannot ask for absurd sizes.
 */
function effectiveOrder(site: SiteResult, r: ReportedValue, ours: NonNullable<ReportedAssessment['ours']>, ctx: AssessContext): { p: number; how: string } {
  const formal = r.order ?? ctx.order;
  const phi0 = site.estimate.value;
  let p = site.estimate.observedOrder;
  let how = 'the observed order of the ladder';
  if (ours.from === 'own solve' && ctx.ownSolve) {
    let half = NaN;
    try { half = ctx.ownSolve(r.size / 2, formal); } catch (e) { if (!isPeakwiseError(e)) throw e; }
    const e1 = Math.abs(ours.value - phi0), e2 = Math.abs(half - phi0);
    p = e1 > 0 && e2 > 0 ? Math.log2(e1 / e2) : NaN;
    how = `our own solves with ${formal === 1 ? 'linear' : 'quadratic'} elements at h and h/2`;
  }
  if (!Number.isFinite(p) || p < 0.25 * formal) return { p: formal, how: `assumed: the element's formal order (${how} do not show a usable one)` };
  if (p > formal) return { p: formal, how: `the element's formal order (${how} show ${g(p)}, capped)` };
  return { p, how };
}

/** The readouts a singular site offers instead of its peak, in words. */
function readoutsInstead(site: SiteResult, units: { length: string; stress: string }): { name: string; value: number; unit: string }[] {
  const r = site.readouts;
  const S = units.stress, L = units.length;
  const out: { name: string; value: number; unit: string }[] = [];
  const push = (name: string, v: number | undefined, unit: string) => { if (v !== undefined && Number.isFinite(v)) out.push({ name, value: v, unit }); };
  if (r.distance !== undefined) {
    push(`stress at r = ${g(r.distance)} ${L}`, r.atDistance, S);
    push(`mean over the disk r ≤ ${g(r.distance)} ${L}`, r.average, S);
  }
  if (r.lineLength !== undefined) push(`mean along 0 ≤ r ≤ ${g(r.lineLength)} ${L}`, r.lineAverage, S);
  if (r.criticalDistance !== undefined) {
    push(`point method at L/2 = ${g(r.criticalDistance / 2)} ${L}`, r.pointMethod, S);
    push(`line method over 2L = ${g(2 * r.criticalDistance)} ${L}`, r.lineMethod, S);
  }
  push('notch stress intensity K_I', r.nsif, r.nsifUnits ?? '');
  return out;
}

/**
 * What a reported value is worth (issue 15 §3), against the site it belongs to: our value at its size
 * with its band first — further apart than band + tolerance, the models differ and nothing else is said;
 * then by the site's verdict: how far from the converged value and the sizes the other mesh needs for
 * 1, 2 and 5 %; the value a singular peak has at that size, what halving adds, and the readouts to use;
 * or what an undecided site needs.
 */
export function assessReported(r: ReportedValue, site: SiteResult, distance: number, added: boolean, ctx: AssessContext): ReportedAssessment {
  const R = OTHER_ANALYSIS_RULES;
  const S = ctx.units.stress, L = ctx.units.length;
  const base: ReportedAssessment = {
    keyPath: r.keyPath, at: r.at, value: r.value, size: r.size, measure: r.measure,
    ...(r.case !== undefined ? { case: r.case } : {}), ...(r.label !== undefined ? { label: r.label } : {}), ...(r.order !== undefined ? { order: r.order } : {}),
    site: site.id, distance, ...(added ? { added: true as const } : {}),
    verdict: site.verdict, finding: 'not-compared', words: '', tolerance: R.tolerance,
  };
  if (r.measure !== ctx.measure) {
    return { ...base, words: `not compared: this value is ${r.measure}, the study reads ${ctx.measure}; study the model with study.measure: ${r.measure} to compare it` };
  }
  const otherOrder = r.order ?? ctx.order;
  // our value at that size: the ladder, or our own solve of the other analysis's element order
  let ours: NonNullable<ReportedAssessment['ours']>;
  let warning: string | undefined;
  if (r.order !== undefined && r.order !== ctx.order && ctx.ownSolve) {
    const f = R.sizeFactor;
    try {
      const v = ctx.ownSolve(r.size, r.order);
      const band = Math.max(Math.abs(ctx.ownSolve(r.size / f, r.order) - v), Math.abs(ctx.ownSolve(r.size * f, r.order) - v));
      ours = { value: v, band, from: 'own solve', order: r.order, allowed: band + R.tolerance * Math.abs(v) };
    } catch (e) {
      // a solve the limits refuse (dof cap, factor memory) or a mesh that fails: said, not thrown
      if (!isPeakwiseError(e)) throw e;
      return { ...base, words: `not compared: peakwise's own solve with ${r.order === 1 ? 'linear' : 'quadratic'} elements at size ${g(r.size)} ${L} failed (${e.message})` };
    }
  } else {
    const at = bandedValueAtSize(site, r.size, ctx.order, L);
    if ('refused' in at) return { ...base, words: `not compared: ${at.refused}` };
    const band = at.band ?? 0;
    ours = { value: at.value, band, from: at.from, order: ctx.order, allowed: band + R.tolerance * Math.abs(at.value) };
    warning = at.warning;
  }
  const diff = r.value - ours.value;
  const scale = Math.max(Math.abs(ours.value), Number.MIN_VALUE);
  const limit = ours.allowed;
  const withOurs = {
    ...base, ours, difference: diff / scale, ...(warning ? { warning } : {}),
  };
  const oursWords = `peakwise gives ${g(ours.value)} ± ${g(ours.band)} ${S} at the same element size ${g(r.size)} ${L}${ours.from === 'own solve' ? ` (its own solve with ${ours.order === 1 ? 'linear' : 'quadratic'} elements)` : ours.from === 'extrapolated' ? ' (extrapolated)' : ''}`;
  if (Math.abs(diff) > limit) {
    return {
      ...withOurs, finding: 'models-differ',
      words: `the models differ at this spot: the other analysis reports ${g(r.value)} ${S} where ${oursWords} — ${pct(Math.abs(diff) / scale)} % apart, more than that band plus ${pct(R.tolerance)} %. Check the geometry, loads, supports and material of the two models here before reading anything else`,
    };
  }
  if (site.verdict === 'converging') {
    const phi0 = site.estimate.value, U = site.estimate.uncertainty;
    const off = (r.value - phi0) / Math.abs(phi0);
    const err = Math.abs(off);
    const { p, how } = effectiveOrder(site, r, ours, ctx);
    const needed = R.percents.map((e) => ({ percent: e, size: err <= e / 100 ? null : r.size * ((e / 100) / err) ** (1 / p) }));
    const inside = Math.abs(r.value - phi0) <= U;
    const side = off < 0 ? 'low' : 'high';
    const head = inside
      ? `converged: the reported value lies inside peakwise's band of the converged value ${g(phi0)} ± ${g(U)} ${S}`
      : `≈ ${pct(err)} % ${side} against the converged value ${g(phi0)} ± ${g(U)} ${S} (the models agree: ${oursWords})`;
    const sizes = needed.map((n) => (n.size === null ? `${n.percent} %: already` : `${n.percent} %: ${g(n.size)} ${L}`)).join(', ');
    const wide = U / Math.abs(phi0) > 0.01 ? `; peakwise's own band is ±${pct(U / Math.abs(phi0))} %, so the finest of these is indicative` : '';
    return {
      ...withOurs, finding: inside ? 'converged' : side,
      converged: { value: phi0, uncertainty: U }, offset: off,
      neededSize: needed, neededOrder: p,
      words: `${head}. Element size the other mesh needs here (error ∝ h^${g(p)}, ${how}): ${sizes}${wide}`,
    };
  }
  if (site.verdict === 'singular') {
    const half = valueAtSize(site, r.size / 2, ctx.order, L);
    const increase = 'refused' in half ? NaN : half.value / ours.value - 1;
    const q = site.growth.exponent, qt = site.growth.theory;
    const instead = readoutsInstead(site, ctx.units);
    const insteadWords = instead.length > 0 ? instead.map((x) => `${x.name} = ${g(x.value)} ${x.unit}`.trimEnd()).join('; ') : 'model the real corner radius and study that';
    return {
      ...withOurs, finding: 'mesh-dependent', halvingIncrease: increase, readouts: instead,
      words: `mesh-dependent: this peak grows like h^-${g(q)} under refinement${qt > 0 ? ` (theory q = ${g(qt)})` : ''}, so the reported number is what a mesh of size ${g(r.size)} ${L} gives, not a stress (${oursWords}). `
        + `Halving the element size would add ${Number.isFinite(increase) ? `${pct(increase)} %` : 'an unknown amount'}${Number.isFinite(q) ? ` (2^q − 1 = ${pct(2 ** q - 1)} %)` : ''}. Use instead: ${insteadWords}`,
    };
  }
  return {
    ...withOurs, finding: 'undecided',
    ...(site.advice ? { needed: site.advice } : {}),
    words: `undecided: peakwise cannot yet tell whether this peak converges (${site.reason}); ${oursWords}. To tell: ${site.advice ?? 'add refinement levels'}`,
  };
}
