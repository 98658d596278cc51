/**
 * `--path` for solve and study: the recovered stress along a line or an opening's edge, written to
 * `<out>/path.csv`, with `--compare kirsch|lame|inglis` adding closed-form columns and the difference.
 * The command wiring calls `registerPathOptions(cmd)` when it builds the command and
 * `writePathOutputs(...)` once it has the mesh and the recovered field.
 */
import { join } from 'node:path';
import { Option, type Command } from 'commander';
import { PeakwiseError } from '../errors.js';
import type { Model, Point } from '../model/types.js';
import type { Mesh } from '../mesh/types.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { NodalStress } from '../recovery/types.js';
import { comparePath, openingPath, parsePathSpec, pathCsv, resolveCompare, samplePath, type PathTable } from '../sweep/path.js';
import { writeFileAtomic } from './io.js';
import { capitalise, type PathPlotInput, type PathSeries } from '../report/index.js';
import { stressUnit } from '../model/index.js';

export interface PathCliOptions {
  path?: string;
  compare?: string;
  remote?: string;
  loadAngle?: string;
  radius?: string;
  outerRadius?: string;
  centre?: string;
  innerPressure?: string;
  outerPressure?: string;
}

/** Adds --path and the comparison options to a command. */
export function registerPathOptions(cmd: Command): Command {
  return cmd
    .option('--path <spec>', 'stress along a line x1,y1:x2,y2[:n] (n samples, default 101) or around opening:<id>; writes path.csv')
    .addOption(new Option('--compare <form>', 'add a closed-form solution to path.csv').choices(['kirsch', 'lame', 'inglis']))
    .option('--remote <S>', 'remote tension for --compare kirsch|inglis')
    .option('--load-angle <deg>', 'direction of the remote tension from the x axis, degrees (default 0)')
    .option('--radius <a>', 'hole radius (kirsch) or inner radius (lame); default: the circular opening')
    .option('--outer-radius <b>', 'outer radius for --compare lame; default: a circular outline')
    .option('--centre <x,y>', 'centre of the hole or ring; default: the opening')
    .option('--inner-pressure <p>', 'internal pressure for --compare lame (default: the model\'s pressure on that opening)')
    .option('--outer-pressure <q>', 'external pressure for --compare lame (default: the model\'s pressure on the outline)');
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

/** Check the path options before any solving, so a typo fails fast. */
export function checkPathOptions(opts: PathCliOptions): void {
  if (opts.path === undefined) {
    if (opts.compare !== undefined) throw new PeakwiseError('usage', '--compare needs --path');
    return;
  }
  parsePathSpec(opts.path);
  num(opts.remote, '--remote');
  num(opts.loadAngle, '--load-angle');
  num(opts.radius, '--radius');
  num(opts.outerRadius, '--outer-radius');
  num(opts.innerPressure, '--inner-pressure');
  num(opts.outerPressure, '--outer-pressure');
  point(opts.centre, '--centre');
}

/** The path table for the options, or undefined without --path. Pure apart from reading options. */
export function pathTable(opts: PathCliOptions, input: { model: Model; mesh: Mesh; geometry: PlateGeometry; field: NodalStress }): PathTable | undefined {
  if (opts.path === undefined) return undefined;
  const spec = parsePathSpec(opts.path);
  let table = spec.kind === 'line'
    ? samplePath(input.mesh, input.field, spec.from, spec.to, spec.samples)
    : openingPath(input.mesh, input.geometry, input.field, spec.id);
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
    if (c.kind === 'inglis' && spec.kind !== 'opening') throw new PeakwiseError('usage', '--compare inglis gives the stress on the hole edge only: use --path opening:<id>');
    table = comparePath(table, c);
  }
  return table;
}

/**
 * Writes `<outDir>/path.csv` when --path was given; returns its path and the curves for the
 * report's path plot (undefined without --path). `protect` lists input files that must never be
 * overwritten (the model file).
 */
export function writePathOutputs(
  outDir: string,
  opts: PathCliOptions,
  input: { model: Model; mesh: Mesh; geometry: PlateGeometry; field: NodalStress },
  protect: string[] = [],
): { file: string; plot: PathPlotInput } | undefined {
  const table = pathTable(opts, input);
  if (!table) return undefined;
  const file = join(outDir, 'path.csv');
  writeFileAtomic(file, pathCsv(table), protect);
  return { file, plot: pathPlotOf(table, opts, input.model) };
}

/** The report's plot: tangential stress around an opening, von Mises along a line; references dashed. */
export function pathPlotOf(table: PathTable, opts: PathCliOptions, model: Model): PathPlotInput {
  const S = stressUnit(model.units);
  const onEdge = table.kind === 'opening';
  const fe = table.samples.map((p) => (onEdge ? p.tangential : p.vonMises));
  const ref = table.extra[onEdge ? 'ref_tangential' : 'ref_von_mises'];
  const what = onEdge ? 'tangential stress' : 'von Mises stress';
  const series: PathSeries[] = [{ label: `peakwise ${what}`, values: fe }];
  if (ref) series.push({ label: `${opts.compare ?? 'closed form'} ${what}`, values: ref, reference: true });
  return {
    title: `${capitalise(what)} along ${opts.path ?? 'the path'}`,
    s: table.samples.map((p) => p.s),
    series,
    xLabel: `arc length s (${model.units.length})`,
    yLabel: `${what} (${S})`,
  };
}
