import { describe, it, expect } from 'vitest';
import { csvText, fieldCsv, sitesCsv } from '../../src/report/index.js';
import { HOSTILE, demoStudy, gridMesh } from './fixtures.js';

/** RFC 4180 reader for the tests: returns rows of [raw cell, was quoted]. */
function parseCsv(text: string): { value: string; quoted: boolean }[][] {
  const rows: { value: string; quoted: boolean }[][] = [];
  let row: { value: string; quoted: boolean }[] = [];
  let i = 0;
  while (i < text.length) {
    let value = '';
    let quoted = false;
    if (text[i] === '"') {
      quoted = true;
      i++;
      for (;;) {
        if (text[i] === '"' && text[i + 1] === '"') { value += '"'; i += 2; }
        else if (text[i] === '"') { i++; break; }
        else if (i >= text.length) throw new Error('unterminated quote');
        else value += text[i++];
      }
    } else {
      while (i < text.length && text[i] !== ',' && text[i] !== '\r') value += text[i++];
    }
    row.push({ value, quoted });
    if (text[i] === ',') i++;
    else if (text.startsWith('\r\n', i)) { rows.push(row); row = []; i += 2; }
    else if (i < text.length) throw new Error(`unexpected ${JSON.stringify(text[i])} at ${i}`);
  }
  if (row.length > 0) rows.push(row);
  return rows;
}

describe('sitesCsv', () => {
  const study = demoStudy();
  const rows = parseCsv(sitesCsv(study));

  it('has one row per site and level under a quoted header', () => {
    // one naming style (snake_case, unit last), units from the study (issue 17)
    expect(rows[0].map((c) => c.value)).toEqual([
      'site', 'x_mm', 'y_mm', 'feature', 'verdict', 'above_yield', 'level', 'h_mm', 'dofs', 'peak_MPa', 'at_distance_MPa',
      'readout_distance_mm', 'value_MPa', 'discretisation_band_MPa', 'growth_exponent', 'theory_exponent',
    ]);
    expect(rows[0].every((c) => c.quoted)).toBe(true);
    expect(rows.length - 1).toBe(study.sites.reduce((a, s) => a + s.levels.length, 0));
    for (const r of rows) expect(r.length).toBe(16);
  });

  it('writes numbers bare with full round-trip precision', () => {
    const first = rows[1];
    const level = study.sites[0].levels[0];
    expect(first[9].quoted).toBe(false);
    expect(Number(first[9].value)).toBe(level.peak); // exact, not rounded
    expect(Number(first[14].value)).toBe(study.sites[0].growth.exponent);
    expect(first[12].value).toBe(''); // a singular site has no value: its peak is not a stress
    expect(first[13].value).toBe('');
    const conv = rows.find((r) => r[4].value === 'converging')!;
    expect(Number(conv[12].value)).toBe(study.sites[1].estimate.value);
    expect(Number(conv[13].value)).toBe(study.sites[1].estimate.uncertainty);
  });

  it('marks a site above the yield stress', () => {
    const flagged = demoStudy();
    flagged.sites[1] = { ...flagged.sites[1], aboveYield: true };
    const r = parseCsv(sitesCsv(flagged)).filter((row) => row[4].value === 'converging');
    expect(r.every((row) => row[5].value === 'yes')).toBe(true);
    expect(parseCsv(sitesCsv(demoStudy())).slice(1).every((row) => row[5].value === '')).toBe(true);
  });
});

describe('formula-injection guard (text cells only)', () => {
  it('prefixes text cells that start with = + - @ tab or CR, and quotes all text', () => {
    expect(csvText('=1+1')).toBe(`"'=1+1"`);
    expect(csvText('+A1')).toBe(`"'+A1"`);
    expect(csvText('-2+3')).toBe(`"'-2+3"`);
    expect(csvText('@SUM(A1)')).toBe(`"'@SUM(A1)"`);
    expect(csvText('\t=x')).toBe(`"'\t=x"`);
    expect(csvText('\r=x')).toBe(`"'\r=x"`);
    expect(csvText('say "hi"')).toBe(`"say ""hi"""`);
    expect(csvText('S1')).toBe('"S1"');
  });

  it('keeps negative numbers as numbers', () => {
    const mesh = gridMesh({ nx: 1, ny: 1, width: 1, height: 1, order: 1 });
    const u = Float64Array.from([-0.001, -2e-7, 0, 0, 1 / 3, -1 / 7, 0, 0]);
    const rows = parseCsv(fieldCsv(mesh, u, { '=evil()': Float64Array.from([-5, 0, 0, 0]) }));
    expect(rows[0][5]).toEqual({ value: "'=evil()", quoted: true });
    expect(rows[1][3]).toEqual({ value: '-0.001', quoted: false });
    expect(rows[1][4]).toEqual({ value: '-2e-7', quoted: false });
    expect(rows[1][5]).toEqual({ value: '-5', quoted: false });
    expect(Number(rows[3][4].value)).toBe(-1 / 7); // node 2, uy = u[5]
  });

  it('guards hostile text in every site string and leaves no formula start', () => {
    const study = demoStudy();
    for (const s of study.sites) s.id = `=cmd|' /C calc'!A0 ${HOSTILE}`;
    const rows = parseCsv(sitesCsv(study));
    for (const r of rows.slice(1)) {
      expect(r[0].quoted).toBe(true);
      expect(r[0].value.startsWith("'=")).toBe(true);
      for (const c of r) if (c.quoted) expect(c.value).not.toMatch(/^[=+\-@\t\r]/);
      expect(r[0].value).not.toMatch(/[\u0000-\u0008\u001b\u007f]/);
    }
  });
});

describe('fieldCsv', () => {
  it('writes node, x, y, ux, uy and the given columns in order, one row per node', () => {
    const mesh = gridMesh({ nx: 3, ny: 2, width: 3, height: 2, order: 2 });
    const n = mesh.xy.length / 2;
    const u = new Float64Array(2 * n).map((_, i) => i * 0.1);
    const vm = new Float64Array(n).map((_, i) => Math.PI * i);
    const rows = parseCsv(fieldCsv(mesh, u, { sxx: vm, 'von Mises': vm }));
    expect(rows[0].map((c) => c.value)).toEqual(['node', 'x', 'y', 'ux', 'uy', 'sxx', 'von Mises']);
    expect(rows.length).toBe(n + 1);
    expect(Number(rows[n][6].value)).toBe(Math.PI * (n - 1));
    expect(Number(rows[5][1].value)).toBe(mesh.xy[8]);
  });

  it('with units: x_mm … and the stresses named as recovered nodal values; coordinates without a binary tail', () => {
    const mesh = gridMesh({ nx: 3, ny: 2, width: 3, height: 2, order: 1 });
    const n = mesh.xy.length / 2;
    mesh.xy[2] = 0.9999999999999999; // a coordinate as arithmetic leaves it
    const rows = parseCsv(fieldCsv(mesh, new Float64Array(2 * n), { sxx: new Float64Array(n), von_mises: new Float64Array(n) }, { length: 'mm', stress: 'MPa' }));
    expect(rows[0].map((c) => c.value)).toEqual(['node', 'x_mm', 'y_mm', 'ux_mm', 'uy_mm', 'sxx_recovered_MPa', 'von_mises_recovered_MPa']);
    // rounded to 1e-9 of the 3.6 mm diagonal (step 1e-9): 0.9999999999999999 → 1
    expect(rows[2][1].value).toBe('1');
    // every row has the header's width: the file stays one plain table
    for (const r of rows) expect(r.length).toBe(7);
  });

  it('rejects columns of the wrong length', () => {
    const mesh = gridMesh({ nx: 1, ny: 1, width: 1, height: 1, order: 1 });
    expect(() => fieldCsv(mesh, new Float64Array(8), { bad: new Float64Array(2) })).toThrow(TypeError);
  });
});
