import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { SolveError } from '../errors.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { Mesh } from '../mesh/types.js';
import type { Support } from '../model/types.js';
import { selectBoundary } from './selectors.js';

/** 1 at every dof fixed by a support (dof 2n = u_x of node n, 2n + 1 = u_y) */
export function supportedDofs(
  mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride' | 'boundaryPiece'>,
  geom: Pick<PlateGeometry, 'pieces' | 'loops' | 'scale'>,
  supports: readonly Support[],
): Uint8Array {
  const fixed = new Uint8Array(mesh.xy.length);
  supports.forEach((s, i) => {
    const keyPath = s.keyPath || `supports[${i}]`;
    const { nodes } = selectBoundary(mesh, geom, s.where, `${keyPath}.where`);
    for (let k = 0; k < nodes.length; k++) {
      if (s.fix.x) fixed[2 * nodes[k]] = 1;
      if (s.fix.y) fixed[2 * nodes[k] + 1] = 1;
    }
  });
  return fixed;
}

function fmt(v: number): string {
  return String(Number(v.toPrecision(6)) + 0);
}

/**
 * Throws a SolveError, in words, if the fixed dofs leave a rigid-body motion free.
 * The three rigid modes of the plane (translation x, translation y, rotation about the node
 * centroid, the rotation scaled by the model size) restricted to the fixed dofs must have
 * rank 3; a rank deficit names the free motion: a translation, or a rotation about the point
 * that does not move.
 */
export function checkRigidRestraint(xy: Float64Array, fixed: Uint8Array, scale: number): void {
  const nNodes = xy.length / 2;
  let xc = 0;
  let yc = 0;
  for (let n = 0; n < nNodes; n++) {
    xc += xy[2 * n];
    yc += xy[2 * n + 1];
  }
  xc /= nNodes;
  yc /= nNodes;
  const L = scale > 0 ? scale : 1;
  // Gram matrix G = RᵀR of the rows r = [1, 0, −(y − yc)/L] (u_x fixed), [0, 1, (x − xc)/L] (u_y fixed)
  let gxx = 0, gyy = 0, gxr = 0, gyr = 0, grr = 0;
  let xMin = Infinity, xMax = -Infinity, yMin = Infinity, yMax = -Infinity;
  for (let n = 0; n < nNodes; n++) {
    const x = xy[2 * n];
    const y = xy[2 * n + 1];
    if (fixed[2 * n]) {
      const r = -(y - yc) / L;
      gxx += 1;
      gxr += r;
      grr += r * r;
      yMin = Math.min(yMin, y);
      yMax = Math.max(yMax, y);
    }
    if (fixed[2 * n + 1]) {
      const r = (x - xc) / L;
      gyy += 1;
      gyr += r;
      grr += r * r;
      xMin = Math.min(xMin, x);
      xMax = Math.max(xMax, x);
    }
  }
  const spread = 1e-9 * L;
  if (gxx === 0 && gyy === 0) {
    throw new SolveError(
      'the plate is not supported: it is free to move in x and in y and to rotate (no support fixes any displacement); add supports',
      'supports',
    );
  }
  if (gxx === 0) {
    const alsoRotates = xMax - xMin <= spread ? `, and free to rotate about a point of the line x = ${fmt(xMin)}` : '';
    throw new SolveError(`the plate is free to move in x (no support fixes x)${alsoRotates}; add a support that fixes x`, 'supports');
  }
  if (gyy === 0) {
    const alsoRotates = yMax - yMin <= spread ? `, and free to rotate about a point of the line y = ${fmt(yMin)}` : '';
    throw new SolveError(`the plate is free to move in y (no support fixes y)${alsoRotates}; add a support that fixes y`, 'supports');
  }
  const G = new Matrix([
    [gxx, 0, gxr],
    [0, gyy, gyr],
    [gxr, gyr, grr],
  ]);
  const eig = new EigenvalueDecomposition(G, { assumeSymmetric: true });
  const lambda = eig.realEigenvalues;
  let kMin = 0;
  for (let k = 1; k < 3; k++) if (lambda[k] < lambda[kMin]) kMin = k;
  const trace = gxx + gyy + grr;
  if (lambda[kMin] > 1e-12 * trace) return;
  const V = eig.eigenvectorMatrix;
  const a = V.get(0, kMin);
  const b = V.get(1, kMin);
  const omega = V.get(2, kMin) / L;
  // u = a − ω (y − yc), v = b + ω (x − xc) vanishes at the centre of rotation
  // round away the noise of the eigenvector so a pin at the origin prints as (0, 0)
  const snap = (v: number): number => Math.round(v / (1e-9 * L)) * (1e-9 * L);
  const px = snap(xc - b / omega);
  const py = snap(yc + a / omega);
  throw new SolveError(
    `the plate is free to rotate about (${fmt(px)}, ${fmt(py)}): the supports fix x and y but cannot stop a rotation (all fixes act through that point); add a support away from it`,
    'supports',
  );
}
