import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { cartesian, expandRange, parseVary, matchSites, sweepCsv, roundTicks, featureClass, tickLabel } from '../../src/sweep/index.js';
import { familyPlotSvg } from '../../src/sweep/html.js';
import type { SiteResult, StudyResult } from '../../src/study/types.js';
import { PeakwiseError } from '../../src/errors.js';

describe('--vary values', () => {
  it('reads a list', () => {
    expect(parseVary('r=0,2,4,8')).toEqual({ name: 'r', values: [0, 2, 4, 8] });
  });
  it('reads a range with the end included and no float drift (0.1 is not exact in binary)', () => {
    expect(parseVary('t=0..0.7 by 0.1').values).toEqual([0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7]);
    expect(parseVary('r=0..20 by 2').values).toHaveLength(11);
    expect(parseVary('r=20..0 by -5').values).toEqual([20, 15, 10, 5, 0]);
    // an end the walk does not land on is not passed
    expect(parseVary('r=0..10 by 3').values).toEqual([0, 3, 6, 9]);
  });
  it('mixes lists and ranges', () => {
    expect(parseVary('r=0,1..3 by 1,8').values).toEqual([0, 1, 2, 3, 8]);
  });
  it('range count matches (end - start)/step + 1 for exact decimal steps', () => {
    fc.assert(
      fc.property(fc.integer({ min: -50, max: 50 }), fc.integer({ min: 1, max: 9 }), fc.integer({ min: 0, max: 200 }), (a, s, n) => {
        const start = a / 10;
        const step = s / 10;
        const end = (a + s * n) / 10;
        const v = expandRange(start, step, end);
        return v.length === n + 1 && Math.abs(v[n] - end) < 1e-12 && v.every((x, k) => Math.abs(x - (a + s * k) / 10) < 1e-12);
      }),
    );
  });
  it('refuses malformed values with usage errors', () => {
    for (const bad of ['r', 'r=', '=1,2', 'r=1,,2', 'r=a', 'r=0..5 by 0', 'r=0..-5 by 1', 'r=0..1', 'r=0..1 by', 'r=1,1', 'r=0..100 by 0.0001']) {
      expect(() => parseVary(bad), bad).toThrow(PeakwiseError);
    }
  });
  it('the old start:step:end form is refused with the new spelling in the message', () => {
    expect(() => parseVary('r=0:2:20')).toThrow(/old start:step:end form; write "0\.\.20 by 2"/);
    expect(() => parseVary('r=1,0:1')).toThrow(/start\.\.end by step/);
  });
  it('cartesian product: first axis slowest, size is the product of the lengths', () => {
    const p = cartesian([{ name: 'a', values: [1, 2] }, { name: 'b', values: [10, 20, 30] }]);
    expect(p).toHaveLength(6);
    expect(p[0]).toEqual({ a: 1, b: 10 });
    expect(p[2]).toEqual({ a: 1, b: 30 });
    expect(p[3]).toEqual({ a: 2, b: 10 });
    expect(() => cartesian([{ name: 'a', values: [1] }, { name: 'a', values: [2] }])).toThrow(/twice/);
  });
  it('round ticks cover the range with 1-2-2.5-5 steps', () => {
    expect(roundTicks(0, 10, 5)).toEqual([0, 2, 4, 6, 8, 10]);
    expect(roundTicks(0.13, 0.91, 4)).toEqual([0.2, 0.4, 0.6, 0.8]);
  });
  it('tick labels of a narrow axis stay distinct', () => {
    const ticks = roundTicks(215.28, 215.36, 4);
    const labels = ticks.map((t) => tickLabel(t, ticks));
    expect(new Set(labels).size).toBe(ticks.length);
  });
});

function site(id: string, kind: SiteResult['feature']['kind'], at: [number, number], verdict: SiteResult['verdict'], value: number, radius = 0): SiteResult {
  return {
    id, at, verdict, reason: '', levels: [],
    feature: { kind, interiorAngleDeg: kind === 'corner' ? 270 : 0, radius, description: '' },
    estimate: { value, uncertainty: 1, observedOrder: 2 },
    growth: { exponent: verdict === 'singular' ? 0.46 : 0, exponentUncertainty: 0, theory: 0 },
    readouts: {},
  };
}
function study(sites: SiteResult[]): StudyResult {
  return {
    tool: 'peakwise', version: '0.1.0', model: { title: 't', file: 'f' }, units: { length: 'mm', force: 'N', stress: 'MPa' },
    mesh: { nodes: 0, elements: 0, order: 2, minAngleDeg: 0 }, solution: { dofs: 0, maxDisplacement: 0, reactionSum: [0, 0], appliedSum: [0, 0] },
    measure: 'von-mises', sites,
  };
}

describe('site families', () => {
  it('a fillet continues the sharp corner it rounds, even when the ids are renumbered', () => {
    const points = [
      { scale: 170, study: study([site('S1', 'edge', [0, 60], 'converging', 143), site('S2', 'corner', [40, 40], 'singular', 1300)]) },
      // the fillet site moved 4 along the arc and the study numbered it first
      { scale: 170, study: study([site('S1', 'fillet', [41, 44], 'converging', 300, 8), site('S2', 'edge', [0, 65], 'converging', 142)]) },
    ];
    const fam = matchSites(points);
    expect(fam).toHaveLength(2);
    const corner = fam.find((f) => f.featureClass === 'corner')!;
    expect(corner.members.map((m) => m.id)).toEqual(['S2', 'S1']);
    expect(featureClass('fillet')).toBe('corner');
  });
  it('different feature classes never merge, and a far site starts a new family', () => {
    const points = [
      { scale: 100, study: study([site('S1', 'corner', [0, 0], 'singular', 10)]) },
      { scale: 100, study: study([site('S1', 'point-load', [0, 0], 'singular', 10), site('S2', 'corner', [50, 50], 'singular', 10)]) },
    ];
    expect(matchSites(points)).toHaveLength(3);
  });
  it('two sites of one point never share a family; the nearer one joins', () => {
    const points = [
      { scale: 100, study: study([site('S1', 'edge', [0, 0], 'converging', 1)]) },
      { scale: 100, study: study([site('S1', 'edge', [3, 0], 'converging', 2), site('S2', 'edge', [1, 0], 'converging', 3)]) },
    ];
    const fam = matchSites(points);
    expect(fam).toHaveLength(2);
    expect(fam[0].members.map((m) => m.id)).toEqual(['S1', 'S2']);
  });
  it('sweep.csv has the parameters, then ten columns per family, empty where a family has no site', () => {
    const points = [
      { index: 0, params: { r: 0 }, key: 'a', reused: false, seconds: 0, scale: 100, study: study([site('S1', 'corner', [0, 0], 'singular', 10)]) },
      { index: 1, params: { r: 2 }, key: 'b', reused: false, seconds: 0, scale: 100, study: study([site('S1', 'fillet', [1, 1], 'converging', 5, 2), site('S2', 'edge', [60, 0], 'converging', 3)]) },
    ];
    const csv = sweepCsv({ axes: [{ name: 'r', values: [0, 2] }], points, families: matchSites(points) });
    const rows = csv.trimEnd().split('\r\n').map((l) => l.split(','));
    expect(rows[0]).toHaveLength(1 + 2 * 10);
    // snake_case names with the study's units last (issue 17)
    expect(rows[0].slice(0, 11)).toEqual([
      '"r"', '"F1_id"', '"F1_x_mm"', '"F1_y_mm"', '"F1_feature"', '"F1_verdict"', '"F1_value_MPa"', '"F1_discretisation_band_MPa"',
      '"F1_growth_exponent"', '"F1_theory_exponent"', '"F1_at_distance_MPa"',
    ]);
    expect(rows[1][0]).toBe('0');
    expect(rows[1][5]).toBe('"singular"');
    // a singular site has no value and no band (its peak, 10 here, is not a stress); its exponent stays
    expect(rows[1][6]).toBe('');
    expect(rows[1][7]).toBe('');
    expect(rows[1][8]).toBe('0.46');
    expect(rows[2][6]).toBe('5');
    expect(rows[2][7]).toBe('1');
    expect(rows[1].slice(11)).toEqual(new Array(10).fill(''));
  });
});

describe('sweep plot', () => {
  it('keeps singular points apart: in their own strip, never on the value axis or joined to valued points', () => {
    const points = [0, 1, 2, 3].map((r, i) => ({
      index: i, params: { r }, key: String(i), reused: false, seconds: 0, scale: 100,
      study: study([site('S1', r === 0 ? 'corner' : 'fillet', [1, 1], r === 0 || r === 2 ? 'singular' : 'converging', 1000 + r, r)]),
    }));
    const sweep = { axes: [{ name: 'r', values: [0, 1, 2, 3] }], points, families: matchSites(points) };
    const svg = familyPlotSvg(sweep, sweep.families[0], 'MPa');
    expect(svg).toContain('class="singular-strip"');
    expect(svg).toContain('singular: no value (the peak is not a stress)');
    const strip = /class="singular-strip" x="[^"]+" y="([^"]+)" width="[^"]+" height="([^"]+)"/.exec(svg)!;
    const [top, bottom] = [Number(strip[1]), Number(strip[1]) + Number(strip[2])];
    const triangles = [...svg.matchAll(/<path d="M([\d.]+) ([\d.]+) L/g)].map((m) => Number(m[2]) + 6);
    expect(triangles).toHaveLength(2);
    for (const y of triangles) expect(y > top && y < bottom).toBe(true);
    const discs = [...svg.matchAll(/<circle cx="[^"]+" cy="([^"]+)"/g)].map((m) => Number(m[1]));
    expect(discs).toHaveLength(2);
    for (const y of discs) expect(y).toBeLessThan(top);
    // r = 1 and r = 3 converge but r = 2 between them is singular: no dashed line joins them across it
    expect(svg).not.toContain('stroke-dasharray="4 3"');
  });
});
