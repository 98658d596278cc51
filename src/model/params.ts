/**
 * `params`: named numbers (or expressions over other params) that the rest of the model
 * refers to. Evaluated in dependency order, whatever order they are written in.
 */
import { ModelError } from '../errors.js';
import { CONSTANTS, ExpressionError, RESERVED_NAMES, namesIn, parseExpression, evaluateTree, type ExpressionTree } from './expr.js';
import { joinPath } from './keypath.js';
import type { SourcePosition } from './types.js';
import { didYouMean, quote } from './text.js';

export const PARAM_NAME = /^[A-Za-z_][A-Za-z0-9_]*$/;

type Locate = (keyPath: string) => SourcePosition;

export function evaluateParams(
  raw: Readonly<Record<string, number | string>>,
  overrides: Readonly<Record<string, number>> | undefined,
  locate: Locate,
): Record<string, number> {
  const fail = (message: string, keyPath: string): never => {
    const pos = locate(keyPath);
    throw new ModelError(message, keyPath, pos.line, pos.col);
  };
  const names = Object.keys(raw);
  for (const name of names) {
    const path = joinPath('params', name);
    if (!PARAM_NAME.test(name)) {
      fail(`parameter name ${quote(name)} must start with a letter or _ and hold only letters, digits and _`, path);
    }
    if (RESERVED_NAMES.includes(name)) fail(`${quote(name)} is a built-in name and cannot be a parameter`, path);
  }

  const source: Record<string, number | string> = { ...raw };
  for (const [name, value] of Object.entries(overrides ?? {})) {
    if (!Object.hasOwn(raw, name)) {
      const known = names.length ? `; the model's parameters are ${names.join(', ')}` : '; the model has no params';
      fail(`cannot set parameter ${quote(name)}: not in the model${didYouMean(name, names)}${known}`, 'params');
    }
    if (typeof value !== 'number' || !Number.isFinite(value)) {
      fail(`value ${String(value)} given for parameter ${quote(name)} is not a finite number`, joinPath('params', name));
    }
    source[name] = value;
  }

  const trees = new Map<string, ExpressionTree>();
  const deps = new Map<string, string[]>();
  for (const name of names) {
    const value = source[name];
    const path = joinPath('params', name);
    if (typeof value === 'number') {
      if (!Number.isFinite(value)) fail(`parameter ${name} = ${value} is not a finite number`, path);
      deps.set(name, []);
      continue;
    }
    let tree: ExpressionTree;
    try {
      tree = parseExpression(value);
    } catch (e) {
      if (e instanceof ExpressionError) fail(`expression ${quote(value)}: ${e.message}`, path);
      throw e;
    }
    trees.set(name, tree);
    const read = namesIn(tree);
    for (const n of read) {
      if (!Object.hasOwn(raw, n) && !Object.hasOwn(CONSTANTS, n)) {
        fail(`expression ${quote(value)}: unknown name ${quote(n)}${didYouMean(n, [...names, ...Object.keys(CONSTANTS)])}`, path);
      }
    }
    const used = read.filter((n) => Object.hasOwn(raw, n));
    deps.set(name, used);
  }

  // Depth-first topological order; a name met again while still open closes a cycle.
  const values: Record<string, number> = {};
  const state = new Map<string, 'open' | 'done'>();
  const stack: string[] = [];
  const visit = (name: string): void => {
    if (state.get(name) === 'done') return;
    if (state.get(name) === 'open') {
      const cycle = [...stack.slice(stack.indexOf(name)), name];
      fail(`parameters refer to each other in a cycle: ${cycle.join(' → ')}`, joinPath('params', name));
    }
    state.set(name, 'open');
    stack.push(name);
    for (const dep of deps.get(name) ?? []) visit(dep);
    stack.pop();
    const value = source[name];
    if (typeof value === 'number') values[name] = value;
    else {
      try {
        values[name] = evaluateTree(trees.get(name)!, values);
      } catch (e) {
        if (e instanceof ExpressionError) fail(`expression ${quote(value)}: ${e.message}`, joinPath('params', name));
        throw e;
      }
    }
    state.set(name, 'done');
  };
  for (const name of names) visit(name);
  return values;
}
