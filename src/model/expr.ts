/**
 * Arithmetic expressions in place of numbers: `w/2 - r`, `sqrt(a^2 + b^2)`, `-h^2`.
 * Parsed with jsep, evaluated by walking the tree here — never eval or Function.
 *
 * Grammar choices (documented in docs/model-format.md):
 * - `^` is the power operator, right-associative (`2^3^2` = 2^9), binding tighter than
 *   unary minus (`-2^2` = -4, `(-2)^2` = 4), as in ordinary mathematical notation;
 * - functions: sqrt sin cos tan asin acos atan atan2 hypot min max abs; trig in radians;
 * - one constant: pi.
 */
import jsep from 'jsep';
import { closest, formatNumber, quote } from './text.js';

/** An expression problem; the caller adds the key path and position. */
export class ExpressionError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ExpressionError';
  }
}

export const MAX_EXPRESSION_CHARS = 1000;

type Fn = { arity: number | 'many'; apply: (args: number[]) => number };

export const FUNCTIONS: Readonly<Record<string, Fn>> = {
  sqrt: { arity: 1, apply: ([x]) => {
    if (x < 0) throw new ExpressionError(`sqrt of a negative number (${formatNumber(x)})`);
    return Math.sqrt(x);
  } },
  sin: { arity: 1, apply: ([x]) => Math.sin(x) },
  cos: { arity: 1, apply: ([x]) => Math.cos(x) },
  tan: { arity: 1, apply: ([x]) => Math.tan(x) },
  asin: { arity: 1, apply: ([x]) => Math.asin(x) },
  acos: { arity: 1, apply: ([x]) => Math.acos(x) },
  atan: { arity: 1, apply: ([x]) => Math.atan(x) },
  atan2: { arity: 2, apply: ([y, x]) => Math.atan2(y, x) },
  // folded pairwise, never spread: an argument list has no bound but the file's length
  hypot: { arity: 'many', apply: (args) => args.reduce((a, b) => Math.hypot(a, b), 0) },
  min: { arity: 'many', apply: (args) => args.reduce((a, b) => Math.min(a, b), Infinity) },
  max: { arity: 'many', apply: (args) => args.reduce((a, b) => Math.max(a, b), -Infinity) },
  abs: { arity: 1, apply: ([x]) => Math.abs(x) },
};

export const CONSTANTS: Readonly<Record<string, number>> = { pi: Math.PI };

/** Names a parameter may not take. */
export const RESERVED_NAMES: readonly string[] = [...Object.keys(FUNCTIONS), ...Object.keys(CONSTANTS)];

// --- jsep set-up (module state of jsep; done once) ---------------------------------------
// jsep reads `^` as bitwise xor below `+`; make it the power operator above `*`.
jsep.removeBinaryOp('^');
jsep.addBinaryOp('^', 11, true);
// jsep returns the inner node of `( … )` unmarked; keep the parentheses so that `(-2)^2`
// can be told from `-2^2` when fixing the precedence of unary minus below.
const GROUP = 'Group';
jsep.hooks.add('gobble-token', function gobbleGroupMarked(env) {
  if (this.code === 40 /* ( */) {
    const inner = this.gobbleGroup() as jsep.Expression | false;
    if (!inner) this.throwError('empty parentheses');
    env.node = { type: GROUP, expression: inner as jsep.Expression };
  }
});

/** A parsed expression tree: jsep's nodes plus our `Group`. */
export type ExpressionTree = jsep.Expression;

export function parseExpression(text: string): ExpressionTree {
  if (text.length > MAX_EXPRESSION_CHARS) {
    throw new ExpressionError(`expression is ${text.length} characters long; the limit is ${MAX_EXPRESSION_CHARS}`);
  }
  if (text.trim() === '') throw new ExpressionError('empty expression');
  let tree: jsep.Expression;
  try {
    tree = jsep(text);
  } catch (e) {
    // `8mm`: jsep's complaint is about variable names, the slip is a unit
    const unit = UNIT_AFTER_NUMBER.exec(text);
    if (unit) throw new ExpressionError(unitMessage(unit[1]));
    const err = e as Error & { description?: string; index?: number };
    const where = typeof err.index === 'number' ? ` at character ${err.index + 1}` : '';
    throw new ExpressionError(`syntax error${where}: ${err.description ?? err.message}`);
  }
  if (tree.type === 'Compound' || tree.type === 'SequenceExpression') throw new ExpressionError(severalValuesMessage(text, tree));
  return raiseUnaryBelowPower(tree);
}

/** A number written with a unit after it: `8 mm`, `8mm`, `210 GPa`, `10 N/mm^2`. */
const UNIT_AFTER_NUMBER = /^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s*((?:mm|cm|m|in|ft|um|µm|N|kN|MN|lbf|kip|Pa|kPa|MPa|GPa|psi|ksi|deg|rad|°)\b[^]*|°.*)$/;

function unitMessage(unit: string): string {
  return `a number followed by the unit ${quote(unit.trim())}; write the number alone: values are in the model's units, set once under units: { length, force }`;
}

/**
 * What `8 mm`, `5 5` or `1, 5` most likely meant, for an expression that holds several values
 * (jsep reads terms side by side, or separated by commas, as a list).
 */
function severalValuesMessage(text: string, tree: jsep.Expression): string {
  const unit = UNIT_AFTER_NUMBER.exec(text);
  if (unit) return unitMessage(unit[1]);
  const parts = ((tree.type === 'Compound' ? tree.body : tree.expressions) as jsep.Expression[]).length;
  if (text.includes(',')) {
    const decimal = /^\s*[-+]?\d+,\d+\s*$/.test(text) ? `; for a decimal write a point (${text.trim().replace(',', '.')})` : '';
    return `expected one number, got a list of ${parts} values separated by commas; a point is written [x, y] (a YAML list), not as text${decimal}`;
  }
  const words = text.trim().split(/\s+/);
  const example = words.length === 2 && text.length <= 40 ? words.join(' * ') : '5 * 5';
  return `expected one number, got ${parts} values side by side; join them with an operator (such as ${example}) or, for a point, write [x, y]`;
}

/**
 * jsep applies a prefix operator to the token right after it, so `-x^2` arrives as
 * (-x)^2. Rotate every `(unary a) ^ b` whose unary is not in parentheses into
 * unary(a ^ b).
 */
function raiseUnaryBelowPower(node: jsep.Expression): jsep.Expression {
  switch (node.type) {
    case 'BinaryExpression': {
      const left = node.left as jsep.Expression;
      const right = raiseUnaryBelowPower(node.right as jsep.Expression);
      if (node.operator === '^' && left.type === 'UnaryExpression') {
        const unary = left as jsep.UnaryExpression;
        return {
          type: 'UnaryExpression',
          operator: unary.operator,
          prefix: true,
          argument: raiseUnaryBelowPower({ type: 'BinaryExpression', operator: '^', left: unary.argument, right }),
        };
      }
      return { ...node, left: raiseUnaryBelowPower(left), right };
    }
    case 'UnaryExpression':
      return { ...node, argument: raiseUnaryBelowPower(node.argument as jsep.Expression) };
    case 'CallExpression':
      return { ...node, arguments: (node.arguments as jsep.Expression[]).map(raiseUnaryBelowPower) };
    case GROUP:
      return { ...node, expression: raiseUnaryBelowPower(node.expression as jsep.Expression) };
    default:
      return node;
  }
}

/** Names the expression reads as values (not function names). */
export function namesIn(tree: ExpressionTree): string[] {
  const names = new Set<string>();
  const visit = (node: jsep.Expression): void => {
    switch (node.type) {
      case 'Identifier': names.add(node.name as string); break;
      case 'BinaryExpression': visit(node.left as jsep.Expression); visit(node.right as jsep.Expression); break;
      case 'UnaryExpression': visit(node.argument as jsep.Expression); break;
      case 'CallExpression': (node.arguments as jsep.Expression[]).forEach(visit); break;
      case GROUP: visit(node.expression as jsep.Expression); break;
      default: break;
    }
  };
  visit(tree);
  return [...names];
}

const BINARY: Record<string, (a: number, b: number) => number> = {
  '+': (a, b) => a + b,
  '-': (a, b) => a - b,
  '*': (a, b) => a * b,
  '/': (a, b) => {
    if (b === 0) throw new ExpressionError('division by zero');
    return a / b;
  },
  '^': (a, b) => {
    if (a === 0 && b < 0) throw new ExpressionError(`division by zero (0 to the power ${formatNumber(b)})`);
    if (a < 0 && !Number.isInteger(b)) {
      throw new ExpressionError(`negative number ${formatNumber(a)} to the non-integer power ${formatNumber(b)}`);
    }
    return a ** b;
  },
};

/**
 * Evaluate a tree. `names` holds the parameters; constants and functions are built in.
 * Every intermediate result must be finite.
 */
export function evaluateTree(tree: ExpressionTree, names: Readonly<Record<string, number>>): number {
  const known = (): string[] => [...Object.keys(names), ...Object.keys(CONSTANTS)];
  const finite = (value: number, what: string): number => {
    if (!Number.isFinite(value)) throw new ExpressionError(`${what} gives ${value}, not a finite number`);
    return value;
  };
  const evaluate = (node: jsep.Expression): number => {
    switch (node.type) {
      case 'Literal': {
        if (typeof node.value === 'number') return finite(node.value, `the number ${node.raw as string}`);
        throw new ExpressionError(`${quote(String(node.raw))} is not a number`);
      }
      case 'Identifier': {
        const name = node.name as string;
        if (Object.hasOwn(names, name)) return names[name];
        if (Object.hasOwn(CONSTANTS, name)) return CONSTANTS[name];
        if (Object.hasOwn(FUNCTIONS, name)) throw new ExpressionError(`${name} is a function; write ${name}(…)`);
        const hint = closest(name, known());
        throw new ExpressionError(`unknown name ${quote(name)}${hint ? ` (did you mean ${quote(hint)}?)` : ''}`);
      }
      case GROUP:
        return evaluate(node.expression as jsep.Expression);
      case 'UnaryExpression': {
        const value = evaluate(node.argument as jsep.Expression);
        if (node.operator === '-') return -value;
        if (node.operator === '+') return value;
        throw new ExpressionError(`operator ${quote(node.operator as string)} is not allowed; use + - * / ^`);
      }
      case 'BinaryExpression': {
        const op = node.operator as string;
        const apply = BINARY[op];
        if (!apply) {
          const hint = op === '**' ? '; write ^ for a power' : '';
          throw new ExpressionError(`operator ${quote(op)} is not allowed; use + - * / ^${hint}`);
        }
        const a = evaluate(node.left as jsep.Expression);
        const b = evaluate(node.right as jsep.Expression);
        return finite(apply(a, b), `${formatNumber(a)} ${op} ${formatNumber(b)}`);
      }
      case 'CallExpression': {
        const callee = node.callee as jsep.Expression;
        if (callee.type !== 'Identifier') throw new ExpressionError('only the built-in functions can be called');
        const name = callee.name as string;
        const fn = FUNCTIONS[name];
        if (!Object.hasOwn(FUNCTIONS, name) || !fn) {
          const hint = closest(name, Object.keys(FUNCTIONS));
          throw new ExpressionError(
            `unknown function ${quote(name)}${hint ? ` (did you mean ${quote(hint)}?)` : ''}; available: ${Object.keys(FUNCTIONS).join(' ')}`,
          );
        }
        const args = (node.arguments as jsep.Expression[]).map(evaluate);
        if (fn.arity === 'many' ? args.length === 0 : args.length !== fn.arity) {
          const wanted = fn.arity === 'many' ? 'at least 1 argument' : fn.arity === 1 ? '1 argument' : `${fn.arity} arguments`;
          throw new ExpressionError(`${name} takes ${wanted}, got ${args.length}`);
        }
        return finite(fn.apply(args), `${name}(${args.map(formatNumber).join(', ')})`);
      }
      case 'MemberExpression':
        throw new ExpressionError('. and [ ] are not allowed in expressions; use plain parameter names');
      case 'SequenceExpression':
      case 'Compound':
        // parseExpression refuses these with a better message; trees built by hand land here
        throw new ExpressionError('a list of values (separated by commas or spaces) stands where one number is expected');
      case 'ConditionalExpression':
        throw new ExpressionError('the ? : operator is not allowed; use + - * / ^ and min/max');
      case 'ArrayExpression':
        throw new ExpressionError('[ ] lists are not allowed inside an expression');
      default:
        throw new ExpressionError(`${quote(node.type)} is not allowed in an expression`);
    }
  };
  return evaluate(tree);
}

/** Parse and evaluate in one step. */
export function evaluateExpression(text: string, names: Readonly<Record<string, number>> = {}): number {
  return evaluateTree(parseExpression(text), names);
}
