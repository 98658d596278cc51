import type { SizeField } from '../mesh/types.js';
import type { SiteCandidate } from './sites.js';
import { LADDER_GRADING } from './ladder.js';

/**
 * Size field of the far-field solve (docs/study.md, "Far field"): level k's core size h₀/ratio^k at
 * each site kept, everything outside it coarsened by `factor` — the background and the cone's
 * grading alike: min(factor·base, minᵢ(h₀ᵢ/ratio^k + factor·g·|x − siteᵢ|)). The ladder refines only
 * the core; the graded transition (size ≈ g·r at distance r, the same on every level) and the
 * background are what this solve changes.
 */
export function coarsenedOuterField(base: SizeField, sites: readonly SiteCandidate[], h0: readonly number[], ratio: number, k: number, factor: number): SizeField {
  const px = sites.map((s) => s.at[0]), py = sites.map((s) => s.at[1]);
  const hk = h0.map((h) => h / Math.pow(ratio, k));
  const g = factor * LADDER_GRADING;
  return (x: number, y: number) => {
    let h = factor * base(x, y);
    for (let i = 0; i < px.length; i++) {
      const v = hk[i] + g * Math.hypot(x - px[i], y - py[i]);
      if (v < h) h = v;
    }
    return h;
  };
}
