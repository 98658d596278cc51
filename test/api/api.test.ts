/**
 * The example of docs/api.md is run as written: the first ```js / ```ts block is extracted, its
 * `from 'peakwise'` import pointed at the built dist/index.js, and the script run with node from
 * the repository folder (its model path is relative to it).
 */
import { execFile } from 'node:child_process';
import { existsSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..', '..');
const entry = join(root, 'dist', 'index.js');

function exampleScript(): string {
  const doc = readFileSync(join(root, 'docs', 'api.md'), 'utf8');
  const m = /```(?:ts|js)\n([\s\S]*?)```/.exec(doc);
  if (!m) throw new Error('docs/api.md has no ```js or ```ts block');
  return m[1].replace(/from\s+['"]peakwise['"]/g, `from '${pathToFileURL(entry).href}'`);
}

describe('docs/api.md example', () => {
  it('the library entry is built with its declarations', () => {
    expect(existsSync(entry)).toBe(true);
    expect(existsSync(join(root, 'dist', 'index.d.ts'))).toBe(true);
  });

  it('runs and prints the corner verdict per radius: singular at r = 0, converging and falling after', async () => {
    const script = exampleScript();
    expect(script).toContain('dist/index.js');
    // next to dist, so the script resolves node_modules the way an installed package would
    const file = join(root, `.api-example-${process.pid}.mjs`);
    writeFileSync(file, script);
    let out: { code: number; stdout: string; stderr: string };
    try {
      out = await new Promise((resolve) => {
        execFile(process.execPath, [file], { cwd: root, encoding: 'utf8', timeout: 120_000 }, (err, stdout, stderr) => {
          resolve({ code: err ? (typeof err.code === 'number' ? err.code : -1) : 0, stdout, stderr });
        });
      });
    } finally {
      rmSync(file, { force: true });
    }
    expect(out.stderr).toBe('');
    expect(out.code).toBe(0);
    const lines = out.stdout.trim().split('\n');
    expect(lines).toHaveLength(4);
    expect(lines[0]).toMatch(/^r = 0: singular, grows like h\^-0\.4\d/); // Williams (1952) 270° free-free: 0.456
    const values = lines.slice(1).map((l) => {
      const m = /^r = (\d+): converging, ([\d.]+) ±/.exec(l);
      expect(m, l).not.toBeNull();
      return Number(m![2]);
    });
    // a larger fillet radius lowers the peak (Peterson's charts: Kt falls as r/d grows)
    expect(values[0]).toBeGreaterThan(values[1]);
    expect(values[1]).toBeGreaterThan(values[2]);
  });
});
