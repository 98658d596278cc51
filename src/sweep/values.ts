/**
 * `--vary` values: `name=v1,v2,…` lists and `name=start..end by step` ranges, and the cartesian
 * product of several axes. Pure functions; errors are usage errors naming the option.
 */
import { PeakwiseError } from '../errors.js';
import type { VaryAxis } from './types.js';

/** Longest list one axis may expand to (a typo like 0..100 by 0.0001 should not hang the machine). */
export const MAX_AXIS_VALUES = 1000;
/** Most points one sweep may have. */
export const MAX_SWEEP_POINTS = 10000;

const NAME = /^[A-Za-z_][A-Za-z0-9_]*$/;

function usage(message: string): PeakwiseError {
  return new PeakwiseError('usage', message);
}

function number(text: string, option: string): number {
  const t = text.trim();
  const v = t === '' ? NaN : Number(t);
  if (!Number.isFinite(v)) throw usage(`--vary ${option}: "${text}" is not a number`);
  return v;
}

/**
 * start..end by step, end included when the walk lands on it. The k-th value is computed as
 * start + k·step (no running sum, so no accumulated drift), the count allows a slack of 1e-9
 * steps, and each value is rounded to 12 significant digits so 0.1-steps print as 0.3, not
 * 0.30000000000000004.
 */
export function expandRange(start: number, step: number, end: number, option = 'range'): number[] {
  if (step === 0) throw usage(`--vary ${option}: the step of a range cannot be 0`);
  if ((end - start) / step < -1e-9) throw usage(`--vary ${option}: the step ${step} walks away from the end ${end}`);
  const count = Math.floor((end - start) / step + 1e-9) + 1;
  if (count > MAX_AXIS_VALUES) throw usage(`--vary ${option}: the range gives ${count} values, more than ${MAX_AXIS_VALUES}`);
  const out: number[] = [];
  for (let k = 0; k < count; k++) out.push(Number((start + k * step).toPrecision(12)));
  return out;
}

/** `start..end by step` with free spaces around the words (one range of a `--vary` list). */
const RANGE = /^(.*?)\.\.(.*?)\bby\b(.*)$/;

/** Parse one `--vary` argument: `r=0,2,4`, `r=0..20 by 2`, or a mix `r=0,1..3 by 1,8`. */
export function parseVary(text: string): VaryAxis {
  const eq = text.indexOf('=');
  if (eq < 0) throw usage(`--vary "${text}": expected name=values, e.g. r=0,2,4 or "r=0..20 by 2"`);
  const name = text.slice(0, eq).trim();
  if (!NAME.test(name)) throw usage(`--vary "${text}": "${name}" is not a parameter name`);
  const body = text.slice(eq + 1).trim();
  if (body === '') throw usage(`--vary ${name}: no values given`);
  const values: number[] = [];
  for (const part of body.split(',')) {
    if (part.includes(':')) {
      // the colon form of an earlier version: say how to write it now
      const bits = part.split(':');
      const now = bits.length === 3 ? `${bits[0].trim()}..${bits[2].trim()} by ${bits[1].trim()}` : 'start..end by step';
      throw usage(`--vary ${name}: "${part}" uses the old start:step:end form; write "${now}" (start..end by step)`);
    }
    if (part.includes('..')) {
      const m = RANGE.exec(part);
      if (!m) throw usage(`--vary ${name}: "${part}" is not a range start..end by step`);
      values.push(...expandRange(number(m[1], name), number(m[3], name), number(m[2], name), name));
    } else {
      values.push(number(part, name));
    }
  }
  const seen = new Set<number>();
  for (const v of values) {
    if (seen.has(v)) throw usage(`--vary ${name}: the value ${v} is listed twice`);
    seen.add(v);
  }
  if (values.length > MAX_AXIS_VALUES) throw usage(`--vary ${name}: ${values.length} values, more than ${MAX_AXIS_VALUES}`);
  return { name, values };
}

/** Check a set of axes: at least one, names distinct, product not too large. */
export function checkAxes(axes: readonly VaryAxis[]): void {
  if (axes.length === 0) throw usage('sweep needs at least one --vary name=values');
  const names = new Set<string>();
  for (const a of axes) {
    if (names.has(a.name)) throw usage(`--vary ${a.name} is given twice; list all its values in one --vary`);
    names.add(a.name);
    if (a.values.length === 0) throw usage(`--vary ${a.name}: no values given`);
  }
  const n = axes.reduce((p, a) => p * a.values.length, 1);
  if (n > MAX_SWEEP_POINTS) throw usage(`the sweep has ${n} points, more than ${MAX_SWEEP_POINTS}`);
}

/** Cartesian product, first axis varying slowest (as nested loops read left to right). */
export function cartesian(axes: readonly VaryAxis[]): Record<string, number>[] {
  checkAxes(axes);
  let out: Record<string, number>[] = [{}];
  for (const axis of axes) {
    const next: Record<string, number>[] = [];
    for (const partial of out) for (const v of axis.values) next.push({ ...partial, [axis.name]: v });
    out = next;
  }
  return out;
}
