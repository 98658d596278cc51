/**
 * Real paths, pseudo-file systems and bounded folder creation (issue 19, classes 1, 4, 12, 14):
 * the modules of src/cli/real-path.ts directly.
 */
import { existsSync, mkdirSync, mkdtempSync, realpathSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { PeakwiseError } from '../../src/errors.js';
import { errnoWords, isInside, makeFolders, pseudoFileSystemReason, realPathOf, removeEmptyFolders } from '../../src/cli/real-path.js';

const tmp = (p: string) => realpathSync(mkdtempSync(join(tmpdir(), `pw-rp-${p}-`)));

function errno(code: string): NodeJS.ErrnoException {
  return Object.assign(new Error(code), { code });
}

function thrown(f: () => unknown): PeakwiseError {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(PeakwiseError);
    return e as PeakwiseError;
  }
  throw new Error('expected an error');
}

describe('realPathOf', () => {
  it('resolves links also for a target that does not exist yet (its nearest existing ancestor)', () => {
    const dir = tmp('link');
    mkdirSync(join(dir, 'models'));
    symlinkSync(join(dir, 'models'), join(dir, 'out'));
    expect(realPathOf(join(dir, 'out'))).toBe(join(dir, 'models'));
    expect(realPathOf(join(dir, 'out', 'new', 'field.csv'))).toBe(join(dir, 'models', 'new', 'field.csv'));
    // relative and `..` spellings of one place agree
    expect(realPathOf(join(dir, 'models', '..', 'out', 'x'))).toBe(join(dir, 'models', 'x'));
  });
  it('isInside compares whole path segments', () => {
    expect(isInside('/proc/1', '/proc')).toBe(true);
    expect(isInside('/proc', '/proc')).toBe(true);
    expect(isInside('/processes', '/proc')).toBe(false);
  });
});

describe('pseudo-file systems are no place for outputs', () => {
  it('/proc, /sys and /dev (also missing paths below them) are refused, a temp folder is not', () => {
    expect(pseudoFileSystemReason('/proc/self/x')).toContain('/proc');
    expect(pseudoFileSystemReason('/sys/x/y')).toContain('/sys');
    expect(pseudoFileSystemReason('/dev/shm/results')).toContain('/dev');
    expect(pseudoFileSystemReason(tmp('ok'))).toBeUndefined();
  });
  it('makeFolders under /proc refuses at once instead of looping (node\'s recursive mkdir spins there)', () => {
    const e = thrown(() => makeFolders('/proc/peakwise-test/a/b', '--out /proc/peakwise-test/a/b'));
    expect(e.stage).toBe('usage');
    expect(e.message).toMatch(/--out \/proc\/peakwise-test\/a\/b: refusing to write there: \/proc holds the kernel's process information/);
    // a link that leads into /proc is seen through
    const dir = tmp('proclink');
    symlinkSync('/proc/self', join(dir, 'p'));
    expect(thrown(() => makeFolders(join(dir, 'p', 'out'), 'x')).message).toContain('/proc');
  });
});

describe('makeFolders: bounded, one try per level', () => {
  it('creates the missing levels, returns them outermost first, and removeEmptyFolders takes them back', () => {
    const dir = tmp('mk');
    const made = makeFolders(join(dir, 'a', 'b', 'c'), 'x');
    expect(made).toEqual([join(dir, 'a'), join(dir, 'a', 'b'), join(dir, 'a', 'b', 'c')]);
    expect(makeFolders(join(dir, 'a', 'b', 'c'), 'x')).toEqual([]); // exists: nothing made
    writeFileSync(join(dir, 'a', 'keep.txt'), 'user file');
    removeEmptyFolders(made);
    expect(existsSync(join(dir, 'a', 'b'))).toBe(false);
    expect(existsSync(join(dir, 'a', 'keep.txt'))).toBe(true); // a folder that holds anything stays
  });
  it('refuses more levels than the cap before creating any', () => {
    const dir = tmp('deep');
    const deep = join(dir, ...Array.from({ length: 40 }, (_, i) => `d${i}`));
    expect(thrown(() => makeFolders(deep, '--out deep')).message).toMatch(/would create 40 nested folders \(at most 32\)/);
    expect(existsSync(join(dir, 'd0'))).toBe(false);
  });
  it('a file system that accepts mkdir but never shows the folder ends with an error, not a loop', () => {
    const dir = tmp('ghost');
    let calls = 0;
    const e = thrown(() => makeFolders(join(dir, 'a', 'b', 'c'), '--out g', { mkdir: () => { calls++; } }));
    // one call: level a does not appear, so the creation stops there
    expect(calls).toBe(1);
    expect(e.message).toBe(`--out g: cannot create the folder ${join(dir, 'a')}: it is not there after creating it (is this a file system for files?)`);
  });
  it('gives up at the deadline (a slow or hung file system)', () => {
    const dir = tmp('slow');
    let clock = 0;
    const e = thrown(() => makeFolders(join(dir, 'a', 'b', 'c', 'd'), '--out s', { deadlineMs: 1000, now: () => clock, mkdir: (p) => { clock += 600; mkdirSync(p); } }));
    expect(e.message).toMatch(/--out s: creating the folder took longer than 1 s/);
    expect(existsSync(join(dir, 'a'))).toBe(false); // what it made is taken back
  });
  it('read-only file system and missing permission are said in plain words', () => {
    const dir = tmp('ro');
    const rofs = thrown(() => makeFolders(join(dir, 'x'), '--out x', { mkdir: () => { throw errno('EROFS'); } }));
    expect(rofs.message).toBe(`--out x: cannot create the folder ${join(dir, 'x')}: the file system is read-only`);
    const acces = thrown(() => makeFolders(join(dir, 'y'), '--out y', { mkdir: () => { throw errno('EACCES'); } }));
    expect(acces.message).toContain('permission denied: you may not write there');
    expect(errnoWords('ENOSPC')).toBe('the disk is full');
    expect(errnoWords('EWHATEVER')).toBe('error EWHATEVER');
  });
  it('a file where the folder should be is named', () => {
    const dir = tmp('file');
    writeFileSync(join(dir, 'f'), '');
    expect(thrown(() => makeFolders(join(dir, 'f'), '--out f')).message).toBe('--out f: is a file, not a folder');
    expect(thrown(() => makeFolders(join(dir, 'f', 'sub'), '--out f/sub')).message).toContain('is a file, not a folder');
  });
});
