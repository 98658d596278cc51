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
 * no copying; the memory is sized once and never grown, which keeps the view valid.
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
