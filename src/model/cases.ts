/**
 * Load cases and combinations (docs/model-format.md, "Load cases"): named cases, each a list of loads
 * and its own values for the supports that prescribe displacements; combinations as linear expressions
 * of case names in the expression syntax of expr.ts. Pure checks and evaluation; the loads themselves
 * are built by the caller (build.ts) so that every load kind reads the same in `loads` and in a case.
 */
import { CONSTANTS, ExpressionError, FUNCTIONS, RESERVED_NAMES, evaluateTree, parseExpression, type ExpressionTree } from './expr.js';
import { joinPath } from './keypath.js';
import { didYouMean, formatNumber, quote } from './text.js';
import type { Combination, LoadCase, Model, PrescribedMotion, Support } from './types.js';

/** Name of the one implicit case of a model without `cases:` (never shown to the user). */
export const IMPLICIT_CASE = 'loads';

/** A case or combination name: it is read inside expressions, so no `-` (which would subtract). */
const CASE_NAME = /^[A-Za-z_][A-Za-z0-9_]*$/;

/** What cases.ts needs of the model builder (build.ts), given structurally to keep imports one way. */
export interface CaseBuilder {
  fail(message: string, keyPath: string): never;
}

/** The raw case as the schema admits it. */
export type RawCase<L, D> = L[] | { loads?: L[]; displace?: Record<string, D> };

/**
 * The linear form Σ factor·case of a combination expression. Parameters, numbers, constants and the
 * functions of expr.ts may appear in the factors; a case name may only be added, subtracted, negated,
 * multiplied by a constant or divided by one. Throws ExpressionError naming what is not linear.
 */
export function linearForm(text: string, caseNames: readonly string[], params: Readonly<Record<string, number>>): Map<string, number> {
  const cases = new Set(caseNames);
  const tree = parseExpression(text);
  const known = [...caseNames, ...Object.keys(params), ...Object.keys(CONSTANTS)];
  const show = (node: ExpressionTree): string => shortText(node);
  type Form = { c: number; terms: Map<string, number> };
  const constant = (c: number): Form => ({ c, terms: new Map() });
  const isConstant = (f: Form): boolean => f.terms.size === 0;
  const scale = (f: Form, k: number): Form => ({ c: f.c * k, terms: new Map([...f.terms].map(([n, v]) => [n, v * k])) });
  const add = (a: Form, b: Form, sign: 1 | -1): Form => {
    const terms = new Map(a.terms);
    for (const [n, v] of b.terms) terms.set(n, (terms.get(n) ?? 0) + sign * v);
    return { c: a.c + sign * b.c, terms };
  };
  const visit = (node: ExpressionTree): Form => {
    switch (node.type) {
      case 'Identifier': {
        const name = node.name as string;
        if (cases.has(name)) return { c: 0, terms: new Map([[name, 1]]) };
        if (!Object.hasOwn(params, name) && !Object.hasOwn(CONSTANTS, name) && !Object.hasOwn(FUNCTIONS, name)) {
          throw new ExpressionError(`unknown name ${quote(name)}${didYouMean(name, known)}; a combination names cases (${caseNames.join(', ')}) and may use the params in its factors`);
        }
        return constant(evaluateTree(node, params));
      }
      case 'Group':
        return visit(node.expression as ExpressionTree);
      case 'UnaryExpression': {
        const f = visit(node.argument as ExpressionTree);
        if (node.operator === '-') return scale(f, -1);
        if (node.operator === '+') return f;
        return constant(evaluateTree(node, params));
      }
      case 'BinaryExpression': {
        const op = node.operator as string;
        const left = visit(node.left as ExpressionTree);
        const right = visit(node.right as ExpressionTree);
        if (isConstant(left) && isConstant(right)) return constant(evaluateTree(node, params));
        if (op === '+' || op === '-') return add(left, right, op === '+' ? 1 : -1);
        if (op === '*') {
          if (isConstant(left)) return scale(right, left.c);
          if (isConstant(right)) return scale(left, right.c);
          throw new ExpressionError(`${quote(show(node))} multiplies cases together; a combination is a sum of cases times factors (linear)`);
        }
        if (op === '/') {
          if (!isConstant(right)) throw new ExpressionError(`${quote(show(node))} divides by a case; a combination is a sum of cases times factors (linear)`);
          if (right.c === 0) throw new ExpressionError('division by zero');
          return scale(left, 1 / right.c);
        }
        if (op === '^') throw new ExpressionError(`${quote(show(node))} raises a case to a power; a combination is a sum of cases times factors (linear)`);
        return constant(evaluateTree(node, params));
      }
      case 'CallExpression': {
        const args = (node.arguments as ExpressionTree[]).map(visit);
        if (args.every(isConstant)) return constant(evaluateTree(node, params));
        const callee = node.callee as ExpressionTree;
        const fn = callee.type === 'Identifier' ? (callee.name as string) : 'a function';
        throw new ExpressionError(`${fn}(…) of a case is not linear; a combination is a sum of cases times factors`);
      }
      default:
        return constant(evaluateTree(node, params));
    }
  };
  const form = visit(tree);
  if (form.c !== 0) {
    throw new ExpressionError(`the constant term ${formatNumber(form.c)} belongs to no case; a combination is a sum of cases times factors`);
  }
  if (form.terms.size === 0) throw new ExpressionError('names no case; write a sum of cases times factors, such as "1.35*dead + 1.5*wind"');
  return form.terms;
}

/** A readable short text of a subtree for messages. */
function shortText(node: ExpressionTree): string {
  switch (node.type) {
    case 'Identifier': return node.name as string;
    case 'Literal': return String(node.raw);
    case 'Group': return `(${shortText(node.expression as ExpressionTree)})`;
    case 'UnaryExpression': return `${node.operator as string}${shortText(node.argument as ExpressionTree)}`;
    case 'BinaryExpression': return `${shortText(node.left as ExpressionTree)} ${node.operator as string} ${shortText(node.right as ExpressionTree)}`;
    case 'CallExpression': return `${shortText(node.callee as ExpressionTree)}(${(node.arguments as ExpressionTree[]).map(shortText).join(', ')})`;
    default: return node.type;
  }
}

/** Which directions a motion prescribes (a table prescribes both). */
function prescribedDirections(m: PrescribedMotion): { x: boolean; y: boolean } {
  return m.kind === 'table' ? { x: true, y: true } : { x: m.x !== undefined, y: m.y !== undefined };
}

const directionWords = (d: { x: boolean; y: boolean }): string => (d.x && d.y ? 'x and y' : d.x ? 'x only' : d.y ? 'y only' : 'nothing');

/** A name a case or combination may not take: a param, a built-in function or constant, x or y. */
function checkName(b: CaseBuilder, name: string, keyPath: string, what: string, params: Readonly<Record<string, number>>): void {
  if (!CASE_NAME.test(name)) {
    b.fail(`${what} name ${quote(name)} is read inside combination expressions: use letters, digits and _ only (${name.replace(/[^A-Za-z0-9_]/g, '_')})`, keyPath);
  }
  if (Object.hasOwn(params, name)) b.fail(`${what} name ${quote(name)} is also a param; rename one of them (a combination could not tell them apart)`, keyPath);
  if (RESERVED_NAMES.includes(name) || name === 'x' || name === 'y') b.fail(`${what} name ${quote(name)} is a built-in name of expressions; choose another`, keyPath);
}

/**
 * The cases of a model file: per case its loads (built by `buildLoads`) and the supports with its own
 * displacement values. With cases, a support's own `displace` says which directions are prescribed and
 * must hold zeros (a non-zero value there would be counted once per case in every combination); each case
 * gives its values by support id, and a case that does not name a support holds it at zero.
 */
export function buildCases<L, D>(
  b: CaseBuilder,
  raw: Readonly<Record<string, RawCase<L, D>>>,
  supports: readonly Support[],
  params: Readonly<Record<string, number>>,
  buildLoads: (list: readonly L[], keyPath: string) => void,
  motion: (raw: D, keyPath: string) => PrescribedMotion,
): { name: string; keyPath: string; loadsPath: string; supports: Support[] }[] {
  // the supports' own values must be zeros: with cases the values belong to the cases
  for (const s of supports) {
    const m = s.displace;
    if (!m) continue;
    const where = joinPath(s.keyPath, 'displace');
    if (m.kind === 'table') b.fail(`with cases, a displacement table belongs to a case: write zeros here ([0, 0]) and give the table under cases.NAME.displace.${s.id ?? 'ID'}`, where);
    for (const k of ['x', 'y'] as const) {
      const v = m[k];
      if (v !== undefined && v !== 0) {
        b.fail(`with cases, a support's own displacement would be counted once per case in every combination; write 0 here and give the value under cases.NAME.displace.${s.id ?? 'ID'}`, where);
      }
    }
    if (s.id === undefined) b.fail('with cases, a support that prescribes displacements needs an id, so that each case can give its values (cases.NAME.displace.ID)', s.keyPath);
  }
  const byId = new Map<string, number>();
  supports.forEach((s, i) => { if (s.id !== undefined) byId.set(s.id, i); });
  return Object.entries(raw).map(([name, c]) => {
    const keyPath = joinPath('cases', name);
    checkName(b, name, keyPath, 'case', params);
    const list = Array.isArray(c) ? c : c.loads ?? [];
    const loadsPath = Array.isArray(c) ? keyPath : joinPath(keyPath, 'loads');
    buildLoads(list, loadsPath);
    const own = Array.isArray(c) ? {} : c.displace ?? {};
    const values = new Map<number, PrescribedMotion>();
    for (const [id, d] of Object.entries(own)) {
      const where = joinPath(keyPath, 'displace', id);
      const i = byId.get(id);
      if (i === undefined) {
        const ids = [...byId.keys()];
        b.fail(`no support has id ${quote(id)}${didYouMean(id, ids)}; ${ids.length ? `the supports with ids are ${ids.join(', ')}` : 'no support has an id'}`, where);
      }
      const s = supports[i];
      if (!s.displace) {
        b.fail(`support ${quote(id)} (${s.keyPath}) holds with fix: at zero in every case; a case gives values only to a support with displace: (the same dofs are prescribed in every case)`, where);
      }
      const m = motion(d, where);
      const want = prescribedDirections(s.displace), got = prescribedDirections(m);
      if (want.x !== got.x || want.y !== got.y) {
        b.fail(`prescribes ${directionWords(got)}, but support ${quote(id)} prescribes ${directionWords(want)}: every case holds the same dofs, only the values differ `
          + '(write null for a free direction, or prescribe the direction in the support with 0)', where);
      }
      values.set(i, m);
    }
    if (list.length === 0 && values.size === 0) b.fail('the case has no loads and no displacement values', keyPath);
    const caseSupports = supports.map((s, i) => (s.displace ? { ...s, displace: values.get(i) ?? zeroMotion(s.displace) } : s));
    return { name, keyPath, loadsPath, supports: caseSupports };
  });
}

/** Zero values in the directions `m` prescribes. */
function zeroMotion(m: PrescribedMotion): PrescribedMotion {
  const d = prescribedDirections(m);
  return { kind: 'values', ...(d.x ? { x: 0 } : {}), ...(d.y ? { y: 0 } : {}) };
}

/** The combinations of a model file: names checked, expressions reduced to one factor per case. */
export function buildCombinations(
  b: CaseBuilder, raw: Readonly<Record<string, string>>, caseNames: readonly string[], params: Readonly<Record<string, number>>,
): Combination[] {
  return Object.entries(raw).map(([name, expression]) => {
    const keyPath = joinPath('combinations', name);
    checkName(b, name, keyPath, 'combination', params);
    if (caseNames.includes(name)) b.fail(`combination name ${quote(name)} is also a case; rename one of them`, keyPath);
    let form: Map<string, number>;
    try {
      form = linearForm(expression, caseNames, params);
    } catch (e) {
      if (e instanceof ExpressionError) b.fail(`expression ${quote(expression)}: ${e.message}`, keyPath);
      throw e;
    }
    const terms = caseNames.filter((n) => form.has(n)).map((n) => ({ case: n, factor: form.get(n)! }));
    return { name, expression, terms, keyPath };
  });
}

/**
 * The load cases of a model: its `cases`, or the one implicit case of a model without them (its
 * `loads` and `supports`, named IMPLICIT_CASE).
 */
export function loadCasesOf(model: Pick<Model, 'loads' | 'supports' | 'cases'>): LoadCase[] {
  if (model.cases && model.cases.length > 0) return model.cases;
  return [{ name: IMPLICIT_CASE, loads: model.loads, supports: model.supports, keyPath: 'loads' }];
}

/** Does the model have named cases (and so per-case results)? */
export function hasCases(model: Pick<Model, 'cases'>): boolean {
  return (model.cases?.length ?? 0) > 0;
}
