/**
 * Every file a run reads: the model file and the files it refers to (imported outlines, SVG
 * drawings, displacement tables). The model stage is free of I/O and reads through the `readFile`
 * it is handed; `modelInputReader` is that reader, and it keeps a record of what it read (real
 * path, device and inode, SHA-256 of the bytes). The record serves two rules: no output may be
 * written onto any of these files (compared by real path and by inode, so symbolic and hard links
 * are seen through), and the run id of a result set is derived from their bytes.
 */
import { createHash } from 'node:crypto';
import { readFileSync, realpathSync, statSync } from 'node:fs';
import { dirname, isAbsolute, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { PeakwiseError } from '../errors.js';
import { realPathOf } from './real-path.js';

export interface InputFile {
  /** the path as the user or the model wrote it */
  path: string;
  /** what the file is, for messages: 'model file', 'imported file', 'verification record' */
  role: string;
  /** absolute real path (links resolved) */
  real: string;
  dev: number;
  ino: number;
  /** SHA-256 of the bytes, hex */
  sha256: string;
}

export function sha256Hex(data: string | Uint8Array): string {
  return createHash('sha256').update(data).digest('hex');
}

/** The record of a file that has been read (`bytes` as read, so the hash is of what was used). */
export function inputFile(path: string, role: string, bytes: string | Uint8Array): InputFile {
  let real = resolve(path);
  let dev = -1, ino = -1;
  try {
    real = realpathSync(path);
    const st = statSync(real);
    dev = st.dev;
    ino = st.ino;
  } catch {
    // read but gone since: keep the resolved path
  }
  return { path, role, real, dev, ino, sha256: sha256Hex(bytes) };
}

/**
 * A `readFile` for parseModel: paths as written in the model, relative to the model file's
 * folder. Each file read is added to `inputs` once.
 */
export function modelInputReader(modelFile: string): { readFile: (path: string) => string; inputs: InputFile[] } {
  const inputs: InputFile[] = [];
  const readFile = (path: string): string => {
    const full = isAbsolute(path) ? path : join(dirname(modelFile), path);
    const bytes = readFileSync(full);
    const record = inputFile(full, 'imported file', bytes);
    record.path = path;
    if (!inputs.some((f) => f.real === record.real)) inputs.push(record);
    noteInput(record);
    return bytes.toString('utf8');
  };
  return { readFile, inputs };
}

/**
 * The verification record every report reads (docs/verification.json of the package), relative to
 * this code's file: tsc's dist/cli/ and the bundle's dist/bundle/ sit at the same depth
 * (DEVELOPERS.md, "Build").
 */
export const VERIFICATION_RECORD = fileURLToPath(new URL('../../docs/verification.json', import.meta.url));

/**
 * The inputs of this process's run. The CLI runs one command per process, so one list; every
 * output write is checked against it (`refuseInputTarget`).
 */
const runInputs: InputFile[] = [];

export function noteInput(file: InputFile): void {
  if (!runInputs.some((f) => f.real === file.real && f.role === file.role)) runInputs.push(file);
}

export function inputsOfRun(): readonly InputFile[] {
  return runInputs;
}

/** Forget the inputs noted so far (tests; `study --watch` before each rerun: new bytes, new run id). */
export function clearInputs(): void {
  runInputs.length = 0;
}

/** The input that `target` would overwrite (same real path, or same inode), if any. */
export function inputAt(target: string, inputs: readonly InputFile[] = runInputs): InputFile | undefined {
  const real = realPathOf(target);
  let dev = -2, ino = -2;
  try {
    const st = statSync(real);
    dev = st.dev;
    ino = st.ino;
  } catch {
    // does not exist yet: only the path can match (an input that vanished since it was read)
  }
  return inputs.find((f) => f.real === real || (f.ino >= 0 && f.dev === dev && f.ino === ino));
}

/**
 * Refuse to write `target` when it is one of the inputs. `what` names the target in the message
 * (an option such as `--svg`, or the file name). Extra paths (e.g. the model file when it has
 * not been noted) can be passed in `alsoProtect`, extra records in `alsoInputs`.
 */
export function refuseInputTarget(target: string, what: string, alsoProtect: readonly string[] = [], alsoInputs: readonly InputFile[] = []): void {
  const extra: InputFile[] = [...alsoInputs];
  for (const p of [...alsoProtect, VERIFICATION_RECORD]) {
    try {
      const real = realpathSync(p);
      const st = statSync(real);
      extra.push({ path: p === VERIFICATION_RECORD ? 'docs/verification.json (the verification record)' : p, role: 'input file', real, dev: st.dev, ino: st.ino, sha256: '' });
    } catch {
      // a protected path that does not exist cannot be overwritten
    }
  }
  const hit = inputAt(target, [...runInputs, ...extra]);
  if (hit) {
    const real = realPathOf(target);
    const notes: string[] = [];
    if (hit.role === 'imported file') notes.push('read by the model');
    if (real !== hit.real) notes.push(`${target} is a hard link to it`);
    else if (resolve(target) !== hit.real) notes.push(`${target} leads to ${hit.real} through a link`);
    const why = notes.length ? ` (${notes.join('; ')})` : '';
    throw new PeakwiseError('io', `${what}: refusing to overwrite the input file ${hit.path}${why}; an input is never written, choose another name`);
  }
}
