/**
 * YAML (and so JSON) text → plain data plus positions. The `yaml` package keeps node
 * ranges; we walk its syntax tree once to record where every key path sits, so that any
 * later message can name a line and column.
 */
import { Composer, isAlias, isMap, isScalar, isSeq, LineCounter, Parser, type Document, type Node } from 'yaml';
import { ModelError } from '../errors.js';
import type { SourcePosition } from './types.js';
import { formatPath, type PathSegment } from './keypath.js';
import { quote } from './text.js';
import { notUtf8Text } from './text-file.js';

/**
 * Aliases (`*name`) are legitimate reuse in YAML, but nested aliases expand exponentially
 * ("billion laughs"). A model file needs a handful at most.
 */
export const MAX_ALIAS_COUNT = 50;

/** Longest model text we read; real plate details are a few kilobytes. */
export const MAX_MODEL_CHARS = 2_000_000;

/**
 * Deepest nesting of mappings and lists accepted. A model needs six levels
 * (`supports[0].where.segment[1]`); the YAML reader builds its tree recursively and would run
 * out of stack near a thousand.
 */
export const MAX_NESTING = 32;

/** Longest parser message echoed (it may quote the file). */
const MAX_ECHO = 160;

export interface YamlSource {
  data: unknown;
  /** key path → position of its value */
  valueAt: Record<string, SourcePosition>;
  /** key path → position of the key itself (mapping entries only) */
  keyAt: Record<string, SourcePosition>;
}

export function readYaml(text: string): YamlSource {
  if (text.length > MAX_MODEL_CHARS) {
    throw new ModelError(`model text is ${text.length} characters; the limit is ${MAX_MODEL_CHARS}`, '', 1, 1);
  }
  const notText = notUtf8Text(text);
  if (notText) throw new ModelError(`the file is not a UTF-8 text file: ${notText.reason}`, '', notText.line, notText.col);
  const lines = new LineCounter();
  const at = (offset: number): SourcePosition => {
    const p = lines.linePos(Math.max(0, Math.min(offset, text.length)));
    return { line: p.line, col: p.col };
  };
  // what the yaml package's parseDocument does, with a depth check between its syntax pass
  // (iterative) and the tree building (recursive)
  const cst = [...new Parser(lines.addNewLine).parse(text)];
  const deep = deepestNesting(cst);
  if (deep.depth > MAX_NESTING) {
    const pos = at(deep.offset);
    throw new ModelError(
      `mappings and lists nest ${deep.depth > 10 * MAX_NESTING ? `more than ${10 * MAX_NESTING}` : deep.depth} levels deep here; `
        + `a model needs about 6 and the limit is ${MAX_NESTING}`,
      '', pos.line, pos.col,
    );
  }
  // YAML 1.2 core schema: `yes`/`no` stay text, no `<<` merge keys
  const composer = new Composer({ uniqueKeys: true, prettyErrors: false, version: '1.2', strict: true });
  let doc: Document.Parsed | undefined;
  let second: number | undefined;
  for (const d of composer.compose(cst, true, text.length)) {
    if (!doc) doc = d;
    else {
      second = d.range[0];
      break;
    }
  }
  if (!doc) throw new ModelError('the model file is empty; expected a mapping with material, thickness, plate, supports and loads', '', 1, 1);

  const valueAt: Record<string, SourcePosition> = {};
  const keyAt: Record<string, SourcePosition> = {};

  if (doc.errors.length > 0) {
    const first = doc.errors[0];
    const pos = at(first.pos[0]);
    if (first.code === 'DUPLICATE_KEY') {
      const key = duplicateKeyName(text, first.pos[0], first.pos[1]);
      throw new ModelError(`duplicate key ${quote(key)}: each key may appear only once in a mapping`, '', pos.line, pos.col);
    }
    throw new ModelError(`YAML syntax: ${yamlMessage(first.message)}`, '', pos.line, pos.col);
  }
  if (second !== undefined) {
    const pos = at(second);
    throw new ModelError('the file holds more than one YAML document (a second ---); a model is one document', '', pos.line, pos.col);
  }

  const root = doc.contents;
  if (root === null || (isScalar(root) && (root.value === null || root.value === ''))) {
    throw new ModelError('the model file is empty; expected a mapping with material, thickness, plate, supports and loads', '', 1, 1);
  }
  if (!isMap(root)) {
    const pos = at(root.range[0]);
    throw new ModelError('expected a mapping (key: value lines) at the top of the model file', '', pos.line, pos.col);
  }

  // Duplicate keys are caught above by the parser; this walk also records where each
  // key path starts, stopping at aliases (their content is located at the alias).
  const walk = (node: Node, path: PathSegment[]): void => {
    const here = formatPath(path);
    if (node.range) valueAt[here] = at(node.range[0]);
    if (isAlias(node)) return;
    if (isMap(node)) {
      for (const pair of node.items) {
        const keyNode = pair.key as Node | null;
        const keyName = isScalar(keyNode) ? String(keyNode.value) : String(keyNode);
        const childPath = [...path, keyName];
        const child = formatPath(childPath);
        if (keyNode && keyNode.range) keyAt[child] = at(keyNode.range[0]);
        const valueNode = pair.value as Node | null;
        if (valueNode && valueNode.range) walk(valueNode, childPath);
        else if (keyAt[child]) valueAt[child] = keyAt[child];
      }
    } else if (isSeq(node)) {
      node.items.forEach((item, index) => {
        if (item && typeof item === 'object' && 'range' in item) walk(item as Node, [...path, index]);
      });
    }
  };
  walk(root, []);
  valueAt[''] = { line: 1, col: 1 };

  let data: unknown;
  try {
    data = doc.toJS({ maxAliasCount: MAX_ALIAS_COUNT });
  } catch (e) {
    if (e instanceof ReferenceError) {
      const pos = firstAlias(doc.contents, at) ?? { line: 1, col: 1 };
      const detail = /alias count/i.test(e.message)
        ? `too many YAML aliases expand here (more than ${MAX_ALIAS_COUNT}); aliases that nest other aliases grow exponentially`
        : `YAML alias: ${yamlMessage(e.message)}`;
      throw new ModelError(detail, '', pos.line, pos.col);
    }
    throw e;
  }
  return { data, valueAt, keyAt };
}

function duplicateKeyName(text: string, start: number, end: number): string {
  const raw = text.slice(start, Math.max(end, start + 1));
  const m = /^\s*["']?([^"':\n]*)/.exec(text.slice(start, start + 80));
  return (m?.[1] ?? raw).trim() || raw;
}

/** The parser's message without position noise, on one line, of bounded length, without control characters. */
function yamlMessage(message: string): string {
  // eslint-disable-next-line no-control-regex
  const line = message.split('\n')[0].replace(/ at line \d+, column \d+:?$/, '').trim().replace(/[\u0000-\u001f\u007f-\u009f]/g, '?');
  return line.length > MAX_ECHO ? `${line.slice(0, MAX_ECHO - 1)}…` : line;
}

/**
 * Deepest nesting of collections in the syntax tokens of the yaml package's Parser (block maps
 * and lists, flow collections), walked with an explicit stack; with the offset where it is reached.
 */
function deepestNesting(tokens: readonly unknown[]): { depth: number; offset: number } {
  let best = { depth: 0, offset: 0 };
  const stack: [unknown, number][] = tokens.map((t) => [t, 0]);
  while (stack.length > 0) {
    const [token, depth] = stack.pop()!;
    if (!token || typeof token !== 'object') continue;
    const t = token as { type?: string; offset?: number; value?: unknown; items?: { key?: unknown; value?: unknown }[] };
    const inner = t.type === 'block-map' || t.type === 'block-seq' || t.type === 'flow-collection' ? depth + 1 : depth;
    if (inner > best.depth) best = { depth: inner, offset: t.offset ?? 0 };
    if (inner > 10 * MAX_NESTING) break; // deep enough to refuse; no need to walk it all
    if (t.value && typeof t.value === 'object') stack.push([t.value, inner]);
    if (Array.isArray(t.items)) {
      for (const item of t.items) {
        if (item?.key && typeof item.key === 'object') stack.push([item.key, inner]);
        if (item?.value && typeof item.value === 'object') stack.push([item.value, inner]);
      }
    }
  }
  return best;
}

function firstAlias(node: unknown, at: (offset: number) => SourcePosition): SourcePosition | undefined {
  let found: SourcePosition | undefined;
  const visit = (n: unknown): void => {
    if (found || !n || typeof n !== 'object') return;
    if (isAlias(n)) {
      if (n.range) found = at(n.range[0]);
      return;
    }
    if (isMap(n)) for (const pair of n.items) { visit(pair.key); visit(pair.value); }
    else if (isSeq(n)) for (const item of n.items) visit(item);
  };
  visit(node);
  return found;
}
