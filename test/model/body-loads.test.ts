/**
 * The body-load keys of the model file (issue 14): material.density and material.expansion, the
 * load kinds gravity, spin and temperature, their key-path errors and the unit hints.
 */
import { describe, expect, it } from 'vitest';
import { ModelError } from '../../src/errors.js';
import { parseModel } from '../../src/model/index.js';
import { densityToKgPerM3 } from '../../src/model/body-loads.js';

function model(material: string, loads: string, units = '') {
  return `
${units}
params: { hot: 60 }
material: { E: 210000, nu: 0.3${material} }
thickness: 10
plate:
  outline: { rect: { center: [50, 25], width: 100, height: 50 } }
supports:
  - { where: { x: 0 }, fix: [x, y] }
loads:
${loads}
`;
}

function error(text: string): ModelError {
  try {
    parseModel(text, 'm.yaml');
  } catch (e) {
    if (e instanceof ModelError) return e;
    throw e;
  }
  throw new Error('expected a ModelError');
}

describe('body-load keys', () => {
  it('reads density, expansion, gravity, spin and a temperature expression (with params)', () => {
    const m = parseModel(model(', density: 7.85e-9, expansion: 1.2e-5', `
  - gravity: [0, -9810]
  - spin: { about: [50, "hot/2"], omega: "2*pi*50" }
  - temperature: 20
  - temperature: "hot * x / 100"`), 'm.yaml');
    expect(m.material).toMatchObject({ density: 7.85e-9, expansion: 1.2e-5 });
    expect(m.loads).toEqual([
      { kind: 'gravity', gravity: [0, -9810], keyPath: 'loads[0]' },
      { kind: 'spin', about: [50, 30], omega: 2 * Math.PI * 50, keyPath: 'loads[1]' },
      { kind: 'temperature', temperature: 20, keyPath: 'loads[2]' },
      { kind: 'temperature', temperature: { expression: 'hot * x / 100', params: { hot: 60 } }, keyPath: 'loads[3]' },
    ]);
    expect(m.warnings).toBeUndefined();
  });

  it('a model without the new keys is read as before (no density or expansion keys appear)', () => {
    const m = parseModel(model('', '  - { where: { x: 100 }, traction: [10, 0] }'), 'm.yaml');
    expect(Object.keys(m.material).sort()).toEqual(['E', 'nu']);
  });

  it('names the key: gravity or spin without density, temperature without expansion', () => {
    const g = error(model('', '  - gravity: [0, -9810]'));
    expect(g.keyPath).toBe('loads[0].gravity');
    expect(g.message).toContain('material.density');
    const s = error(model(', expansion: 1e-5', '  - spin: { about: [0, 0], omega: 100 }'));
    expect(s.keyPath).toBe('loads[0].spin');
    expect(s.message).toContain('material.density');
    const t = error(model(', density: 7.85e-9', '  - temperature: 50'));
    expect(t.keyPath).toBe('loads[0].temperature');
    expect(t.message).toContain('material.expansion');
  });

  it('refuses a where on a body load, about outside spin, no where on an edge load, a zero or negative density', () => {
    expect(error(model(', density: 1e-9', '  - { where: { x: 100 }, gravity: [0, -1] }')).message).toContain('a gravity load acts over the whole plate; drop where');
    const about = error(model(', density: 1e-9', '  - { spin: { about: [0, 0], omega: 1 }, about: [0, 0] }'));
    expect(about.keyPath).toBe('loads[0].about');
    expect(about.message).toContain('spin: { about: [x, y], omega }');
    const where = error(model('', '  - { traction: [10, 0] }'));
    expect(where.keyPath).toBe('loads[0]');
    expect(where.message).toContain('expected where');
    expect(error(model(', density: 0', '  - gravity: [0, -1]')).keyPath).toBe('material.density');
    expect(error(model(', density: 1e-9', '  - gravity: [0, 0]')).message).toContain('no direction');
    expect(error(model(', density: 1e-9', '  - spin: { about: [0, 0] }')).keyPath).toBe('loads[0].spin.omega');
  });

  it('an unknown name in a temperature expression is reported with a hint', () => {
    const e = error(model(', expansion: 1e-5', '  - temperature: "hto * y"'));
    expect(e.keyPath).toBe('loads[0].temperature');
    expect(e.message).toContain("did you mean 'hot'?");
  });
});

describe('unit hints (units are labels; nothing is converted)', () => {
  it('kg/m³ per model density unit: N·mm → 1e12 (tonne/mm³), N·m → 1 (kg/m³), lbf·in → 6.9e−6·…', () => {
    expect(densityToKgPerM3({ length: 'mm', force: 'N' })).toBeCloseTo(1e12, 0);
    expect(densityToKgPerM3({ length: 'm', force: 'N' })).toBe(1);
    // steel 7850 kg/m³ is 7.35e−4 lbf·s²/in⁴ (common handbook value 7.3e−4; derived: 4.448 N / 0.0254⁴ m⁴)
    expect(7850 / densityToKgPerM3({ length: 'in', force: 'lbf' })!).toBeCloseTo(7.345e-4, 6);
    expect(densityToKgPerM3({ length: 'furlong', force: 'N' })).toBeUndefined();
  });

  it('warns for a density that looks like kg/m³ or g/cm³ with N and mm, not for tonne/mm³', () => {
    const kg = parseModel(model(', density: 7850', '  - gravity: [0, -9810]'), 'm.yaml');
    expect(kg.warnings?.map((w) => w.keyPath)).toEqual(['material.density']);
    expect(kg.warnings?.[0].message).toContain('looks like kg/m³');
    expect(kg.warnings?.[0].message).toContain('7.85e-9');
    const g = parseModel(model(', density: 7.85', '  - gravity: [0, -9810]'), 'm.yaml');
    expect(g.warnings?.[0].message).toContain('looks like g/cm³');
    expect(parseModel(model(', density: 7.85e-9', '  - gravity: [0, -9810]'), 'm.yaml').warnings).toBeUndefined();
    // N and m: kg/m³ is the consistent unit
    // (E and the thickness of this test model are out of scale in metres and warn on their own)
    const metres = parseModel(model(', density: 7850', '  - gravity: [0, -9.81]', 'units: { length: m, force: N }'), 'm.yaml');
    expect(metres.warnings?.map((w) => w.keyPath).filter((k) => k.includes('density') || k.includes('gravity'))).toEqual([]);
  });

  it('warns for gravity of about 9.81 with lengths in mm', () => {
    const m = parseModel(model(', density: 7.85e-9', '  - gravity: [0, -9.81]'), 'm.yaml');
    expect(m.warnings?.map((w) => w.keyPath)).toEqual(['loads[0].gravity']);
    expect(m.warnings?.[0].message).toContain('9806.65 mm/s²');
  });
});
