/**
 * A study with load cases (docs/study.md, "Load cases and the envelope"): the sites found in any case or
 * combination are studied in all, each gets a verdict per case and combination, and the envelope names the
 * governing one per site. Pure functions on the study's own results; run.ts drives them.
 */
import type { SizeField } from '../mesh/types.js';
import type { BodyFields } from '../fem/index.js';
import type { SiteCandidate } from './sites.js';
import type { Point, StressMeasure } from '../model/types.js';
import type { CaseStudy, DesignBasis, EnvelopeEntry, EnvelopeValue, LevelResult, SiteResult, StudyResult } from './types.js';

/** Measures whose sign carries meaning (tension or compression, shear direction): the envelope compares magnitudes. */
export const SIGNED_MEASURES: readonly StressMeasure[] = ['sxx', 'syy', 'sxy'];

/**
 * The sites of every case and combination as one list: a site of a later list joins unless an earlier
 * one sits at the same node or within half a local element size of the first mesh (MERGE_SIZES) — so the
 * peak of the later field lies well inside the earlier site's neighbourhood and is measured there (the
 * refinement cone is centred on the site); sorted by x, then y, like the sites of one field. Peaks farther apart are sites of their own
 * (a load that turns moves the peak along a hole's edge), each studied in every case.
 */
/** Sites of two fields closer than this many local element sizes are one (mergeSiteLists). */
export const MERGE_SIZES = 0.5;

export function mergeSiteLists(lists: readonly (readonly SiteCandidate[])[], baseSize: SizeField): SiteCandidate[] {
  // one field (a model without cases, or every case finding the same sites): its list as it is
  if (lists.length <= 1) return [...(lists[0] ?? [])];
  const out: SiteCandidate[] = [...lists[0]];
  let added = false;
  for (const list of lists.slice(1)) {
    const before = out.length;
    for (const c of list) {
      const near = out.slice(0, before).some((o) => o.node === c.node
        || Math.hypot(o.at[0] - c.at[0], o.at[1] - c.at[1]) < MERGE_SIZES * Math.min(baseSize(o.at[0], o.at[1]), baseSize(c.at[0], c.at[1])));
      if (!near) { out.push(c); added = true; }
    }
  }
  return added ? out.sort((a, b) => a.at[0] - b.at[0] || a.at[1] - b.at[1]) : out;
}

/**
 * The value of a site in one case, as the envelope compares it: the converged value of a converging site,
 * the readout at distance of a singular one (its disk average, or the finest peak, when the readout is not
 * defined there), the finest peak of an undecided one (flagged by its verdict).
 */
export function designValue(site: Pick<SiteResult, 'verdict' | 'estimate' | 'readouts' | 'levels'>): { value: number; basis: DesignBasis } {
  const finest = site.levels[site.levels.length - 1]?.peak ?? NaN;
  if (site.verdict === 'converging' && Number.isFinite(site.estimate.value)) return { value: site.estimate.value, basis: 'converged value' };
  if (site.verdict === 'singular') {
    if (site.readouts.atDistance !== undefined && Number.isFinite(site.readouts.atDistance)) return { value: site.readouts.atDistance, basis: 'readout at distance' };
    if (site.readouts.average !== undefined && Number.isFinite(site.readouts.average)) return { value: site.readouts.average, basis: 'disk average' };
  }
  return { value: finest, basis: 'finest peak' };
}

/**
 * Is the finest peak of a site in one case on the rim of its neighbourhood (beyond EDGE_FRACTION of the
 * radius from the site)? Then that case has no peak of its own there: the values rise towards a peak of
 * a neighbouring site, which that site measures.
 */
export const EDGE_FRACTION = 0.75;
export function peakOnRim(levels: readonly Pick<LevelResult, 'peakAt' | 'radius'>[], at: Point): boolean {
  const last = levels[levels.length - 1];
  if (!last || last.radius === undefined || !(last.radius > 0)) return false;
  return Math.hypot(last.peakAt[0] - at[0], last.peakAt[1] - at[1]) > EDGE_FRACTION * last.radius;
}

/**
 * The governing case or combination of every site: the largest value (designValue), by magnitude for a
 * signed measure (SIGNED_MEASURES); values whose peak lies on the rim of the neighbourhood (`onRim`, see
 * peakOnRim) govern only when every value of the site does; the first in the model's order on a tie; a site
 * whose every value is undefined (NaN) is governed by the first case.
 */
export function envelopeOf(
  cases: readonly Pick<CaseStudy, 'name' | 'sites'>[], measure: StressMeasure, onRim: readonly (readonly boolean[])[] = [],
): EnvelopeEntry[] {
  const byMagnitude = SIGNED_MEASURES.includes(measure);
  const key = (v: number) => (Number.isFinite(v) ? (byMagnitude ? Math.abs(v) : v) : -Infinity);
  return (cases[0]?.sites ?? []).map((site, i) => {
    const values: EnvelopeValue[] = cases.map((c, j) => {
      const s = c.sites[i];
      return { case: c.name, verdict: s.verdict, ...designValue(s), ...(onRim[j]?.[i] ? { rim: true as const } : {}) };
    });
    const own = values.some((v) => !v.rim);
    let best = -1;
    values.forEach((v, k) => {
      if (own && v.rim) return;
      if (best < 0 || key(v.value) > key(values[best].value)) best = k;
    });
    return { site: site.id, governing: values[best].case, value: values[best].value, basis: values[best].basis, byMagnitude, values };
  });
}

/** The sites as the envelope shows them: each from its governing case, `case` set. */
export function envelopeSites(cases: readonly CaseStudy[], envelope: readonly EnvelopeEntry[]): SiteResult[] {
  return envelope.map((e, i) => {
    const c = cases.find((k) => k.name === e.governing) ?? cases[0];
    return { ...c.sites[i], case: c.name };
  });
}

/**
 * The StudyResult of one case or combination of a study with cases: its solve and its sites, the rest of
 * the study's fields as they are (no `cases`, no `envelope`). Undefined when the study has no such case.
 */
export function caseStudyResult(study: StudyResult, name: string): StudyResult | undefined {
  const c = study.cases?.find((k) => k.name === name);
  if (!c) return undefined;
  const { cases: _c, envelope: _e, ...rest } = study;
  return { ...rest, solution: c.solution, sites: c.sites.map((s) => ({ ...s, case: c.name })) };
}

/** The names of a study's cases and combinations (empty without cases). */
export function caseNames(study: Pick<StudyResult, 'cases'>): string[] {
  return (study.cases ?? []).map((c) => c.name);
}

/** The body fields of a combination: the factored sum of its cases' body force and thermal strain (linear). */
export function combinedBodyFields(parts: readonly BodyFields[], factors: readonly number[]): BodyFields {
  const out: BodyFields = {};
  const forces = parts.map((p, t) => ({ f: p.force, k: factors[t] })).filter((p) => p.f !== undefined);
  const strains = parts.map((p, t) => ({ f: p.strain, k: factors[t] })).filter((p) => p.f !== undefined);
  if (forces.length > 0) {
    out.force = (x, y) => {
      let bx = 0, by = 0;
      for (const { f, k } of forces) {
        const [fx, fy] = f!(x, y);
        bx += k * fx;
        by += k * fy;
      }
      return [bx, by];
    };
  }
  if (strains.length > 0) out.strain = (x, y) => strains.reduce((s, { f, k }) => s + k * f!(x, y), 0);
  return out;
}
