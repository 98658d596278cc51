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
  /** with load cases: the case or combination this entry is of (in `StudyResult.sites`, the governing one) */
  case?: string;
}

/** What a site's value in one case or combination is (docs/study.md, "Load cases and the envelope"). */
export type DesignBasis = 'converged value' | 'readout at distance' | 'disk average' | 'finest peak';

/** One site in one case or combination, as the envelope compares it. */
export interface EnvelopeValue {
  case: string;
  verdict: Verdict;
  /** the converged value (converging), the readout at distance (singular), or the finest peak (undecided) */
  value: number;
  basis: DesignBasis;
  /** the finest peak lies on the rim of the site's neighbourhood: no peak of this case's own here (it does not govern) */
  rim?: true;
}

/** The governing case or combination of one site. */
export interface EnvelopeEntry {
  site: string;
  /** the case or combination with the largest value (by magnitude for signed measures) */
  governing: string;
  value: number;
  basis: DesignBasis;
  /** true when the measure is signed (σxx, σyy, τxy) and the values were compared by magnitude */
  byMagnitude: boolean;
  /** every case and combination, in the model's order */
  values: EnvelopeValue[];
}

/** The study of one case or combination: its own first solve and its sites (the same ids in every case). */
export interface CaseStudy {
  name: string;
  kind: 'case' | 'combination';
  /** the combination's expression (combinations only) */
  expression?: string;
  solution: StudyResult['solution'];
  sites: SiteResult[];
}

/**
 * What a value reported by another analysis is worth (issue 15; docs/other-analysis.md), against the
 * site it belongs to. `finding`: the models differ; converged (inside our band of the converged value),
 * low or high against it; mesh-dependent (a singular site); undecided; not-compared (`words` say why).
 */
export interface ReportedAssessment {
  keyPath: string;
  at: Point;
  value: number;
  size: number;
  measure: string;
  case?: string;
  label?: string;
  order?: 1 | 2;
  /** id of the site it was judged against, and its distance from the reported point */
  site: string;
  distance: number;
  /** the point was far from every found site and was studied as a listed point of its own */
  added?: true;
  verdict: Verdict;
  finding: 'models-differ' | 'converged' | 'low' | 'high' | 'mesh-dependent' | 'undecided' | 'not-compared';
  /** plain words: the finding first, then what follows from it */
  words: string;
  /** the stated tolerance beyond our band before the models differ (fraction) */
  tolerance: number;
  /** our value at the same element size with its band, and where it came from */
  ours?: {
    value: number; band: number; from: 'ladder' | 'extrapolated' | 'own solve'; order: 1 | 2;
    /** the comparison's half-width: band + tolerance × |value|; further apart, the models differ */
    allowed: number;
  };
  /** (reported − ours at that size) / |ours| */
  difference?: number;
  /** set when our value at that size was extrapolated beyond the ladder */
  warning?: string;
  /** converging site: the converged value, the reported value's offset from it (fraction, negative = low) */
  converged?: { value: number; uncertainty: number };
  offset?: number;
  /** element sizes the other mesh needs at this point for 1, 2 and 5 % (null: already within) and the order assumed */
  neededSize?: { percent: number; size: number | null }[];
  neededOrder?: number;
  /** singular site: what halving the element size would add (fraction), and the readouts to use instead */
  halvingIncrease?: number;
  readouts?: { name: string; value: number; unit: string }[];
  /** undecided site: what is needed to tell */
  needed?: string;
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
  /** values another analysis reported (model key `reported`), each judged against its site */
  reported?: ReportedAssessment[];
  timings?: { totalS: number };
  /** set when the study was stopped (Ctrl-C) before every level was solved */
  interrupted?: boolean;
  /** health warnings of the model and mesh (printed by the CLI, shown in the report) */
  warnings?: string[];
  /**
   * with load cases: every case and combination studied on the same meshes and sites; `sites` and
   * `solution` above are then the envelope (each site from its governing case, `case` set) and the
   * first case's solve
   */
  cases?: CaseStudy[];
  /** with load cases: the governing case or combination of every site */
  envelope?: EnvelopeEntry[];
}
