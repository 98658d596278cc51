/**
 * Warm reruns of `peakwise study --watch` (issue 16 §4; goal: a rerun of a demo ≤ 0.3× the yardstick,
 * plain delaunator triangulating 1 000 000 uniform random points in the same run).
 *
 *   nice -n 5 node dist/bench/watch-rerun.js [models/l-bracket-sharp.yaml] [--reruns 5] [--jobs n]
 *
 * The built binary watches a copy of the demo in a temporary folder and three kinds of save are made,
 * interleaved (comment, load, geometry, comment, …), each starting one rerun whose time is the one the
 * watch prints ("written in … s": from the start of the rerun to the result set complete — parse,
 * first solve, every level, far field, study.json, sites.csv, field.csv, report.html):
 *
 * - comment: one more comment line (new bytes, the same model): every mesh and factor is reused;
 * - load: the `tau` param (the end traction) one higher: every mesh and factor is reused, the
 *   right-hand sides, solves, recovery and readings are new;
 * - geometry: the `leg` param one higher: nothing to reuse, only the warm code.
 *
 * The first run (cold: module loading, compilation) is reported apart and one round of the three is
 * a warm-up; each figure is the median of the next `reruns` of its kind. A model without a `tau` or
 * `leg` param gets only the kinds it has. Exported for the benchmark's goals list (main.ts, "watch").
 */
import Delaunator from 'delaunator';
import { spawn } from 'node:child_process';
import { copyFileSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Goal } from './goals.js';

const root = join(import.meta.dirname, '..', '..');
const bin = join(root, 'dist', 'cli', 'main.js');

function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const n = s.length;
  return n === 0 ? NaN : n % 2 ? s[(n - 1) >> 1] : 0.5 * (s[n / 2 - 1] + s[n / 2]);
}

/** Seconds plain delaunator takes on 1e6 uniform random points (fixed seed), median of `runs`, after a warm-up. */
export function yardstickSeconds(runs = 3): number {
  const points = (n: number, seed: number): Float64Array => {
    let a = seed >>> 0;
    const p = new Float64Array(2 * n);
    for (let i = 0; i < 2 * n; i++) {
      a = (a + 0x6d2b79f5) >>> 0;
      let t = a;
      t = Math.imul(t ^ (t >>> 15), t | 1);
      t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
      p[i] = ((t ^ (t >>> 14)) >>> 0) / 4294967296;
    }
    return p;
  };
  new Delaunator(points(100_000, 1));
  const pts = points(1_000_000, 20261204);
  const ts: number[] = [];
  for (let k = 0; k < runs; k++) {
    const t0 = performance.now();
    new Delaunator(pts);
    ts.push((performance.now() - t0) / 1000);
  }
  return median(ts);
}

/** The kinds of save, in the order they are interleaved. */
export const RERUN_KINDS = ['comment', 'load', 'geometry'] as const;
export type RerunKind = (typeof RERUN_KINDS)[number];

/** The param each kind of edit raises by one (none for a comment). */
const EDITED_PARAM: Record<RerunKind, string | undefined> = { comment: undefined, load: 'tau', geometry: 'leg' };

const paramLine = (name: string): RegExp => new RegExp(`^(\\s*${name}:\\s*)(-?[0-9.]+)`, 'm');

export interface WatchRerun {
  model: string;
  coldS: number;
  /** per kind of save, the counted reruns' times (empty for a kind the model cannot take) */
  rerunsS: Record<RerunKind, number[]>;
  medianS: Record<RerunKind, number>;
  /** the watch's words on what each counted rerun reused, per kind (the last one) */
  reused: Record<RerunKind, string>;
}

/** The model text after one more save of `kind` (`n`: the save's number, for a new comment). */
function edited(text: string, kind: RerunKind, n: number): string {
  const param = EDITED_PARAM[kind];
  if (!param) return `${text}# rerun ${n}\n`;
  return text.replace(paramLine(param), (_m, head: string, v: string) => `${head}${Number(v) + 1}`);
}

/** Watch a copy of `model` and save it `reruns` + 1 times per kind, interleaved; collect the printed run times. */
export function measureWatchRerun(model: string, reruns = 5, jobs?: number): Promise<WatchRerun> {
  const dir = mkdtempSync(join(tmpdir(), 'peakwise-watch-bench-'));
  const file = join(dir, basename(model));
  copyFileSync(model, file);
  let text = readFileSync(file, 'utf8');
  const kinds = RERUN_KINDS.filter((k) => EDITED_PARAM[k] === undefined || paramLine(EDITED_PARAM[k]!).test(text));
  const saves: RerunKind[] = Array.from({ length: (reruns + 1) * kinds.length }, (_, i) => kinds[i % kinds.length]);
  const args = [bin, 'study', file, '--watch', '--out', join(dir, 'out'), ...(jobs ? ['--jobs', String(jobs)] : [])];
  const child = spawn(process.execPath, args, { env: { ...process.env, NO_COLOR: '1' } });
  return new Promise((resolve, reject) => {
    const lines: string[] = [];
    let err = '';
    child.stdout.resume();
    child.stderr.setEncoding('utf8').on('data', (c: string) => {
      err += c;
      const found = err.split('\n').filter((l) => / written in [0-9.]+ s/.test(l));
      if (found.length > lines.length) {
        lines.push(...found.slice(lines.length));
        const next = lines.length - 1; // saves made so far
        if (next >= saves.length) {
          child.kill('SIGINT');
          return;
        }
        // the next save once this run is written
        setTimeout(() => { text = edited(text, saves[next], next); writeFileSync(file, text); }, 200);
      }
      if (err.includes('still watching')) {
        child.kill('SIGKILL');
        reject(new Error(`the watch failed:\n${err}`));
      }
    });
    child.on('exit', () => {
      rmSync(dir, { recursive: true, force: true });
      if (lines.length <= saves.length) return reject(new Error(`the watch ended early:\n${err}`));
      const time = (l: string): number => Number(/ written in ([0-9.]+) s/.exec(l)![1]);
      const empty = (): Record<RerunKind, number[]> => ({ comment: [], load: [], geometry: [] });
      const rerunsS = empty();
      const reused: Record<RerunKind, string> = { comment: '', load: '', geometry: '' };
      saves.forEach((kind, i) => {
        if (i < kinds.length) return; // the warm-up round
        const line = lines[i + 1];
        rerunsS[kind].push(time(line));
        reused[kind] = /\(reused ([^)]*)\)/.exec(line)?.[1] ?? 'nothing';
      });
      const medianS = { comment: median(rerunsS.comment), load: median(rerunsS.load), geometry: median(rerunsS.geometry) };
      resolve({ model, coldS: time(lines[0]), rerunsS, medianS, reused });
    });
  });
}

const KIND_WORDS: Record<RerunKind, string> = {
  comment: 'comment-only save',
  load: 'load-only edit (tau + 1)',
  geometry: 'geometry edit (leg + 1)',
};

/** The figures as lines, each kind against the yardstick. */
export function watchRerunText(r: WatchRerun, yardstickS: number): string {
  const lines = [`watch reruns of ${basename(r.model)}: cold first run ${r.coldS.toFixed(2)} s; yardstick ${yardstickS.toFixed(2)} s`];
  for (const k of RERUN_KINDS) {
    if (r.rerunsS[k].length === 0) continue;
    lines.push(`  ${KIND_WORDS[k].padEnd(26)} ${r.rerunsS[k].map((t) => t.toFixed(2)).join(', ')} s, median ${r.medianS[k].toFixed(2)} s = ${(r.medianS[k] / yardstickS).toFixed(2)}× (reused ${r.reused[k]})${k === 'geometry' ? '' : ' (goal ≤ 0.3×)'}`);
  }
  return lines.join('\n') + '\n';
}

/**
 * The watch goals as lines of the benchmark's goals list (bench/goals.ts's Goal), given the
 * yardstick measured in the same run: the comment-only save and the load-only edit, each with the
 * geometry edit's figure beside it (nothing to reuse there: it has no goal of its own).
 */
export function watchRerunGoals(r: WatchRerun, yardstickS: number): Goal[] {
  const geometry = r.rerunsS.geometry.length > 0
    ? `; geometry edit ${r.medianS.geometry.toFixed(2)} s = ${(r.medianS.geometry / yardstickS).toFixed(2)}×`
    : '';
  return (['comment', 'load'] as const).filter((k) => r.rerunsS[k].length > 0).map((k) => ({
    what: `study --watch: warm rerun of ${basename(r.model)} after a ${KIND_WORDS[k]} (whole rerun, files written)`,
    measured: `${r.medianS[k].toFixed(2)} s (median of ${r.rerunsS[k].length}, interleaved; cold first run ${r.coldS.toFixed(2)} s${geometry})`,
    value: r.medianS[k] / yardstickS,
    limit: 0.3,
    unit: '×' as const,
    against: 'delaunator, 1e6 random points',
  }));
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const argv = process.argv.slice(2);
  const opt = (name: string): string | undefined => { const i = argv.indexOf(name); return i >= 0 ? argv[i + 1] : undefined; };
  const model = argv.find((a, i) => !a.startsWith('--') && !(i > 0 && argv[i - 1].startsWith('--'))) ?? join(root, 'models', 'l-bracket-sharp.yaml');
  const reruns = Number(opt('--reruns') ?? 5);
  const jobs = opt('--jobs') !== undefined ? Number(opt('--jobs')) : undefined;
  const before = yardstickSeconds();
  const r = await measureWatchRerun(model, reruns, jobs);
  const after = yardstickSeconds();
  const yard = median([before, after]);
  process.stdout.write(
    `${jobs ? `(--jobs ${jobs}) ` : ''}yardstick (delaunator, 1e6 random points): ${before.toFixed(2)} s before, ${after.toFixed(2)} s after\n` +
    watchRerunText(r, yard),
  );
}
