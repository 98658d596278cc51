/**
 * Watch mode's reuse between runs (src/pipeline/reuse.ts, docs/watch.md "Reuse"): the built binary
 * watches a copy of the l-bracket-sharp demo; after a comment-only save, a load-only edit (the `tau`
 * param) and a geometry edit (the `leg` param) the watch's result set is compared with a fresh
 * `peakwise study` of the edited file in a new process: every file byte for byte, study.json save its
 * one timing (`"totalS"`, the only field two fresh runs of the same file differ in). The comment-only
 * save must read every level back (six levels and the far field: 7) and take the first solve's mesh
 * and factor; the load-only edit after it every mesh and factor (six levels, the first solve, the far
 * field: 8 each), which the levels read back kept in use; the geometry edit nothing.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { copyFileSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { root, runCli } from '../pipeline/helpers.js';

const bin = join(root, 'dist', 'cli', 'main.js');
const demo = readFileSync(join(root, 'models', 'l-bracket-sharp.yaml'), 'utf8');

/** A result file as compared: study.json without its run time. */
function comparableFile(dir: string, name: string): string {
  const text = readFileSync(join(dir, name), 'utf8');
  return name === 'study.json' ? text.replace(/"totalS": [-0-9.e+]+/, '"totalS": 0') : text;
}

describe('study --watch reuses meshes and factors between runs', () => {
  let dir: string;
  let child: ChildProcess;
  let stderr = '';
  const file = (): string => join(dir, 'l-bracket-sharp.yaml');

  /** the watch's "written in" lines so far */
  const written = (): string[] => stderr.split('\n').filter((l) => l.includes(' written in '));
  const waitForRun = (count: number, ms = 120_000): Promise<string> => new Promise((resolve, reject) => {
    const started = Date.now();
    const look = (): void => {
      const lines = written();
      if (lines.length >= count) return resolve(lines[count - 1]);
      if (/still watching|internal error/.test(stderr)) return reject(new Error(`the watch failed:\n${stderr}`));
      if (Date.now() - started > ms) return reject(new Error(`timed out waiting for run ${count}; stderr:\n${stderr}`));
      setTimeout(look, 50);
    };
    look();
  });

  /** save `text`, wait for the rerun, then a fresh study of the same file in a new process; compare */
  async function rerunMatchesFresh(text: string, run: number, name: string): Promise<string> {
    writeFileSync(file(), text);
    const line = await waitForRun(run);
    const fresh = join(dir, `fresh-${name}`);
    const r = await runCli(['study', file(), '--out', fresh, '--quiet']);
    expect(r.code, r.stderr).toBe(0);
    const names = readdirSync(fresh).sort();
    expect(readdirSync(join(dir, 'watch')).filter((n) => n !== 'run.lock').sort()).toEqual(names);
    expect(names).toEqual(expect.arrayContaining(['study.json', 'sites.csv', 'field.csv', 'report.html', 'run.json']));
    for (const n of names) expect(comparableFile(join(dir, 'watch'), n), `${name}: ${n}`).toBe(comparableFile(fresh, n));
    return line;
  }

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'peakwise-watch-reuse-'));
    copyFileSync(join(root, 'models', 'l-bracket-sharp.yaml'), file());
    child = spawn(process.execPath, [bin, 'study', file(), '--watch', '--out', join(dir, 'watch')], { env: { ...process.env, NO_COLOR: '1' } });
    child.stdout!.resume();
    child.stderr!.setEncoding('utf8').on('data', (c: string) => { stderr += c; });
    await waitForRun(1);
  }, 150_000);

  afterAll(async () => {
    if (child.exitCode === null) {
      const ended = new Promise((r) => child.once('exit', r));
      child.kill('SIGINT');
      await ended;
    }
    rmSync(dir, { recursive: true, force: true });
  });

  it('the first run reuses nothing', () => {
    expect(written()[0]).not.toMatch(/reused/);
  });

  it('a comment-only save: every level read back (and the first solve\'s mesh and factor), the files those of a fresh run', async () => {
    const line = await rerunMatchesFresh(demo + '# a note\n', 2, 'comment');
    expect(line).toMatch(/\(reused 7 levels, 1 mesh, 1 factor\)/);
  }, 150_000);

  it('then a load-only edit: every mesh and factor reused (kept in use by the levels read back), the files those of a fresh run', async () => {
    const line = await rerunMatchesFresh(demo.replace('tau: 6 ', 'tau: 9 ') + '# a note\n', 3, 'load');
    expect(line).toMatch(/\(reused 8 meshes, 8 factors\)/);
  }, 150_000);

  it('a geometry edit: nothing to reuse, the files those of a fresh run', async () => {
    const line = await rerunMatchesFresh(demo.replace('leg: 120 ', 'leg: 130 '), 4, 'geometry');
    expect(line).not.toMatch(/reused/);
  }, 150_000);
});
