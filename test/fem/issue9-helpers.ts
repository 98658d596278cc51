import { gaussStresses, solvePlate } from '../../src/fem/index.js';
import { buildGeometry } from '../../src/geometry/index.js';
import { meshPlate, sizeFieldFromSettings } from '../../src/mesh/index.js';
import type { Model } from '../../src/model/types.js';
import { recoverSpr } from '../../src/recovery/index.js';

/** One solve at the model's own mesh settings, with SPR nodal stresses. */
export function solveModel(model: Model) {
  const geometry = buildGeometry(model.plate);
  const sizeAt = sizeFieldFromSettings(geometry, model.mesh);
  const required: [number, number][] = [];
  for (const s of model.supports) if (s.where.kind === 'point') required.push([s.where.at[0], s.where.at[1]]);
  for (const l of model.loads) if ('where' in l && l.where.kind === 'point') required.push([l.where.at[0], l.where.at[1]]);
  const mesh = meshPlate(geometry, { sizeAt, order: model.mesh.order, requiredPoints: required });
  const section = { ...model.material, state: model.state, thickness: model.thickness };
  const solution = solvePlate({ mesh, geometry, section, supports: model.supports, loads: model.loads });
  const field = recoverSpr(mesh, gaussStresses(mesh, solution.u, section), section);
  return { geometry, mesh, solution, field };
}

/** Hoop stress σθθ at the boundary nodes on the circle r = a about the origin: [θ, σθθ] pairs. */
export function hoopOnHole(mesh: { xy: Float64Array }, stress: Float64Array, a: number): [number, number][] {
  const out: [number, number][] = [];
  for (let n = 0; n < mesh.xy.length / 2; n++) {
    const x = mesh.xy[2 * n], y = mesh.xy[2 * n + 1];
    if (Math.abs(Math.hypot(x, y) - a) > 1e-6 * a) continue;
    const t = Math.atan2(y, x);
    const c = Math.cos(t), s = Math.sin(t);
    const sxx = stress[3 * n], syy = stress[3 * n + 1], sxy = stress[3 * n + 2];
    out.push([t, sxx * s * s + syy * c * c - 2 * sxy * s * c]);
  }
  return out;
}
