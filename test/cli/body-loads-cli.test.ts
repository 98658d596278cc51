/**
 * The body-load keys end to end (issue 14): a model file in a temporary folder, `peakwise solve`
 * through the built binary, the numbers read back from --json and field.csv.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readFieldColumns, runCli } from '../pipeline/helpers.js';



/** A 100 × 200 plate held along its top edge under self-weight; `head` leads (title, material), `tail` follows. */
function hangingPlate(head: string, tail = ''): string {
  return `${head}
thickness: 10
plate:
  outline: { rect: { center: [50, 100], width: 100, height: 200 } }
supports:
  - { where: { y: 200 }, fix: [x, y] }
loads:
  - gravity: [0, -9810]
${tail}`;
}

describe('peakwise solve with body loads', () => {
  it('plane strain, held in x and y, warmed by 80: σxx = σyy = σzz = −EαΔT/(1 − 2ν) in field.csv (Hooke\'s law)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pw-thermal-'));
    writeFileSync(join(dir, 'warm.yaml'), `
title: warm block held on all sides
material: { E: 210000, nu: 0.3, expansion: 1.2e-5 }
thickness: 5
state: plane-strain
plate:
  outline: { rect: { center: [60, 30], width: 120, height: 60 } }
supports:
  - { where: { x: 0 }, fix: [x] }
  - { where: { x: 120 }, fix: [x] }
  - { where: { y: 0 }, fix: [y] }
  - { where: { y: 60 }, fix: [y] }
loads:
  - temperature: 80
mesh: { size: 15 }
`);
    const r = await runCli(['solve', 'warm.yaml', '--json', '--out', 'out'], dir);
    expect(r.code).toBe(0);
    const cols = readFieldColumns(join(dir, 'out', 'field.csv'));
    const want = (-210000 * 1.2e-5 * 80) / (1 - 0.6);
    for (const name of ['sxx_recovered_MPa', 'syy_recovered_MPa', 'szz_recovered_MPa']) {
      expect(cols[name].length).toBeGreaterThan(10);
      // measured: round-off (≤ 1e−13 relative) — a uniform state
      for (const v of cols[name]) expect(Math.abs(v / want - 1)).toBeLessThan(1e-10);
    }
    // hydrostatic: von Mises (with σzz) vanishes
    for (const v of cols.von_mises_recovered_MPa) expect(Math.abs(v / want)).toBeLessThan(1e-9);
  });

  it('a plate hanging from its top edge: the supports carry its weight ρ g W L t (statics)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pw-weight-'));
    writeFileSync(join(dir, 'hang.yaml'), hangingPlate('title: hanging plate\nmaterial: { E: 210000, nu: 0.3, density: 7.85e-9 }', 'mesh: { size: 20 }\n'));
    const r = await runCli(['solve', 'hang.yaml', '--json', '--out', 'out'], dir);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout) as { solution: { appliedSum: number[]; reactionSum: number[] } };
    const weight = 7.85e-9 * 9810 * 100 * 200 * 10;
    expect(j.solution.appliedSum[1] / -weight).toBeCloseTo(1, 12);
    expect(j.solution.reactionSum[1] / weight).toBeCloseTo(1, 9);
  });

  it('a gravity load without material.density: exit 1, file:line and key path, no stack trace', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pw-nodensity-'));
    writeFileSync(join(dir, 'bad.yaml'), hangingPlate('material: { E: 210000, nu: 0.3 }'));
    const r = await runCli(['solve', 'bad.yaml'], dir);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/^peakwise: bad\.yaml:8:\d+ loads\[0\]\.gravity: a gravity load needs the material's density/);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });
});
