/**
 * The start of the study/solve worker (src/cli/main.ts). In the bundle, the worker's code is also
 * built as one CommonJS file, dist/bundle/worker-body.cjs, which V8 can compile from a code cache
 * (src/cli/code-cache.ts); tsc's dist/ has no such file and imports worker-run.js as usual.
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

type WorkerRun = typeof import('./worker-run.js');

/** Run the worker's command line from `body` (the CommonJS build) when it exists, else from worker-run.js. */
export async function startWorker(body: URL): Promise<void> {
  const file = fileURLToPath(body);
  if (existsSync(file)) {
    const { loadCommonJs } = await import('./code-cache.js');
    const loaded = loadCommonJs(file);
    (loaded.exports as WorkerRun).runAsWorker(() => loaded.saveCache());
  } else {
    (await import('./worker-run.js')).runAsWorker();
  }
}
