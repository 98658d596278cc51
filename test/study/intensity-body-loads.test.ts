/**
 * The reciprocal-work K with body loads (issue 14; derivation in src/study/stress-intensity.ts): a field
 * that adds no singular term must leave K unchanged. On the 270° L corner (the exact mode-I Williams 1952
 * field of the reference notes, item 6) we add, as exact nodal displacements on an LST mesh,
 * - the free thermal expansion of a linear (harmonic, hence compatible) ΔT: ε = c(x, y)·(1, 1, 0),
 *   u = c₀x + c₁(x² − y²)/2 + c₂xy, v = c₀y + c₁xy + c₂(y² − x²)/2, stress-free;
 * - the field of a uniform body force b with traction-free faces x = 0 and y = 0: σxx = −bₓx,
 *   σyy = −b_y y, τxy = 0, whose plane-stress displacements (derived here) are
 *   u = (−bₓx²/2 + ν b_y xy − ν bₓy²/2)/E, v = (−b_y y²/2 + ν bₓxy − ν b_y x²/2)/E.
 * Neither has a singular term, so with the body fields passed K must be the Williams field's own K;
 * without them the integral would mistake those fields for one.
 */
import { describe, expect, it } from 'vitest';
import { buildGeometry } from '../../src/geometry/index.js';
import { meshPlate } from '../../src/mesh/index.js';
import { intensityNorm, reciprocalIntensity, runStudy } from '../../src/study/index.js';
import { parseModel } from '../../src/model/index.js';
import { LAMBDA_270, williamsDisplacement } from '../recovery/williams-field.js';
import { E, kappa, lPlate, mu, nu, section, setup } from './l-corner.js';


describe('reciprocal work K with body loads: fields without a singular term leave K unchanged', () => {
  const geom = buildGeometry(lPlate);
  const mesh = meshPlate(geom, { sizeAt: (x, y) => 0.01 + 0.1 * Math.hypot(x, y), order: 2 });
  const nNodes = mesh.xy.length / 2;
  const williams = new Float64Array(mesh.xy.length);
  for (let n = 0; n < nNodes; n++) {
    const [ux, uy] = williamsDisplacement(mesh.xy[2 * n], mesh.xy[2 * n + 1], mu, kappa);
    // at the apex node itself the field is its limit, 0 (r^λ → 0; the formula's angle is undefined there)
    williams[2 * n] = Number.isFinite(ux) ? ux : 0; williams[2 * n + 1] = Number.isFinite(uy) ? uy : 0;
  }
  const norm = intensityNorm(270, LAMBDA_270, section);
  const K0 = reciprocalIntensity(mesh, williams, section, setup, norm);
  const plus = (f: (x: number, y: number) => [number, number]) => williams.map((v, i) => {
    const n = i >> 1;
    return v + f(mesh.xy[2 * n], mesh.xy[2 * n + 1])[i & 1];
  });

  it('thermal strain c = c₀ + c₁x + c₂y (the apex value c₀ ≠ 0): K as without it', () => {
    const [c0, c1, c2] = [0.4, 0.25, -0.15];
    const u = plus((x, y) => [c0 * x + (c1 * (x * x - y * y)) / 2 + c2 * x * y, c0 * y + c1 * x * y + (c2 * (y * y - x * x)) / 2]);
    const K = reciprocalIntensity(mesh, u, section, setup, norm, { strain: (x, y) => c0 + c1 * x + c2 * y });
    // measured 5.6e−7 relative (the quadrature of (c − c₀) tr σ* ~ r^(−λ) near the apex); without the body
    // fields the same displacements give a K 17 % too high (checked below)
    expect(Math.abs(K / K0 - 1)).toBeLessThan(3e-6);
    const blind = reciprocalIntensity(mesh, u, section, setup, norm);
    expect(Math.abs(blind / K0 - 1)).toBeGreaterThan(0.1);
  });

  it('uniform body force b = (0.3, −0.7) with traction-free faces: K as without it', () => {
    const [bx, by] = [0.3, -0.7];
    const u = plus((x, y) => [
      (-bx * x * x / 2 + nu * by * x * y - (nu * bx * y * y) / 2) / E,
      (-by * y * y / 2 + nu * bx * x * y - (nu * by * x * x) / 2) / E,
    ]);
    const K = reciprocalIntensity(mesh, u, section, setup, norm, { force: () => [bx, by] });
    // measured 1.1e−6 relative; without the body force 3 % off (checked below)
    expect(Math.abs(K / K0 - 1)).toBeLessThan(5e-6);
    const blind = reciprocalIntensity(mesh, u, section, setup, norm);
    expect(Math.abs(blind / K0 - 1)).toBeGreaterThan(0.01);
  });
});

/*
 * Through the study: an edge slit in a strip (an invented 100 × 200 plate, slit 20 deep), bottom and top
 * edges held in y and the plate warmed uniformly by ΔT = 50, against the same strip without temperature
 * whose top edge is moved by −αΔT·H. By superposition the first is the second plus the stress-free
 * expansion αΔT·(x, y), so both have the same stresses and the same K (derived; no published source
 * needed). The study must pass the thermal strain to the K integral for the two to agree.
 */
describe('study: K of a warm, restrained slit equals K of the equivalent displacement load', () => {
  const model = (support: string, loads: string) => `
title: slit strip
params: { W: 100, H: 200, a: 20 }
material: { E: 210000, nu: 0.3, expansion: 1.2e-5 }
thickness: 12
plate:
  outline: [[0, 0], [W, 0], [W, H], [0, H], [0, H/2 + 0.5], [a, H/2], [0, H/2 - 0.5]]
supports:
  - { where: { y: 0 }, fix: [y] }
  - { where: { point: [0, 0] }, fix: [x] }
${support}
loads: ${loads}
mesh: { size: 5, local: [{ near: [a, H/2], size: 0.5, radius: 4 }] }
study: { measure: max-principal, levels: 3, readouts: { distance: 0.5 } }
`;
  // measured 1.05e−4 relative on the finest level (the integral's own quadrature scatter); without the thermal
  // strain passed to the integral the warm plate's K is 23 % off
  it('the two K agree', () => {
    const warm = runStudy(parseModel(model('  - { where: { y: H }, fix: [y] }', '\n  - temperature: 50'), 'warm.yaml'));
    const moved = runStudy(parseModel(model('  - { where: { y: H }, displace: [null, "-1.2e-5*50*H"] }', '[]'), 'moved.yaml'));
    const tip = (r: typeof warm) => r.sites.find((s) => s.readouts.nsif !== undefined)!;
    const kWarm = tip(warm).readouts.nsif!, kMoved = tip(moved).readouts.nsif!;
    expect(Math.abs(kMoved)).toBeGreaterThan(100);
    expect(Math.abs(kWarm / kMoved - 1)).toBeLessThan(5e-4);
  });
});
