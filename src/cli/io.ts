import { mkdirSync, readFileSync, renameSync, rmSync, writeFileSync, openSync, writeSync, closeSync, realpathSync, existsSync } from 'node:fs';
import { basename, dirname, extname, join, resolve, sep } from 'node:path';
import { PeakwiseError } from '../errors.js';

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
 * Output folder rules (nothing lost): the folder may not be the folder that holds the model
 * file (or any `models` folder), and no output may have the same path as the input.
 */
export function prepareOutDir(outDir: string, modelFile: string): string {
  const out = resolve(outDir);
  const modelDir = dirname(resolve(modelFile));
  if (out === modelDir || basename(out) === 'models') {
    throw new PeakwiseError('usage', `--out ${outDir}: refusing to write results into the models folder ${modelDir}; choose another folder, e.g. out/${modelName(modelFile)}`);
  }
  try {
    mkdirSync(out, { recursive: true });
  } catch (e) {
    throw new PeakwiseError('io', `--out ${outDir}: cannot create the folder (${(e as NodeJS.ErrnoException).code ?? 'error'})`);
  }
  return out;
}

function samePath(a: string, b: string): boolean {
  try {
    return realpathSync(a) === realpathSync(b);
  } catch {
    return resolve(a) === resolve(b);
  }
}

/**
 * Write a file atomically: the text goes to a temporary file in the same folder, which is then
 * renamed over the target, so a reader never sees a partial file and a crash never destroys a
 * complete earlier one. Refuses to overwrite the model file.
 */
export function writeFileAtomic(path: string, content: string | Iterable<string>, protect: string[] = []): void {
  for (const p of protect) {
    if (existsSync(path) && samePath(path, p)) throw new PeakwiseError('io', `${path}: refusing to overwrite the input file`);
  }
  mkdirSync(dirname(resolve(path)), { recursive: true });
  const tmp = join(dirname(resolve(path)), `.${basename(path)}.${process.pid}.tmp`);
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
    throw new PeakwiseError('io', `${path}: cannot write (${(e as NodeJS.ErrnoException).code ?? String(e)})`);
  }
}

export const pathSep = sep;
