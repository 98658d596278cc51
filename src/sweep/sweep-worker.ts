/**
 * Worker thread of a sweep: runs the points it is sent, one at a time, and posts each result back
 * as JSON text (NaN as null), or the error's stage, message and key path. Runs from dist/ only.
 */
import { parentPort } from 'node:worker_threads';
import { ModelError, isPeakwiseError } from '../errors.js';
import { runPoint, toJson, type PointTask } from './point.js';

export type WorkerReply =
  | { type: 'done'; index: number; json: string }
  | { type: 'error'; index: number; error: { stage: string; message: string; keyPath?: string; line?: number; col?: number; ours: boolean } };

if (parentPort) {
  const port = parentPort;
  port.on('message', (task: PointTask) => {
    let reply: WorkerReply;
    try {
      reply = { type: 'done', index: task.index, json: toJson(runPoint(task)) };
    } catch (e) {
      const ours = isPeakwiseError(e);
      reply = {
        type: 'error',
        index: task.index,
        error: {
          stage: ours ? e.stage : 'internal',
          message: e instanceof Error ? e.message : String(e),
          keyPath: ours ? e.keyPath : undefined,
          line: e instanceof ModelError ? e.line : undefined,
          col: e instanceof ModelError ? e.col : undefined,
          ours,
        },
      };
    }
    port.postMessage(reply);
  });
}
