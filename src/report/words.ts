/**
 * Plain-language descriptions shared by the terminal and the HTML page: the caution, verdict
 * wording, and loads / supports in words.
 */
import type { AnyLoad, DisplacementValue, Model, Selector, Support } from '../model/types.js';
import type { SiteResult, StudyResult } from '../study/types.js';
import { formatFixed, formatNumber, stripControl } from './text.js';

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

/**
 * The headline value of a site: the extrapolated value for a converging site, the growth rate
 * for a singular one (the peak itself means nothing there), the last peak for an undecided one.
 */
export function siteValue(site: SiteResult, stressUnit: string): string {
  const s = stripControl(stressUnit);
  if (site.verdict === 'converging') {
    return `${formatNumber(site.estimate.value)} ± ${formatNumber(site.estimate.uncertainty, 2)} ${s}`.trimEnd();
  }
  if (site.verdict === 'singular') {
    return `q = ${formatFixed(site.growth.exponent, 2)} (theory ${formatFixed(site.growth.theory, 2)})`;
  }
  const last = site.levels[site.levels.length - 1];
  return last ? `last peak ${formatNumber(last.peak)} ${s} (unsettled)`.trimEnd() : 'no levels';
}

/** The usable engineering measure(s) of a site, in one line. */
export function siteReadout(site: SiteResult, units: StudyResult['units']): string {
  const r = site.readouts;
  const s = stripControl(units.stress);
  const L = stripControl(units.length);
  const parts: string[] = [];
  if (r.atDistance !== undefined && Number.isFinite(r.atDistance)) {
    const d = r.distance !== undefined ? ` at ${formatNumber(r.distance)} ${L}` : ' at distance';
    parts.push(`${formatNumber(r.atDistance)} ${s}${d}`);
  }
  if (r.average !== undefined && Number.isFinite(r.average)) parts.push(`disk mean ${formatNumber(r.average)} ${s}`);
  // line-method mean: newer study results carry it; read it structurally so older ones still type-check
  const line = r as { lineAverage?: number; lineLength?: number };
  if (line.lineAverage !== undefined && Number.isFinite(line.lineAverage)) {
    const over = line.lineLength !== undefined ? ` over ${formatNumber(line.lineLength)} ${L}` : '';
    parts.push(`line mean ${formatNumber(line.lineAverage)} ${s}${over}`);
  }
  if (r.nsif !== undefined && Number.isFinite(r.nsif)) {
    parts.push(`K = ${formatNumber(r.nsif)}${r.nsifUnits ? ' ' + stripControl(r.nsifUnits) : ''}`);
  }
  return parts.length > 0 ? parts.join('; ') : '—';
}

/** Model-level summary lines (used in HTML). */
export function materialLine(model: Model, stressUnit: string): string {
  return `E = ${formatNumber(model.material.E)} ${stripControl(stressUnit)}, ν = ${formatNumber(model.material.nu)}`;
}
