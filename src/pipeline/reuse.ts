/**
 * Reuse between the runs of one warm process (`peakwise study --watch`, docs/watch.md, "Reuse"): a
 * bounded, process-wide store of the meshes the pipeline made and of each mesh's assembled stiffness,
 * ordering and factor, so a rerun after an edit that leaves them as they were (a comment, a load
 * value) takes them instead of making them again.
 *
 * - Keys are SHA-256 content hashes of exactly what a stage reads (contentKey: every number by its
 *   64 bits, -0 and NaN included, every string, typed array and key). A mesh: the plate geometry
 *   after params, the mesh settings (size, order, local disks), a caller's description of its size
 *   field (the study's sites, h₀, ratio, level, far-field coarsening), the points that must be nodes,
 *   the mesher's angle and vertex settings and the dof cap with its estimate rule. A stiffness and its
 *   factor: the mesh (every array of it), the elastic section (E, ν and every other material field,
 *   thickness, state) and the held dofs (supports, the axis, prescribed dofs). Loads and prescribed
 *   values only reach right-hand sides, so they are not in any key. A stage with no description of
 *   its size field (the adaptive loop, a reported value's own solve) is never reused.
 * - Off unless the process turns it on (`reuseStore.enable()`: watch mode only); a plain run never
 *   hashes or keeps anything.
 * - Kept: only what the last run used. `endRun()` drops every entry the run did not take or make
 *   (after a failed run nothing is dropped, so fixing a bad edit finds the last good run's work).
 * - Memory: the entries' bytes (mesh arrays, matrices, the factor's whole storage — a factor in
 *   WebAssembly memory keeps that memory, work area included) plus the factor being made stay within
 *   the run's `maxFactorBytes`, and the kept meshes' dofs within `maxDofs` (limits.ts; the command
 *   line's defaults where a limit is not given), least recently used first out: the store never lets
 *   a run hold more than one solve of it may.
 * - A kept factor stays valid: the solver gives a factor's WebAssembly memory back for the next
 *   factorisation (linalg's releaseFactor) only when the store does not keep it, and the store gives
 *   it back only when it lets the entry go (evicted, dropped after a run, or the store turned off).
 */
import { createHash, type Hash } from 'node:crypto';
import type { Mesh } from '../mesh/types.js';
import type { ElasticSection } from '../fem/types.js';
import type { KeptStiffness, StiffnessReuse } from '../fem/index.js';
import { DEFAULT_MAX_DOFS, defaultFactorBytes, type SolveLimits } from './limits.js';

/** An incremental SHA-256 of plain data: numbers by their bits, with a type code before each value. */
class ContentDigest {
  private readonly hash: Hash = createHash('sha256');
  private readonly buf = new Float64Array(2048);
  private n = 0;

  private flush(): void {
    if (this.n > 0) this.hash.update(new Uint8Array(this.buf.buffer, 0, 8 * this.n));
    this.n = 0;
  }

  private num(x: number): void {
    if (this.n === this.buf.length) this.flush();
    this.buf[this.n++] = x;
  }

  private text(s: string): void {
    this.num(2);
    this.num(s.length);
    this.flush();
    this.hash.update(s);
  }

  add(v: unknown): this {
    if (typeof v === 'number') { this.num(1); this.num(v); }
    else if (typeof v === 'string') this.text(v);
    else if (typeof v === 'boolean') { this.num(3); this.num(v ? 1 : 0); }
    else if (v === undefined) this.num(4);
    else if (v === null) this.num(5);
    else if (Array.isArray(v)) { this.num(6); this.num(v.length); for (const x of v) this.add(x); }
    else if (ArrayBuffer.isView(v)) {
      this.text(v.constructor.name);
      this.num(v.byteLength);
      this.flush();
      this.hash.update(new Uint8Array(v.buffer, v.byteOffset, v.byteLength));
    } else if (typeof v === 'object' && Object.getPrototypeOf(v) === Object.prototype) {
      const keys = Object.keys(v).sort();
      this.num(7);
      this.num(keys.length);
      for (const k of keys) { this.text(k); this.add((v as Record<string, unknown>)[k]); }
    } else {
      // a function (a size field), a Map, a class instance: what it does cannot be read off it
      throw new TypeError(`cannot key a ${typeof v === 'object' ? (v as object).constructor?.name ?? 'object' : typeof v} by its content`);
    }
    return this;
  }

  digest(): string {
    this.flush();
    return this.hash.digest('hex');
  }
}

/** The content hash of plain data (numbers, strings, booleans, arrays, typed arrays, plain objects). */
export function contentKey(...parts: unknown[]): string {
  const d = new ContentDigest();
  for (const p of parts) d.add(p);
  return d.digest();
}

const objectKeys = new WeakMap<object, string>();

/** The content hash of an object that is read, never written (a geometry, a mesh), computed once per object. */
export function objectKey(o: object): string {
  let k = objectKeys.get(o);
  if (k === undefined) { k = contentKey(o); objectKeys.set(o, k); }
  return k;
}

/** Bytes of the typed arrays among an object's own values (one level down). */
function arrayBytes(o: object): number {
  let bytes = 0;
  for (const v of Object.values(o)) if (ArrayBuffer.isView(v)) bytes += v.byteLength;
  return bytes;
}

/** Bytes a kept stiffness holds: K, K_ff, the fixed rows, the analysis and the factor's whole storage. */
export function keptStiffnessBytes(kept: KeptStiffness): number {
  const f = kept.factor;
  return arrayBytes(kept.K) + arrayBytes(kept.Kff) + arrayBytes(kept.fixedRows) + (f ? arrayBytes(f.symbolic) + f.values.buffer.byteLength : 0);
}

interface Entry { value: unknown; bytes: number; dofs: number; run: number; deps: readonly string[]; release?: () => void }

/** The store (see the file's note). One per thread; `reuseStore` is this process's. */
export class ReuseStore {
  private readonly entries = new Map<string, Entry>();
  private run = 1;
  private on = false;
  /** takes that found an entry / found none, since the store was made */
  hits = 0;
  misses = 0;
  /** entries taken by the current run, by kind ('mesh', 'stiffness') */
  private taken = new Map<string, number>();
  /** the keys taken or kept while each `kept` value on the stack is made (what it was made from) */
  private readonly making: Set<string>[] = [];

  get enabled(): boolean {
    return this.on;
  }

  enable(): void {
    this.on = true;
  }

  /** Turn it off and let go of everything. */
  disable(): void {
    this.on = false;
    for (const e of this.entries.values()) e.release?.();
    this.entries.clear();
    this.taken = new Map();
    this.making.length = 0;
  }

  /** What is kept now. */
  get size(): { entries: number; bytes: number; dofs: number } {
    let bytes = 0, dofs = 0;
    for (const e of this.entries.values()) { bytes += e.bytes; dofs += e.dofs; }
    return { entries: this.entries.size, bytes, dofs };
  }

  /** The entry under `key`, marked as used by this run, or undefined; `kind` is counted for `endRun`. */
  take<T>(key: string, kind = 'entry'): T | undefined {
    const e = this.entries.get(key);
    if (!e) { this.misses++; return undefined; }
    this.hits++;
    this.taken.set(kind, (this.taken.get(kind) ?? 0) + 1);
    this.touch(key, e);
    return e.value as T;
  }

  /** Mark an entry and what it was made from as used by this run, most recently used last (eviction takes from the front). */
  private touch(key: string, e: Entry): void {
    for (const m of this.making) m.add(key);
    e.run = this.run;
    this.entries.delete(key);
    this.entries.set(key, e);
    for (const d of e.deps) {
      const de = this.entries.get(d);
      if (de && de.run !== this.run) this.touch(d, de);
    }
  }

  /**
   * The value kept under `key`, or `make()`'s, kept with what it was made from (the entries taken or
   * kept meanwhile): a hit keeps those in use too, so a later run that needs only them still finds them.
   */
  kept<T>(key: string, kind: string, make: () => T, size: (value: T) => { bytes: number; dofs: number }, limits: SolveLimits): T {
    const hit = this.take<T>(key, kind);
    if (hit !== undefined) return hit;
    const deps = new Set<string>();
    this.making.push(deps);
    let value: T;
    try {
      value = make();
    } finally {
      this.making.pop();
    }
    this.keep(key, value, size(value), limits, [...deps]);
    return value;
  }

  /** Keep `value` under `key` when it fits within the limits beside the rest (evicting the least recently used). */
  keep(
    key: string, value: unknown, size: { bytes: number; dofs: number }, limits: SolveLimits,
    deps: readonly string[] = [], release?: () => void,
  ): boolean {
    if (!this.on) return false;
    for (const m of this.making) m.add(key);
    this.drop(key);
    const capBytes = limits.maxFactorBytes ?? defaultFactorBytes();
    const capDofs = limits.maxDofs ?? DEFAULT_MAX_DOFS;
    // what cannot fit even alone is not kept, and costs the others nothing
    if (size.bytes > capBytes || size.dofs > capDofs || !this.makeRoom(size.bytes, size.dofs, limits)) return false;
    this.entries.set(key, { value, bytes: size.bytes, dofs: size.dofs, run: this.run, deps, ...(release ? { release } : {}) });
    return true;
  }

  /** Let go of one entry (its release, if any, is called: a factor's memory then serves the next one). */
  private drop(key: string): void {
    const e = this.entries.get(key);
    if (!e) return;
    this.entries.delete(key);
    e.release?.();
  }

  /**
   * Let go of entries (least recently used first) until `bytes` more and `dofs` more fit within the
   * limits; false when they cannot fit even in an empty store.
   */
  makeRoom(bytes: number, dofs: number, limits: SolveLimits): boolean {
    const capBytes = limits.maxFactorBytes ?? defaultFactorBytes();
    const capDofs = limits.maxDofs ?? DEFAULT_MAX_DOFS;
    let { bytes: held, dofs: heldDofs } = this.size;
    for (const [k, e] of this.entries) {
      if (held + bytes <= capBytes && heldDofs + dofs <= capDofs) break;
      this.drop(k);
      held -= e.bytes;
      heldDofs -= e.dofs;
    }
    return held + bytes <= capBytes && heldDofs + dofs <= capDofs;
  }

  /**
   * A run has ended: drop what it did not use (unless it failed), and start counting the next.
   * Returns how many entries of each kind the run took from the store.
   */
  endRun(failed = false): Record<string, number> {
    if (!failed) for (const [k, e] of this.entries) if (e.run !== this.run) this.drop(k);
    this.run++;
    const taken = Object.fromEntries(this.taken);
    this.taken = new Map();
    return taken;
  }
}

/** This process's store (off until watch mode turns it on). */
export const reuseStore = new ReuseStore();

/** What the mesher reads, as a key (see the file's note); `sizeKey` describes the size field beyond the mesh settings. */
export function meshKey(
  geometry: object, meshSettings: object, order: 1 | 2, points: readonly (readonly [number, number])[],
  request: { sizeKey: string; minAngleDeg?: number; maxVertices?: number; predicted?: boolean }, limits: SolveLimits,
): string {
  return contentKey('mesh', objectKey(geometry), meshSettings, order, points, request.sizeKey,
    request.minAngleDeg, request.maxVertices, request.predicted === true, limits.maxDofs);
}

/** A mesh from the store, or `make`'s, kept under `key` and known by it afterwards. */
export function keptMesh(key: string, limits: SolveLimits, make: () => Mesh): Mesh {
  const hit = reuseStore.take<Mesh>(key, 'mesh');
  if (hit) return hit;
  const mesh = make();
  objectKeys.set(mesh, contentKey('mesh-made', key));
  reuseStore.keep(key, mesh, { bytes: arrayBytes(mesh), dofs: mesh.xy.length }, limits);
  return mesh;
}

/** The store bound to one mesh and section, as the solver asks it (fem/solve.ts StiffnessReuse). */
export function stiffnessReuse(mesh: Mesh, section: ElasticSection, limits: SolveLimits): StiffnessReuse {
  const base = contentKey('stiffness', objectKey(mesh), section);
  const keyOf = (fixed: Uint8Array): string => contentKey(base, fixed);
  return {
    find: (fixed) => reuseStore.take<KeptStiffness>(keyOf(fixed), 'stiffness'),
    room: (bytes) => { reuseStore.makeRoom(bytes, 0, limits); },
    keep: (fixed, kept, release) => reuseStore.keep(keyOf(fixed), kept, { bytes: keptStiffnessBytes(kept), dofs: 0 }, limits, [], release),
  };
}
