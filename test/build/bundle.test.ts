/**
 * The bundled CLI (src/build/bundle.ts, DEVELOPERS.md "Build"): its three entries are where
 * package.json and the code look for them, and every URL a built file makes from its own location
 * (the two workers, docs/verification.json) names an existing file, in the bundle and in tsc's
 * unbundled dist/.
 */
import { mkdtempSync, mkdirSync, readFileSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { BUNDLE_ENTRIES, WORKER_BODY, brokenSelfUrls, selfUrls } from '../../src/build/layout.js';
import { bin, root } from '../helpers/bin.js';

const scratch = mkdtempSync(join(tmpdir(), 'pw-self-urls-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

describe('the bundle', () => {
  it('is the bin of package.json, with the two workers beside it', () => {
    expect(bin).toBe(join(root, 'dist', 'bundle', 'peakwise.js'));
    // the study/solve worker is the CLI's own file: that code must be in the entry, not in a chunk
    expect(readFileSync(bin, 'utf8')).toContain('new Worker(new URL(import.meta.url)');
    expect(Object.keys(BUNDLE_ENTRIES).sort()).toEqual(['peakwise', 'study-worker', 'sweep-worker']);
    for (const name of Object.keys(BUNDLE_ENTRIES)) expect(readFileSync(join(root, 'dist', 'bundle', `${name}.js`), 'utf8')).toMatch(/\S/);
  });

  it('is readable and enterable by every user, as tsc\'s dist/ is (a user other than the builder runs it)', () => {
    const dir = join(root, 'dist', 'bundle');
    expect(statSync(dir).mode & 0o005).toBe(0o005);
    for (const f of readdirSync(dir)) expect(statSync(join(dir, f)).mode & 0o004, f).toBe(0o004);
  });

  it('its URLs to the workers, the worker body and docs/verification.json resolve to the bundle\'s files and the package docs', () => {
    const urls = selfUrls(join(root, 'dist', 'bundle'));
    const targets = [...new Set(urls.map((u) => u.target))].sort();
    expect(targets).toEqual([
      join(root, 'dist', 'bundle', 'study-worker.js'),
      join(root, 'dist', 'bundle', 'sweep-worker.js'),
      join(root, 'dist', 'bundle', WORKER_BODY.file),
      join(root, 'docs', 'verification.json'),
    ]);
    expect(urls.every((u) => u.exists)).toBe(true);
  });

  it('tsc\'s unbundled cli, sweep and study folders keep theirs', () => {
    // the CommonJS worker body exists only in the bundle; main.js falls back to worker-run.js without it
    for (const d of ['cli', 'sweep', 'study']) expect(brokenSelfUrls(join(root, 'dist', d), [`./${WORKER_BODY.file}`]), d).toEqual([]);
    const targets = ['cli', 'sweep', 'study'].flatMap((d) => selfUrls(join(root, 'dist', d)).filter((u) => u.exists).map((u) => u.target));
    expect(new Set(targets)).toEqual(new Set([join(root, 'dist', 'sweep', 'sweep-worker.js'), join(root, 'dist', 'study', 'study-worker.js'), join(root, 'docs', 'verification.json')]));
  });

  it('the check sees a URL that a layout broke, and passes one that resolves', () => {
    const dir = join(scratch, 'bundle');
    mkdirSync(dir);
    writeFileSync(join(scratch, 'record.json'), '{}');
    writeFileSync(join(dir, 'a.js'), `const ok = new URL('../record.json', import.meta.url);\nconst gone = new URL("./sweep-worker.js", import.meta.url);\n`);
    expect(brokenSelfUrls(dir)).toEqual([`a.js: new URL('./sweep-worker.js') → ${join(dir, 'sweep-worker.js')}`]);
  });
});
