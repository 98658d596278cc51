import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/model/index.js';
import { kirschCartesian, kirschDisplacement } from '../../src/reference/index.js';
import { hoopOnHole, solveModel } from './issue9-helpers.js';

/*
 * A square with a hole driven by the exact Kirsch displacements on its outer edges, given as a
 * table of points (issue 9 acceptance). Reference: G. Kirsch, Z. VDI 42 (1898) 797–807, with the
 * displacement field of Kirsch (1898), derived from its strains (plane stress): the peak hoop stress is 3S at
 * (0, ±a), and the reactions on the driven edges are the resultants of the Kirsch tractions
 * σ·n there. With exact boundary data there is no finite-size effect; what remains is the
 * discretisation and the linear interpolation of the table (spacing L/50), both well below 1 %.
 */
const a = 1, L = 5, S = 80, E = 200000, nu = 0.3;

function kirschTable(perEdge: number, shuffle: boolean): string {
  const rows: string[] = [];
  const pts: [number, number][] = [];
  for (let k = 0; k < perEdge; k++) {
    const t = -L + (2 * L * k) / perEdge;
    pts.push([t, -L], [L, t], [-t, L], [-L, -t]);
  }
  if (shuffle) pts.reverse();
  for (const [x, y] of pts) {
    const { ux, uy } = kirschDisplacement(S, a, x, y, E, nu);
    rows.push(`${uy},${x},${ux},${y}`);
  }
  return `uy,x,ux,y\n${rows.join('\n')}\n`;
}

const model = (table: string) => parseModel(`
title: Gusset cut-out driven by a coarse global run
material: { E: ${E}, nu: ${nu} }
thickness: 1
plate:
  outline: { rect: { center: [0, 0], width: ${2 * L}, height: ${2 * L} } }
  openings: [ { id: bolt, circle: { center: [0, 0], radius: ${a} } } ]
supports:
  - { where: { outline: true }, displace: { table: global-run.csv } }
loads:
  - { where: { opening: bolt }, pressure: 0 }
mesh: { size: 0.5, order: 2, local: [ { near: [0, 0], size: 0.05, radius: 1.5 } ] }
`, 'cutout.yaml', { readFile: (p) => { if (p !== 'global-run.csv') throw new Error('no such file'); return table; } });

/** ∫ over the right half of the boundary (x > 0) of the Kirsch traction's x component. */
function kirschRightHalfFx(): number {
  const n = 4000;
  let fx = 0;
  for (let i = 0; i < n; i++) {
    const y = -L + (2 * L * (i + 0.5)) / n; // right edge, n = (1, 0): t_x = σxx
    fx += kirschCartesian(S, a, L, y).sxx * (2 * L) / n;
    const x = (L * (i + 0.5)) / n; // top (n = (0, 1)) and bottom (n = (0, −1)) halves: t_x = ±σxy
    fx += (kirschCartesian(S, a, x, L).sxy - kirschCartesian(S, a, x, -L).sxy) * L / n;
  }
  return fx;
}

describe('displacements from a table of the Kirsch field', () => {
  const solved = solveModel(model(kirschTable(50, true)));

  it('peak hoop stress 3S at (0, ±a) within 1 % (Kirsch 1898)', () => {
    const pts = hoopOnHole(solved.mesh, solved.field.stress, a);
    const peak = pts.reduce((b, p) => (p[1] > b[1] ? p : b));
    expect(Math.abs(peak[1] / (3 * S) - 1)).toBeLessThan(0.01);
    expect(Math.abs(Math.abs((peak[0] * 180) / Math.PI) - 90)).toBeLessThan(5);
  });

  it('reactions on the right half match the Kirsch traction resultant within 1 %', () => {
    const { mesh, solution } = solved;
    let rx = 0;
    for (let n = 0; n < mesh.xy.length / 2; n++) {
      if (!solution.fixed[2 * n]) continue;
      const x = mesh.xy[2 * n];
      rx += x > 1e-9 ? solution.reaction[2 * n] : Math.abs(x) <= 1e-9 ? 0.5 * solution.reaction[2 * n] : 0;
    }
    const exact = kirschRightHalfFx();
    // statics: the whole outline's reactions balance (no other loads)
    expect(Math.abs(solution.reactionSum[0]) / exact).toBeLessThan(1e-9);
    expect(Math.abs(rx / exact - 1)).toBeLessThan(0.01);
  });

  it('a node far from every table point is an error naming the file', () => {
    const sparse = 'x,y,ux,uy\n5,5,0,0\n-5,5,0,0\n-5,-5,0,0\n5,-5,0,0\n';
    expect(() => solveModel(model(sparse))).toThrow(/global-run\.csv: the boundary node .* farther than the tolerance/);
  });

  it('a missing column is an error naming the file', () => {
    expect(() => model('x,y,ux\n0,0,0\n')).toThrow(/global-run\.csv: missing column 'uy'/);
  });
});
