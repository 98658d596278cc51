/**
 * Issue 19, class 13: binary, UTF-16 and deeply nested model files get one short line in plain
 * words — no kilobytes of garbage, no "call stack". Files are decoded the way the CLI reads them
 * (bytes as UTF-8).
 */
import { describe, expect, it } from 'vitest';
import { formatModelError } from '../../src/model/index.js';
import { seededRandom } from '../helpers/random.js';
import { modelErrorOf } from './helpers.js';

const MODEL = [
  'material: { E: 210000, nu: 0.3 }', 'thickness: 3',
  'plate:', '  outline: [[0, 0], [120, 0], [120, 60], [0, 60]]',
  'supports: [ { where: { x: 0 }, fix: [x, y] } ]',
  'loads: [ { where: { x: 120 }, traction: [50, 0] } ]', '',
].join('\n');

const line = (text: string): string => formatModelError(modelErrorOf(text), 'm.yaml');
const asRead = (bytes: Buffer): string => bytes.toString('utf8');

describe('model files that are not UTF-8 text', () => {
  it('UTF-16 (either byte order, with or without a byte-order mark) and UTF-32', () => {
    const le = Buffer.from(MODEL, 'utf16le');
    const be = Buffer.from(le).swap16();
    const utf32 = Buffer.alloc(4 * MODEL.length);
    for (let k = 0; k < MODEL.length; k++) utf32.writeUInt32LE(MODEL.charCodeAt(k), 4 * k);
    for (const bytes of [le, be, Buffer.concat([Buffer.from([0xff, 0xfe]), le]), Buffer.concat([Buffer.from([0xfe, 0xff]), be]), utf32]) {
      expect(line(asRead(bytes))).toMatch(/^m\.yaml:1:\d+: the file is not a UTF-8 text file: it looks like UTF-16 \(a zero byte beside every letter\); save it as UTF-8$/);
    }
  });

  it('random binary data: one short line, always', () => {
    const rnd = seededRandom(1913);
    for (let run = 0; run < 40; run++) {
      const bytes = Buffer.alloc(64 + Math.floor(rnd() * 8000));
      for (let k = 0; k < bytes.length; k++) bytes[k] = Math.floor(rnd() * 256);
      const text = line(asRead(bytes));
      expect(text).not.toContain('\n');
      expect(text.length).toBeLessThan(200);
      expect(text).toMatch(/not a UTF-8 text file: it (holds a zero byte|holds bytes that are not UTF-8|looks like UTF-16)/);
    }
  });

  it('Latin-1 text names the line of the first byte that is not UTF-8', () => {
    const latin1 = Buffer.from(MODEL.replace('thickness: 3', 'title: Kranbahnträger\nthickness: 3'), 'latin1');
    expect(line(asRead(latin1))).toMatch(/^m\.yaml:2:18: the file is not a UTF-8 text file: it holds bytes that are not UTF-8/);
  });
});

describe('deep nesting and long garbage', () => {
  it('flow and block nesting far beyond a model: a plain message, quickly, no stack overflow', () => {
    const n = 50_000;
    const cases = [
      `material: ${'['.repeat(n)}${']'.repeat(n)}\n`,
      `material: ${'{a: '.repeat(n)}1${'}'.repeat(n)}\n`,
      `${Array.from({ length: 1500 }, (_, i) => `${' '.repeat(i)}k:`).join('\n')} 1\n`,
      `${'- '.repeat(5000)}1\n`,
    ];
    for (const text of cases) {
      const msg = line(text);
      expect(msg).toMatch(/mappings and lists nest (more than 320|\d+) levels deep here; a model needs about 6 and the limit is 32$/);
      expect(msg).not.toMatch(/call stack/i);
    }
  });

  it('33 levels are refused, 32 pass the nesting check (and fail later on the schema)', () => {
    const nested = (levels: number) => `${MODEL}study: { sites: ${'['.repeat(levels - 2)}1${']'.repeat(levels - 2)} }\n`;
    expect(line(nested(33))).toContain('nest 33 levels deep');
    expect(line(nested(32))).toContain('study.sites');
  });

  it('a 4 KB line of printable garbage is echoed in at most a short fragment', () => {
    const rnd = seededRandom(7);
    for (let run = 0; run < 20; run++) {
      let junk = '';
      for (let k = 0; k < 4096; k++) junk += String.fromCharCode(33 + Math.floor(rnd() * 94));
      const msg = line(run % 2 === 0 ? junk : `material: ${junk}\n`);
      expect(msg).not.toContain('\n');
      expect(msg.length).toBeLessThan(300);
    }
  });
});
