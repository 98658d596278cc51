import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { appliedResultant, pinForceLoad, selectBoundary } from '../../src/fem/index.js';
import { buildGeometry } from '../../src/geometry/index.js';
import { meshPlate, sizeFieldFromSettings } from '../../src/mesh/index.js';
import { parseModel } from '../../src/model/index.js';
import { solveModel } from './issue9-helpers.js';

/*
 * Pin force (issue 9): cosine pressure over the half of the hole facing the force, scaled so
 * that the nodal forces sum to the given force (common practice for pin-loaded lugs). The sum
 * is exact by construction, so the check is round-off: 1e-9 relative.
 */
const lugFile = fileURLToPath(new URL('../../models/hoist-lug.yaml', import.meta.url));

describe('pin force on a pin hole', () => {
  const model = parseModel(readFileSync(lugFile, 'utf8'), 'hoist-lug.yaml');
  // the demo's `angled` case: the pin pulls F tilted 20°, a guide plate pushes on the flank
  const angled = model.cases!.find((c) => c.name === 'angled')!;
  const load = angled.loads.find((l) => l.kind === 'pinForce');
  const F = 24000, tilt = (20 * Math.PI) / 180;

  it('the resultant of the nodal forces equals the given force to 1e-9', () => {
    expect(load?.kind).toBe('pinForce');
    for (const order of [1, 2] as const) {
      const geometry = buildGeometry(model.plate);
      const mesh = meshPlate(geometry, { sizeAt: sizeFieldFromSettings(geometry, { size: 8, local: [] }), order });
      const { edges } = selectBoundary(mesh, geometry, { kind: 'opening', id: 'pin' }, 'loads[0].where');
      const [fx, fy] = appliedResultant(pinForceLoad(mesh, edges, model.thickness, [F * Math.sin(tilt), F * Math.cos(tilt)]));
      expect(Math.abs(fx - F * Math.sin(tilt)) / F).toBeLessThan(1e-9);
      expect(Math.abs(fy - F * Math.cos(tilt)) / F).toBeLessThan(1e-9);
    }
  });

  it('only the half of the hole facing the force is loaded, pushing outwards', () => {
    const geometry = buildGeometry(model.plate);
    const mesh = meshPlate(geometry, { sizeAt: sizeFieldFromSettings(geometry, model.mesh), order: 2 });
    const { nodes } = selectBoundary(mesh, geometry, { kind: 'opening', id: 'pin' }, 'loads[0].where');
    const f = pinForceLoad(mesh, selectBoundary(mesh, geometry, { kind: 'opening', id: 'pin' }, '').edges, 12, [0, F]);
    const cy = 110 - 45 + 5;
    for (const n of nodes) {
      const dy = mesh.xy[2 * n + 1] - cy;
      // below the centre (beyond 90° from the force, less one element of spread) no force
      if (dy < -1.6) expect(Math.hypot(f[2 * n], f[2 * n + 1])).toBe(0);
      if (dy > 1) expect(f[2 * n + 1]).toBeGreaterThan(0);
    }
  });

  it('the lug solves in equilibrium: the foot reacts the pin force and the flank traction (statics)', () => {
    const { solution } = solveModel({ ...model, loads: angled.loads, supports: angled.supports });
    // flank: traction −2 on x = 90 from y = 0 to the fillet start y = 110 − 44, thickness 12
    const flank = -2 * (110 - 44) * 12;
    expect(Math.abs(solution.appliedSum[0] - (F * Math.sin(tilt) + flank)) / F).toBeLessThan(1e-9);
    expect(Math.abs(solution.appliedSum[1] - F * Math.cos(tilt)) / F).toBeLessThan(1e-9);
    expect(Math.abs(solution.reactionSum[0] + solution.appliedSum[0]) / F).toBeLessThan(1e-9);
    expect(Math.abs(solution.reactionSum[1] + solution.appliedSum[1]) / F).toBeLessThan(1e-9);
  });
});
