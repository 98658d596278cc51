/**
 * Every input protected (issue 19, class 1) and one run per folder (class 3): the record of the
 * files a model reads (src/cli/inputs.ts) and the folder lock (src/cli/lock.ts) directly.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, linkSync, mkdirSync, mkdtempSync, readFileSync, realpathSync, symlinkSync, utimesSync, writeFileSync } from 'node:fs';
import { hostname, tmpdir } from 'node:os';
import { join, relative } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { PeakwiseError } from '../../src/errors.js';
import { parseModel } from '../../src/model/index.js';
import { clearInputs, inputFile, inputsOfRun, modelInputReader, noteInput, refuseInputTarget, sha256Hex } from '../../src/cli/inputs.js';
import { acquireLock, LOCK_NAME, lockOwnerState, readLock, releaseLock } from '../../src/cli/lock.js';

const tmp = (p: string) => realpathSync(mkdtempSync(join(tmpdir(), `pw-il-${p}-`)));

function message(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(PeakwiseError);
    return (e as Error).message;
  }
  throw new Error('expected an error');
}

/** A model that imports its outline from a CSV one folder up, as engineers keep shared data. */
function project(): { dir: string; model: string; csv: string; text: string } {
  const dir = tmp('proj');
  mkdirSync(join(dir, 'models'));
  mkdirSync(join(dir, 'data'));
  const csv = join(dir, 'data', 'outline.csv');
  writeFileSync(csv, 'x,y\n0,0\n100,0\n100,40\n0,40\n');
  const text = [
    'material: { E: 210000, nu: 0.3 }',
    'thickness: 5',
    'plate: { outline: { points: ../data/outline.csv } }',
    'supports: [ { where: { x: 0 }, fix: [x, y] } ]',
    'loads: [ { where: { x: 100 }, traction: [20, 0] } ]',
    '',
  ].join('\n');
  const model = join(dir, 'models', 'strip.yaml');
  writeFileSync(model, text);
  return { dir, model, csv, text };
}

afterEach(() => clearInputs());

describe('the files a model reads', () => {
  it('the reader handed to parseModel records each imported file with its real path and hash', () => {
    const p = project();
    const reader = modelInputReader(p.model);
    const model = parseModel(p.text, p.model, { readFile: reader.readFile });
    expect(model.plate.outline.kind).toBe('polygon');
    expect(reader.inputs).toHaveLength(1);
    expect(reader.inputs[0].path).toBe('../data/outline.csv');
    expect(reader.inputs[0].real).toBe(p.csv);
    expect(reader.inputs[0].sha256).toBe(sha256Hex(readFileSync(p.csv)));
    expect(inputsOfRun().map((f) => f.real)).toEqual([p.csv]);
  });

  it('no spelling of an input can be written: same path, relative, through a folder link, through a file link, a hard link', () => {
    const p = project();
    const reader = modelInputReader(p.model);
    parseModel(p.text, p.model, { readFile: reader.readFile });
    noteInput(inputFile(p.model, 'model file', p.text));
    symlinkSync(join(p.dir, 'data'), join(p.dir, 'linked'));
    symlinkSync(p.csv, join(p.dir, 'alias.csv'));
    linkSync(p.csv, join(p.dir, 'hard.csv'));
    const spellings = [p.csv, relative(process.cwd(), p.csv), join(p.dir, 'models', '..', 'data', 'outline.csv'), join(p.dir, 'linked', 'outline.csv'), join(p.dir, 'alias.csv'), join(p.dir, 'hard.csv')];
    for (const s of spellings) {
      expect(message(() => refuseInputTarget(s, `--svg ${s}`)), s).toContain('refusing to overwrite the input file ../data/outline.csv (read by the model');
    }
    expect(message(() => refuseInputTarget(join(p.dir, 'hard.csv'), 'x'))).toContain('is a hard link to it');
    expect(message(() => refuseInputTarget(join(p.dir, 'linked', 'outline.csv'), 'x'))).toContain(`leads to ${p.csv} through a link`);
    expect(message(() => refuseInputTarget(p.model, '--export-matrix'))).toContain(`refusing to overwrite the input file ${p.model}`);
    // a neighbour that is not an input is fine
    expect(() => refuseInputTarget(join(p.dir, 'data', 'mesh.svg'), 'x')).not.toThrow();
  });

  it('the verification record the reports read is protected in every run', () => {
    const record = join(import.meta.dirname, '..', '..', 'docs', 'verification.json');
    expect(message(() => refuseInputTarget(record, '--report'))).toContain('the verification record');
  });
});

/** The pid of a process that has ended (a child we started and waited for). */
function deadPid(): number {
  const r = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], { encoding: 'utf8' });
  return Number(r.stdout);
}

describe('run.lock', () => {
  it('is created exclusively with pid, host and start; a second run into the folder is refused naming the first', () => {
    const dir = tmp('lock');
    const lock = acquireLock(dir, 'study', '--out o', () => {});
    const info = readLock(join(dir, LOCK_NAME))!;
    expect(info.pid).toBe(process.pid);
    expect(info.host).toBe(hostname());
    expect(Math.abs(Date.parse(info.started) - Date.now())).toBeLessThan(60_000);
    expect(message(() => acquireLock(dir, 'solve', '--out o', () => {}))).toMatch(
      new RegExp(`--out o: another peakwise run \\(study, pid ${process.pid}, started .*\\) is writing into this folder; wait for it to end or choose another --out`),
    );
    releaseLock(lock);
    expect(existsSync(join(dir, LOCK_NAME))).toBe(false);
    releaseLock(acquireLock(dir, 'solve', '--out o', () => {})); // free again
  });

  it('a lock of a process that has ended is taken over with a notice, and its temporary files go', () => {
    const dir = tmp('stale');
    const pid = deadPid();
    writeFileSync(join(dir, LOCK_NAME), JSON.stringify({ pid, host: hostname(), started: new Date().toISOString(), command: 'study', token: 'old' }));
    writeFileSync(join(dir, `.field.csv.${pid}.tmp`), 'half a file');
    writeFileSync(join(dir, `.field.csv.${pid + 1}.tmp`), 'not its file');
    const notes: string[] = [];
    const lock = acquireLock(dir, 'solve', '--out o', (l) => notes.push(l));
    expect(notes).toHaveLength(1);
    expect(notes[0]).toContain(`--out o: taking over the lock left by pid ${pid} (study`);
    expect(notes[0]).toContain(`removed its temporary files .field.csv.${pid}.tmp`);
    expect(existsSync(join(dir, `.field.csv.${pid}.tmp`))).toBe(false);
    expect(existsSync(join(dir, `.field.csv.${pid + 1}.tmp`))).toBe(true);
    expect(readLock(join(dir, LOCK_NAME))!.token).toBe(lock.token);
    releaseLock(lock);
  });

  it('a live pid whose process started after the lock was written is a reused pid (Linux /proc)', () => {
    if (!existsSync(`/proc/${process.pid}/stat`)) return; // no /proc: only the ESRCH rule applies
    const base = { pid: process.pid, host: hostname(), command: 'study', token: 't' };
    expect(lockOwnerState({ ...base, started: new Date().toISOString() })).toBe('alive');
    expect(lockOwnerState({ ...base, started: '2001-01-01T00:00:00.000Z' })).toBe('dead');
    expect(lockOwnerState({ ...base, pid: deadPid(), started: new Date().toISOString() })).toBe('dead');
  });

  it('a lock from another host is never taken over (its processes cannot be asked)', () => {
    const dir = tmp('host');
    writeFileSync(join(dir, LOCK_NAME), JSON.stringify({ pid: deadPid(), host: 'some-other-machine', started: '2001-01-01T00:00:00.000Z', command: 'sweep', token: 'x' }));
    expect(message(() => acquireLock(dir, 'solve', '--out o', () => {}))).toContain('on some-other-machine');
  });

  it('a damaged lock file counts as held while young (being written) and as stale when old', () => {
    const dir = tmp('damaged');
    const path = join(dir, LOCK_NAME);
    writeFileSync(path, '');
    expect(message(() => acquireLock(dir, 'solve', '--out o', () => {}))).toContain('another peakwise run is writing');
    const old = (Date.now() - 60_000) / 1000;
    utimesSync(path, old, old);
    const notes: string[] = [];
    releaseLock(acquireLock(dir, 'solve', '--out o', (l) => notes.push(l)));
    expect(notes[0]).toContain('taking over the lock');
  });

  it('release removes only the lock it holds', () => {
    const dir = tmp('token');
    const lock = acquireLock(dir, 'solve', '--out o', () => {});
    const path = join(dir, LOCK_NAME);
    writeFileSync(path, JSON.stringify({ ...readLock(path)!, token: 'someone-else' }));
    releaseLock(lock);
    expect(existsSync(path)).toBe(true);
  });
});
