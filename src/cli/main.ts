#!/usr/bin/env node
/**
 * peakwise command line. Wires the stages to commands; the only place that touches argv,
 * files and the console. Errors of ours become one line and exit status 1, never a stack trace.
 * The commands are defined in program.ts; this file decides which thread runs them.
 */
import { Worker, isMainThread } from 'node:worker_threads';
import { runCommandLine } from './program.js';

export { buildProgram } from './program.js';

/**
 * A study (and a solve) runs in a worker thread so that Ctrl-C can reach it: the work is
 * synchronous, and a signal handler only runs when the thread that owns it is idle. The main
 * thread keeps the handler and sets a shared flag; the study reads it between two solves (solve
 * --adapt between two cycles), writes what it has and ends with status 130. A second Ctrl-C — or
 * the first one for a single solve, which has nothing finished to keep — quits at once, and the
 * main thread releases the folder lock the worker reported.
 */
async function runInWorker(argv: string[], graceful: boolean): Promise<void> {
  const { adoptWorkerLock, releaseAllLocks } = await import('./lock.js');
  // before the worker exists, so that all its compilations see it (compiler-tuning.ts)
  (await import('./compiler-tuning.js')).tuneCompiler();
  const flag = new Int32Array(new SharedArrayBuffer(4));
  // this very file: dist/cli/main.js, or in the bundle its entry dist/bundle/peakwise.js (an entry's
  // own code stays in the entry's file; test/build/bundle.test.ts checks it)
  const worker = new Worker(new URL(import.meta.url), {
    argv: argv.slice(2),
    workerData: { flag, stdoutTTY: process.stdout.isTTY === true, stderrTTY: process.stderr.isTTY === true, columns: process.stderr.columns },
  });
  let interrupts = 0;
  const onSigint = (): void => {
    interrupts++;
    if (interrupts > 1 || !graceful) {
      // quit at once: the lock, temporary files and an empty new folder go (lock.ts exit hook)
      if (!graceful) process.stderr.write('\npeakwise: interrupted\n');
      releaseAllLocks();
      process.exit(130);
    }
    Atomics.store(flag, 0, 1);
    process.stderr.write(argv.includes('--watch')
      ? '\npeakwise: ending the watch (a study under way stops after its current solve and writes the finished levels; Ctrl-C again to quit at once)\n'
      : argv[2] === 'solve'
      ? '\npeakwise: stopping after the current cycle and writing the last finished one (Ctrl-C again to quit at once)\n'
      : '\npeakwise: stopping after the current solve and writing the finished levels (Ctrl-C again to quit at once)\n');
  };
  process.on('SIGINT', onSigint);
  let code = 2;
  worker.on('message', (m: unknown) => {
    if (typeof m === 'number') code = m;
    else adoptWorkerLock(m); // released by the main thread if the worker is cut short
  });
  worker.on('error', (e) => {
    process.stderr.write(`peakwise: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
    code = 2;
  });
  worker.on('exit', () => {
    process.off('SIGINT', onSigint);
    process.exitCode = code;
  });
}

if (isMainThread) {
  // `peakwise … | head` closes the pipe early: that is not an error
  process.stdout.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code === 'EPIPE') process.exit(process.exitCode ?? 0);
    throw e;
  });
  // study and solve run in a worker so that Ctrl-C reaches them: study and solve --adapt keep
  // their finished part, a single solve quits at once and leaves its folder as it was
  const command = process.argv[2];
  if (command === 'study' || command === 'solve') {
    const adapt = process.argv.some((a) => a === '--adapt' || a.startsWith('--adapt='));
    void runInWorker(process.argv, command === 'study' || adapt);
  } else {
    // a sweep's points are studies on worker threads started from this thread (compiler-tuning.ts)
    if (command === 'sweep') (await import('./compiler-tuning.js')).tuneCompiler();
    runCommandLine(process.argv).then((code) => {
      // an action may have set a failure status itself (check: a case failed); keep it
      if (code !== 0) process.exitCode = code;
    });
  }
} else {
  // the worker: from the bundle's code-cached CommonJS build when it is there, else the module
  void (await import('./worker-start.js')).startWorker(new URL('./worker-body.cjs', import.meta.url));
}
