import { describe, it, expect, vi, afterEach } from 'vitest';
import { Command } from 'commander';

// Replace the suite by one failing row: the command must print it and set exit status 1 without throwing.
vi.mock('../../src/check/index.js', async (importOriginal) => {
  const real = await importOriginal<typeof import('../../src/check/index.js')>();
  return {
    ...real,
    runChecks: () => [{ caseId: 'x', name: 'deliberately off', source: 'test 2026', quantity: 'q', reference: 1, value: 1.5, error: 0.5, tolerance: 0.01, pass: false }],
  };
});

afterEach(() => {
  vi.restoreAllMocks();
  process.exitCode = undefined;
});

describe('peakwise check exit status', () => {
  it('a failing case → FAIL in the table and exit status 1, no exception', async () => {
    const { registerCheck } = await import('../../src/cli/check.js');
    let out = '';
    vi.spyOn(process.stdout, 'write').mockImplementation((chunk: string | Uint8Array) => { out += String(chunk); return true; });
    const p = new Command().exitOverride();
    registerCheck(p, { file: undefined, model: undefined });
    const before = new Set(process.listeners('beforeExit'));
    await p.parseAsync(['node', 'peakwise', 'check', '--no-color']);
    // the command keeps status 1 past main()'s own assignment with a beforeExit hook; drop it here
    const added = process.listeners('beforeExit').filter((l) => !before.has(l));
    expect(added.length).toBe(1);
    for (const l of added) process.removeListener('beforeExit', l);
    expect(out).toMatch(/deliberately off.*FAIL/);
    expect(out).toMatch(/1 of 1 checks fail/);
    expect(process.exitCode).toBe(1);
  });
});
