/**
 * Small CSV reader for point and displacement tables: one row per line, fields separated by
 * commas (or semicolons, or tabs), `#` starts a comment line, blank lines are skipped. The
 * first row is a header when any of its fields is not a number. Numbers are plain decimals:
 * hexadecimal, binary, `_` separators and `Infinity` are refused, not read the way JavaScript
 * would. Errors name the file and line.
 */
import { quote } from './text.js';

export class CsvError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CsvError';
  }
}

export interface CsvTable {
  /** lower-cased header names, or undefined when the file has no header row */
  header: string[] | undefined;
  /** numeric rows, each with its 1-based line number */
  rows: { line: number; values: number[] }[];
}

export function splitFields(line: string): string[] {
  const sep = line.includes(',') ? ',' : line.includes(';') ? ';' : line.includes('\t') ? '\t' : /\s+/;
  return line.split(sep).map((f) => f.trim().replace(/^"(.*)"$/, '$1').trim());
}

/** Plain decimal notation: what a spreadsheet or a program writes (`-1.5`, `.5`, `2e-3`). */
const DECIMAL = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

const isNumber = (text: string): boolean => DECIMAL.test(text) && Number.isFinite(Number(text));

/**
 * Why a cell that looks numeric is refused, or undefined when it is plain text or a decimal
 * number. JavaScript's Number() would read `0x10` as 16, `0b1` as 1 and `Infinity` as a value;
 * a table of coordinates means none of these.
 */
function notDecimal(text: string): string | undefined {
  if (DECIMAL.test(text)) return Number.isFinite(Number(text)) ? undefined : 'not a finite number (too large)';
  const t = text.replace(/^[+-]/, '');
  if (/^0x[0-9a-f_]+$/i.test(t)) return 'a hexadecimal number; write it in decimal';
  if (/^0b[01_]+$/i.test(t)) return 'a binary number; write it in decimal';
  if (/^0o[0-7_]+$/i.test(t)) return 'an octal number; write it in decimal';
  if (/^[\d.]*_[\d._]*(?:e[+-]?\d+)?$/i.test(t) && /\d/.test(t)) return 'a number with _ separators; write it without them';
  if (/^(?:infinity|inf|nan)$/i.test(t)) return 'not a finite number';
  return undefined;
}

/** A cell as a plain decimal number, or the reason it is not one (for tables that mix text and numbers). */
export function decimalCell(text: string): number | { reason: string } {
  if (isNumber(text)) return Number(text);
  return { reason: notDecimal(text) ?? 'not a number' };
}

export function readCsv(text: string, file: string): CsvTable {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  let header: string[] | undefined;
  const rows: CsvTable['rows'] = [];
  for (let i = 0; i < lines.length; i++) {
    const raw = lines[i].trim();
    if (raw === '' || raw.startsWith('#')) continue;
    const fields = splitFields(raw);
    // a numeric-looking cell in another notation is an error even in the first row (it is
    // not a header name)
    const odd = fields.findIndex((f) => notDecimal(f) !== undefined);
    if (odd >= 0) throw new CsvError(`${file}:${i + 1}: field ${odd + 1} is ${quote(fields[odd])}, ${notDecimal(fields[odd])}`);
    if (header === undefined && rows.length === 0 && fields.some((f) => !isNumber(f))) {
      header = fields.map((f) => f.toLowerCase());
      continue;
    }
    const values = fields.map(Number);
    const bad = fields.findIndex((f) => !isNumber(f));
    if (bad >= 0) throw new CsvError(`${file}:${i + 1}: field ${bad + 1} is ${quote(fields[bad])}, not a number`);
    rows.push({ line: i + 1, values });
  }
  if (rows.length === 0) throw new CsvError(`${file}: no rows of numbers`);
  return { header, rows };
}

/**
 * Pick named columns: by header name when the file has a header (each name required), else
 * by position. Returns rows of the picked values in the order of `names`.
 */
export function pickColumns(table: CsvTable, names: readonly string[], file: string, headerRequired: boolean): number[][] {
  let index: number[];
  if (table.header) {
    index = names.map((n) => {
      const k = table.header!.indexOf(n);
      if (k < 0) {
        throw new CsvError(`${file}: missing column '${n}' (the header has ${table.header!.map((h) => `'${h}'`).join(', ')}; expected ${names.join(', ')})`);
      }
      return k;
    });
  } else {
    if (headerRequired) throw new CsvError(`${file}: the first row must be a header naming the columns ${names.join(', ')}`);
    index = names.map((_, k) => k);
  }
  return table.rows.map((r) => {
    const picked = index.map((k) => r.values[k]);
    const missing = picked.findIndex((v) => v === undefined);
    if (missing >= 0) throw new CsvError(`${file}:${r.line}: the row has ${r.values.length} fields; column '${names[missing]}' is missing`);
    return picked;
  });
}
