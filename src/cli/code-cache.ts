/**
 * A CommonJS file compiled with V8's code cache (`vm.Script` with `cachedData`): the bytecode of
 * every function the last run compiled is kept, so the next run neither parses nor compiles them
 * again. Node 20 has no such cache for ES modules (`module.enableCompileCache` came in 22.1); the
 * bundle's study/solve worker is built as one CommonJS file for this (docs/speed.md, "Start-up").
 *
 * Safety: cached data is code. It is kept only in a folder of this user's own — `peakwise-code-cache-<uid>`
 * in the OS temporary folder, made with mode 0700 — and used only when that folder is a real
 * directory (not a link) owned by this user and closed to everyone else, and the file is a regular
 * file owned by this user. The file is named by the SHA-256 of the source text, the Node version and
 * the architecture (V8's own check looks at the source's length, its version and flags, and rejects
 * data that does not match: `script.cachedDataRejected`); rejected data is replaced. Written atomically (temporary file,
 * then rename); the folder keeps the newest KEEP_FILES (other builds, other Node versions), older
 * ones are removed. Every failure of the cache falls back to a plain compile; nothing is reported.
 * `PEAKWISE_CODE_CACHE=0` turns it off. Not on Windows (no owner check there).
 */
import { createHash } from 'node:crypto';
import { lstatSync, mkdirSync, readFileSync, readdirSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import Module, { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { Script } from 'node:vm';
import { threadId } from 'node:worker_threads';

/** Cache files kept per user: a few builds or Node versions used in turn each keep theirs. */
export const KEEP_FILES = 4;

export interface LoadedCommonJs {
  /** the file's `module.exports` */
  exports: unknown;
  /** true when V8 took the cached data (false: none, rejected, or the cache is off) */
  fromCache: boolean;
  /** Write the code cache of what has run so far, when there was none or it was rejected. */
  saveCache(): void;
}

/** This user's cache folder, made if missing; undefined when it cannot be trusted or made. */
export function trustedCacheDir(dir = defaultCacheDir()): string | undefined {
  if (process.platform === 'win32' || typeof process.getuid !== 'function') return undefined;
  try {
    mkdirSync(dir, { mode: 0o700 });
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code !== 'EEXIST') return undefined;
  }
  try {
    const st = lstatSync(dir);
    if (!st.isDirectory() || st.uid !== process.getuid() || (st.mode & 0o077) !== 0) return undefined;
    return dir;
  } catch {
    return undefined;
  }
}

function defaultCacheDir(): string {
  return join(tmpdir(), `peakwise-code-cache-${process.getuid?.() ?? 'user'}`);
}

/** The cached data in `file`, when it is a regular file of this user's. */
function readOwnFile(file: string): Buffer | undefined {
  try {
    const st = lstatSync(file);
    if (!st.isFile() || st.uid !== process.getuid?.()) return undefined;
    return readFileSync(file);
  } catch {
    return undefined;
  }
}

/** Remove all but the newest KEEP_FILES cache files of `dir`. */
function pruneCache(dir: string): void {
  const files = readdirSync(dir).filter((n) => n.endsWith('.v8')).map((n) => ({ n, t: statSync(join(dir, n)).mtimeMs }));
  files.sort((a, b) => b.t - a.t);
  for (const { n } of files.slice(KEEP_FILES)) rmSync(join(dir, n), { force: true });
}

/** Compile and run the CommonJS `file`, from and for the code cache in `cacheDir` (default: this user's). */
export function loadCommonJs(file: string, cacheDir?: string): LoadedCommonJs {
  const source = readFileSync(file, 'utf8');
  const dir = process.env.PEAKWISE_CODE_CACHE === '0' ? undefined : trustedCacheDir(cacheDir);
  const key = createHash('sha256').update(`${process.version}\0${process.arch}\0`).update(source).digest('hex');
  const cacheFile = dir === undefined ? undefined : join(dir, `${key}.v8`);
  const cachedData = cacheFile === undefined ? undefined : readOwnFile(cacheFile);
  const script = new Script(Module.wrap(source), { filename: file, cachedData });
  const fromCache = cachedData !== undefined && script.cachedDataRejected === false;
  const module = { exports: {} as unknown };
  const run = script.runInThisContext() as (exports: unknown, require: NodeJS.Require, module: unknown, filename: string, dirname: string) => void;
  run.call(module.exports, module.exports, createRequire(file), module, file, dirname(file));
  let saved = false;
  return {
    exports: module.exports,
    fromCache,
    saveCache(): void {
      if (cacheFile === undefined || fromCache || saved) return;
      saved = true;
      const tmp = `${cacheFile}.${process.pid}-${threadId}.tmp`;
      try {
        writeFileSync(tmp, script.createCachedData(), { mode: 0o600, flag: 'wx' });
        renameSync(tmp, cacheFile);
        pruneCache(dir!);
      } catch {
        rmSync(tmp, { force: true });
      }
    },
  };
}
