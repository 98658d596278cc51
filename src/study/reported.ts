/**
 * The last step of a study before its result leaves the stage: site coordinates rounded to
 * about 1e-9 of the plate size (so a corner at x = 60 reads 60, not 59.999999999999865, in the
 * JSON and CSV), and a converged value above the material's yield stress flagged.
 */
import type { SiteResult } from './types.js';

/**
 * `value` rounded to the decimal step 10^⌊log10(fraction · scale)⌋ (1e-7 for a 170 mm plate and
 * the default fraction 1e-9), printed back through that many decimals so no binary tail is left.
 * Non-finite values and a non-positive scale pass through.
 */
export function roundToScale(value: number, scale: number, fraction = 1e-9): number {
  if (!Number.isFinite(value) || !(scale > 0) || !(fraction > 0)) return value;
  const exponent = Math.floor(Math.log10(fraction * scale));
  const step = 10 ** exponent;
  const rounded = Math.round(value / step) * step;
  const decimals = Math.min(20, Math.max(0, -exponent));
  const cleaned = Number(rounded.toFixed(decimals));
  return cleaned === 0 ? 0 : cleaned; // no −0
}

/**
 * Whether a site's converged value exceeds the yield stress: only a converging site has a value
 * (a singular site's peak is not a stress; an undecided one has not settled). Components that can
 * be negative (σxx, max-principal in compression) compare by magnitude.
 */
export function isAboveYield(site: Pick<SiteResult, 'verdict' | 'estimate'>, yieldStress: number | undefined): boolean {
  if (yieldStress === undefined || !(yieldStress > 0) || site.verdict !== 'converging') return false;
  return Number.isFinite(site.estimate.value) && Math.abs(site.estimate.value) > yieldStress;
}

/** The sites as reported: rounded coordinates (`at`, `levels[].peakAt`) and `aboveYield` where it applies. */
export function reportedSites(sites: readonly SiteResult[], opts: { scale: number; yieldStress?: number }): SiteResult[] {
  const r = (p: readonly [number, number]): [number, number] => [roundToScale(p[0], opts.scale), roundToScale(p[1], opts.scale)];
  return sites.map((s) => ({
    ...s,
    at: r(s.at),
    levels: s.levels.map((l) => ({ ...l, peakAt: r(l.peakAt) })),
    ...(isAboveYield(s, opts.yieldStress) ? { aboveYield: true as const } : {}),
  }));
}
