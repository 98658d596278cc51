/**
 * Terminal output: the study's verdict table and the one-solve summary. Colour comes from
 * `picocolors` only when the caller asks for it (the CLI decides from --no-color, NO_COLOR
 * and whether stdout is a terminal).
 */
import pc from 'picocolors';
import type { PlateGeometry } from '../geometry/types.js';
import type { Mesh } from '../mesh/types.js';
import type { Model, Point } from '../model/types.js';
import type { StudyResult, Verdict } from '../study/types.js';
import { singularMaxWarning } from './singular-max.js';
import { reportedCell, reportedLines } from './other-analysis.js';
import { formatNumber, formatPoint, stripControl } from './text.js';
import {
  BAND_LABEL, CAUTION, aboveYieldNote, atSupportEnd, featureLabel, isCrackLike, siteAdvice, siteReadout, siteValue, siteWhere,
} from './words.js';

export interface TerminalOptions {
  color: boolean;
}

type Colors = ReturnType<typeof pc.createColors>;

// eslint-disable-next-line no-control-regex
const ANSI = /\u001b\[[0-9;]*m/g;

function visibleWidth(text: string): number {
  return [...text.replace(ANSI, '')].length;
}

function pad(text: string, width: number): string {
  return text + ' '.repeat(Math.max(0, width - visibleWidth(text)));
}

function verdictColour(c: Colors, verdict: Verdict): (s: string) => string {
  if (verdict === 'converging') return c.green;
  if (verdict === 'singular') return c.magenta;
  return c.yellow;
}

/** Lays out rows as aligned columns separated by two spaces; the first row is the header. */
function columns(rows: string[][], c: Colors): string[] {
  // folded, not spread: a study may list any number of sites
  const widths = rows[0].map((_, j) => rows.reduce((w, r) => Math.max(w, visibleWidth(r[j] ?? '')), 0));
  return rows.map((r, i) => {
    const line = r.map((cell, j) => (j === r.length - 1 ? cell : pad(cell, widths[j]))).join('  ');
    return i === 0 ? c.bold(line) : line;
  });
}

/** Short legend of the readout column (the report and docs/study.md say more). */
const READOUT_KEY =
  'readouts: measures of the linear-elastic field along the inward bisector — point = the stress at the distance r shown, ' +
  'line = its mean from r = 0 to the length shown, area = the mean over the disk of the radius shown, K_I = notch stress intensity of the opening mode';

/** Lines under the table: what to make of flagged, support-end, crack and undecided sites. */
function siteNotes(study: StudyResult, c: Colors): string[] {
  const lines: string[] = [];
  for (const s of study.sites) {
    const y = aboveYieldNote(s, study.yieldStress, study.units.stress);
    if (y) lines.push(c.red(`${stripControl(s.id)}: ${y}`));
  }
  const ends = study.sites.filter((s) => s.verdict === 'singular' && atSupportEnd(s));
  if (ends.length > 0) {
    lines.push(c.magenta(`${ends.map((s) => stripControl(s.id)).join(', ')} (where a support ends): ${siteAdvice(ends[0])}`));
  }
  for (const s of study.sites) {
    if (s.verdict === 'singular' && isCrackLike(s)) lines.push(c.magenta(`${stripControl(s.id)}: ${siteAdvice(s)}`));
  }
  for (const s of study.sites.filter((x) => x.verdict === 'undecided')) {
    if (s.advice) lines.push(c.yellow(`${stripControl(s.id)}: ${stripControl(s.advice)}`));
  }
  return lines;
}

/**
 * The verdict table of a study: one row per site (site, where, feature, verdict, value ±
 * discretisation band, readouts), a short header naming the model and measure, notes on flagged
 * sites, and the caution line at the end.
 */
export function studyTable(study: StudyResult, options: TerminalOptions): string {
  const c = pc.createColors(options.color);
  const units = study.units;
  // with load cases: the envelope (a column names each site's governing case), or one case (--case)
  const envelope = study.envelope !== undefined;
  // a column of reported values (issue 15) when the model lists any; readouts stay last
  const withReported = (study.reported ?? []).length > 0;
  const section = study.model.state === 'axisymmetric';
  const header = ['site', section ? 'where (r, z)' : 'where', 'feature', 'verdict', ...(envelope ? ['governs'] : []), `value ± ${BAND_LABEL}`, ...(withReported ? ['reported'] : []), 'readouts'];
  const rows: string[][] = [header];
  for (const site of study.sites) {
    const verdict = stripControl(site.verdict);
    rows.push([
      stripControl(site.id),
      siteWhere(site, units.length),
      featureLabel(site),
      verdictColour(c, site.verdict)(verdict),
      ...(envelope ? [c.bold(stripControl(site.case ?? ''))] : []),
      siteValue(site, units.stress),
      ...(withReported ? [reportedCell(study, site.id) || '—'] : []),
      siteReadout(site, units),
    ]);
  }
  const lines: string[] = [];
  const title = stripControl(study.model.title) || '(untitled model)';
  lines.push(c.bold(title));
  lines.push(
    c.dim(
      `${stripControl(study.measure)} in ${stripControl(units.stress)} · ${study.mesh.order === 2 ? 'LST' : 'CST'} · ` +
        (section ? 'axisymmetric section · ' : '') +
        `${study.sites.length} site${study.sites.length === 1 ? '' : 's'}`,
    ),
  );
  const cases = caseLine(study);
  if (cases) lines.push(c.dim(cases));
  lines.push('');
  if (study.sites.length === 0) lines.push('No sites were found.');
  else {
    for (const line of columns(rows, c)) lines.push(line);
    lines.push(c.dim(READOUT_KEY));
  }
  lines.push(...siteNotes(study, c));
  const rep = reportedLines(study);
  if (rep.length > 0) lines.push('', ...rep);
  lines.push('');
  lines.push(c.dim(CAUTION));
  return lines.join('\n') + '\n';
}

/** The line naming the load cases: the envelope's list, or the one case shown; undefined without cases. */
function caseLine(study: StudyResult): string | undefined {
  if (study.cases && study.envelope) {
    const names = study.cases.map((k) => stripControl(k.kind === 'combination' && k.expression ? `${k.name} = ${k.expression}` : k.name));
    const signed = study.envelope.some((e) => e.byMagnitude) ? ' by magnitude (a signed measure)' : '';
    return `envelope of ${names.join(', ')}: each site from the case or combination that governs it${signed} (converged value; readout at distance where singular); --case NAME shows one`;
  }
  const one = study.sites[0]?.case;
  return one !== undefined ? `load case ${stripControl(one)} alone` : undefined;
}

/**
 * What `peakwise solve` prints. All numbers are in the model's own consistent units; the
 * strings only label them. Timings are seconds per phase, in the order given.
 */
export interface SolveSummaryInput {
  title: string;
  units: { length: string; force: string; stress: string };
  nodes: number;
  elements: number;
  order: 1 | 2;
  dofs: number;
  /** largest displacement magnitude and the node position where it occurs */
  maxDisplacement: { value: number; at: Point };
  /** sum of support reactions, x and y (force units) */
  reactionSum: [number, number];
  /** sum of applied loads, x and y (force units) */
  appliedSum: [number, number];
  /** largest value of the stress measure and where */
  maxStress: { measure: string; value: number; at: Point };
  /** seconds per phase, e.g. { mesh: 0.12, assemble: 0.05, factor: 0.3, solve: 0.01, recover: 0.04 } */
  timings: Record<string, number>;
  /** Zienkiewicz–Zhu error estimate η in percent, when computed */
  errorPercent?: number;
  /** further labelled lines, shown after the stress lines (label, text) */
  extraRows?: [string, string][];
  /** Σ |nodal load| (force units): the scale of the equilibrium check for self-balanced loads */
  loadScale?: number;
  /** scaled residual ‖Ku − f‖ / ‖f‖, when computed */
  residual?: number;
  /** the solved model: when given, a maximum at a point theory flags as singular gets a warning */
  singularCheck?: { model: Model; geometry: PlateGeometry; mesh: Mesh };
}

/**
 * Equilibrium mismatch |R + F| of the support reactions R (the forces the supports exert on the
 * plate) and the applied loads F, relative to the size of the loading: `loadScale` (the sum of
 * the magnitudes of all nodal loads — it stays meaningful for a self-equilibrated loading whose
 * resultant is zero), or else the larger of |F| and |R|.
 */
export function equilibriumMismatch(reaction: [number, number], applied: [number, number], loadScale = 0): number {
  const ref = Math.max(loadScale, Math.hypot(applied[0], applied[1]), Math.hypot(reaction[0], reaction[1]));
  if (ref === 0) return 0;
  return Math.hypot(reaction[0] + applied[0], reaction[1] + applied[1]) / ref;
}

export function solveSummary(info: SolveSummaryInput, options: TerminalOptions): string {
  const c = pc.createColors(options.color);
  const L = stripControl(info.units.length);
  const F = stripControl(info.units.force);
  const S = stripControl(info.units.stress);
  const vec = (v: [number, number]) => `(${formatNumber(v[0], 6)}, ${formatNumber(v[1], 6)}) ${F}`.trimEnd();
  const mismatch = equilibriumMismatch(info.reactionSum, info.appliedSum, info.loadScale);
  const balanced = mismatch < 1e-6;
  const rows: string[][] = [
    ['mesh', `${info.nodes} nodes, ${info.elements} ${info.order === 2 ? 'LST' : 'CST'} elements, ${info.dofs} dofs`],
    ['max displacement', `${formatNumber(info.maxDisplacement.value)} ${L} at ${formatPoint(info.maxDisplacement.at, L)}`],
    ['applied sum', vec(info.appliedSum)],
    [
      'reaction sum',
      `${vec(info.reactionSum)}  ${(balanced ? c.green : c.red)(
        `balance ${formatNumber(mismatch, 2)}${balanced ? '' : ' — check supports and loads'}`,
      )}`,
    ],
    [
      `max ${stripControl(info.maxStress.measure)}`,
      `${formatNumber(info.maxStress.value)} ${S} at ${formatPoint(info.maxStress.at, L)}`,
    ],
  ];
  for (const [k, v] of info.extraRows ?? []) rows.push([stripControl(k), stripControl(v)]);
  if (info.errorPercent !== undefined) rows.push(['error estimate', `${formatNumber(info.errorPercent, 3)} % (energy norm)`]);
  if (info.residual !== undefined) rows.push(['scaled residual', formatNumber(info.residual, 2)]);
  const phases = Object.entries(info.timings);
  if (phases.length > 0) {
    const total = phases.reduce((a, [, t]) => a + t, 0);
    rows.push([
      'time',
      phases.map(([k, t]) => `${stripControl(k)} ${formatNumber(t, 2)} s`).join(', ') + ` (total ${formatNumber(total, 3)} s)`,
    ]);
  }
  const width = Math.max(...rows.map((r) => visibleWidth(r[0])));
  const lines = [c.bold(stripControl(info.title) || '(untitled model)'), ''];
  for (const [k, v] of rows) lines.push(`${c.dim(pad(k, width))}  ${v}`);
  const singular = info.singularCheck
    ? singularMaxWarning({ ...info.singularCheck, at: info.maxStress.at, measure: info.maxStress.measure })
    : undefined;
  if (singular) lines.push('', c.yellow(`warning: ${singular}`));
  lines.push('');
  lines.push(c.dim(CAUTION));
  return lines.join('\n') + '\n';
}
