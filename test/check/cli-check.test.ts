import { describe, it, expect, vi, afterEach } from 'vitest';
import { Command } from 'commander';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { registerCheck } from '../../src/cli/register.js';

/* The `check` command wired on a bare commander program, one fast case only (the full suite runs in checks.test.ts). */
function program(): Command {
  const p = new Command().exitOverride();
  registerCheck(p, { file: undefined, model: undefined });
  return p;
}

afterEach(() => {
  vi.restoreAllMocks();
  process.exitCode = undefined;
});

describe('peakwise check (command)', () => {
  it('--json prints { cases } for the chosen case and leaves the exit status 0 when it passes', async () => {
    let out = '';
    vi.spyOn(process.stdout, 'write').mockImplementation((chunk: string | Uint8Array) => { out += String(chunk); return true; });
    const dir = mkdtempSync(join(tmpdir(), 'pw-check-'));
    try {
      const report = join(dir, 'check.html');
      await program().parseAsync(['node', 'peakwise', 'check', '--only', 'patch-cst', '--json', '--report', report]);
      const json = JSON.parse(out);
      expect(json.cases).toHaveLength(1);
      expect(json.cases[0].name).toBe('patch test, CST');
      expect(json.cases[0].pass).toBe(true);
      expect(process.exitCode ?? 0).toBe(0);
      const html = readFileSync(report, 'utf8');
      expect(html).toMatch(/^<!DOCTYPE html>/);
      expect(html).toMatch(/MacNeal &amp; Harder 1985/);
      expect(html).toMatch(/qualified engineer/);
      expect(html).not.toMatch(/<script|src="http/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
  it('an unknown case id is a usage error naming it', async () => {
    await expect(program().parseAsync(['node', 'peakwise', 'check', '--only', 'kirsh'])).rejects.toThrow(/"kirsh"/);
  });
});
