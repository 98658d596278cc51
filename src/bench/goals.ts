/**
 * The benchmark's goals (issue 16 and earlier): each section records what it measured against
 * its goal, and `npm run bench` prints them all at the end, every one with its figure, its ratio
 * or time, and whether it is met. Goals of whole commands are ratios to one yardstick measured in
 * the same run — plain delaunator triangulating 1 000 000 uniform random points — because this
 * machine's speed drifts by up to 2× over tens of minutes (../shared/anchors.md).
 */
import Delaunator from 'delaunator';

export interface Goal {
  /** what is measured, e.g. "study models/l-bracket-sharp.yaml (whole command)" */
  what: string;
  /** the measured figure in words, e.g. "1.84 s (median of 3)" */
  measured: string;
  /** the compared number (a ratio or seconds) and its limit: met when value ≤ limit */
  value: number;
  limit: number;
  /** how value is expressed: '×' for a ratio, 's' for seconds */
  unit: '×' | 's';
  /** what the ratio is taken against (for ratios) */
  against?: string;
}

const goals: Goal[] = [];

export function recordGoal(goal: Goal): void {
  goals.push(goal);
}

export function recordedGoals(): readonly Goal[] {
  return goals;
}

export function median(xs: readonly number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const n = s.length;
  return n === 0 ? NaN : n % 2 ? s[(n - 1) >> 1] : 0.5 * (s[n / 2 - 1] + s[n / 2]);
}

/** Uniform random points in the unit square from a fixed-seed generator (mulberry32), so every run triangulates the same cloud. */
export function randomPoints(n: number, seed = 20261204): Float64Array {
  let a = seed >>> 0;
  const next = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const p = new Float64Array(2 * n);
  for (let i = 0; i < 2 * n; i++) p[i] = next();
  return p;
}

/** Seconds plain delaunator takes on n random points: median of `runs` after one warm-up on 100 000. */
export function delaunaySeconds(n: number, runs = 3): number {
  new Delaunator(randomPoints(100_000, 1));
  const pts = randomPoints(n);
  const ts: number[] = [];
  for (let k = 0; k < runs; k++) {
    const t0 = performance.now();
    const d = new Delaunator(pts);
    ts.push((performance.now() - t0) / 1000);
    if (d.triangles.length === 0) throw new Error('delaunator returned no triangles');
  }
  return median(ts);
}

const yardSamples: number[] = [];
let pointsCache: Float64Array | undefined;

/**
 * One more timing of the yardstick — delaunator on 1 000 000 random points — taken now. The
 * commands section takes one before each command it times, so the yardstick is sampled across
 * the minutes the commands ran in and a burst of load moves its median little.
 */
export function sampleYardstick(): number {
  if (!pointsCache) {
    new Delaunator(randomPoints(100_000, 1)); // warm-up
    pointsCache = randomPoints(1_000_000);
  }
  const t0 = performance.now();
  const d = new Delaunator(pointsCache);
  const s = (performance.now() - t0) / 1000;
  if (d.triangles.length === 0) throw new Error('delaunator returned no triangles');
  yardSamples.push(s);
  return s;
}

/** The yardstick of this run: the median of its samples (three taken now if there are none). */
export function yardstick(): number {
  while (yardSamples.length < 3) sampleYardstick();
  return median(yardSamples);
}

/** The closing table: one line per goal, with its figure and whether it is met. */
export function goalsText(): string {
  if (goals.length === 0) return '';
  const lines = ['', '== goals (each figure measured in this run)'];
  if (yardSamples.length > 0) {
    const sorted = [...yardSamples].sort((a, b) => a - b);
    lines.push(`  yardstick: plain delaunator, 1 000 000 random points: ${median(yardSamples).toFixed(3)} s (median of ${yardSamples.length} samples taken through the run, ${sorted[0].toFixed(3)}–${sorted[sorted.length - 1].toFixed(3)} s)`);
  }
  for (const g of goals) {
    const v = g.unit === '×' ? `${g.value.toFixed(2)}×` : `${g.value.toFixed(3)} s`;
    const lim = g.unit === '×' ? `${g.limit}×` : `${g.limit} s`;
    const verdict = g.value <= g.limit ? 'met' : 'NOT met';
    lines.push(`  ${g.what}: ${g.measured} → ${v}${g.against ? ` ${g.against}` : ''} (goal ≤ ${lim}): ${verdict}`);
  }
  return lines.join('\n') + '\n';
}
