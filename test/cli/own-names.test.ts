/**
 * Names of our own (issue 17): the words of other programs' vocabulary that earlier versions used
 * (a studied location called a "spot", the pin load called "bearing", a "path" readout, the colon
 * range syntax) appear neither in the command help nor in a study's outputs, and each old spelling
 * gets a one-line hint to the new one.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { bin, root } from '../helpers/bin.js';

function run(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [bin, ...args], { cwd: root, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' }, timeout: 60_000, maxBuffer: 64 << 20 }, (err, stdout, stderr) => {
      resolve({ code: err ? (typeof err.code === 'number' ? err.code : -1) : 0, stdout, stderr });
    });
  });
}

/** The old names, as whole words (the weld "hot-spot stress" helpers are not in the CLI or outputs). */
const OLD = /\bspots?\b|hot[- ]?spot|\bbearing\b|--path\b|path\.csv|along the path|start:step:end/i;

describe('no old name in the help or the outputs', () => {
  it('the help of every command', async () => {
    for (const cmd of [[], ['mesh'], ['solve'], ['study'], ['sweep'], ['check']]) {
      const r = await run([...cmd, '--help']);
      expect(r.code, cmd.join(' ')).toBe(0);
      expect(r.stdout, cmd.join(' ')).not.toMatch(OLD);
    }
  });
  it('every file a study of the lug demo writes, with a cut', async () => {
    const out = mkdtempSync(join(tmpdir(), 'pw-names-'));
    const r = await run(['study', 'models/hoist-lug.yaml', '--levels', '3', '--quiet', '--out', out, '--cut', 'opening:pin']);
    expect(r.code, r.stderr).toBe(0);
    const files = readdirSync(out);
    expect(files).toContain('cut.csv');
    expect(files).toContain('sites.csv');
    for (const f of files) expect(readFileSync(join(out, f), 'utf8'), f).not.toMatch(OLD);
    expect(r.stderr).not.toMatch(OLD);
  });
});

describe('old spellings get a hint to the new one', () => {
  const dir = mkdtempSync(join(tmpdir(), 'pw-old-'));
  const plate = [
    'material: { E: 200000, nu: 0.3 }', 'thickness: 1',
    'plate: { outline: [[0, 0], [100, 0], [100, 50], [0, 50]], openings: [{ id: h, circle: { center: [50, 25], radius: 10 } }] }',
    'supports: [{ where: { x: 0 }, fix: [x, y] }]',
  ];
  it('study.spots → study.sites, with file, line and key', async () => {
    const f = join(dir, 'old-spots.yaml');
    writeFileSync(f, [...plate, 'loads: [{ where: { x: 100 }, traction: [10, 0] }]', 'study: { spots: auto }', ''].join('\n'));
    const r = await run(['study', f, '--quiet', '--out', join(dir, 'o1')]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/old-spots\.yaml:6:\d+ study\.spots: key 'spots' is now called 'sites'/);
  });
  it('bearing → pinForce', async () => {
    const f = join(dir, 'old-pin.yaml');
    writeFileSync(f, [...plate, 'loads: [{ where: { opening: h }, bearing: [10, 0] }]', ''].join('\n'));
    const r = await run(['solve', f, '--quiet', '--out', join(dir, 'o2')]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/old-pin\.yaml:5:\d+ loads\[0\]\.bearing: key 'bearing' is now called 'pinForce'/);
  });
  it('--path → --cut', async () => {
    const r = await run(['solve', 'models/hoist-lug.yaml', '--path', 'opening:pin']);
    expect(r.code).toBe(1);
    expect(r.stderr.trim()).toBe('peakwise: option --path is now called --cut (same meaning); rename it');
  });
  it('--vary r=0:2:20 → "r=0..20 by 2"', async () => {
    const r = await run(['sweep', 'models/l-bracket-fillet.yaml', '--vary', 'r=1:1:3', '--quiet', '--out', join(dir, 'o3')]);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/old start:step:end form; write "1\.\.3 by 1"/);
  });
});
