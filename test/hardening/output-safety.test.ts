/**
 * The output side of reliability II (issue 19, classes 1, 2, 3, 4, 12, 14) through the real binary
 * (dist/, built by `npx tsc -p tsconfig.json`): no input of any kind is written, whatever the
 * spelling; `solve --adapt` keeps its last cycle on Ctrl-C; a result folder is one stamped set
 * with run.json, a killed run is reported, one run per folder; no empty folder after a failure;
 * pseudo-file systems refused; --max-dofs and file-system errors in plain words.
 */
import { execFile, spawn, type ChildProcess } from 'node:child_process';
import { createHash } from 'node:crypto';
import { chmodSync, existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, realpathSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { bin, root } from '../helpers/bin.js';

const STACK = /\n\s+at .+\(.+:\d+:\d+\)|\n\s+at file:/;

interface Run { code: number | null; signal: NodeJS.Signals | null; stdout: string; stderr: string }

function run(args: string[], opts: { cwd?: string; env?: Record<string, string>; uid?: number; gid?: number } = {}): Promise<Run> {
  return new Promise((resolve) => {
    execFile(process.execPath, [bin, ...args], {
      cwd: opts.cwd ?? root, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1', ...opts.env }, timeout: 60_000, maxBuffer: 64 << 20,
      ...(opts.uid !== undefined ? { uid: opts.uid, gid: opts.gid } : {}),
    }, (err, stdout, stderr) => {
      const e = err as (NodeJS.ErrnoException & { code?: number | string; signal?: NodeJS.Signals }) | null;
      resolve({ code: e ? (typeof e.code === 'number' ? e.code : null) : 0, signal: e?.signal ?? null, stdout, stderr });
    });
  });
}

const tmp = (p: string) => realpathSync(mkdtempSync(join(tmpdir(), `pw-out-${p}-`)));
const sha = (f: string) => createHash('sha256').update(readFileSync(f)).digest('hex');
const stampOf = (f: string) => /(?:peakwise run |"runId": "|name="peakwise-run" content=")([0-9a-f]{64})/.exec(readFileSync(f, 'utf8').slice(0, 4096))?.[1];

/** A project as engineers keep one: models/, shared data/ with an outline CSV and a drawing. */
function project(): { dir: string; model: string; csv: string; svg: string } {
  const dir = tmp('proj');
  mkdirSync(join(dir, 'models'));
  mkdirSync(join(dir, 'data'));
  const csv = join(dir, 'data', 'strip.csv');
  writeFileSync(csv, 'x,y\n0,0\n120,0\n120,40\n0,40\n');
  const svg = join(dir, 'data', 'cutouts.svg');
  writeFileSync(svg, '<svg xmlns="http://www.w3.org/2000/svg"><path id="slot" d="M 50 -15 L 70 -15 L 70 -25 L 50 -25 Z"/></svg>\n');
  const model = join(dir, 'models', 'strip.yaml');
  writeFileSync(model, [
    'title: Conveyor guard strap with a cable slot',
    'material: { E: 210000, nu: 0.3 }',
    'thickness: 4',
    'plate:',
    '  outline: { points: ../data/strip.csv }',
    '  openings:',
    '    - { id: slot, svg: ../data/cutouts.svg, path: slot, units: mm }',
    'supports: [ { where: { x: 0 }, fix: [x, y] } ]',
    'loads: [ { where: { x: 120 }, traction: [30, 0] } ]',
    'mesh: { size: 6 }',
    'study: { levels: 2 }',
    '',
  ].join('\n'));
  return { dir, model, csv, svg };
}

describe('class 1: no input is ever an output, by any spelling', () => {
  it('imported CSV and SVG, through folder links, file links and result names, and the verification record', async () => {
    const p = project();
    const hashes = [p.model, p.csv, p.svg].map(sha);
    symlinkSync(join(p.dir, 'data'), join(p.dir, 'shared'));
    symlinkSync(join(p.dir, 'models'), join(p.dir, 'out-models'));
    symlinkSync(join(p.dir, 'data'), join(p.dir, 'out-data'));
    mkdirSync(join(p.dir, 'res'));
    symlinkSync(p.csv, join(p.dir, 'res', 'field.csv'));
    const refused: [string[], string][] = [
      [['mesh', p.model, '--svg', p.csv], 'refusing to overwrite the input file ../data/strip.csv (read by the model)'],
      [['mesh', p.model, '--svg', join(p.dir, 'shared', 'cutouts.svg')], `leads to ${p.svg} through a link`],
      [['solve', p.model, '--out', join(p.dir, 'o1'), '--export-matrix', join(p.dir, 'shared', 'strip.csv')], 'refusing to overwrite the input file ../data/strip.csv'],
      [['solve', p.model, '--out', join(p.dir, 'o2'), '--export-load', p.model], `refusing to overwrite the input file ${p.model}`],
      [['solve', p.model, '--out', join(p.dir, 'out-models')], 'refusing to write results into the models folder'],
      [['study', p.model, '--out', join(p.dir, 'out-data')], 'refusing to write results into the folder that holds the imported file ../data/strip.csv'],
      [['solve', p.model, '--out', join(p.dir, 'res'), '--report'], 'field.csv: refusing to overwrite the input file ../data/strip.csv'],
      [['check', '--only', 'kirsch', '--report', join(root, 'docs', 'verification.json')], 'refusing to overwrite the input file docs/verification.json (the verification record)'],
    ];
    const record = sha(join(root, 'docs', 'verification.json'));
    const results = await Promise.all(refused.map(([args]) => run(args)));
    results.forEach((r, i) => {
      expect(r.code, refused[i][0].join(' ')).toBe(1);
      expect(r.stderr).toContain(refused[i][1]);
      expect(r.stderr).not.toMatch(STACK);
    });
    expect([p.model, p.csv, p.svg].map(sha)).toEqual(hashes);
    expect(sha(join(root, 'docs', 'verification.json'))).toBe(record);
    // refused before any work: the explicit targets are checked before the output folder is made
    expect(existsSync(join(p.dir, 'o1'))).toBe(false);
    expect(existsSync(join(p.dir, 'o2'))).toBe(false);
    expect(readdirSync(join(p.dir, 'models'))).toEqual(['strip.yaml']);
    // and the model does run, recording both imported files in its run.json
    const ok = await run(['solve', p.model, '--out', join(p.dir, 'good'), '--quiet']);
    expect(ok.code).toBe(0);
    const manifest = JSON.parse(readFileSync(join(p.dir, 'good', 'run.json'), 'utf8')) as { inputs: { file: string; sha256: string }[] };
    expect(manifest.inputs.map((f) => f.file)).toEqual([p.model, '../data/strip.csv', '../data/cutouts.svg']);
    expect(manifest.inputs.map((f) => f.sha256)).toEqual(hashes);
  }, 120_000);
});

function waitFor(child: ChildProcess, stream: 'stderr' | 'stdout', pattern: RegExp, timeoutMs: number): Promise<string> {
  return new Promise((resolve, reject) => {
    let text = '';
    const timer = setTimeout(() => reject(new Error(`no ${pattern} in ${timeoutMs} ms; got: ${text}`)), timeoutMs);
    child[stream]!.on('data', (d: Buffer) => {
      text += d.toString();
      if (pattern.test(text)) {
        clearTimeout(timer);
        resolve(text);
      }
    });
  });
}

describe('class 2: solve --adapt and Ctrl-C', () => {
  it('keeps the last finished cycle: its field and report, run.json "interrupted", exit 130', async () => {
    const out = join(tmp('adapt'), 'o');
    // edge-slit, CST: cycle 0 at 3 040 dofs, cycle 1 at 16 902, cycle 2 at 82 024 (measured); the
    // cap is far away, so only the Ctrl-C after cycle 0 ends the loop (after cycle 0 or cycle 1)
    const child = spawn(process.execPath, [bin, 'solve', 'models/edge-slit.yaml', '--adapt', '0.01', '--order', '1', '--out', out, '--report'], { cwd: root, env: { ...process.env, NO_COLOR: '1' } });
    child.stdout.resume();
    let stderr = '';
    child.stderr.on('data', (d: Buffer) => { stderr += d.toString(); });
    const exited = new Promise<number | null>((r) => child.on('exit', (c) => r(c)));
    await waitFor(child, 'stderr', /cycle 0: \d+ dofs/, 60_000);
    child.kill('SIGINT');
    expect(await exited).toBe(130);
    expect(stderr).not.toMatch(STACK);
    const cycles = [...stderr.matchAll(/cycle (\d+): (\d+) dofs/g)].map((m) => ({ cycle: Number(m[1]), dofs: Number(m[2]) }));
    const kept = /interrupted: cycle (\d+) \((\d+) dofs/.exec(stderr);
    expect(kept).not.toBeNull();
    const last = cycles[cycles.length - 1];
    // the last finished cycle, nothing half done: cycle 0 when the Ctrl-C lands before cycle 1 starts,
    // cycle 1 when it lands while cycle 1 runs (which one depends on the machine's load)
    expect(Number(kept![1])).toBe(last.cycle);
    // field.csv holds that cycle's mesh: one row per node, two dofs per node
    const rows = readFileSync(join(out, 'field.csv'), 'utf8').split('\r\n').filter((l) => l.length > 0 && !l.startsWith('#')).length - 1;
    expect(2 * rows).toBe(Number(kept![2]));
    const manifest = JSON.parse(readFileSync(join(out, 'run.json'), 'utf8')) as { interrupted?: boolean; files: string[] };
    expect(manifest.interrupted).toBe(true);
    expect(manifest.files).toEqual(['field.csv', 'report.html']);
    expect(readdirSync(out).filter((f) => f.endsWith('.tmp') || f === 'run.lock')).toEqual([]);
  }, 120_000);
});

describe('class 3: a result set is one unit', () => {
  it('a run killed (SIGKILL) between two files is reported as incomplete by `results` and by the next run', async () => {
    const out = join(tmp('kill'), 'o');
    const study = await run(['study', 'models/strap-pin-hole.yaml', '--levels', '2', '--out', out, '--quiet']);
    expect(study.code).toBe(0);
    expect((await run(['results', out])).code).toBe(0);
    const studyId = stampOf(join(out, 'study.json'));
    // a different run into the folder, killed by the test hook right after its first file
    const killed = await run(['solve', 'models/strap-pin-hole.yaml', '--out', out, '--quiet'], { env: { PEAKWISE_TEST_KILL_AFTER_WRITES: '1' } });
    expect(killed.signal).toBe('SIGKILL');
    expect(existsSync(join(out, 'run.json'))).toBe(false);
    const solveId = stampOf(join(out, 'field.csv'));
    expect(solveId).toMatch(/^[0-9a-f]{64}$/);
    expect(solveId).not.toBe(studyId);
    expect(stampOf(join(out, 'study.json'))).toBe(studyId);
    const check = await run(['results', out]);
    expect(check.code).toBe(1);
    expect(check.stdout).toContain(`${out}: incomplete result set: no run.json`);
    expect(check.stdout).toContain('the files come from 2 different runs');
    // the next run takes the dead run's lock over, warns, and leaves one complete set
    const next = await run(['study', 'models/strap-pin-hole.yaml', '--levels', '2', '--out', out]);
    expect(next.code).toBe(0);
    expect(next.stderr).toContain(`--out ${out}: taking over the lock left by pid`);
    expect(next.stderr).toContain(`peakwise: warning: ${out} holds an incomplete result set (no run.json`);
    const after = await run(['results', out]);
    expect(after.code).toBe(0);
    expect(after.stdout).toMatch(/complete result set of run [0-9a-f]{12} \(study\), 4 files: field.csv, report.html, sites.csv, study.json/);
    for (const f of ['field.csv', 'report.html', 'sites.csv', 'study.json']) expect(stampOf(join(out, f)), f).toBe(studyId);
    expect(readFileSync(join(out, 'report.html'), 'utf8')).toContain(`<meta name="peakwise-run" content="${studyId}"/>`);
  }, 120_000);

  it('a second run into a folder in use refuses naming the first; the lock goes with the first run (Ctrl-C)', async () => {
    const out = join(tmp('busy'), 'o');
    const first = spawn(process.execPath, [bin, 'study', 'models/l-bracket-sharp.yaml', '--levels', '12', '--size', '1.5', '--out', out, '--quiet'], { cwd: root, env: { ...process.env, NO_COLOR: '1' } });
    first.stdout.resume();
    first.stderr.resume();
    const exited = new Promise<number | null>((r) => first.on('exit', (c) => r(c)));
    for (let i = 0; i < 600 && !existsSync(join(out, 'run.lock')); i++) await new Promise((r) => setTimeout(r, 50));
    const [second, busy] = await Promise.all([run(['solve', 'models/l-bracket-sharp.yaml', '--out', out]), run(['results', out])]);
    expect(busy.stdout).toContain(`a run is writing into this folder now (study, pid ${first.pid}, started `);
    expect(second.code).toBe(1);
    expect(second.stderr).toContain(`--out ${out}: another peakwise run (study, pid ${first.pid}, started `);
    expect(second.stderr).not.toMatch(STACK);
    first.kill('SIGINT');
    expect(await exited).toBe(130);
    expect(existsSync(join(out, 'run.lock'))).toBe(false);
    const check = await run(['results', out]);
    expect(check.code).toBe(0);
    expect(check.stdout).toContain('(study, interrupted: the finished part)');
  }, 120_000);

  it('identical runs give byte-identical sets, run.json included', async () => {
    const a = join(tmp('same-a'), 'o'), b = join(tmp('same-b'), 'o');
    const [ra, rb] = await Promise.all([a, b].map((o) => run(['solve', 'models/strap-pin-hole.yaml', '--out', o, '--quiet', '--cut', '0,20:100,20'])));
    expect(ra.code).toBe(0);
    expect(rb.code).toBe(0);
    for (const f of ['run.json', 'field.csv', 'cut.csv']) expect(sha(join(a, f)), f).toBe(sha(join(b, f)));
  }, 120_000);
});

describe('class 4: a failed run leaves no empty folder', () => {
  it('neither for an error of the model nor for a usage error found after the folder was opened', async () => {
    const base = tmp('empty');
    const bad = await run(['solve', 'test/fixtures/bad-run/load-inside.yaml', '--out', join(base, 'a', 'b', 'c')]);
    expect(bad.code).toBe(1);
    const usage = await run(['study', 'models/strap-pin-hole.yaml', '--levels', '99', '--out', join(base, 'x', 'y')]);
    expect(usage.code).toBe(1);
    expect(usage.stderr).toContain('--levels must be');
    expect(readdirSync(base)).toEqual([]);
  }, 60_000);
});

describe('class 12: pseudo-file systems', () => {
  it('/proc, /sys and /dev are refused at once for --out, --svg and check --report', async () => {
    const cases: [string[], string][] = [
      [['solve', 'models/strap-pin-hole.yaml', '--out', '/proc/self/peakwise-out'], '--out /proc/self/peakwise-out: refusing to write there: /proc holds'],
      [['study', 'models/strap-pin-hole.yaml', '--out', '/sys/peakwise/a/b'], 'refusing to write there: /sys holds'],
      [['solve', 'models/strap-pin-hole.yaml', '--out', '/dev/shm/peakwise-out'], 'refusing to write there: /dev holds'],
      [['mesh', 'models/strap-pin-hole.yaml', '--svg', '/proc/peakwise/mesh.svg'], '--svg /proc/peakwise/mesh.svg: refusing to write there'],
      [['check', '--only', 'kirsch', '--report', '/proc/peakwise.html'], '--report /proc/peakwise.html: refusing to write there'],
    ];
    const results = await Promise.all(cases.map(([args]) => run(args)));
    results.forEach((r, i) => {
      expect(r.code, cases[i][0].join(' ')).toBe(1);
      expect(r.stderr).toContain(cases[i][1]);
    });
    expect(existsSync('/dev/shm/peakwise-out')).toBe(false);
  }, 60_000);
});

describe('class 14: command-line messages', () => {
  it('--max-dofs 0.5, 0, -1, 1e99, abc: refused before the model is read, naming the option and the rule', async () => {
    const base = tmp('maxdofs');
    const cases: [string, string][] = [['solve', '0.5'], ['solve', '0'], ['solve', '-1'], ['solve', '1e99'], ['solve', 'abc'], ['study', '0.5']];
    // a model that does not exist: the option is checked first
    const results = await Promise.all(cases.map(([cmd, v]) => run([cmd, 'models/no-such-model.yaml', '--max-dofs', v, '--out', join(base, 'o')])));
    results.forEach((r, i) => {
      expect(r.code).toBe(1);
      expect(r.stderr.trim()).toBe(`peakwise: --max-dofs must be a whole number from 1 to 1000000000, got "${cases[i][1]}"`);
    });
    expect(readdirSync(base)).toEqual([]);
  }, 120_000);

  it('--out where the user may not write says "permission denied" in plain words', async () => {
    if (process.platform === 'win32') return;
    const base = tmp('perm');
    const locked = join(base, 'locked');
    mkdirSync(locked);
    chmodSync(locked, 0o555);
    chmodSync(base, 0o755);
    // root may write anywhere: run the binary as the unprivileged user `nobody` then
    const asUser = process.getuid?.() === 0 ? { uid: 65534, gid: 65534 } : {};
    const model = join(base, 'plate.yaml');
    writeFileSync(model, readFileSync(join(root, 'models', 'strap-pin-hole.yaml')));
    chmodSync(model, 0o644);
    const r = await run(['solve', model, '--out', join(locked, 'o')], { cwd: base, ...asUser });
    expect(r.code).toBe(1);
    expect(r.stderr).toContain(`--out ${join(locked, 'o')}: cannot create the folder ${join(locked, 'o')}: permission denied: you may not write there`);
    expect(r.stderr).not.toMatch(STACK);
  }, 60_000);
});
