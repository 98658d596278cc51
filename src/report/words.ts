/**
 * Plain-language descriptions shared by the terminal and the HTML page: the caution, verdict
 * wording, and loads / supports in words.
 */
import type { AnyLoad, DisplacementValue, EdgeLoad, Model, Selector, Support } from '../model/types.js';
import type { SiteResult, StudyResult } from '../study/types.js';
import { formatBand, formatFixed, formatNumber, stripControl } from './text.js';

export const CAUTION =
  'peakwise supports, and does not replace, the judgment of a qualified engineer; ' +
  'follow the design codes and licensed practice that apply where you work.';

/** Words for a selector: "the boundary on the line x = 0". */
export function describeSelector(where: Selector, lengthUnit: string): string {
  const u = stripControl(lengthUnit);
  const n = (v: number) => formatNumber(v);
  switch (where.kind) {
    case 'x':
      return `the boundary on the line x = ${n(where.value)} ${u}`.trimEnd();
    case 'y':
      return `the boundary on the line y = ${n(where.value)} ${u}`.trimEnd();
    case 'segment':
      return `the boundary between (${n(where.from[0])}, ${n(where.from[1])}) and (${n(where.to[0])}, ${n(where.to[1])})`;
    case 'opening':
      return `the edge of opening “${stripControl(where.id)}”`;
    case 'outline':
      return 'the whole outer edge';
    case 'point':
      return `the point (${n(where.at[0])}, ${n(where.at[1])})`;
    case 'piece':
      return `the boundary piece nearest (${n(where.at[0])}, ${n(where.at[1])})`;
  }
}

function displacementWords(v: DisplacementValue | undefined, axis: string, lengthUnit: string): string {
  if (v === undefined) return '';
  return typeof v === 'number' ? `u${axis} = ${formatNumber(v)} ${stripControl(lengthUnit)}`.trimEnd() : `u${axis} = ${stripControl(v.expression)}`;
}

export function describeSupport(support: Support, lengthUnit: string): string {
  const d = support.displace;
  if (d) {
    const where = capitalise(describeSelector(support.where, lengthUnit));
    if (d.kind === 'table') return `${where} is moved by the displacements of the table ${stripControl(d.file)} (${d.rows.length / 4} points).`;
    const parts = [displacementWords(d.x, 'x', lengthUnit), displacementWords(d.y, 'y', lengthUnit)].filter(Boolean);
    return `${where} is moved to ${parts.join(', ')}.`;
  }
  const dirs = [support.fix.x ? 'x' : '', support.fix.y ? 'y' : ''].filter(Boolean);
  const held = dirs.length === 2 ? 'held in x and y' : dirs.length === 1 ? `held in ${dirs[0]} only` : 'free';
  return `${capitalise(describeSelector(support.where, lengthUnit))} is ${held}.`;
}

export function describeLoad(load: AnyLoad, units: { length: string; force: string; stress: string }): string {
  const len = stripControl(units.length);
  switch (load.kind) {
    case 'gravity':
      return `Self-weight: gravity (${formatNumber(load.gravity[0])}, ${formatNumber(load.gravity[1])}) ${len}/time² over the whole plate.`;
    case 'spin':
      return `Rotation at ω = ${formatNumber(load.omega)} rad/time about (${formatNumber(load.about[0])}, ${formatNumber(load.about[1])}) ${len}: centrifugal load ρω²r.`;
    case 'temperature': {
      const t = load.temperature;
      return `Temperature change ΔT = ${typeof t === 'number' ? formatNumber(t) : t.expression} over the plate.`;
    }
    default:
      return describeEdgeLoad(load, units);
  }
}

function describeEdgeLoad(load: EdgeLoad, units: { length: string; force: string; stress: string }): string {
  const where = describeSelector(load.where, units.length);
  const s = stripControl(units.stress);
  const f = stripControl(units.force);
  switch (load.kind) {
    case 'traction':
      return `Traction (${formatNumber(load.traction[0])}, ${formatNumber(load.traction[1])}) ${s} on ${where}.`;
    case 'pressure':
      return `Pressure ${formatNumber(load.pressure)} ${s} pushing on ${where}.`;
    case 'force':
      return `Concentrated force (${formatNumber(load.force[0])}, ${formatNumber(load.force[1])}) ${f} at ${where}.`;
    case 'stress':
      return `Far-field stress (σxx, σyy, τxy) = (${load.stress.map((v) => formatNumber(v)).join(', ')}) ${s} applied as tractions on ${where}.`;
    case 'pinForce':
      return `Pin force (${formatNumber(load.force[0])}, ${formatNumber(load.force[1])}) ${f} as a cosine pressure on ${where}.`;
  }
}

export function capitalise(text: string): string {
  return text.length > 0 ? text[0].toUpperCase() + text.slice(1) : text;
}

/** "S1 at (12, 30) mm" style location. */
export function siteWhere(site: SiteResult, lengthUnit: string): string {
  return `(${formatNumber(site.at[0])}, ${formatNumber(site.at[1])}) ${stripControl(lengthUnit)}`.trimEnd();
}

/** The short feature label used in tables: "corner 270°", "fillet r 5", "point load". */
export function featureLabel(site: SiteResult): string {
  const f = site.feature;
  switch (f.kind) {
    case 'corner': {
      // a corner where a support ends says so: its singularity belongs to the idealised support
      const held = f.faceConditions?.some((c) => c !== 'free') ? `, faces ${f.faceConditions.join('/')}` : '';
      return `corner ${formatNumber(f.interiorAngleDeg, 4)}°${stripControl(held)}`;
    }
    case 'fillet':
      return `fillet r ${formatNumber(f.radius)}`;
    case 'opening':
      return f.radius > 0 ? `opening r ${formatNumber(f.radius)}` : 'opening';
    default:
      return stripControl(f.kind).replace('-', ' ');
  }
}

/** What the ± of a converged value is: the estimated error of the discretisation alone. */
export const BAND_LABEL = 'discretisation band';

/** "143.1234 ± 0.0044 MPa": a converged value with its discretisation band, rounded by `formatBand`. */
export function bandText(value: number, band: number, stressUnit: string): string {
  const f = formatBand(value, band);
  return `${f.value} ± ${f.band} ${stripControl(stressUnit)}`.trimEnd();
}

/**
 * The headline value of a site: the extrapolated value ± its discretisation band for a converging
 * site (marked when above the yield stress), the growth rate for a singular one (the peak itself
 * means nothing there), the last peak for an undecided one.
 */
export function siteValue(site: SiteResult, stressUnit: string): string {
  const s = stripControl(stressUnit);
  if (site.verdict === 'converging') {
    return bandText(site.estimate.value, site.estimate.uncertainty, s) + (site.aboveYield ? ' (above yield)' : '');
  }
  if (site.verdict === 'singular') {
    return `q = ${formatFixed(site.growth.exponent, 2)} (theory ${formatFixed(site.growth.theory, 2)})`;
  }
  const last = site.levels[site.levels.length - 1];
  return last ? `last peak ${formatNumber(last.peak)} ${s} (unsettled)`.trimEnd() : 'no levels';
}

/** Stress and length units a notch stress intensity can be restated in MPa·m^x from. */
const TO_MPA: Record<string, number> = { MPa: 1, 'N/mm²': 1, 'N/mm^2': 1, kPa: 1e-3, Pa: 1e-6, GPa: 1e3 };
const TO_M: Record<string, number> = { mm: 1e-3, cm: 1e-2, m: 1 };

/** "mm^0.456", or "√mm" for the crack exponent 1/2. */
function lengthPower(length: string, x: number): string {
  return Math.abs(x - 0.5) < 5e-4 ? `√${length}` : `${length}^${formatFixed(x, 3)}`;
}

/**
 * The notch stress intensity of the opening mode (K_I; for a crack, the stress intensity factor),
 * K = lim √(2π) r^(1−λ) σθθ (Gross & Mendelson 1972), in the model's units stress·length^(1−λ),
 * and restated in MPa·m^(1−λ) when the model's units allow (N and mm: divide by 1000^(1−λ), so
 * MPa·√mm / √1000 = MPa·√m). Undefined when the site has none.
 */
export function nsifText(site: SiteResult, units: StudyResult['units']): string | undefined {
  const r = site.readouts;
  if (r.nsif === undefined || !Number.isFinite(r.nsif)) return undefined;
  const S = stripControl(units.stress), L = stripControl(units.length);
  const m = /\^([0-9.]+)$/.exec(r.nsifUnits ?? '');
  if (!m) return `${formatNumber(r.nsif)}${r.nsifUnits ? ' ' + stripControl(r.nsifUnits) : ''}`;
  // the exponent 1 − λ of the opening family; the units string holds it to 3 decimals, the feature exactly
  let x = Number(m[1]);
  const lambda = site.feature.lambda;
  if (lambda !== undefined && Math.abs(1 - lambda - x) < 6e-4) x = 1 - lambda;
  const native = `${formatNumber(r.nsif)} ${S}·${lengthPower(L, x)}`;
  const toMPa = TO_MPA[units.stress], toM = TO_M[units.length];
  if (toMPa === undefined || toM === undefined || (toMPa === 1 && toM === 1)) return native;
  return `${native} (${formatNumber(r.nsif * toMPa * toM ** x)} MPa·${lengthPower('m', x)})`;
}

/**
 * The point, line and area measures of the linear field at a site, and its notch stress
 * intensity, in one line, each with the distance or radius it belongs to:
 * "point 139 MPa at r = 0.5 mm; line mean 135 MPa over r = 0–2 mm; area mean 141.4 MPa over r ≤ 0.5 mm; K_I …".
 */
export function siteReadout(site: SiteResult, units: StudyResult['units']): string {
  const r = site.readouts;
  const s = stripControl(units.stress);
  const L = stripControl(units.length);
  const len = (v: number | undefined) => (v !== undefined ? `${formatNumber(v)} ${L}`.trimEnd() : 'the readout distance');
  const parts: string[] = [];
  if (r.atDistance !== undefined && Number.isFinite(r.atDistance)) parts.push(`point ${formatNumber(r.atDistance)} ${s} at r = ${len(r.distance)}`);
  if (r.lineAverage !== undefined && Number.isFinite(r.lineAverage)) {
    parts.push(`line mean ${formatNumber(r.lineAverage)} ${s} over r = 0–${len(r.lineLength)}`);
  }
  if (r.average !== undefined && Number.isFinite(r.average)) parts.push(`area mean ${formatNumber(r.average)} ${s} over r ≤ ${len(r.distance)}`);
  const k = nsifText(site, units);
  if (k) parts.push(`K_I ${k}`);
  return parts.length > 0 ? parts.join('; ') : '—';
}

/** What the readouts are, for legends under a table of them. */
export const READOUTS_LEGEND =
  'Readouts are measures of the linear-elastic field at the site, along the inward bisector (the inward normal on an edge): ' +
  'point = the stress at the distance r; line = its mean over 0 ≤ r ≤ 4 × that distance; area = the mean over the disk of radius r; ' +
  'K_I = the notch stress intensity of the opening mode. Assessment methods use them with a distance of their own: the point and ' +
  'line methods of the theory of critical distances (Taylor 2007) need the material\u2019s critical distance, averaging methods a ' +
  'material volume, notch stress intensity methods K_I itself; set study.readouts.distance to the distance the applicable code or method asks for.';

/** A singular site's corner (or edge end) where a support ends: the singularity belongs to the idealised support. */
export function atSupportEnd(site: SiteResult): boolean {
  const f = site.feature;
  return f.kind === 'support-edge' || (f.kind === 'corner' && (f.faceConditions?.some((c) => c !== 'free') ?? false));
}

/** A corner whose material angle is that of a crack (a slit closing to a sharp tip). */
export function isCrackLike(site: SiteResult): boolean {
  return site.feature.kind === 'corner' && site.feature.interiorAngleDeg >= 350 && !atSupportEnd(site);
}

/**
 * The next step for a site, in the report's words: for a singular site it depends on what makes it
 * singular (an idealised support, a concentrated load, a crack, a sharp corner); otherwise the
 * study's own advice.
 */
export function siteAdvice(site: SiteResult): string | undefined {
  if (site.verdict !== 'singular') return site.advice;
  const f = site.feature;
  if (atSupportEnd(site)) {
    return 'model the real support (the bolts, the contact, the stiffness of the flange or member it is fixed to) rather than a radius: ' +
      'the singularity comes from a support idealised as rigid up to a sharp end, and its readouts describe that idealisation, ' +
      'not the real detail; use them only to compare variants with the same support';
  }
  if (f.kind === 'point-load') return 'spread the force over its real contact length (a pressure on an edge) or read the stress at a distance from it';
  if (f.kind === 'point-support') return 'model the support over its real length and stiffness, or read the stress at a distance from it';
  if (isCrackLike(site)) {
    return 'this is a crack: it needs a fracture assessment (K_I against the material\u2019s fracture toughness, and crack growth under repeated load, by the applicable code or procedure); the peak stress means nothing here';
  }
  return 'do not read the peak as a stress: model the real corner radius, or use the readouts the applicable code asks for';
}

/** The flag of a converged value above the yield stress. */
export function aboveYieldNote(site: SiteResult, yieldStress: number | undefined, stressUnit: string): string | undefined {
  if (!site.aboveYield) return undefined;
  const y = yieldStress !== undefined ? ` (${formatNumber(yieldStress)} ${stripControl(stressUnit)})`.trimEnd() : '';
  return `above the yield stress${y}: a linear-elastic result, so local yielding is expected here; assess it as the applicable code asks (e.g. an elastic–plastic analysis or a limit on the linear-elastic peak)`;
}

/** How the sites are chosen, in one sentence (README, report lede, docs/study.md say the same). */
export const SITE_DETECTION =
  'Sites are the points theory flags as singular (sharp corners with a Williams exponent below 1, ends of supports, concentrated loads and loaded point supports), ' +
  'the local maxima of the first solve\u2019s stress above 1.3 × its median, or the points the model lists in study.sites; ' +
  'a peak outside these is not studied, and every verdict is about the model, which is the user\u2019s idealisation of the real detail.';

/** Model-level summary lines (used in HTML). */
export function materialLine(model: Model, stressUnit: string): string {
  const y = model.material.yield !== undefined ? `, yield ${formatNumber(model.material.yield)} ${stripControl(stressUnit)}` : '';
  const { density, expansion } = model.material;
  const rho = density !== undefined ? `, density ${formatNumber(density)}` : '';
  const alpha = expansion !== undefined ? `, α = ${formatNumber(expansion)} per degree` : '';
  return `E = ${formatNumber(model.material.E)} ${stripControl(stressUnit)}, ν = ${formatNumber(model.material.nu)}${y}${rho}${alpha}`;
}
