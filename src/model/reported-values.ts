/**
 * `reported` (issue 15; docs/other-analysis.md): values another analysis reported at spots of this
 * detail, written in the model file or read from a CSV with the columns x, y, value, size and,
 * optionally, measure, case, label and order. Every bad entry is one error naming its key path
 * (`reported[1].size`) or the CSV file and line.
 */
import { joinPath } from './keypath.js';
import { IMPLICIT_CASE } from './cases.js';
import { decimalCell, splitFields } from './csv.js';
import { ImportError, readImportedText, type ReadFile } from './imports.js';
import { MEASURES, REPORTED_COLUMNS, type ModelFile, type RawPoint } from './schema.js';
import { didYouMean, quote } from './text.js';
import type { Point, ReportedValue, StressMeasure } from './types.js';

/** What the model builder lends this module (build.ts's Builder has it). */
export interface ReportedBuilder {
  readFile: ReadFile | undefined;
  num(raw: number | string, keyPath: string, quantity?: string, rule?: { test: (v: number) => boolean; text: string }, unit?: string): number;
  point(raw: RawPoint, keyPath: string): Point;
  fail(message: string, keyPath: string): never;
  imported<T>(keyPath: string, f: () => T): T;
}

/**
 * The name of the one case a model without `cases` has: its `loads`. A reported value's `case` must
 * name a case or combination of the model (contracts §5); until load cases exist, this is the only one.
 */


/**
 * Is `name` a load case or combination of the model? `caseNames` are the model's case and combination
 * names (empty for a model without `cases`, whose only case is IMPLICIT_CASE). Returns the error text, or
 * undefined when the name is known.
 */
export function reportedCaseRule(name: string, caseNames: readonly string[]): string | undefined {
  const known = caseNames.length > 0 ? caseNames : [IMPLICIT_CASE];
  if (known.includes(name)) return undefined;
  if (caseNames.length === 0) {
    return `case ${quote(name)} is not a load case of this model: it has no cases, only its loads (case: ${IMPLICIT_CASE}, or leave case out)`;
  }
  return `case ${quote(name)} is not a load case or combination of this model${didYouMean(name, known)}; known: ${known.join(', ')}`;
}

const ORDER_RULE = { test: (v: number) => v === 1 || v === 2, text: 'must be 1 (linear elements) or 2 (quadratic elements)' };
const SIZE_RULE = { test: (v: number) => v > 0, text: 'must be > 0 (the element edge length there)' };

type RawReported = NonNullable<ModelFile['reported']>[number];

/** One CSV row → a reported value; errors name file and line. */
function rowValue(file: string, line: number, header: string[], fields: string[], measure: StressMeasure, caseNames: readonly string[], keyPath: string): ReportedValue {
  const where = `${file}:${line}`;
  const cell = (name: string): string | undefined => {
    const k = header.indexOf(name);
    if (k < 0 || k >= fields.length) return undefined;
    const t = fields[k].trim();
    return t === '' ? undefined : t;
  };
  const number = (name: string, required: boolean): number | undefined => {
    const t = cell(name);
    if (t === undefined) {
      if (required) throw new ImportError(`${where}: column '${name}' is empty; a reported value needs x, y, value and size`);
      return undefined;
    }
    const v = decimalCell(t);
    if (typeof v !== 'number') throw new ImportError(`${where}: column '${name}' is ${quote(t)}, ${v.reason}`);
    return v;
  };
  const x = number('x', true)!, y = number('y', true)!, value = number('value', true)!, size = number('size', true)!;
  if (!(size > 0)) throw new ImportError(`${where}: column 'size' must be > 0 (the element edge length there), got ${size}`);
  const m = cell('measure');
  if (m !== undefined && !(MEASURES as readonly string[]).includes(m)) {
    throw new ImportError(`${where}: column 'measure' is ${quote(m)}; expected one of ${MEASURES.join(', ')}${didYouMean(m, MEASURES)}`);
  }
  const order = number('order', false);
  if (order !== undefined && order !== 1 && order !== 2) throw new ImportError(`${where}: column 'order' must be 1 (linear) or 2 (quadratic), got ${order}`);
  const c = cell('case');
  if (c !== undefined) {
    const bad = reportedCaseRule(c, caseNames);
    if (bad) throw new ImportError(`${where}: ${bad}`);
  }
  const label = cell('label');
  return {
    at: [x, y], value, size, measure: (m as StressMeasure | undefined) ?? measure,
    ...(c !== undefined ? { case: c } : {}), ...(label !== undefined ? { label } : {}), ...(order !== undefined ? { order: order as 1 | 2 } : {}),
    keyPath: `${keyPath} (${where})`,
  };
}

/** Rows of a reported-values CSV: a header naming the columns (any order; x, y, value, size required). */
export function reportedTable(text: string, file: string, measure: StressMeasure, caseNames: readonly string[], keyPath: string): ReportedValue[] {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  let header: string[] | undefined;
  const out: ReportedValue[] = [];
  for (let i = 0; i < lines.length; i++) {
    const raw = lines[i].trim();
    if (raw === '' || raw.startsWith('#')) continue;
    const fields = splitFields(raw);
    if (!header) {
      header = fields.map((f) => f.toLowerCase());
      const unknown = header.find((h) => !(REPORTED_COLUMNS as readonly string[]).includes(h));
      if (unknown !== undefined) {
        throw new ImportError(`${file}:${i + 1}: unknown column ${quote(unknown)}${didYouMean(unknown, REPORTED_COLUMNS)}; the columns are ${REPORTED_COLUMNS.join(', ')}`);
      }
      const missing = ['x', 'y', 'value', 'size'].filter((k) => !header!.includes(k));
      if (missing.length > 0) throw new ImportError(`${file}:${i + 1}: the header must name the columns x, y, value and size; missing ${missing.join(', ')}`);
      continue;
    }
    if (fields.length > header.length) throw new ImportError(`${file}:${i + 1}: the row has ${fields.length} fields, the header ${header.length}`);
    out.push(rowValue(file, i + 1, header, fields, measure, caseNames, keyPath));
  }
  if (out.length === 0) throw new ImportError(`${file}: no reported values (a header row, then one row per value)`);
  return out;
}

/** The model's `reported` list, evaluated and checked; `caseNames` as for reportedCaseRule. */
export function buildReported(b: ReportedBuilder, raw: readonly RawReported[] | undefined, measure: StressMeasure, caseNames: readonly string[] = []): ReportedValue[] | undefined {
  if (raw === undefined) return undefined;
  const out: ReportedValue[] = [];
  raw.forEach((r, i) => {
    const keyPath = joinPath('reported', i);
    if (r.table !== undefined) {
      const file = r.table;
      out.push(...b.imported(joinPath(keyPath, 'table'), () => reportedTable(readImportedText(b.readFile, file), file, measure, caseNames, keyPath)));
      return;
    }
    if (r.case !== undefined) {
      const bad = reportedCaseRule(r.case, caseNames);
      if (bad) b.fail(bad, joinPath(keyPath, 'case'));
    }
    out.push({
      at: b.point(r.at!, joinPath(keyPath, 'at')),
      value: b.num(r.value!, joinPath(keyPath, 'value'), 'reported value'),
      size: b.num(r.size!, joinPath(keyPath, 'size'), 'element size', SIZE_RULE),
      measure: r.measure ?? measure,
      ...(r.case !== undefined ? { case: r.case } : {}),
      ...(r.label !== undefined ? { label: r.label } : {}),
      ...(r.order !== undefined ? { order: b.num(r.order, joinPath(keyPath, 'order'), 'element order', ORDER_RULE) as 1 | 2 } : {}),
      keyPath,
    });
  });
  return out;
}
