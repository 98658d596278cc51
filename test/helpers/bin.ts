/**
 * The binary the CLI tests run: what users run, the `bin` of package.json (the bundled CLI,
 * dist/bundle/peakwise.js, DEVELOPERS.md "Build"), so that a test runs what `npm install` puts on
 * the path. tsc's unbundled dist/cli/main.js is kept working by one smoke test
 * (test/cli/unbundled.test.ts).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

export const root = join(import.meta.dirname, '..', '..');

const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { bin: { peakwise: string } };

/** package.json's bin, as an absolute path. */
export const bin = join(root, pkg.bin.peakwise);

/** tsc's output of src/cli/main.ts, not bundled. */
export const unbundledBin = join(root, 'dist', 'cli', 'main.js');
