import { describe, expect, it } from 'vitest';
import { analyze, factorize, releaseFactor, factorKernels } from '../../src/linalg/index.js';
import type { Csr } from '../../src/linalg/types.js';
import { gridKronecker } from './helpers.js';

const factorOf = (A: Csr) => factorize(A, analyze(A));
const copy = (v: Float64Array) => Float64Array.from(v);
const same = (a: Float64Array, b: Float64Array) => a.length === b.length && a.every((x, i) => Object.is(x, b[i]));

// A factor given back lends its WebAssembly memory to the next one (no fresh pages to fault in).
// The memory then holds an old factor, or is grown: the new factor must be bit for bit the one a
// fresh memory gives.
describe('factor memory given back and taken again', () => {
  it('a smaller factor on a dirty spare, and a larger one on a grown spare, equal their fresh factors', () => {
    const small = gridKronecker(12, 10).A, mid = gridKronecker(30, 24).A, large = gridKronecker(48, 40).A;
    const fs = factorOf(small), fl = factorOf(large);
    if (factorKernels(fs) !== 'wasm') return; // no WebAssembly SIMD here: nothing is given back
    const freshSmall = copy(fs.values), freshLarge = copy(fl.values);
    const fm = factorOf(mid);
    const midBuffer = fm.values.buffer;
    releaseFactor(fm); // a spare holding the mid factor
    const again = factorOf(small); // takes it: must clear the old values first
    expect(again.values.buffer).toBe(midBuffer); // the spare was taken, not a fresh memory
    expect(same(again.values, freshSmall)).toBe(true);
    releaseFactor(again);
    const grown = factorOf(large); // the spare is too small: grown, its old part cleared
    expect(same(grown.values, freshLarge)).toBe(true);
    expect(midBuffer.byteLength).toBe(0); // growing the spare detached its old buffer: the same memory
  });
});
