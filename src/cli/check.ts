/**
 * `peakwise check [--json] [--report file] [--only ids] [--quiet] [--no-color]`: runs the built-in
 * verification suite, prints the table (or the JSON), optionally writes an HTML page, and sets
 * exit status 1 when any case fails.
 */
import { progressBar } from './progress.js';
import { CHECK_CASES, checksHtml, checksJson, checksTable, runChecks, type CheckResult } from '../check/index.js';
import { PeakwiseError } from '../errors.js';
import { VERSION } from '../version.js';
import type { CliContext } from './common.js';
import { useColor } from './common.js';
import { writeFileAtomic } from './io.js';
import { checkTargetFile } from './output-set.js';

export interface CheckCliOptions {
  json?: boolean;
  report?: string;
  only?: string;
  quiet?: boolean;
  color?: boolean;
}


export function runCheck(_ctx: CliContext, opts: CheckCliOptions): void {
  if (opts.report) checkTargetFile(opts.report, `--report ${opts.report}`);
  const bar = progressBar(opts, 'cases');
  let results: CheckResult[];
  try {
    const only = opts.only ? opts.only.split(',').map((id) => id.trim()).filter(Boolean) : undefined;
    if (only) {
      const unknown = only.filter((id) => !CHECK_CASES.some((c) => c.id === id));
      if (unknown.length > 0) {
        throw new PeakwiseError('usage', `--only: no check case ${unknown.map((u) => `"${u}"`).join(', ')} (cases: ${CHECK_CASES.map((c) => c.id).join(', ')})`);
      }
    }
    results = runChecks({ only, onProgress: (d, t, l) => bar.update(d, t, l) });
  } finally {
    bar.stop();
  }
  if (opts.json) process.stdout.write(JSON.stringify(checksJson(results), null, 2) + '\n');
  else process.stdout.write(checksTable(results, { color: useColor(opts) }));
  if (opts.report) {
    writeFileAtomic(opts.report, checksHtml(results, { version: VERSION, date: new Date().toISOString().slice(0, 10) }));
    if (!opts.json && !opts.quiet) process.stderr.write(`wrote ${opts.report}\n`);
  }
  if (results.some((r) => !r.pass)) {
    process.exitCode = 1;
  }
}
