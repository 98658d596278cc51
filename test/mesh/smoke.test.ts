import { describe, it, expect } from 'vitest';
import { buildGeometry } from '../../src/geometry/index.js';
import { meshPlate, meshQuality, validateMesh } from '../../src/mesh/index.js';
import type { Plate } from '../../src/model/types.js';

describe('smoke', () => {
  it('rect minus circle', () => {
    const plate: Plate = {
      outline: { kind: 'rect', center: [50, 25], width: 100, height: 50, round: 0 },
      openings: [{ id: 'h', shape: { kind: 'circle', center: [50, 25], radius: 10 }, keyPath: 'plate.openings[0]' }],
    };
    const g = buildGeometry(plate);
    const t0 = performance.now();
    const m = meshPlate(g, { sizeAt: () => 5, order: 2 });
    const q = meshQuality(m);
    console.log(performance.now() - t0, q, g.area);
    console.log(validateMesh(m, g));
  });
});
