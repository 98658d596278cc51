/**
 * `peakwise results <folder>`: does the folder hold one complete result set (every file of its
 * run.json present and carrying the run id)? Exit 0 when complete, 1 when incomplete or empty.
 */
import { statSync } from 'node:fs';
import { PeakwiseError } from '../errors.js';
import { join } from 'node:path';
import { describeFolder, inspectFolder } from './output-set.js';
import { LOCK_NAME, lockOwnerState, readLock } from './lock.js';
import { plain } from './report-error.js';

export function runResults(folder: string, opts: { json?: boolean }): void {
  try {
    if (!statSync(folder).isDirectory()) throw new PeakwiseError('usage', `${folder}: is a file, not a result folder`);
  } catch (e) {
    if (e instanceof PeakwiseError) throw e;
    throw new PeakwiseError('io', `${folder}: no such folder`);
  }
  const state = inspectFolder(folder);
  const { complete, lines } = describeFolder(folder, state);
  const lock = readLock(join(folder, LOCK_NAME));
  if (lock && lockOwnerState(lock) !== 'dead') lines.push(`  a run is writing into this folder now (${lock.command}, pid ${lock.pid}, started ${lock.started})`);
  if (opts.json) process.stdout.write(JSON.stringify({ folder, ...state }, null, 2) + '\n');
  else process.stdout.write(lines.map(plain).join('\n') + '\n');
  if (!complete) process.exitCode = 1;
}
