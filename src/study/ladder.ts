import type { Mesh, SizeField } from '../mesh/types.js';
import type { GaussStresses, ElasticSection } from '../fem/types.js';
import type { NodalStress } from '../recovery/types.js';
import type { Point, StressMeasure } from '../model/types.js';
import { buildPointLocator, measureValue, stressAt, type PointLocator } from '../recovery/index.js';
import type { LevelResult } from './types.js';
import type { SiteCandidate } from './sites.js';
import { notchStressIntensity, sampledAverage } from './readouts.js';

/** Grading of the refinement cone around each site: size grows by this much per unit distance. */
export const LADDER_GRADING = 0.25;
/** The peak neighbourhood: this many level-0 element sizes around the site (fixed in physical size). */
export const NEIGHBOURHOOD_SIZES = 2;

/** Size field of level k: every site's cone h₀/ratio^k + g·|x − site| under the base field (one mesh for all sites). */
export function levelSizeField(base: SizeField, sites: readonly SiteCandidate[], h0: readonly number[], ratio: number, k: number): SizeField {
  const px = sites.map((s) => s.at[0]), py = sites.map((s) => s.at[1]);
  const hk = h0.map((h) => h / Math.pow(ratio, k));
  return (x: number, y: number) => {
    let h = base(x, y);
    for (let i = 0; i < px.length; i++) {
      const v = hk[i] + LADDER_GRADING * Math.hypot(x - px[i], y - py[i]);
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
  const dir = site.direction;
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
}

/**
 * Record one level for one site: the peak of the nodal measure over all nodes within `radius` of the site,
 * the measure at distance d along the readout direction (point method), the mean along it over
 * 0 ≤ r ≤ 4d (line method: point at L/2 and line over 2L, Taylor 2007), the Gauss-point area mean over the
 * disk r ≤ d, and the notch stress intensity fitted on the opening stress over 3h ≤ r ≤ max(d, 8h).
 */
export function probeLevel(
  mesh: Mesh, field: NodalStress, nodal: Float64Array, gauss: GaussStresses, section: ElasticSection,
  measure: StressMeasure, probe: SiteProbe, h: number, dofs: number, locator: PointLocator = buildPointLocator(mesh),
): LevelResult {
  const { site, radius, distance: d } = probe;
  const [sx, sy] = site.at;
  let peak = -Infinity, pn = -1;
  for (let n = 0; n < mesh.xy.length / 2; n++) {
    if (Math.hypot(mesh.xy[2 * n] - sx, mesh.xy[2 * n + 1] - sy) > radius) continue;
    if (nodal[n] > peak || (nodal[n] === peak && n < pn)) { peak = nodal[n]; pn = n; }
  }
  const out: LevelResult = { h, dofs, peak, peakAt: [mesh.xy[2 * pn], mesh.xy[2 * pn + 1]], radius };
  const dir = site.direction;
  if (dir) {
    const at = (r: number) => {
      const p = stressAt(mesh, field, sx + r * dir[0], sy + r * dir[1], locator);
      return p ? measureValue(measure, p.sxx, p.syy, p.sxy, p.szz) : NaN;
    };
    const pm = at(d);
    if (Number.isFinite(pm)) out.atDistance = pm;
    const rs: number[] = [], vs: number[] = [];
    const N = 96;
    for (let i = 0; i <= N; i++) {
      const r = (4 * d * i) / N;
      const v = at(Math.max(r, 1e-9 * d));
      if (Number.isFinite(v)) { rs.push(r); vs.push(v); }
    }
    if (rs.length > N / 2) out.lineAverage = sampledAverage(rs, vs);
    if (site.lambdaOpening !== undefined && site.lambdaOpening < 1) {
      // opening stress: the normal stress across the bisector, n = bisector turned by 90°
      const nx = -dir[1], ny = dir[0];
      const r0 = 3 * h, r1 = Math.max(d, 8 * h);
      const rr: number[] = [], ss: number[] = [];
      for (let i = 0; i < 8; i++) {
        const r = r0 * Math.pow(r1 / r0, i / 7);
        const p = stressAt(mesh, field, sx + r * dir[0], sy + r * dir[1], locator);
        if (!p) continue;
        rr.push(r);
        ss.push(p.sxx * nx * nx + 2 * p.sxy * nx * ny + p.syy * ny * ny);
      }
      if (rr.length >= 3) out.nsif = notchStressIntensity(rr, ss, site.lambdaOpening).K;
    }
  }
  // area mean over the disk r ≤ d (Gauss points of the raw element stresses)
  let sw = 0, sv = 0;
  const plainStrain = section.state === 'plane-strain';
  for (let k = 0; k < gauss.weight.length; k++) {
    if (Math.hypot(gauss.xy[2 * k] - sx, gauss.xy[2 * k + 1] - sy) > d) continue;
    const a = gauss.stress[3 * k], b = gauss.stress[3 * k + 1], c = gauss.stress[3 * k + 2];
    const szz = plainStrain ? section.nu * (a + b) : 0;
    sv += gauss.weight[k] * measureValue(measure, a, b, c, szz);
    sw += gauss.weight[k];
  }
  if (sw > 0) out.average = sv / sw;
  return out;
}

export type { Point };
