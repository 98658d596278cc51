/**
 * The command line as a user meets it: the bin of package.json (the bundle dist/bundle/peakwise.js,
 * made by `npm install` / `prepare`; test/helpers/bin.ts), exit codes, one-line messages with
 * file:line:col and key path, no stack traces.
 */
import { execFile } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, readdirSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { bin, root } from '../helpers/bin.js';

function run(args: string[], env: Record<string, string> = {}): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [bin, ...args], { cwd: root, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', ...env }, timeout: 60_000, maxBuffer: 64 << 20 }, (err, stdout, stderr) => {
      const code = err ? (typeof err.code === 'number' ? err.code : -1) : 0;
      resolve({ code, stdout, stderr });
    });
  });
}

const STACK = /\n\s+at .+\(.+:\d+:\d+\)|\n\s+at file:/;

describe('peakwise binary basics', () => {
  it('is built', () => {
    expect(existsSync(bin)).toBe(true);
  });
  it('--version prints the package version and exits 0', async () => {
    const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { version: string };
    const r = await run(['--version']);
    expect(r.code).toBe(0);
    expect(r.stdout.trim()).toBe(pkg.version);
  });
  it('--help lists the commands', async () => {
    const r = await run(['--help']);
    expect(r.code).toBe(0);
    for (const c of ['mesh', 'solve', 'study']) expect(r.stdout).toContain(c);
  });
  it('an unknown option exits 1 without a stack trace', async () => {
    const r = await run(['mesh', 'models/l-bracket-sharp.yaml', '--frobnicate']);
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('--frobnicate');
    expect(r.stderr).not.toMatch(STACK);
  });
  it('a missing model file is named', async () => {
    const r = await run(['mesh', 'models/does-not-exist.yaml']);
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('models/does-not-exist.yaml: no such file');
  });
  it('refuses to write results into the models folder', async () => {
    const r = await run(['solve', 'models/l-bracket-sharp.yaml', '--out', 'models']);
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('refusing to write results into the models folder');
  });
});

describe('solve through the binary', () => {
  it('--json carries the solution, stress, timing and factor keys, and the reactions balance the loads', async () => {
    const out = mkdtempSync(join(tmpdir(), 'pw-solve-'));
    const r = await run(['solve', 'models/strap-pin-hole.yaml', '--json', '--out', out]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout) as {
      solution: { dofs: number; maxDisplacement: number; maxDisplacementAt: number[]; reactionSum: number[]; appliedSum: number[] };
      stress: { measure: string; max: number; at: number[]; errorPercent: number };
      timings: Record<string, number>;
      factor: { nnzL: number };
    };
    for (const k of ['meshS', 'assembleS', 'orderS', 'factorS', 'solveS']) expect(j.timings[k]).toBeGreaterThanOrEqual(0);
    expect(j.factor.nnzL).toBeGreaterThan(j.solution.dofs);
    expect(j.stress.measure).toBe('von-mises');
    expect(j.stress.errorPercent).toBeGreaterThan(0);
    // statics: Σ reactions + Σ applied loads = 0 (1e-9 of the applied resultant)
    const F = Math.hypot(j.solution.appliedSum[0], j.solution.appliedSum[1]);
    expect(Math.hypot(j.solution.reactionSum[0] + j.solution.appliedSum[0], j.solution.reactionSum[1] + j.solution.appliedSum[1])).toBeLessThan(1e-9 * F);
    // RFC 4180 line ends; the first line is the result set's stamp, a `#` comment (docs/reliability.md)
    const [stamp, header] = readFileSync(join(out, 'field.csv'), 'utf8').split('\r\n');
    expect(stamp).toMatch(/^# peakwise run [0-9a-f]{64}$/);
    // units in the header, stresses named as recovered nodal values (issue 17)
    expect(header).toBe('"node","x_mm","y_mm","ux_mm","uy_mm","sxx_recovered_MPa","syy_recovered_MPa","sxy_recovered_MPa","von_mises_recovered_MPa"');
  });

  it('--adapt stops at the dof cap with a warning line, exit 0, and no solved mesh above the cap', async () => {
    const out = mkdtempSync(join(tmpdir(), 'pw-adapt-'));
    const r = await run(['solve', 'models/l-bracket-sharp.yaml', '--adapt', '0.01', '--max-dofs', '8000', '--json', '--out', out]);
    expect(r.code).toBe(0);
    expect(r.stderr).toMatch(/warning: adaptive loop stopped by the dof cap/);
    expect(r.stderr).not.toMatch(STACK);
    const j = JSON.parse(r.stdout) as { cycles: { dofs: number; errorPercent: number }[] };
    expect(j.cycles.length).toBeGreaterThanOrEqual(1);
    for (const c of j.cycles) expect(c.dofs).toBeLessThanOrEqual(8000);
  });
});

describe('mesh --json on every demo model', () => {
  const models = readdirSync(join(root, 'models')).filter((f) => f.endsWith('.yaml'));
  it.concurrent.each(models)('%s', async (f) => {
    const r = await run(['mesh', `models/${f}`, '--json']);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout) as { mesh: { nodes: number; elements: number; order: number; minAngleDeg: number; area: number; exactArea: number } };
    // area of the mesh against the exact plate area: the order-2 mesh follows curves with
    // mid-side nodes on the true curve, so the chord error is far below 1e-4 relative
    expect(Math.abs(out.mesh.area / out.mesh.exactArea - 1)).toBeLessThan(1e-4);
    expect(out.mesh.minAngleDeg).toBeGreaterThan(20);
  });
});

/** Bad models from test/fixtures/bad (model-stage) and test/fixtures/bad-run (later stages). */
describe('bad models end with exit 1, file:line and key path, no stack trace', () => {
  const badDir = join(root, 'test', 'fixtures', 'bad');
  const expected = JSON.parse(readFileSync(join(badDir, 'expected.json'), 'utf8')) as Record<string, { fragment: string; line?: number; keyPath?: string }>;
  it.concurrent.each(Object.entries(expected))('%s', async (file, exp) => {
    const rel = `test/fixtures/bad/${file}`;
    const r = await run(['mesh', rel]);
    expect(r.code).toBe(1);
    expect(r.stderr).not.toMatch(STACK);
    expect(r.stderr).toContain(exp.fragment);
    expect(r.stderr).toContain(exp.line !== undefined ? `${rel}:${exp.line}:` : rel);
    if (exp.keyPath) expect(r.stderr).toContain(exp.keyPath);
  });

  const runDir = join(root, 'test', 'fixtures', 'bad-run');
  const later = JSON.parse(readFileSync(join(runDir, 'expected.json'), 'utf8')) as Record<string, { command: string; fragment: string; keyPath?: string }>;
  it.concurrent.each(Object.entries(later))('%s', async (file, exp) => {
    const rel = `test/fixtures/bad-run/${file}`;
    const out = mkdtempSync(join(tmpdir(), 'pw-bad-'));
    const r = await run([exp.command, rel, '--out', out]);
    expect(r.code).toBe(1);
    expect(r.stderr).not.toMatch(STACK);
    expect(r.stderr).toContain(exp.fragment);
    expect(r.stderr).toMatch(new RegExp(`${rel.replace(/[.]/g, '\\.')}:\\d+:\\d+`));
    if (exp.keyPath) expect(r.stderr).toContain(exp.keyPath);
    // nothing half-written is left behind
    for (const f of readdirSync(out)) expect(statSync(join(out, f)).size).toBeGreaterThan(0);
  });
});
