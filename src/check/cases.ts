/**
 * The built-in verification cases of `peakwise check`. Each case builds its own model in code,
 * runs the product pipeline (mesh → solve → SPR, or the whole convergence study where a verdict,
 * a band or an exponent is the quantity) and compares one number with a closed form or an
 * independent computation. Tolerances are a few times the error measured when the case was set
 * (the reason beside each); rows that run a study must also have the reference inside the band.
 * Meshes are LST (order 2) and modest so the whole suite runs in well under a minute.
 */
import type { Support } from '../model/types.js';
import { parseModel } from '../model/index.js';
import {
  cantileverDisplacement, cantileverStress, kirschCartesian, kirschHoopAtEdge, lameClosedCylinder, lameRing, type CantileverData,
} from '../reference/index.js';
import { boundaryTangentialStress, stressAt } from '../recovery/index.js';
import { runStudy, type SiteResult, type StudyResult } from '../study/index.js';
import type { PrescribedDisplacement } from '../fem/index.js';
import { caseModel, nearestNode, nodesWhere, relError, solveModel, type Solved } from './pipeline.js';
import { EXACT_PLATE_STRESS, exactNeighbourhoodPeak, inglisPlate, kirschPlate, type ExactPlate } from './exact-plates.js';
import { extrapolateK, feddersenCentreCrackK, tadaCentreCrackK } from './crack.js';
import type { CheckCase, CheckResult } from './types.js';
import { BODY_LOAD_CASES } from './body-loads.js';

type Draft = Omit<CheckResult, 'pass' | 'seconds'>;

function result(d: Draft): CheckResult {
  return { ...d, pass: Number.isFinite(d.error) && d.error <= d.tolerance };
}

const support = (where: Support['where'], x: boolean, y: boolean, keyPath: string): Support => ({ where, fix: { x, y }, keyPath });

function hoopSamples(s: Solved, loopId: string): { x: Float64Array; y: Float64Array; st: Float64Array } {
  return boundaryTangentialStress(s.mesh, s.geometry, s.field, loopId);
}

function maxOf(a: ArrayLike<number>): number {
  let m = -Infinity;
  for (let i = 0; i < a.length; i++) if (a[i] > m) m = a[i];
  return m;
}

// ---------------------------------------------------------------------------------------------
// Patch test

/*
 * MacNeal & Harder, "A proposed standard set of problems to test finite element accuracy",
 * Finite Elements in Analysis and Design 1 (1985) 3–20: membrane patch 0.24 × 0.12 with four
 * interior nodes, E = 1e6, ν = 0.25, t = 0.001, boundary displacements u = 1e−3 (x + y/2),
 * v = 1e−3 (y + x/2) (test B of Irons' patch test). Exact: σx = σy = 1333.333…, τxy = 400.
 * Pass means round-off: 1e−10 relative.
 */
function patchCase(order: 1 | 2): CheckResult[] {
  const E = 1e6, nu = 0.25;
  const model = caseModel({
    title: `membrane patch (${order === 1 ? 'CST' : 'LST'})`,
    plate: { outline: { kind: 'rect', center: [0.12, 0.06], width: 0.24, height: 0.12, round: 0 }, openings: [] },
    material: { E, nu },
    thickness: 0.001,
    size: 1,
    order,
  });
  const interior: [number, number][] = [[0.04, 0.02], [0.18, 0.03], [0.16, 0.08], [0.08, 0.08]];
  const exactU = (x: number, y: number): [number, number] => [1e-3 * (x + y / 2), 1e-3 * (y + x / 2)];
  const onBoundary = (x: number, y: number) =>
    Math.abs(x) < 1e-12 || Math.abs(x - 0.24) < 1e-12 || Math.abs(y) < 1e-12 || Math.abs(y - 0.12) < 1e-12;
  const s = solveModel(model, {
    requiredPoints: interior,
    prescribe: (mesh) => {
      const out: PrescribedDisplacement[] = [];
      for (const n of nodesWhere(mesh, onBoundary)) {
        const [u, v] = exactU(mesh.xy[2 * n], mesh.xy[2 * n + 1]);
        out.push({ dof: 2 * n, value: u }, { dof: 2 * n + 1, value: v });
      }
      return out;
    },
  });
  const sx = (E * (1 + nu) * 1e-3) / (1 - nu * nu);
  const txy = (E / (2 * (1 + nu))) * 1e-3;
  const exact = [sx, sx, txy];
  let worst = 0;
  let worstValue = sx;
  const g = s.gauss;
  for (let k = 0; k < g.stress.length / 3; k++) {
    for (let c = 0; c < 3; c++) {
      const e = Math.abs(g.stress[3 * k + c] - exact[c]) / sx;
      if (e >= worst) {
        worst = e;
        if (c === 0) worstValue = g.stress[3 * k];
      }
    }
  }
  // interior displacements must be the linear field too
  let worstU = 0;
  for (const [x, y] of interior) {
    const n = nearestNode(s.mesh, x, y);
    const [u, v] = exactU(s.mesh.xy[2 * n], s.mesh.xy[2 * n + 1]);
    worstU = Math.max(worstU, Math.abs(s.solution.u[2 * n] - u) / 1.5e-4, Math.abs(s.solution.u[2 * n + 1] - v) / 1.5e-4);
  }
  return [
    result({
      name: `patch test, ${order === 1 ? 'CST' : 'LST'}`,
      source: 'MacNeal & Harder 1985 (FEAD 1), membrane patch (node coordinates from memory); Irons patch test B',
      quantity: 'σx at the Gauss points; error = largest |σ − σexact|/σx over σx, σy, τxy and interior u, v',
      reference: sx,
      value: worstValue,
      error: Math.max(worst, worstU),
      tolerance: 1e-10,
    }),
  ];
}

// ---------------------------------------------------------------------------------------------
// Kirsch

/*
 * G. Kirsch, Z. VDI 42 (1898); Timoshenko & Goodier (1970): hole of radius a in an infinite plate
 * under remote σxx = S, here a square of half-side 5a carrying the exact Cartesian Kirsch
 * tractions on all four edges (so the truncation changes nothing), rigid motion removed by three
 * dofs at two corners (the tractions are self-equilibrated, the reactions vanish). The peak itself
 * is checked by the study rows below (exact displacements, a band that must hold 3S).
 */
const KIRSCH = { a: 1, half: 5, S: 1, E: 1000, nu: 0.3 };

/** Square of half-side 5a around the hole, exact Kirsch tractions on every outer edge. */
function solveKirsch(order: 1 | 2, hHole: number): Solved {
  const { a, half, S, E, nu } = KIRSCH;
  const model = caseModel({
    title: 'Kirsch hole, exact tractions',
    plate: {
      outline: { kind: 'rect', center: [0, 0], width: 2 * half, height: 2 * half, round: 0 },
      openings: [{ id: 'bore', shape: { kind: 'circle', center: [0, 0], radius: a }, keyPath: 'plate.openings[0]' }],
    },
    material: { E, nu },
    size: 1,
    order,
    local: [{ near: [0, 0], size: hHole, radius: 1.3 * a }],
  });
  return solveModel(model, {
    requiredPoints: [[a, 0], [-a, 0]],
    exactTraction: { stress: (x, y) => kirschCartesian(S, a, x, y), onEdge: (x, y) => Math.hypot(x, y) > 2 * a },
    prescribe: (mesh) => {
      const c0 = nearestNode(mesh, -half, -half);
      const c1 = nearestNode(mesh, half, -half);
      return [{ dof: 2 * c0, value: 0 }, { dof: 2 * c0 + 1, value: 0 }, { dof: 2 * c1 + 1, value: 0 }];
    },
  });
}

function kirschCase(): CheckResult[] {
  const { a, S, E } = KIRSCH;
  // about 16 LST edges per quarter of the hole edge
  const s = solveKirsch(2, 0.1);
  const hoop = hoopSamples(s, 'bore');
  // hoop stress at 0°, 15°, …, 90°: the node nearest each angle, compared with S(1 − 2 cos 2θ) at
  // that node's own angle; deviation over the peak 3S
  let worst = -1, worstRef = 0, worstVal = 0;
  for (let deg = 0; deg <= 90; deg += 15) {
    const th = (deg * Math.PI) / 180;
    let best = 0, bestD = Infinity;
    for (let i = 0; i < hoop.st.length; i++) {
      const d = Math.hypot(hoop.x[i] - a * Math.cos(th), hoop.y[i] - a * Math.sin(th));
      if (d < bestD) { bestD = d; best = i; }
    }
    const ref = kirschHoopAtEdge(S, 0, Math.atan2(hoop.y[best], hoop.x[best]));
    const dev = Math.abs(hoop.st[best] - ref) / (3 * S);
    if (dev > worst) { worst = dev; worstRef = ref; worstVal = hoop.st[best]; }
  }
  // hole widening along the load: u_x(a, 0) − u_x(−a, 0) = 2 · 3Sa/E (free of any rigid motion)
  const right = nearestNode(s.mesh, a, 0), left = nearestNode(s.mesh, -a, 0);
  const widening = s.solution.u[2 * right] - s.solution.u[2 * left];
  const wideningRef = (6 * S * a) / E;
  const src = 'Kirsch 1898 (Z. VDI 42); Timoshenko & Goodier 1970';
  return [
    // measured 0.47 % (one solve, ≈ 16 edges per quarter): 1 % is about twice that
    result({
      name: 'Kirsch hole: hoop stress along the edge',
      source: `${src}: σθ(a, θ) = S(1 − 2 cos 2θ)`,
      quantity: 'σθ at θ = 0°, 15° … 90°, worst angle; error = |σθ − exact| / 3S',
      reference: worstRef, value: worstVal, error: worst, tolerance: 0.01,
    }),
    // measured 9.4e−5: 3e−4 is three times that
    result({
      name: 'Kirsch hole: widening along the load',
      source: `${src}: u_x(a, 0) = 3Sa/E (plane stress)`,
      quantity: 'u_x(a, 0) − u_x(−a, 0)',
      reference: wideningRef, value: widening, error: relError(widening, wideningRef), tolerance: 3e-4,
    }),
  ];
}

/*
 * The same Kirsch plate with CST elements, about 64 edges per quarter of the hole (h = a/40).
 * Measured 0.79 % for the SPR peak: 2 % is two and a half times that.
 */
function kirschCstCase(): CheckResult[] {
  const s = solveKirsch(1, 0.025);
  const peak = maxOf(hoopSamples(s, 'bore').st);
  const ref = 3 * KIRSCH.S;
  return [
    result({ name: 'Kirsch hole, CST: peak hoop stress', source: 'Kirsch 1898 (Z. VDI 42): σθ(a, 90°) = 3S', quantity: 'max σθ on the hole edge / S (CST + SPR)', reference: ref, value: peak, error: relError(peak, ref), tolerance: 0.02 }),
  ];
}

// ---------------------------------------------------------------------------------------------
// Finite-width strip

/*
 * R. C. J. Howland, Phil. Trans. R. Soc. A 229 (1930) 49–86: central hole of diameter d in a strip of
 * width W under uniform end tension S. Howland's values as usually quoted (3.14, 3.36, 4.32 for
 * d/W = 0.2, 0.3, 0.5; from memory) have three figures only; the references here are independent FE
 * computations with biquadratic 9-node quadrilaterals on graded mapped meshes (32, 64 and 128 element
 * edges on the quarter circle) and Richardson extrapolation:
 *   d/W = 0.2, 0.3, half-length 3W: 3.153 and 3.374, GCI ≤ 2e−4, printed to three decimals
 *     (uncertainty taken as 5e−4 rounding + 2e−4 relative);
 *   d/W = 0.5, half-length 2W: 4.3476 ± 0.0001.
 * Each row runs the convergence study (W = 20, base size W/10, five levels); every converging site
 * on the hole edge must have the reference inside its band, and the row's value is the larger one.
 */
const STRIP_REFERENCE: Record<string, { ktg: number; u: number; halfLength: number }> = {
  '0.2': { ktg: 3.153, u: 5e-4 + 2e-4 * 3.153, halfLength: 3 },
  '0.3': { ktg: 3.374, u: 5e-4 + 2e-4 * 3.374, halfLength: 3 },
  '0.5': { ktg: 4.3476, u: 1e-4, halfLength: 2 },
};

/** The band holds the reference: |value − reference| ≤ half-width + the reference's own uncertainty. */
const holds = (value: number, halfWidth: number, reference: number, referenceUncertainty: number) =>
  Math.abs(value - reference) <= halfWidth + referenceUncertainty;

/**
 * A study row: the converging site `site` (value and band divided by `scale`) against `reference`;
 * `othersInside` says whether every other converging site checked also holds its exact value.
 */
function bandResult(d: {
  name: string; source: string; quantity: string; reference: number; referenceUncertainty: number; tolerance: number;
  site: SiteResult | undefined; scale: number; othersInside: boolean;
}): CheckResult {
  const conv = d.site?.verdict === 'converging';
  const value = conv ? d.site!.estimate.value / d.scale : NaN;
  const halfWidth = conv ? d.site!.estimate.uncertainty / d.scale : NaN;
  const inside = conv && holds(value, halfWidth, d.reference, d.referenceUncertainty) && d.othersInside;
  const row = result({
    name: d.name, source: d.source,
    quantity: `${d.quantity} (verdict ${d.site ? d.site.verdict : 'missing'})`,
    reference: d.reference, value, error: relError(value, d.reference), tolerance: d.tolerance,
  });
  return { ...row, band: { value, halfWidth, referenceUncertainty: d.referenceUncertainty, inside }, pass: row.pass && inside };
}

function stripCase(dOverW: number): CheckResult[] {
  const ref = STRIP_REFERENCE[String(dOverW)];
  const W = 20, Lh = ref.halfLength * W, a = (dOverW * W) / 2;
  const model = parseModel(STUDY_HEAD + `
title: strip with a central hole, d/W = ${dOverW}
plate:
  outline: { rect: { center: [0, 0], width: ${W}, height: ${2 * Lh} } }
  openings: [ { id: hole, circle: { center: [0, 0], radius: ${a} } } ]
supports:
  - { where: { point: [${-W / 2}, ${-Lh}] }, fix: [x, y] }
  - { where: { point: [${W / 2}, ${-Lh}] }, fix: [y] }
loads:
  - { where: { y: ${Lh} }, traction: [0, 1] }
  - { where: { y: ${-Lh} }, traction: [0, -1] }
mesh: { size: ${W / 10}, order: 2 }
`, `check-strip-${dOverW}.yaml`);
  const r = runStudy(model, { levels: 5 });
  // the peaks of the hole edge, at (±a, 0) across the load
  const edge = [siteAt(r, a, 0), siteAt(r, -a, 0)].filter((p): p is SiteResult => p?.verdict === 'converging');
  const site = edge.reduce<SiteResult | undefined>((m, p) => (!m || p.estimate.value > m.estimate.value ? p : m), undefined);
  // measured errors 0.01–0.02 % against the references: 0.1 % is several times that
  return [bandResult({
    name: `study: strip hole d/W = ${dOverW}, Ktg`,
    source: `independent FE computation (9-node quadrilaterals on graded mapped meshes, Richardson extrapolation); problem of Howland 1930 (Phil. Trans. A 229; ${{ '0.2': '3.14', '0.3': '3.36', '0.5': '4.32' }[String(dOverW)]} from memory)`,
    quantity: `study estimate of the converged von Mises peak / S, half-length ${ref.halfLength}W`,
    reference: ref.ktg, referenceUncertainty: ref.u, tolerance: 1e-3,
    site: site ?? siteAt(r, a, 0), scale: 1,
    othersInside: edge.every((p) => holds(p.estimate.value, p.estimate.uncertainty, ref.ktg, ref.u)),
  })];
}

// ---------------------------------------------------------------------------------------------
// Inglis

/*
 * C. E. Inglis, Trans. Inst. Naval Architects 55 (1913) 219–241: elliptical hole, semi-axis a
 * across the remote tension S, b along it: Kt = 1 + 2a/b at the ends of a. The finite plate: 40a
 * wide (2a/W = 0.05) and 120a long, one solve with elements of ρ/8 at the tips (ρ = b²/a). Its
 * exact Kt is not Inglis' — the finite width adds about +0.2 % (independent FE computation,
 * 9-node elements with Richardson extrapolation: 7.013 for a/b = 3) — and the single solve is
 * about 0.5 % low of that; measured −0.29 % and −0.33 % against 1 + 2a/b, so 1 % (three times).
 * The exact value is checked by the study rows on the exact-displacement plates below.
 */
function inglisCase(aOverB: number): CheckResult[] {
  const a = 1, b = a / aOverB, W = 40, H = 120, rho = (b * b) / a;
  const model = caseModel({
    title: `elliptical hole a/b = ${aOverB}`,
    plate: {
      outline: { kind: 'rect', center: [0, 0], width: W, height: H, round: 0 },
      openings: [{ id: 'slot', shape: { kind: 'ellipse', center: [0, 0], a, b, angleDeg: 0 }, keyPath: 'plate.openings[0]' }],
    },
    material: { E: 1000, nu: 0.3 },
    supports: [
      support({ kind: 'point', at: [-W / 2, -H / 2] }, true, true, 'supports[0]'),
      support({ kind: 'point', at: [W / 2, -H / 2] }, false, true, 'supports[1]'),
    ],
    loads: [
      { kind: 'traction', where: { kind: 'y', value: H / 2 }, traction: [0, 1], keyPath: 'loads[0]' },
      { kind: 'traction', where: { kind: 'y', value: -H / 2 }, traction: [0, -1], keyPath: 'loads[1]' },
    ],
    size: 4,
    // tip elements ρ/8 over a disk of radius ρ at both tips (ρ = b²/a), b/2 around the hole
    local: [
      { near: [0, 0], size: b / 2, radius: a },
      { near: [a, 0], size: rho / 8, radius: rho },
      { near: [-a, 0], size: rho / 8, radius: rho },
    ],
  });
  const s = solveModel(model);
  const kt = maxOf(hoopSamples(s, 'slot').st);
  const ref = 1 + 2 * aOverB;
  return [
    result({
      name: `Inglis ellipse a/b = ${aOverB}, finite plate: Kt`,
      source: 'Inglis 1913 (Trans. INA 55): Kt = 1 + 2a/b',
      quantity: 'max σθ at the ellipse tip / S, finite plate 2a/W = 0.05, one solve',
      reference: ref, value: kt, error: relError(kt, ref), tolerance: 0.01,
    }),
  ];
}

// ---------------------------------------------------------------------------------------------
// Studies on plates whose outline carries the exact displacements

/*
 * Kirsch (1898) and Inglis (1913) plates with the closed form's displacements prescribed on the
 * whole outline (src/check/exact-plates.ts), so the FE problem's exact solution is the closed form:
 * the convergence study (five levels) must find the hole's peaks converging and every converging
 * site's band must hold the closed-form peak of its own neighbourhood. The row shows the largest
 * site. Measured errors 1e−4 to 2e−4 of the value: tolerance 0.1 %.
 */
function exactPlateCase(make: (levels: number) => ExactPlate): CheckResult[] {
  const plate = make(5);
  const r = runStudy(plate.model);
  const conv = r.sites.filter((p) => p.verdict === 'converging');
  const inside = conv.length > 0 && conv.every((p) =>
    holds(p.estimate.value, p.estimate.uncertainty, exactNeighbourhoodPeak(plate, p.at, p.levels[0].radius ?? 0), 0));
  const site = conv.reduce<SiteResult | undefined>((m, p) => (!m || p.estimate.value > m.estimate.value ? p : m), r.sites[0]);
  return [bandResult({
    name: `study: ${plate.name}`,
    source: plate.source,
    quantity: `study estimate of the converged von Mises peak / S, ${conv.length} converging sites`,
    reference: plate.kt, referenceUncertainty: 0, tolerance: 1e-3,
    site, scale: EXACT_PLATE_STRESS, othersInside: inside,
  })];
}

// ---------------------------------------------------------------------------------------------
// Lamé

/*
 * G. Lamé (1852); Timoshenko & Goodier (1970): ring a = 1, b = 2 under internal pressure p = 1,
 * E = 1000, ν = 0.3, plane stress. Whole ring, pressure through the model's own load; rigid motion
 * removed by three displacement components the exact field also satisfies (u_y = 0 at (±b, 0),
 * u_x = 0 at (0, b)), a statically determinate set, so the reactions are zero.
 * Tolerances a few times the errors measured: u_r 0.010 % → 0.05 %, σθ(a) 0.40 % → 1 %.
 */
function solveLame(state: 'plane-stress' | 'plane-strain'): Solved {
  const a = 1, b = 2, p = 1, E = 1000, nu = 0.3;
  const model = caseModel({
    title: 'Lamé ring under internal pressure',
    state,
    plate: {
      outline: { kind: 'circle', center: [0, 0], radius: b },
      openings: [{ id: 'bore', shape: { kind: 'circle', center: [0, 0], radius: a }, keyPath: 'plate.openings[0]' }],
    },
    material: { E, nu },
    loads: [{ kind: 'pressure', where: { kind: 'opening', id: 'bore' }, pressure: p, keyPath: 'loads[0]' }],
    // 10 LST elements through the wall
    size: 0.1,
  });
  return solveModel(model, {
    requiredPoints: [[b, 0], [-b, 0], [0, b]],
    prescribe: (mesh) => [
      { dof: 2 * nearestNode(mesh, b, 0) + 1, value: 0 },
      { dof: 2 * nearestNode(mesh, -b, 0) + 1, value: 0 },
      { dof: 2 * nearestNode(mesh, 0, b), value: 0 },
    ],
  });
}

function lameCase(): CheckResult[] {
  const a = 1, b = 2, p = 1, E = 1000, nu = 0.3;
  const s = solveLame('plane-stress');
  const exactA = lameRing({ a, b, p }, a, E, nu, 'plane-stress');
  let worstU = -1, valU = 0;
  for (const n of nodesWhere(s.mesh, (x, y) => Math.abs(Math.hypot(x, y) - a) < 1e-9)) {
    const x = s.mesh.xy[2 * n], y = s.mesh.xy[2 * n + 1];
    const ur = (s.solution.u[2 * n] * x + s.solution.u[2 * n + 1] * y) / a;
    const e = relError(ur, exactA.ur);
    if (e > worstU) { worstU = e; valU = ur; }
  }
  const hoop = hoopSamples(s, 'bore');
  let worstS = -1, valS = 0;
  for (const v of hoop.st) {
    const e = relError(v, exactA.st);
    if (e > worstS) { worstS = e; valS = v; }
  }
  const src = 'Lamé 1852; Timoshenko & Goodier 1970';
  return [
    result({ name: 'Lamé ring: u_r(a)', source: `${src}: u_r = [(1 − ν)Ar + (1 + ν)B/r]/E`, quantity: 'radial displacement of the bore, worst node', reference: exactA.ur, value: valU, error: worstU, tolerance: 5e-4 }),
    result({ name: 'Lamé ring: σθ(a)', source: `${src}: σθ = A + B/r²`, quantity: 'hoop stress on the bore, worst node', reference: exactA.st, value: valS, error: worstS, tolerance: 0.01 }),
  ];
}

/*
 * The same ring in plane strain: u_r(a) = 1.906667e−3 and σz = ν(σr + σθ) = 2νA = 0.2 everywhere
 * (Lamé's field with the plane-strain law) — a check of the plane-strain law and of the σz
 * bookkeeping of the recovered field. Measured u_r 0.012 % → 0.05 %, σz 0.69 % → 1.5 %.
 */
function lamePlaneStrainCase(): CheckResult[] {
  const a = 1, b = 2, p = 1, E = 1000, nu = 0.3;
  const s = solveLame('plane-strain');
  const exactA = lameRing({ a, b, p }, a, E, nu, 'plane-strain');
  let worstU = -1, valU = 0, worstZ = -1, valZ = 0;
  for (const n of nodesWhere(s.mesh, (x, y) => Math.abs(Math.hypot(x, y) - a) < 1e-9)) {
    const x = s.mesh.xy[2 * n], y = s.mesh.xy[2 * n + 1];
    const ur = (s.solution.u[2 * n] * x + s.solution.u[2 * n + 1] * y) / a;
    if (relError(ur, exactA.ur) > worstU) { worstU = relError(ur, exactA.ur); valU = ur; }
    const sz = s.field.szz[n];
    if (relError(sz, exactA.sz) > worstZ) { worstZ = relError(sz, exactA.sz); valZ = sz; }
  }
  const src = 'Lamé 1852; Timoshenko & Goodier 1970, plane strain';
  return [
    result({ name: 'Lamé ring, plane strain: u_r(a)', source: `${src}: u_r = (1 + ν)[(1 − 2ν)Ar + B/r]/E`, quantity: 'radial displacement of the bore, worst node', reference: exactA.ur, value: valU, error: worstU, tolerance: 5e-4 }),
    result({ name: 'Lamé ring, plane strain: σz', source: `${src}: σz = ν(σr + σθ) = 2νA`, quantity: 'out-of-plane stress on the bore (SPR), worst node', reference: exactA.sz, value: valZ, error: worstZ, tolerance: 0.015 }),
  ];
}

// ---------------------------------------------------------------------------------------------
// Cantilever

/*
 * Timoshenko & Goodier, Theory of Elasticity (1970), cantilever with a parabolic end shear; the
 * exact root displacements prescribed at every root node (as in Augarde & Deeks, FEAD 44 (2008);
 * their printed form from memory) and the exact parabolic shear on the tip.
 * L = 10, D = 1, P = 1, E = 1000, ν = 0.3: δ = 4.0275, σxx(L/2, D/2) = 30.
 * Measured 4.9e−6 on δ → 2e−5; 0.034 % on σxx → 0.1 %.
 */
function cantileverCase(): CheckResult[] {
  const c: CantileverData = { L: 10, D: 1, t: 1, P: 1, E: 1000, nu: 0.3 };
  const model = caseModel({
    title: 'cantilever with parabolic end shear',
    plate: { outline: { kind: 'rect', center: [c.L / 2, 0], width: c.L, height: c.D, round: 0 }, openings: [] },
    material: { E: c.E, nu: c.nu },
    size: 0.25,
  });
  const s = solveModel(model, {
    requiredPoints: [[c.L, 0], [c.L / 2, c.D / 2]],
    exactTraction: { stress: (x, y) => cantileverStress(c, x, y), onEdge: (x) => Math.abs(x - c.L) < 1e-9 },
    prescribe: (mesh) => {
      const out: PrescribedDisplacement[] = [];
      for (const n of nodesWhere(mesh, (x) => Math.abs(x) < 1e-9)) {
        const d = cantileverDisplacement(c, 0, mesh.xy[2 * n + 1]);
        out.push({ dof: 2 * n, value: d.ux }, { dof: 2 * n + 1, value: d.uy });
      }
      return out;
    },
  });
  const tip = -s.solution.u[2 * nearestNode(s.mesh, c.L, 0) + 1];
  const tipRef = -cantileverDisplacement(c, c.L, 0).uy;
  const top = stressAt(s.mesh, s.field, c.L / 2, c.D / 2 - 1e-9);
  const sxx = top ? top.sxx : NaN;
  const sxxRef = cantileverStress(c, c.L / 2, c.D / 2).sxx;
  const src = 'Timoshenko & Goodier 1970, cantilever with end shear; exact root displacements (Augarde & Deeks 2008, printed form from memory)';
  return [
    result({ name: 'cantilever: tip deflection', source: `${src}: δ = PL³/3EI + (4 + 5ν)PD²L/24EI`, quantity: '−u_y(L, 0)', reference: tipRef, value: tip, error: relError(tip, tipRef), tolerance: 2e-5 }),
    result({ name: 'cantilever: bending stress', source: `${src}: σxx = P(L − x)y/I`, quantity: 'σxx(L/2, D/2) (SPR)', reference: sxxRef, value: sxx, error: relError(sxx, sxxRef), tolerance: 1e-3 }),
  ];
}

// ---------------------------------------------------------------------------------------------
// Williams exponents through the convergence study

const STUDY_HEAD = `
units: { length: mm, force: N }
material: { E: 200000, nu: 0.3 }
thickness: 1
state: plane-stress
`;

function siteAt(r: StudyResult, x: number, y: number): SiteResult | undefined {
  return r.sites.find((p) => Math.hypot(p.at[0] - x, p.at[1] - y) < 1e-6);
}

function exponentResult(name: string, source: string, site: SiteResult | undefined, qRef: number, tolerance: number): CheckResult {
  const q = site ? site.growth.exponent : NaN;
  const verdict = site ? site.verdict : 'missing';
  return {
    ...result({
      name, source,
      quantity: `study exponent q in peak ∝ h^−q (verdict ${verdict}); error = |q − q_ref|, absolute`,
      reference: qRef, value: q, error: Math.abs(q - qRef), tolerance,
    }),
    // an exponent within the band but without the singular verdict is not a pass
    ...(verdict !== 'singular' ? { pass: false } : {}),
  };
}

/*
 * M. L. Williams, J. Appl. Mech. 19 (1952) 526–528: a free–free 270° corner has λ = 0.544484
 * (mode I), so the peak grows like h^−0.455516. L-shaped plate pulled along one leg, five
 * refinement levels of the study. Measured |q − q_ref| = 0.012: ±0.02. A singular site has no
 * value band (its peak is not a stress), so the band column reads n/a.
 */
function williamsCornerCase(): CheckResult[] {
  const model = parseModel(STUDY_HEAD + `
title: L plate with a re-entrant corner
plate:
  outline: [[0, 0], [2, 0], [2, 1], [1, 1], [1, 2], [0, 2]]
supports:
  - { where: { y: 0 }, fix: [y] }
  - { where: { point: [0, 0] }, fix: [x] }
loads:
  - { where: { y: 2 }, traction: [0, 1] }
mesh: { size: 0.25, order: 2 }
`, 'check-l-plate.yaml');
  const r = runStudy(model, { levels: 5 });
  return [exponentResult('Williams 270° corner: exponent', 'Williams 1952 (J. Appl. Mech. 19), free–free 270°: λ = 0.544484', siteAt(r, 1, 1), 0.455516, 0.02)];
}

/*
 * Williams (1952) at 360° (a crack): λ = 1/2, q = 0.5. Edge slit as a half model on its symmetry
 * line: the roller ends at the tip (0.5, 0). Measured |q − 0.5| = 0.0025: ±0.02 like the corner.
 */
function williamsCrackCase(): CheckResult[] {
  const model = parseModel(STUDY_HEAD + `
title: plate with an edge slit, half model
plate:
  outline: [[0, 0], [2, 0], [2, 2], [0, 2]]
supports:
  - { where: { segment: [[0.5, 0], [2, 0]] }, fix: [y] }
  - { where: { point: [2, 0] }, fix: [x] }
loads:
  - { where: { y: 2 }, traction: [0, 1] }
mesh: { size: 0.25, order: 2 }
`, 'check-edge-slit.yaml');
  const r = runStudy(model, { levels: 5 });
  return [exponentResult('Williams crack tip: exponent', 'Williams 1952 (J. Appl. Mech. 19), 360° crack: λ = 1/2', siteAt(r, 0.5, 0), 0.5, 0.02)];
}

/*
 * The other half of the study's job: a smooth concentration must come out "converging", with the
 * reference inside its band. Strip W = 20, hole d = 2 (d/W = 0.1), half-length 60, four study
 * levels. Reference 3.036: independent FE computation (9-node elements on graded mapped meshes,
 * Richardson extrapolation, GCI 4e−4, printed to three decimals); Howland 1930 quotes 3.03 (from
 * memory). Measured 0.005 % from 3.036: tolerance 0.1 % (the reference itself is good to 0.06 %).
 */
function studyHoleCase(): CheckResult[] {
  const model = parseModel(STUDY_HEAD + `
title: strip with a central hole
plate:
  outline: { rect: { center: [0, 0], width: 20, height: 120 } }
  openings: [ { id: hole, circle: { center: [0, 0], radius: 1 } } ]
supports:
  - { where: { point: [-10, -60] }, fix: [x, y] }
  - { where: { point: [10, -60] }, fix: [y] }
loads:
  - { where: { y: 60 }, traction: [0, 1] }
  - { where: { y: -60 }, traction: [0, -1] }
mesh: { size: 3, order: 2 }
`, 'check-strip-hole.yaml');
  const r = runStudy(model, { levels: 4 });
  const ref = 3.036, u = 5e-4 + 4e-4 * ref;
  const edge = [siteAt(r, 1, 0), siteAt(r, -1, 0)].filter((p): p is SiteResult => p?.verdict === 'converging');
  return [bandResult({
    name: 'study: strip hole d/W = 0.1, Ktg',
    source: 'independent FE computation (9-node quadrilaterals on graded mapped meshes, Richardson extrapolation); problem of Howland 1930 (Phil. Trans. A 229; 3.03 from memory)',
    quantity: 'study estimate of the converged von Mises peak / S',
    reference: ref, referenceUncertainty: u, tolerance: 1e-3,
    site: siteAt(r, 1, 0) ?? siteAt(r, -1, 0), scale: 1,
    othersInside: edge.every((p) => holds(p.estimate.value, p.estimate.uncertainty, ref, u)),
  })];
}

// ---------------------------------------------------------------------------------------------
// Centre crack stress intensity

const CRACK = { W: 1, Lh: 1.5, S: 1, E: 1000, nu: 0.3 };

/** Quarter model of the centre crack of half-length a (symmetry rollers on x = 0 and on the ligament). */
function solveCrackQuarter(a: number): Solved {
  const { W, Lh, S, E, nu } = CRACK;
  const hTip = a / 200;
  const model = caseModel({
    title: `centre crack a = ${a}, quarter model`,
    plate: { outline: { kind: 'rect', center: [W / 4, Lh / 2], width: W / 2, height: Lh, round: 0 }, openings: [] },
    material: { E, nu },
    supports: [
      support({ kind: 'x', value: 0 }, true, false, 'supports[0]'),
      support({ kind: 'segment', from: [a, 0], to: [W / 2, 0] }, false, true, 'supports[1]'),
    ],
    loads: [{ kind: 'traction', where: { kind: 'y', value: Lh }, traction: [0, S], keyPath: 'loads[0]' }],
    size: 0.1,
    // a/200 at the tip, a/20 along the whole crack
    local: [{ near: [a, 0], size: hTip, radius: 2 * hTip }, { near: [a / 2, 0], size: a / 20, radius: a }],
  });
  return solveModel(model, { requiredPoints: [[a, 0]] });
}

/*
 * Centre crack 2a = 0.2 in a strip W = 1 (half-length 1.5), S = 1, plane stress: quarter model with
 * symmetry rollers on x = 0 and on the ligament y = 0, a ≤ x ≤ W/2; the crack face 0 ≤ x < a is free.
 * K_I from the opening of the crack-face nodes by displacement extrapolation (crack.ts) against
 * Tada, Paris & Irwin (2000) p. 2.2 (Feddersen 1966 secant form, with Tada's polynomial; page and
 * coefficients from memory). Measured 0.070 %: 0.5 %.
 * Second figure: the energy release rate from two crack lengths, G ≈ dU/dA with U = ½ fᵀu under
 * fixed load (central difference over a ± 0.1a; four quarters, two tips: G = 2 ΔU_quarter/(t Δa)),
 * against Irwin's G = K²/E' (Irwin 1957) with Tada's K. Measured 0.053 %: 0.2 %.
 */
function centreCrackCase(): CheckResult[] {
  const { W, S, E, nu } = CRACK;
  const a = 0.1;
  const s = solveCrackQuarter(a);
  const face = nodesWhere(s.mesh, (x, y) => Math.abs(y) < 1e-12 && x < a - 1e-12);
  const r = face.map((n) => a - s.mesh.xy[2 * n]);
  const uy = face.map((n) => s.solution.u[2 * n + 1]);
  // fit over 0.1a ≤ r ≤ 0.5a: ≥ 20 tip elements away, where the ordinary elements' error in the √r
  // opening has died out; K(r) = K + O(r) there (the Griffith profile gives K√(1 − r/2a))
  const { K } = extrapolateK(r, uy, E, nu, 'plane-stress', 0.1 * a, 0.5 * a);
  const ref = tadaCentreCrackK(S, a, W);

  const da = 0.1 * a;
  const energy = (q: Solved): number => {
    let w = 0;
    for (let i = 0; i < q.solution.u.length; i++) w += q.solution.load[i] * q.solution.u[i];
    return 0.5 * w;
  };
  const t = s.model.thickness;
  const G = (2 * (energy(solveCrackQuarter(a + da)) - energy(solveCrackQuarter(a - da)))) / (t * 2 * da);
  const Gref = (ref * ref) / E;
  return [
    result({
      name: 'centre crack: K_I',
      source: `Tada, Paris & Irwin 2000, p. 2.2 (from memory): S√(πa)·F(2a/W) (Feddersen 1966: ${feddersenCentreCrackK(S, a, W).toFixed(4)})`,
      quantity: 'K_I by displacement extrapolation of the crack-face opening, 2a/W = 0.2',
      reference: ref, value: K, error: relError(K, ref), tolerance: 0.005,
    }),
    result({
      name: 'centre crack: energy release rate',
      source: 'Irwin 1957 (J. Appl. Mech. 24): G = K²/E\', K from Tada, Paris & Irwin 2000',
      quantity: 'G = dU/dA from the strain energy at a ± 0.1a (fixed load)',
      reference: Gref, value: G, error: relError(G, Gref), tolerance: 0.002,
    }),
  ];
}

/*
 * A body of revolution (issue 18): the thick cylinder a = 10, b = 20 with closed ends under internal
 * pressure p = 100 as an axisymmetric section a ≤ r ≤ b, 0 ≤ z ≤ 10 (z = 0 held in z, the end cap's
 * pull A = pa²/(b² − a²) as a traction on z = 10), the hoop stress σθ from the recovered field's σzz.
 * LST, h = 1.25 (8 elements through the wall). Tolerances a few times the errors measured when the
 * case was set (worst bore node, at the ends where SPR extrapolates): σθ(a) 0.28 % → 1 %, σz 0.27 % → 1 %,
 * u_r(a) 0.007 % → 0.03 %.
 */
function axisymmetricCylinderCase(): CheckResult[] {
  const a = 10, b = 20, L = 10, p = 100, E = 200000, nu = 0.3;
  const exactA = lameClosedCylinder(a, b, p, a, E, nu);
  const model = caseModel({
    title: 'thick cylinder with closed ends, axisymmetric section',
    state: 'axisymmetric',
    plate: { outline: { kind: 'rect', center: [(a + b) / 2, L / 2], width: b - a, height: L, round: 0 }, openings: [] },
    material: { E, nu },
    supports: [support({ kind: 'y', value: 0 }, false, true, 'supports[0]')],
    loads: [
      { kind: 'pressure', where: { kind: 'x', value: a }, pressure: p, keyPath: 'loads[0]' },
      { kind: 'traction', where: { kind: 'y', value: L }, traction: [0, exactA.sz], keyPath: 'loads[1]' },
    ],
    size: 1.25,
  });
  const s = solveModel(model);
  let worstS = -1, valS = 0, worstZ = -1, valZ = 0, worstU = -1, valU = 0;
  for (const n of nodesWhere(s.mesh, (x) => Math.abs(x - a) < 1e-9)) {
    const eS = relError(s.field.szz[n], exactA.st);
    if (eS > worstS) { worstS = eS; valS = s.field.szz[n]; }
    const eZ = relError(s.field.stress[3 * n + 1], exactA.sz);
    if (eZ > worstZ) { worstZ = eZ; valZ = s.field.stress[3 * n + 1]; }
    const eU = relError(s.solution.u[2 * n], exactA.ur);
    if (eU > worstU) { worstU = eU; valU = s.solution.u[2 * n]; }
  }
  const src = 'Lamé 1852; Timoshenko & Goodier 1970 §33; Roark 7th ed. Table 13.5';
  return [
    result({ name: 'Closed cylinder (axisymmetric): σθ(a)', source: `${src}: σθ = A + B/r²`, quantity: 'hoop stress on the bore, worst node', reference: exactA.st, value: valS, error: worstS, tolerance: 0.01 }),
    result({ name: 'Closed cylinder (axisymmetric): σz', source: `${src}: σz = pa²/(b² − a²)`, quantity: 'axial stress on the bore, worst node', reference: exactA.sz, value: valZ, error: worstZ, tolerance: 0.01 }),
    result({ name: 'Closed cylinder (axisymmetric): u_r(a)', source: `${src}: u_r = r(σθ − ν(σr + σz))/E`, quantity: 'radial displacement of the bore, worst node', reference: exactA.ur, value: valU, error: worstU, tolerance: 3e-4 }),
  ];
}

/** Every case, in the order the table lists them. */
export const CHECK_CASES: readonly CheckCase[] = [
  { id: 'patch-cst', run: () => patchCase(1) },
  { id: 'patch-lst', run: () => patchCase(2) },
  { id: 'kirsch', run: kirschCase },
  { id: 'kirsch-cst', run: kirschCstCase },
  { id: 'strip-0.2', run: () => stripCase(0.2) },
  { id: 'strip-0.3', run: () => stripCase(0.3) },
  { id: 'strip-0.5', run: () => stripCase(0.5) },
  { id: 'inglis-2', run: () => inglisCase(2) },
  { id: 'inglis-3', run: () => inglisCase(3) },
  { id: 'study-kirsch', run: () => exactPlateCase(kirschPlate) },
  { id: 'study-inglis-2', run: () => exactPlateCase((levels) => inglisPlate(2, levels)) },
  { id: 'study-inglis-3', run: () => exactPlateCase((levels) => inglisPlate(3, levels)) },
  { id: 'lame', run: lameCase },
  { id: 'lame-plane-strain', run: lamePlaneStrainCase },
  { id: 'axisymmetric-cylinder', run: axisymmetricCylinderCase },
  { id: 'cantilever', run: cantileverCase },
  { id: 'williams-corner', run: williamsCornerCase },
  { id: 'williams-crack', run: williamsCrackCase },
  { id: 'study-hole', run: studyHoleCase },
  { id: 'centre-crack', run: centreCrackCase },
  ...BODY_LOAD_CASES,
];
