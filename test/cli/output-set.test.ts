/**
 * A result set is one unit (issue 19, classes 1, 3, 4): run id, stamps, manifest, folder rules and
 * the life of a set (src/cli/output-set.ts) directly. Kills are simulated by leaving a set
 * neither finished nor abandoned; the CLI test test/hardening/output-safety.test.ts kills the
 * real binary with SIGKILL.
 */
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, realpathSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { PeakwiseError } from '../../src/errors.js';
import { readCsv } from '../../src/model/csv.js';
import { clearInputs, inputFile, type InputFile } from '../../src/cli/inputs.js';
import { writeFileAtomic } from '../../src/cli/io.js';
import { LOCK_NAME } from '../../src/cli/lock.js';
import {
  canonicalJson, checkOutFolder, closeOutputSets, inspectFolder, MANIFEST_NAME, openOutputSet, runIdOf, stampContent, stampOfFile,
  type RunIdentity,
} from '../../src/cli/output-set.js';

const tmp = (p: string) => realpathSync(mkdtempSync(join(tmpdir(), `pw-os-${p}-`)));
const ID = 'a'.repeat(64);

function message(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(PeakwiseError);
    return (e as Error).message;
  }
  throw new Error('expected an error');
}

const identity = (over: Partial<RunIdentity> = {}): RunIdentity => ({
  command: 'study',
  model: 'models/plate.yaml',
  inputs: [{ path: 'models/plate.yaml', role: 'model file', sha256: 'm1' }, { path: 'outline.csv', role: 'imported file', sha256: 'c1' }],
  options: { levels: '3', maxDofs: '2000000' },
  version: '0.1.0',
  ...over,
});

afterEach(() => {
  closeOutputSets('failed');
  clearInputs();
});

describe('run id', () => {
  it('is the same for the same inputs and options, whatever the key order, the folder or the terminal options', () => {
    const a = runIdOf(identity());
    expect(a).toMatch(/^[0-9a-f]{64}$/);
    expect(runIdOf(identity({ options: { maxDofs: '2000000', levels: '3' } }))).toBe(a);
    expect(runIdOf(identity({ options: { levels: '3', maxDofs: '2000000', out: 'elsewhere', quiet: true, json: true, color: false, jobs: '4' } }))).toBe(a);
    expect(canonicalJson({ b: 1, a: [{ d: 2, c: 3 }] })).toBe('{"a":[{"c":3,"d":2}],"b":1}');
  });
  it('changes with the model bytes, an imported file\'s bytes, an option that changes results, the command and the version', () => {
    const a = runIdOf(identity());
    const variants = [
      identity({ inputs: [{ path: 'models/plate.yaml', role: 'model file', sha256: 'm2' }, { path: 'outline.csv', role: 'imported file', sha256: 'c1' }] }),
      identity({ inputs: [{ path: 'models/plate.yaml', role: 'model file', sha256: 'm1' }, { path: 'outline.csv', role: 'imported file', sha256: 'c2' }] }),
      identity({ options: { levels: '4', maxDofs: '2000000' } }),
      identity({ command: 'solve' }),
      identity({ version: '0.2.0' }),
    ];
    const ids = new Set([a, ...variants.map(runIdOf)]);
    expect(ids.size).toBe(variants.length + 1);
  });
});

describe('stamps: every format keeps parsing and carries the id', () => {
  it('JSON: a first key runId, same object otherwise', () => {
    const text = JSON.stringify({ tool: 'peakwise', sites: [1, 2] }, null, 2) + '\n';
    const stamped = stampContent('study.json', text, ID) as string;
    expect(JSON.parse(stamped)).toEqual({ runId: ID, tool: 'peakwise', sites: [1, 2] });
    expect(Object.keys(JSON.parse(stamped))[0]).toBe('runId');
    expect(JSON.parse(stampContent('x.json', '{}', ID) as string)).toEqual({ runId: ID });
    expect(JSON.parse(stampContent('x.json', '{"a":1}', ID) as string)).toEqual({ runId: ID, a: 1 });
  });
  it('CSV: a first # comment line with the file\'s own line ends; our CSV reader reads the same rows', () => {
    const csv = '"x","y"\r\n1,2\r\n3,4\r\n';
    const stamped = stampContent('field.csv', csv, ID) as string;
    expect(stamped.split('\r\n')[0]).toBe(`# peakwise run ${ID}`);
    const strip = (t: ReturnType<typeof readCsv>) => ({ header: t.header, rows: t.rows.map((r) => r.values) });
    expect(strip(readCsv(stamped, 'f.csv'))).toEqual(strip(readCsv(csv, 'f.csv')));
    expect((stampContent('a.csv', 'x\n1\n', ID) as string).startsWith(`# peakwise run ${ID}\n`)).toBe(true);
    expect([...(stampContent('a.csv', ['x\r\n', '1\r\n'], ID) as Iterable<string>)].join('')).toBe(`# peakwise run ${ID}\r\nx\r\n1\r\n`);
  });
  it('HTML: a meta tag after the charset (same tag style) and a visible line in the footer', () => {
    const xhtml = '<!DOCTYPE html>\n<html>\n<head>\n<meta charset="utf-8"/>\n<title>t</title>\n</head>\n<body><footer><p>made</p></footer>\n</body>\n</html>\n';
    const s = stampContent('report.html', xhtml, ID) as string;
    expect(s).toContain(`<meta charset="utf-8"/>\n<meta name="peakwise-run" content="${ID}"/>\n<title>`);
    expect(s).toMatch(new RegExp(`<p>made</p><p class="small">Result set peakwise run ${ID}: .*run\\.json.*</p></footer>`));
    const html = '<html><head><meta charset="utf-8"><title>t</title></head><body>x</body></html>';
    const h = stampContent('sweep.html', html, ID) as string;
    expect(h).toContain(`<meta charset="utf-8"><meta name="peakwise-run" content="${ID}">`);
    expect(h).toMatch(/peakwise run [0-9a-f]{64}: .*<\/p><\/body>/);
  });
  it('SVG: a comment before the root element (after an XML declaration); Matrix Market: a % line after the header', () => {
    expect(stampContent('m.svg', '<svg xmlns="http://www.w3.org/2000/svg"/>', ID)).toBe(`<!-- peakwise run ${ID} -->\n<svg xmlns="http://www.w3.org/2000/svg"/>`);
    expect(stampContent('m.svg', '<?xml version="1.0"?>\n<svg/>', ID)).toBe(`<?xml version="1.0"?>\n<!-- peakwise run ${ID} -->\n<svg/>`);
    const mm = ['%%MatrixMarket matrix coord', 'inate real symmetric\n2 2 1\n', '1 1 4\n'];
    expect([...(stampContent('K.mtx', mm, ID) as Iterable<string>)].join('')).toBe(`%%MatrixMarket matrix coordinate real symmetric\n% peakwise run ${ID}\n2 2 1\n1 1 4\n`);
  });
  it('stampOfFile reads the id back from every format', () => {
    const dir = tmp('stamps');
    const files: Record<string, string> = {
      'a.json': '{\n  "x": 1\n}\n', 'a.csv': 'x\r\n1\r\n', 'a.html': '<html><head><meta charset="utf-8"/></head><body></body></html>',
      'a.svg': '<svg/>', 'a.mtx': '%%MatrixMarket matrix array real general\n1 1\n1\n',
    };
    for (const [name, text] of Object.entries(files)) {
      const stamped = stampContent(name, text, ID);
      writeFileSync(join(dir, name), typeof stamped === 'string' ? stamped : [...stamped].join(''));
      expect(stampOfFile(join(dir, name)), name).toBe(ID);
    }
    writeFileSync(join(dir, 'plain.csv'), 'x\n1\n');
    expect(stampOfFile(join(dir, 'plain.csv'))).toBeUndefined();
  });
});

function inputsIn(dir: string): { model: string; inputs: InputFile[] } {
  mkdirSync(join(dir, 'models'), { recursive: true });
  mkdirSync(join(dir, 'data'), { recursive: true });
  const model = join(dir, 'models', 'plate.yaml');
  writeFileSync(model, 'title: t\n');
  writeFileSync(join(dir, 'data', 'outline.csv'), 'x,y\n');
  return { model, inputs: [inputFile(model, 'model file', 'title: t\n'), inputFile(join(dir, 'data', 'outline.csv'), 'imported file', 'x,y\n')] };
}

describe('folder rules on real paths', () => {
  it('a link to the models folder, the folder of an imported file, a result name linked to an input, /proc: all refused', () => {
    const dir = tmp('rules');
    const { model, inputs } = inputsIn(dir);
    symlinkSync(join(dir, 'models'), join(dir, 'out-link'));
    expect(message(() => checkOutFolder(join(dir, 'out-link'), inputs, model))).toContain(`refusing to write results into the models folder ${join(dir, 'models')} (${join(dir, 'out-link')} leads there through a link)`);
    expect(message(() => checkOutFolder(join(dir, 'data'), inputs, model))).toContain('refusing to write results into the folder that holds the imported file');
    mkdirSync(join(dir, 'res'));
    symlinkSync(join(dir, 'data', 'outline.csv'), join(dir, 'res', 'sites.csv'));
    expect(message(() => checkOutFolder(join(dir, 'res'), inputs, model))).toContain('sites.csv: refusing to overwrite the input file');
    expect(message(() => checkOutFolder('/proc/self/out', inputs, model))).toContain('refusing to write there: /proc');
    expect(checkOutFolder(join(dir, 'results', 'new'), inputs, model)).toBe(join(dir, 'results', 'new'));
  });
});

function open(dir: string, id: RunIdentity = identity(), notes: string[] = []) {
  return openOutputSet({ outDir: dir, identity: id, inputs: [], notice: (l) => notes.push(l) });
}

describe('the life of a result set', () => {
  it('finish writes run.json last, listing the stamped files; the folder is complete', () => {
    const dir = join(tmp('life'), 'out');
    const set = open(dir);
    expect(existsSync(join(dir, LOCK_NAME))).toBe(true);
    set.write('study.json', '{\n  "a": 1\n}\n');
    // writes through the ordinary writer into the folder become files of the set
    writeFileAtomic(join(dir, 'sites.csv'), 'x\r\n1\r\n');
    expect(existsSync(join(dir, MANIFEST_NAME))).toBe(false);
    set.finish();
    const manifest = JSON.parse(readFileSync(join(dir, MANIFEST_NAME), 'utf8')) as { runId: string; files: string[] };
    expect(manifest.runId).toBe(set.runId);
    expect(manifest.files).toEqual(['sites.csv', 'study.json']);
    expect(stampOfFile(join(dir, 'sites.csv'))).toBe(set.runId);
    const state = inspectFolder(dir);
    expect(state.kind).toBe('complete');
    expect(existsSync(join(dir, LOCK_NAME))).toBe(false);
    expect(readdirSync(dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
  });

  it('a run killed while writing leaves no manifest: the next run and inspectFolder say the folder is incomplete', () => {
    const dir = join(tmp('kill'), 'out');
    const first = open(dir);
    first.write('study.json', '{"a":1}');
    first.write('sites.csv', 'x\n1\n');
    first.finish();
    // a second, different run writes one file and is "killed": neither finished nor abandoned
    const second = open(dir, identity({ options: { levels: '5' } }));
    second.write('study.json', '{"a":2}');
    expect(existsSync(join(dir, MANIFEST_NAME))).toBe(false); // removed before the first file
    const state = inspectFolder(dir);
    expect(state.kind).toBe('incomplete');
    expect(state.problems.join('; ')).toContain('no run.json');
    expect(state.problems.join('; ')).toContain('the files come from 2 different runs');
    closeOutputSets('failed'); // (the lock of the "killed" run: a dead process's lock is tested in inputs-lock.test.ts)
    const notes: string[] = [];
    const third = open(dir, identity(), notes);
    expect(notes.join('\n')).toContain(`${dir} holds an incomplete result set (no run.json`);
    third.write('study.json', '{"a":1}');
    third.write('sites.csv', 'x\n1\n');
    third.finish();
    expect(inspectFolder(dir).kind).toBe('complete');
  });

  it('a manifest whose files are missing or from another run is incomplete too', () => {
    const dir = join(tmp('mismatch'), 'out');
    const set = open(dir);
    set.write('study.json', '{"a":1}');
    set.write('sites.csv', 'x\n1\n');
    set.finish();
    writeFileSync(join(dir, 'sites.csv'), stampContent('sites.csv', 'x\n2\n', 'b'.repeat(64)) as string);
    let state = inspectFolder(dir);
    expect(state.kind).toBe('incomplete');
    expect(state.problems[0]).toMatch(/^sites\.csv is from run bbbbbbbbbbbb, not run [0-9a-f]{12}$/);
    writeFileSync(join(dir, 'sites.csv'), 'x\n2\n'); // no stamp at all
    expect(inspectFolder(dir).problems[0]).toContain('sites.csv is from no run of this set');
    writeFileSync(join(dir, MANIFEST_NAME), '{ broken');
    state = inspectFolder(dir);
    expect(state.problems[0]).toBe('run.json is damaged');
  });

  it('files of the replaced set that the new run does not write are removed, with a notice', () => {
    const dir = join(tmp('replace'), 'out');
    const a = open(dir, identity({ options: { cut: '0,0:1,1' } }));
    a.write('field.csv', 'x\n1\n');
    a.write('cut.csv', 's\n0\n');
    a.finish();
    writeFileSync(join(dir, 'notes.txt'), 'the user\'s own file');
    const notes: string[] = [];
    const b = open(dir, identity(), notes);
    b.write('field.csv', 'x\n1\n');
    b.finish();
    expect(existsSync(join(dir, 'cut.csv'))).toBe(false);
    expect(existsSync(join(dir, 'notes.txt'))).toBe(true);
    expect(notes.join('\n')).toMatch(/replaces run [0-9a-f]{12}'s; removed its cut\.csv, which this run does not write/);
    expect(inspectFolder(dir).kind).toBe('complete');
  });

  it('identical runs write byte-identical files and manifests', () => {
    const write = (dir: string) => {
      const s = open(dir);
      s.write('study.json', '{"v":1}');
      s.write('report.html', '<html><head><meta charset="utf-8"/></head><body><footer></footer></body></html>');
      s.finish();
      return ['study.json', 'report.html', MANIFEST_NAME].map((f) => readFileSync(join(dir, f), 'utf8'));
    };
    expect(write(join(tmp('det-a'), 'o'))).toEqual(write(join(tmp('det-b'), 'o')));
  });

  it('a run that fails before writing leaves no folder it made, and frees the lock', () => {
    const base = tmp('fail');
    const set = open(join(base, 'a', 'b'));
    expect(existsSync(join(base, 'a', 'b', LOCK_NAME))).toBe(true);
    set.abandon();
    expect(existsSync(join(base, 'a'))).toBe(false);
    // an existing folder stays, and its earlier complete set is untouched
    const dir = join(base, 'kept');
    const good = open(dir);
    good.write('field.csv', 'x\n1\n');
    good.finish();
    const before = readFileSync(join(dir, MANIFEST_NAME), 'utf8');
    open(dir, identity({ command: 'solve' })).abandon();
    expect(readFileSync(join(dir, MANIFEST_NAME), 'utf8')).toBe(before);
    expect(inspectFolder(dir).kind).toBe('complete');
  });

  it('a second set in the same folder at once is refused (the lock)', () => {
    const dir = join(tmp('twice'), 'out');
    open(dir);
    expect(message(() => open(dir))).toContain('is writing into this folder');
  });
});
