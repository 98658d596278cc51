/**
 * Whole commands as a user runs them: the `bin` of package.json (the bundled CLI,
 * dist/bundle/peakwise.js, src/build/bundle.ts) in a fresh process each time:
 *
 * - start-up: `--version` and `--help`, median of 11 (goal ≤ 0.1 s each, issue 16);
 * - `study` of every demo model, 3 runs, as a ratio to the yardstick (goals.ts): ≤ 1.2× for
 *   models/l-bracket-sharp.yaml, ≤ 1.7× for every demo with a single load case; and its breakdown
 *   (start, mesh, solve, recover, write) from a CPU profile of one more run;
 * - `mesh` of a plate of about 300 000 nodes, 5 runs, against plain delaunator on as many random
 *   points in this process (goal ≤ 3×).
 *
 * Every timed run comes right after a reference timing of its own (the yardstick, or delaunator on
 * as many points), and the ratio is the median of those pairs: the machine's speed drifts by up to
 * 2× within minutes, and a pair taken within a second or two sees the same machine.
 *
 * The breakdown: one extra run under `node --cpu-prof` (both threads: the command's work runs in a
 * worker), every sample charged to the innermost frame of ours on its stack, by stage folder:
 * model parsing, module loading and compilation are "start"; geometry and mesh "mesh"; fem and
 * linalg "solve"; recovery "recover"; report, output files and the file system "write"; the study's
 * own logic (sites, fits, verdicts) and the pipeline glue "study"; garbage collection "gc". Idle
 * time (the main thread waiting for the worker) is left out. The shares are of CPU time; the
 * profiler slows the run a little, so they are shares, not a second wall time. A frame of the
 * bundle is placed by the bundle's source map, which names the tsc output (dist/<stage>/x.js) its
 * code came from.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { SourceMap, type SourceMapPayload } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import Delaunator from 'delaunator';
import { delaunaySeconds, median, randomPoints, recordGoal, sampleYardstick, yardstick } from './goals.js';

const root = join(import.meta.dirname, '..', '..');
/** What users run: the bin of package.json. */
export const bin = join(root, (JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { bin: { peakwise: string } }).bin.peakwise);

function runOnce(args: string[], nodeFlags: string[] = []): { seconds: number; stdout: string; status: number | null } {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, [...nodeFlags, bin, ...args], { cwd: root, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' }, maxBuffer: 64 << 20 });
  const seconds = (performance.now() - t0) / 1000;
  if (r.status !== 0) throw new Error(`peakwise ${args.join(' ')} failed (status ${r.status}): ${r.stderr}`);
  return { seconds, stdout: r.stdout, status: r.status };
}

function timeCommand(args: string[], runs: number): number {
  const ts: number[] = [];
  for (let k = 0; k < runs; k++) ts.push(runOnce(args).seconds);
  return median(ts);
}

/**
 * `runs` runs of a command, each right after a reference timing of its own (`reference()`, in this
 * process): the ratio is the median of the paired ratios, so that the machine's drift — up to 2× within
 * minutes on this shared machine — cancels in each pair instead of landing on one side of a ratio of medians.
 */
function timePaired(args: string[], runs: number, reference: () => number): { s: number; ref: number; ratio: number } {
  const ts: number[] = [], refs: number[] = [], ratios: number[] = [];
  for (let k = 0; k < runs; k++) {
    const r = reference();
    const t = runOnce(args).seconds;
    ts.push(t);
    refs.push(r);
    ratios.push(t / r);
  }
  return { s: median(ts), ref: median(refs), ratio: median(ratios) };
}

export const PHASES = ['start', 'mesh', 'solve', 'recover', 'study', 'write', 'gc'] as const;
export type Phase = (typeof PHASES)[number];

interface CallFrame { functionName: string; url: string; lineNumber: number; columnNumber: number }
interface ProfileNode { id: number; callFrame: CallFrame; children?: number[] }
interface Profile { nodes: ProfileNode[]; samples: number[]; timeDeltas: number[] }

const STAGE_PHASE: Record<string, Phase> = {
  model: 'start', geometry: 'mesh', mesh: 'mesh', element: 'solve', fem: 'solve', linalg: 'solve', recovery: 'recover',
  report: 'write', study: 'study', pipeline: 'study', reference: 'study', sweep: 'study', check: 'study',
};

/**
 * The file a profiled frame's code was written in: its own URL, or for a file of the bundle the
 * tsc output (dist/<stage>/x.js, or a dependency's file) that the bundle's source map gives for the
 * start of the frame's function.
 */
class FrameSources {
  private readonly maps = new Map<string, SourceMap | null>();

  path(f: CallFrame): string {
    if (!/\/dist\/bundle\/[^/]+\.c?js$/.test(f.url)) return f.url;
    // the code-cached worker body is compiled by vm.Script under its plain path
    const file = f.url.startsWith('file:') ? fileURLToPath(f.url) : f.url;
    let map = this.maps.get(file);
    if (map === undefined) {
      map = existsSync(`${file}.map`) ? new SourceMap(JSON.parse(readFileSync(`${file}.map`, 'utf8')) as SourceMapPayload) : null;
      this.maps.set(file, map);
    }
    const entry = map?.findEntry(f.lineNumber, f.columnNumber);
    if (!entry || !('originalSource' in entry)) return f.url;
    return new URL(entry.originalSource, pathToFileURL(`${file}.map`)).pathname;
  }
}

/** The phase of one stack, innermost frame first, each frame with the file its code came from. */
function phaseOf(stack: readonly { frame: CallFrame; path: string }[]): Phase | 'idle' {
  const top = stack[0].frame;
  if (top.functionName === '(idle)') return 'idle';
  if (top.functionName === '(garbage collector)') return 'gc';
  for (const { frame: f, path } of stack) {
    // a bundle file's top-level code, or a module's top-level code the bundler wrapped in its init_… function
    if (/\/dist\/bundle\//.test(f.url) && ((f.functionName === '' && f.lineNumber === 0) || f.functionName.startsWith('init_'))) return 'start';
    const m = /\/dist\/([^/]+)\/([^/]+)\.js$/.exec(path);
    if (!m) continue;
    if (f.functionName === '' && f.lineNumber === 0) return 'start'; // a module's top-level code
    const [, stage, file] = m;
    if (stage === 'cli') return /output|io|results|lock|study-output|solve-output|cut/.test(file) ? 'write' : 'start';
    return STAGE_PHASE[stage] ?? 'study';
  }
  // no frame of ours: module loading and compilation, or the runtime
  return 'start';
}

/** CPU milliseconds per phase over every profile file in `dir`. */
export function profilePhases(dir: string): Record<Phase, number> {
  const out = Object.fromEntries(PHASES.map((p) => [p, 0])) as Record<Phase, number>;
  const sources = new FrameSources();
  for (const f of readdirSync(dir).filter((n) => n.endsWith('.cpuprofile'))) {
    const p = JSON.parse(readFileSync(join(dir, f), 'utf8')) as Profile;
    const byId = new Map(p.nodes.map((n) => [n.id, n]));
    const parent = new Map<number, number>();
    for (const n of p.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
    const cache = new Map<number, Phase | 'idle'>();
    const phaseOfNode = (id: number): Phase | 'idle' => {
      let ph = cache.get(id);
      if (ph === undefined) {
        const stack: { frame: CallFrame; path: string }[] = [];
        for (let at: number | undefined = id; at !== undefined; at = parent.get(at)) {
          const frame = byId.get(at)!.callFrame;
          stack.push({ frame, path: sources.path(frame) });
        }
        ph = phaseOf(stack);
        cache.set(id, ph);
      }
      return ph;
    };
    for (let i = 0; i < p.samples.length; i++) {
      const ph = phaseOfNode(p.samples[i]);
      if (ph !== 'idle') out[ph] += (p.timeDeltas[i] ?? 0) / 1000;
    }
  }
  return out;
}

/** Phase shares of one profiled run of `args`, as text. */
function breakdown(args: string[]): string {
  const dir = mkdtempSync(join(tmpdir(), 'peakwise-prof-'));
  try {
    runOnce(args, ['--cpu-prof', `--cpu-prof-dir=${dir}`]);
    const ms = profilePhases(dir);
    const total = PHASES.reduce((s, p) => s + ms[p], 0);
    return PHASES.map((p) => `${p} ${((100 * ms[p]) / total).toFixed(0)} %`).join(', ') + ` of ${(total / 1000).toFixed(2)} s CPU`;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** Seconds of `node -e 0`, median of n: Node's own start, the floor under any command (on a loaded machine it rises with the rest). */
export function nodeStartSeconds(n: number): number {
  const floor: number[] = [];
  for (let k = 0; k < n; k++) {
    const t0 = performance.now();
    spawnSync(process.execPath, ['-e', '0']);
    floor.push((performance.now() - t0) / 1000);
  }
  return median(floor);
}

export function benchStartup(quick: boolean): void {
  const n = quick ? 5 : 11;
  const floorS = nodeStartSeconds(n);
  process.stdout.write(`  node -e 0 (Node's own start): ${(floorS * 1000).toFixed(0)} ms (median of ${n})\n`);
  for (const flag of ['--version', '--help']) {
    const s = timeCommand([flag], n);
    process.stdout.write(`  peakwise ${flag}: ${(s * 1000).toFixed(0)} ms (median of ${n})\n`);
    recordGoal({ what: `peakwise ${flag}`, measured: `median of ${n}; node -e 0 took ${(floorS * 1000).toFixed(0)} ms`, value: s, limit: 0.1, unit: 's' });
  }
}

/** The demo models, and whether each has a single load case (no `cases` key). */
function demoModels(): { file: string; singleCase: boolean }[] {
  const dir = join(root, 'models');
  return readdirSync(dir).filter((f) => f.endsWith('.yaml')).sort().map((f) => ({
    file: `models/${f}`,
    singleCase: !/^cases\s*:/m.test(readFileSync(join(dir, f), 'utf8')),
  }));
}

export function benchStudyCommands(quick: boolean): void {
  const out = mkdtempSync(join(tmpdir(), 'peakwise-bench-study-'));
  const runs = quick ? 1 : 3;
  const timed: { file: string; singleCase: boolean; s: number; ref: number; ratio: number }[] = [];
  try {
    const demos = demoModels().filter((d) => !quick || d.file === 'models/l-bracket-sharp.yaml');
    for (const { file, singleCase } of demos) {
      const args = ['study', file, '--out', join(out, file.replace(/\W/g, '-')), '--quiet'];
      // each run right after a yardstick sample of its own: the ratio is the median of the pairs
      const t = timePaired(args, runs, sampleYardstick);
      timed.push({ file, singleCase, ...t });
      process.stdout.write(`  study ${file}: ${t.s.toFixed(2)} s (median of ${runs})${singleCase ? '' : ' (several load cases)'}, yardstick beside it ${t.ref.toFixed(3)} s\n`);
      process.stdout.write(`    breakdown: ${breakdown(args)}\n`);
    }
  } finally {
    rmSync(out, { recursive: true, force: true });
  }
  process.stdout.write(`  yardstick: plain delaunator on 1 000 000 random points ${yardstick().toFixed(3)} s (median of the samples so far)\n`);
  for (const { file, singleCase, s, ref, ratio } of timed) {
    process.stdout.write(`  study ${file}: ${ratio.toFixed(2)}× the yardstick (median of ${runs} pairs, each run against the sample taken just before it)\n`);
    const measured = `${s.toFixed(2)} s (median of ${runs}; yardstick beside it ${ref.toFixed(3)} s)`;
    if (file === 'models/l-bracket-sharp.yaml') recordGoal({ what: `study ${file} (whole command)`, measured, value: ratio, limit: 1.2, unit: '×', against: 'the yardstick (paired runs)' });
    else if (singleCase) recordGoal({ what: `study ${file} (whole command)`, measured, value: ratio, limit: 1.7, unit: '×', against: 'the yardstick (paired runs)' });
  }
}

/** An invented machine-base plate (the mesher benchmark's, src/bench/mesh.ts) as a model file, order 1, at element size `size`. */
export function basePlateModel(size: number): string {
  return `title: bench machine-base plate
material: { E: 210000, nu: 0.3 }
thickness: 10
plate:
  outline: { rect: { center: [500, 300], width: 1000, height: 600, round: 30 } }
  openings:
    - { id: bolt-a, circle: { center: [120, 120], radius: 22 } }
    - { id: bolt-b, circle: { center: [880, 120], radius: 22 } }
    - { id: bolt-c, circle: { center: [120, 480], radius: 22 } }
    - { id: bolt-d, circle: { center: [880, 480], radius: 22 } }
    - { id: cable, circle: { center: [640, 300], radius: 60 } }
    - { id: slot, rect: { center: [330, 300], width: 220, height: 50, round: 24 } }
supports:
  - { where: { x: 0 }, fix: [x, y] }
loads:
  - { where: { x: 1000 }, traction: [10, 0] }
mesh: { size: ${size}, order: 1 }
`;
}

export function benchMeshCommand(quick: boolean): void {
  const dir = mkdtempSync(join(tmpdir(), 'peakwise-bench-mesh-'));
  try {
    // size 1.5 gives about 306 000 nodes (order 1: nodes = vertices); quick: about 40 000
    const file = join(dir, 'base-plate.yaml');
    writeFileSync(file, basePlateModel(quick ? 4 : 1.5));
    const runs = quick ? 1 : 5;
    const first = runOnce(['mesh', file, '--json']);
    const q = JSON.parse(first.stdout) as { mesh: { nodes: number; minAngleDeg: number } };
    // the command and plain delaunator on as many random points taken in turn, the ratio the median
    // of the pairs (the machine's drift cancels in each pair)
    delaunaySeconds(100_000, 1); // warm-up
    const pts = randomPoints(q.mesh.nodes);
    const { s, ref: d, ratio } = timePaired(['mesh', file], runs, () => {
      const t0 = performance.now();
      new Delaunator(pts);
      return (performance.now() - t0) / 1000;
    });
    process.stdout.write(
      `  peakwise mesh (machine-base plate, ${q.mesh.nodes} nodes, min angle ${q.mesh.minAngleDeg.toFixed(2)}°): ${s.toFixed(3)} s (median of ${runs}), ` +
        `delaunator on ${q.mesh.nodes} random points ${d.toFixed(3)} s → ${ratio.toFixed(2)}×\n`,
    );
    if (!quick) {
      recordGoal({ what: `peakwise mesh, ${q.mesh.nodes} nodes (whole command)`, measured: `${s.toFixed(2)} s (median of ${runs})`, value: ratio, limit: 3, unit: '×', against: `delaunator on as many random points (${d.toFixed(3)} s)` });
      recordGoal({ what: 'min angle of that mesh', measured: `${q.mesh.minAngleDeg.toFixed(2)}°`, value: 28 / q.mesh.minAngleDeg, limit: 1, unit: '×', against: '28° / min angle' });
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
