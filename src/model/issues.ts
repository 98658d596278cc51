/**
 * zod issues → one ModelError at the earliest place in the file. The schemas write their
 * own messages (schema.ts); here we pick the right branch of a union, turn "got nothing"
 * into a missing-key message, and attach key path, line and column.
 */
import type { z } from 'zod';
import { ModelError } from '../errors.js';
import { formatPath, type PathSegment } from './keypath.js';
import type { SourcePosition } from './types.js';
import { quote } from './text.js';

export interface Positions {
  valueAt: Record<string, SourcePosition>;
  keyAt: Record<string, SourcePosition>;
}

type Issue = z.core.$ZodIssue;

interface Located {
  kind: 'unknown-key' | 'missing-key' | 'other';
  /** the mapping that holds the offending key */
  parent: string;
  keyPath: string;
  message: string;
  pos: SourcePosition;
}

/** Nearest recorded position of a path: the path itself, else its closest ancestor. */
export function nearest(map: Record<string, SourcePosition>, segments: readonly PathSegment[]): SourcePosition {
  for (let n = segments.length; n >= 0; n--) {
    const pos = map[formatPath(segments.slice(0, n))];
    if (pos) return pos;
  }
  return { line: 1, col: 1 };
}

function valueAtPath(data: unknown, segments: readonly PathSegment[]): { found: boolean; value: unknown } {
  let value: unknown = data;
  for (const segment of segments) {
    if (value === null || typeof value !== 'object' || !Object.hasOwn(value as object, segment)) {
      return { found: false, value: undefined };
    }
    value = (value as Record<string | number, unknown>)[segment];
  }
  return { found: true, value };
}

/** A union branch failed on the value's own type, so it was not what the user meant. */
function wrongTypeBranch(issues: readonly Issue[]): boolean {
  return issues.some((i) => i.path.length === 0 && (i.code === 'invalid_type' || (i.code === 'invalid_value' && i.path.length === 0)));
}

function flatten(issue: Issue, prefix: PathSegment[]): Array<{ issue: Issue; path: PathSegment[] }> {
  const path = [...prefix, ...(issue.path as PathSegment[])];
  if (issue.code === 'invalid_union') {
    const branches = issue.errors.filter((branch) => !wrongTypeBranch(branch));
    if (branches.length >= 1) return branches[0].flatMap((inner) => flatten(inner, path));
  }
  return [{ issue, path }];
}

function locateIssue(issue: Issue, path: PathSegment[], data: unknown, positions: Positions): Located {
  if (issue.code === 'unrecognized_keys') {
    const key = issue.keys[0];
    const keyPath = [...path, key];
    return {
      kind: 'unknown-key', parent: formatPath(path), keyPath: formatPath(keyPath), message: issue.message,
      pos: nearest(positions.keyAt, keyPath),
    };
  }
  const here = valueAtPath(data, path);
  if (!here.found && path.length > 0) {
    const key = path[path.length - 1];
    const parent = path.slice(0, -1);
    const what = issue.message.replace(/^expected /, '').replace(/, got nothing$/, '');
    const message = typeof key === 'string'
      ? `required key ${quote(key)} is missing (expected ${what})`
      : `missing item (expected ${what})`;
    const pos = positions.keyAt[formatPath(parent)] ?? nearest(positions.valueAt, parent);
    return { kind: 'missing-key', parent: formatPath(parent), keyPath: formatPath(path), message, pos };
  }
  return { kind: 'other', parent: '', keyPath: formatPath(path), message: issue.message, pos: nearest(positions.valueAt, path) };
}

/** The first problem in file order, as a ModelError ready to throw. */
export function firstIssueError(error: z.ZodError, data: unknown, positions: Positions): ModelError {
  const all = error.issues
    .flatMap((issue) => flatten(issue, []))
    .map(({ issue, path }) => locateIssue(issue, path, data, positions));
  // `{ Ee: 1 }` is both an unknown key and a missing `E`; the unknown key, with its hint,
  // is the message that helps.
  const misspelt = new Set(all.filter((l) => l.kind === 'unknown-key').map((l) => l.parent));
  // Likewise `{ circel: … }` also fails "expected one of circle, …" on the mapping itself.
  const located = all.filter((l) =>
    !(l.kind === 'missing-key' && misspelt.has(l.parent)) && !(l.kind === 'other' && misspelt.has(l.keyPath)));
  // A missing key is reported only when nothing concrete is wrong: the concrete problem is
  // what the user is looking at, and a missing key has no place of its own in the file.
  // Among missing keys, nested ones first: a top-level key missing is placed at 1:1.
  const rank = (l: Located): number => (l.kind !== 'missing-key' ? 0 : l.parent === '' ? 2 : 1);
  located.sort((a, b) => rank(a) - rank(b) || a.pos.line - b.pos.line || a.pos.col - b.pos.col);
  const first = located[0] ?? all[0] ?? { keyPath: '', message: 'invalid model', pos: { line: 1, col: 1 } };
  return new ModelError(first.message, first.keyPath, first.pos.line, first.pos.col);
}
