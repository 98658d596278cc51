/**
 * Issue 19, class 7: the SVG reader takes only drawn paths. Elements inside comments, CDATA,
 * `<defs>` and the other parts that are not drawn where they stand (SVG 1.1: §5.3 defs, §5.5
 * symbol, §14.3 clipPath, §14.4 mask, §13.3 pattern, §11.6 marker, §5.4 title/desc, §21
 * metadata), or hidden by display: none, are not outlines; an id used twice is an error; a
 * number that overflows is "not a finite number".
 */
import { describe, expect, it } from 'vitest';
import { SvgError, findSvgPath, parseSvgPath } from '../../src/model/svg.js';
import { readCsv } from '../../src/model/csv.js';

const SQUARE = 'M 0 0 H 10 V -10 H 0 Z';
const wrap = (body: string) => `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 -10 10 10">\n${body}\n</svg>`;
const find = (body: string, id = 'p') => findSvgPath(wrap(body), id, 'drawing.svg');
const error = (body: string, id = 'p'): string => {
  try {
    find(body, id);
  } catch (e) {
    if (e instanceof SvgError) return e.message;
    throw e;
  }
  throw new Error('expected an SvgError');
};

describe('SVG: only drawn paths', () => {
  for (const container of ['defs', 'symbol', 'clipPath', 'mask', 'pattern', 'marker', 'title', 'desc', 'metadata', 'linearGradient', 'filter']) {
    it(`a path inside <${container}> is not drawn`, () => {
      const msg = error(`<${container} id="c">\n  <g><path id="p" d="${SQUARE}"/></g>\n</${container}>`);
      expect(msg).toContain(`drawing.svg:3: path 'p' is not drawn: it lies inside <${container}> (line 2)`);
    });
  }

  it('a path in a comment, a CDATA section, a script or a style is not an element at all', () => {
    for (const body of [
      `<!-- <path id="p" d="${SQUARE}"/> -->`,
      `<script><![CDATA[ '<path id="p" d="${SQUARE}"/>' ]]></script>`,
      `<script> if (a < b) x = '<path id="p" d="${SQUARE}"/>'; </script>`,
      `<style> /* <path id="p" d="${SQUARE}"/> */ </style>`,
    ]) {
      expect(error(`${body}\n<path id="q" d="${SQUARE}"/>`)).toBe("drawing.svg: no <path> with id 'p'; the drawn paths with an id are 'q'");
    }
  });

  it('display: none (attribute or style) on the path or an ancestor hides it', () => {
    expect(error(`<path id="p" display="none" d="${SQUARE}"/>`)).toContain("path 'p' is not drawn: it has display: none");
    expect(error(`<g style="fill: red; display:none">\n<path id="p" d="${SQUARE}"/></g>`)).toContain('it lies inside an element with display: none (line 2)');
  });

  it('the drawn path is found past comments, a DOCTYPE with an internal subset, a processing instruction, ">" in attributes, entities and prefixes', () => {
    const text = `<?xml version="1.0"?>
<!DOCTYPE svg [ <!ENTITY e "x"> ]>
<svg:svg xmlns:svg="http://www.w3.org/2000/svg">
  <!-- <path id="p" d="M 0 0 L 1 1 Z"/> -->
  <svg:desc>a > b, and <svg:path id="in-desc" d="M 0 0 Z"/></svg:desc>
  <svg:path data-note="x > y" id='p' d="M&#32;0 0 H 10 V -10 H 0 &#x5A;"/>
</svg:svg>`;
    const d = findSvgPath(text, 'p', 'drawing.svg');
    expect(d).toBe(SQUARE);
    // model point = (x, −y): a 10 × 10 square above the x axis
    const segs = parseSvgPath(d, 1, 'drawing.svg', 'p');
    expect(segs.map((s) => (s.kind === 'line' ? [s.from, s.to] : []))).toEqual([
      [[0, -0], [10, -0]], [[10, -0], [10, 10]], [[10, 10], [0, 10]], [[0, 10], [0, -0]],
    ]);
  });

  it('an id used twice (on any elements) is an error naming both lines', () => {
    expect(error(`<g id="p">\n</g>\n<path id="p" d="${SQUARE}"/>`)).toBe(
      "drawing.svg: the id 'p' is used by 2 elements (lines 2, 4); ids must be unique in a drawing, rename all but one",
    );
    // the same id twice even when one copy is not drawn
    expect(error(`<defs><path id="p" d="${SQUARE}"/></defs>\n<path id="p" d="${SQUARE}"/>`)).toContain('used by 2 elements (lines 2, 3)');
  });

  it('a transform on an enclosing group or a nested <svg> is refused, like one on the path', () => {
    expect(error(`<g transform="rotate(30)">\n<g><path id="p" d="${SQUARE}"/></g></g>`)).toContain('sits inside <g> with a transform (line 2), which moves it');
    expect(error(`<svg x="5" y="5">\n<path id="p" d="${SQUARE}"/></svg>`)).toContain('sits inside a nested <svg> (line 2)');
    expect(error(`<path id="p" transform="scale(2)" d="${SQUARE}"/>`)).toContain('has a transform attribute');
  });

  it('numbers that overflow are not finite numbers', () => {
    const parse = (d: string, scale = 1) => () => parseSvgPath(d, scale, 'drawing.svg', 'p');
    expect(parse('M 0 0 H 1e400 V -10 H 0 Z')).toThrow("path 'p': the number '1e400' at character 9 of the path data is not a finite number");
    expect(parse('M 0 0 H 1e308 V -10 H 0 Z', 1e10)).toThrow('times the scale 10000000000 is not a finite number');
  });

  it('a long hostile id is cut in the message', () => {
    const id = 'x'.repeat(5000);
    const msg = error(`<path id="q" d="${SQUARE}"/>`, id);
    expect(msg.length).toBeLessThan(200);
  });
});

describe('CSV: plain decimal numbers only', () => {
  const cell = (text: string) => () => readCsv(`x,y\n0,0\n${text},1\n`, 'pts.csv');
  it('hexadecimal, binary, octal, digit separators and Infinity are refused with the reason', () => {
    // JavaScript's Number() would read these as 16, 1, 8, NaN and Infinity
    expect(cell('0x10')).toThrow("pts.csv:3: field 1 is '0x10', a hexadecimal number; write it in decimal");
    expect(cell('0b1')).toThrow("field 1 is '0b1', a binary number");
    expect(cell('-0o10')).toThrow("field 1 is '-0o10', an octal number");
    expect(cell('1_000')).toThrow("field 1 is '1_000', a number with _ separators");
    expect(cell('Infinity')).toThrow("field 1 is 'Infinity', not a finite number");
    expect(cell('1e400')).toThrow("field 1 is '1e400', not a finite number (too large)");
    // even in the first row, where a text cell would make a header
    expect(() => readCsv('0x0,0\n1,0\n', 'pts.csv')).toThrow("pts.csv:1: field 1 is '0x0', a hexadecimal number");
  });
  it('decimal forms are read', () => {
    expect(readCsv('x,y\n-1.5,.5\n+2e-3,7.\n', 'pts.csv').rows.map((r) => r.values)).toEqual([[-1.5, 0.5], [0.002, 7]]);
  });
});
