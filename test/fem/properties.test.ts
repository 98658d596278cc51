import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  elasticityMatrix,
  elementStiffnessCst,
  elementStiffnessLst,
  gaussStresses,
  solvePlate,
  type ElasticSection,
  type PrescribedDisplacement,
} from '../../src/fem/index.js';
import { meshFromTriangles, rectangleGeometry } from './helpers/meshes.js';

/*
 * Property checks (fast-check): the patch test must hold for ANY admissible distortion of the
 * interior nodes, not only MacNeal & Harder's (1985) four positions; and element stiffness must be
 * objective: turning the element by θ turns K as Tᵀ K T (frame indifference of linear elasticity,
 * any FE text, e.g. Cook et al. 2002).
 */
const section: ElasticSection = { E: 1e6, nu: 0.25, state: 'plane-strain', thickness: 0.01 };
const geometry = rectangleGeometry(0, 0, 0.24, 0.12);

// each interior node moves anywhere inside a ±0.01 box around its MacNeal–Harder position;
// draws that make a triangle sliver (smallest angle under 4°; the published patch has 5.4°) are discarded: a nearly
// degenerate triangle amplifies round-off by its condition number, which is not what this tests
const base = [0.04, 0.02, 0.18, 0.03, 0.16, 0.08, 0.08, 0.08];
const offsets = fc.array(fc.double({ min: -0.01, max: 0.01, noNaN: true }), { minLength: 8, maxLength: 8 });

function minAngleDeg(xy: number[], tris: number[]): number {
  let least = 180;
  for (let t = 0; t < tris.length; t += 3) {
    for (let k = 0; k < 3; k++) {
      const a = tris[t + k], b = tris[t + ((k + 1) % 3)], c = tris[t + ((k + 2) % 3)];
      const ux = xy[2 * b] - xy[2 * a], uy = xy[2 * b + 1] - xy[2 * a + 1];
      const vx = xy[2 * c] - xy[2 * a], vy = xy[2 * c + 1] - xy[2 * a + 1];
      const cross = ux * vy - uy * vx;
      const ang = (Math.atan2(cross, ux * vx + uy * vy) * 180) / Math.PI;
      least = Math.min(least, ang);
    }
  }
  return least;
}

function patch(order: 1 | 2, inner: number[]) {
  const xy = [0, 0, 0.24, 0, 0.24, 0.12, 0, 0.12, ...inner];
  const quads = [[4, 5, 6, 7], [0, 1, 5, 4], [1, 2, 6, 5], [2, 3, 7, 6], [3, 0, 4, 7]];
  const tris: number[] = [];
  for (const [p, q, r, s] of quads) tris.push(p, q, r, p, r, s);
  return { mesh: meshFromTriangles({ xy, tris, order, pieceOf: () => 0 }), minAngle: minAngleDeg(xy, tris) };
}

describe('patch test B for random interior distortions', () => {
  it.each([1, 2] as const)('order %i reproduces a linear field to 1e-10', (order) => {
    fc.assert(
      fc.property(offsets, fc.double({ min: -2, max: 2, noNaN: true }), (d, g) => {
        const { mesh, minAngle } = patch(order, base.map((v, i) => v + d[i]));
        fc.pre(minAngle >= 4);
        const lin = (x: number, y: number): [number, number] => [1e-3 * (x + g * y), 1e-3 * (-0.5 * y + 0.3 * x)];
        const prescribed: PrescribedDisplacement[] = [];
        const nNodes = mesh.xy.length / 2;
        const onEdge = (x: number, y: number) => x < 1e-12 || y < 1e-12 || x > 0.24 - 1e-12 || y > 0.12 - 1e-12;
        for (let n = 0; n < nNodes; n++) {
          const [x, y] = [mesh.xy[2 * n], mesh.xy[2 * n + 1]];
          if (onEdge(x, y)) {
            const [u, v] = lin(x, y);
            prescribed.push({ dof: 2 * n, value: u }, { dof: 2 * n + 1, value: v });
          }
        }
        const sol = solvePlate({ mesh, geometry, section, supports: [], loads: [], prescribed });
        for (let n = 0; n < nNodes; n++) {
          const [u, v] = lin(mesh.xy[2 * n], mesh.xy[2 * n + 1]);
          expect(Math.abs(sol.u[2 * n] - u)).toBeLessThan(1e-10 * 1e-3);
          expect(Math.abs(sol.u[2 * n + 1] - v)).toBeLessThan(1e-10 * 1e-3);
        }
        // constant stress: every Gauss point equals the first, relative to the largest component
        const s = gaussStresses(mesh, sol.u, section).stress;
        const sMax = Math.max(Math.abs(s[0]), Math.abs(s[1]), Math.abs(s[2]));
        for (let k = 3; k < s.length; k++) expect(Math.abs(s[k] - s[k % 3]) / sMax).toBeLessThan(1e-10);
      }),
      { numRuns: 40 },
    );
  });
});

describe('element stiffness is frame indifferent', () => {
  const D = elasticityMatrix(section);
  it.each([
    ['CST', [0.1, 0.2, 1.3, 0.4, 0.5, 1.1]],
    ['LST curved', [0, 0, 2, 0.3, 0.4, 1.5, 1.05, 0.05, 1.3, 1.0, 0.1, 0.8]],
  ] as const)('%s: K(R x) = T K(x) Tᵀ for any turn', (_name, xy) => {
    fc.assert(
      fc.property(fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }), (theta) => {
        const c = Math.cos(theta), s = Math.sin(theta);
        const nNodes = xy.length / 2;
        const turned = xy.map((_, i) => (i % 2 === 0 ? c * xy[i] - s * xy[i + 1] : s * xy[i - 1] + c * xy[i]));
        const stiffness = (p: number[]) => (nNodes === 3 ? elementStiffnessCst(p, D, 1) : elementStiffnessLst(p, D, 1));
        const K = stiffness([...xy]);
        const Kr = stiffness(turned);
        const n = 2 * nNodes;
        // T is block-diagonal with the 2×2 rotation R; (T K Tᵀ)_ij
        const R = [c, -s, s, c];
        let kMax = 0, err = 0;
        for (let i = 0; i < n; i++) {
          for (let j = 0; j < n; j++) {
            let v = 0;
            const bi = i & ~1, bj = j & ~1;
            for (let a = 0; a < 2; a++) for (let b = 0; b < 2; b++) v += R[2 * (i & 1) + a] * K[(bi + a) * n + bj + b] * R[2 * (j & 1) + b];
            kMax = Math.max(kMax, Math.abs(K[i * n + j]));
            err = Math.max(err, Math.abs(v - Kr[i * n + j]));
          }
        }
        expect(err / kMax).toBeLessThan(1e-12);
      }),
      { numRuns: 50 },
    );
  });
});
