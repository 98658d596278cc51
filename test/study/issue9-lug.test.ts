import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { runStudy } from '../../src/study/index.js';

/*
 * The lug demo (issue 9) runs through the convergence study with its pin force. Statics, no
 * published source: the first solve's reactions balance the applied forces, whose y sum is
 * the pin force's F cos 20° (the flank traction acts in x only).
 */
const file = fileURLToPath(new URL('../../models/hoist-lug.yaml', import.meta.url));

describe('lug demo through the study', () => {
  it('runs, carries the pin force, and finds a site at the pin hole', () => {
    const model = parseModel(readFileSync(file, 'utf8'), 'models/hoist-lug.yaml');
    const result = runStudy(model, { levels: 2 });
    const F = 24000 * Math.cos((20 * Math.PI) / 180);
    expect(Math.abs(result.solution.appliedSum[1] - F) / F).toBeLessThan(1e-9);
    expect(Math.abs(result.solution.reactionSum[1] + F) / F).toBeLessThan(1e-9);
    const atHole = result.sites.filter((s) => Math.abs(Math.hypot(s.at[0] - 45, s.at[1] - 70) - 15) < 0.5);
    expect(atHole.length).toBeGreaterThan(0);
  });
});
