/**
 * Vitest global set-up: the CLI tests run the bundle (test/helpers/bin.ts), which is made from
 * tsc's dist/ by `node dist/build/bundle.js`. After a plain `npx tsc` the bundle would be older than
 * the code it stands for; rebuild it then (under a second), so the tests never run stale code.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

const root = join(import.meta.dirname, '..', '..');
const dist = join(root, 'dist');

/** The newest modification time of the .js files under `dir`, leaving out `skip`. */
function newestJs(dir: string, skip: string): number {
  let newest = 0;
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const path = join(dir, e.name);
    if (e.isDirectory()) {
      if (path !== skip) newest = Math.max(newest, newestJs(path, skip));
    } else if (e.name.endsWith('.js')) {
      newest = Math.max(newest, statSync(path).mtimeMs);
    }
  }
  return newest;
}

export default function setup(): void {
  const builder = join(dist, 'build', 'bundle.js');
  if (!existsSync(builder)) return; // not built at all: the tests say what is missing
  const entry = join(dist, 'bundle', 'peakwise.js');
  if (existsSync(entry) && statSync(entry).mtimeMs >= newestJs(dist, join(dist, 'bundle'))) return;
  execFileSync(process.execPath, [builder], { cwd: root, stdio: 'inherit' });
}
