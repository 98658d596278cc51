/**
 * The import graph of src/, read from the source text: every `import … from`, `export … from`,
 * side-effect `import '…'` and dynamic `import('…')` with a relative specifier, resolved to the
 * .ts file it names (the sources import `./x.js`, compiled from `./x.ts`). A small reader of our
 * own style of imports, not a TypeScript parser: it is checked against the compiler's own view by
 * the typecheck (a specifier it cannot resolve fails the tests below).
 */
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';

export const SRC = resolve(import.meta.dirname, '..', '..', 'src');

export interface ImportEdge {
  /** importing file, relative to src/ with forward slashes, e.g. 'cli/commands.ts' */
  from: string;
  /** imported file, same form */
  to: string;
  /** `import`, `export … from` or dynamic `import()` */
  kind: 'import' | 'export' | 'dynamic';
  /** true for `import type` / `export type` and for imports whose every name is `type X` */
  typeOnly: boolean;
  /** the names imported (`a as b` gives a; `* as ns` gives '*'); empty for a side-effect import */
  names: string[];
}

function tsFiles(dir: string): string[] {
  const out: string[] = [];
  for (const entry of readdirSync(dir)) {
    const path = join(dir, entry);
    if (statSync(path).isDirectory()) out.push(...tsFiles(path));
    else if (entry.endsWith('.ts') && !entry.endsWith('.d.ts')) out.push(path);
  }
  return out.sort();
}

const rel = (path: string): string => relative(SRC, path).split('\\').join('/');

/** Comments out, strings kept: so that an import written inside a comment is not read. */
function stripComments(text: string): string {
  return text.replace(/\/\*[\s\S]*?\*\//g, ' ').replace(/(^|[^:'"`\\])\/\/[^\n]*/g, '$1');
}

function namesOf(clause: string): { names: string[]; allTypes: boolean } {
  const names: string[] = [];
  let allTypes = true;
  const braces = /\{([^}]*)\}/.exec(clause);
  const outside = clause.replace(/\{[^}]*\}/, ' ').trim();
  if (braces) {
    for (const raw of braces[1].split(',')) {
      const item = raw.trim();
      if (!item) continue;
      const isType = /^type\s+/.test(item);
      if (!isType) allTypes = false;
      names.push(item.replace(/^type\s+/, '').split(/\s+as\s+/)[0].trim());
    }
  }
  for (const part of outside.split(',').map((p) => p.trim()).filter(Boolean)) {
    allTypes = false;
    names.push(part.startsWith('*') ? '*' : part);
  }
  return { names, allTypes };
}

/** Every relative import edge between files of src/. */
export function importEdges(): ImportEdge[] {
  const edges: ImportEdge[] = [];
  const files = tsFiles(SRC);
  const known = new Set(files);
  const statement = /(?:^|[;\n])\s*(import|export)\s+(type\s+)?([^;'"]*?)\s*from\s*['"]([^'"]+)['"]|(?:^|[;\n])\s*import\s*['"]([^'"]+)['"]|\bimport\s*\(\s*['"]([^'"]+)['"]\s*\)/g;
  for (const file of files) {
    const text = stripComments(readFileSync(file, 'utf8'));
    for (const m of text.matchAll(statement)) {
      const spec = m[4] ?? m[5] ?? m[6];
      if (!spec.startsWith('.')) continue;
      const target = resolve(dirname(file), spec.replace(/\.js$/, '.ts'));
      if (!known.has(target)) throw new Error(`${rel(file)}: import '${spec}' names no source file`);
      if (m[4] !== undefined) {
        const { names, allTypes } = namesOf(m[3]);
        const typeOnly = m[2] !== undefined || (names.length > 0 && allTypes);
        edges.push({ from: rel(file), to: rel(target), kind: m[1] as 'import' | 'export', typeOnly, names });
      } else {
        edges.push({ from: rel(file), to: rel(target), kind: m[5] !== undefined ? 'import' : 'dynamic', typeOnly: false, names: [] });
      }
    }
  }
  return edges;
}

/** All source files of src/, relative. */
export function sourceFiles(): string[] {
  return tsFiles(SRC).map(rel);
}

/**
 * The cycles of a directed graph: its strongly connected components with more than one node (or
 * a node importing itself), by Tarjan's algorithm (R. Tarjan, "Depth-first search and linear
 * graph algorithms", SIAM J. Computing 1, 1972), each as the list of its files.
 */
export function cycles(nodes: readonly string[], edges: readonly { from: string; to: string }[]): string[][] {
  const out = new Map<string, string[]>();
  for (const n of nodes) out.set(n, []);
  for (const e of edges) out.get(e.from)?.push(e.to);
  const index = new Map<string, number>();
  const low = new Map<string, number>();
  const onStack = new Set<string>();
  const stack: string[] = [];
  const found: string[][] = [];
  let next = 0;
  const visit = (v: string): void => {
    index.set(v, next);
    low.set(v, next);
    next++;
    stack.push(v);
    onStack.add(v);
    for (const w of out.get(v) ?? []) {
      if (!index.has(w)) {
        visit(w);
        low.set(v, Math.min(low.get(v)!, low.get(w)!));
      } else if (onStack.has(w)) {
        low.set(v, Math.min(low.get(v)!, index.get(w)!));
      }
    }
    if (low.get(v) === index.get(v)) {
      const component: string[] = [];
      let w: string;
      do {
        w = stack.pop()!;
        onStack.delete(w);
        component.push(w);
      } while (w !== v);
      if (component.length > 1 || (out.get(v) ?? []).includes(v)) found.push(component.sort());
    }
  };
  for (const n of nodes) if (!index.has(n)) visit(n);
  return found;
}
