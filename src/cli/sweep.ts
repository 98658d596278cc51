/**
 * `peakwise sweep <model> --vary name=values …`: the study repeated over parameter values on
 * worker threads, with finished points kept in `<out>/points/<key>.json` so that a rerun (after an
 * interruption, or with more values) reuses them. Writes sweep.csv, sweep.html and sweep.json.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { progressBar } from './progress.js';
import { CAUTION } from '../report/index.js';
import pc from 'picocolors';
import { PeakwiseError } from '../errors.js';
import { parseModel, stressUnit } from '../model/index.js';
import { bandText, formatNumber } from '../report/index.js';
import {
  fromJson, memberAt, parseShard, parseVary, runSweep, sweepCsv, sweepHtml, toJson,
  type PointCache, type PointOutcome, type Shard, type SweepResult, type SweepStudyOptions,
} from '../sweep/index.js';
import type { SiteResult } from '../study/types.js';
import { StudyInterrupted, levelsOption, limitsOf, outDirFor, ratioOption, useColor, type CliContext, type CommonOptions } from './common.js';
import { modelName, readModelText, writeFileAtomic } from './io.js';
import { inputFile, inputsOfRun, noteInput } from './inputs.js';
import { checkOutFolder } from './output-set.js';
import { plain } from './report-error.js';

export interface SweepCliOptions extends CommonOptions {
  vary: string[];
  maxDofs?: string;
  jobs?: string;
  shard?: string;
  levels?: string;
  ratio?: string;
}

/** What a point file holds. */
interface PointFile {
  key: string;
  params: Record<string, number>;
  scale: number;
  study: PointOutcome['study'];
}

/** Finished points as files `<dir>/<key>.json`, written atomically; unreadable files count as absent. */
export function pointFolderCache(dir: string, protect: string[]): PointCache {
  return {
    get(key) {
      const path = join(dir, `${key}.json`);
      if (!existsSync(path)) return undefined;
      try {
        const data = fromJson<PointFile>(readFileSync(path, 'utf8'));
        if (data.key !== key || !data.study || !Array.isArray(data.study.sites)) return undefined;
        return { study: data.study, scale: data.scale, seconds: 0 };
      } catch {
        return undefined; // a damaged file is recomputed and replaced
      }
    },
    put(key, params, outcome) {
      const data: PointFile = { key, params, scale: outcome.scale, study: outcome.study };
      writeFileAtomic(join(dir, `${key}.json`), toJson(data) + '\n', protect);
    },
  };
}

function intOption(text: string | undefined, option: string, lo: number, hi: number): number | undefined {
  if (text === undefined) return undefined;
  const v = Number(text);
  if (!(Number.isInteger(v) && v >= lo && v <= hi)) throw new PeakwiseError('usage', `${option} must be an integer from ${lo} to ${hi}, got "${text}"`);
  return v;
}

/** The folder a shard writes its point files under: --out as given, checked like a result folder. */
function shardOutDir(file: string, opts: SweepCliOptions): string {
  const outDir = opts.out ?? join('out', modelName(file));
  checkOutFolder(outDir, inputsOfRun(), file);
  return outDir;
}

/** What a shard did: its points, where their files are, and how to merge (stdout; --json: the same as JSON). */
function writeShardSummary(sweep: SweepResult, shard: Shard, outDir: string, opts: SweepCliOptions): void {
  const k = shard.index + 1;
  const n = shard.count;
  const points = join(outDir, 'points');
  if (opts.json) {
    const record = { tool: sweep.tool, version: sweep.version, shard: { k, n }, pointsFolder: points, points: sweep.points.map((p) => ({ index: p.index, params: p.params, key: p.key, reused: p.reused })) };
    process.stdout.write(toJson(record, 2) + '\n');
    return;
  }
  process.stdout.write(
    `  shard ${k}/${n}: ${sweep.points.length} points (every ${n === 1 ? '' : `${ordinal(n)} `}point from point ${k}), reused ${sweep.reused}, ${sweep.totalS.toFixed(1)} s\n` +
    `  point files in ${points}; when every shard has finished, run the same command without --shard on a folder\n` +
    '  that holds the point files of all shards: it computes nothing more and writes sweep.csv, sweep.html, sweep.json\n',
  );
}

function ordinal(n: number): string {
  const t = n % 100;
  const suffix = t >= 11 && t <= 13 ? 'th' : n % 10 === 1 ? 'st' : n % 10 === 2 ? 'nd' : n % 10 === 3 ? 'rd' : 'th';
  return `${n}${suffix}`;
}

function duration(s: number): string {
  if (!Number.isFinite(s)) return '…';
  if (s < 60) return `${Math.ceil(s)} s`;
  return `${Math.floor(s / 60)} min ${Math.round(s % 60)} s`;
}


function siteLine(s: SiteResult, unit: string, lengthUnit: string): string {
  const r = s.readouts.atDistance !== undefined && Number.isFinite(s.readouts.atDistance)
    ? `; point ${formatNumber(s.readouts.atDistance)} ${unit} at r = ${formatNumber(s.readouts.distance)} ${lengthUnit}`
    : '';
  if (s.verdict === 'converging') return `${bandText(s.estimate.value, s.estimate.uncertainty, unit)} (discretisation band)${s.aboveYield ? ', above yield' : ''}`;
  if (s.verdict === 'singular') return `q = ${formatNumber(s.growth.exponent, 3)} (theory ${formatNumber(s.growth.theory, 3)})${r}`;
  return `last ${formatNumber(s.estimate.value)} ${unit} (unsettled)`;
}

/** The terminal summary: one block per site family, one line per sweep point. */
export function sweepSummary(sweep: SweepResult, units: { stress: string; length: string }, color: boolean): string {
  const c = color ? pc : pc.createColors(false);
  const paint = (v: string) => (v === 'converging' ? c.green(v) : v === 'singular' ? c.magenta(v) : c.yellow(v));
  const lines = [c.bold(plain(sweep.model.title)), `  sweep of ${sweep.axes.map((a) => a.name).join(' × ')}: ${sweep.points.length} points, reused ${sweep.reused} of ${sweep.points.length} points, ${sweep.totalS.toFixed(1)} s`];
  const widths = sweep.axes.map((a) => Math.max(a.name.length, ...a.values.map((v) => formatNumber(v).length)));
  for (const f of sweep.families) {
    lines.push('', c.bold(`  ${f.id} ${f.featureClass} near (${formatNumber(f.at[0])}, ${formatNumber(f.at[1])})`));
    lines.push('    ' + sweep.axes.map((a, i) => a.name.padEnd(widths[i])).join('  ') + '  site  verdict     value');
    for (const p of sweep.points) {
      const m = memberAt(f, p.index);
      const params = sweep.axes.map((a, i) => formatNumber(p.params[a.name]).padEnd(widths[i])).join('  ');
      if (!m) { lines.push(`    ${params}  —`); continue; }
      const s = p.study.sites[m.site];
      lines.push(`    ${params}  ${plain(s.id).padEnd(4)}  ${paint(s.verdict.padEnd(10))}  ${plain(siteLine(s, units.stress, units.length))}`);
    }
  }
  lines.push('', c.dim(CAUTION));
  return lines.join('\n');
}

export async function runSweepCommand(ctx: CliContext, file: string, opts: SweepCliOptions): Promise<void> {
  ctx.file = file;
  const text = readModelText(file);
  noteInput(inputFile(file, 'model file', text));
  const axes = opts.vary.map(parseVary);
  if (axes.length === 0) throw new PeakwiseError('usage', 'sweep needs at least one --vary name=values, e.g. --vary r=0,2,4');
  const jobs = intOption(opts.jobs, '--jobs', 1, 256);
  const shard = opts.shard !== undefined ? parseShard(opts.shard) : undefined;
  const options: SweepStudyOptions = {};
  const levels = levelsOption(opts.levels);
  if (levels !== undefined) options.levels = levels;
  const ratio = ratioOption(opts.ratio);
  if (ratio !== undefined) options.ratio = ratio;
  if (opts.order !== undefined) options.order = opts.order === '1' ? 1 : 2;
  if (opts.size !== undefined) {
    const size = Number(opts.size);
    if (!(Number.isFinite(size) && size > 0)) throw new PeakwiseError('usage', `--size must be a positive number, got "${opts.size}"`);
    options.size = size;
  }
  // the model as written, for error positions and units (each point re-parses with its params)
  const model = parseModel(text, file);
  ctx.model = model;
  // A shard writes point files only, into <out>/points/, and takes no lock: shards on many
  // machines may share one folder (each point file is written atomically under its own name), and
  // the run without --shard that merges them is the one that writes the result set.
  const outDir = shard ? shardOutDir(file, opts) : outDirFor(file, opts, 'sweep');
  const protect = [file];
  const bar = progressBar(opts, 'points');
  let sweep: SweepResult;
  // Ctrl-C: hand out no new point, let the running ones finish, write what is done (exit 130);
  // a second Ctrl-C quits at once. Finished points are in points/ either way and are reused.
  let stop = false;
  const onSigint = (): void => {
    if (stop) process.exit(130);
    stop = true;
    process.stderr.write('\npeakwise: stopping after the running points and writing the finished ones (Ctrl-C again to quit at once)\n');
  };
  process.on('SIGINT', onSigint);
  try {
    sweep = await runSweep(text, file, axes, {
      ...options,
      limits: limitsOf(opts),
      ...(jobs !== undefined ? { jobs } : {}),
      cache: pointFolderCache(join(outDir, 'points'), protect),
      onProgress: (done, total, left) => bar.update(done, total, `${duration(left)} left`),
      shouldStop: () => stop,
      ...(shard ? { shard } : {}),
    });
  } finally {
    bar.stop();
    process.off('SIGINT', onSigint);
  }
  if (shard) {
    writeShardSummary(sweep, shard, outDir, opts);
    if (sweep.interrupted) {
      process.stderr.write(`peakwise: interrupted: ${sweep.points.length} finished points of shard ${shard.index + 1}/${shard.count} are in ${join(outDir, 'points')}; run the same shard again to compute the rest\n`);
      throw new StudyInterrupted();
    }
    return;
  }
  const unit = stressUnit(model.units);
  writeFileAtomic(join(outDir, 'sweep.csv'), sweepCsv(sweep), protect);
  writeFileAtomic(join(outDir, 'sweep.html'), sweepHtml(sweep, unit), protect);
  const json = toJson(sweepJson(sweep), 2) + '\n';
  writeFileAtomic(join(outDir, 'sweep.json'), json, protect);
  if (opts.json) {
    process.stdout.write(json);
  } else {
    process.stdout.write(sweepSummary(sweep, { stress: unit, length: model.units.length }, useColor(opts)) + '\n');
    process.stdout.write(`  results in ${outDir}: sweep.csv, sweep.html, sweep.json, points/\n`);
  }
  if (sweep.interrupted) {
    process.stderr.write(`peakwise: interrupted: ${sweep.points.length} finished points are written to ${outDir}; run the same sweep again to compute the rest\n`);
    throw new StudyInterrupted();
  }
}

/**
 * sweep.json: the sweep without each point's level-by-level detail (that stays in points/). It
 * holds results only — no wall times, no count of reused points (the terminal says those) — so
 * one run, a resumed run and a run merged from shards write the same bytes.
 */
export function sweepJson(sweep: SweepResult): unknown {
  return {
    tool: sweep.tool,
    version: sweep.version,
    model: sweep.model,
    axes: sweep.axes,
    ...(sweep.interrupted ? { interrupted: true } : {}),
    families: sweep.families,
    points: sweep.points.map((p) => ({
      index: p.index,
      params: p.params,
      key: p.key,
      sites: p.study.sites.map((s) => ({
        id: s.id, at: s.at, feature: s.feature.kind, verdict: s.verdict, estimate: s.estimate, growth: s.growth, readouts: s.readouts,
      })),
    })),
  };
}
