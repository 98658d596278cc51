/**
 * Mutated model files: the loader must either return a model or throw a ModelError that
 * names a line — never another exception, never a hang (issue 8, fuzzing).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ModelError } from '../../src/errors.js';
import { formatModelError, parseModel } from '../../src/model/index.js';

const dir = fileURLToPath(new URL('../../models/', import.meta.url));
const texts = readdirSync(dir).filter((f) => f.endsWith('.yaml')).map((f) => readFileSync(dir + f, 'utf8'));

const TOKENS = ['', '-', '0', '-1', '1e300', '.nan', 'null', '~', '[', ']', '{', '}', ':', ',', '&a', '*a', '"', "'", 'x', 'y', 'w/0',
  'sqrt(-1)', 'pi', '\t', '  ', '\n', '- ', '#', 'round: -1', '[1, 2, 3]', '{ point: [0, 0] }', 'true', '0.5', '1/3', '^', '%'];

type Mutation = { kind: 'delete-line' | 'duplicate-line' | 'insert' | 'replace'; at: number; token: number; width: number };

function mutate(text: string, ms: Mutation[]): string {
  let out = text;
  for (const m of ms) {
    const lines = out.split('\n');
    const li = m.at % Math.max(lines.length, 1);
    const token = TOKENS[m.token % TOKENS.length];
    if (m.kind === 'delete-line') lines.splice(li, 1);
    else if (m.kind === 'duplicate-line') lines.splice(li, 0, lines[li] ?? '');
    else {
      const line = lines[li] ?? '';
      const col = m.at % (line.length + 1);
      lines[li] = line.slice(0, col) + token + line.slice(m.kind === 'replace' ? col + (m.width % 6) : col);
    }
    out = lines.join('\n');
  }
  return out;
}

const mutation: fc.Arbitrary<Mutation> = fc.record({
  kind: fc.constantFrom('delete-line', 'duplicate-line', 'insert', 'replace' as const),
  at: fc.nat(10_000),
  token: fc.nat(1000),
  width: fc.nat(100),
});

describe('model loader fuzz', () => {
  it('mutated demo models give a model or a located ModelError', () => {
    let errors = 0;
    fc.assert(
      fc.property(fc.nat(texts.length - 1), fc.array(mutation, { minLength: 1, maxLength: 4 }), (which, ms) => {
        const text = mutate(texts[which], ms);
        try {
          const m = parseModel(text, 'fuzz.yaml');
          expect(Number.isFinite(m.thickness) && m.thickness > 0).toBe(true);
          expect(m.material.nu > -1 && m.material.nu < 0.5).toBe(true);
        } catch (e) {
          if (!(e instanceof ModelError)) throw e;
          errors++;
          expect(e.line).toBeGreaterThanOrEqual(1);
          expect(e.col).toBeGreaterThanOrEqual(1);
          expect(formatModelError(e, 'fuzz.yaml')).toMatch(/^fuzz\.yaml:\d+:\d+[ :]/);
        }
      }),
      { numRuns: 300, seed: 424242 },
    );
    // the mutations must actually exercise the error paths (an oracle on the test itself)
    expect(errors).toBeGreaterThan(75);
  });
});
