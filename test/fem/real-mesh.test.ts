import { describe, expect, it } from 'vitest';
import { buildGeometry } from '../../src/geometry/index.js';
import { meshPlate } from '../../src/mesh/index.js';
import { edgeTractionLoad, selectBoundary, solvePlate, type ElasticSection } from '../../src/fem/index.js';
import type { Support } from '../../src/model/types.js';
import { kirsch, lameRadialDisplacement } from './helpers/closed-form.js';
import { displacementL2Error, energyError, rate } from './helpers/exact.js';

/*
 * The closed-form checks again on meshes of the real mesher (src/mesh meshPlate) and geometry
 * (src/geometry buildGeometry): whole plates, selectors of the model file, point supports placed
 * as required nodes. The three point supports below are statically determinate and do no work on
 * the exact symmetric fields (u_y = 0 on y = 0, u_x = 0 on x = 0), so the exact field solves the
 * supported problem.
 */
const E = 1000, nu = 0.3;
const pointSupports = (R: number): Support[] => [
  { where: { kind: 'point', at: [R, 0] }, fix: { x: false, y: true }, keyPath: 'supports[0]' },
  { where: { kind: 'point', at: [-R, 0] }, fix: { x: false, y: true }, keyPath: 'supports[1]' },
  { where: { kind: 'point', at: [0, R] }, fix: { x: true, y: false }, keyPath: 'supports[2]' },
];
const requiredPoints = (R: number): Array<[number, number]> => [[R, 0], [-R, 0], [0, R]];

function absSum(f: Float64Array): number {
  let s = 0;
  for (let i = 0; i < f.length; i++) s += Math.abs(f[i]);
  return s;
}

describe('Lamé thick ring on a mesher mesh: full ring a = 1, b = 2, bore pressure p = 1 (Lamé 1852)', () => {
  const geometry = buildGeometry({
    outline: { kind: 'circle', center: [0, 0], radius: 2 },
    openings: [{ id: 'bore', shape: { kind: 'circle', center: [0, 0], radius: 1 }, keyPath: 'plate.openings[0]' }],
  });
  it.each([
    ['plane-stress', 2, 0.2, 0.005],
    ['plane-strain', 2, 0.2, 0.005],
    ['plane-stress', 1, 0.05, 0.01],
  ] as const)('%s, order %i, size %f: u_r at every bore node within %f', (state, order, h, tol) => {
    // tolerances: issue acceptance 0.5 % for LST; 1 % for CST [common practice];
    // measured 0.06 % (LST h = 0.2) and 0.21 % (CST h = 0.05), plane stress
    const mesh = meshPlate(geometry, { sizeAt: () => h, order, requiredPoints: requiredPoints(2) });
    const section: ElasticSection = { E, nu, state, thickness: 1 };
    const solution = solvePlate({
      mesh, geometry, section, supports: pointSupports(2),
      loads: [{ kind: 'pressure', where: { kind: 'opening', id: 'bore' }, pressure: 1, keyPath: 'loads[0]' }],
    });
    const exact = lameRadialDisplacement(1, 2, 1, E, nu, state, 1);
    const bore = selectBoundary(mesh, geometry, { kind: 'opening', id: 'bore' }, 'loads[0].where').nodes;
    expect(bore.length).toBeGreaterThan(20);
    for (const n of bore) {
      const x = mesh.xy[2 * n], y = mesh.xy[2 * n + 1];
      const ur = (solution.u[2 * n] * x + solution.u[2 * n + 1] * y) / Math.hypot(x, y);
      expect(Math.abs(ur / exact - 1)).toBeLessThan(tol);
    }
    // a closed bore under pressure is self-equilibrated; the point supports carry nothing
    const scale = absSum(solution.load);
    expect(Math.hypot(...solution.appliedSum) / scale).toBeLessThan(1e-12);
    expect(Math.hypot(...solution.reactionSum) / scale).toBeLessThan(1e-9);
  });
});

describe('Kirsch plate on mesher meshes: square of half-side 5a, exact tractions (Kirsch 1898)', () => {
  const a = 1, R = 5;
  const exact = kirsch(a, 1, E, nu);
  const geometry = buildGeometry({
    outline: { kind: 'rect', center: [0, 0], width: 2 * R, height: 2 * R, round: 0 },
    openings: [{ id: 'hole', shape: { kind: 'circle', center: [0, 0], radius: a }, keyPath: 'plate.openings[0]' }],
  });
  const section: ElasticSection = { E, nu, state: 'plane-stress', thickness: 1 };
  const strain = (x: number, y: number): [number, number, number] => {
    const [sx, sy, t] = exact.stress(x, y);
    return [(sx - nu * sy) / E, (sy - nu * sx) / E, (2 * (1 + nu) * t) / E];
  };

  function run(order: 1 | 2, h: number) {
    // a fixed size field scaled by h, four times finer at the hole: every level halves the whole
    // mesh (a uniform size would leave the hole at the mesher's curvature limit and stall the rate)
    const mesh = meshPlate(geometry, { sizeAt: (x, y) => h * Math.min(1, 0.25 * Math.hypot(x, y)), order, requiredPoints: requiredPoints(R) });
    const edges: number[] = [];
    for (const sel of [{ kind: 'x', value: R }, { kind: 'x', value: -R }, { kind: 'y', value: R }, { kind: 'y', value: -R }] as const) {
      edges.push(...selectBoundary(mesh, geometry, sel, 'loads[0].where').edges);
    }
    const extraLoad = edgeTractionLoad(mesh, edges, 1, (x, y, nx, ny) => {
      const [sx, sy, t] = exact.stress(x, y);
      return [sx * nx + t * ny, t * nx + sy * ny];
    });
    const solution = solvePlate({ mesh, geometry, section, supports: pointSupports(R), loads: [], extraLoad });
    const l2 = displacementL2Error(mesh, solution.u, exact.displacement);
    const en = energyError(mesh, solution.u, section, strain);
    return { solution, l2: l2.error / l2.norm, energy: en.error / en.norm };
  }

  /*
   * Rates in h (the size field is halved; measured √(N ratio) = 1.91–1.99): L2 displacement
   * h^(p+1), energy h^p (Strang & Fix 1973, ch. 3); band ±0.25 on the last halving [practice].
   */
  // measured on the last halving: CST 1.93 and 0.97, LST 3.22 and 1.92
  it.each([
    [1, 2, 1],
    [2, 3, 2],
  ] as const)('order %i: L2 displacement rate ≈ %i, energy rate ≈ %i over h = 0.8, 0.4, 0.2', (order, pL2, pE) => {
    const runs = [0.8, 0.4, 0.2].map((h) => run(order, h));
    expect(runs[1].l2).toBeLessThan(runs[0].l2);
    expect(runs[2].l2).toBeLessThan(runs[1].l2);
    expect(Math.abs(rate(runs[1].l2, runs[2].l2) - pL2)).toBeLessThan(0.25);
    expect(Math.abs(rate(runs[1].energy, runs[2].energy) - pE)).toBeLessThan(0.25);
    for (const r of runs) {
      const scale = absSum(r.solution.load);
      expect(Math.abs(r.solution.reactionSum[0] + r.solution.appliedSum[0]) / scale).toBeLessThan(1e-9);
      expect(Math.abs(r.solution.reactionSum[1] + r.solution.appliedSum[1]) / scale).toBeLessThan(1e-9);
    }
  });
});
