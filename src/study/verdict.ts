import type { Verdict } from './types.js';
import { GCI_SAFETY_FACTOR, incrementExponent, logLogSlope, threeLevelFit, type ThreeLevelFit } from './fit.js';

/** Thresholds of the verdict rules (docs/study.md explains each one). */
export const VERDICT_RULES = {
  /** smallest growth exponent called singular */
  minSingularQ: 0.1,
  /** largest standard error of q accepted, absolute and relative to q */
  maxQSe: 0.05,
  maxQSeRelative: 0.25,
  /** plausible observed orders for Richardson: [0.5, 2·order + 2] */
  minOrder: 0.5,
  /** both finest increments below this fraction of the peak: settled */
  settledFraction: 1e-3,
  /** oscillatory convergence (|R| < 1) is accepted when the last three peaks span at most this fraction */
  oscillationFraction: 1e-2,
  /** levels used for the singular fit (finest ones) */
  singularWindow: 4,
  /** measured and predicted exponents further apart than this disagree */
  theoryTolerance: 0.1,
} as const;

export interface FitHistoryEntry {
  /** index of the finest level of the triple */
  finest: number;
  value: number;
  uncertainty: number;
  observedOrder: number;
  kind: ThreeLevelFit['kind'];
}

export interface SiteVerdict {
  verdict: Verdict;
  reason: string;
  advice?: string;
  estimate: { value: number; uncertainty: number; observedOrder: number };
  growth: { exponent: number; exponentUncertainty: number; theory: number };
  /** Richardson/GCI of every consecutive triple, coarse → fine (the band should shrink) */
  history: FitHistoryEntry[];
  /** slope of log(peak) against log(h) over the fit window (peak ∝ h^slope) */
  peakSlope: number;
}

const fmt = (v: number, d = 3) => (Number.isFinite(v) ? v.toFixed(d) : String(v));
const finiteOr = (v: number, d: number) => (Number.isFinite(v) ? v : d);

function richardson(f1: number, f2: number, fit: ThreeLevelFit, r: number, pUsed: number) {
  const rp1 = Math.pow(r, pUsed) - 1;
  const value = f1 + (f1 - f2) / rp1;
  const uncertainty = (GCI_SAFETY_FACTOR * Math.abs(f1 - f2)) / rp1;
  return { value, uncertainty, observedOrder: fit.p };
}

/**
 * Verdict for one site from its peaks on levels of size h (coarse → fine, constant ratio r).
 * `order` is the element order (1 or 2); `theory` the predicted growth exponent q_th = 1 − λ (0: none);
 * `theoryWhy` names what theory sees ("concentrated load", "re-entrant corner 270°", …).
 */
export function judgeSite(
  h: readonly number[], peak: readonly number[], r: number, order: 1 | 2, theory: number, theoryWhy = '',
): SiteVerdict {
  const n = peak.length;
  const R = VERDICT_RULES;
  const maxOrder = 2 * order + 2;
  const growthTheory = theory;
  const history: FitHistoryEntry[] = [];
  for (let k = 2; k < n; k++) {
    const fit = threeLevelFit(peak[k], peak[k - 1], peak[k - 2], r);
    const pUsed = Math.min(Math.max(fit.p, R.minOrder), maxOrder);
    const est = fit.kind === 'monotone' ? richardson(peak[k], peak[k - 1], fit, r, pUsed) : { value: peak[k], uncertainty: GCI_SAFETY_FACTOR * Math.abs(peak[k] - peak[k - 1]), observedOrder: fit.p };
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

  const converged = (value: number, uncertainty: number, observedOrder: number, how: string): SiteVerdict => ({
    verdict: 'converging',
    reason: how + (growthTheory > 0 ? `; but${theorySays}: the rise may not have started at these sizes` : ''),
    ...(growthTheory > 0 ? { advice: 'refine further (more levels) before trusting this value' } : {}),
    estimate: { value, uncertainty, observedOrder },
    growth: { exponent: -peakSlope, exponentUncertainty: finiteOr(slope.slopeSe, NaN), theory: growthTheory },
    history, peakSlope,
  });

  // (2) monotone convergence with a plausible observed order: Richardson + GCI
  if (fit.kind === 'monotone' && fit.p >= R.minOrder) {
    const pUsed = Math.min(fit.p, maxOrder);
    const est = richardson(f1, f2, fit, r, pUsed);
    const capped = fit.p > maxOrder ? ` (order capped at ${maxOrder} for the extrapolation)` : '';
    return converged(est.value, est.uncertainty, fit.p,
      `converges monotonically with observed order ${fmt(fit.p, 2)}${capped}; Richardson extrapolation, GCI band (F_s = 1.25)`);
  }
  // (3) settled: both finest increments below 0.1 % of the peak, whatever their signs
  if (Math.abs(f1 - f2) <= R.settledFraction * scale && Math.abs(f2 - f3) <= R.settledFraction * scale) {
    const u = GCI_SAFETY_FACTOR * Math.max(Math.abs(f1 - f2), Math.abs(f2 - f3));
    return converged(f1, u, fit.kind === 'monotone' ? fit.p : NaN, `settled: the last two changes are below ${R.settledFraction * 100} % of the peak (${fit.kind}); band 1.25 × the larger change`);
  }
  // (3b) oscillatory convergence (R < 0). Stern, Wilson, Coleman & Paterson, "Comprehensive
  // approach to verification and validation of CFD simulations", J. Fluids Eng. 123 (2001):
  // uncertainty ½(S_U − S_L) from the range of the oscillation; we multiply it by F_s = 1.25 like
  // the GCI, take the middle of the range as the value, and accept it only where no singularity is
  // predicted and the last three peaks span at most 1 % (common practice). Swings that do not
  // shrink yet (|R| ≥ 1) are accepted on the same terms — the band then comes from their range
  // alone, and the reason says so.
  if (fit.kind === 'oscillatory' && growthTheory === 0) {
    const hi = Math.max(f1, f2, f3);
    const lo = Math.min(f1, f2, f3);
    if (hi - lo <= R.oscillationFraction * scale) {
      const how = Math.abs(fit.R) < 1
        ? `converges with shrinking oscillations (R = ${fmt(fit.R, 2)})`
        : `oscillates within ${fmt((100 * (hi - lo)) / scale, 2)} % over the last three levels, swings not yet shrinking (R = ${fmt(fit.R, 2)})`;
      return converged(0.5 * (hi + lo), GCI_SAFETY_FACTOR * 0.5 * (hi - lo), NaN,
        `${how}; value the middle of the last three peaks, band 1.25 × half their range (Stern et al. 2001)`);
    }
  }
  // (4) undecided, with the reason
  let reason: string;
  let advice: string;
  if (fit.kind === 'oscillatory' || !inc.sameSign) {
    reason = `oscillating: the peak goes up and down between the finest levels (R = ${fmt(fit.R, 2)})`;
    advice = 'add levels or start finer; a larger neighbourhood radius or a smoother size grading also helps';
  } else if (fit.kind === 'monotone') {
    reason = `not yet asymptotic: converging, but with observed order ${fmt(fit.p, 2)} below ${R.minOrder}`;
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
