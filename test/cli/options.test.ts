/**
 * Command-line numbers refused up front with the option and the rule (issue 19, class 14):
 * src/cli/options.ts directly; test/hardening/output-safety.test.ts checks the binary.
 */
import { describe, expect, it } from 'vitest';
import { PeakwiseError } from '../../src/errors.js';
import { MAX_DOFS_LIMIT, parseMaxDofs, wholeNumberOption } from '../../src/cli/options.js';

describe('--max-dofs', () => {
  it('takes a whole number in decimal, also in exponent form', () => {
    expect(parseMaxDofs('2000000')).toBe(2_000_000);
    expect(parseMaxDofs('2e6')).toBe(2_000_000);
    expect(parseMaxDofs(' 150 ')).toBe(150);
    expect(parseMaxDofs('1')).toBe(1);
    expect(parseMaxDofs(String(MAX_DOFS_LIMIT))).toBe(MAX_DOFS_LIMIT);
  });
  it.each(['0.5', '0', '-1', '1e99', 'abc', '', '0x10', '0b11', 'Infinity', 'NaN', '1e9.5', '2,000', String(MAX_DOFS_LIMIT + 1)])('refuses %j naming the option and the rule', (text) => {
    let err: unknown;
    try {
      parseMaxDofs(text);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(PeakwiseError);
    expect((err as PeakwiseError).stage).toBe('usage');
    expect((err as Error).message).toBe(`--max-dofs must be a whole number from 1 to ${MAX_DOFS_LIMIT}, got "${text}"`);
  });
  it('the rule is the general one for whole-number options', () => {
    expect(() => wholeNumberOption('13', '--levels', 2, 12)).toThrow('--levels must be a whole number from 2 to 12, got "13"');
  });
});
