import { describe, expect, it } from 'vitest';
import {
  assembleStiffness,
  bodyForceLoad,
  csrMultiply,
  gaussStresses,
  solvePlate,
  type ElasticSection,
  type PrescribedDisplacement,
} from '../../src/fem/index.js';
import type { Load } from '../../src/model/types.js';
import { macNealHarderPatch, rectangleGeometry } from './helpers/meshes.js';

/*
 * MacNeal & Harder, "A proposed standard set of problems to test finite element accuracy",
 * Finite Elements in Analysis and Design 1 (1985) 3–20, membrane patch test (Irons & Razzaque 1972):
 * E = 1e6, ν = 0.25, t = 0.001, u = 1e−3 (x + y/2), v = 1e−3 (y + x/2), so εx = εy = γxy = 1e−3 and
 * σx = σy = E(1 + ν)·1e−3/(1 − ν²) = 1333.333…, τxy = G·1e−3 = 400 exactly (plane stress).
 * Patch test criteria (Irons & Razzaque 1972; Taylor, Simo, Zienkiewicz & Chan, IJNME 22, 1986):
 * exact to round-off — relative error ≤ 1e−10 [practice for the number].
 */
const section: ElasticSection = { E: 1e6, nu: 0.25, state: 'plane-stress', thickness: 0.001 };
const sExact = (1e6 * 1.25 * 1e-3) / (1 - 0.0625);
const tauExact = (1e6 / 2.5) * 1e-3;
const uLin = (x: number, y: number): [number, number] => [1e-3 * (x + y / 2), 1e-3 * (y + x / 2)];
const geometry = rectangleGeometry(0, 0, 0.24, 0.12);
const onBoundary = (x: number, y: number): boolean =>
  Math.abs(x) < 1e-12 || Math.abs(y) < 1e-12 || Math.abs(x - 0.24) < 1e-12 || Math.abs(y - 0.12) < 1e-12;

function expectConstantStress(stress: Float64Array): void {
  for (let k = 0; k < stress.length / 3; k++) {
    expect(Math.abs(stress[3 * k] / sExact - 1)).toBeLessThan(1e-10);
    expect(Math.abs(stress[3 * k + 1] / sExact - 1)).toBeLessThan(1e-10);
    expect(Math.abs(stress[3 * k + 2] / tauExact - 1)).toBeLessThan(1e-10);
  }
}

describe.each([
  [1, 'a'],
  [1, 'b'],
  [2, 'a'],
  [2, 'b'],
] as const)('MacNeal–Harder membrane patch, order %i, diagonal %s', (order, diagonal) => {
  const mesh = macNealHarderPatch(order, diagonal);
  const nNodes = mesh.xy.length / 2;
  const exact = new Float64Array(2 * nNodes);
  for (let n = 0; n < nNodes; n++) {
    const [u, v] = uLin(mesh.xy[2 * n], mesh.xy[2 * n + 1]);
    exact[2 * n] = u;
    exact[2 * n + 1] = v;
  }

  it('test A: the linear field at every node leaves no force at interior nodes', () => {
    const K = assembleStiffness(mesh, section);
    const r = csrMultiply(K, exact);
    let rMax = 0;
    let fScale = 0;
    for (let n = 0; n < nNodes; n++) {
      fScale = Math.max(fScale, Math.abs(r[2 * n]), Math.abs(r[2 * n + 1]));
      if (!onBoundary(mesh.xy[2 * n], mesh.xy[2 * n + 1])) rMax = Math.max(rMax, Math.abs(r[2 * n]), Math.abs(r[2 * n + 1]));
    }
    expect(rMax / fScale).toBeLessThan(1e-10);
    expectConstantStress(gaussStresses(mesh, exact, section).stress);
  });

  it('test B: boundary displacements prescribed, interior solved', () => {
    const prescribed: PrescribedDisplacement[] = [];
    for (let n = 0; n < nNodes; n++) {
      if (onBoundary(mesh.xy[2 * n], mesh.xy[2 * n + 1])) {
        prescribed.push({ dof: 2 * n, value: exact[2 * n] }, { dof: 2 * n + 1, value: exact[2 * n + 1] });
      }
    }
    const sol = solvePlate({ mesh, geometry, section, supports: [], loads: [], prescribed });
    expect(sol.freeDofs).toBeGreaterThan(0);
    for (let i = 0; i < 2 * nNodes; i++) expect(Math.abs(sol.u[i] - exact[i])).toBeLessThan(1e-10 * 3.6e-4);
    expectConstantStress(gaussStresses(mesh, sol.u, section).stress);
  });

  it('test C: rigid-body supports only, consistent boundary tractions', () => {
    const loads: Load[] = [
      { kind: 'traction', where: { kind: 'x', value: 0.24 }, traction: [sExact, tauExact], keyPath: 'loads[0]' },
      { kind: 'traction', where: { kind: 'x', value: 0 }, traction: [-sExact, -tauExact], keyPath: 'loads[1]' },
      { kind: 'traction', where: { kind: 'y', value: 0.12 }, traction: [tauExact, sExact], keyPath: 'loads[2]' },
      { kind: 'traction', where: { kind: 'y', value: 0 }, traction: [-tauExact, -sExact], keyPath: 'loads[3]' },
    ];
    const sol = solvePlate({
      mesh, geometry, section, loads,
      supports: [
        { where: { kind: 'point', at: [0, 0] }, fix: { x: true, y: true }, keyPath: 'supports[0]' },
        { where: { kind: 'point', at: [0.24, 0] }, fix: { x: false, y: true }, keyPath: 'supports[1]' },
      ],
    });
    // the supports allow the linear field plus the rigid rotation ω that makes v(0.24, 0) = 0:
    // 1e−3·0.12 + 0.24 ω = 0
    const omega = -0.12e-3 / 0.24;
    for (let n = 0; n < nNodes; n++) {
      const x = mesh.xy[2 * n], y = mesh.xy[2 * n + 1];
      expect(Math.abs(sol.u[2 * n] - (exact[2 * n] - omega * y))).toBeLessThan(1e-10 * 3.6e-4);
      expect(Math.abs(sol.u[2 * n + 1] - (exact[2 * n + 1] + omega * x))).toBeLessThan(1e-10 * 3.6e-4);
    }
    expectConstantStress(gaussStresses(mesh, sol.u, section).stress);
    // self-equilibrated loads: both resultants vanish, reactions too (to round-off of the load size)
    const loadScale = sExact * 0.24 * 0.001;
    expect(Math.abs(sol.appliedSum[0]) / loadScale).toBeLessThan(1e-12);
    expect(Math.abs(sol.reactionSum[1]) / loadScale).toBeLessThan(1e-9);
  });
});

/*
 * Higher-order patch test (Taylor, Simo, Zienkiewicz & Chan 1986):
 * the LST contains every quadratic displacement field, so with the matching body force
 * b = −div σ and the field prescribed on the boundary, the solution is the field itself
 * (nodal values and linear stresses exact to round-off). The CST cannot, which the test
 * also shows (it must miss, or the check would be vacuous).
 */
describe('quadratic-field patch test with body force (LST exact, CST not)', () => {
  // u = 1e−3 (x² + 2xy − y²), v = 1e−3 (3x² − xy + 2y²) on the MacNeal–Harder patch
  const c = 1e-3;
  const disp = (x: number, y: number): [number, number] => [c * (x * x + 2 * x * y - y * y), c * (3 * x * x - x * y + 2 * y * y)];
  // strains: εx = c(2x + 2y), εy = c(−x + 4y), γ = c(2x − 2y) + c(6x − y) = c(8x − 3y)
  const D = { E: 1e6, nu: 0.25 };
  const k = D.E / (1 - D.nu * D.nu);
  const G = D.E / (2 * (1 + D.nu));
  // div σ: ∂σx/∂x + ∂τ/∂y and ∂τ/∂x + ∂σy/∂y with σx = k(εx + ν εy), σy = k(εy + ν εx), τ = Gγ
  const bx = -(k * (2 * c + D.nu * -c) + G * (-3 * c));
  const by = -(G * (8 * c) + k * (4 * c + D.nu * 2 * c));
  it.each([1, 2] as const)('order %i', (order) => {
    const mesh = macNealHarderPatch(order, 'a');
    const nNodes = mesh.xy.length / 2;
    const prescribed: PrescribedDisplacement[] = [];
    for (let n = 0; n < nNodes; n++) {
      const x = mesh.xy[2 * n], y = mesh.xy[2 * n + 1];
      if (onBoundary(x, y)) {
        const [u, v] = disp(x, y);
        prescribed.push({ dof: 2 * n, value: u }, { dof: 2 * n + 1, value: v });
      }
    }
    const extraLoad = bodyForceLoad(mesh, section.thickness, () => [bx, by]);
    const sol = solvePlate({ mesh, geometry, section, supports: [], loads: [], prescribed, extraLoad });
    let err = 0;
    for (let n = 0; n < nNodes; n++) {
      const [u, v] = disp(mesh.xy[2 * n], mesh.xy[2 * n + 1]);
      err = Math.max(err, Math.abs(sol.u[2 * n] - u), Math.abs(sol.u[2 * n + 1] - v));
    }
    const uScale = c * 0.24 * 0.24 * 3;
    if (order === 2) {
      expect(err / uScale).toBeLessThan(1e-10);
      const gs = gaussStresses(mesh, sol.u, section);
      for (let g = 0; g < gs.weight.length; g++) {
        const x = gs.xy[2 * g], y = gs.xy[2 * g + 1];
        const ex = c * (2 * x + 2 * y), ey = c * (-x + 4 * y), gam = c * (8 * x - 3 * y);
        expect(Math.abs(gs.stress[3 * g] - k * (ex + D.nu * ey)) / 1000).toBeLessThan(1e-10);
        expect(Math.abs(gs.stress[3 * g + 2] - G * gam) / 1000).toBeLessThan(1e-10);
      }
    } else {
      expect(err / uScale).toBeGreaterThan(1e-6);
    }
  });
});
