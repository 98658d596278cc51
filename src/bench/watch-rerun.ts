/**
 * Warm rerun of `peakwise study --watch` (issue 16 §4; goal: a rerun of a demo ≤ 0.3× the yardstick,
 * plain delaunator triangulating 1 000 000 uniform random points in the same run).
 *
 *   node dist/bench/watch-rerun.js [models/l-bracket-sharp.yaml] [--reruns 5] [--jobs n]
 *
 * The built binary watches a copy of the demo in a temporary folder; each rerun is started by
 * saving the model with one more comment line (new bytes, the same model), and its time is the
 * one the watch prints ("written in … s": from the start of the rerun to the result set complete —
 * parse, first solve, every level, far field, study.json, sites.csv, field.csv, report.html). The
 * first run (cold: module loading, compilation, worker start-up) is reported apart; the figure is
 * the median of the warm reruns. Exported for the benchmark's goals list.
 */
import Delaunator from 'delaunator';
import { spawn } from 'node:child_process';
import { copyFileSync, mkdtempSync, appendFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { fileURLToPath } from 'node:url';

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

export interface WatchRerun {
  model: string;
  coldS: number;
  rerunsS: number[];
  medianS: number;
}

/** Watch a copy of `model`, save it `reruns` times, and collect the printed run times. */
export function measureWatchRerun(model: string, reruns = 5, jobs?: number): Promise<WatchRerun> {
  const dir = mkdtempSync(join(tmpdir(), 'peakwise-watch-bench-'));
  const file = join(dir, basename(model));
  copyFileSync(model, file);
  const args = [bin, 'study', file, '--watch', '--out', join(dir, 'out'), ...(jobs ? ['--jobs', String(jobs)] : [])];
  const child = spawn(process.execPath, args, { env: { ...process.env, NO_COLOR: '1' } });
  return new Promise((resolve, reject) => {
    const times: number[] = [];
    let err = '';
    child.stdout.resume();
    child.stderr.setEncoding('utf8').on('data', (c: string) => {
      err += c;
      let m: RegExpExecArray | null;
      const re = /written in ([0-9.]+) s/g;
      const found: number[] = [];
      while ((m = re.exec(err)) !== null) found.push(Number(m[1]));
      if (found.length > times.length) {
        times.push(...found.slice(times.length));
        if (times.length > reruns) {
          child.kill('SIGINT');
          return;
        }
        // the next save once this run is written (new bytes, the same model)
        setTimeout(() => appendFileSync(file, `# rerun ${times.length}\n`), 200);
      }
      if (err.includes('still watching')) {
        child.kill('SIGKILL');
        reject(new Error(`the watch failed:\n${err}`));
      }
    });
    child.on('exit', () => {
      rmSync(dir, { recursive: true, force: true });
      if (times.length <= reruns) return reject(new Error(`the watch ended early:\n${err}`));
      const warm = times.slice(1);
      resolve({ model, coldS: times[0], rerunsS: warm, medianS: median(warm) });
    });
  });
}

/**
 * The watch goal as a line of the benchmark's goals list (the shape of bench/goals.ts's Goal:
 * what, measured, value ≤ limit, unit, against), given the yardstick measured in the same run.
 */
export async function watchRerunGoal(yardstickS: number, model = join(root, 'models', 'l-bracket-sharp.yaml'), reruns = 5): Promise<{
  what: string; measured: string; value: number; limit: number; unit: '×'; against: string;
}> {
  const r = await measureWatchRerun(model, reruns);
  return {
    what: `study --watch: warm rerun of ${basename(model)} (whole rerun, files written)`,
    measured: `${r.medianS.toFixed(2)} s (median of ${r.rerunsS.length}; cold first run ${r.coldS.toFixed(2)} s)`,
    value: r.medianS / yardstickS,
    limit: 0.3,
    unit: '×',
    against: 'delaunator, 1e6 random points',
  };
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
    `watch rerun of ${basename(model)}${jobs ? ` (--jobs ${jobs})` : ''}: cold first run ${r.coldS.toFixed(2)} s; warm reruns ${r.rerunsS.map((t) => t.toFixed(2)).join(', ')} s, median ${r.medianS.toFixed(2)} s\n` +
    `yardstick (delaunator, 1e6 random points): ${before.toFixed(2)} s before, ${after.toFixed(2)} s after\n` +
    `ratio ${(r.medianS / yard).toFixed(2)}× (goal ≤ 0.3×)\n`,
  );
}
