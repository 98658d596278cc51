import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ExpressionError, evaluateExpression, namesIn, parseExpression } from '../../src/model/index.js';

const ev = (text: string, names: Record<string, number> = {}) => evaluateExpression(text, names);
const message = (text: string, names: Record<string, number> = {}): string => {
  try {
    ev(text, names);
  } catch (e) {
    expect(e).toBeInstanceOf(ExpressionError);
    return (e as Error).message;
  }
  throw new Error(`expected ${text} to fail`);
};

describe('expressions: arithmetic by hand', () => {
  it('follows the usual precedence of * / over + -', () => {
    expect(ev('1 + 2 * 3')).toBe(7);
    expect(ev('(1 + 2) * 3')).toBe(9);
    expect(ev('10 - 4 - 3')).toBe(3); // left-associative
    expect(ev('24 / 4 / 3')).toBe(2);
  });

  it('^ is a right-associative power above * and unary minus', () => {
    expect(ev('2^3^2')).toBe(512); // 2^(3^2) = 2^9
    expect(ev('2 * 3^2')).toBe(18);
    expect(ev('-2^2')).toBe(-4); // -(2^2), mathematical convention
    expect(ev('(-2)^2')).toBe(4);
    expect(ev('2^-1')).toBe(0.5);
    expect(ev('2^-3^2')).toBe(2 ** -9);
    expect(ev('--2^2')).toBe(4);
    expect(ev('-x^2', { x: 3 })).toBe(-9);
    expect(ev('1 - 2^2')).toBe(-3);
  });

  it('evaluates functions (trig in radians) and pi', () => {
    expect(ev('sqrt(16)')).toBe(4);
    expect(ev('sin(pi/2)')).toBe(1);
    expect(ev('cos(pi)')).toBe(-1);
    expect(ev('tan(pi/4)')).toBeCloseTo(1, 14);
    expect(ev('atan2(1, 1)')).toBeCloseTo(Math.PI / 4, 15);
    expect(ev('min(3, -1, 2)')).toBe(-1);
    expect(ev('max(3, -1, 2)')).toBe(3);
    expect(ev('abs(-2.5)')).toBe(2.5);
    expect(ev('hypot(3, 4)')).toBe(5);
    expect(ev('2*pi*r', { r: 1 })).toBe(2 * Math.PI);
  });

  it('reads parameters and reports the names an expression uses', () => {
    expect(ev('w/2 - r', { w: 100, r: 8 })).toBe(42);
    expect(namesIn(parseExpression('sqrt(a^2 + b^2) * pi')).sort()).toEqual(['a', 'b', 'pi']);
  });

  it('accepts numbers in exponent notation', () => {
    expect(ev('2.1e5 * 1e-3')).toBeCloseTo(210, 12);
    expect(ev('.5 + 0.25')).toBe(0.75);
  });
});

describe('expressions: errors', () => {
  it('names an unknown name with a hint', () => {
    expect(message('widht / 2', { width: 100 })).toBe("unknown name 'widht' (did you mean 'width'?)");
    expect(message('zz', { width: 100 })).toBe("unknown name 'zz'");
  });
  it('names an unknown function with a hint', () => {
    expect(message('sqr(2)')).toContain("unknown function 'sqr' (did you mean 'sqrt'?)");
  });
  it('refuses division by zero and non-finite results', () => {
    expect(message('1 / (2 - 2)')).toBe('division by zero');
    expect(message('0^-1')).toContain('division by zero');
    expect(message('10^400')).toContain('not a finite number');
    expect(message('sqrt(-4)')).toBe('sqrt of a negative number (-4)');
    expect(message('(-8)^(1/3)')).toContain('non-integer power');
  });
  it('gives syntax errors with a character position', () => {
    expect(message('2 * * 3')).toMatch(/^syntax error at character \d+/);
    expect(message('(1 + 2')).toContain('syntax error');
    expect(message('()')).toContain('empty parentheses');
    expect(message('')).toBe('empty expression');
  });
  it('refuses everything that is not arithmetic', () => {
    expect(message('a.b', { a: 1 })).toContain('not allowed');
    expect(message('a[0]', { a: 1 })).toContain('not allowed');
    expect(message('1 % 2')).toContain("operator '%' is not allowed");
    expect(message('2 ** 3')).toContain('write ^ for a power');
    expect(message('1 == 1')).toContain('not allowed');
    expect(message('1 ? 2 : 3')).toContain('not allowed');
    expect(message('"text"')).toContain('is not a number');
    expect(message('true')).toContain('is not a number');
    expect(message('1, 2')).toContain('one number');
    expect(message('sqrt')).toContain('is a function');
    expect(message('sqrt(1, 2)')).toBe('sqrt takes 1 argument, got 2');
    expect(message('max()')).toBe('max takes at least 1 argument, got 0');
    expect(message('constructor')).toContain('unknown name');
    expect(message('toString(1)')).toContain('unknown function');
  });
  it('says what was meant by a value with a unit, two values side by side, or a list (issue 19)', () => {
    for (const t of ['8 mm', '8mm', '210 GPa', '10 N/mm', '45°']) expect(message(t)).toMatch(/^a number followed by the unit '.+'; write the number alone/);
    expect(message('5 5')).toBe('expected one number, got 2 values side by side; join them with an operator (such as 5 * 5) or, for a point, write [x, y]');
    expect(message('2 r', { r: 1 })).toContain('(such as 2 * r)');
    expect(message('0,3')).toContain('for a decimal write a point (0.3)');
    expect(message('(1, 2) * 3')).toContain('a list of values');
  });
  it('refuses very long text before parsing it', () => {
    expect(message('1+'.repeat(600) + '1')).toContain('limit');
  });
});

describe('expressions: property test against direct arithmetic', () => {
  // Random trees of small integers printed with full parentheses; the oracle is JavaScript's
  // own arithmetic on the same tree (no parser involved).
  type Tree = { v: number } | { op: '+' | '-' | '*' | '/'; l: Tree; r: Tree } | { neg: Tree };
  const tree: fc.Arbitrary<Tree> = fc.letrec<{ t: Tree }>((tie) => ({
    t: fc.oneof(
      { depthSize: 'small', withCrossShrink: true },
      fc.integer({ min: -9, max: 9 }).map((v) => ({ v })),
      fc.record({ op: fc.constantFrom('+', '-', '*', '/' as const), l: tie('t'), r: tie('t') }),
      fc.record({ neg: tie('t') }),
    ),
  })).t;
  const print = (t: Tree): string =>
    'v' in t ? (t.v < 0 ? `(${t.v})` : `${t.v}`) : 'neg' in t ? `-(${print(t.neg)})` : `(${print(t.l)} ${t.op} ${print(t.r)})`;
  const value = (t: Tree): number => {
    if ('v' in t) return t.v;
    if ('neg' in t) return -value(t.neg);
    const a = value(t.l);
    const b = value(t.r);
    if (t.op === '/' && b === 0) return NaN;
    const r = t.op === '+' ? a + b : t.op === '-' ? a - b : t.op === '*' ? a * b : a / b;
    return r;
  };
  it('agrees exactly, or both refuse (division by zero)', () => {
    fc.assert(
      fc.property(tree, (t) => {
        const expected = value(t);
        if (Number.isNaN(expected) || !Number.isFinite(expected)) {
          expect(() => ev(print(t))).toThrow(ExpressionError);
        } else {
          expect(ev(print(t))).toBe(expected);
        }
      }),
      { numRuns: 300, seed: 20240 },
    );
  });
  it('never throws anything but ExpressionError on arbitrary text', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 40 }), (text) => {
        try {
          const v = ev(text, { a: 1, b: 2 });
          expect(Number.isFinite(v)).toBe(true);
        } catch (e) {
          expect(e).toBeInstanceOf(ExpressionError);
        }
      }),
      { numRuns: 500, seed: 7 },
    );
  });
});
