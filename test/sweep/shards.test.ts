/**
 * `peakwise sweep --shard k/n` (docs/sweep.md, "Spreading a sweep over machines"): three shards
 * run as separate processes into one folder, each computing every third point; the run without
 * --shard then finds every point file, computes nothing, and writes sweep.csv, sweep.json and
 * sweep.html byte for byte as one run of the whole sweep in another folder does (the run id in
 * their stamps is derived from the inputs and options, not from the folder or the time).
 */
import { execFile } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { bin, root } from '../helpers/bin.js';

const model = 'models/l-bracket-sharp.yaml';
const out = mkdtempSync(join(tmpdir(), 'peakwise-shards-'));
const POINT_FILE = /^[0-9a-f]{64}\.json$/;
// five points over three shards: shard 1 takes points 1 and 4, shard 2 points 2 and 5, shard 3 point 3
const SWEEP = ['sweep', model, '--vary', 'r=0,1,3,5,8', '--levels', '3', '--jobs', '1', '--quiet'];

function run(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [bin, ...args], { cwd: root, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' }, timeout: 240_000, maxBuffer: 64 << 20 }, (err, stdout, stderr) => {
      resolve({ code: err ? (typeof err.code === 'number' ? err.code : -1) : 0, stdout, stderr });
    });
  });
}

function pointFiles(dir: string): string[] {
  const p = join(dir, 'points');
  return existsSync(p) ? readdirSync(p).filter((f) => POINT_FILE.test(f)).sort() : [];
}

describe('sweep --shard k/n', () => {
  it('three shards as separate processes, merged, give the same sweep.csv, sweep.json and sweep.html as one run', async () => {
    const whole = join(out, 'whole');
    const shared = join(out, 'shared');
    const one = await run([...SWEEP, '--out', whole]);
    expect(one.stderr).toBe('');
    expect(one.code).toBe(0);
    // the shards run at the same time, on one folder, with no lock between them
    const shards = await Promise.all([1, 2, 3].map((k) => run([...SWEEP, '--shard', `${k}/3`, '--out', shared, '--json'])));
    for (const s of shards) {
      expect(s.stderr).toBe('');
      expect(s.code).toBe(0);
    }
    const indices = shards.map((s) => (JSON.parse(s.stdout) as { points: { index: number }[] }).points.map((p) => p.index));
    expect(indices).toEqual([[0, 3], [1, 4], [2]]);
    // a shard writes point files only: no result set, no lock left behind
    expect(readdirSync(shared).sort()).toEqual(['points']);
    expect(pointFiles(shared)).toEqual(pointFiles(whole));
    const merged = await run([...SWEEP, '--out', shared]);
    expect(merged.code).toBe(0);
    for (const name of ['sweep.csv', 'sweep.json', 'sweep.html']) {
      const a = readFileSync(join(whole, name));
      const b = readFileSync(join(shared, name));
      expect(b.length).toBeGreaterThan(500);
      expect(b.equals(a), name).toBe(true);
    }
    // the merge computed nothing: every point came from the shards' files
    const summary = await run([...SWEEP.filter((a) => a !== '--quiet'), '--out', shared]);
    expect(summary.stdout).toContain('reused 5 of 5 points');
  }, 300_000);

  it('refuses a shard that does not exist, naming the option', async () => {
    for (const bad of ['0/3', '4/3', '2', 'a/b', '1/0']) {
      const r = await run([...SWEEP, '--shard', bad, '--out', join(out, 'bad')]);
      expect(r.code).toBe(1);
      expect(r.stderr).toContain('--shard must be k/n');
      expect(r.stderr).not.toMatch(/\n\s+at /);
    }
  });
});
