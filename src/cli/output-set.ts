/**
 * A result folder (`--out`) holds one result set: the files of one run, each carrying the run's
 * id, listed in a manifest `run.json` written last. The life of a set:
 *
 *   open    folder rules (no pseudo-file system, not the folder of an input, real paths), the
 *           folder made if missing (bounded), `run.lock` taken, the earlier content inspected: a
 *           folder without a matching manifest is reported as incomplete;
 *   write   the first write removes the old manifest; each file is stamped with the run id and
 *           written atomically;
 *   finish  files of the replaced set that this run did not write again are removed, the new
 *           manifest is written, the lock released;
 *   abandon (the run failed) the lock released; a folder the run made and left empty is removed.
 *
 * So a run killed at any moment (even SIGKILL) leaves either the old complete set, or files
 * without a manifest, which the next run and `peakwise results <folder>` report as incomplete.
 *
 * The run id is the SHA-256 of a canonical text of what determines the results: command, model
 * path, the bytes of every input (model file and imported files), the options that change results,
 * and the version — so identical runs write identical files. Stamps: JSON a first key `"runId"`;
 * CSV a first comment line `# peakwise run <id>` (our own CSV reader, numpy and pandas with
 * `comment='#'` skip it); HTML a `<meta name="peakwise-run">` in the head and a line in the
 * footer; SVG a comment before the root element; Matrix Market a `%` comment after the header.
 */
import { openSync, readSync, closeSync, readFileSync, readdirSync, rmSync, statSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { PeakwiseError } from '../errors.js';
import { VERSION } from '../version.js';
import { inputAt, refuseInputTarget, sha256Hex, type InputFile } from './inputs.js';
import { setClaimedWrite, writeAtomic } from './io.js';
import { acquireLock, LOCK_NAME, releaseLock, type HeldLock } from './lock.js';
import { errnoWords, makeFolders, pseudoFileSystemReason, realPathOf, removeEmptyFolders, type FolderLimits } from './real-path.js';

export const MANIFEST_NAME = 'run.json';

/** Names our commands write into a result folder (files of an older version carry no stamp). */
export const RESULT_NAMES: readonly string[] = ['study.json', 'sites.csv', 'field.csv', 'report.html', 'cut.csv', 'sweep.csv', 'sweep.html', 'sweep.json'];

/** Options that change no result: where results go, how the terminal looks, how many threads, watching and serving. */
const NEUTRAL_OPTIONS: ReadonlySet<string> = new Set(['out', 'json', 'quiet', 'color', 'jobs', 'watch', 'port']);

export interface RunIdentity {
  command: string;
  /** the model file as given on the command line */
  model: string;
  inputs: readonly Pick<InputFile, 'path' | 'role' | 'sha256'>[];
  /** command-line options (neutral ones are dropped by runIdOf) */
  options: Readonly<Record<string, unknown>>;
  version?: string;
}

/** JSON with object keys sorted at every level: one text for one value. */
export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const keys = Object.keys(value).filter((k) => (value as Record<string, unknown>)[k] !== undefined).sort();
    return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson((value as Record<string, unknown>)[k])}`).join(',')}}`;
  }
  return JSON.stringify(value) ?? 'null';
}

/** The options that change results, keys sorted. */
export function resultOptions(options: Readonly<Record<string, unknown>>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const k of Object.keys(options).sort()) {
    if (!NEUTRAL_OPTIONS.has(k) && options[k] !== undefined) out[k] = options[k];
  }
  return out;
}

/** The canonical text a run id is the hash of. */
export function runIdentityText(id: RunIdentity): string {
  const inputs = id.inputs.map((f) => ({ path: f.path, role: f.role, sha256: f.sha256 }));
  return canonicalJson({ tool: 'peakwise', version: id.version ?? VERSION, command: id.command, model: id.model, inputs, options: resultOptions(id.options) });
}

/** Run id: SHA-256 (hex) of the canonical identity text. */
export function runIdOf(id: RunIdentity): string {
  return sha256Hex(runIdentityText(id));
}

/** Finds the run id in the first bytes of any stamped file (and in run.json). */
export const STAMP_PATTERN = /(?:peakwise run |name="peakwise-run" content="|"runId": ?")([0-9a-f]{64})/;

function joinChunks(content: string | Iterable<string>): string {
  return typeof content === 'string' ? content : [...content].join('');
}

/** Yields the chunks with `line` inserted after the first line (Matrix Market header). */
function* afterFirstLine(chunks: Iterable<string>, line: string): Generator<string> {
  let done = false;
  let head = '';
  for (const c of chunks) {
    if (done) {
      yield c;
      continue;
    }
    head += c;
    const nl = head.indexOf('\n');
    if (nl >= 0) {
      yield head.slice(0, nl + 1) + line + '\n' + head.slice(nl + 1);
      done = true;
    }
  }
  if (!done) yield head + (head === '' ? '' : '\n') + line + '\n';
}

/** `content` with the run id stamped in the way its format allows (see the module note). */
export function stampContent(name: string, content: string | Iterable<string>, runId: string): string | Iterable<string> {
  const ext = name.slice(name.lastIndexOf('.') + 1).toLowerCase();
  const plainStamp = `peakwise run ${runId}`;
  switch (ext) {
    case 'json': {
      const text = joinChunks(content);
      const m = /^\{(\s*)/.exec(text);
      if (!m) return text;
      const ws = m[1];
      const rest = text.slice(m[0].length);
      const sep = rest.startsWith('}') ? (ws.includes('\n') ? '\n' : '') : `,${ws}`;
      return `{${ws}"runId": ${JSON.stringify(runId)}${sep}${rest}`;
    }
    case 'csv': {
      if (typeof content === 'string') {
        const eol = /\r\n/.test(content.slice(0, 4096)) ? '\r\n' : '\n';
        return `# ${plainStamp}${eol}${content}`;
      }
      return (function* () {
        yield `# ${plainStamp}\r\n`;
        yield* content;
      })();
    }
    case 'html':
    case 'htm': {
      let text = joinChunks(content);
      const charset = /<meta charset[^>]*>\n?/i.exec(text) ?? /<head[^>]*>\n?/i.exec(text);
      const close = charset && /\/>\n?$/.test(charset[0]) ? '/>' : '>';
      const meta = `<meta name="peakwise-run" content="${runId}"${close}`;
      if (charset) {
        const at = charset.index + charset[0].length;
        text = text.slice(0, at) + meta + (charset[0].endsWith('\n') ? '\n' : '') + text.slice(at);
      } else {
        text = meta + '\n' + text;
      }
      const line = `<p class="small">Result set ${plainStamp}: the files of this set are listed in ${MANIFEST_NAME} beside this page.</p>`;
      const footer = text.lastIndexOf('</footer>');
      const body = text.lastIndexOf('</body>');
      const at = footer >= 0 ? footer : body >= 0 ? body : text.length;
      return text.slice(0, at) + line + text.slice(at);
    }
    case 'svg': {
      const text = joinChunks(content);
      const decl = /^<\?xml[^>]*\?>\n?/.exec(text);
      const at = decl ? decl[0].length : 0;
      return `${text.slice(0, at)}${decl && !decl[0].endsWith('\n') ? '\n' : ''}<!-- ${plainStamp} -->\n${text.slice(at)}`;
    }
    case 'mtx':
      return typeof content === 'string' ? [...afterFirstLine([content], `% ${plainStamp}`)].join('') : afterFirstLine(content, `% ${plainStamp}`);
    default:
      return content;
  }
}

/** Formats stampContent marks; other files are listed in the manifest but carry no id. */
export function isStampable(name: string): boolean {
  return /\.(json|csv|html?|svg|mtx)$/i.test(name);
}

/** The run id a file carries (read from its first 4 KB), or undefined. */
export function stampOfFile(path: string): string | undefined {
  let fd: number | undefined;
  try {
    fd = openSync(path, 'r');
    const buf = Buffer.alloc(4096);
    const n = readSync(fd, buf, 0, buf.length, 0);
    return STAMP_PATTERN.exec(buf.subarray(0, n).toString('utf8'))?.[1];
  } catch {
    return undefined;
  } finally {
    if (fd !== undefined) closeSync(fd);
  }
}

export interface Manifest {
  runId: string;
  tool: string;
  version: string;
  command: string;
  model: string;
  inputs: { file: string; role: string; sha256: string }[];
  options: Record<string, unknown>;
  files: string[];
  interrupted?: boolean;
}

export function manifestText(id: RunIdentity, runId: string, files: readonly string[], interrupted: boolean): string {
  const m: Manifest = {
    runId,
    tool: 'peakwise',
    version: id.version ?? VERSION,
    command: id.command,
    model: id.model,
    inputs: id.inputs.map((f) => ({ file: f.path, role: f.role, sha256: f.sha256 })),
    options: resultOptions(id.options),
    files: [...files].sort(),
    ...(interrupted ? { interrupted: true } : {}),
  };
  return JSON.stringify(m, null, 2) + '\n';
}

export interface FolderState {
  /** none: no result files at all; complete: a manifest whose files all carry its id */
  kind: 'none' | 'complete' | 'incomplete';
  /** the manifest's run id */
  runId?: string;
  command?: string;
  interrupted?: boolean;
  /** the manifest's files, or (without one) the result files found */
  files: string[];
  /** why the set is incomplete */
  problems: string[];
  /** result files that are not part of the manifest's set */
  others: string[];
}

const short = (id: string | undefined): string => (id ? id.slice(0, 12) : 'none');

/** What a result folder holds now: one complete set, an incomplete one, or none. */
export function inspectFolder(dir: string): FolderState {
  let names: string[];
  try {
    names = readdirSync(dir);
  } catch {
    return { kind: 'none', files: [], problems: [], others: [] };
  }
  const files = names.filter((n) => {
    if (n.startsWith('.') || n === LOCK_NAME || n === MANIFEST_NAME) return false;
    try {
      return statSync(join(dir, n)).isFile();
    } catch {
      return false;
    }
  });
  const stamps = new Map(files.map((f) => [f, stampOfFile(join(dir, f))]));
  const ours = files.filter((f) => stamps.get(f) !== undefined || RESULT_NAMES.includes(f)).sort();
  const manifestPath = join(dir, MANIFEST_NAME);
  let manifest: Manifest | undefined;
  let damaged = false;
  try {
    const m = JSON.parse(readFileSync(manifestPath, 'utf8')) as Manifest;
    if (typeof m.runId === 'string' && Array.isArray(m.files) && m.files.every((f) => typeof f === 'string')) manifest = m;
    else damaged = true;
  } catch (e) {
    damaged = (e as NodeJS.ErrnoException).code !== 'ENOENT';
  }
  if (!manifest) {
    if (ours.length === 0 && !damaged) return { kind: 'none', files: [], problems: [], others: [] };
    const ids = new Set([...stamps.values()].filter((v) => v !== undefined));
    const problems = [damaged ? `${MANIFEST_NAME} is damaged` : `no ${MANIFEST_NAME}: an earlier run stopped before it finished writing`];
    if (ids.size > 1) problems.push(`the files come from ${ids.size} different runs`);
    return { kind: 'incomplete', files: ours, problems, others: [] };
  }
  const problems: string[] = [];
  for (const f of manifest.files) {
    if (!files.includes(f)) problems.push(`${f} is missing`);
    else if (isStampable(f) && stamps.get(f) !== manifest.runId) problems.push(`${f} is from ${stamps.get(f) ? `run ${short(stamps.get(f))}` : 'no run of this set'}, not run ${short(manifest.runId)}`);
  }
  const others = ours.filter((f) => !manifest.files.includes(f));
  return {
    kind: problems.length ? 'incomplete' : 'complete',
    runId: manifest.runId,
    command: manifest.command,
    ...(manifest.interrupted ? { interrupted: true } : {}),
    files: [...manifest.files],
    problems,
    others,
  };
}

/** Why `outDir` may not hold results, checked on real paths; throws a usage error. */
export function checkOutFolder(outDir: string, inputs: readonly InputFile[], modelFile?: string): string {
  const real = realPathOf(outDir);
  const what = `--out ${outDir}`;
  const pseudo = pseudoFileSystemReason(real);
  if (pseudo !== undefined) throw new PeakwiseError('usage', `${what}: refusing to write there: ${pseudo}; choose a folder on a disk`);
  const via = real !== resolve(outDir) ? ` (${outDir} leads there through a link)` : '';
  const model = modelFile !== undefined ? inputAt(modelFile, inputs) ?? { real: realPathOf(modelFile), path: modelFile } : undefined;
  if (model && (real === dirname(model.real) || basename(real) === 'models' || basename(resolve(outDir)) === 'models')) {
    const name = basename(modelFile!).replace(/\.[^.]*$/, '');
    throw new PeakwiseError('usage', `${what}: refusing to write results into the models folder ${real === dirname(model.real) ? dirname(model.real) : real}${via}; choose another folder, e.g. out/${name}`);
  }
  for (const f of inputs) {
    if (dirname(f.real) === real) {
      throw new PeakwiseError('usage', `${what}: refusing to write results into the folder that holds the ${f.role} ${f.path}${via}; choose another folder`);
    }
  }
  try {
    if (!statSync(real).isDirectory()) throw new PeakwiseError('usage', `${what}: is a file, not a folder`);
  } catch (e) {
    if (e instanceof PeakwiseError) throw e;
  }
  // a result name in the folder that leads to an input (a link): refused now, not after the work
  for (const name of [...RESULT_NAMES, MANIFEST_NAME, LOCK_NAME]) refuseInputTarget(join(real, name), `--out ${outDir}: ${name}`, [], inputs);
  return real;
}

/**
 * An explicit output file (--svg, --export-matrix, --export-load, check --report), checked before
 * any work: not an input of the run (real path, inode), not on a pseudo-file system, not a folder.
 */
export function checkTargetFile(target: string, what: string): void {
  refuseInputTarget(target, what);
  const real = realPathOf(target);
  const pseudo = pseudoFileSystemReason(real);
  if (pseudo !== undefined) throw new PeakwiseError('usage', `${what}: refusing to write there: ${pseudo}; choose a file on a disk`);
  try {
    if (statSync(real).isDirectory()) throw new PeakwiseError('usage', `${what}: is a folder; give a file name`);
  } catch (e) {
    if (e instanceof PeakwiseError) throw e;
  }
}

export interface OpenSetOptions {
  /** the folder as given (shown in messages) */
  outDir: string;
  identity: RunIdentity;
  /** every file the run has read (folder rules) */
  inputs: readonly InputFile[];
  modelFile?: string;
  /** where warnings and notices go (one line each, without the "peakwise: warning: " prefix) */
  notice: (line: string) => void;
  /** limits of folder creation (tests) */
  folders?: FolderLimits;
}

/** Test hook: SIGKILL this process after this many files of a set (the mid-write kill test). */
const KILL_AFTER = Number(process.env.PEAKWISE_TEST_KILL_AFTER_WRITES ?? NaN);

export class OutputSet {
  /** real path of the folder */
  readonly dir: string;
  /** the folder as the user gave it */
  readonly shown: string;
  readonly runId: string;
  readonly identity: RunIdentity;
  /** files written so far, in order */
  readonly written: string[] = [];
  /** what the folder held when the run began */
  readonly previous: FolderState;
  private readonly lock: HeldLock;
  private readonly created: string[];
  private readonly notice: (line: string) => void;
  private started = false;
  private closed = false;

  constructor(opts: OpenSetOptions) {
    this.shown = opts.outDir;
    this.identity = opts.identity;
    this.runId = runIdOf(opts.identity);
    this.notice = opts.notice;
    this.dir = checkOutFolder(opts.outDir, opts.inputs, opts.modelFile);
    const what = `--out ${opts.outDir}`;
    this.created = makeFolders(this.dir, what, opts.folders);
    try {
      this.lock = keptLocks.get(this.dir) ?? acquireLock(this.dir, opts.identity.command, what, opts.notice, this.created);
    } catch (e) {
      removeEmptyFolders(this.created);
      throw e;
    }
    this.previous = inspectFolder(this.dir);
    if (this.previous.kind === 'incomplete') {
      this.notice(`${opts.outDir} holds an incomplete result set (${this.previous.problems.join('; ')}); this run writes a complete one`);
    }
  }

  /** Write one file of the set (stamped, atomically); the first write removes the old manifest. */
  write(name: string, content: string | Iterable<string>): void {
    if (this.closed) throw new Error(`internal: ${name} written after the result set in ${this.shown} was closed`);
    const path = join(this.dir, name);
    refuseInputTarget(path, join(this.shown, name));
    if (!this.started) {
      this.started = true;
      try {
        rmSync(join(this.dir, MANIFEST_NAME), { force: true });
      } catch (e) {
        throw new PeakwiseError('io', `${join(this.shown, MANIFEST_NAME)}: cannot remove the old manifest: ${errnoWords((e as NodeJS.ErrnoException).code)}`);
      }
    }
    writeAtomic(path, stampContent(name, content, this.runId));
    if (!this.written.includes(name)) this.written.push(name);
    if (this.written.length === KILL_AFTER) process.kill(process.pid, 'SIGKILL');
  }

  /** The run ended with its results written: complete the set with its manifest, release the folder. */
  finish(opts: { interrupted?: boolean } = {}): void {
    if (this.closed) return;
    this.closed = true;
    try {
      if (this.written.length === 0) return;
      const prev = this.previous;
      if (prev.kind === 'complete') {
        // the replaced set's files this run did not write again (e.g. cut.csv of a run with --cut)
        const gone: string[] = [];
        for (const f of prev.files) {
          if (!this.written.includes(f) && (!isStampable(f) || stampOfFile(join(this.dir, f)) === prev.runId)) {
            rmSync(join(this.dir, f), { force: true });
            gone.push(f);
          }
        }
        if (gone.length) this.notice(`${this.shown}: this run's result set replaces run ${short(prev.runId)}'s; removed its ${gone.join(', ')}, which this run does not write`);
      }
      writeAtomic(join(this.dir, MANIFEST_NAME), manifestText(this.identity, this.runId, this.written, opts.interrupted === true));
      const now = inspectFolder(this.dir);
      if (now.others.length > 0) {
        this.notice(`${this.shown} also holds ${now.others.join(', ')}, which ${now.others.length === 1 ? 'is' : 'are'} not part of this result set (see ${MANIFEST_NAME})`);
      }
    } finally {
      this.release();
      if (this.written.length === 0) removeEmptyFolders(this.created);
    }
  }

  /** The run failed: release the folder; a folder made for it and left empty goes. */
  abandon(): void {
    if (this.closed) return;
    this.closed = true;
    this.release();
    if (this.written.length === 0) removeEmptyFolders(this.created);
    else this.notice(`${this.shown} holds an incomplete result set: the run failed after writing ${this.written.join(', ')} (no ${MANIFEST_NAME})`);
  }

  private release(): void {
    if (keptLocks.get(this.lock.dir) !== this.lock) releaseLock(this.lock);
    const i = openSets.indexOf(this);
    if (i >= 0) openSets.splice(i, 1);
    if (openSets.length === 0) setClaimedWrite(undefined);
  }
}

const openSets: OutputSet[] = [];

/** Folders whose lock this process holds across result sets (`study --watch`), by real path. */
const keptLocks = new Map<string, HeldLock>();

/**
 * Take the lock of an output folder for the life of a watching process: the folder rules checked
 * (with the model file; each run checks its own inputs again), the folder made if missing, the
 * lock taken and kept — every result set opened there meanwhile writes under it instead of taking
 * its own, and `release` (or the process's exit hook) lets it go. Returns the folder's real path.
 */
export function holdOutputFolder(outDir: string, modelFile: string, command: string, notice: (line: string) => void): { dir: string; release(): void } {
  const dir = checkOutFolder(outDir, [], modelFile);
  const what = `--out ${outDir}`;
  const created = makeFolders(dir, what);
  let lock: HeldLock;
  try {
    lock = acquireLock(dir, command, what, notice, created);
  } catch (e) {
    removeEmptyFolders(created);
    throw e;
  }
  keptLocks.set(dir, lock);
  return {
    dir,
    release: () => {
      if (keptLocks.get(dir) !== lock) return;
      keptLocks.delete(dir);
      releaseLock(lock);
      removeEmptyFolders(created);
    },
  };
}

/** Writes whose folder is an open set's folder become files of that set. */
function claimedWrite(path: string, content: string | Iterable<string>): boolean {
  const dir = realPathOf(dirname(path));
  const set = openSets.find((s) => s.dir === dir);
  if (!set) return false;
  set.write(basename(path), content);
  return true;
}

/** Open a result set in `opts.outDir` (see the module note); writes into the folder then go through it. */
export function openOutputSet(opts: OpenSetOptions): OutputSet {
  const set = new OutputSet(opts);
  openSets.push(set);
  setClaimedWrite(claimedWrite);
  return set;
}

/**
 * End every open set when the command ends: `done` and `interrupted` (results written, Ctrl-C)
 * finish them, `failed` abandons them. `failed` never throws.
 */
export function closeOutputSets(how: 'done' | 'interrupted' | 'failed'): void {
  for (const set of [...openSets]) {
    if (how === 'failed') {
      try {
        set.abandon();
      } catch {
        // the error being reported matters more
      }
    } else {
      set.finish({ interrupted: how === 'interrupted' });
    }
  }
}

/** One line per fact about a result folder, for `peakwise results`. */
export function describeFolder(shown: string, state: FolderState): { complete: boolean; lines: string[] } {
  if (state.kind === 'none') return { complete: false, lines: [`${shown}: no peakwise result set here`] };
  const lines: string[] = [];
  if (state.kind === 'complete') {
    lines.push(`${shown}: complete result set of run ${short(state.runId)} (${state.command ?? 'a run'}${state.interrupted ? ', interrupted: the finished part' : ''}), ${state.files.length} file${state.files.length === 1 ? '' : 's'}: ${state.files.join(', ')}`);
  } else {
    lines.push(`${shown}: incomplete result set: ${state.problems.join('; ')}`);
    if (state.files.length) lines.push(`  files: ${state.files.join(', ')}`);
  }
  if (state.others.length) lines.push(`  not part of the set: ${state.others.join(', ')}`);
  return { complete: state.kind === 'complete', lines };
}
