import { readFileSync, readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { solvePlate } from '../../src/fem/index.js';
import { buildGeometry } from '../../src/geometry/index.js';
import { meshPlate, sizeFieldFromSettings } from '../../src/mesh/index.js';
import { parseModel } from '../../src/model/index.js';
import type { Model } from '../../src/model/types.js';

/*
 * Equilibrium on every demo model (issue 3 acceptance): the reactions must balance the applied
 * loads, ‖reactionSum + appliedSum‖ ≤ 1e-9 · Σ|f|. Statics, no published source needed: the sum
 * of K u over the x (or y) dofs is the rigid translation applied to K u, which is zero.
 */
const modelsDir = fileURLToPath(new URL('../../models/', import.meta.url));
const files = readdirSync(modelsDir).filter((f) => f.endsWith('.yaml'));

function pointsOf(model: Model): Array<[number, number]> {
  const pts: Array<[number, number]> = [];
  for (const s of model.supports) if (s.where.kind === 'point') pts.push([s.where.at[0], s.where.at[1]]);
  for (const l of model.loads) if ('where' in l && l.where.kind === 'point') pts.push([l.where.at[0], l.where.at[1]]);
  return pts;
}

describe('equilibrium on the demo models', () => {
  it('there are demo models to check', () => {
    expect(files.length).toBeGreaterThan(0);
  });
  it.each(files)('%s', (file) => {
    const model = parseModel(readFileSync(modelsDir + file, 'utf8'), file);
    const geometry = buildGeometry(model.plate);
    // the model's own mesh settings, coarsened ×2 to keep the suite fast (equilibrium does not depend on h)
    const sizeAt0 = sizeFieldFromSettings(geometry, model.mesh);
    const mesh = meshPlate(geometry, { sizeAt: (x, y) => 2 * sizeAt0(x, y), order: model.mesh.order, requiredPoints: pointsOf(model) });
    const section = { ...model.material, state: model.state, thickness: model.thickness };
    const solution = solvePlate({ mesh, geometry, section, supports: model.supports, loads: model.loads });
    let scale = 0;
    for (let i = 0; i < solution.load.length; i++) scale += Math.abs(solution.load[i]);
    expect(scale).toBeGreaterThan(0);
    expect(Math.abs(solution.reactionSum[0] + solution.appliedSum[0]) / scale).toBeLessThan(1e-9);
    expect(Math.abs(solution.reactionSum[1] + solution.appliedSum[1]) / scale).toBeLessThan(1e-9);
    expect(solution.residual).toBeLessThan(1e-10);
  });
});
