/**
 * The bundle's layout (src/build/bundle.ts, DEVELOPERS.md "Build"): its entries, and the check
 * that every URL a built file makes from its own location (`new URL('…', import.meta.url)`) still
 * names a file from where the bundle puts the code. Kept apart from bundle.ts so that the tests
 * read it without loading the bundler.
 */
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

/**
 * Entry name (the file name without .js, in dist/bundle/) → tsc's output it bundles, relative to
 * dist/. The CLI is also the study/solve worker (it starts its own file); the workers' names are
 * the ones src/sweep/runner.ts and src/study/parallel.ts ask for next to themselves.
 */
export const BUNDLE_ENTRIES: Readonly<Record<string, string>> = {
  peakwise: 'cli/main.js',
  'sweep-worker': 'sweep/sweep-worker.js',
  'study-worker': 'study/study-worker.js',
};

/**
 * The study/solve worker's code as one CommonJS file, for V8's code cache (src/cli/code-cache.ts):
 * built from tsc's dist/cli/worker-run.js, found by src/cli/main.ts next to itself.
 */
export const WORKER_BODY = { file: 'worker-body.cjs', from: 'cli/worker-run.js' } as const;

/**
 * `new URL('<literal>', import.meta.url)` in a built file, or in the CommonJS build the same with
 * the bundler's stand-in for import.meta.url, `require("url").pathToFileURL(__filename).href`.
 */
const SELF_URL = /new URL\(\s*(["'])([^"']+)\1\s*,\s*(?:import\.meta\.url|require\("url"\)\.pathToFileURL\(__filename\)\.href)\s*\)/g;

export interface SelfUrl {
  /** the .js file (its name in `dir`) */
  file: string;
  /** the literal */
  url: string;
  /** the path it resolves to when the file runs where it is */
  target: string;
  exists: boolean;
}

/** Every relative URL literal the .js and .cjs files of `dir` build from their own location, resolved. */
export function selfUrls(dir: string): SelfUrl[] {
  const out: SelfUrl[] = [];
  for (const file of readdirSync(dir).filter((n) => n.endsWith('.js') || n.endsWith('.cjs')).sort()) {
    const path = join(dir, file);
    for (const m of readFileSync(path, 'utf8').matchAll(SELF_URL)) {
      const target = fileURLToPath(new URL(m[2], pathToFileURL(path)));
      out.push({ file, url: m[2], target, exists: existsSync(target) });
    }
  }
  return out;
}

/**
 * The URLs of `selfUrls` that name no existing file, as lines: a path the layout broke. `optional`
 * literals may be absent (tsc's dist/cli/ has no `./worker-body.cjs`; the bundle must have it).
 */
export function brokenSelfUrls(dir: string, optional: readonly string[] = []): string[] {
  return selfUrls(dir).filter((u) => !u.exists && !optional.includes(u.url)).map((u) => `${u.file}: new URL('${u.url}') → ${u.target}`);
}
