/**
 * A pool of worker threads that run pure functions by name: the caller hands a task name and a
 * plain-data input (structured clone: numbers, strings, arrays, typed arrays, plain objects), a
 * worker looks the name up in the registry its script serves and posts the plain-data output
 * back. The pool knows nothing of what the tasks compute — the study's levels are one user
 * (src/study/level.ts); what a level returns can grow without touching this file.
 *
 * Errors of ours cross the thread boundary as their stage, message and key path and are raised
 * again in the caller's thread as the same class (ModelError keeps its line and column), so a
 * level that fails in a worker fails with the message it would have given in the main thread.
 */
import { parentPort, Worker } from 'node:worker_threads';
import { FemError, GeometryError, MeshError, ModelError, PeakwiseError, SolveError, isPeakwiseError, type ErrorStage } from '../errors.js';
import { LimitError } from '../fem/health.js';

/** A function a worker can run: plain data in, plain data out, no shared state. */
export type PoolTask = (input: never) => unknown;
export type TaskRegistry = Readonly<Record<string, PoolTask>>;

interface TaskMessage { id: number; name: string; input: unknown }

/** A thrown error as plain data. */
export interface ErrorData {
  ours: boolean;
  stage: string;
  name: string;
  message: string;
  keyPath?: string;
  related?: readonly string[];
  line?: number;
  col?: number;
  at?: readonly [number, number];
  limit?: 'dofs' | 'memory';
}

type ReplyMessage = { id: number; ok: true; output: unknown } | { id: number; ok: false; error: ErrorData };

export function errorData(e: unknown): ErrorData {
  if (!isPeakwiseError(e)) return { ours: false, stage: 'internal', name: e instanceof Error ? e.name : 'Error', message: e instanceof Error ? e.message : String(e) };
  const d: ErrorData = { ours: true, stage: e.stage, name: e.name, message: e.message, related: e.related };
  if (e.keyPath !== undefined) d.keyPath = e.keyPath;
  if (e instanceof ModelError) { d.line = e.line; d.col = e.col; }
  if (e instanceof MeshError && e.at) d.at = e.at;
  if (e instanceof LimitError) d.limit = e.limit;
  return d;
}

/** The error `errorData` describes, as the class it was thrown as (a bug stays a plain Error). */
export function errorFromData(d: ErrorData): Error {
  if (!d.ours) return new Error(d.message);
  if (d.limit) return new LimitError(d.limit, d.message, d.keyPath);
  switch (d.stage as ErrorStage) {
    case 'model': return new ModelError(d.message, d.keyPath, d.line, d.col);
    case 'geometry': return new GeometryError(d.message, d.keyPath);
    case 'mesh': return new MeshError(d.message, d.keyPath, d.at);
    case 'fem': return new FemError(d.message, d.keyPath, d.related);
    case 'solve': return new SolveError(d.message, d.keyPath);
    default: return new PeakwiseError(d.stage as ErrorStage, d.message, d.keyPath, d.related ?? []);
  }
}

/** In a worker script: answer the pool's tasks from `registry`, one at a time. */
export function serveTasks(registry: TaskRegistry): void {
  const port = parentPort;
  if (!port) return;
  port.on('message', (m: TaskMessage) => {
    let reply: ReplyMessage;
    try {
      const fn = registry[m.name];
      if (!fn) throw new Error(`no task called "${m.name}" in this worker`);
      reply = { id: m.id, ok: true, output: (fn as (input: unknown) => unknown)(m.input) };
    } catch (e) {
      reply = { id: m.id, ok: false, error: errorData(e) };
    }
    port.postMessage(reply);
  });
}

/** A task handed to the pool: its result, and a way to give it up (its worker is ended). */
export interface PoolRun<T> {
  result: Promise<T>;
  cancel(): void;
}

interface Slot { worker: Worker; busy: number | undefined }
interface Pending { id: number; name: string; input: unknown; resolve(v: unknown): void; reject(e: unknown): void; cancelled: boolean }

/**
 * `size` workers of `script` (a compiled module that calls `serveTasks`), started at once so
 * they load their modules while the caller works; tasks queue until a worker is free. Workers
 * are `unref`ed while idle, so an open pool never keeps the process alive by itself.
 */
export class TaskPool {
  readonly size: number;
  private readonly script: URL;
  private readonly slots: Slot[] = [];
  private readonly queue: Pending[] = [];
  private readonly running = new Map<number, { slot: Slot; task: Pending }>();
  private nextId = 1;
  private closed = false;

  constructor(script: URL, size: number) {
    if (!(Number.isInteger(size) && size >= 1)) throw new PeakwiseError('usage', `a worker pool needs a whole number of workers ≥ 1, got ${size}`);
    this.script = script;
    this.size = size;
    for (let i = 0; i < size; i++) this.slots.push(this.spawn());
  }

  /** Tasks running now. */
  get busy(): number {
    return this.running.size;
  }

  run<T>(name: string, input: unknown): PoolRun<T> {
    if (this.closed) throw new Error('the worker pool is closed');
    let task!: Pending;
    const result = new Promise<T>((resolve, reject) => {
      task = { id: this.nextId++, name, input, resolve: resolve as (v: unknown) => void, reject, cancelled: false };
    });
    this.queue.push(task);
    this.dispatch();
    return {
      result,
      cancel: () => {
        if (task.cancelled) return;
        task.cancelled = true;
        const q = this.queue.indexOf(task);
        if (q >= 0) this.queue.splice(q, 1);
        const r = this.running.get(task.id);
        if (r) {
          this.running.delete(task.id);
          this.replace(r.slot);
        }
        task.reject(new PoolCancelled());
      },
    };
  }

  /** End every worker; queued and running tasks are rejected with PoolCancelled. */
  async close(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    for (const t of this.queue.splice(0)) { t.cancelled = true; t.reject(new PoolCancelled()); }
    for (const { task } of this.running.values()) { task.cancelled = true; task.reject(new PoolCancelled()); }
    this.running.clear();
    await Promise.all(this.slots.map((s) => s.worker.terminate()));
  }

  private spawn(): Slot {
    const worker = new Worker(this.script);
    const slot: Slot = { worker, busy: undefined };
    worker.unref();
    worker.on('message', (m: ReplyMessage) => this.settle(slot, m));
    worker.on('error', (e) => this.lost(slot, e));
    worker.on('exit', (code) => this.lost(slot, new Error(`a worker thread stopped unexpectedly (exit code ${code})`)));
    return slot;
  }

  /** Replace a worker whose task was given up. */
  private replace(slot: Slot): void {
    const i = this.slots.indexOf(slot);
    slot.worker.removeAllListeners();
    void slot.worker.terminate();
    if (i >= 0 && !this.closed) this.slots[i] = this.spawn();
    this.dispatch();
  }

  private lost(slot: Slot, e: unknown): void {
    if (this.closed || !this.slots.includes(slot)) return;
    const id = slot.busy;
    const r = id !== undefined ? this.running.get(id) : undefined;
    if (r) { this.running.delete(id!); r.task.reject(e); }
    slot.busy = undefined;
    this.replace(slot);
  }

  private settle(slot: Slot, m: ReplyMessage): void {
    const r = this.running.get(m.id);
    slot.busy = undefined;
    slot.worker.unref();
    if (r) {
      this.running.delete(m.id);
      if (m.ok) r.task.resolve(m.output);
      else r.task.reject(errorFromData(m.error));
    }
    this.dispatch();
  }

  private dispatch(): void {
    for (const slot of this.slots) {
      if (this.queue.length === 0) return;
      if (slot.busy !== undefined) continue;
      const task = this.queue.shift()!;
      slot.busy = task.id;
      slot.worker.ref();
      this.running.set(task.id, { slot, task });
      slot.worker.postMessage({ id: task.id, name: task.name, input: task.input } satisfies TaskMessage);
    }
  }
}

/** The rejection of a task given up by `cancel` or `close`. */
export class PoolCancelled extends Error {
  constructor() {
    super('task cancelled');
    this.name = 'PoolCancelled';
  }
}
