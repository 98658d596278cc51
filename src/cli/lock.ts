/**
 * One run at a time per output folder: `run.lock`, created exclusively (`wx`), holding the pid,
 * host, start time and a random token of the run that writes there. A second run into the same
 * folder refuses with a message naming the first. A lock left by a process that no longer exists
 * (killed, machine restarted) is recognised and taken over with a notice: `process.kill(pid, 0)`
 * fails with ESRCH, or on Linux the pid now belongs to a process started after the lock was.
 * Locks are released when the run ends — also on errors, on Ctrl-C and on `process.exit` — and a
 * run in a worker thread reports its lock to the main thread, which releases it if the worker is
 * cut short.
 */
import { randomUUID } from 'node:crypto';
import { closeSync, linkSync, openSync, readFileSync, readdirSync, renameSync, rmSync, statSync, unlinkSync, writeSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';
import { isMainThread, parentPort } from 'node:worker_threads';
import { PeakwiseError } from '../errors.js';
import { errnoWords, removeEmptyFolders } from './real-path.js';

export const LOCK_NAME = 'run.lock';

export interface LockInfo {
  pid: number;
  host: string;
  /** ISO time the run started */
  started: string;
  command: string;
  token: string;
}

export interface HeldLock {
  /** the folder (real path) and the lock file in it */
  dir: string;
  path: string;
  token: string;
  /** folders the run created for its output (removed at exit when they are still empty) */
  created: string[];
}

/** What the lock file says, or undefined when it is missing, being written or damaged. */
export function readLock(path: string): LockInfo | undefined {
  try {
    const data = JSON.parse(readFileSync(path, 'utf8')) as Partial<LockInfo>;
    if (typeof data.pid !== 'number' || typeof data.token !== 'string') return undefined;
    return { pid: data.pid, host: String(data.host ?? ''), started: String(data.started ?? ''), command: String(data.command ?? ''), token: data.token };
  } catch {
    return undefined;
  }
}

/**
 * Start time of a live process in ms since 1970, from /proc (Linux): field 22 of /proc/<pid>/stat
 * is the start in clock ticks after boot, /proc/stat's `btime` the boot time in seconds; USER_HZ
 * is 100 on every mainstream Linux architecture (common practice; `getconf CLK_TCK`).
 * Undefined where /proc is not available.
 */
export function processStartMs(pid: number): number | undefined {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    const ticks = Number(fields[19]); // field 22 of the line; the split starts at field 3
    const btime = /^btime (\d+)$/m.exec(readFileSync('/proc/stat', 'utf8'));
    if (!btime || !Number.isFinite(ticks)) return undefined;
    return Number(btime[1]) * 1000 + ticks * 10;
  } catch {
    return undefined;
  }
}

/** 'alive', 'dead' or 'unknown' (another host: we cannot ask its processes). */
export function lockOwnerState(info: LockInfo): 'alive' | 'dead' | 'unknown' {
  if (info.host !== '' && info.host !== hostname()) return 'unknown';
  try {
    process.kill(info.pid, 0);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'ESRCH') return 'dead';
    if (code === 'EPERM') return 'alive'; // exists, belongs to another user
    return 'unknown';
  }
  // the pid exists; if it started clearly after the lock was written, it is another process
  const started = Date.parse(info.started);
  const startMs = processStartMs(info.pid);
  if (Number.isFinite(started) && startMs !== undefined && startMs > started + 2000) return 'dead';
  return 'alive';
}

const held: HeldLock[] = [];
let exitHookInstalled = false;

function installExitHook(): void {
  if (exitHookInstalled) return;
  exitHookInstalled = true;
  // runs on normal ends, on errors that reach the top, and on process.exit (second Ctrl-C)
  process.on('exit', () => {
    for (const lock of [...held]) cleanUpAfter(lock);
  });
}

/** Remove this process's temporary files in the lock's folder, release the lock, drop empty folders it made. */
function cleanUpAfter(lock: HeldLock): void {
  removeTemporaryFiles(lock.dir, process.pid);
  releaseLock(lock);
  removeEmptyFolders(lock.created);
}

/** Temporary files of the atomic writer (`.<name>.<pid>.tmp`) that process `pid` left in `dir`. */
export function removeTemporaryFiles(dir: string, pid: number): string[] {
  const removed: string[] = [];
  let names: string[];
  try {
    names = readdirSync(dir);
  } catch {
    return removed;
  }
  const suffix = `.${pid}.tmp`;
  for (const n of names) {
    if (n.startsWith('.') && n.endsWith(suffix)) {
      rmSync(join(dir, n), { force: true });
      removed.push(n);
    }
  }
  return removed;
}

function describeOwner(info: LockInfo | undefined): string {
  if (!info) return 'another peakwise run';
  const host = info.host && info.host !== hostname() ? ` on ${info.host}` : '';
  return `another peakwise run (${info.command || 'a run'}, pid ${info.pid}${host}, started ${info.started || 'at an unknown time'})`;
}

/**
 * Take the lock of `dir` (a real path that exists). `what` names the folder in messages
 * (`--out out/x`); notices (a stale lock taken over) go to `notice`. Throws a usage error when a
 * live run holds it.
 */
export function acquireLock(dir: string, command: string, what: string, notice: (line: string) => void, created: string[] = []): HeldLock {
  const path = join(dir, LOCK_NAME);
  const info: LockInfo = { pid: process.pid, host: hostname(), started: new Date().toISOString(), command, token: randomUUID() };
  for (let attempt = 0; attempt < 5; attempt++) {
    let fd: number;
    try {
      fd = openSync(path, 'wx');
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      if (code !== 'EEXIST') throw new PeakwiseError('io', `${what}: cannot write in the folder: ${errnoWords(code)}`);
      const other = readLock(path);
      const state = other ? lockOwnerState(other) : lockFileAgeMs(path) > 10_000 ? 'dead' : 'alive';
      if (state !== 'dead') {
        throw new PeakwiseError('usage', `${what}: ${describeOwner(other)} is writing into this folder; wait for it to end or choose another --out (if no run is going, delete ${path})`);
      }
      if (takeOver(path, other)) {
        const gone = other ? removeTemporaryFiles(dir, other.pid) : [];
        notice(`${what}: taking over the lock left by ${other ? `pid ${other.pid} (${other.command || 'a run'}, started ${other.started})` : 'a run'}, which ended without releasing it${gone.length ? `; removed its temporary files ${gone.join(', ')}` : ''}`);
      }
      continue;
    }
    try {
      writeSync(fd, JSON.stringify(info) + '\n');
    } finally {
      closeSync(fd);
    }
    const lock: HeldLock = { dir, path, token: info.token, created };
    held.push(lock);
    installExitHook();
    if (!isMainThread) parentPort?.postMessage({ peakwiseLock: lock });
    return lock;
  }
  throw new PeakwiseError('usage', `${what}: other runs keep taking this folder's lock; wait for them or choose another --out`);
}

function lockFileAgeMs(path: string): number {
  try {
    return Date.now() - statSync(path).mtimeMs;
  } catch {
    return Infinity;
  }
}

/**
 * Remove a stale lock without ever removing a fresh one that another run put in its place
 * meanwhile: move it to a private name first (one rename wins), then look at what was moved.
 */
function takeOver(path: string, stale: LockInfo | undefined): boolean {
  const aside = `${path}.${process.pid}.stale`;
  try {
    renameSync(path, aside);
  } catch {
    return false; // someone else moved or removed it first: just try to create ours
  }
  const moved = readLock(aside);
  if (stale && moved && moved.token !== stale.token) {
    // a live run's fresh lock: put it back (link fails only if yet another lock is there now)
    try {
      linkSync(aside, path);
    } catch {
      // leave the newest lock in place
    }
    rmSync(aside, { force: true });
    return false;
  }
  rmSync(aside, { force: true });
  return true;
}

/** Release a lock this process holds (only if the file still carries its token). */
export function releaseLock(lock: HeldLock): void {
  const info = readLock(lock.path);
  if (info && info.token === lock.token) {
    try {
      unlinkSync(lock.path);
    } catch {
      // already gone
    }
  }
  const i = held.indexOf(lock);
  if (i >= 0) held.splice(i, 1);
}

/**
 * The main thread's side of a run in a worker: a lock the worker reported is released (with the
 * worker's temporary files and empty new folders) when the process exits, in case the worker is
 * cut short (second Ctrl-C). A lock the worker released itself is left alone (token check).
 */
export function adoptWorkerLock(message: unknown): boolean {
  const m = message as { peakwiseLock?: HeldLock } | null;
  if (!m || typeof m !== 'object' || !m.peakwiseLock) return false;
  const lock = m.peakwiseLock;
  held.push({ dir: lock.dir, path: lock.path, token: lock.token, created: [...lock.created] });
  installExitHook();
  return true;
}

/** Release every lock held or adopted now (the main thread calls this before a forced exit). */
export function releaseAllLocks(): void {
  for (const lock of [...held]) cleanUpAfter(lock);
}
