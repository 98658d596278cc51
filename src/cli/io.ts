import { readFileSync, renameSync, rmSync, writeFileSync, openSync, writeSync, closeSync } from 'node:fs';
import { basename, dirname, extname, join, resolve, sep } from 'node:path';
import { PeakwiseError } from '../errors.js';
import { refuseInputTarget } from './inputs.js';
import { errnoWords, makeFolders } from './real-path.js';

/** Read a model file, with a clear message when it is missing or unreadable. */
export function readModelText(file: string): string {
  try {
    return readFileSync(file, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder, not a model file' : `cannot be read (${code ?? 'unknown error'})`;
    throw new PeakwiseError('io', `${file}: ${why}`);
  }
}

/** Model name for the default output folder: file name without extension. */
export function modelName(file: string): string {
  return basename(file, extname(file));
}

/**
 * Writes into a result folder go through its output set (src/cli/output-set.ts), which stamps
 * each file with the run id and lists it in the manifest. The set registers itself here, so no
 * code path can write into an open result folder behind its back.
 */
export type ClaimedWrite = (path: string, content: string | Iterable<string>) => boolean;
let claimedWrite: ClaimedWrite | undefined;
export function setClaimedWrite(hook: ClaimedWrite | undefined): void {
  claimedWrite = hook;
}

/**
 * Write an output file: refused when it would overwrite any input of the run (the model file,
 * the files it imports, the verification record, and `protect`), compared by real path and
 * inode; handed to the output set when it lies in an open result folder; else written
 * atomically (`writeAtomic`).
 */
export function writeFileAtomic(path: string, content: string | Iterable<string>, protect: string[] = []): void {
  refuseInputTarget(path, path, protect);
  if (claimedWrite?.(path, content)) return;
  writeAtomic(path, content);
}

/**
 * Write a file atomically: the text goes to a temporary file in the same folder, which is then
 * renamed over the target, so a reader never sees a partial file and a crash never destroys a
 * complete earlier one. The folder is made if missing (bounded, never under /proc, /sys, /dev).
 */
export function writeAtomic(path: string, content: string | Iterable<string>): void {
  const dir = dirname(resolve(path));
  makeFolders(dir, path);
  const tmp = join(dir, `.${basename(path)}.${process.pid}.tmp`);
  try {
    if (typeof content === 'string') {
      writeFileSync(tmp, content);
    } else {
      const fd = openSync(tmp, 'w');
      try {
        for (const chunk of content) writeSync(fd, chunk);
      } finally {
        closeSync(fd);
      }
    }
    renameSync(tmp, path);
  } catch (e) {
    rmSync(tmp, { force: true });
    if (e instanceof PeakwiseError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    throw new PeakwiseError('io', `${path}: cannot write: ${code ? errnoWords(code) : String(e)}`);
  }
}

export const pathSep = sep;
