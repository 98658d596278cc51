/**
 * `--cut` for solve and study: the recovered stress along a line or an opening's edge, written to
 * `<out>/cut.csv`, with `--compare kirsch|lame|inglis` adding closed-form columns and the difference.
 * The command wiring adds the options with `registerCutOptions(cmd)` (register.ts) and calls
 * `writeCutOutputs(...)` once it has the mesh and the recovered field.
 */
import { join } from 'node:path';
import { PeakwiseError } from '../errors.js';
import type { Model, Point } from '../model/types.js';
import type { Mesh } from '../mesh/types.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { NodalStress } from '../recovery/types.js';
import { compareCut, cutColumn, openingCut, overlayOtherCut, parseCutSpec, cutCsv, resolveCompare, sampleCut, OTHER_CUT_COLUMNS, type CutTable, type OtherCutColumn } from '../sweep/cut.js';
import { readFileSync } from 'node:fs';
import { CsvError, readCsv } from '../model/csv.js';
import { writeFileAtomic } from './io.js';
import { capitalise, type CutPlotInput, type CutSeries } from '../report/index.js';
import { stressUnit } from '../model/index.js';

export interface CutCliOptions {
  cut?: string;
  compare?: string;
  remote?: string;
  loadAngle?: string;
  radius?: string;
  outerRadius?: string;
  centre?: string;
  innerPressure?: string;
  outerPressure?: string;
  /** results along the same cut from another analysis: a CSV with x, y and one stress column */
  cutOther?: string;
}

function num(text: string | undefined, option: string): number | undefined {
  if (text === undefined) return undefined;
  const v = Number(text);
  if (text.trim() === '' || !Number.isFinite(v)) throw new PeakwiseError('usage', `${option} must be a number, got "${text}"`);
  return v;
}

function point(text: string | undefined, option: string): Point | undefined {
  if (text === undefined) return undefined;
  const xy = text.split(',').map((v) => (v.trim() === '' ? NaN : Number(v)));
  if (xy.length !== 2 || !xy.every(Number.isFinite)) throw new PeakwiseError('usage', `${option} must be x,y, got "${text}"`);
  return [xy[0], xy[1]];
}

/** Check the cut options before any solving, so a typo fails fast. */
export function checkCutOptions(opts: CutCliOptions): void {
  if (opts.cut === undefined) {
    if (opts.compare !== undefined) throw new PeakwiseError('usage', '--compare needs --cut');
    if (opts.cutOther !== undefined) throw new PeakwiseError('usage', '--cut-other needs --cut');
    return;
  }
  if (opts.cutOther !== undefined) readOtherCut(opts.cutOther);
  parseCutSpec(opts.cut);
  num(opts.remote, '--remote');
  num(opts.loadAngle, '--load-angle');
  num(opts.radius, '--radius');
  num(opts.outerRadius, '--outer-radius');
  num(opts.innerPressure, '--inner-pressure');
  num(opts.outerPressure, '--outer-pressure');
  point(opts.centre, '--centre');
}

/** The cut table for the options, or undefined without --cut. Pure apart from reading options. */
export function cutTable(opts: CutCliOptions, input: { model: Model; mesh: Mesh; geometry: PlateGeometry; field: NodalStress }): CutTable | undefined {
  if (opts.cut === undefined) return undefined;
  const spec = parseCutSpec(opts.cut);
  let table = spec.kind === 'line'
    ? sampleCut(input.mesh, input.field, spec.from, spec.to, spec.samples)
    : openingCut(input.mesh, input.geometry, input.field, spec.id);
  if (opts.compare !== undefined) {
    const c = resolveCompare({
      kind: opts.compare,
      remote: num(opts.remote, '--remote'),
      angleDeg: num(opts.loadAngle, '--load-angle'),
      radius: num(opts.radius, '--radius'),
      outerRadius: num(opts.outerRadius, '--outer-radius'),
      center: point(opts.centre, '--centre'),
      innerPressure: num(opts.innerPressure, '--inner-pressure'),
      outerPressure: num(opts.outerPressure, '--outer-pressure'),
      opening: spec.kind === 'opening' ? spec.id : undefined,
    }, input.model);
    if (c.kind === 'inglis' && spec.kind !== 'opening') throw new PeakwiseError('usage', '--compare inglis gives the stress on the hole edge only: use --cut opening:<id>');
    table = compareCut(table, c);
  }
  if (opts.cutOther !== undefined) {
    const other = readOtherCut(opts.cutOther);
    // a point of the other analysis may sit up to 1 % of the cut's length off it (its own mesh's nodes)
    const length = table.samples.length > 0 ? table.samples[table.samples.length - 1].s - table.samples[0].s : 0;
    table = overlayOtherCut(table, other.points, other.column, opts.cutOther, 0.01 * length);
  }
  return table;
}

/** The other analysis's results along the cut: a CSV with a header naming x, y and one stress column. */
export function readOtherCut(file: string): { column: OtherCutColumn; points: { x: number; y: number; value: number; line: number }[] } {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new PeakwiseError('io', `--cut-other ${file}: ${code === 'ENOENT' ? 'no such file' : `cannot be read (${code ?? 'unknown error'})`}`);
  }
  try {
    const t = readCsv(text, file);
    if (!t.header) throw new CsvError(`${file}: the first row must be a header naming x, y and one stress column (${OTHER_CUT_COLUMNS.join(', ')})`);
    const header = t.header;
    const ix = header.indexOf('x'), iy = header.indexOf('y');
    const stress = header.filter((h) => (OTHER_CUT_COLUMNS as readonly string[]).includes(h));
    if (ix < 0 || iy < 0 || stress.length !== 1 || header.length !== 3) {
      throw new CsvError(`${file}: expected the columns x, y and one stress column (${OTHER_CUT_COLUMNS.join(', ')}), got ${header.map((h) => `'${h}'`).join(', ')}`);
    }
    const column = stress[0] as OtherCutColumn;
    const iv = header.indexOf(column);
    const points = t.rows.map((r) => {
      if (r.values.length !== 3) throw new CsvError(`${file}:${r.line}: the row has ${r.values.length} fields, expected 3`);
      return { x: r.values[ix], y: r.values[iy], value: r.values[iv], line: r.line };
    });
    return { column, points };
  } catch (e) {
    if (e instanceof CsvError) throw new PeakwiseError('usage', e.message);
    throw e;
  }
}

/**
 * Writes `<outDir>/cut.csv` when --cut was given; returns its path and the curves for the
 * report's cut plot (undefined without --cut). `protect` lists input files that must never be
 * overwritten (the model file).
 */
export function writeCutOutputs(
  outDir: string,
  opts: CutCliOptions,
  input: { model: Model; mesh: Mesh; geometry: PlateGeometry; field: NodalStress },
  protect: string[] = [],
): { file: string; plot: CutPlotInput } | undefined {
  const table = cutTable(opts, input);
  if (!table) return undefined;
  const file = join(outDir, 'cut.csv');
  writeFileAtomic(file, cutCsv(table, { length: input.model.units.length, stress: stressUnit(input.model.units) }), opts.cutOther !== undefined ? [...protect, opts.cutOther] : protect);
  return { file, plot: cutPlotOf(table, opts, input.model) };
}

/** The report's plot: tangential stress around an opening, von Mises along a line; references dashed. */
export function cutPlotOf(table: CutTable, opts: CutCliOptions, model: Model): CutPlotInput {
  const S = stressUnit(model.units);
  const onEdge = table.kind === 'opening';
  const fe = table.samples.map((p) => (onEdge ? p.tangential : p.vonMises));
  const ref = table.extra[onEdge ? 'ref_tangential' : 'ref_von_mises'];
  const what = onEdge ? 'tangential stress' : 'von Mises stress';
  const series: CutSeries[] = [{ label: `peakwise ${what}`, values: fe }];
  if (ref) series.push({ label: `${opts.compare ?? 'closed form'} ${what}`, values: ref, reference: true });
  // results of another analysis along the same cut (issue 15 §5), beside peakwise's value of that column
  const otherKey = Object.keys(table.extra).find((k) => k.startsWith('other_'));
  if (otherKey) {
    const column = otherKey.slice('other_'.length) as OtherCutColumn;
    const plotted = onEdge ? 'tangential' : 'von_mises';
    const name = column.replace('_', ' ');
    if (column !== plotted) series.push({ label: `peakwise ${name}`, values: cutColumn(table, column) });
    series.push({ label: `another analysis ${name}`, values: table.extra[otherKey], other: true });
  }
  return {
    title: `${capitalise(what)} along ${opts.cut ?? 'the cut'}`,
    s: table.samples.map((p) => p.s),
    series,
    xLabel: `arc length s (${model.units.length})`,
    yLabel: `${what} (${S})`,
  };
}
