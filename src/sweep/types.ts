import type { Point } from '../model/types.js';
import type { FeatureKind, StudyResult, Verdict } from '../study/types.js';

/** One varied parameter and the values it takes, in the order given. */
export interface VaryAxis {
  name: string;
  values: number[];
}

/** Study settings that every point of a sweep shares (they enter the point key). */
export interface SweepStudyOptions {
  levels?: number;
  ratio?: number;
  order?: 1 | 2;
  size?: number;
}

/** The finished study of one parameter combination. */
export interface SweepPoint {
  /** position in the cartesian product (0-based, first axis varies slowest) */
  index: number;
  params: Record<string, number>;
  /** sha256 of model text, params, options and tool version (hex) */
  key: string;
  /** diagonal of the outline's bounding box: the length that site matching tolerances scale with */
  scale: number;
  study: StudyResult;
  /** true when the result came from an earlier run's point file */
  reused: boolean;
  /** wall time of this point's study (s); 0 when reused */
  seconds: number;
}

/** One site of one sweep point, as a member of a family. */
export interface FamilyMember {
  point: number;
  /** index of the site in that point's study.sites */
  site: number;
  id: string;
  at: Point;
  verdict: Verdict;
}

/**
 * The same physical site followed across sweep points. Site ids are renumbered by each
 * study as the geometry changes, so families are formed by feature class and location.
 */
export interface SiteFamily {
  /** F1, F2, … in order of first appearance */
  id: string;
  /** 'corner' covers both corner and fillet sites (a rounded corner is the same place) */
  featureClass: string;
  /** where the family was first seen */
  at: Point;
  /** members by sweep point (at most one per point) */
  members: FamilyMember[];
}

export interface SweepResult {
  tool: 'peakwise';
  version: string;
  model: { title: string; file: string };
  axes: VaryAxis[];
  points: SweepPoint[];
  families: SiteFamily[];
  /** points taken from earlier point files */
  reused: number;
  /** wall time of the whole sweep (s) */
  totalS: number;
  /** set when the sweep was stopped (Ctrl-C) before every point was computed; `points` then holds the finished ones */
  interrupted?: boolean;
}

export type { FeatureKind };
