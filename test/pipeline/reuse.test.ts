/**
 * The reuse store of a warm process (src/pipeline/reuse.ts, docs/watch.md "Reuse"): an edit that
 * changes only loads takes the kept mesh and factor, a changed support, material, thickness or state
 * misses the factor (and keeps the mesh), a changed outline misses both; whatever was taken, the
 * solution is bit for bit the one of a solve with the store off. The independent check of a reused
 * factor is linearity: doubling the traction of a linear elastic plate doubles every displacement,
 * and scaling a right-hand side by 2 is exact in binary floating point, so the reused factor must give
 * exactly 2·u (no tolerance: every operation of the solve is linear in b and 2× is exact).
 */
import { afterEach, describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { baseSizeField, problemOf, solveAt, type SolveLimits } from '../../src/pipeline/index.js';
import { contentKey, ReuseStore, reuseStore } from '../../src/pipeline/reuse.js';

interface Variant { pull?: number; tau?: number; E?: number; nu?: number; t?: number; state?: string; fix?: string; w?: number; comment?: string }

/** An invented gusset plate with a slot-shaped notch, held on its left edge, sheared on its right. */
const text = (v: Variant = {}): string => `${v.comment ?? ''}
title: gusset with a notch
params: { tau: ${v.tau ?? 5}, w: ${v.w ?? 80} }
material: { E: ${v.E ?? 70000}, nu: ${v.nu ?? 0.33} }
thickness: ${v.t ?? 4}
state: ${v.state ?? 'plane-stress'}
plate:
  outline: [[0, 0], [w, 0], [w, 30], [40, 30], { at: [36, 26], round: 2 }, [32, 30], [0, 30]]
supports:
  - { where: { x: 0 }, fix: ${v.fix ?? '[x, y]'} }
${v.fix === '[x]' ? '  - { where: { y: 0 }, fix: [y] }\n' : ''}${v.pull !== undefined ? `  - { where: { x: w }, displace: [null, ${v.pull}] }\n` : ''}loads:
  - { where: { x: w }, traction: [0, -tau] }
mesh: { size: 6, order: 2 }
`;

function solve(v: Variant, limits: SolveLimits = {}): ReturnType<typeof solveAt> {
  const problem = problemOf(parseModel(text(v), 'gusset.yaml'));
  return solveAt(problem, baseSizeField(problem), 2, limits, { sizeKey: 'base' });
}

/** A solve with the store off (as a plain run), for comparison. */
function fresh(v: Variant): ReturnType<typeof solveAt> {
  const on = reuseStore.enabled;
  reuseStore.disable();
  try {
    return solve(v);
  } finally {
    if (on) reuseStore.enable();
  }
}

const same = (a: ArrayLike<number>, b: ArrayLike<number>): boolean => a.length === b.length && Array.from(a).every((x, i) => Object.is(x, b[i]));

afterEach(() => reuseStore.disable());

describe('content keys', () => {
  it('tell apart what a stage could read differently, and only that', () => {
    expect(contentKey({ a: 1, b: [2, 3] })).toBe(contentKey({ b: [2, 3], a: 1 })); // key order is not content
    expect(contentKey(0)).not.toBe(contentKey(-0));
    expect(contentKey(1)).not.toBe(contentKey('1'));
    expect(contentKey(new Float64Array([1, 2]))).not.toBe(contentKey([1, 2]));
    expect(contentKey(new Int32Array([1]))).not.toBe(contentKey(new Uint32Array([1])));
    expect(contentKey({ a: undefined })).not.toBe(contentKey({}));
    expect(contentKey(['ab', 'c'])).not.toBe(contentKey(['a', 'bc']));
    expect(() => contentKey({ f: (x: number) => x })).toThrow(/cannot key a function/);
  });
});

describe('the reuse store', () => {
  it('is off by default: a plain run keeps nothing', () => {
    solve({});
    expect(reuseStore.size.entries).toBe(0);
  });

  it('a load-only edit or a comment takes the mesh and the factor; the solution doubles exactly with the traction', () => {
    reuseStore.enable();
    const a = solve({});
    expect(reuseStore.endRun()).toEqual({});
    const b = solve({ tau: 10, comment: '# a note' });
    expect(reuseStore.endRun()).toEqual({ mesh: 1, stiffness: 1 });
    expect(b.mesh).toBe(a.mesh);
    expect(b.solution.u.every((x, i) => x === 2 * a.solution.u[i])).toBe(true);
    expect(same(b.solution.u, fresh({ tau: 10 }).solution.u)).toBe(true);
    expect(same(b.field.stress, fresh({ tau: 10 }).field.stress)).toBe(true);
    expect(same(b.solution.reaction, fresh({ tau: 10 }).solution.reaction)).toBe(true);
  });

  it('a kept factor is not overwritten by the factorisations after it (a factor let go gives its memory to the next one)', () => {
    reuseStore.enable();
    const a = solve({});
    solve({ w: 90 });
    solve({ E: 71000 });
    const b = solve({ tau: 10 });
    expect(reuseStore.endRun()).toEqual({ mesh: 2, stiffness: 1 }); // E: the w = 80 mesh again, a new factor
    expect(b.solution.u.every((x, i) => x === 2 * a.solution.u[i])).toBe(true);
    // the w = 90 and E = 71000 work was let go after the run; the memory it gave back serves these
    expect(same(solve({ w: 100 }).solution.u, fresh({ w: 100 }).solution.u)).toBe(true);
    expect(same(solve({ tau: 10 }).solution.u, b.solution.u)).toBe(true);
  });

  it('an edited prescribed displacement takes the factor (the values reach only the right-hand side, K_fc u_c)', () => {
    reuseStore.enable();
    const a = solve({ pull: -0.01 });
    reuseStore.endRun();
    const b = solve({ pull: -0.02, tau: 10 });
    expect(reuseStore.endRun()).toEqual({ mesh: 1, stiffness: 1 });
    expect(b.solution.u.every((x, i) => x === 2 * a.solution.u[i])).toBe(true);
    expect(same(b.solution.u, fresh({ pull: -0.02, tau: 10 }).solution.u)).toBe(true);
    expect(same(b.solution.reaction, fresh({ pull: -0.02, tau: 10 }).solution.reaction)).toBe(true);
  });

  it.each<[string, Variant]>([
    ['E', { E: 71000 }],
    ['ν', { nu: 0.3 }],
    ['thickness', { t: 5 }],
    ['state', { state: 'plane-strain' }],
    ['support (a roller instead of a clamp)', { fix: '[x]' }],
    ['support (a prescribed displacement added)', { pull: -0.01 }],
  ])('a changed %s keeps the mesh and misses the factor; the solution is a fresh solve\'s', (_what, v) => {
    reuseStore.enable();
    solve({});
    reuseStore.endRun();
    const b = solve(v);
    expect(reuseStore.endRun()).toEqual({ mesh: 1 });
    expect(same(b.solution.u, fresh(v).solution.u)).toBe(true);
  });

  it('a geometry edit misses both, and a run keeps only what it used', () => {
    reuseStore.enable();
    solve({});
    reuseStore.endRun();
    expect(reuseStore.size.entries).toBe(2);
    const b = solve({ w: 90 });
    expect(reuseStore.endRun()).toEqual({});
    expect(reuseStore.size.entries).toBe(2); // the w = 80 mesh and factor are dropped
    expect(same(b.solution.u, fresh({ w: 90 }).solution.u)).toBe(true);
    solve({});
    expect(reuseStore.endRun()).toEqual({});
  });

  it('after a failed run nothing is dropped', () => {
    reuseStore.enable();
    solve({});
    reuseStore.endRun();
    expect(() => solve({ fix: '[]' })).toThrow();
    reuseStore.endRun(true);
    solve({});
    expect(reuseStore.endRun()).toEqual({ mesh: 1, stiffness: 1 });
  });

  it('a value read back keeps what it was made from in use; one not read back lets it go', () => {
    const store = new ReuseStore();
    store.enable();
    const size = () => ({ bytes: 1, dofs: 0 });
    const make = (): object => { store.keep('mesh-of-level', {}, { bytes: 1, dofs: 1 }, {}); return {}; };
    store.kept('level', 'level', make, size, {});
    store.endRun();
    expect(store.kept('level', 'level', () => { throw new Error('made again'); }, size, {})).toBeDefined();
    expect(store.endRun()).toEqual({ level: 1 });
    expect(store.size.entries).toBe(2); // the mesh was not taken, but the level read back holds it
    store.endRun(); // a run that used neither
    expect(store.size.entries).toBe(0);
  });

  it('holds no more than the factor-memory cap and the dof cap allow', () => {
    reuseStore.enable();
    const a = solve({});
    const held = reuseStore.size;
    expect(held.dofs).toBe(a.solution.dofs);
    // room for one solve's entries, not two: the second geometry's replace the first's
    const limits = { maxFactorBytes: 1.5 * held.bytes };
    reuseStore.disable();
    reuseStore.enable();
    solve({}, limits);
    const b = solve({ w: 90 }, limits);
    expect(reuseStore.size.bytes).toBeLessThanOrEqual(limits.maxFactorBytes);
    expect(same(b.solution.u, fresh({ w: 90 }).solution.u)).toBe(true);
    expect(reuseStore.size.entries).toBeLessThan(4);
    // a dof cap below one mesh keeps no mesh
    const store = new ReuseStore();
    store.enable();
    store.keep('m', {}, { bytes: 10, dofs: 100 }, { maxDofs: 99 });
    store.keep('n', {}, { bytes: 10, dofs: 50 }, { maxDofs: 99 });
    store.keep('o', {}, { bytes: 10, dofs: 40 }, { maxDofs: 99 });
    expect(store.size).toEqual({ entries: 2, bytes: 20, dofs: 90 });
    store.keep('p', {}, { bytes: 10, dofs: 40 }, { maxDofs: 99 }); // 'n', the least recently used, goes
    expect(store.take('n')).toBeUndefined();
    expect(store.take('o')).toBeDefined();
  });
});
