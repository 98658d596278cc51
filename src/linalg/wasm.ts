import { KERNELS_WASM_BASE64 } from './wasm-kernels.js';

// The project's lib settings carry no WebAssembly typings; the few members used are typed here.
interface WasmMemory { readonly buffer: ArrayBuffer }
type WasmModule = object;
interface WasmApi {
  Module: new (bytes: Uint8Array) => WasmModule;
  Memory: new (desc: { initial: number; maximum?: number }) => WasmMemory;
  Instance: new (mod: WasmModule, imports: object) => { exports: Record<string, unknown> };
}
const WA = (globalThis as unknown as { WebAssembly?: WasmApi }).WebAssembly;

/**
 * The WebAssembly SIMD kernels of kernels.wat bound to one memory. The factor's panels live in
 * that memory (Factor.values is a Float64Array view on it), so the kernels work in place with
 * no copying; the memory is sized once and never grown, which keeps the view valid (and growing
 * would detach its old buffer: the first detached buffer of a process makes V8 drop the optimised
 * code of every function that reads a typed array and guard each such read from then on).
 */
export interface WasmKernels {
  memory: WasmMemory;
  /** C (m4 × k4) = X Yᵀ, lower block triangle; byte addresses (see kernels.wat) */
  syrk: (px: number, ld: number, m4: number, k4: number, kk: number, pc: number) => void;
  /** scatter-subtract C into a panel through byte-offset maps (see kernels.wat) */
  scatter: (pc: number, m4: number, m: number, k: number, prow: number, pcol: number) => void;
  /** dense Cholesky of one panel; returns the failing column or -1 (see kernels.wat) */
  panel: (pa: number, nr: number, nc: number, ptol: number, pw: number) => number;
}

const PAGE = 65536;
const MAX_PAGES = 65536; // 4 GiB: the wasm32 address space

let compiled: WasmModule | null | undefined;

/** The compiled module, or null where WebAssembly SIMD is unavailable. */
function kernelModule(): WasmModule | null {
  if (compiled === undefined) {
    try {
      if (!WA) throw new TypeError('no WebAssembly');
      compiled = new WA.Module(Buffer.from(KERNELS_WASM_BASE64, 'base64'));
    } catch {
      compiled = null;
    }
  }
  return compiled;
}

/** True when the SIMD kernels can be used on this runtime. */
export function wasmKernelsAvailable(): boolean {
  return kernelModule() !== null;
}

/** Kernels on a fresh zeroed memory of at least `bytes` bytes, or null (no SIMD, or too large). */
export function createWasmKernels(bytes: number): WasmKernels | null {
  const mod = kernelModule();
  if (!mod || !WA) return null;
  const pages = Math.ceil(bytes / PAGE);
  if (pages > MAX_PAGES) return null;
  try {
    const memory = new WA.Memory({ initial: Math.max(1, pages), maximum: Math.max(1, pages) });
    const inst = new WA.Instance(mod, { env: { mem: memory } });
    const ex = inst.exports as unknown as Omit<WasmKernels, 'memory'>;
    return { memory, syrk: ex.syrk, scatter: ex.scatter, panel: ex.panel };
  } catch {
    return null;
  }
}

/** Kernels whose factor was given back, with memory already mapped (its pages touched). */
const spares: WasmKernels[] = [];
/** Spare memory kept for the next factor at most (bytes, all spares together). */
const SPARE_BYTES = 512 * 1024 * 1024;

/** A new memory is made this much larger than the factor asks: only the pages written cost, and the next, larger factor of a ladder then fits. */
const HEADROOM = 2;

/**
 * Kernels on a memory of at least `bytes` bytes for a new factor, and whether the memory is fresh
 * (all zero) or a spare (`dirtyBytes`: how much of it may hold old values and must be cleared).
 * A fresh memory costs a page fault on the first write of every 4 KiB page — about 0.7 ms per MiB
 * here, a fifth of a small factor's time — so the smallest spare that fits is taken, else a new
 * memory with room to spare (its unwritten pages cost nothing).
 */
export function takeWasmKernels(bytes: number): { kernels: WasmKernels; dirtyBytes: number } | null {
  let fit = -1;
  for (let i = 0; i < spares.length; i++) {
    const size = spares[i].memory.buffer.byteLength;
    if (size >= bytes && (fit < 0 || size < spares[fit].memory.buffer.byteLength)) fit = i;
  }
  if (fit >= 0) {
    const [kernels] = spares.splice(fit, 1);
    return { kernels, dirtyBytes: bytes };
  }
  // every spare is too small: let them go before the new memory is made, so that they do not stay
  // resident beside it (a ladder's factors grow level by level)
  spares.length = 0;
  const kernels = createWasmKernels(Math.min(HEADROOM * bytes, MAX_PAGES * PAGE)) ?? createWasmKernels(bytes);
  return kernels ? { kernels, dirtyBytes: 0 } : null;
}

/** Give back the kernels of a factor that will not be used again; their memory serves the next factor. */
export function giveBackWasmKernels(kernels: WasmKernels): void {
  if (spares.includes(kernels)) return;
  spares.push(kernels);
  // keep the largest spares within the cap
  spares.sort((a, b) => b.memory.buffer.byteLength - a.memory.buffer.byteLength);
  let total = 0;
  for (let i = 0; i < spares.length; i++) {
    total += spares[i].memory.buffer.byteLength;
    if (total > SPARE_BYTES) { spares.length = i; break; }
  }
}
