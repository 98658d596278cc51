/**
 * The bundled command line, dist/bundle/: the second build output, made from tsc's dist/ by
 * rolldown, and the one `bin` and `npm start` run. Node 20's ESM loader pays per module file
 * (resolve, read, compile, link); the CLI is some 220 files (95 of them zod's locales), and that
 * per-file cost was most of a short command's start (docs/speed.md, "Start-up"). The library
 * export (`exports: ./dist/index.js`) stays unbundled.
 *
 * Run after tsc by `npm run build` and `prepare`: `node dist/build/bundle.js`.
 *
 * Layout (DEVELOPERS.md, "Build"): one flat folder, every file at the depth of tsc's
 * dist/<stage>/x.js, so that every URL the code builds from its own `import.meta.url` resolves
 * the same in both outputs — `../../docs/verification.json` to the package's docs/, and the two
 * workers by file names that are unique over the program, `./sweep-worker.js` and
 * `./study-worker.js`. Entries: `peakwise.js` (the CLI, also the study/solve worker, which is the
 * CLI's own file), `sweep-worker.js`, `study-worker.js`. The actions' dynamic imports stay chunks
 * of their own, so `--version` still loads only the command definitions.
 *
 * The study/solve worker's code is built a second time as one CommonJS file, `worker-body.cjs`
 * (from dist/cli/worker-run.js, every dynamic import inlined), which the worker compiles with V8's
 * code cache (src/cli/code-cache.ts): Node 20 keeps no compiled code for ES modules.
 *
 * Written atomically: the bundle is built into a fresh sibling folder, its URLs checked, and only
 * then put in place of the old one.
 */
import { chmodSync, existsSync, mkdtempSync, renameSync, rmSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'rolldown';
import { BUNDLE_ENTRIES, WORKER_BODY, brokenSelfUrls } from './layout.js';

/** Bundle `<dist>/` into `<dist>/bundle/`; returns the files written. */
export async function bundleCli(dist: string): Promise<string[]> {
  for (const [name, from] of Object.entries(BUNDLE_ENTRIES)) {
    if (!existsSync(join(dist, from))) throw new Error(`bundle: entry ${name} needs ${join(dist, from)}; run tsc first`);
  }
  const target = join(dist, 'bundle');
  // a sibling folder: the same depth, so the URL check below holds for the final place too
  const tmp = mkdtempSync(join(dist, 'bundle-tmp-'));
  try {
    chmodSync(tmp, 0o755); // mkdtemp makes it private; the bundle is read by every user, as dist/ is
    const out = await build({
      input: Object.fromEntries(Object.entries(BUNDLE_ENTRIES).map(([name, from]) => [name, join(dist, from)])),
      cwd: dirname(dist),
      platform: 'node',
      logLevel: 'warn',
      output: {
        dir: tmp,
        format: 'esm',
        entryFileNames: '[name].js',
        chunkFileNames: 'chunk-[name]-[hash].js',
        // maps back to tsc's dist/ files: for `node --enable-source-maps` and the benchmark's breakdown
        sourcemap: true,
      },
    });
    // the worker's code once more, as one CommonJS file that V8 can compile from its code cache
    const body = await build({
      input: { [WORKER_BODY.file.replace(/\.cjs$/, '')]: join(dist, WORKER_BODY.from) },
      cwd: dirname(dist),
      platform: 'node',
      logLevel: 'warn',
      output: { dir: tmp, format: 'cjs', entryFileNames: '[name].cjs', codeSplitting: false, sourcemap: true },
    });
    out.output.push(...body.output);
    const broken = brokenSelfUrls(tmp);
    if (broken.length > 0) throw new Error(`bundle: URLs that would not resolve from dist/bundle/:\n  ${broken.join('\n  ')}`);
    chmodSync(join(tmp, 'peakwise.js'), 0o755);
    rmSync(target, { recursive: true, force: true });
    renameSync(tmp, target);
    return out.output.map((o) => o.fileName).sort();
  } catch (e) {
    rmSync(tmp, { recursive: true, force: true });
    throw e;
  }
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const dist = resolve(import.meta.dirname, '..');
  const t0 = performance.now();
  bundleCli(dist).then(
    (files) => {
      const js = files.filter((f) => f.endsWith('.js')).length;
      process.stdout.write(`bundle: dist/bundle/ written, ${js} .js files (${Object.keys(BUNDLE_ENTRIES).join('.js, ')}.js and their chunks) and ${WORKER_BODY.file}, in ${((performance.now() - t0) / 1000).toFixed(1)} s\n`);
    },
    (e: unknown) => {
      process.stderr.write(`${e instanceof Error ? e.message : String(e)}\n`);
      process.exitCode = 1;
    },
  );
}
