import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { kirschPlate } from '../../src/check/exact-plates.js';
import { parseModel } from '../../src/model/index.js';
import type { Model, ReportedValue } from '../../src/model/types.js';
import { baseSizeField, problemOf, solveProblem } from '../../src/pipeline/index.js';
import { runStudy, williamsRoots, type StudyResult } from '../../src/study/index.js';
import { OTHER_ANALYSIS_RULES } from '../../src/study/other-analysis.js';

/*
 * Issue 15 acceptance: values reported by "another analysis" set beside the study. The other analyses
 * here are peakwise runs of the same models (uniform or coarse meshes, other element orders, scaled loads),
 * so what the answer must be is known independently of the comparison itself.
 */

const rep = (at: [number, number], value: number, size: number, extra: Partial<ReportedValue> = {}, i = 0): ReportedValue =>
  ({ at, value, size, measure: 'von-mises', keyPath: `reported[${i}]`, ...extra });

/** The largest nodal measure within `radius` of p on one solve (what a big model's contour plot shows there). */
function peakNear(level: ReturnType<typeof solveProblem>, p: [number, number], radius: number): number {
  let best = -Infinity;
  const xy = level.mesh.xy;
  for (let n = 0; n < xy.length / 2; n++) {
    if (Math.hypot(xy[2 * n] - p[0], xy[2 * n + 1] - p[1]) <= radius && level.nodal[n] > best) best = level.nodal[n];
  }
  return best;
}

const withMesh = (m: Model, size: number, order: 1 | 2 = m.mesh.order): Model => ({ ...m, mesh: { size, order, local: [] } });

describe('Kirsch plate (Kirsch 1898: σθ = 3S at (0, ±a)), exact Kirsch boundary data', () => {
  // src/check/exact-plates.ts: hole a = 1 in a square of half-side 4, S = 100, the exact Kirsch displacements
  // on the outline, so the elasticity solution is Kirsch's field and the peak von Mises is 3S = 300 at (0, ±1).
  // (Model-file tractions cannot vary along an edge; the exact displacements pose the same problem.)
  const plate = kirschPlate(6);
  const S3 = 3 * 100;

  it('a reported 0.9 × 3S at a coarse size reads "≈ 10 % low"; h(1 %) < h(2 %) < h(5 %); a uniform mesh of the 2 % size lands within 2 % of 3S', () => {
    // a linear-element (CST) analysis at h = 0.2 (about 31 edges round the hole): peakwise's own uniform CST
    // mesh of that size gives 272.75 = 0.909 × 3S there, so 0.9 × 3S is what such a mesh reports
    const model: Model = { ...plate.model, reported: [rep([0, 1], 0.9 * S3, 0.2, { order: 1 })] };
    const r = runStudy(model);
    const a = r.reported![0];
    expect(a.finding, a.words).toBe('low');
    expect(a.words).toMatch(/^≈ 10 % low against the converged value/);
    expect(a.offset!).toBeCloseTo(-0.1, 3); // the converged value is 3S within its band (measured 300.09 ± 0.32)
    const h = a.neededSize!.map((n) => n.size!);
    expect(h[0]).toBeLessThan(h[1]);
    expect(h[1]).toBeLessThan(h[2]);
    // rerun peakwise itself with a uniform mesh of the suggested 2 % size and the other analysis's elements
    const rerun = solveProblem(problemOf(withMesh(plate.model, h[1], 1)));
    const peak = peakNear(rerun, [0, 1], 0.3);
    // measured: h(2 %) = 0.04, peak 297.65 (−0.78 %)
    expect(Math.abs(peak / S3 - 1)).toBeLessThan(0.02);
  });

  it('an LST value at twice the ladder\'s coarsest size is extrapolated with a warning; 0.9 × 3S there is not what LST gives', () => {
    // peakwise's own uniform LST mesh at 0.3 gives 292.86 (−2.4 %): a 10 % lower LST value is another model
    const r = runStudy({ ...plate.model, reported: [rep([0, 1], 0.9 * S3, 0.3)] });
    const a = r.reported![0];
    expect(a.warning).toMatch(/extrapolated with φ₀ \+ αh\^2/);
    expect(a.finding).toBe('models-differ');
    const refused = runStudy({ ...plate.model, reported: [rep([0, 1], 0.9 * S3, 1.2)] }).reported![0];
    expect(refused.finding).toBe('not-compared');
    expect(refused.words).toMatch(/coarser than the coarsest level .* beyond 2× the fitted law is not trusted/);
  });

  it('a coarse CST run given with order: 1 does not read "differ"; the same number against the LST ladder does', () => {
    const size = 0.2;
    const cst = solveProblem(problemOf(withMesh(plate.model, size, 1)));
    const value = peakNear(cst, [0, 1], 0.3);
    const model: Model = { ...plate.model, reported: [rep([0, 1], value, size, { order: 1 }, 0), rep([0, -1], value, size, {}, 1)] };
    const r = runStudy(model);
    // measured: the CST run gives 272.75; our own CST solve at 0.2 gives 262.35 ± 8.00 (allowed ± 21.1),
    // the LST ladder 294.32 ± 3.20 there (allowed ± 17.9): 21.6 apart
    expect(r.reported![0].finding).not.toBe('models-differ');
    expect(r.reported![0].ours!.from).toBe('own solve');
    expect(r.reported![1].finding).toBe('models-differ');
  });
});

describe('a demo fed back: the lamp-rail hanger (models/l-bracket-sharp.yaml)', () => {
  const file = 'models/l-bracket-sharp.yaml';
  const demo = parseModel(readFileSync(file, 'utf8'), file);
  const levels = 5;
  const study = runStudy(demo, { levels });
  const base = baseSizeField(problemOf(demo));
  // peakwise's own coarse run at the model's settings: the peak near each site and the element size there
  const fedBack = (model: Model): ReportedValue[] => {
    const coarse = solveProblem(problemOf(model));
    return study.sites.map((s, i) => {
      const others = study.sites.filter((o) => o !== s).map((o) => Math.hypot(o.at[0] - s.at[0], o.at[1] - s.at[1]));
      const radius = Math.min(2 * base(s.at[0], s.at[1]), 0.5 * Math.min(...others));
      return rep(s.at, peakNear(coarse, s.at, radius), base(s.at[0], s.at[1]), { label: `coarse ${s.id}` }, i);
    });
  };

  it('its own coarse run, with its sizes, is consistent (inside band + tolerance) at every site', () => {
    const r = runStudy({ ...demo, reported: fedBack(demo) }, { levels });
    expect(r.sites.map((s) => s.id)).toEqual(study.sites.map((s) => s.id));
    for (const a of r.reported!) {
      expect(a.finding, a.words).not.toBe('models-differ');
      expect(a.site).toBe(a.label!.slice('coarse '.length));
      expect(Math.abs(a.value - a.ours!.value)).toBeLessThanOrEqual(a.ours!.band + OTHER_ANALYSIS_RULES.tolerance * Math.abs(a.ours!.value));
    }
    // measured differences (band): S1 −0.01 % (0.03 %), S2 0.19 % (6.8 %), S3 −3.4 % (10.7 %), S4 −0.01 % (0.01 %),
    // S5 2.9 % (6.6 %), S6 0.37 % (0.25 %): the coarse run's mesh is not the ladder's first level (no rosettes)
  });

  it('the same values from a model with a 20 % larger load: the models differ', () => {
    // the hanger's end shear tau = 6 MPa raised by 20 %, solved coarse like the run above
    const heavier = parseModel(readFileSync(file, 'utf8'), file, { params: { tau: 7.2 } });
    const r = runStudy({ ...demo, reported: fedBack(heavier) }, { levels });
    // at a converging site the 20 % shows plainly; at a singular one the comparison half-width holds the
    // value's change over a ±25 % element size (1.25^q − 1 ≈ 11 % for the 270° corner) plus the 5 %
    // tolerance, so a 20 % shift of a coarse peak can fall inside it: there the finding must be
    // mesh-dependent, and "differ" wherever the shift clears the half-width by 10 %
    let differ = 0;
    for (const a of r.reported!) {
      const verdict = r.sites.find((s) => s.id === a.site)!.verdict;
      const allowed = a.ours!.band + OTHER_ANALYSIS_RULES.tolerance * Math.abs(a.ours!.value);
      const shift = Math.abs(a.value - a.ours!.value);
      if (verdict === 'converging' || shift > 1.1 * allowed) {
        expect(a.finding, a.words).toBe('models-differ');
        expect(a.words).toMatch(/^the models differ at this spot/);
        differ++;
      } else {
        expect(verdict).toBe('singular');
        expect(a.finding, a.words).toBe('mesh-dependent');
      }
    }
    // measured (merged build, 2026-12-04): shift / half-width S2 23.1 / 11.8 %, S3 (the 270° corner) 14.8 / 15.7 %
    // → mesh-dependent, S4 20.0 / 5.0 %, S5 21.5 / 11.6 %, S6 20.0 / 5.2 %: all but S3 read "differ"
    expect(differ).toBeGreaterThanOrEqual(r.reported!.length - 1);
  });

  it('the sharp re-entrant corner: mesh-dependent, halving adds close to 2^q − 1 for Williams q (Williams 1952)', () => {
    // 270° free-free wedge: Williams' (1952) smallest mode-I eigenvalue λ = 0.5445, q = 1 − λ
    const q = 1 - williamsRoots(270, 'free-free').lambdaMin;
    const r = runStudy({ ...demo, reported: [rep([40, 40], 400, 0.5)] }, { levels });
    const a = r.reported![0];
    expect(a.finding).toBe('mesh-dependent');
    expect(a.words).toMatch(/^mesh-dependent/);
    // measured 0.37108 against 2^q − 1 = 0.37129 (the fitted q is 0.45541 over the finest four levels): the
    // halving between the levels 0.5 and 0.25; 0.005 leaves room for the level-to-level wobble of the peak
    expect(Math.abs(a.halvingIncrease! - (2 ** q - 1))).toBeLessThan(0.005);
    expect(a.readouts!.some((x) => x.name.startsWith('stress at r = 0.5'))).toBe(true);
  });

  it('a value far from every site is studied as a listed point; automatic detection stays on', () => {
    const far: [number, number] = [100, 20];
    const r = runStudy({ ...demo, reported: [rep(far, 30, 5)] }, { levels: 3 });
    const a = r.reported![0];
    expect(a.added).toBe(true);
    const site = r.sites.find((s) => s.id === a.site)!;
    expect(site.at).toEqual(far);
    // the automatic sites are all still there (the corner among them)
    expect(r.sites.length).toBe(study.sites.length + 1);
    expect(r.sites.some((s) => s.at[0] === 40 && s.at[1] === 40)).toBe(true);
  });
});

export type { StudyResult };
