import type { BandComponents, Verdict } from './types.js';
import { GCI_SAFETY_FACTOR, incrementExponent, logLogSlope, threeLevelFit, type ThreeLevelFit } from './fit.js';
import { BAND_RULES, ecaHoekstraBand, farFieldHalfWidth, finestSpread, type BandEstimate } from './band.js';

/** Thresholds of the verdict rules (docs/study.md explains each one). */
export const VERDICT_RULES = {
  /** smallest growth exponent called singular */
  minSingularQ: 0.1,
  /** largest standard error of q accepted, absolute and relative to q */
  maxQSe: 0.05,
  maxQSeRelative: 0.25,
  /** both finest increments below this fraction of the peak: settled */
  settledFraction: 1e-3,
  /** oscillatory convergence (|R| < 1) is accepted when the last three peaks span at most this fraction */
  oscillationFraction: 1e-2,
  /** levels used for the singular fit (finest ones) */
  singularWindow: 4,
  /** measured and predicted exponents further apart than this disagree */
  theoryTolerance: 0.1,
  /** safety factor of the three-level fallback band: an order three levels cannot check (Roache 1998) */
  threeLevelSafety: 3,
} as const;

export interface FitHistoryEntry {
  /** index of the finest level of the triple */
  finest: number;
  /** three-level Richardson value of the triple (the finest peak when the triple is not monotone) */
  value: number;
  /** three-level GCI of the triple, F_s = 1.25 (Roache 1998) — shown for the trend, not the band */
  uncertainty: number;
  observedOrder: number;
  kind: ThreeLevelFit['kind'];
}

export interface SiteEstimate {
  value: number;
  /** half-width of the band value ± uncertainty that must hold the exact value */
  uncertainty: number;
  observedOrder: number;
  /** where the half-width comes from (converging sites only) */
  components?: BandComponents;
}

export interface SiteVerdict {
  verdict: Verdict;
  reason: string;
  advice?: string;
  estimate: SiteEstimate;
  growth: { exponent: number; exponentUncertainty: number; theory: number };
  /** Richardson/GCI of every consecutive triple, coarse → fine (the band should shrink) */
  history: FitHistoryEntry[];
  /** slope of log(peak) against log(h) over the fit window (peak ∝ h^slope) */
  peakSlope: number;
}

const fmt = (v: number, d = 3) => (Number.isFinite(v) ? v.toFixed(d) : String(v));
const finiteOr = (v: number, d: number) => (Number.isFinite(v) ? v : d);

/** The converged value and the two parts of its band the ladder sees (the far field is added later). */
interface LadderBand {
  value: number;
  discretisation: number;
  scatter: number;
  observedOrder: number;
  /** words for the reason: how the band was made */
  how: string;
}

/**
 * Band from the ladder: the least-squares fits of Eça & Hoekstra (2014) over the finest levels when
 * there are four or more, else the three-level fallback — Richardson with the order capped at the
 * formal order, F_s = 3, never below the spread of the three values (docs/study.md, "Bands").
 */
function ladderBand(peak: readonly number[], r: number, formalOrder: 1 | 2, fit: ThreeLevelFit, ls: BandEstimate | undefined): LadderBand {
  const n = peak.length;
  if (ls) {
    const b = ls;
    const form = b.fit.form === 'free' ? `φ₀ + αh^p, p = ${fmt(b.observedOrder, 2)}` : b.fit.form === 'two-term' ? 'φ₀ + α₁h + α₂h²' : `φ₀ + αh^${fmt(b.orderUsed[0], 2).replace(/\.00$/, '')}`;
    const why = b.good ? '' : b.fit.form === 'free' ? ' (scatter large against the data range)' : Number.isFinite(b.observedOrder) && b.observedOrder > formalOrder ? `, order capped at the element's ${formalOrder}` : ', order outside the range';
    const observedOrder = b.observedOrder > BAND_RULES.orderSearch[0] * 1.0001 && b.observedOrder < BAND_RULES.orderSearch[1] * 0.9999 ? b.observedOrder : NaN;
    return {
      value: b.good && b.fit.form === 'free' ? b.value : peak[n - 1],
      discretisation: b.components.discretisation,
      scatter: b.components.scatter,
      observedOrder,
      how: `least-squares fit ${form} over the finest ${b.levels} levels${b.fit.weighted ? ' (weighted)' : ''}${why}; band F_s = ${b.safetyFactor} (Eça & Hoekstra 2014)${b.floored ? ', raised to the spread of the finest three peaks' : ''}`,
    };
  }
  const f1 = peak[n - 1], f2 = peak[n - 2];
  const floor = finestSpread(peak);
  const Fs = VERDICT_RULES.threeLevelSafety;
  if (fit.kind === 'monotone' && fit.p >= BAND_RULES.goodOrderLow * formalOrder) {
    const pUsed = Math.min(fit.p, formalOrder);
    const rp1 = Math.pow(r, pUsed) - 1;
    const u = Math.max((Fs * Math.abs(f1 - f2)) / rp1, floor);
    return {
      value: f1 + (f1 - f2) / rp1, discretisation: u, scatter: 0, observedOrder: fit.p,
      how: `three levels only: Richardson with order ${fmt(pUsed, 2)}${fit.p > formalOrder ? ` (capped at the element's ${formalOrder})` : ''}, band F_s = ${Fs} and at least the spread of the three peaks`,
    };
  }
  const hi = Math.max(...peak.slice(-3)), lo = Math.min(...peak.slice(-3));
  return {
    value: 0.5 * (hi + lo), discretisation: Math.max(Fs * 0.5 * (hi - lo), floor), scatter: 0, observedOrder: NaN,
    how: `three levels only: value the middle of the three peaks, band F_s = ${Fs} × half their spread`,
  };
}

/**
 * Verdict for one site from its peaks on levels of size h (coarse → fine, constant ratio r).
 * `order` is the element order (1 or 2), which is also the formal order of its stresses; `theory` the
 * predicted growth exponent q_th = 1 − λ (0: none); `theoryWhy` names what theory sees ("concentrated
 * load", "re-entrant corner 270°", …). `farFieldShift` is the change of the finest peak when the
 * mesh outside the refined cores is coarsened by BAND_RULES.farField.coarsening (run.ts solves it); absent: not assessed.
 */
export function judgeSite(
  h: readonly number[], peak: readonly number[], r: number, order: 1 | 2, theory: number, theoryWhy = '', farFieldShift?: number,
): SiteVerdict {
  const n = peak.length;
  const R = VERDICT_RULES;
  const growthTheory = theory;
  const history: FitHistoryEntry[] = [];
  for (let k = 2; k < n; k++) {
    const fit = threeLevelFit(peak[k], peak[k - 1], peak[k - 2], r);
    const pUsed = Math.min(Math.max(fit.p, 0.5), 2 * order + 2);
    const rp1 = Math.pow(r, pUsed) - 1;
    const est = fit.kind === 'monotone'
      ? { value: peak[k] + (peak[k] - peak[k - 1]) / rp1, uncertainty: (GCI_SAFETY_FACTOR * Math.abs(peak[k] - peak[k - 1])) / rp1 }
      : { value: peak[k], uncertainty: GCI_SAFETY_FACTOR * Math.abs(peak[k] - peak[k - 1]) };
    history.push({ finest: k, value: est.value, uncertainty: est.uncertainty, observedOrder: finiteOr(fit.p, 0), kind: fit.kind });
  }
  const last = n > 0 ? peak[n - 1] : NaN;
  const base = {
    estimate: { value: last, uncertainty: NaN, observedOrder: NaN },
    growth: { exponent: NaN, exponentUncertainty: NaN, theory: growthTheory },
    history,
    peakSlope: NaN,
  };
  if (n < 3) {
    return {
      ...base, verdict: 'undecided', reason: `too few levels (${n}): three are needed for a convergence fit`,
      advice: 'run at least 3 refinement levels (4 or more to tell a singularity from slow convergence)',
    };
  }
  const w = Math.min(n, R.singularWindow);
  const hw = h.slice(n - w), fw = peak.slice(n - w);
  const slope = logLogSlope(hw, fw);
  const inc = incrementExponent(hw, fw);
  const f1 = peak[n - 1], f2 = peak[n - 2], f3 = peak[n - 3];
  const fit = threeLevelFit(f1, f2, f3, r);
  const peakSlope = slope.slope;
  const theorySays = growthTheory > 0 ? ` theory predicts a singularity (${theoryWhy || 'wedge analysis'}, q = ${fmt(growthTheory)})` : '';
  const scale = Math.max(Math.abs(f1), Number.MIN_VALUE);
  const minOrder = BAND_RULES.goodOrderLow * order;

  // (1) singular: the increments of the finest levels keep one sign, grow steadily, q > 0.1 with small scatter
  const growing = inc.sameSign && Math.sign(f1) * inc.sign > 0;
  const qOk = inc.q > R.minSingularQ;
  const seOk = !Number.isFinite(inc.qSe) || inc.qSe <= Math.max(R.maxQSe, R.maxQSeRelative * inc.q);
  // where theory predicts a bounded stress, two growing increments (3 levels) are not enough to
  // contradict it: a coarse ladder often still climbs toward a finite value (pre-asymptotic)
  const evidenceOk = growthTheory > 0 || w >= R.singularWindow;
  if (growing && qOk && seOk && evidenceOk) {
    const q = inc.q;
    const qSe = Number.isFinite(inc.qSe) ? inc.qSe : Math.abs(Math.log(Math.abs((f1 - f2) / (f2 - f3))) / Math.log(r) - q);
    let reason = `peak keeps rising like h^-${fmt(q)} over the finest ${w} levels`;
    if (growthTheory > 0) {
      reason += Math.abs(q - growthTheory) > R.theoryTolerance
        ? `; this disagrees with the theory value ${fmt(growthTheory)} (${theoryWhy || 'wedge analysis'}) by more than ${R.theoryTolerance}`
        : `, as theory predicts for a ${theoryWhy || 'singular point'} (q = ${fmt(growthTheory)})`;
    } else {
      reason += '; theory predicts no singularity here: check the geometry, supports and loads near this site';
    }
    return {
      verdict: 'singular', reason,
      advice: 'do not read the peak as a stress: use the readouts (stress at a distance, average, notch stress intensity) or model the real radius',
      // no value: the peak of a singular site is not a stress (it is in levels[].peak)
      estimate: { value: NaN, uncertainty: NaN, observedOrder: NaN },
      growth: { exponent: q, exponentUncertainty: qSe, theory: growthTheory },
      history, peakSlope,
    };
  }

  const ls = n >= 4 ? ecaHoekstraBand(h, peak, order) : undefined;
  const farField = farFieldShift === undefined ? NaN : farFieldHalfWidth(farFieldShift, order);
  const converged = (how: string): SiteVerdict => {
    const b = ladderBand(peak, r, order, fit, ls);
    const ff = Number.isFinite(farField) ? farField : 0;
    const farWords = Number.isFinite(farField) ? `; far field ± ${farField.toPrecision(2)} (outer mesh coarsened ${BAND_RULES.farField.coarsening}×)` : '; far field not assessed';
    return {
      verdict: 'converging',
      reason: `${how}; ${b.how}${farWords}` + (growthTheory > 0 ? `; but${theorySays}: the rise may not have started at these sizes` : ''),
      ...(growthTheory > 0 ? { advice: 'refine further (more levels) before trusting this value' } : {}),
      estimate: {
        value: b.value,
        uncertainty: b.discretisation + b.scatter + ff,
        observedOrder: b.observedOrder,
        components: { discretisation: b.discretisation, scatter: b.scatter, farField },
      },
      growth: { exponent: -peakSlope, exponentUncertainty: finiteOr(slope.slopeSe, NaN), theory: growthTheory },
      history, peakSlope,
    };
  };

  // (2) converging: with four or more levels the increments over the singular window keep one sign and
  // shrink on average, and the least-squares order (Eça & Hoekstra 2014) is at least p_f/4 (a rising or
  // irregular sequence fits only a smaller one); where theory predicts a singularity the finest triple
  // must be monotone too. With three levels: the finest triple monotone with that order.
  const lsOrder = ls ? ls.observedOrder : fit.p;
  const lsConverges = ls !== undefined && lsOrder >= minOrder && inc.sameSign && inc.q < 0 && (growthTheory === 0 || fit.kind === 'monotone');
  if (ls ? lsConverges : fit.kind === 'monotone' && fit.p >= minOrder) {
    const words = ls && lsOrder >= BAND_RULES.orderSearch[1] * 0.9999
      ? `converges: the finest levels settle faster than any order up to ${BAND_RULES.orderSearch[1]} describes`
      : `converges with observed order ${fmt(lsOrder, 2)}`;
    return converged(words);
  }
  // (3) settled: both finest increments below 0.1 % of the peak, whatever their signs
  if (Math.abs(f1 - f2) <= R.settledFraction * scale && Math.abs(f2 - f3) <= R.settledFraction * scale) {
    return converged(`settled: the last two changes are below ${R.settledFraction * 100} % of the peak (${fit.kind})`);
  }
  // (3b) oscillatory convergence (R < 0), accepted only where no singularity is predicted and the last
  // three peaks span at most 1 % (common practice; Stern, Wilson, Coleman & Paterson, J. Fluids Eng. 123
  // (2001) describe the oscillatory class). Swings that do not shrink yet (|R| ≥ 1) are accepted on the
  // same terms, and the reason says so.
  if (fit.kind === 'oscillatory' && growthTheory === 0) {
    const hi = Math.max(f1, f2, f3);
    const lo = Math.min(f1, f2, f3);
    if (hi - lo <= R.oscillationFraction * scale) {
      const how = Math.abs(fit.R) < 1
        ? `converges with shrinking oscillations (R = ${fmt(fit.R, 2)})`
        : `oscillates within ${fmt((100 * (hi - lo)) / scale, 2)} % over the last three levels, swings not yet shrinking (R = ${fmt(fit.R, 2)})`;
      return converged(how);
    }
  }
  // (4) undecided, with the reason
  let reason: string;
  let advice: string;
  if (fit.kind === 'oscillatory' || !inc.sameSign) {
    reason = `oscillating: the peak goes up and down between the finest levels (R = ${fmt(fit.R, 2)})`;
    advice = 'add levels or start finer; a larger neighbourhood radius or a smoother size grading also helps';
  } else if (fit.kind === 'monotone' || (ls && inc.q < 0)) {
    reason = `not yet asymptotic: converging, but with observed order ${fmt(lsOrder, 2)} below ${fmt(minOrder, 2)}`;
    advice = 'add levels (or start finer) until the observed order settles';
  } else if (growing && qOk && !evidenceOk) {
    reason = `not yet asymptotic: the peak still rises (q = ${fmt(inc.q)}) over ${w} levels, where theory predicts a bounded stress`;
    advice = 'add levels: at least 4 are needed before a rise can be called a singularity here';
  } else {
    reason = `not yet asymptotic: the peak grows (q = ${fmt(inc.q)} ± ${fmt(inc.qSe)}) but not steadily enough to call`;
    advice = 'add levels: a singular site needs at least 4 levels in the asymptotic range';
  }
  if (growthTheory > 0) reason += `;${theorySays}`;
  return {
    verdict: 'undecided', reason, advice,
    estimate: { value: f1, uncertainty: NaN, observedOrder: finiteOr(fit.p, NaN) },
    growth: { exponent: inc.q, exponentUncertainty: finiteOr(inc.qSe, NaN), theory: growthTheory },
    history, peakSlope,
  };
}
