import { describe, it, expect } from 'vitest';
import { CAUTION, equilibriumMismatch, featureLabel, solveSummary, studyTable } from '../../src/report/index.js';
import { HOSTILE, demoStudy } from './fixtures.js';

// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/;

describe('studyTable', () => {
  const study = demoStudy();
  const plain = studyTable(study, { color: false });

  it('lists each site with its verdict in plain words, its value and readout', () => {
    const lines = plain.split('\n');
    const s1 = lines.find((l) => l.startsWith('S1 '));
    const s2 = lines.find((l) => l.startsWith('S2 '));
    const s3 = lines.find((l) => l.startsWith('S3 '));
    expect(s1).toContain('singular');
    expect(s1).toContain('q = 0.46 (theory 0.46)');
    expect(s1).toContain('point 118 MPa at r = 0.5 mm');
    expect(s2).toContain('converging');
    // the band to two significant digits and the value to the same decimal place (issue 17)
    expect(s2).toContain('182.40 ± 0.90 MPa');
    expect(lines.find((l) => l.startsWith('site '))).toContain('value ± discretisation band');
    expect(s3).toContain('undecided');
    expect(plain).toContain('S3: add two refinement levels');
  });

  it('ends with the caution and has no escape codes without colour', () => {
    expect(plain.trimEnd().endsWith(CAUTION)).toBe(true);
    expect(plain).not.toContain('\u001b');
  });

  it('aligns columns: the verdict column starts at the same place on every row', () => {
    const rows = plain.split('\n').filter((l) => /^(site|S\d) /.test(l));
    const at = rows.map((r) => r.indexOf(r.startsWith('site') ? 'verdict' : r.match(/converging|singular|undecided/)![0]));
    expect(new Set(at).size).toBe(1);
  });

  it('colours verdicts when asked', () => {
    const coloured = studyTable(study, { color: true });
    expect(coloured).toContain('\u001b[');
    expect(coloured.replace(/\u001b\[[0-9;]*m/g, '')).toBe(plain);
  });

  it('strips control characters from every model-provided string', () => {
    const hostile = studyTable(demoStudy(HOSTILE), { color: false });
    expect(hostile).not.toMatch(CONTROL);
    expect(hostile).toContain('<script>'); // plain text in a terminal: shown, not interpreted
  });
});

describe('solveSummary', () => {
  const info = {
    title: `Hanger lug ${HOSTILE}`,
    units: { length: 'mm', force: 'N', stress: 'MPa' },
    nodes: 1234, elements: 560, order: 2 as const, dofs: 2468,
    maxDisplacement: { value: 0.0123, at: [50, 10] as [number, number] },
    reactionSum: [-1000, 0] as [number, number],
    appliedSum: [1000, 0] as [number, number],
    maxStress: { measure: 'von Mises', value: 312.5, at: [20, 5] as [number, number] },
    timings: { mesh: 0.05, assemble: 0.02, factor: 0.11, solve: 0.01, recover: 0.02 },
    errorPercent: 4.2,
  };
  const text = solveSummary(info, { color: false });

  it('reports dofs, displacement, reaction balance, stress, timings and error', () => {
    expect(text).toContain('2468 dofs');
    expect(text).toContain('0.0123 mm at (50, 10) mm');
    expect(text).toContain('balance 0');
    expect(text).toMatch(/max von Mises +312.5 MPa at \(20, 5\) mm/);
    expect(text).toContain('factor 0.11 s');
    expect(text).toContain('total 0.21 s');
    expect(text).toContain('4.2 % (energy norm)');
    expect(text).not.toMatch(CONTROL);
  });

  it('flags reactions that do not balance the loads', () => {
    // 5 % off: |(−950) + 1000| / 1000 = 0.05
    expect(equilibriumMismatch([-950, 0], [1000, 0])).toBeCloseTo(0.05, 12);
    const bad = solveSummary({ ...info, reactionSum: [-950, 0] }, { color: false });
    expect(bad).toContain('check supports and loads');
    // a reaction of the right size but the wrong sign is not a balance
    expect(equilibriumMismatch([1000, 0], [1000, 0])).toBeCloseTo(2, 12);
  });

  it('judges a self-balanced loading against the size of its loads, not its zero resultant', () => {
    // pure shear on a panel: resultant ~1e-11 N of round-off, nodal loads summing to 8000 N
    const m = equilibriumMismatch([-3.5e-8, -4.5e-9], [-8e-11, 5.5e-11], 8000);
    expect(m).toBeLessThan(1e-11);
    expect(solveSummary({ ...info, reactionSum: [-3.5e-8, -4.5e-9], appliedSum: [-8e-11, 5.5e-11], loadScale: 8000 }, { color: false })).not.toContain('check supports');
  });
});

describe('feature labels', () => {
  const site = (feature: Record<string, unknown>) => ({ feature } as unknown as Parameters<typeof featureLabel>[0]);
  it('a free corner gives its angle; a corner at the end of a support also names its faces', () => {
    expect(featureLabel(site({ kind: 'corner', interiorAngleDeg: 270, radius: 0, faceConditions: ['free', 'free'] }))).toBe('corner 270°');
    expect(featureLabel(site({ kind: 'corner', interiorAngleDeg: 90, radius: 0, faceConditions: ['clamped', 'free'] }))).toBe('corner 90°, faces clamped/free');
    expect(featureLabel(site({ kind: 'fillet', interiorAngleDeg: 0, radius: 8 }))).toBe('fillet r 8');
  });
});

describe('notes under the study table (issue 17)', () => {
  it('flags a site above yield, names the support ends and the crack, and keys the readouts', () => {
    const study = demoStudy();
    study.yieldStress = 150;
    study.sites[1] = { ...study.sites[1], aboveYield: true };
    study.sites.push({ ...study.sites[0], id: 'S4', feature: { ...study.sites[0].feature, interiorAngleDeg: 90, faceConditions: ['clamped', 'free'] } });
    study.sites.push({ ...study.sites[0], id: 'S5', feature: { ...study.sites[0].feature, interiorAngleDeg: 357.1 } });
    const text = studyTable(study, { color: false });
    expect(text).toContain('182.40 ± 0.90 MPa (above yield)');
    expect(text).toContain('S2: above the yield stress (150 MPa): a linear-elastic result, so local yielding is expected here');
    expect(text).toContain('S4 (where a support ends): model the real support');
    expect(text).toContain('S5: this is a crack: it needs a fracture assessment');
    expect(text).toMatch(/readouts: measures of the linear-elastic field along the inward bisector/);
  });
});

describe('solve warning at a singular maximum', () => {
  it('is printed only when the model is given and the maximum sits at a singular point', async () => {
    const { parseModel } = await import('../../src/model/index.js');
    const { buildGeometry } = await import('../../src/geometry/index.js');
    const { meshPlate, sizeFieldFromSettings } = await import('../../src/mesh/index.js');
    const model = parseModel(`
material: { E: 210000, nu: 0.3 }
thickness: 10
plate: { outline: [[0, 0], [120, 0], [120, 40], [40, 40], [40, 120], [0, 120]] }
supports: [{ where: { y: 120 }, fix: [x, y] }]
loads: [{ where: { x: 120 }, traction: [0, -6] }]
mesh: { size: 10 }
`, 'l.yaml');
    const geometry = buildGeometry(model.plate);
    const mesh = meshPlate(geometry, { sizeAt: sizeFieldFromSettings(geometry, model.mesh), order: 1 });
    const base = {
      title: 'L', units: { length: 'mm', force: 'N', stress: 'MPa' }, nodes: 1, elements: 1, order: 1 as const, dofs: 2,
      maxDisplacement: { value: 1, at: [120, 0] as [number, number] }, reactionSum: [0, 1] as [number, number], appliedSum: [0, -1] as [number, number],
      timings: {},
    };
    const at = (p: [number, number]) => solveSummary({ ...base, maxStress: { measure: 'von Mises', value: 500, at: p }, singularCheck: { model, geometry, mesh } }, { color: false });
    expect(at([40, 40])).toMatch(/warning: the maximum von Mises sits at the re-entrant corner \(40, 40\) mm, 270°/);
    expect(at([60, 20])).not.toContain('warning');
    expect(solveSummary({ ...base, maxStress: { measure: 'von Mises', value: 500, at: [40, 40] } }, { color: false })).not.toContain('warning');
  });
});
