/** What the model-file tests share: a minimal valid plate and the ModelError a text raises. */
import { expect } from 'vitest';
import { ModelError } from '../../src/errors.js';
import { parseModel } from '../../src/model/index.js';

/** A 100 × 50 plate, clamped at x = 0 and pulled at x = 100: the smallest model every key test edits. */
export const MINIMAL_MODEL = `
material: { E: 210000, nu: 0.3 }
thickness: 10
plate:
  outline: [[0, 0], [100, 0], [100, 50], [0, 50]]
supports:
  - { where: { x: 0 }, fix: [x, y] }
loads:
  - { where: { x: 100 }, traction: [10, 0] }
`;

/** The ModelError that parsing `text` raises; the test fails when it parses or throws anything else. */
export function modelErrorOf(text: string, file = 'm.yaml'): ModelError {
  try {
    parseModel(text, file);
  } catch (e) {
    expect(e).toBeInstanceOf(ModelError);
    return e as ModelError;
  }
  throw new Error('expected a ModelError');
}
