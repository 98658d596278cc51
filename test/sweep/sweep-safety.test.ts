/**
 * Ctrl-C during a sweep (issue 8): no new point is started, the running ones finish, the finished
 * points are written (sweep.json with "interrupted": true, sweep.csv, sweep.html) and the process
 * exits with status 130; the next run reuses them.
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { bin, root } from '../helpers/bin.js';

const VARY = ['--vary', 'r=0,1,2,3,4,6,8,10,12,14', '--levels', '5', '--jobs', '1'];

function points(dir: string): string[] {
  const p = join(dir, 'points');
  return existsSync(p) ? readdirSync(p).filter((f) => f.endsWith('.json')) : [];
}

describe('Ctrl-C during a sweep', () => {
  it('writes the finished points, marks the sweep interrupted, exits 130; a rerun reuses them', async () => {
    const out = mkdtempSync(join(tmpdir(), 'pw-sweep-int-'));
    const child = spawn(process.execPath, [bin, 'sweep', 'models/l-bracket-sharp.yaml', ...VARY, '--out', out, '--quiet'], { cwd: root, env: { ...process.env, NO_COLOR: '1' } });
    let stderr = '';
    child.stderr.on('data', (d: Buffer) => { stderr += d.toString(); });
    const exited = new Promise<number | null>((r) => child.on('exit', (c) => r(c)));
    // interrupt as soon as the first point is on disk
    const t0 = Date.now();
    while (points(out).length === 0 && Date.now() - t0 < 90_000) await new Promise((r) => setTimeout(r, 100));
    child.kill('SIGINT');
    const code = await exited;
    expect(code).toBe(130);
    expect(stderr).toContain('interrupted');
    expect(stderr).not.toMatch(/\n\s+at /);
    const sweep = JSON.parse(readFileSync(join(out, 'sweep.json'), 'utf8')) as { interrupted?: boolean; points: unknown[] };
    expect(sweep.interrupted).toBe(true);
    expect(sweep.points.length).toBeGreaterThanOrEqual(1);
    expect(sweep.points.length).toBeLessThan(10);
    expect(sweep.points.length).toBe(points(out).length);
    for (const f of ['sweep.csv', 'sweep.html']) expect(existsSync(join(out, f))).toBe(true);
  }, 120_000);
});

describe('determinism across --jobs', () => {
  it('one worker and two workers give the same sweep.json, byte for byte (it holds no wall times)', async () => {
    const runOnce = (jobs: string): Promise<string> =>
      new Promise((resolve, reject) => {
        const out = mkdtempSync(join(tmpdir(), `pw-sweep-j${jobs}-`));
        const child = spawn(process.execPath, [bin, 'sweep', 'models/l-bracket-sharp.yaml', '--vary', 'r=0,4', '--levels', '3', '--jobs', jobs, '--out', out, '--quiet'], { cwd: root });
        child.on('exit', (c) => (c === 0 ? resolve(readFileSync(join(out, 'sweep.json'), 'utf8')) : reject(new Error(`exit ${c}`))));
      });
    const [one, two] = await Promise.all([runOnce('1'), runOnce('2')]);
    expect(one).toBe(two);
  }, 120_000);
});
