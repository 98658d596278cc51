import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseModel } from '../../src/model/index.js';
import { mesh, recover, solve } from '../../src/index.js';
import { checkCutOptions, writeCutOutputs } from '../../src/cli/cut.js';
import { PeakwiseError } from '../../src/errors.js';
import { SIGN_PLATE_MODEL } from './sign-plate.js';

// The signboard base plate of cut.test.ts (a wide plate, d/W = 0.1, so Kirsch applies); the "other
// analysis" along the hole edge is Kirsch's (1898) σθ = S(1 − 2 cos 2θ) at 37 points, the same curve an exact
// analysis would report.
const MODEL = SIGN_PLATE_MODEL;

describe('results along a cut from another analysis (issue 15 §5)', () => {
  const model = parseModel(MODEL, 'sign.yaml');
  const r = recover(solve(mesh(model)));
  const dir = mkdtempSync(join(tmpdir(), 'peakwise-cut-other-'));
  const kirsch = (t: number) => 100 * (1 - 2 * Math.cos(2 * t));
  const rows = ['x,y,tangential'];
  for (let k = 0; k <= 36; k++) {
    const t = (2 * Math.PI * k) / 36;
    rows.push(`${200 + 10 * Math.cos(t)},${100 + 10 * Math.sin(t)},${kirsch(t)}`);
  }
  const file = join(dir, 'other.csv');
  writeFileSync(file, rows.join('\n') + '\n');

  it('overlaid on the cut plot and written to cut.csv with the difference', () => {
    const out = writeCutOutputs(dir, { cut: 'opening:cable', cutOther: file }, { model, mesh: r.mesh, geometry: r.geometry, field: r.field })!;
    const lines = readFileSync(out.file, 'utf8').trimEnd().split('\r\n');
    const head = lines[0].split(',').map((h) => h.replace(/"/g, ''));
    const col = (name: string) => lines.slice(1).map((l) => Number(l.split(',')[head.indexOf(name)]));
    const x = col('x_mm'), y = col('y_mm'), ours = col('tangential_MPa'), other = col('other_tangential_MPa'), diff = col('diff_other_tangential_MPa');
    expect(head).toContain('other_tangential_MPa');
    for (let k = 0; k < x.length; k++) {
      const t = Math.atan2(y[k] - 100, x[k] - 200);
      // linear interpolation of 10° steps of S(1 − 2cos 2θ): error ≤ 2S·(2·Δθ)²/8 = 6.1 MPa
      expect(Math.abs(other[k] - kirsch(t))).toBeLessThan(6.2);
      expect(diff[k]).toBeCloseTo(ours[k] - other[k], 6);
      // peakwise against the other (exact) analysis: 2 % of 3S as in cut.test.ts, plus the interpolation
      expect(Math.abs(diff[k])).toBeLessThan(0.02 * 300 + 6.2);
    }
    const series = out.plot.series;
    expect(series.map((s) => s.label)).toEqual(['peakwise tangential stress', 'another analysis tangential']);
    expect(series[1].other).toBe(true);
  });

  it('bad files: a point off the cut names file and line; no stress column; --cut-other without --cut', () => {
    const off = join(dir, 'off.csv');
    writeFileSync(off, 'x,y,tangential\n210,100,300\n230,100,100\n');
    expect(() => writeCutOutputs(dir, { cut: 'opening:cable', cutOther: off }, { model, mesh: r.mesh, geometry: r.geometry, field: r.field }))
      .toThrow(/off\.csv:3: point \(230, 100\) is 20 from the cut/);
    const cols = join(dir, 'cols.csv');
    writeFileSync(cols, 'x,y,stress\n210,100,300\n');
    expect(() => checkCutOptions({ cut: 'opening:cable', cutOther: cols })).toThrow(/expected the columns x, y and one stress column/);
    expect(() => checkCutOptions({ cutOther: cols })).toThrow(PeakwiseError);
    expect(() => checkCutOptions({ cut: 'opening:cable', cutOther: join(dir, 'none.csv') })).toThrow(/no such file/);
  });
});
