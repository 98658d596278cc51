/**
 * The study/solve worker thread's side of src/cli/main.ts: takes the main thread's stop flag and
 * terminal facts, writes stderr straight to fd 2, runs the command line and posts its exit status.
 * Loaded by main.ts in the worker, from the bundle's code-cached CommonJS build when there is one
 * (src/cli/code-cache.ts, docs/speed.md "Start-up"), else as this module.
 */
import { writeSync } from 'node:fs';
import { parentPort, workerData } from 'node:worker_threads';
import { setStopFlag } from './common.js';
import { runCommandLine } from './program.js';

/**
 * A worker's stderr is a message port to the main thread that passes a chunk on only when the
 * worker is idle: during a long synchronous solve, the adaptive cycle lines and the progress bar
 * would all arrive at the end. Written straight to the process's stderr (fd 2) they show as they
 * happen.
 */
function writeStderrDirectly(): void {
  const direct = (chunk: string | Uint8Array, encoding?: BufferEncoding | ((e?: Error | null) => void), done?: (e?: Error | null) => void): boolean => {
    const cb = typeof encoding === 'function' ? encoding : done;
    try {
      if (typeof chunk === 'string') writeSync(2, chunk);
      else writeSync(2, chunk);
      cb?.(null);
    } catch (e) {
      cb?.(e as Error);
    }
    return true;
  };
  process.stderr.write = direct as typeof process.stderr.write;
}

/** Run this worker's command line; `finished` is called after it, before the status is posted. */
export function runAsWorker(finished?: () => void): void {
  const data = workerData as { flag: Int32Array; stdoutTTY: boolean; stderrTTY: boolean; columns?: number };
  setStopFlag(data.flag);
  // the worker's streams are pipes to the main thread's; let colours and the progress bar
  // follow the real terminal
  if (data.stdoutTTY) Object.defineProperty(process.stdout, 'isTTY', { value: true });
  if (data.stderrTTY) {
    Object.defineProperty(process.stderr, 'isTTY', { value: true });
    if (data.columns) Object.defineProperty(process.stderr, 'columns', { value: data.columns });
  }
  writeStderrDirectly();
  runCommandLine(process.argv).then((code) => {
    finished?.();
    parentPort?.postMessage(code);
  });
}
