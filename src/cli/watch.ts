/**
 * `peakwise study <model> --watch` (docs/watch.md): one warm process that studies the model, then
 * studies it again each time the model file or a file it reads (an imported outline, a table) is
 * saved with new bytes, and prints the new table. The output folder's lock is taken at the start
 * and held until the watch ends; each run writes a complete result set under it (the same files,
 * run id included, as `peakwise study` without --watch). The report is served on 127.0.0.1
 * (serve.ts) and the open page reloads itself when a run has finished. A bad edit prints its one
 * line and the watch goes on; Ctrl-C ends it.
 *
 * Changes are found by polling the files' status (size, modification time, inode) a few times a
 * second: editors that save by writing a new file and renaming it over the old one are seen as
 * well as those that write in place, and a save that leaves the bytes as they were (same SHA-256)
 * starts no run.
 */
import { createHash } from 'node:crypto';
import { readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { PeakwiseError, isPeakwiseError } from '../errors.js';
import { studyPool } from '../study/index.js';
import type { TaskPool } from '../pipeline/pool.js';
import { reuseStore } from '../pipeline/reuse.js';
import { jobsOption, runStudy, type StudyCliOptions } from './commands.js';
import { StudyInterrupted, emitWarnings, stopRequested, type CliContext } from './common.js';
import { clearInputs, inputsOfRun } from './inputs.js';
import { modelName } from './io.js';
import { closeOutputSets, holdOutputFolder, MANIFEST_NAME, stampOfFile } from './output-set.js';
import { describeError, plain } from './report-error.js';
import { serveFolder } from './serve.js';

export interface WatchOptions extends StudyCliOptions {
  watch?: boolean;
  port?: string;
}

/** How often the watched files are looked at, ms. */
const POLL_MS = 150;
/** A change is studied once the files have stayed the same this long (an editor's save in several writes), ms. */
const SETTLE_MS = 100;

interface FileState { key: string; sha: string }

function stateOf(path: string): FileState | undefined {
  try {
    const st = statSync(path);
    return { key: `${st.size}:${st.mtimeMs}:${st.ino}`, sha: '' };
  } catch {
    return undefined;
  }
}

function shaOf(path: string): string {
  try {
    return createHash('sha256').update(readFileSync(path)).digest('hex');
  } catch {
    return 'unreadable';
  }
}

/** `--port`: a whole number from 0 (any free port) to 65535. */
export function portOption(text: string | undefined): number {
  if (text === undefined) return 0;
  const v = Number(text);
  if (!(text.trim() !== '' && Number.isInteger(v) && v >= 0 && v <= 65535)) {
    throw new PeakwiseError('usage', `--port must be a whole number from 0 to 65535, got "${text}"`);
  }
  return v;
}

const sleep = (ms: number): Promise<void> => new Promise((r) => setTimeout(r, ms));

/**
 * The watched files: the model, every file watched before and every file the last run read. `fresh`
 * (before a run) takes every file's status and hash now; otherwise (after a run) the files known
 * before keep the state they had when the run began, so a save during the run is not missed.
 */
function snapshot(modelFile: string, previous: Map<string, FileState>, fresh: boolean): Map<string, FileState> {
  const paths = new Set<string>([modelFile, ...previous.keys()]);
  for (const f of inputsOfRun()) if (f.role === 'model file' || f.role === 'imported file') paths.add(f.real);
  const next = new Map<string, FileState>();
  for (const p of paths) {
    const before = previous.get(p);
    if (before && !fresh) { next.set(p, before); continue; }
    const st = stateOf(p) ?? { key: 'missing', sha: '' };
    st.sha = before && before.key === st.key ? before.sha : st.key === 'missing' ? '' : shaOf(p);
    next.set(p, st);
  }
  return next;
}

/** Has any watched file new bytes? (status first; the hash only when the status moved) */
function changed(files: Map<string, FileState>): string | undefined {
  for (const [p, old] of files) {
    const now = stateOf(p) ?? { key: 'missing', sha: '' };
    if (now.key === old.key) continue;
    const sha = now.key === 'missing' ? '' : shaOf(p);
    if (sha !== old.sha) return p;
    old.key = now.key; // touched, same bytes
  }
  return undefined;
}

/** ' (reused 7 levels, 1 mesh, 1 factor)' for what a run took from the reuse store (a level: its readings), '' when nothing. */
export function reusedWords(taken: Record<string, number>): string {
  const n = (count: number | undefined, one: string, many: string): string => (count ? `${count} ${count === 1 ? one : many}` : '');
  const parts = [n(taken.level, 'level', 'levels'), n(taken.mesh, 'mesh', 'meshes'), n(taken.stiffness, 'factor', 'factors')].filter((p) => p !== '');
  return parts.length > 0 ? ` (reused ${parts.join(', ')})` : '';
}

/** Study, then study again on every saved change, until Ctrl-C. */
export async function watchStudy(ctx: CliContext, file: string, opts: WatchOptions): Promise<void> {
  const port = portOption(opts.port);
  // one job by default: the levels run in this thread, which keeps their meshes and factors between
  // runs (pipeline/reuse.ts); workers (--jobs n) stay warm but make everything afresh (docs/watch.md)
  const jobs = jobsOption(opts.jobs) ?? 1;
  const outDir = opts.out ?? join('out', modelName(file));
  const say = (line: string): void => { process.stderr.write(`peakwise: ${line}\n`); };
  const held = holdOutputFolder(outDir, file, 'study', (line) => emitWarnings([line], opts));
  let pool: TaskPool | undefined;
  let server: Awaited<ReturnType<typeof serveFolder>> | undefined;
  reuseStore.enable();
  try {
    // warm workers for every rerun (one job: each level in this thread, itself warm)
    pool = jobs > 1 ? studyPool(jobs) : undefined;
    try {
      server = await serveFolder(held.dir, port);
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      const why = code === 'EADDRINUSE' ? 'is in use' : code === 'EACCES' ? 'may not be opened by this user' : `cannot be opened (${code ?? String(e)})`;
      throw new PeakwiseError('usage', `--port ${port}: that port on 127.0.0.1 ${why}; choose another, or leave --port out for any free one`);
    }
    say(`watching ${file} (and the files it reads); the report is at ${server.url}report.html — Ctrl-C ends the watch`);
    let files = new Map<string, FileState>();
    let reason = '';
    for (;;) {
      const t0 = performance.now();
      files = snapshot(file, files, true); // taken before the run: a save during the run starts the next one
      clearInputs();
      if (reason) say(`${reason} changed: studying again`);
      try {
        await runStudy(ctx, file, { ...opts, out: outDir }, pool);
        const taken = reuseStore.endRun();
        closeOutputSets('done');
        const runId = stampOfFile(join(held.dir, MANIFEST_NAME));
        if (runId) server.announceRun(runId);
        if (!opts.quiet) say(`run ${runId ? runId.slice(0, 12) : ''} written in ${((performance.now() - t0) / 1000).toFixed(2)} s${reusedWords(taken)}; waiting for changes`);
      } catch (e) {
        if (e instanceof StudyInterrupted) {
          // the finished levels are written: complete the set while the lock is still held
          closeOutputSets('interrupted');
          throw e;
        }
        closeOutputSets('failed');
        reuseStore.endRun(true); // keeps the last good run's work for when the edit is fixed
        const line = isPeakwiseError(e) ? describeError(e, ctx.file, ctx.model) : `internal error: ${e instanceof Error ? e.message : String(e)}`;
        process.stderr.write(`peakwise: ${line}\n`);
        server.announceError(plain(line));
        say('fix the file and save it again; still watching');
      }
      files = snapshot(file, files, false);
      for (;;) {
        if (stopRequested()) return;
        const hit = changed(files);
        if (hit) {
          // let the save finish: wait until the file stays put
          let last = stateOf(hit)?.key;
          for (;;) {
            await sleep(SETTLE_MS);
            const now = stateOf(hit)?.key;
            if (now === last) break;
            last = now;
          }
          reason = hit;
          break;
        }
        await sleep(POLL_MS);
      }
    }
  } finally {
    await server?.close();
    await pool?.close();
    reuseStore.disable();
    held.release();
  }
}
