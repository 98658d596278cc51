/**
 * Following sites across sweep points. A study numbers its sites afresh for every model,
 * and a change of geometry (a corner radius, a hole size) moves them, adds some and removes
 * others, so sites are matched by feature class and location, not by id.
 */
import type { FeatureKind, SiteResult } from '../study/types.js';
import type { Point } from '../model/types.js';
import type { FamilyMember, SiteFamily, SweepPoint } from './types.js';

/** Match radius as a fraction of the outline's bounding-box diagonal (docs/sweep.md). */
export const MATCH_TOLERANCE_FRACTION = 0.05;
/** …widened to this many feature radii, since a fillet's peak moves along the arc as it grows. */
export const MATCH_RADIUS_FACTOR = 2;

/** Feature kinds that are the same place under a change of parameter: a sharp corner and its fillet. */
export function featureClass(kind: FeatureKind): string {
  return kind === 'fillet' ? 'corner' : kind;
}

/** How far a site may lie from a family's earlier members and still join it. */
export function matchTolerance(site: Pick<SiteResult, 'feature'>, scale: number): number {
  return Math.max(MATCH_TOLERANCE_FRACTION * scale, MATCH_RADIUS_FACTOR * site.feature.radius);
}

function distance(a: Point, b: Point): number {
  return Math.hypot(a[0] - b[0], a[1] - b[1]);
}

/**
 * Group the sites of all points into families. Points are taken in sweep order; within a point,
 * candidate (site, family) pairs of the same feature class closer than the tolerance are taken
 * nearest first (distance to the nearest earlier member, so a site that drifts step by step
 * stays in its family), each family and site at most once. A site left over starts a family.
 */
export function matchSites(points: readonly Pick<SweepPoint, 'study' | 'scale'>[]): SiteFamily[] {
  const families: SiteFamily[] = [];
  points.forEach((point, p) => {
    const sites = point.study.sites;
    const pairs: { s: number; f: number; d: number }[] = [];
    sites.forEach((site, s) => {
      const cls = featureClass(site.feature.kind);
      const tol = matchTolerance(site, point.scale);
      families.forEach((fam, f) => {
        if (fam.featureClass !== cls) return;
        let d = Infinity;
        for (const m of fam.members) d = Math.min(d, distance(m.at, site.at));
        if (d <= tol) pairs.push({ s, f, d });
      });
    });
    pairs.sort((a, b) => a.d - b.d || a.s - b.s || a.f - b.f);
    const siteTaken = new Uint8Array(sites.length);
    const famTaken = new Uint8Array(families.length);
    const member = (s: number): FamilyMember => ({ point: p, site: s, id: sites[s].id, at: sites[s].at, verdict: sites[s].verdict });
    for (const { s, f } of pairs) {
      if (siteTaken[s] || famTaken[f]) continue;
      siteTaken[s] = 1;
      famTaken[f] = 1;
      families[f].members.push(member(s));
    }
    sites.forEach((site, s) => {
      if (siteTaken[s]) return;
      families.push({ id: `F${families.length + 1}`, featureClass: featureClass(site.feature.kind), at: site.at, members: [member(s)] });
    });
  });
  return families;
}

/** The member of a family at a sweep point, if the family has a site there. */
export function memberAt(family: SiteFamily, point: number): FamilyMember | undefined {
  return family.members.find((m) => m.point === point);
}
