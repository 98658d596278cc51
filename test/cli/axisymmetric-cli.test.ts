/**
 * Axisymmetric sections end to end (issue 18): a model file in a temporary folder, `peakwise solve`
 * through the built binary, the numbers read back from field.csv; a section reaching r < 0 is an
 * error naming the file, line and key, exit status 1, no stack trace.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readFieldColumns, runCli } from '../pipeline/helpers.js';


const rod = (outline: string) => `
title: round bar in tension
material: { E: 210000, nu: 0.3 }
state: axisymmetric
plate:
  outline: ${outline}
supports:
  - { where: { y: 0 }, fix: [y] }
loads:
  - { where: { y: 40 }, traction: [0, 120] }
mesh: { size: 4, order: 2 }
`;

describe('peakwise solve on an axisymmetric section', () => {
  it('a bar in uniform tension: σz = 120, σr = σθ = 0 in field.csv, u_r = −νσ r/E, total force σπR² balanced', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pw-axisym-'));
    writeFileSync(join(dir, 'rod.yaml'), rod('[[0, 0], [10, 0], [10, 40], [0, 40]]'));
    const r = await runCli(['solve', 'rod.yaml', '--out', 'out'], dir);
    expect(r.code).toBe(0);
    // the sums are the whole revolution's: 120 · π · 10² along the axis, 0 radially
    expect(r.stdout).toMatch(/applied sum\s+\(0, 37699\.1\) N/);
    const cols = readFieldColumns(join(dir, 'out', 'field.csv'));
    // measured: round-off — a uniform state that every element reproduces
    for (const v of cols.syy_recovered_MPa) expect(Math.abs(v / 120 - 1)).toBeLessThan(1e-9);
    for (const name of ['sxx_recovered_MPa', 'stheta_recovered_MPa']) for (const v of cols[name]) expect(Math.abs(v)).toBeLessThan(1e-7);
    cols.x_mm.forEach((x, i) => expect(Math.abs(cols.ux_mm[i] - (-0.3 * 120 * x) / 210000)).toBeLessThan(1e-12));
  });

  it('material at r < 0: exit 1, file, line and key named, no stack trace', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pw-axisym-'));
    writeFileSync(join(dir, 'bad.yaml'), rod('[[0, 0], [10, 0], [10, 40], [-2, 40]]'));
    const r = await runCli(['solve', 'bad.yaml', '--out', 'out'], dir);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/bad\.yaml/);
    expect(r.stderr).toMatch(/plate\.outline\[3\]\[0\]/);
    expect(r.stderr).toMatch(/r = x ≥ 0/);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });
});
