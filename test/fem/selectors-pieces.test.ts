import { describe, expect, it } from 'vitest';
import { FemError } from '../../src/errors.js';
import { mesh as meshModel, recover, solve } from '../../src/index.js';
import { buildGeometry } from '../../src/geometry/index.js';
import { farFieldEdges, outlineFarPieces, selectBoundary, selectorVertices, selectorWarnings } from '../../src/fem/index.js';
import { parseModel } from '../../src/model/index.js';

const head = `
units: { length: mm, force: N }
material: { E: 1000, nu: 0.3 }
thickness: 1
`;

// a quarter of a thick ring a = 1 ≤ r ≤ b = 2 as one SVG path (SVG's y axis points down): line, outer arc,
// line, bore arc
const ringSvg = '<svg xmlns="http://www.w3.org/2000/svg"><path id="ring" d="M 1 0 L 2 0 A 2 2 0 0 0 0 -2 L 0 -1 A 1 1 0 0 1 1 0 Z"/></svg>';
const ring = (where: string) => parseModel(`${head}
title: quarter of a thick ring under bore pressure
plate:
  outline: { svg: ring.svg, path: ring }
supports:
  - { where: { piece: [0, 1.5] }, fix: [x] }
  - { where: { piece: [1.5, 0] }, fix: [y] }
loads:
  - { where: ${where}, pressure: 1 }
mesh: { size: 0.1, order: 2 }
`, 'ring.yaml', { readFile: () => ringSvg });

describe('{ piece: [x, y] } selects the whole boundary piece nearest the point, for loads and supports (issue 12 §9)', () => {
  // Lamé (1852), Timoshenko & Goodier (1970): a = 1, b = 2, p = 1, E = 1000, ν = 0.3, plane stress:
  // σθ(a) = p(b² + a²)/(b² − a²) = 5/3, u_r(b) = 2pa²b/(E(b² − a²)) = 1.333333e-3 (outer arc unloaded)
  const s = recover(solve(ring('{ piece: [0.7071, 0.7071] }')));
  it('the bore arc alone carries the pressure: resultant p·(a, a)', () => {
    expect(s.solution.appliedSum[0]).toBeCloseTo(1, 12);
    expect(s.solution.appliedSum[1]).toBeCloseTo(1, 12);
  });
  it('u_r at the outer arc within 0.01 % of Lamé (we measure 2e-5) and σθ at the bore within 1 % (we measure 0.37 %)', () => {
    let worstU = 0, worstS = 0;
    for (let n = 0; n < s.mesh.xy.length / 2; n++) {
      const x = s.mesh.xy[2 * n], y = s.mesh.xy[2 * n + 1], r = Math.hypot(x, y);
      if (Math.abs(r - 2) < 1e-9) worstU = Math.max(worstU, Math.abs((s.solution.u[2 * n] * x + s.solution.u[2 * n + 1] * y) / r / (4 / 3e3) - 1));
      if (Math.abs(r - 1) < 1e-9) {
        // hoop stress: the stress along the tangent (−y, x)/r
        const [sxx, syy, sxy] = [s.field.stress[3 * n], s.field.stress[3 * n + 1], s.field.stress[3 * n + 2]];
        const st = (sxx * y * y - 2 * sxy * x * y + syy * x * x) / (r * r);
        worstS = Math.max(worstS, Math.abs(st / (5 / 3) - 1));
      }
    }
    expect(worstU).toBeLessThan(1e-4);
    expect(worstS).toBeLessThan(1e-2);
  });
  it('a point as near to two pieces (a corner) is ambiguous, and the message names the key', () => {
    const m = ring('{ piece: [1, 0] }');
    let caught: unknown;
    try { solve(m); } catch (e) { caught = e; }
    expect(caught).toBeInstanceOf(FemError);
    expect((caught as FemError).keyPath).toBe('loads[0].where');
    expect((caught as FemError).message).toMatch(/is as near to .* as to .*; give a point on \(or nearer to\) the one piece/);
  });
});

const strip = (supports: string, loads: string) => parseModel(`${head}
title: strip
plate:
  outline: [[0, 0], [100, 0], [100, 40], [0, 40]]
supports:
${supports}
loads:
${loads}
mesh: { size: 7, order: 2 }
`, 'strip.yaml');

describe('selector ends are mesh vertices (issue 12 §4)', () => {
  it('a segment ending inside an edge splits it: the support stops exactly at its end', () => {
    const m = strip('  - { where: { segment: [[37.3, 0], [100, 0]] }, fix: [y] }\n  - { where: { x: 100 }, fix: [x] }', '  - { where: { y: 40 }, traction: [0, 1] }');
    const { mesh, geometry } = meshModel(m);
    expect(selectorVertices(m, geometry)).toEqual([[37.3, 0]]);
    const sel = selectBoundary(mesh, geometry, m.supports[0].where, 'supports[0].where');
    const xs = Array.from(sel.nodes, (n) => mesh.xy[2 * n]);
    expect(Math.min(...xs)).toBe(37.3);
    // the edges it takes cover 37.3 ≤ x ≤ 100 exactly
    let length = 0;
    for (const e of sel.edges) length += Math.abs(mesh.xy[2 * mesh.boundaryEdges[3 * e + 1]] - mesh.xy[2 * mesh.boundaryEdges[3 * e]]);
    expect(length).toBeCloseTo(100 - 37.3, 10);
  });
  it('a point selector means the nearest boundary point, for forces and supports alike, with a warning', () => {
    const m = strip(
      '  - { where: { x: 0 }, fix: [x] }\n  - { where: { point: [30, 6] }, fix: [y] }',
      '  - { where: { point: [61.5, 31] }, force: [0, 5] }',
    );
    const meshed = meshModel(m);
    const { mesh, geometry } = meshed;
    expect(selectorVertices(m, geometry)).toEqual([[30, 0], [61.5, 40]]);
    const s = solve(meshed);
    const at = (x: number, y: number) => {
      for (let n = 0; n < mesh.xy.length / 2; n++) if (mesh.xy[2 * n] === x && mesh.xy[2 * n + 1] === y) return n;
      throw new Error(`no node at (${x}, ${y})`);
    };
    expect(s.solution.load[2 * at(61.5, 40) + 1]).toBe(5);
    // the point support takes the whole vertical reaction (the x support carries none)
    expect(s.solution.reaction[2 * at(30, 0) + 1]).toBeCloseTo(-5, 9);
    const w = selectorWarnings(m, geometry);
    expect(w.map((x) => x.keyPath)).toEqual(['supports[1].where', 'loads[0].where']);
    expect(w[1].message).toMatch(/the point \(61\.5, 31\) is not on the boundary; the nearest boundary point \(61\.5, 40\), 9 away, is used/);
  });
});

describe('far-field stress and notch faces (issue 12 §10)', () => {
  // an edge slit 20 deep, 0.02 wide at the mouth, in a 100 × 200 strip
  const slit = parseModel(`${head}
title: slit strip
plate:
  outline: [[0, 0], [100, 0], [100, 200], [0, 200], [0, 100.01], [20, 100], [0, 99.99]]
supports:
  - { where: { point: [100, 0] }, fix: [x, y] }
  - { where: { point: [100, 200] }, fix: [x] }
loads:
  - { where: { outline: true }, stress: [0, 100, 0] }
mesh: { size: 10, order: 2 }
`, 'slit.yaml');
  const geometry = buildGeometry(slit.plate);
  it('the slit faces are not far edges; the far-field load leaves them free and says so, naming the key', () => {
    const far = outlineFarPieces(geometry);
    const outline = geometry.loops.find((l) => !l.hole)!.pieces;
    expect(outline.filter((id) => !far.has(id)).map((id) => geometry.pieces[id].keyPath)).toEqual(['plate.outline[4]', 'plate.outline[5]']);
    const w = selectorWarnings(slit, geometry);
    expect(w).toHaveLength(1);
    expect(w[0].keyPath).toBe('loads[0]');
    expect(w[0].message).toMatch(/far edges only: 2 faces inside its convex hull \(notch, slit or crack faces: plate\.outline\[4\], plate\.outline\[5\]\) stay free/);
  });
  it('so the load balances on the far edges alone: resultant 0, the slit faces carry nothing', () => {
    const s = solve(slit);
    expect(Math.abs(s.solution.appliedSum[1])).toBeLessThan(1e-9 * 100 * 100);
    const { mesh } = s;
    const edges = selectBoundary(mesh, geometry, { kind: 'outline' }, 'loads[0].where').edges;
    const far = outlineFarPieces(geometry);
    const kept = farFieldEdges(mesh, geometry, { kind: 'outline' }, edges);
    expect(kept.length).toBeLessThan(edges.length);
    for (const e of kept) expect(far.has(mesh.boundaryPiece[e])).toBe(true);
    for (let n = 0; n < mesh.xy.length / 2; n++) {
      const x = mesh.xy[2 * n], y = mesh.xy[2 * n + 1];
      if (x > 1e-9 && x < 20 - 1e-9 && Math.abs(y - 100) < 0.02) expect(s.solution.load[2 * n + 1]).toBe(0);
    }
  });
});
