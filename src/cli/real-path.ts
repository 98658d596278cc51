/**
 * Where a path really leads, and folders made safely. Output rules compare real paths (every
 * symbolic link resolved), also for a target that does not exist yet: its nearest existing
 * ancestor is resolved and the missing part appended. Folder creation is bounded (a depth cap and
 * a deadline) and refuses the kernel's pseudo-file systems, where `mkdir -p` can loop for ever.
 */
import { lstatSync, mkdirSync, realpathSync, rmdirSync, statSync, statfsSync } from 'node:fs';
import { basename, dirname, join, resolve, sep } from 'node:path';
import { PeakwiseError } from '../errors.js';

/** The real path of `path`: symbolic links resolved, also when the path (or part of it) does not exist yet. */
export function realPathOf(path: string): string {
  const abs = resolve(path);
  const missing: string[] = [];
  let at = abs;
  for (;;) {
    try {
      const real = realpathSync(at);
      return missing.length === 0 ? real : join(real, ...missing.reverse());
    } catch {
      const up = dirname(at);
      if (up === at) return abs; // nothing of it exists (cannot happen on a working system: / exists)
      missing.push(basename(at));
      at = up;
    }
  }
}

/** The nearest part of `path` that exists, as a real path (the folder a creation would start from). */
export function nearestExisting(path: string): string {
  let at = resolve(path);
  for (;;) {
    try {
      return realpathSync(at);
    } catch {
      const up = dirname(at);
      if (up === at) return at;
      at = up;
    }
  }
}

/** `inner` is `outer` or lies inside it (both real, absolute). */
export function isInside(inner: string, outer: string): boolean {
  if (inner === outer) return true;
  const prefix = outer.endsWith(sep) ? outer : outer + sep;
  return inner.startsWith(prefix);
}

/** Folders that are the kernel's, not a disk's (refused as output places by path). */
export const PSEUDO_ROOTS: readonly string[] = ['/proc', '/sys', '/dev'];

/**
 * statfs(2) magic numbers of Linux pseudo-file systems (linux/magic.h): proc, sysfs, devpts,
 * cgroup, cgroup2, debugfs, tracefs, securityfs, configfs. Used when such a file system is
 * mounted somewhere other than its usual root.
 */
const PSEUDO_FS_TYPES: ReadonlyMap<number, string> = new Map([
  [0x9fa0, 'proc'], [0x62656572, 'sysfs'], [0x1cd1, 'devpts'], [0x27e0eb, 'cgroup'], [0x63677270, 'cgroup2'],
  [0x64626720, 'debugfs'], [0x74726163, 'tracefs'], [0x73636673, 'securityfs'], [0x62656570, 'configfs'],
]);

/**
 * Why `real` (a real path) is no place for output files, or undefined when it is fine: under
 * /proc, /sys or /dev, or on a pseudo-file system mounted elsewhere.
 */
export function pseudoFileSystemReason(real: string): string | undefined {
  for (const root of PSEUDO_ROOTS) {
    if (isInside(real, root)) return `${root} holds the kernel's ${root === '/dev' ? 'devices' : root === '/proc' ? 'process information' : 'system information'}, not files`;
  }
  try {
    const type = PSEUDO_FS_TYPES.get(statfsSync(nearestExisting(real)).type);
    if (type !== undefined) return `it lies on a ${type} pseudo-file system of the kernel, not on a disk`;
  } catch {
    // statfs unavailable (not Linux): the path rule above is all we can say
  }
  return undefined;
}

/** A file-system error code in plain words (for "cannot create / cannot write" messages). */
export function errnoWords(code: string | undefined): string {
  switch (code) {
    case 'EROFS': return 'the file system is read-only';
    case 'EACCES':
    case 'EPERM': return 'permission denied: you may not write there';
    case 'ENOSPC': return 'the disk is full';
    case 'EDQUOT': return 'the disk quota is used up';
    case 'ENOTDIR': return 'a part of the path is a file, not a folder';
    case 'EISDIR': return 'it is a folder, not a file';
    case 'ENAMETOOLONG': return 'the name is too long';
    case 'ELOOP': return 'too many symbolic links (a loop of links?)';
    case 'ENOENT': return 'a folder on the way does not exist';
    case 'EEXIST': return 'something else already has that name';
    case 'EBUSY': return 'the file is busy';
    case 'EMFILE':
    case 'ENFILE': return 'too many open files';
    default: return code ? `error ${code}` : 'unknown error';
  }
}

export interface FolderLimits {
  /** at most this many folder levels are created (default 32) */
  maxLevels?: number;
  /** give up after this many milliseconds (default 10 000) */
  deadlineMs?: number;
  /** the creating call, replaceable for tests (default fs.mkdirSync) */
  mkdir?: (path: string) => void;
  /** the clock, replaceable for tests (default Date.now) */
  now?: () => number;
}

/**
 * Create `path` and its missing parents one level at a time, each level tried once (so no
 * retry loop can spin), with a cap on the number of levels and a deadline. Refuses pseudo-file
 * systems. Returns the folders it created, outermost first (for removal when nothing is written).
 * `what` names the path in messages (e.g. `--out out/x`).
 */
export function makeFolders(path: string, what: string, limits: FolderLimits = {}): string[] {
  const maxLevels = limits.maxLevels ?? 32;
  const now = limits.now ?? Date.now;
  const deadline = now() + (limits.deadlineMs ?? 10_000);
  const mkdir = limits.mkdir ?? ((p: string) => mkdirSync(p));
  const real = realPathOf(path);
  const pseudo = pseudoFileSystemReason(real);
  if (pseudo !== undefined) throw new PeakwiseError('usage', `${what}: refusing to write there: ${pseudo}; choose a folder on a disk`);
  const start = nearestExisting(real);
  if (start === real) {
    if (!statSync(real).isDirectory()) throw new PeakwiseError('io', `${what}: is a file, not a folder`);
    return [];
  }
  if (!statSync(start).isDirectory()) throw new PeakwiseError('io', `${what}: ${start} is a file, not a folder`);
  const rest = real.slice(start.length).split(sep).filter((s) => s.length > 0);
  if (rest.length > maxLevels) {
    throw new PeakwiseError('usage', `${what}: would create ${rest.length} nested folders (at most ${maxLevels}); check the path`);
  }
  const created: string[] = [];
  let at = start;
  for (const part of rest) {
    if (now() > deadline) {
      removeEmptyFolders(created);
      throw new PeakwiseError('io', `${what}: creating the folder took longer than ${Math.round((limits.deadlineMs ?? 10_000) / 1000)} s; is the file system responding?`);
    }
    at = join(at, part);
    try {
      mkdir(at);
      created.push(at);
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      if (code === 'EEXIST' && isFolder(at)) continue; // made by someone else meanwhile
      removeEmptyFolders(created);
      throw new PeakwiseError('io', `${what}: cannot create the folder ${at}: ${errnoWords(code)}`);
    }
    if (!isFolder(at)) {
      removeEmptyFolders(created);
      throw new PeakwiseError('io', `${what}: cannot create the folder ${at}: it is not there after creating it (is this a file system for files?)`);
    }
  }
  return created;
}

function isFolder(path: string): boolean {
  try {
    return lstatSync(path).isDirectory() || statSync(path).isDirectory();
  } catch {
    return false;
  }
}

/** Remove folders (innermost first) that are empty; a folder that holds anything stays. */
export function removeEmptyFolders(created: readonly string[]): void {
  for (let i = created.length - 1; i >= 0; i--) {
    try {
      rmdirSync(created[i]);
    } catch {
      return; // not empty (or gone): its parents are not empty either
    }
  }
}
