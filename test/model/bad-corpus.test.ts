/**
 * The bad-model corpus (test/fixtures/bad): every model-stage case must throw a
 * ModelError whose one-line text names the file, the expected line and the key path, and
 * contains the expected fragment. Expected values live in expected.json (one line per
 * case to tighten); the line numbers there come from the fixture text, not from the loader.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { ModelError } from '../../src/errors.js';
import { formatModelError, parseModel } from '../../src/model/index.js';

const dir = fileURLToPath(new URL('../fixtures/bad/', import.meta.url));
interface Expected { stage: string; fragment: string; line?: number; keyPath?: string }
const expected = JSON.parse(readFileSync(`${dir}expected.json`, 'utf8')) as Record<string, Expected>;
/** imported files (outlines, tables) live in bad/files, named relative to the fixture */
const readFile = (path: string): string => readFileSync(dir + path, 'utf8');

describe('bad-model corpus', () => {
  it('lists every fixture file in expected.json and has 20+ model cases', () => {
    const files = readdirSync(dir).filter((f) => f.endsWith('.yaml')).sort();
    expect(Object.keys(expected).sort()).toEqual(files);
    expect(Object.values(expected).filter((e) => e.stage === 'model').length).toBeGreaterThanOrEqual(20);
  });

  for (const [name, want] of Object.entries(expected)) {
    if (want.stage !== 'model') {
      it(`${name} passes the model stage (its error belongs to ${want.stage})`, () => {
        expect(() => parseModel(readFileSync(dir + name, 'utf8'), `bad/${name}`, { readFile })).not.toThrow();
      });
      continue;
    }
    it(`${name}: ${want.fragment}`, () => {
      const file = `test/fixtures/bad/${name}`;
      let caught: unknown;
      try {
        parseModel(readFileSync(dir + name, 'utf8'), file, { readFile });
      } catch (e) {
        caught = e;
      }
      expect(caught).toBeInstanceOf(ModelError);
      const error = caught as ModelError;
      const text = formatModelError(error, file);
      expect(text).toContain(want.fragment);
      expect(text).not.toContain('\n');
      if (want.line !== undefined) {
        expect(error.line).toBe(want.line);
        expect(text.startsWith(`${file}:${want.line}:${error.col}`)).toBe(true);
      }
      expect(error.col).toBeGreaterThanOrEqual(1);
      if (want.keyPath !== undefined) {
        expect(error.keyPath).toBe(want.keyPath);
        expect(text).toContain(` ${want.keyPath}: `);
      }
    });
  }
});
