import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { ModelError } from '../../src/errors.js';
import { reportedCaseRule } from '../../src/model/reported-values.js';

const head = `
units: { length: mm, force: N }
material: { E: 200000, nu: 0.3 }
thickness: 1
plate: { outline: [[0, 0], [10, 0], [10, 5], [0, 5]] }
supports: [ { where: { x: 0 }, fix: [x, y] } ]
loads: [ { where: { x: 10 }, traction: [1, 0] } ]
params: { h: 0.5 }
study: { measure: max-principal }
`;
const files: Record<string, string> = {
  'other.csv': 'x,y,value,size,label,order,measure\n10,5,123.5,0.8,run-7,1,\n# a comment\n0;5;99;h;x;;\n',
  'good.csv': 'label,x,y,value,size\nrun-7,10,5,123.5,0.8\nrun-8,0,5,99,1.5\n',
  'bad-size.csv': 'x,y,value,size\n10,5,123.5,-1\n',
  'bad-col.csv': 'x,y,valeu,size\n10,5,1,1\n',
  'bad-num.csv': 'x,y,value,size\n10,5,0x10,1\n',
  'bad-measure.csv': 'x,y,value,size,measure\n10,5,1,1,von-mise\n',
};
const parse = (reported: string) => parseModel(`${head}reported: ${reported}\n`, 'm.yaml', { readFile: (p) => { if (!(p in files)) throw new Error(`ENOENT: ${p}`); return files[p]; } });
const error = (reported: string): ModelError => {
  try { parse(reported); } catch (e) { if (e instanceof ModelError) return e; throw e; }
  throw new Error('expected an error');
};

describe('reported values in the model file (issue 15 §1)', () => {
  it('entries: at, value and size evaluated; measure defaults to study.measure; label, case, order kept', () => {
    const m = parse('[ { at: [10, 5], value: 120, size: "2*h", label: run-3, order: 1, case: loads }, { at: [0, 5], value: 80, size: 1, measure: von-mises } ]');
    expect(m.reported).toEqual([
      { at: [10, 5], value: 120, size: 1, measure: 'max-principal', label: 'run-3', order: 1, case: 'loads', keyPath: 'reported[0]' },
      { at: [0, 5], value: 80, size: 1, measure: 'von-mises', keyPath: 'reported[1]' },
    ]);
  });
  it('a CSV table: header names the columns in any order; rows keep file and line', () => {
    const m = parse('[ { table: good.csv } ]');
    expect(m.reported!.map((r) => [r.at, r.value, r.size, r.label, r.keyPath])).toEqual([
      [[10, 5], 123.5, 0.8, 'run-7', 'reported[0] (good.csv:2)'],
      [[0, 5], 99, 1.5, 'run-8', 'reported[0] (good.csv:3)'],
    ]);
  });
  it('bad entries get one-line errors with the key path', () => {
    expect(error('[ { at: [10, 5], value: 1 } ]').message).toMatch(/a reported value needs size/);
    expect(error('[ { at: [10, 5], value: 1, size: 0 } ]')).toMatchObject({ keyPath: 'reported[0].size' });
    expect(error('[ { at: [10, 5], value: 1, size: 0 } ]').message).toMatch(/element size must be > 0/);
    expect(error('[ { at: [10, 5], value: 1, size: 1, order: 3 } ]')).toMatchObject({ keyPath: 'reported[0].order' });
    expect(error('[ { at: [10, 5], value: 1, size: 1, measure: vm } ]').keyPath).toBe('reported[0].measure');
    expect(error('[ { at: [10, 5], value: 1, size: 1, sise: 2 } ]').message).toMatch(/unknown key 'sise'.*size/);
    expect(error('[ { table: good.csv, value: 3 } ]').message).toMatch(/value goes in the table's columns/);
    expect(error('[ { at: [10, 5], value: 1, size: 1, case: wind } ]').message).toMatch(/case 'wind' is not a load case of this model/);
    expect(error('[]').message).toMatch(/at least one reported value/);
  });
  it('bad CSV rows name the file and line', () => {
    expect(error('[ { table: other.csv } ]').message).toMatch(/other\.csv:4: column 'size' is 'h', not a number/);
    expect(error('[ { table: bad-size.csv } ]').message).toMatch(/bad-size\.csv:2: column 'size' must be > 0/);
    expect(error('[ { table: bad-col.csv } ]').message).toMatch(/bad-col\.csv:1: unknown column 'valeu'.*value/);
    expect(error('[ { table: bad-num.csv } ]').message).toMatch(/bad-num\.csv:2: column 'value' is '0x10', a hexadecimal number/);
    expect(error('[ { table: bad-measure.csv } ]').message).toMatch(/bad-measure\.csv:2: column 'measure' is 'von-mise'/);
    expect(error('[ { table: missing.csv } ]')).toMatchObject({ keyPath: 'reported[0].table' });
  });
  it('case: without load cases only the model\'s own loads; with cases, their names (contracts §5)', () => {
    expect(reportedCaseRule('loads', [])).toBeUndefined();
    expect(reportedCaseRule('wind', ['wind', 'snow'])).toBeUndefined();
    expect(reportedCaseRule('wnd', ['wind', 'snow'])).toMatch(/did you mean 'wind'/);
  });
});
