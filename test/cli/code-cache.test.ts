/**
 * V8's code cache for the bundle's CommonJS worker body (src/cli/code-cache.ts): written after the
 * first run, taken by the next, keyed by the source text (V8's own check looks only at the length),
 * rejected data replaced, and never read from a folder another user could write.
 */
import { spawnSync } from 'node:child_process';
import { chmodSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { KEEP_FILES, trustedCacheDir } from '../../src/cli/code-cache.js';
import { root } from '../helpers/bin.js';

const scratch = mkdtempSync(join(tmpdir(), 'pw-code-cache-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

let n = 0;
/** A fresh private cache folder and a CommonJS file whose `value()` returns `v` (same length for every one-digit v). */
function setup(v: number): { dir: string; file: string } {
  const base = join(scratch, `case-${n++}`);
  const dir = `${base}-cache`;
  const file = `${base}.cjs`;
  writeFileSync(file, `'use strict';\nconst sq = (x) => x * x;\nexports.value = () => sq(${v}) + 0;\n`);
  return { dir, file };
}
/**
 * Load `file` with the cache in `dir` in a fresh process, as the CLI's worker does (V8 also keeps an
 * in-memory cache per process, which would hide whether the file cache was taken), run its
 * `value()`, then save the cache.
 */
function load(file: string, dir: string, env: Record<string, string> = {}): { fromCache: boolean; value: number } {
  const mod = pathToFileURL(join(root, 'dist', 'cli', 'code-cache.js')).href;
  const script = `const { loadCommonJs } = await import(${JSON.stringify(mod)});
const l = loadCommonJs(${JSON.stringify(file)}, ${JSON.stringify(dir)});
const value = l.exports.value();
l.saveCache();
process.stdout.write(JSON.stringify({ fromCache: l.fromCache, value }));`;
  const r = spawnSync(process.execPath, ['--input-type=module', '-e', script], { encoding: 'utf8', env: { ...process.env, ...env } });
  expect(r.stderr).toBe('');
  return JSON.parse(r.stdout) as { fromCache: boolean; value: number };
}

describe('the code cache', () => {
  it('is written after a first run and taken by the next; the code runs the same', () => {
    const { dir, file } = setup(3);
    expect(load(file, dir)).toEqual({ fromCache: false, value: 9 });
    expect(readdirSync(dir).filter((f) => f.endsWith('.v8'))).toHaveLength(1);
    expect(load(file, dir)).toEqual({ fromCache: true, value: 9 });
  });

  it('is keyed by the source text: a source of the same length gets its own entry, not the other one\'s code', () => {
    const a = setup(3);
    load(a.file, a.dir);
    writeFileSync(a.file, readFileSync(a.file, 'utf8').replace('sq(3)', 'sq(4)'));
    expect(load(a.file, a.dir)).toEqual({ fromCache: false, value: 16 });
    expect(load(a.file, a.dir)).toEqual({ fromCache: true, value: 16 });
  });

  it('replaces data V8 rejects', () => {
    const { dir, file } = setup(5);
    load(file, dir);
    const [entry] = readdirSync(dir);
    writeFileSync(join(dir, entry), Buffer.alloc(4096, 7));
    expect(load(file, dir)).toEqual({ fromCache: false, value: 25 }); // rejected, and replaced
    expect(load(file, dir)).toEqual({ fromCache: true, value: 25 });
  });

  it('is not used from a folder others may write to, and is off with PEAKWISE_CODE_CACHE=0', () => {
    const { dir, file } = setup(6);
    expect(trustedCacheDir(dir)).toBe(dir); // made, mode 0700
    chmodSync(dir, 0o777);
    expect(trustedCacheDir(dir)).toBeUndefined();
    expect(load(file, dir)).toEqual({ fromCache: false, value: 36 });
    expect(readdirSync(dir)).toEqual([]);
    chmodSync(dir, 0o700);
    expect(load(file, dir, { PEAKWISE_CODE_CACHE: '0' })).toEqual({ fromCache: false, value: 36 });
    expect(readdirSync(dir)).toEqual([]);
  });

  it(`keeps the newest ${KEEP_FILES} entries`, () => {
    const { dir, file } = setup(7);
    for (let v = 0; v < KEEP_FILES + 2; v++) {
      writeFileSync(file, `'use strict';\nexports.value = () => ${v};\n`);
      load(file, dir);
    }
    expect(readdirSync(dir).filter((f) => f.endsWith('.v8'))).toHaveLength(KEEP_FILES);
    expect(load(file, dir)).toEqual({ fromCache: true, value: KEEP_FILES + 1 }); // the last one written is among them
  });
});
