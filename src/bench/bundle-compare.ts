/**
 * The bundled CLI against tsc's unbundled build, whole commands in fresh processes, taken in turn
 * so that both medians come from the same minutes (docs/speed.md, "Start-up"):
 * `--version` and `--help` (median of 21), `mesh` of the benchmark's ~306 000-node machine-base
 * plate (median of 5, with plain delaunator on as many random points between the runs), `mesh` of
 * the demo models/l-bracket-sharp.yaml (median of 21), and
 * `study models/l-bracket-sharp.yaml --quiet` (median of 5), the last also with the bundle's code
 * cache off (`PEAKWISE_CODE_CACHE=0`, src/cli/code-cache.ts).
 *
 *   node dist/bench/bundle-compare.js [--runs-scale k] [--only version,help,mesh,mesh-demo,study]
 *
 * Not part of `npm run bench` (which times the bin only): it is the measurement behind the choice.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Delaunator from 'delaunator';
import { basePlateModel, bin, nodeStartSeconds } from './commands.js';
import { median, randomPoints } from './goals.js';

const root = join(import.meta.dirname, '..', '..');
const builds = {
  bundle: { file: bin, env: {} },
  unbundled: { file: join(root, 'dist', 'cli', 'main.js'), env: {} },
  'bundle without code cache': { file: bin, env: { PEAKWISE_CODE_CACHE: '0' } },
} as const;
type Build = keyof typeof builds;

function seconds(build: Build, args: string[]): number {
  const { file, env } = builds[build];
  const t0 = performance.now();
  const r = spawnSync(process.execPath, [file, ...args], { cwd: root, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', ...env }, maxBuffer: 64 << 20 });
  const s = (performance.now() - t0) / 1000;
  if (r.status !== 0) throw new Error(`${file} ${args.join(' ')} failed (status ${r.status}): ${r.stderr}`);
  return s;
}

type Timed = Partial<Record<Build, number[]>>;

/** `runs` of each build in turn (the order reversed every other round), seconds. */
function interleaved(args: string[], runs: number, which: Build[], between?: () => void): Timed {
  const t: Timed = Object.fromEntries(which.map((b) => [b, [] as number[]]));
  for (let k = 0; k < runs; k++) {
    for (const b of k % 2 === 0 ? which : [...which].reverse()) {
      between?.();
      t[b]!.push(seconds(b, args));
    }
  }
  return t;
}

/** Medians of each build, and each against the unbundled build: ratio of the medians, and the median of the rounds' ratios (drift between rounds cancels). */
function line(what: string, t: Timed, runs: number, extra = ''): void {
  const ms = (s: number) => `${(s * 1000).toFixed(0)} ms`;
  const base = t.unbundled!;
  const parts = (Object.keys(t) as Build[]).map((b) => {
    const xs = t[b]!;
    const vs = b === 'unbundled' ? '' : ` (${(median(xs) / median(base)).toFixed(2)}×, rounds ${median(xs.map((x, k) => x / base[k])).toFixed(2)}×)`;
    return `${b} ${ms(median(xs))}${vs}`;
  });
  process.stdout.write(`${what}, medians of ${runs}: ${parts.join(', ')}${extra}\n`);
}

function main(argv: string[]): void {
  const at = argv.indexOf('--only');
  const only = new Set(at >= 0 ? argv[at + 1].split(',') : ['version', 'help', 'mesh', 'mesh-demo', 'study']);
  const sc = argv.indexOf('--runs-scale');
  const scale = sc >= 0 ? Number(argv[sc + 1]) : 1;
  const short = Math.max(1, Math.round(21 * scale));
  const long = Math.max(1, Math.round(5 * scale));
  const dir = mkdtempSync(join(tmpdir(), 'peakwise-bundle-compare-'));
  try {
    if (only.has('version') || only.has('help')) {
      process.stdout.write(`node -e 0 (Node's own start): ${(nodeStartSeconds(short) * 1000).toFixed(0)} ms (median of ${short})\n`);
    }
    const two: Build[] = ['bundle', 'unbundled'];
    if (only.has('version')) line('--version', interleaved(['--version'], short, two), short);
    if (only.has('help')) line('--help', interleaved(['--help'], short, two), short);
    if (only.has('mesh')) {
      const file = join(dir, 'base-plate.yaml');
      writeFileSync(file, basePlateModel(1.5));
      const nodes = (JSON.parse(spawnSync(process.execPath, [bin, 'mesh', file, '--json'], { cwd: root, encoding: 'utf8', maxBuffer: 64 << 20 }).stdout) as { mesh: { nodes: number } }).mesh.nodes;
      const pts = randomPoints(nodes);
      const del: number[] = [];
      const m = interleaved(['mesh', file], long, two, () => {
        const t0 = performance.now();
        new Delaunator(pts);
        del.push((performance.now() - t0) / 1000);
      });
      const d = median(del);
      line(`mesh, ${nodes} nodes`, m, long, `; delaunator on as many random points ${(d * 1000).toFixed(0)} ms: bundle ${(median(m.bundle!) / d).toFixed(2)}×, unbundled ${(median(m.unbundled!) / d).toFixed(2)}×`);
    }
    if (only.has('mesh-demo')) line('mesh models/l-bracket-sharp.yaml', interleaved(['mesh', 'models/l-bracket-sharp.yaml'], short, two), short);
    if (only.has('study')) {
      const args = ['study', 'models/l-bracket-sharp.yaml', '--quiet', '--out', join(dir, 'study')];
      seconds('bundle', args); // the code cache of this build, if it was not there yet
      line('study models/l-bracket-sharp.yaml --quiet', interleaved(args, long, ['bundle', 'bundle without code cache', 'unbundled']), long);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

main(process.argv.slice(2));
