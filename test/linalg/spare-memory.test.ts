import { describe, expect, it } from 'vitest';
import { analyze, factorize, releaseFactor, factorKernels } from '../../src/linalg/index.js';
import type { Csr } from '../../src/linalg/types.js';
import { gridKronecker } from './helpers.js';

const factorOf = (A: Csr) => factorize(A, analyze(A));
const copy = (v: Float64Array) => Float64Array.from(v);
const same = (a: Float64Array, b: Float64Array) => a.length === b.length && a.every((x, i) => Object.is(x, b[i]));

// A factor given back lends its WebAssembly memory to the next one (no fresh pages to fault in). The
// memory then holds an old factor: the new factor must be bit for bit the one a fresh memory gives.
// A new memory is made with room to spare so that the next, somewhat larger factor of a ladder fits;
// a memory is never grown (growing detaches a buffer, which costs every typed-array read in V8).
describe('factor memory given back and taken again', () => {
  it('a smaller and a somewhat larger factor on a spare equal their fresh factors; no buffer is detached', () => {
    const small = gridKronecker(12, 10).A, mid = gridKronecker(30, 24).A, bigger = gridKronecker(33, 26).A, large = gridKronecker(60, 50).A;
    const fs = factorOf(small), fb = factorOf(bigger), fl = factorOf(large);
    // Node 20 has WebAssembly SIMD (test/linalg/kernels.test.ts holds it): the factors live in wasm memory
    expect(factorKernels(fs)).toBe('wasm');
    const freshSmall = copy(fs.values), freshBigger = copy(fb.values), freshLarge = copy(fl.values);
    const fm = factorOf(mid);
    const midBuffer = fm.values.buffer;
    releaseFactor(fm); // a spare holding the mid factor
    const again = factorOf(small); // takes it: must clear the old values first
    expect(again.values.buffer).toBe(midBuffer);
    expect(same(again.values, freshSmall)).toBe(true);
    releaseFactor(again);
    const up = factorOf(bigger); // larger than mid, within its room to spare
    expect(up.values.buffer).toBe(midBuffer);
    expect(same(up.values, freshBigger)).toBe(true);
    releaseFactor(up);
    const big = factorOf(large); // beyond the spare's room: a new memory, the spare stays as it was
    expect(big.values.buffer).not.toBe(midBuffer);
    expect(same(big.values, freshLarge)).toBe(true);
    expect(midBuffer.byteLength).toBeGreaterThan(0);
  });
});
