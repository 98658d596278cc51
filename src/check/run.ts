import pc from 'picocolors';
import { isPeakwiseError } from '../errors.js';
import { CAUTION, stripControl } from '../report/index.js';
import { CHECK_CASES } from './cases.js';
import type { CheckCase, CheckResult } from './types.js';

export interface RunChecksOptions {
  /** case ids to run (see CHECK_CASES); all when absent */
  only?: string[];
  /** called before each case (done of total, case id) and once at the end */
  onProgress?(done: number, total: number, label: string): void;
}

/**
 * Runs the verification cases. A case that throws does not stop the suite: it becomes a failed
 * row carrying the message, so the table always shows every case.
 */
export function runChecks(opts: RunChecksOptions = {}): CheckResult[] {
  let cases: readonly CheckCase[] = CHECK_CASES;
  if (opts.only && opts.only.length > 0) {
    const unknown = opts.only.filter((id) => !CHECK_CASES.some((c) => c.id === id));
    if (unknown.length > 0) {
      throw new RangeError(`unknown check case ${unknown.join(', ')} (have ${CHECK_CASES.map((c) => c.id).join(', ')})`);
    }
    cases = CHECK_CASES.filter((c) => opts.only!.includes(c.id));
  }
  const out: CheckResult[] = [];
  cases.forEach((c, i) => {
    opts.onProgress?.(i, cases.length, c.id);
    const t0 = performance.now();
    try {
      const rows = c.run();
      const seconds = (performance.now() - t0) / 1000;
      for (const r of rows) out.push({ caseId: c.id, ...r, seconds: seconds / rows.length });
    } catch (e) {
      const message = isPeakwiseError(e) || e instanceof Error ? e.message : String(e);
      out.push({
        caseId: c.id, name: c.id, source: '', quantity: 'case could not run', reference: NaN, value: NaN, error: NaN, tolerance: NaN,
        pass: false, failure: message, seconds: (performance.now() - t0) / 1000,
      });
    }
  });
  opts.onProgress?.(cases.length, cases.length, 'done');
  return out;
}

/** Figures for the table: 6 significant digits, tiny errors in exponent form. */
export function formatFigure(v: number, sig = 6): string {
  if (!Number.isFinite(v)) return '—';
  if (v === 0) return '0';
  const abs = Math.abs(v);
  if (abs < 1e-3 || abs >= 1e6) return v.toExponential(Math.max(1, sig - 1));
  return String(Number(v.toPrecision(sig)));
}

export function formatError(e: number): string {
  if (!Number.isFinite(e)) return '—';
  if (e < 1e-4) return e.toExponential(1);
  return `${(100 * e).toPrecision(2)} %`;
}

/** Error column: relative errors in percent, absolute ones (exponents) as plain numbers. */
export function errorText(r: Pick<CheckResult, 'quantity'>, e: number): string {
  return r.quantity.includes('absolute') ? formatFigure(e, 2) : formatError(e);
}

/** "reference inside band" cell: yes/NO with the half-width for study rows, n/a for single solves. */
export function bandText(band: { halfWidth: number | null; inside: boolean | null } | undefined | null): string {
  if (!band || band.inside === null) return 'n/a';
  const hw = band.halfWidth === null || !Number.isFinite(band.halfWidth) ? 'no band' : `± ${formatFigure(band.halfWidth, 2)}`;
  return `${band.inside ? 'yes' : 'NO'} (${hw})`;
}

export function tableRows(results: readonly CheckResult[]): string[][] {
  return results.map((r) => [
    stripControl(r.name),
    stripControl(r.source),
    stripControl(r.quantity),
    formatFigure(r.reference),
    formatFigure(r.value),
    errorText(r, r.error),
    errorText(r, r.tolerance),
    bandText(r.band),
    r.pass ? 'pass' : 'FAIL',
  ]);
}

export const TABLE_HEADER = ['case', 'source', 'quantity', 'reference', 'peakwise', 'error', 'tolerance', 'reference inside band', 'result'];

// eslint-disable-next-line no-control-regex
const ANSI = /\u001b\[[0-9;]*m/g;
const width = (t: string) => [...t.replace(ANSI, '')].length;

/**
 * The verification table for the terminal: one row per case (case, source, quantity,
 * reference, peakwise, error, tolerance, pass/FAIL), a summary line and the caution.
 */
export function checksTable(results: readonly CheckResult[], options: { color: boolean; wrap?: number }): string {
  const c = pc.createColors(options.color);
  const wrapAt = options.wrap ?? 44;
  // long text columns (source, quantity) wrap onto continuation lines so the table fits a terminal
  const wrapped = [TABLE_HEADER, ...tableRows(results)].map((r) => r.map((cell, j) => (j === 1 || j === 2 ? wrapText(cell, wrapAt) : [cell])));
  const widths = TABLE_HEADER.map((_, j) => Math.max(...wrapped.map((r) => Math.max(...r[j].map(width)))));
  const lines: string[] = [];
  wrapped.forEach((r, i) => {
    const height = Math.max(...r.map((cell) => cell.length));
    for (let k = 0; k < height; k++) {
      const cells = r.map((cellLines, j) => {
        const text = cellLines[k] ?? '';
        const padded = j === r.length - 1 ? text : text + ' '.repeat(widths[j] - width(text));
        if (i > 0 && j === r.length - 1 && k === 0) return results[i - 1].pass ? c.green(padded) : c.red(c.bold(padded));
        return padded;
      });
      const line = cells.join('  ').trimEnd();
      lines.push(i === 0 ? c.bold(line) : line);
    }
  });
  const failed = results.filter((r) => !r.pass);
  for (const r of failed) if (r.failure) lines.push(c.red(`${stripControl(r.name)}: ${stripControl(r.failure)}`));
  const seconds = results.reduce((s, r) => s + (r.seconds ?? 0), 0);
  lines.push('');
  lines.push(
    failed.length === 0
      ? c.green(`all ${results.length} checks pass`) + c.dim(` (${seconds.toFixed(1)} s)`)
      : c.red(`${failed.length} of ${results.length} checks fail`) + c.dim(` (${seconds.toFixed(1)} s)`),
  );
  lines.push(c.dim(CAUTION));
  return lines.join('\n') + '\n';
}

/** Greedy word wrap at `max` visible characters (a longer single word stays whole). */
function wrapText(text: string, max: number): string[] {
  const out: string[] = [];
  let line = '';
  for (const word of text.split(' ')) {
    if (line && width(line) + 1 + width(word) > max) {
      out.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  out.push(line);
  return out;
}

export interface ChecksJson {
  cases: {
    name: string; source: string; quantity: string; reference: number | null; value: number | null; error: number | null; tolerance: number | null;
    /** study rows: the band's half-width and whether it holds the reference; null for single solves */
    halfWidth: number | null; insideBand: boolean | null;
    pass: boolean;
  }[];
}

const num = (v: number): number | null => (Number.isFinite(v) ? v : null);

/**
 * `--json` output: `{ "cases": [ { name, source, quantity, reference, value, error, tolerance, halfWidth,
 * insideBand, pass } ] }` (NaN → null; halfWidth and insideBand null for single-solve rows).
 */
export function checksJson(results: readonly CheckResult[]): ChecksJson {
  return {
    cases: results.map((r) => ({
      name: r.name, source: r.source, quantity: r.quantity,
      reference: num(r.reference), value: num(r.value), error: num(r.error), tolerance: num(r.tolerance),
      halfWidth: r.band ? num(r.band.halfWidth) : null, insideBand: r.band ? r.band.inside : null,
      pass: r.pass,
    })),
  };
}
