/**
 * Command-line numbers checked before anything runs: a bad value is refused with the option's
 * name and the rule, e.g. `--max-dofs must be a whole number from 1 to 1000000000, got "0.5"`.
 */
import { PeakwiseError } from '../errors.js';

/** Largest --max-dofs: far beyond any machine's memory (about 10⁹ dofs need terabytes), and int32-safe. */
export const MAX_DOFS_LIMIT = 1_000_000_000;
export const DEFAULT_MAX_DOFS = 2_000_000;

/** A plain decimal number (`2000000`, `2e6`, `1.5`); no hexadecimal, binary, `Infinity` or blanks. */
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

/** A whole number in [lo, hi] written in decimal, or a usage error naming the option and the rule. */
export function wholeNumberOption(text: string, option: string, lo: number, hi: number): number {
  const t = text.trim();
  const v = DECIMAL.test(t) ? Number(t) : NaN;
  if (!(Number.isInteger(v) && v >= lo && v <= hi)) {
    throw new PeakwiseError('usage', `${option} must be a whole number from ${lo} to ${hi}, got "${text}"`);
  }
  return v;
}

/** --max-dofs: a whole number of degrees of freedom from 1 to MAX_DOFS_LIMIT. */
export function parseMaxDofs(text: string): number {
  return wholeNumberOption(text, '--max-dofs', 1, MAX_DOFS_LIMIT);
}

/** commander argParser for --max-dofs: checks at parse time (before the model is read), keeps the text. */
export function maxDofsArgument(text: string): string {
  parseMaxDofs(text);
  return text;
}
