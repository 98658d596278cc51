/**
 * The bundled CLI against tsc's unbundled build, whole commands in fresh processes, taken in turn
 * so that both medians come from the same minutes (docs/speed.md, "Start-up"):
 * `--version` and `--help` (median of 21), `mesh` of the benchmark's ~306 000-node machine-base
 * plate (median of 5, with plain delaunator on as many random points between the runs), and
 * `study models/l-bracket-sharp.yaml --quiet` (median of 5).
 *
 *   node dist/bench/bundle-compare.js [--runs-scale k] [--only version,help,mesh,study]
 *
 * Not part of `npm run bench` (which times the bin only): it is the measurement behind the choice.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Delaunator from 'delaunator';
import { basePlateModel, bin } from './commands.js';
import { median, randomPoints } from './goals.js';

const root = join(import.meta.dirname, '..', '..');
const builds = { bundle: bin, unbundled: join(root, 'dist', 'cli', 'main.js') } as const;
type Build = keyof typeof builds;

function seconds(file: string, args: string[]): number {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, [file, ...args], { cwd: root, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' }, maxBuffer: 64 << 20 });
  const s = (performance.now() - t0) / 1000;
  if (r.status !== 0) throw new Error(`${file} ${args.join(' ')} failed (status ${r.status}): ${r.stderr}`);
  return s;
}

interface Timed extends Record<Build, number> {
  /** the median over the rounds of bundle ÷ unbundled within a round (drift between rounds cancels) */
  pairRatio: number;
}

/** `runs` of each build in turn (the order alternating), medians in seconds. */
function interleaved(args: string[], runs: number, between?: () => void): Timed {
  const t: Record<Build, number[]> = { bundle: [], unbundled: [] };
  for (let k = 0; k < runs; k++) {
    const order: Build[] = k % 2 === 0 ? ['bundle', 'unbundled'] : ['unbundled', 'bundle'];
    for (const b of order) {
      between?.();
      t[b].push(seconds(builds[b], args));
    }
  }
  return { bundle: median(t.bundle), unbundled: median(t.unbundled), pairRatio: median(t.bundle.map((b, k) => b / t.unbundled[k])) };
}

function line(what: string, m: Timed, runs: number, extra = ''): void {
  const ms = (s: number) => `${(s * 1000).toFixed(0)} ms`;
  process.stdout.write(`${what}: bundle ${ms(m.bundle)}, unbundled ${ms(m.unbundled)} (medians of ${runs}) → ${(m.bundle / m.unbundled).toFixed(2)}×, median of the rounds' ratios ${m.pairRatio.toFixed(2)}×${extra}\n`);
}

function main(argv: string[]): void {
  const at = argv.indexOf('--only');
  const only = new Set(at >= 0 ? argv[at + 1].split(',') : ['version', 'help', 'mesh', 'study']);
  const sc = argv.indexOf('--runs-scale');
  const scale = sc >= 0 ? Number(argv[sc + 1]) : 1;
  const short = Math.max(1, Math.round(21 * scale));
  const long = Math.max(1, Math.round(5 * scale));
  const dir = mkdtempSync(join(tmpdir(), 'peakwise-bundle-compare-'));
  try {
    if (only.has('version') || only.has('help')) {
      const floor: number[] = [];
      for (let k = 0; k < short; k++) {
        const t0 = performance.now();
        spawnSync(process.execPath, ['-e', '0']);
        floor.push((performance.now() - t0) / 1000);
      }
      process.stdout.write(`node -e 0 (Node's own start): ${(median(floor) * 1000).toFixed(0)} ms (median of ${short})\n`);
    }
    if (only.has('version')) line('--version', interleaved(['--version'], short), short);
    if (only.has('help')) line('--help', interleaved(['--help'], short), short);
    if (only.has('mesh')) {
      const file = join(dir, 'base-plate.yaml');
      writeFileSync(file, basePlateModel(1.5));
      const nodes = (JSON.parse(spawnSync(process.execPath, [bin, 'mesh', file, '--json'], { cwd: root, encoding: 'utf8', maxBuffer: 64 << 20 }).stdout) as { mesh: { nodes: number } }).mesh.nodes;
      const pts = randomPoints(nodes);
      const del: number[] = [];
      const m = interleaved(['mesh', file], long, () => {
        const t0 = performance.now();
        new Delaunator(pts);
        del.push((performance.now() - t0) / 1000);
      });
      const d = median(del);
      line(`mesh, ${nodes} nodes`, m, long, `; delaunator on as many random points ${(d * 1000).toFixed(0)} ms: bundle ${(m.bundle / d).toFixed(2)}×, unbundled ${(m.unbundled / d).toFixed(2)}×`);
    }
    if (only.has('study')) line('study models/l-bracket-sharp.yaml --quiet', interleaved(['study', 'models/l-bracket-sharp.yaml', '--quiet', '--out', join(dir, 'study')], long), long);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

main(process.argv.slice(2));
