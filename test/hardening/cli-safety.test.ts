/**
 * Hardening through the real binary (dist/, built by `npx tsc -p tsconfig.json`): Ctrl-C during
 * a study, atomic outputs, the input model never written, determinism of study.json, hostile
 * text in model strings, and the warnings of the health checks.
 */
import { execFile, spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { copyFileSync, existsSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { bin, root } from '../helpers/bin.js';

const STACK = /\n\s+at .+\(.+:\d+:\d+\)|\n\s+at file:/;

function run(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [bin, ...args], { cwd: root, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' }, timeout: 120_000, maxBuffer: 64 << 20 }, (err, stdout, stderr) => {
      resolve({ code: err ? (typeof err.code === 'number' ? err.code : -1) : 0, stdout, stderr });
    });
  });
}

const tmp = (p: string) => mkdtempSync(join(tmpdir(), `pw-${p}-`));
const sha = (f: string) => createHash('sha256').update(readFileSync(f)).digest('hex');
const noTempFiles = (dir: string) => readdirSync(dir).filter((f) => f.endsWith('.tmp'));

describe('Ctrl-C during a study', () => {
  it('stops between solves, writes study.json with "interrupted": true and exits 130', async () => {
    const out = tmp('sigint');
    // 12 levels on a finer base mesh take several seconds even on a quiet machine (8.6 s measured);
    // the exit listener goes on at once so an early exit cannot be missed
    const child = spawn(process.execPath, [bin, 'study', 'models/l-bracket-sharp.yaml', '--levels', '12', '--size', '1.5', '--out', out, '--quiet'], { cwd: root, env: { ...process.env, NO_COLOR: '1' } });
    let stderr = '';
    child.stderr.on('data', (d: Buffer) => { stderr += d.toString(); });
    child.stdout.resume();
    const exited = new Promise<number | null>((r) => child.on('exit', (c) => r(c)));
    await new Promise((r) => setTimeout(r, 2000));
    child.kill('SIGINT');
    const code = await exited;
    expect(code).toBe(130);
    expect(stderr).not.toMatch(STACK);
    expect(stderr).toContain('interrupted');
    const study = JSON.parse(readFileSync(join(out, 'study.json'), 'utf8')) as { interrupted?: boolean; sites: { levels: unknown[] }[] };
    expect(study.interrupted).toBe(true);
    // fewer levels than asked for, all of them complete records
    for (const s of study.sites) expect(s.levels.length).toBeLessThan(12);
    for (const f of ['sites.csv', 'field.csv', 'report.html']) expect(existsSync(join(out, f))).toBe(true);
    expect(noTempFiles(out)).toEqual([]);
  }, 120_000);
});

describe('nothing lost', () => {
  it('a failing run leaves the complete files of an earlier run untouched and no temporary file', async () => {
    const out = tmp('atomic');
    const good = await run(['solve', 'models/strap-pin-hole.yaml', '--out', out]);
    expect(good.code).toBe(0);
    const before = sha(join(out, 'field.csv'));
    // same folder reused by a run that fails in the solve stage (a load on no boundary)
    const bad = await run(['solve', 'test/fixtures/bad-run/load-inside.yaml', '--out', out]);
    expect(bad.code).toBe(1);
    expect(sha(join(out, 'field.csv'))).toBe(before);
    expect(noTempFiles(out)).toEqual([]);
    // and reused by a good run again: replaced whole
    const again = await run(['solve', 'models/strap-pin-hole.yaml', '--out', out]);
    expect(again.code).toBe(0);
    expect(sha(join(out, 'field.csv'))).toBe(before);
  }, 120_000);

  it('--svg or --export-matrix onto the model file is refused and the model is not changed', async () => {
    const dir = tmp('protect');
    const model = join(dir, 'plate.yaml');
    copyFileSync(join(root, 'models', 'l-bracket-sharp.yaml'), model);
    const h = sha(model);
    const svg = await run(['mesh', model, '--svg', model]);
    expect(svg.code).toBe(1);
    expect(svg.stderr).toContain('refusing to overwrite the input file');
    const mtx = await run(['solve', model, '--out', join(dir, 'out'), '--export-matrix', model]);
    expect(mtx.code).toBe(1);
    expect(mtx.stderr).toContain('refusing to overwrite the input file');
    const outIsModels = await run(['solve', model, '--out', dir]);
    expect(outIsModels.code).toBe(1);
    expect(outIsModels.stderr).toContain('refusing to write results into the models folder');
    expect(sha(model)).toBe(h);
    expect(noTempFiles(dir)).toEqual([]);
  }, 120_000);
});

describe('determinism', () => {
  it('two studies of the same model give byte-identical study.json apart from timings', async () => {
    const a = tmp('det-a'), b = tmp('det-b');
    const [ra, rb] = await Promise.all([
      run(['study', 'models/strap-pin-hole.yaml', '--levels', '3', '--out', a, '--quiet']),
      run(['study', 'models/strap-pin-hole.yaml', '--levels', '3', '--out', b, '--quiet']),
    ]);
    expect(ra.code).toBe(0);
    expect(rb.code).toBe(0);
    const strip = (f: string) => readFileSync(f, 'utf8').replace(/"(\w*S|totalS|timings)": [-0-9.e+]+/g, '"$1": 0');
    const ja = strip(join(a, 'study.json'));
    expect(ja).toContain('"sites"');
    expect(ja).toBe(strip(join(b, 'study.json')));
    expect(readFileSync(join(a, 'sites.csv'), 'utf8')).toBe(readFileSync(join(b, 'sites.csv'), 'utf8'));
  }, 180_000);
});

describe('hostile text in model strings', () => {
  const hostileTitle = '=HYPERLINK("http://x")<script>alert(1)</script>\u001b[2J\u0007 & "q"';
  const model = [
    `title: ${JSON.stringify(hostileTitle)}`,
    'units: { length: mm, force: N }',
    'material: { E: 210000, nu: 0.3 }',
    'thickness: 5',
    'plate:',
    '  outline: [[0, 0], [100, 0], [100, 40], [0, 40]]',
    '  openings:',
    '    - { id: "h1", circle: { center: [50, 20], radius: 6 } }',
    'supports: [ { where: { x: 0 }, fix: [x, y] } ]',
    'loads: [ { where: { x: 100 }, traction: [20, 0] } ]',
    'mesh: { size: 8 }',
    'study: { levels: 2 }',
    '',
  ].join('\n');

  it('is escaped in HTML, stripped of control characters on the terminal, guarded in CSV', async () => {
    const dir = tmp('hostile');
    const file = join(dir, '=evil<b>\u0007.yaml');
    writeFileSync(file, model);
    const out = join(dir, 'out');
    const r = await run(['study', file, '--out', out]);
    expect(r.code).toBe(0);
    // terminal: no escape, bell or other control characters from the file reach stdout / stderr
    // eslint-disable-next-line no-control-regex
    const controls = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/;
    expect(r.stdout).not.toMatch(controls);
    expect(r.stderr).not.toMatch(controls);
    const html = readFileSync(join(out, 'report.html'), 'utf8');
    expect(html).not.toContain('<script>alert(1)</script>');
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(html).not.toContain('=evil<b>');
    expect(html).not.toContain('\u001b');
    // CSV: every text cell that would start a formula is quoted with a leading apostrophe
    for (const f of ['sites.csv', 'field.csv']) {
      for (const line of readFileSync(join(out, f), 'utf8').split(/\r?\n/)) {
        for (const cell of line.split(',')) expect(cell.replace(/^"/, '')).not.toMatch(/^[=+@]/);
      }
    }
    // study.json is JSON: the title round-trips exactly (escaped by the JSON writer)
    const study = JSON.parse(readFileSync(join(out, 'study.json'), 'utf8')) as { model: { title: string } };
    expect(study.model.title).toBe(hostileTitle);
  }, 120_000);

  it('a hostile file name in an error message is stripped of control characters', async () => {
    const dir = tmp('hostile-err');
    const file = join(dir, 'bad\u001b[31m\u0007.yaml');
    writeFileSync(file, 'material: { E: 210000, nu: 0.7 }\n');
    const r = await run(['mesh', file]);
    expect(r.code).toBe(1);
    // eslint-disable-next-line no-control-regex
    expect(r.stderr).not.toMatch(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/);
    expect(r.stderr).not.toMatch(STACK);
  }, 60_000);
});

describe('warnings reach stderr and --json', () => {
  it('E written in Pa in a millimetre model: a unit hint naming file, line and key', async () => {
    const dir = tmp('units');
    const file = join(dir, 'pa.yaml');
    writeFileSync(file, readFileSync(join(root, 'models', 'strap-pin-hole.yaml'), 'utf8').replace('E: 210000', 'E: 2.1e11'));
    const r = await run(['solve', file, '--out', join(dir, 'out'), '--json']);
    expect(r.code).toBe(0);
    expect(r.stderr).toMatch(/peakwise: warning: .*pa\.yaml:\d+:\d+ material\.E: E = 2\.1e11 MPa/);
    const out = JSON.parse(r.stdout) as { warnings: string[] };
    expect(out.warnings.some((w) => w.includes('material.E'))).toBe(true);
  }, 60_000);

  it('plane strain, nu = 0.495, 3-node triangles: a locking warning suggesting 6-node triangles', async () => {
    const dir = tmp('lock');
    const file = join(dir, 'rubber.yaml');
    writeFileSync(file, 'title: rubber pad\nmaterial: { E: 5, nu: 0.495 }\nthickness: 10\nstate: plane-strain\nplate:\n  outline: [[0, 0], [60, 0], [60, 20], [0, 20]]\nsupports: [ { where: { y: 0 }, fix: [x, y] } ]\nloads: [ { where: { y: 20 }, pressure: 0.1 } ]\nmesh: { size: 4, order: 1 }\n');
    const r = await run(['solve', file, '--out', join(dir, 'out'), '--json']);
    expect(r.code).toBe(0);
    expect(r.stderr).toContain('volumetric locking');
    const out = JSON.parse(r.stdout) as { warnings: string[] };
    expect(out.warnings.some((w) => w.includes('mesh.order 2'))).toBe(true);
  }, 60_000);
});
