import type { Mesh, SizeField } from '../mesh/types.js';
import type { GaussStresses, ElasticSection } from '../fem/types.js';
import type { NodalStress } from '../recovery/types.js';
import type { Point, StressMeasure } from '../model/types.js';
import { buildPointLocator, measureValue, stressAt, type PointLocator } from '../recovery/index.js';
import { outOfPlaneStress, type BodyFields } from '../fem/index.js';
import type { LevelResult } from './types.js';
import type { SiteCandidate } from './sites.js';
import { sampledAverage } from './readouts.js';
import { reciprocalIntensity, singularTerm, type IntensityNorm, type IntensitySetup } from './stress-intensity.js';

/** Grading of the refinement cone around each site: size grows by this much per unit distance. */
export const LADDER_GRADING = 0.25;
/** The peak neighbourhood: this many level-0 element sizes around the site (fixed in physical size). */
export const NEIGHBOURHOOD_SIZES = 2;
/** Readouts closer than this many level sizes to a singular apex at a mirror use the singular term of the level's K. */
export const APEX_SIZES = 2;

/** Lower bounds of distances are scaled by this before they may skip a candidate (far above rounding, far below 1). */
const LOWER_BOUND_SLACK = 1 - 1e-9;

/** distance from (x, y) to the segment a–b */
function segmentDistance(x: number, y: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax, dy = by - ay;
  const l2 = dx * dx + dy * dy;
  const t = l2 > 0 ? Math.min(1, Math.max(0, ((x - ax) * dx + (y - ay) * dy) / l2)) : 0;
  return Math.hypot(x - ax - t * dx, y - ay - t * dy);
}

/**
 * Size field of level k: every site's cone h₀/ratio^k + g·|x − site| under the base field (one mesh for all
 * sites). A flat peak (a plateau) has its cone round the whole polyline through its points, so the plateau
 * is refined alike along its length.
 */
export function levelSizeField(base: SizeField, sites: readonly Pick<SiteCandidate, 'at' | 'plateau'>[], h0: readonly number[], ratio: number, k: number): SizeField {
  const px = sites.map((s) => s.at[0]), py = sites.map((s) => s.at[1]);
  const hk = h0.map((h) => h / Math.pow(ratio, k));
  // plateau segments: x0, y0, x1, y1, h per segment
  const seg: number[] = [];
  sites.forEach((s, i) => {
    const p = s.plateau?.points;
    if (!p || p.length < 2) return;
    const n = s.plateau!.closed ? p.length : p.length - 1;
    for (let j = 0; j < n; j++) {
      const a = p[j], b = p[(j + 1) % p.length];
      seg.push(a[0], a[1], b[0], b[1], hk[i]);
    }
  });
  // a cone or a plateau band can only lower h where a lower bound of its size is below h: the distance is at
  // least the larger coordinate offset (from a point) or the offset from the segment's bounding box, and a
  // candidate that cannot win is skipped unevaluated (LOWER_BOUND_SLACK keeps the bound clear of rounding,
  // so the field's values are exactly those of evaluating every candidate)
  const box: number[] = [];
  for (let j = 0; j < seg.length; j += 5) {
    box.push(Math.min(seg[j], seg[j + 2]), Math.min(seg[j + 1], seg[j + 3]), Math.max(seg[j], seg[j + 2]), Math.max(seg[j + 1], seg[j + 3]));
  }
  const g = LADDER_GRADING * LOWER_BOUND_SLACK;
  return (x: number, y: number) => {
    let h = base(x, y);
    for (let i = 0; i < px.length; i++) {
      const dx = Math.abs(x - px[i]), dy = Math.abs(y - py[i]);
      if (hk[i] + g * (dx > dy ? dx : dy) >= h) continue;
      const v = hk[i] + LADDER_GRADING * Math.hypot(x - px[i], y - py[i]);
      if (v < h) h = v;
    }
    for (let j = 0, b = 0; j < seg.length; j += 5, b += 4) {
      const ox = x < box[b] ? box[b] - x : x > box[b + 2] ? x - box[b + 2] : 0;
      const oy = y < box[b + 1] ? box[b + 1] - y : y > box[b + 3] ? y - box[b + 3] : 0;
      if (seg[j + 4] + g * (ox > oy ? ox : oy) >= h) continue;
      const v = seg[j + 4] + LADDER_GRADING * segmentDistance(x, y, seg[j], seg[j + 1], seg[j + 2], seg[j + 3]);
      if (v < h) h = v;
    }
    return h;
  };
}

/**
 * Required points that make the mesh next to a singular site a scaled copy from level to level: two rings
 * (r = h and 2.1h, h the site's level size) of points on rays across the wedge, at most 45° apart, plus the
 * points on straight faces. Delaunay refinement with a size field h + g·r is scale-invariant, so with these
 * seeds the elements touching the site keep their shapes and the peak changes only by the field's own
 * growth — without them the number and shape of the elements at the apex change at random between levels,
 * and that noise swamps the increments the fit relies on.
 */
export function rosettePoints(site: SiteCandidate, h: number, straightFaces: [boolean, boolean]): Point[] {
  const dir = site.bisector ?? site.direction;
  if (!dir || site.theory <= 0) return [];
  const alpha = ((site.feature.interiorAngleDeg > 0 ? site.feature.interiorAngleDeg : 180) * Math.PI) / 180;
  // dOut is the bisector turned back by α/2
  const a0 = Math.atan2(dir[1], dir[0]) - alpha / 2;
  const m = Math.max(2, Math.ceil(alpha / (Math.PI / 4) - 1e-9));
  const pts: Point[] = [];
  for (const c of [1, 2.1]) {
    for (let j = 0; j <= m; j++) {
      if ((j === 0 && !straightFaces[1]) || (j === m && !straightFaces[0])) continue;
      const t = a0 + (alpha * j) / m;
      pts.push([site.at[0] + c * h * Math.cos(t), site.at[1] + c * h * Math.sin(t)]);
    }
  }
  return pts;
}

export interface SiteProbe {
  site: SiteCandidate;
  /** neighbourhood radius of the peak search */
  radius: number;
  /** readout distance d along `site.direction` */
  distance: number;
  /** how d was chosen, for the result ("0.05 × shorter face 20") */
  distanceRule?: string;
  /** material critical distance L (Taylor 2007): point method at L/2, line method over 2L */
  criticalDistance?: number;
  /** stress intensity by the reciprocal work integral (stress-intensity.ts), where the site has one */
  intensity?: IntensitySetup & { norm: IntensityNorm };
}

/**
 * Record one level for one site: the peak of the nodal measure over all nodes within `radius` of the site,
 * the measure at distance d along the readout direction (point method), the mean along it over
 * 0 ≤ r ≤ 4d (line method: point at L/2 and line over 2L, Taylor 2007, with L = 2d), the Gauss-point area
 * mean over the disk r ≤ d, with a critical distance L the point and line methods at L/2 and over 2L, and
 * the stress intensity by the reciprocal work integral (from the displacements u) when the annulus of its
 * domain is at least two element sizes h from the apex (NaN on coarser levels); `body` holds the body force
 * and thermal strain of the model's body loads, which that integral needs (stress-intensity.ts).
 */
export function probeLevel(
  mesh: Mesh, field: NodalStress, nodal: Float64Array, gauss: GaussStresses, section: ElasticSection,
  measure: StressMeasure, probe: SiteProbe, h: number, dofs: number, locator: PointLocator = buildPointLocator(mesh),
  u?: Float64Array, body: BodyFields = {},
): LevelResult {
  const { site, radius, distance: d } = probe;
  const [sx, sy] = site.at;
  // the scans over nodes and Gauss points are functions of their own (a cold first call of one long
  // many-loop function is slow: src/linalg/numeric.ts)
  const pn = peakNode(mesh.xy, nodal, sx, sy, radius);
  const peak = pn >= 0 ? nodal[pn] : -Infinity;
  const out: LevelResult = { h, dofs, peak, peakAt: [mesh.xy[2 * pn], mesh.xy[2 * pn + 1]], radius };
  const K = probe.intensity;
  if (K && u && K.innerRadius >= 2 * h) out.nsif = reciprocalIntensity(mesh, u, section, K, K.norm, body);
  const dir = site.direction;
  if (dir) {
    // within APEX_SIZES·h of a singular apex the elements cannot follow r^(λ−1): at a mirror, where the field
    // is symmetric and its singular part the opening term alone, the readouts take that term with this
    // level's K there (the unit eigenfunction scaled by K/K₁), the FE field beyond. Elsewhere an
    // antisymmetric term may be singular too (a corner beyond 257°, a crack under shear): no substitution.
    const singular = K && K.mirrorFactor > 1 && out.nsif !== undefined && Number.isFinite(out.nsif) ? singularTerm(K, out.nsif, section) : undefined;
    const at = (r: number) => {
      if (singular && r < APEX_SIZES * h) {
        // the singular term is a mechanical field (no thermal strain), so its σzz is ν(σxx + σyy) in plane strain
        const p = singular(r);
        return measureValue(measure, p.sxx, p.syy, p.sxy, outOfPlaneStress(section, p.sxx, p.syy));
      }
      const p = stressAt(mesh, field, sx + r * dir[0], sy + r * dir[1], locator);
      return p ? measureValue(measure, p.sxx, p.syy, p.sxy, p.szz) : NaN;
    };
    // mean along the direction over 0 ≤ r ≤ length: trapezoidal in s with r = length·s² (97 samples), which
    // turns an r^(λ−1) rise at the apex (λ ≥ 1/2) into a bounded integrand 2·length·s·σ(length·s²), so the
    // mean converges as the levels resolve the apex instead of following the growing apex value
    const lineMean = (length: number): number => {
      const ss: number[] = [], gs: number[] = [];
      const N = 96;
      for (let i = 0; i <= N; i++) {
        const sv = i / N;
        const v = at(Math.max(length * sv * sv, 1e-9 * length));
        if (Number.isFinite(v)) { ss.push(sv); gs.push(2 * sv * v); }
      }
      return ss.length > N / 2 ? (sampledAverage(ss, gs) * (ss[ss.length - 1] - ss[0])) : NaN;
    };
    const pm = at(d);
    if (Number.isFinite(pm)) out.atDistance = pm;
    const lm = lineMean(4 * d);
    if (Number.isFinite(lm)) out.lineAverage = lm;
    const L = probe.criticalDistance;
    if (L !== undefined) {
      const p = at(L / 2), l = lineMean(2 * L);
      if (Number.isFinite(p)) out.pointMethod = p;
      if (Number.isFinite(l)) out.lineMethod = l;
    }
  }
  const average = diskMean(gauss, measure, sx, sy, d);
  if (average !== undefined) out.average = average;
  return out;
}

/** The node of the largest nodal value within `radius` of (sx, sy), the lowest-numbered on a tie; −1 when none. */
function peakNode(xy: Float64Array, nodal: Float64Array, sx: number, sy: number, radius: number): number {
  let peak = -Infinity, pn = -1;
  const outside = radius / LOWER_BOUND_SLACK; // a node this far off in x or y is outside for certain
  for (let n = 0; n < xy.length / 2; n++) {
    const ox = Math.abs(xy[2 * n] - sx), oy = Math.abs(xy[2 * n + 1] - sy);
    if (ox > outside || oy > outside) continue;
    if (Math.hypot(xy[2 * n] - sx, xy[2 * n + 1] - sy) > radius) continue;
    if (nodal[n] > peak || (nodal[n] === peak && n < pn)) { peak = nodal[n]; pn = n; }
  }
  return pn;
}

/** Area mean of the measure over the disk r ≤ d (Gauss points of the raw element stresses); undefined when none lies in it. */
function diskMean(gauss: GaussStresses, measure: StressMeasure, sx: number, sy: number, d: number): number | undefined {
  let sw = 0, sv = 0;
  const beyond = d / LOWER_BOUND_SLACK;
  for (let k = 0; k < gauss.weight.length; k++) {
    if (Math.abs(gauss.xy[2 * k] - sx) > beyond || Math.abs(gauss.xy[2 * k + 1] - sy) > beyond) continue;
    if (Math.hypot(gauss.xy[2 * k] - sx, gauss.xy[2 * k + 1] - sy) > d) continue;
    const a = gauss.stress[3 * k], b = gauss.stress[3 * k + 1], c = gauss.stress[3 * k + 2];
    sv += gauss.weight[k] * measureValue(measure, a, b, c, gauss.szz[k]);
    sw += gauss.weight[k];
  }
  return sw > 0 ? sv / sw : undefined;
}

export type { Point };
