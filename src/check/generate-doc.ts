/**
 * Regenerates docs/verification.md: `node dist/check/generate-doc.js [out-file]`.
 * Runs the checks in-process, takes their `--json` form and writes the markdown table.
 */
import { writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { VERSION } from '../version.js';
import { runChecks, checksJson } from './run.js';
import { checksMarkdown } from './markdown.js';

export function verificationDoc(): { markdown: string; failed: number } {
  const json = checksJson(runChecks());
  return { markdown: checksMarkdown(json, { version: VERSION, command: 'node dist/check/generate-doc.js' }), failed: json.cases.filter((c) => !c.pass).length };
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const out = process.argv[2] ?? 'docs/verification.md';
  const { markdown, failed } = verificationDoc();
  writeFileSync(out, markdown);
  process.stdout.write(`wrote ${out}${failed ? ` (${failed} failing case${failed === 1 ? '' : 's'})` : ''}\n`);
  if (failed) process.exitCode = 1;
}
