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

export function verificationDoc(): { markdown: string; json: string; failed: number } {
  const json = checksJson(runChecks());
  // the same results as data, for the verification strip of every report (src/cli/checks-record.ts)
  const date = new Date().toISOString().slice(0, 10);
  const record = JSON.stringify({ tool: 'peakwise', version: VERSION, date, ...json }, (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? null : v), 2);
  return { markdown: checksMarkdown(json, { version: VERSION, command: 'node dist/check/generate-doc.js', date }), json: record + '\n', failed: json.cases.filter((c) => !c.pass).length };
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const out = process.argv[2] ?? 'docs/verification.md';
  const { markdown, json, failed } = verificationDoc();
  writeFileSync(out, markdown);
  writeFileSync(out.replace(/\.md$/, '') + '.json', json);
  process.stdout.write(`wrote ${out}${failed ? ` (${failed} failing case${failed === 1 ? '' : 's'})` : ''}\n`);
  if (failed) process.exitCode = 1;
}
