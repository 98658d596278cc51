/**
 * tsc's unbundled build of the CLI (dist/cli/main.js) still runs on its own — the bin of
 * package.json is the bundle (test/helpers/bin.ts) — and both give the same bytes: a study of a
 * small plate with its levels on two worker threads (the study worker found next to the code in
 * each layout), its report's verification strip read from docs/ (a URL relative to the code).
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { bin, root, unbundledBin } from '../helpers/bin.js';
import { farFieldPlateText } from '../pipeline/helpers.js';

const dir = mkdtempSync(join(tmpdir(), 'pw-unbundled-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(file: string, args: string[], env: Record<string, string> = {}): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [file, ...args], { cwd: dir, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', ...env }, timeout: 120_000 }, (err, stdout, stderr) => {
      resolve({ code: err ? (typeof err.code === 'number' ? err.code : -1) : 0, stdout, stderr });
    });
  });
}

describe('the unbundled dist/cli/main.js', () => {
  it('--version prints the package version', async () => {
    const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { version: string };
    const r = await run(unbundledBin, ['--version']);
    expect(r.code).toBe(0);
    expect(r.stdout.trim()).toBe(pkg.version);
  });

  it('studies a small plate on two workers to the same bytes as the bundle (its worker without, then twice with the code cache)', async () => {
    writeFileSync(join(dir, 'plate.yaml'), farFieldPlateText());
    const outputs: Record<string, string>[] = [];
    const runs: [string, string, Record<string, string>][] = [
      ['unbundled', unbundledBin, {}],
      ['bundle-no-cache', bin, { PEAKWISE_CODE_CACHE: '0' }],
      ['bundle', bin, {}],
      ['bundle-again', bin, {}], // the cache the run before wrote, if it was not there already
    ];
    for (const [name, file, env] of runs) {
      const r = await run(file, ['study', 'plate.yaml', '--out', name, '--quiet', '--jobs', '2'], env);
      expect(r.stderr).toBe('');
      expect(r.code).toBe(0);
      const read = (f: string) => readFileSync(join(dir, name, f), 'utf8');
      outputs.push({ json: read('study.json').replace(/"totalS": [0-9.e+-]+/, '"totalS": 0'), csv: read('sites.csv'), html: read('report.html') });
    }
    // the verification strip is there (the first recorded case of docs/verification.json), not the "no record" note
    const first = (JSON.parse(readFileSync(join(root, 'docs', 'verification.json'), 'utf8')) as { cases: { name: string }[] }).cases[0].name;
    expect(outputs[0].html).toContain(first);
    for (const o of outputs.slice(1)) expect(o).toEqual(outputs[0]);
  });
});
