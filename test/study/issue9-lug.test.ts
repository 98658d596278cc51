import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { runStudy, type BaseSolve } from '../../src/study/index.js';
import { reportHtml } from '../../src/report/index.js';

/*
 * The lug demo (issue 9) runs through the convergence study with its pin force, in three load cases
 * and a combination (issue 14). Statics, no published source: in each case the first solve's reactions
 * balance the applied forces, whose sums are the case's pin force (and the flank traction, in x only);
 * the combination's are the factored sums.
 */
const file = fileURLToPath(new URL('../../models/hoist-lug.yaml', import.meta.url));

describe('lug demo through the study', () => {
  it('runs, carries the pin force, and finds a site at the pin hole', () => {
    const model = parseModel(readFileSync(file, 'utf8'), 'models/hoist-lug.yaml');
    let base: BaseSolve | undefined;
    const result = runStudy(model, { levels: 2, onBase: (b) => { base = b; } });
    const F = 24000, tilt = (20 * Math.PI) / 180;
    const flank = -2 * (110 - 44) * 12;
    const applied: Record<string, [number, number]> = {
      lift: [0, F], sway: [F / 3, 0], angled: [F * Math.sin(tilt) + flank, F * Math.cos(tilt)], swing: [F / 6, F],
    };
    expect(result.cases!.map((c) => c.name)).toEqual(Object.keys(applied));
    for (const c of result.cases!) {
      const [fx, fy] = applied[c.name];
      expect(Math.abs(c.solution.appliedSum[0] - fx) / F, c.name).toBeLessThan(1e-9);
      expect(Math.abs(c.solution.appliedSum[1] - fy) / F, c.name).toBeLessThan(1e-9);
      expect(Math.abs(c.solution.reactionSum[0] + fx) / F, c.name).toBeLessThan(1e-9);
      expect(Math.abs(c.solution.reactionSum[1] + fy) / F, c.name).toBeLessThan(1e-9);
      // every case studies the same sites
      expect(c.sites.map((s) => s.id)).toEqual(result.sites.map((s) => s.id));
    }
    const atHole = result.sites.filter((s) => Math.abs(Math.hypot(s.at[0] - 45, s.at[1] - 70) - 15) < 0.5);
    expect(atHole.length).toBeGreaterThan(0);
    // the envelope names a governing case for every site, and the site shown is that case's
    expect(result.envelope!.map((e) => e.site)).toEqual(result.sites.map((s) => s.id));
    result.envelope!.forEach((e, i) => expect(result.sites[i].case).toBe(e.governing));
    // the demo's report shows the envelope, one column per case and combination
    const html = reportHtml({ model, study: result, mesh: base!.mesh, geometry: base!.geometry, field: base!.nodal, u: base!.solution.u });
    expect(html).toContain('<section id="envelope">');
    for (const name of ['lift', 'sway', 'angled']) expect(html).toContain(`<th>${name}</th>`);
    expect(html).toContain('swing<br/><small>lift + 0.5*sway</small>');
  });
});
