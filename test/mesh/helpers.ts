import type { PlateGeometry } from '../../src/geometry/index.js';
import type { Mesh } from '../../src/mesh/index.js';

/**
 * Smallest corner angle (degrees) over the elements that do not touch an input corner sharper
 * than 60° — the triangles the quality bound of the mesh issue applies to.
 */
export function minAngleAwayFromSharpCorners(mesh: Mesh, geom: PlateGeometry): number {
  const tol = 1e-9 * geom.scale;
  const sharp = geom.corners.filter((c) => c.interiorAngleDeg < 60).map((c) => c.at);
  const { xy, elemNodes: en, nodesPerElem: npe } = mesh;
  const isSharp = new Uint8Array(mesh.nVertices);
  for (let n = 0; n < mesh.nVertices; n++) {
    for (const p of sharp) if (Math.hypot(xy[2 * n] - p[0], xy[2 * n + 1] - p[1]) <= tol) isSharp[n] = 1;
  }
  let minDeg = 180;
  for (let e = 0; e < en.length / npe; e++) {
    const v = [en[npe * e], en[npe * e + 1], en[npe * e + 2]];
    if (v.some((n) => isSharp[n])) continue;
    for (let k = 0; k < 3; k++) {
      const a = v[k], b = v[(k + 1) % 3], c = v[(k + 2) % 3];
      const ux = xy[2 * b] - xy[2 * a], uy = xy[2 * b + 1] - xy[2 * a + 1];
      const wx = xy[2 * c] - xy[2 * a], wy = xy[2 * c + 1] - xy[2 * a + 1];
      const ang = (Math.atan2(Math.abs(ux * wy - uy * wx), ux * wx + uy * wy) * 180) / Math.PI;
      if (ang < minDeg) minDeg = ang;
    }
  }
  return minDeg;
}

/**
 * Upper bound on |polygon area − exact area| from replacing every curved piece by chords that
 * subtend at most θ: a circular segment of angle θ has area R²(θ − sin θ)/2 ≤ R²θ³/12, and there
 * are |sweep|/θ of them, so the piece contributes ≤ ρmax²·|sweep|·θ²/12 (elementary geometry).
 */
export function chordAreaBound(geom: PlateGeometry, theta = 0.2): number {
  let s = 0;
  for (const p of geom.pieces) {
    const c = p.curve;
    if (c.kind === 'arc') s += (c.radius ** 2 * Math.abs(c.sweep) * theta ** 2) / 12;
    else if (c.kind === 'ellipse-arc') {
      const rhoMax = Math.max(c.a, c.b) ** 2 / Math.min(c.a, c.b);
      s += (rhoMax ** 2 * Math.abs(c.sweep) * theta ** 2) / 12;
    }
  }
  return s;
}
