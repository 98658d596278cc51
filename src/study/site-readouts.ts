/**
 * The readouts of a site from its levels (issue 12 §5–8): the probe set up for the ladder (readout distance
 * tied to the feature, critical distance, the stress intensity's annulus), the stress intensity's value and
 * band over the levels, the finest-level readouts, the reported position and a flat peak's extent.
 */
import type { Mesh } from '../mesh/types.js';
import type { Model, Point } from '../model/types.js';
import type { ElasticSection } from '../fem/types.js';
import type { LevelResult, SiteResult } from './types.js';
import type { SiteCandidate } from './sites.js';
import type { SiteProbe } from './ladder.js';
import { judgeSite } from './verdict.js';
import { nsifUnits } from './readouts.js';
import { intensityNorm } from './stress-intensity.js';

/** Default readout distance: this fraction of each site's feature length (docs/study.md, "Readout distance"). */
export const DEFAULT_READOUT_FRACTION = 0.05;

/**
 * The probe of one site: readout distance (study.readouts.distance, else DEFAULT_READOUT_FRACTION × the
 * feature length), the critical distance, and the stress intensity's annulus R₁ = ℓ/4 ≤ r ≤ R₂ = ℓ/2, ℓ the
 * feature length or the clearance to any other boundary if smaller (the faces are free of other features
 * inside, no other site and no other boundary reaches it), with the eigenfunction's normalisation.
 */
export function siteProbe(site: SiteCandidate, radius: number, model: Model, section: ElasticSection): SiteProbe {
  const fixed = model.study.readouts.distance;
  const distance = fixed ?? DEFAULT_READOUT_FRACTION * site.featureLength;
  const distanceRule = fixed !== undefined ? 'study.readouts.distance' : `${DEFAULT_READOUT_FRACTION} × ${site.featureLengthWhy}`;
  const probe: SiteProbe = { site, radius, distance, distanceRule };
  const L = model.study.readouts.critical?.length;
  if (L !== undefined) probe.criticalDistance = L;
  if (site.intensity) {
    const { alphaDeg, lambda, mirrorFactor, bisector } = site.intensity;
    const l = Math.min(site.featureLength, site.intensity.clearance ?? Infinity);
    probe.intensity = {
      apex: site.at, bisector, alphaDeg, lambda, mirrorFactor,
      innerRadius: 0.25 * l, outerRadius: 0.5 * l,
      norm: intensityNorm(alphaDeg, lambda, section),
    };
  }
  return probe;
}

/**
 * Stress intensity over the levels: the same fit and band as a peak (judgeSite with no singularity expected:
 * least squares over the finest levels, the order cap, the floor at the finest spread and the far-field
 * term from `farFieldShift`, K on the coarsened far-field solve less K on the finest level) on the levels
 * where it was taken, the finest ones in a row. Not converging: the finest value, band NaN.
 */
export function intensityBand(
  levels: readonly Pick<LevelResult, 'h' | 'nsif'>[], ratio: number, order: 1 | 2, farFieldShift?: number,
): { value: number; uncertainty: number } | undefined {
  let first = levels.length;
  while (first > 0 && levels[first - 1].nsif !== undefined && Number.isFinite(levels[first - 1].nsif)) first--;
  const used = levels.slice(first);
  if (used.length === 0) return undefined;
  const K = used.map((l) => l.nsif!);
  const v = judgeSite(used.map((l) => l.h), K, ratio, order, 0, '', farFieldShift !== undefined && Number.isFinite(farFieldShift) ? farFieldShift : undefined);
  if (v.verdict !== 'converging') return { value: K[K.length - 1], uncertainty: NaN };
  return { value: v.estimate.value, uncertainty: v.estimate.uncertainty };
}

/**
 * The extent of a flat peak (issue 12 §8) on the finest mesh: from the node of the finest peak, the boundary
 * both ways while the nodal measure stays within twice the site's band, the band taken at least as wide as
 * the finest level's distance from the converged value and the spread of the finest three peaks (so the
 * node-to-node noise of the finest mesh does not cut the plateau short).
 */
export function withPlateauExtent(r: SiteResult, c: SiteCandidate, mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride'>, nodal: Float64Array): SiteResult {
  if (!c.plateau || r.verdict !== 'converging' || r.levels.length === 0) return r;
  const last = r.levels[r.levels.length - 1];
  const peaks = r.levels.slice(-3).map((l) => l.peak);
  const spread = Math.max(...peaks) - Math.min(...peaks);
  const tol = 2 * Math.max(r.estimate.uncertainty, Math.abs(last.peak - r.estimate.value), spread);
  const floor = r.estimate.value - tol;
  const s = mesh.edgeStride, nE = mesh.boundaryEdges.length / s;
  const out = new Int32Array(mesh.xy.length / 2).fill(-1), into = new Int32Array(mesh.xy.length / 2).fill(-1);
  for (let e = 0; e < nE; e++) { out[mesh.boundaryEdges[s * e]] = e; into[mesh.boundaryEdges[s * e + 1]] = e; }
  let start = -1, bd = Infinity;
  for (let e = 0; e < nE; e++) {
    const n = mesh.boundaryEdges[s * e];
    const dd = Math.hypot(mesh.xy[2 * n] - last.peakAt[0], mesh.xy[2 * n + 1] - last.peakAt[1]);
    if (dd < bd) { bd = dd; start = n; }
  }
  if (start < 0) return r;
  const ends: number[] = [start, start];
  let length = 0, closed = false;
  for (const forward of [true, false]) {
    let m = start;
    for (;;) {
      const e = forward ? out[m] : into[m];
      if (e < 0) break;
      const next = mesh.boundaryEdges[s * e + (forward ? 1 : 0)];
      if (!(nodal[next] >= floor)) break;
      length += Math.hypot(mesh.xy[2 * next] - mesh.xy[2 * m], mesh.xy[2 * next + 1] - mesh.xy[2 * m + 1]);
      if (next === start || next === ends[0]) { closed = true; break; }
      m = next;
    }
    if (closed) break;
    ends[forward ? 0 : 1] = m;
  }
  const P = (n: number): Point => [mesh.xy[2 * n], mesh.xy[2 * n + 1]];
  return { ...r, extent: closed ? { from: P(start), to: P(start), length, closed } : { from: P(ends[1]), to: P(ends[0]), length, closed } };
}

/** The finest level's readouts of a site, with the distances they were read at and K with its band. */
export function siteReadouts(
  levels: readonly LevelResult[], probe: SiteProbe, ratio: number, order: 1 | 2, stress: string, length: string, farFieldShiftK?: number,
): SiteResult['readouts'] {
  const last = levels[levels.length - 1];
  const d = probe.distance;
  const readouts: SiteResult['readouts'] = {};
  if (!last) return readouts;
  if (last.atDistance !== undefined || last.average !== undefined) {
    readouts.distance = d;
    if (probe.distanceRule) readouts.distanceRule = probe.distanceRule;
    if (last.atDistance !== undefined) readouts.atDistance = last.atDistance;
    if (last.average !== undefined) readouts.average = last.average;
  }
  if (last.lineAverage !== undefined) { readouts.lineAverage = last.lineAverage; readouts.lineLength = 4 * d; }
  if (probe.criticalDistance !== undefined && (last.pointMethod !== undefined || last.lineMethod !== undefined)) {
    readouts.criticalDistance = probe.criticalDistance;
    if (last.pointMethod !== undefined) readouts.pointMethod = last.pointMethod;
    if (last.lineMethod !== undefined) readouts.lineMethod = last.lineMethod;
  }
  const K = intensityBand(levels, ratio, order, farFieldShiftK);
  if (K && probe.intensity) {
    readouts.nsif = K.value;
    readouts.nsifUncertainty = K.uncertainty;
    readouts.nsifUnits = nsifUnits(stress, length, probe.intensity.lambda);
    readouts.nsifRadii = [probe.intensity.innerRadius, probe.intensity.outerRadius];
  }
  return readouts;
}

/**
 * Where a site is reported (issue 12 §8): a peak found as a maximum of the first mesh where the finest level's
 * peak sits; a feature (corner, support end, point load) and a listed point exactly where they are.
 */
export function reportedPosition(c: Pick<SiteCandidate, 'origin' | 'at'>, finest: Pick<LevelResult, 'peakAt'> | undefined): Point {
  return c.origin === 'maximum' && finest ? [finest.peakAt[0], finest.peakAt[1]] : c.at;
}
