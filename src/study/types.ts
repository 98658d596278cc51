import type { Point } from '../model/types.js';

export type FaceCondition = 'free' | 'clamped' | 'sliding';

export type FeatureKind =
  | 'corner'
  | 'fillet'
  | 'opening'
  | 'point-load'
  | 'point-support'
  | 'support-edge'
  | 'edge'
  | 'interior';

export interface SiteFeature {
  kind: FeatureKind;
  /** material angle at a sharp corner (deg); 180 on a straight edge; 0 when not applicable */
  interiorAngleDeg: number;
  /** fillet / hole radius; 0 when not applicable */
  radius: number;
  /** boundary conditions on the two faces of a corner */
  faces?: 'free-free' | 'free-clamped' | 'clamped-clamped';
  /**
   * condition of each face (incoming, outgoing along the boundary): 'sliding' is a roller whose fixed
   * direction is the face normal (a symmetry line); `faces` is set only when both are free or clamped
   */
  faceConditions?: [FaceCondition, FaceCondition];
  /** governing Williams eigenvalue λ (Re part) behind `growth.theory`; absent when not a wedge */
  lambda?: number;
  /** words for the report, e.g. "re-entrant corner of the outline, 270°" */
  description: string;
}

export interface LevelResult {
  /** element size near the site at this level */
  h: number;
  dofs: number;
  /** peak of the study measure within the site neighbourhood */
  peak: number;
  /** where the peak sits */
  peakAt: Point;
  /** measure at the readout distance along the bisector (singular sites), if defined */
  atDistance?: number;
  /** average of the measure over a disk of the readout radius, if defined */
  average?: number;
  /** mean of the measure along the bisector over 0 ≤ r ≤ 4·distance (line method), if defined */
  lineAverage?: number;
  /** point method of the critical distance: the measure at L/2 along the readout direction, if L is given */
  pointMethod?: number;
  /** line method: the mean of the measure along the readout direction over 0 ≤ r ≤ 2L, if L is given */
  lineMethod?: number;
  /** stress intensity (reciprocal work integral) on this level, if defined there */
  nsif?: number;
  /** radius of the neighbourhood the peak was searched in (fixed across levels) */
  radius?: number;
}

export type Verdict = 'converging' | 'singular' | 'undecided';

/**
 * The parts of a converging site's half-width (docs/study.md, "Bands"): their sum is
 * `estimate.uncertainty`. `farField` is NaN (null in JSON) when it was not assessed (interrupted
 * or failed extra solve); the sum then leaves it out.
 */
export interface BandComponents {
  /** F_s ε + |φ₁ − φ_fit(h₁)| of the least-squares fit, at least the spread of the finest three peaks */
  discretisation: number;
  /** standard deviation of the fit (Eça & Hoekstra 2014) */
  scatter: number;
  /** discretisation error of the background mesh, which the ladder does not refine */
  farField: number;
}

export interface SiteResult {
  id: string;
  at: Point;
  feature: SiteFeature;
  levels: LevelResult[];
  verdict: Verdict;
  /** one sentence: why this verdict (reason for undecided, theory agreement, …) */
  reason: string;
  /** what to do next for an undecided site */
  advice?: string;
  /** value ± uncertainty must hold the exact value; `components` for converging sites */
  estimate: { value: number; uncertainty: number; observedOrder: number; components?: BandComponents };
  growth: { exponent: number; exponentUncertainty: number; theory: number };
  readouts: {
    /** the measure at `distance` along `direction` and its mean over the disk of that radius (finest level) */
    atDistance?: number; distance?: number; average?: number;
    /** how `distance` was chosen: "0.05 × shorter face 20" or "study.readouts.distance" */
    distanceRule?: string;
    /** stress intensity: the converged value over the levels (the finest level's value when not converging) */
    nsif?: number; nsifUnits?: string;
    /** half-width of the band of `nsif` (NaN when the levels do not converge) */
    nsifUncertainty?: number;
    /** the annulus R₁ ≤ r ≤ R₂ of the domain integral behind `nsif` */
    nsifRadii?: [number, number];
    /** line-method mean along the bisector over 0 ≤ r ≤ lineLength */
    lineAverage?: number; lineLength?: number;
    /** material critical distance L = (1/π)(ΔK_th/Δσ₀)² (Taylor 2007), with the point method at L/2 and the line method over 2L */
    criticalDistance?: number; pointMethod?: number; lineMethod?: number;
  };
  /** a flat peak (plateau): the stretch of boundary through `at` whose finest-level values lie within the band */
  extent?: { from: Point; to: Point; length: number; closed: boolean };
  /** three-level Richardson/GCI of every consecutive triple, coarse → fine: the trend, not the band */
  history?: { finest: number; value: number; uncertainty: number; observedOrder: number }[];
  /** direction from the site into the material used for the readouts (unit vector), if defined */
  direction?: Point;
  /**
   * set when the site converges to a value above the material's yield stress (`material.yield`):
   * the linear-elastic result then expects local yielding
   */
  aboveYield?: true;
}

export interface StudyResult {
  tool: 'peakwise';
  version: string;
  /** `state` only for an axisymmetric section (the report then says "section" and shows r, z) */
  model: { title: string; file: string; state?: 'axisymmetric' };
  units: { length: string; force: string; stress: string };
  mesh: { nodes: number; elements: number; order: 1 | 2; minAngleDeg: number };
  solution: { dofs: number; maxDisplacement: number; reactionSum: [number, number]; appliedSum: [number, number] };
  measure: string;
  /** the material's yield stress (`material.yield`, stress units), when the model gives one */
  yieldStress?: number;
  sites: SiteResult[];
  timings?: { totalS: number };
  /** set when the study was stopped (Ctrl-C) before every level was solved */
  interrupted?: boolean;
  /** health warnings of the model and mesh (printed by the CLI, shown in the report) */
  warnings?: string[];
}
