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
    const { registerCheck } = await import('../../src/cli/register.js');
    let out = '';
    vi.spyOn(process.stdout, 'write').mockImplementation((chunk: string | Uint8Array) => { out += String(chunk); return true; });
    const p = new Command().exitOverride();
    registerCheck(p, { file: undefined, model: undefined });
    await p.parseAsync(['node', 'peakwise', 'check', '--no-color']);
    expect(out).toMatch(/deliberately off.*FAIL/);
    expect(out).toMatch(/1 of 1 checks fail/);
    expect(process.exitCode).toBe(1);
  });
});
