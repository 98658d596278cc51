/**
 * Far-field stress (`stress:`) and pin force (`pinForce:`) loads reach the solver through every
 * entry of the pipeline: the check cases' pipeline, the sweep, the benchmark's model builder and
 * the library API. Before the one pipeline, check and bench left them out (`Model.fieldLoads`), so
 * these loads silently vanished there.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { caseModel, solveModel } from '../../src/check/pipeline.js';
import { boundaryTangentialStress } from '../../src/recovery/index.js';
import { parseModel } from '../../src/model/index.js';
import { runStudy } from '../../src/study/index.js';
import { runSweep } from '../../src/sweep/index.js';
import { solveProblem } from '../../src/pipeline/index.js';
import { holePlateProblem } from '../../src/bench/models.js';
import { loadModel, study } from '../../src/index.js';
import { comparable, farFieldPlateText, runCli } from './helpers.js';

describe('through check (a case built in code, solved by check/pipeline.ts)', () => {
  /*
   * G. Kirsch, Z. VDI 42 (1898): hoop stress 3S at the edge of a circular hole of radius a under
   * remote σxx = S. Here the remote state is the model's far-field stress load on a circular
   * outline of radius 20a; the finite outline changes the peak by O((a/R)²) ≈ 0.3 %, so the check
   * case's own tolerance (1.5 % for LST with about 16 edges per quarter arc) applies.
   */
  it('a far-field stress on the outline gives Kirsch\'s 3S at the hole, with vanishing reactions', () => {
    const S = 1, a = 1, R = 20;
    const model = caseModel({
      title: 'Kirsch hole, far-field stress on a circular outline',
      plate: {
        outline: { kind: 'circle', center: [0, 0], radius: R },
        openings: [{ id: 'bore', shape: { kind: 'circle', center: [0, 0], radius: a }, keyPath: 'plate.openings[0]' }],
      },
      material: { E: 1000, nu: 0.3 },
      supports: [
        { where: { kind: 'point', at: [-R, 0] }, fix: { x: true, y: true }, keyPath: 'supports[0]' },
        { where: { kind: 'point', at: [R, 0] }, fix: { x: false, y: true }, keyPath: 'supports[1]' },
      ],
      loads: [{ kind: 'stress', where: { kind: 'outline' }, stress: [S, 0, 0], gradient: { sxx: [0, 0], syy: [0, 0], sxy: [0, 0] }, about: [0, 0], keyPath: 'loads[0]' }],
      size: 2.5,
      local: [{ near: [0, 0], size: 0.1, radius: 1.3 * a }],
    });
    const s = solveModel(model);
    const peak = Math.max(...boundaryTangentialStress(s.mesh, s.geometry, s.field, 'bore').st);
    expect(Math.abs(peak / (3 * S) - 1)).toBeLessThan(0.015);
    // a uniform stress state is self-equilibrated: the supports carry (almost) nothing, against
    // the S·2R·t = 40 the outline carries across any diameter
    // (measured 5e-13: round-off of the nodal sums)
    expect(Math.hypot(...s.solution.reactionSum)).toBeLessThan(1e-11 * 2 * R * S);
  });

  it('a pin force arrives whole: the nodal forces sum to the force and the supports return it (statics, to round-off)', () => {
    const F: [number, number] = [3000, -12000];
    const model = caseModel({
      title: 'lug with a pin force',
      plate: {
        outline: { kind: 'rect', center: [0, 0], width: 80, height: 120, round: 0 },
        openings: [{ id: 'pin', shape: { kind: 'circle', center: [0, -20], radius: 12 }, keyPath: 'plate.openings[0]' }],
      },
      material: { E: 210000, nu: 0.3 },
      thickness: 10,
      supports: [{ where: { kind: 'y', value: 60 }, fix: { x: true, y: true }, keyPath: 'supports[0]' }],
      loads: [{ kind: 'pinForce', where: { kind: 'opening', id: 'pin' }, force: F, keyPath: 'loads[0]' }],
      size: 8,
    });
    const { solution } = solveModel(model);
    const Fn = Math.hypot(...F);
    expect(Math.abs(solution.appliedSum[0] - F[0]) / Fn).toBeLessThan(1e-9);
    expect(Math.abs(solution.appliedSum[1] - F[1]) / Fn).toBeLessThan(1e-9);
    expect(Math.abs(solution.reactionSum[0] + F[0]) / Fn).toBeLessThan(1e-9);
    expect(Math.abs(solution.reactionSum[1] + F[1]) / Fn).toBeLessThan(1e-9);
  });
});

describe('through the sweep', () => {
  it('a far-field stress changes every point, and each point equals the direct study of its model', async () => {
    const file = 'far-field-plate.yaml';
    const axes = [{ name: 'sx', values: [50, 100] }];
    const withLoad = await runSweep(farFieldPlateText(true), file, axes, { jobs: 0 });
    const without = await runSweep(farFieldPlateText(false), file, axes, { jobs: 0 });
    expect(withLoad.points).toHaveLength(2);
    for (const [k, p] of withLoad.points.entries()) {
      const direct = runStudy(parseModel(farFieldPlateText(true), file, { params: p.params }));
      expect(comparable(p.study)).toEqual(comparable(direct));
      // the far-field load adds σxx·area of the right edge (sx · 60 · t) to the applied force
      expect(p.study.solution.appliedSum[0]).toBeCloseTo(p.params.sx * 60 * 2, 6);
      expect(without.points[k].study.solution.appliedSum[0]).toBeCloseTo(0, 9);
      expect(p.study.sites.map((s) => s.levels.at(-1)!.peak)).not.toEqual(without.points[k].study.sites.map((s) => s.levels.at(-1)!.peak));
    }
    // the two far-field values give different studies (the load is read per point)
    expect(withLoad.points[0].study.solution.appliedSum[0]).not.toBe(withLoad.points[1].study.solution.appliedSum[0]);
  });
});

describe('through the benchmark\'s model builder', () => {
  it('the hole plate written with a far-field stress solves exactly as the same tension written as a traction', () => {
    const size = 25;
    const a = solveProblem(holePlateProblem(size, 'traction'));
    const b = solveProblem(holePlateProblem(size, 'far-field'));
    // σ·n with σ = (100, 0, 0) and n = (1, 0) on x = 200 is the traction (100, 0): the same nodal forces
    expect(b.solution.appliedSum[0]).toBeCloseTo(100 * 200 * 1, 8);
    expect(Array.from(b.solution.load)).toEqual(Array.from(a.solution.load));
    expect(Array.from(b.solution.u)).toEqual(Array.from(a.solution.u));
  });
});

describe('through the library API', () => {
  it('study(loadModel(file)) of a far-field model equals `peakwise study file --json`', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'pw-api-'));
    const file = join(dir, 'far-field-plate.yaml');
    writeFileSync(file, farFieldPlateText(true));
    const api = study(loadModel(file));
    const r = await runCli(['study', file, '--json', '--quiet', '--out', join(dir, 'out')]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const cli = JSON.parse(r.stdout) as Parameters<typeof comparable>[0];
    expect(comparable(api)).toEqual(comparable(cli));
    expect(api.solution.appliedSum[0]).toBeCloseTo(50 * 60 * 2, 6);
  });
});
