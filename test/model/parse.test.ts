import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { FemError, ModelError } from '../../src/errors.js';
import {
  boundingBox, formatModelError, locate, parseModel, shapeArea, stressUnit, type Model,
} from '../../src/model/index.js';
import { MINIMAL_MODEL as minimal, modelErrorOf as fails } from './helpers.js';

const modelsDir = fileURLToPath(new URL('../../models/', import.meta.url));
const demo = (name: string): Model => parseModel(readFileSync(modelsDir + name, 'utf8'), `models/${name}`);

describe('demo models', () => {
  const files = readdirSync(modelsDir).filter((f) => f.endsWith('.yaml'));
  it('has the nine demo models', () => {
    expect(files.sort()).toEqual([
      'edge-slit.yaml', 'ellipse-hole.yaml', 'flywheel-web.yaml', 'hanger-rod-shoulder.yaml', 'hoist-lug.yaml', 'l-bracket-fillet.yaml',
      'l-bracket-sharp.yaml', 'strap-pin-hole.yaml', 'web-opening.yaml',
    ]);
  });

  for (const file of files) {
    it(`${file} parses, starts with a comment header, uses steel in mm and N and stays small`, () => {
      const text = readFileSync(modelsDir + file, 'utf8');
      expect(text.startsWith('# ')).toBe(true);
      expect(text).toMatch(/what to expect/i);
      const m = demo(file);
      expect(m.units).toEqual({ length: 'mm', force: 'N' });
      expect(stressUnit(m.units)).toBe('MPa');
      // steel, with the yield stress of its grade (S235 or S355, EN 10025-2 nominal values for t ≤ 16 mm)
      expect(m.material.E).toBe(210000);
      expect(m.material.nu).toBe(0.3);
      expect([235, 355]).toContain(m.material.yield);
      expect(m.warnings).toBeUndefined();
      // a few thousand elements at most: equilateral-triangle estimate A / (√3/4 h²) for
      // the far field plus each local disk (common practice, same estimate as issue 2)
      const h = m.mesh.size;
      const farField = shapeArea(m.plate.outline) / ((Math.sqrt(3) / 4) * h * h);
      const local = m.mesh.local.reduce((sum, l) => sum + (Math.PI * l.radius ** 2) / ((Math.sqrt(3) / 4) * l.size ** 2), 0);
      expect(farField + local).toBeLessThan(5000);
      expect(farField).toBeGreaterThan(100);
      // loads and supports exist, and a force is only ever at a point
      expect(m.supports.length).toBeGreaterThan(0);
      expect(m.loads.length).toBeGreaterThan(0);
      for (const load of m.loads) if (load.kind === 'force') expect(load.where.kind).toBe('point');
    });
  }

  it('l-bracket-sharp: the re-entrant corner vertex has round 0, the fillet twin round 8', () => {
    const sharp = demo('l-bracket-sharp.yaml');
    const fillet = demo('l-bracket-fillet.yaml');
    const corner = (m: Model) => (m.plate.outline.kind === 'polygon' ? m.plate.outline.vertices[3] : undefined);
    expect(corner(sharp)).toEqual({ at: [40, 40], round: 0 });
    expect(corner(fillet)).toEqual({ at: [40, 40], round: 8 });
    // L area by hand: 120·40 + 40·80 = 8000 mm²
    expect(shapeArea(sharp.plate.outline)).toBe(8000);
    // the same file serves radius sweeps
    const swept = parseModel(readFileSync(`${modelsDir}l-bracket-sharp.yaml`, 'utf8'), 'x.yaml', { params: { r: 4 } });
    expect(corner(swept)).toEqual({ at: [40, 40], round: 4 });
  });

  it('strap-pin-hole: d/W = 0.3 (a row of the Heywood 1952 / Howland 1930 tables)', () => {
    const m = demo('strap-pin-hole.yaml');
    const pin = m.plate.openings[0].shape;
    expect(pin.kind).toBe('circle');
    if (pin.kind === 'circle') expect((2 * pin.radius) / m.params.W).toBeCloseTo(0.3, 12);
    expect(m.plate.openings[0].id).toBe('pin');
  });

  it('ellipse-hole: a/b = 3 with the long axis across the load (Inglis 1913, K_t = 1 + 2a/b = 7)', () => {
    const m = demo('ellipse-hole.yaml');
    const port = m.plate.openings[0].shape;
    expect(port.kind).toBe('ellipse');
    if (port.kind === 'ellipse') {
      expect(port.a / port.b).toBe(3);
      expect(port.angleDeg).toBe(0); // a along x; the load is along y
    }
    const top = m.loads[0];
    expect(top.kind === 'traction' && top.traction[0] === 0 && top.traction[1] > 0).toBe(true);
    // local size at the tips is rho/4 = b²/(4a) = 25/60 (the tip radius ρ = b²/a of Inglis' ellipse, a quarter of it)
    expect(m.mesh.local[0].size).toBeCloseTo(25 / 60, 14);
  });

  it('web-opening: the edge tractions of uniform shear are self-equilibrated (force and moment)', () => {
    const m = demo('web-opening.yaml');
    const { w, h } = m.params;
    // resultant of a uniform traction on a straight edge = traction × edge length (× t)
    let fx = 0, fy = 0, moment = 0;
    for (const load of m.loads) {
      if (load.kind !== 'traction') throw new Error('expected tractions only');
      const sel = load.where;
      const [tx, ty] = load.traction;
      if (sel.kind === 'x') { fx += tx * h; fy += ty * h; moment += sel.value * ty * h - (h / 2) * tx * h; }
      if (sel.kind === 'y') { fx += tx * w; fy += ty * w; moment += (w / 2) * ty * w - sel.value * tx * w; }
    }
    expect(fx).toBe(0);
    expect(fy).toBe(0);
    expect(moment).toBe(0);
  });

  it('edge-slit: the slit is a sharp V of 1 mm mouth and 20 mm depth', () => {
    const m = demo('edge-slit.yaml');
    if (m.plate.outline.kind !== 'polygon') throw new Error('polygon outline expected');
    const v = m.plate.outline.vertices.map((p) => p.at);
    expect(v[5]).toEqual([20, 100]);
    expect(v[4][1] - v[6][1]).toBe(1);
    expect(m.plate.outline.vertices.every((p) => p.round === 0)).toBe(true);
  });
});

describe('defaults and shape', () => {
  it('fills every default of docs/model-format.md', () => {
    const m = parseModel(minimal, 'models/plain-strip.yaml');
    expect(m.title).toBe('plain-strip');
    expect(m.file).toBe('models/plain-strip.yaml');
    expect(m.units).toEqual({ length: 'mm', force: 'N' });
    expect(m.state).toBe('plane-stress');
    expect(m.params).toEqual({});
    expect(m.plate.openings).toEqual([]);
    // default mesh size: a tenth of the smaller extent, 50/10
    expect(m.mesh).toEqual({ size: 5, order: 2, local: [] });
    expect(m.study).toEqual({ measure: 'von-mises', levels: 6, ratio: 2, sites: 'auto', readouts: { distance: undefined } });
    expect(m.supports[0]).toEqual({ where: { kind: 'x', value: 0 }, fix: { x: true, y: true }, keyPath: 'supports[0]' });
    expect(m.loads[0]).toEqual({ kind: 'traction', where: { kind: 'x', value: 100 }, traction: [10, 0], keyPath: 'loads[0]' });
  });

  it('accepts JSON, which is YAML', () => {
    const json = JSON.stringify({
      material: { E: 70000, nu: 0.33 }, thickness: 2,
      plate: { outline: { circle: { center: [0, 0], radius: 50 } } },
      supports: [{ where: { outline: true }, fix: ['x', 'y'] }],
      loads: [{ where: { point: [0, 50] }, force: [0, -100] }],
      mesh: { size: 4, order: 1 },
    });
    const m = parseModel(json, 'disc.json');
    expect(m.title).toBe('disc');
    expect(m.plate.outline).toEqual({ kind: 'circle', center: [0, 0], radius: 50 });
    expect(m.supports[0].where).toEqual({ kind: 'outline' });
    expect(m.loads[0]).toMatchObject({ kind: 'force', where: { kind: 'point', at: [0, 50] }, force: [0, -100] });
    expect(m.mesh.order).toBe(1);
  });

  it('reads every key of docs/model-format.md, with expressions in place of numbers', () => {
    const text = `
title: Access opening in a test panel
units: { length: mm, force: N }
params: { w: 800, h: 400, r: 25, half: w/2 }
material: { E: 206000, nu: 0.3 }
thickness: 10
state: plane-strain
plate:
  outline: [[0, 0], [w, 0], { at: [w, h], round: 12 }, [0, h]]
  openings:
    - { id: door, rect: { center: [half, 200], width: 300, height: 150, round: r } }
    - { id: pin, circle: { center: [100, 100], radius: 20 } }
    - { id: ell, ellipse: { center: [650, 300], a: 40, b: 12, angle: 30 } }
    - { id: cut, polygon: [[600, 0], [620, 0], { at: [610, 30], round: 2 }] }
supports:
  - { where: { x: 0 }, fix: [x, y] }
  - { where: { point: [w, 0] }, fix: [y] }
  - { where: { segment: [[0, 0], [10, 0]] }, fix: [x] }
loads:
  - { where: { x: w }, traction: [100, 0] }
  - { where: { opening: pin }, pressure: 5 }
  - { where: { point: [w/2, h] }, force: [0, -1000] }
  - { where: { y: "h" }, traction: [0, 1] }
mesh:
  size: 25
  order: 1
  local: [ { near: [250, 125], size: 2, radius: 60 } ]
study:
  measure: max-principal
  levels: 4
  ratio: 1.5
  sites: [[400, 200], [0, 0]]
  readouts: { distance: 0.5 }
`;
    const m = parseModel(text, 'panel.yaml');
    expect(m.title).toBe('Access opening in a test panel');
    expect(m.params).toEqual({ w: 800, h: 400, r: 25, half: 400 });
    expect(m.state).toBe('plane-strain');
    expect(m.plate.outline).toEqual({
      kind: 'polygon',
      vertices: [{ at: [0, 0], round: 0 }, { at: [800, 0], round: 0 }, { at: [800, 400], round: 12 }, { at: [0, 400], round: 0 }],
    });
    expect(m.plate.openings.map((o) => [o.id, o.shape.kind, o.keyPath])).toEqual([
      ['door', 'rect', 'plate.openings[0]'], ['pin', 'circle', 'plate.openings[1]'],
      ['ell', 'ellipse', 'plate.openings[2]'], ['cut', 'polygon', 'plate.openings[3]'],
    ]);
    expect(m.plate.openings[0].shape).toEqual({ kind: 'rect', center: [400, 200], width: 300, height: 150, round: 25 });
    expect(m.plate.openings[2].shape).toEqual({ kind: 'ellipse', center: [650, 300], a: 40, b: 12, angleDeg: 30 });
    expect(m.plate.openings[3].shape).toEqual({
      kind: 'polygon', vertices: [{ at: [600, 0], round: 0 }, { at: [620, 0], round: 0 }, { at: [610, 30], round: 2 }],
    });
    expect(m.supports.map((s) => s.fix)).toEqual([{ x: true, y: true }, { x: false, y: true }, { x: true, y: false }]);
    expect(m.supports[2].where).toEqual({ kind: 'segment', from: [0, 0], to: [10, 0] });
    expect(m.loads.map((l) => l.kind)).toEqual(['traction', 'pressure', 'force', 'traction']);
    expect(m.loads[1]).toMatchObject({ where: { kind: 'opening', id: 'pin' }, pressure: 5 });
    expect(m.loads[2]).toMatchObject({ where: { kind: 'point', at: [400, 400] } });
    expect(m.loads[3]).toHaveProperty('where', { kind: 'y', value: 400 });
    expect(m.mesh).toEqual({ size: 25, order: 1, local: [{ near: [250, 125], size: 2, radius: 60 }] });
    expect(m.study).toEqual({ measure: 'max-principal', levels: 4, ratio: 1.5, sites: [[400, 200], [0, 0]], readouts: { distance: 0.5 } });
  });

  it('outline as one shape: rect and ellipse', () => {
    const rect = parseModel(minimal.replace('[[0, 0], [100, 0], [100, 50], [0, 50]]', '{ rect: { center: [50, 25], width: 100, height: 50 } }'), 'r.yaml');
    expect(rect.plate.outline).toEqual({ kind: 'rect', center: [50, 25], width: 100, height: 50, round: 0 });
    expect(boundingBox(rect.plate.outline)).toEqual({ minX: 0, minY: 0, width: 100, height: 50 });
    const ell = parseModel(minimal.replace('[[0, 0], [100, 0], [100, 50], [0, 50]]', '{ ellipse: { center: [0, 0], a: 3, b: 1, angle: 90 } }'), 'e.yaml');
    // turned by 90°, the long axis lies along y: bounds 2b × 2a
    const box = boundingBox(ell.plate.outline);
    expect(box.width).toBeCloseTo(2, 12);
    expect(box.height).toBeCloseTo(6, 12);
    expect(shapeArea(ell.plate.outline)).toBeCloseTo(3 * Math.PI, 12);
  });

  it('small YAML aliases are fine (reuse of a point)', () => {
    const m = parseModel(minimal.replace('[[0, 0], [100, 0],', '[&origin [0, 0], [100, 0],').replace('{ x: 0 }', '{ point: *origin }'), 'a.yaml');
    expect(m.supports[0].where).toEqual({ kind: 'point', at: [0, 0] });
  });

  it('warns when E looks like it is in other units than the labels', () => {
    const m = parseModel(minimal.replace('E: 210000', 'E: 210e9'), 'pa.yaml');
    expect(m.warnings?.[0].keyPath).toBe('material.E');
    expect(m.warnings?.[0].message).toContain('MPa');
    const inMetres = parseModel(`units: { length: m, force: N }\n${minimal.replace('E: 210000', 'E: 210e9')}`, 'm.yaml');
    // no E warning in metres (the 10 m thickness of this minimal model gets its own warning)
    expect(inMetres.warnings?.map((w) => w.keyPath)).toEqual(['thickness']);
  });
});

describe('params and overrides', () => {
  it('evaluates params in dependency order, whatever the written order', () => {
    const m = parseModel(`params: { area: w * h, w: 2 * h, h: 5 }\n${minimal}`, 'p.yaml');
    expect(m.params).toEqual({ area: 50, w: 10, h: 5 });
  });
  it('overrides replace a param and its dependants follow', () => {
    const text = `params: { r: 2, d: 2 * r }\n${minimal.replace('thickness: 10', 'thickness: d')}`;
    const m = parseModel(text, 'p.yaml', { params: { r: 3 } });
    expect(m.params).toEqual({ r: 3, d: 6 });
    expect(m.thickness).toBe(6);
  });
  it('an override of an unknown param is an error with a hint', () => {
    let caught: unknown;
    try {
      parseModel(`params: { radius: 2 }\n${minimal}`, 'p.yaml', { params: { raduis: 3 } });
    } catch (e) { caught = e; }
    expect(caught).toBeInstanceOf(ModelError);
    expect((caught as Error).message).toContain("did you mean 'radius'?");
    expect((caught as ModelError).keyPath).toBe('params');
  });
  it('__proto__ is refused as a key and as a parameter name', () => {
    expect(fails(`__proto__: 1\n${minimal}`).keyPath).toBe('__proto__');
    const e = fails(`params: { __proto__: 1 }\n${minimal}`);
    expect([e.keyPath, e.line]).toEqual(['params.__proto__', 1]);
  });
  it('a self-reference is a cycle', () => {
    const e = fails(`params: { a: a + 1 }\n${minimal}`);
    expect(e.message).toContain('a → a');
    expect([e.line, e.keyPath]).toEqual([1, 'params.a']);
  });
});

describe('source map, locate and formatModelError', () => {
  const text = `material: { E: 210000, nu: 0.3 }
thickness: 10
plate:
  outline: [[0, 0], [100, 0], [100, 50], [0, 50]]
  openings:
    - { id: hole, circle: { center: [50, 25], radius: 5 } }
supports:
  - { where: { x: 0 }, fix: [x, y] }
loads:
  - { where: { x: 100 }, traction: [10, 0] }
  - where: { opening: hole }
    pressure: 3
`;
  const m = parseModel(text, 'models/x.yaml');

  it('records the value position of every key path (positions counted by hand)', () => {
    expect(m.sourceMap['thickness']).toEqual({ line: 2, col: 12 });
    expect(m.sourceMap['plate.outline[2]']).toEqual({ line: 4, col: 31 });
    expect(m.sourceMap['plate.openings[0]']).toEqual({ line: 6, col: 7 });
    expect(m.sourceMap['plate.openings[0].circle.radius']).toEqual({ line: 6, col: 55 });
    expect(m.sourceMap['supports[0].fix']).toEqual({ line: 8, col: 29 });
    expect(m.sourceMap['loads[1].where']).toEqual({ line: 11, col: 12 });
    expect(m.sourceMap['loads[1].pressure']).toEqual({ line: 12, col: 15 });
  });

  it('locate walks up to the nearest known parent', () => {
    expect(locate(m, 'loads[1].where')).toEqual({ line: 11, col: 12 });
    expect(locate(m, 'loads[1].where.segment[0]')).toEqual({ line: 11, col: 12 });
    expect(locate(m, 'plate.openings[0].circle')).toEqual({ line: 6, col: 27 });
    expect(locate(m, 'mesh.size')).toEqual({ line: 1, col: 1 });
  });

  it('formats model errors and later-stage errors as one line', () => {
    const e = new ModelError('expected one of x, y, segment, opening, outline, point', 'loads[1].where', 12, 7);
    expect(formatModelError(e, 'models/x.yaml')).toBe('models/x.yaml:12:7 loads[1].where: expected one of x, y, segment, opening, outline, point');
    const later = new FemError('selector matches no boundary\nat all', 'loads[1].where');
    expect(formatModelError(later, 'models/x.yaml', m)).toBe('models/x.yaml:11:12 loads[1].where: selector matches no boundary at all');
    expect(formatModelError(later, 'models/x.yaml')).toBe('models/x.yaml loads[1].where: selector matches no boundary at all');
    expect(formatModelError(new ModelError('YAML syntax: bad', '', 3, 5), 'f.yaml')).toBe('f.yaml:3:5: YAML syntax: bad');
  });
});

describe('stressUnit', () => {
  it('names the usual stress units and falls back to force/length²', () => {
    // 1 N/mm² = 1 MPa, 1 N/m² = 1 Pa, 1 kN/m² = 1 kPa, 1 lbf/in² = 1 psi, 1 kip/in² = 1 ksi (SI and US customary definitions)
    expect(stressUnit({ length: 'mm', force: 'N' })).toBe('MPa');
    expect(stressUnit({ length: 'm', force: 'N' })).toBe('Pa');
    expect(stressUnit({ length: 'm', force: 'kN' })).toBe('kPa');
    expect(stressUnit({ length: 'in', force: 'lbf' })).toBe('psi');
    expect(stressUnit({ length: 'in', force: 'kip' })).toBe('ksi');
    expect(stressUnit({ length: 'cm', force: 'daN' })).toBe('daN/cm²');
  });
});

describe('value rules (one case per rule beyond the corpus)', () => {
  const cases: Array<[string, string, string, string]> = [
    ['ellipse b = 0', minimal.replace('[[0, 0], [100, 0], [100, 50], [0, 50]]', '{ ellipse: { center: [0, 0], a: 3, b: 0 } }'), 'plate.outline.ellipse.b', 'ellipse semi-axis b must be > 0, got 0 mm'],
    ['rect width < 0', minimal.replace('[[0, 0], [100, 0], [100, 50], [0, 50]]', '{ rect: { center: [0, 0], width: -3, height: 1 } }'), 'plate.outline.rect.width', 'rectangle width must be > 0, got -3 mm'],
    ['local radius 0', `${minimal}mesh: { local: [ { near: [0, 0], size: 1, radius: 0 } ] }\n`, 'mesh.local[0].radius', 'local radius must be > 0'],
    ['readout distance 0', `${minimal}study: { readouts: { distance: 0 } }\n`, 'study.readouts.distance', 'readout distance must be > 0'],
    ['levels 13', `${minimal}study: { levels: 13 }\n`, 'study.levels', 'from 1 to 12, got 13'],
    ['zero-length segment', minimal.replace('{ x: 0 }', '{ segment: [[0, 0], [0, 0]] }'), 'supports[0].where.segment', 'segment has zero length'],
    ['fix twice', minimal.replace('fix: [x, y]', 'fix: [y, y]'), 'supports[0].fix[1]', 'direction y is listed twice'],
    ['sites typo', `${minimal}study: { sites: atuo }\n`, 'study.sites', "expected auto or a list of points [x, y], got 'atuo'"],
    ['opening id not a name', minimal.replace('plate:\n', 'plate:\n  openings: [ { id: 3, circle: { center: [50, 25], radius: 1 } } ]\n'), 'plate.openings[0].id', 'expected a name, got 3'],
    ['no openings to refer to', minimal.replace('traction: [10, 0]', 'pressure: 1').replace('{ x: 100 }', '{ opening: h }'), 'loads[0].where.opening', 'the plate has no openings'],
    ['outline: false', minimal.replace('{ x: 0 }', '{ outline: false }'), 'supports[0].where.outline', 'expected true'],
    ['units with a space', `units: { length: milli metre }\n${minimal}`, 'units.length', 'short unit label'],
  ];
  for (const [name, text, keyPath, fragment] of cases) {
    it(name, () => {
      const e = fails(text);
      expect(e.keyPath).toBe(keyPath);
      expect(e.message).toContain(fragment);
      expect(e.line).toBeGreaterThanOrEqual(1);
    });
  }
});
