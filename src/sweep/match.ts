/**
 * Following hot spots across sweep points. A study numbers its spots afresh for every model,
 * and a change of geometry (a corner radius, a hole size) moves them, adds some and removes
 * others, so spots are matched by feature class and location, not by id.
 */
import type { FeatureKind, SpotResult } from '../study/types.js';
import type { Point } from '../model/types.js';
import type { FamilyMember, SpotFamily, SweepPoint } from './types.js';

/** Match radius as a fraction of the outline's bounding-box diagonal (docs/sweep.md). */
export const MATCH_TOLERANCE_FRACTION = 0.05;
/** …widened to this many feature radii, since a fillet's peak moves along the arc as it grows. */
export const MATCH_RADIUS_FACTOR = 2;

/** Feature kinds that are the same place under a change of parameter: a sharp corner and its fillet. */
export function featureClass(kind: FeatureKind): string {
  return kind === 'fillet' ? 'corner' : kind;
}

/** How far a spot may lie from a family's earlier members and still join it. */
export function matchTolerance(spot: Pick<SpotResult, 'feature'>, scale: number): number {
  return Math.max(MATCH_TOLERANCE_FRACTION * scale, MATCH_RADIUS_FACTOR * spot.feature.radius);
}

function distance(a: Point, b: Point): number {
  return Math.hypot(a[0] - b[0], a[1] - b[1]);
}

/**
 * Group the spots of all points into families. Points are taken in sweep order; within a point,
 * candidate (spot, family) pairs of the same feature class closer than the tolerance are taken
 * nearest first (distance to the nearest earlier member, so a spot that drifts step by step
 * stays in its family), each family and spot at most once. A spot left over starts a family.
 */
export function matchSpots(points: readonly Pick<SweepPoint, 'study' | 'scale'>[]): SpotFamily[] {
  const families: SpotFamily[] = [];
  points.forEach((point, p) => {
    const spots = point.study.spots;
    const pairs: { s: number; f: number; d: number }[] = [];
    spots.forEach((spot, s) => {
      const cls = featureClass(spot.feature.kind);
      const tol = matchTolerance(spot, point.scale);
      families.forEach((fam, f) => {
        if (fam.featureClass !== cls) return;
        let d = Infinity;
        for (const m of fam.members) d = Math.min(d, distance(m.at, spot.at));
        if (d <= tol) pairs.push({ s, f, d });
      });
    });
    pairs.sort((a, b) => a.d - b.d || a.s - b.s || a.f - b.f);
    const spotTaken = new Uint8Array(spots.length);
    const famTaken = new Uint8Array(families.length);
    const member = (s: number): FamilyMember => ({ point: p, spot: s, id: spots[s].id, at: spots[s].at, verdict: spots[s].verdict });
    for (const { s, f } of pairs) {
      if (spotTaken[s] || famTaken[f]) continue;
      spotTaken[s] = 1;
      famTaken[f] = 1;
      families[f].members.push(member(s));
    }
    spots.forEach((spot, s) => {
      if (spotTaken[s]) return;
      families.push({ id: `F${families.length + 1}`, featureClass: featureClass(spot.feature.kind), at: spot.at, members: [member(s)] });
    });
  });
  return families;
}

/** The member of a family at a sweep point, if the family has a spot there. */
export function memberAt(family: SpotFamily, point: number): FamilyMember | undefined {
  return family.members.find((m) => m.point === point);
}
