import type { PlateGeometry } from '../../src/geometry/index.js';
import type { Mesh } from '../../src/mesh/index.js';
import { closestOnCurve } from '../../src/geometry/index.js';

/**
 * Smallest angle a Delaunay refinement with concentric shells can be forced to leave between the
 * two sides of an input corner of angle φ: arctan(sin φ / (2 − cos φ)) (Shewchuk, "Delaunay
 * refinement algorithms for triangular mesh generation", Comput. Geom. 22, 2002 — from memory).
 */
export function forcedAngleDeg(phiDeg: number): number {
  const phi = (phiDeg * Math.PI) / 180;
  return (Math.atan(Math.sin(phi) / (2 - Math.cos(phi))) * 180) / Math.PI;
}

/**
 * The angle rule, checked per element: elements touching a corner sharper than 60° are
 * exempt; elements spanning such a corner (a vertex on each of its two pieces) must keep the
 * angle the corner forces (minus 0.5° for rounding of shell radii); all others ≥ `bound`.
 * Returns the worst margin (min over elements of angle − required angle), ≥ 0 when it holds.
 */
export function angleRuleMargin(mesh: Mesh, geom: PlateGeometry, bound = 25): number {
  const tol = 1e-9 * geom.scale;
  const sharp = geom.corners.filter((c) => c.interiorAngleDeg < 60);
  const { xy, elemNodes: en, nodesPerElem: npe } = mesh;
  const nV = mesh.nVertices;
  const touching = new Uint8Array(nV);
  // bit k·2 / k·2+1: vertex lies on corner k's incoming / outgoing piece
  const onSide: number[][] = Array.from({ length: nV }, () => []);
  sharp.forEach((c, k) => {
    for (let n = 0; n < nV; n++) {
      const p: [number, number] = [xy[2 * n], xy[2 * n + 1]];
      if (Math.hypot(p[0] - c.at[0], p[1] - c.at[1]) <= tol) touching[n] = 1;
      if (closestOnCurve(geom.pieces[c.pieceIn].curve, p).distance <= tol) onSide[n].push(2 * k);
      if (closestOnCurve(geom.pieces[c.pieceOut].curve, p).distance <= tol) onSide[n].push(2 * k + 1);
    }
  });
  let margin = Infinity;
  for (let e = 0; e < en.length / npe; e++) {
    const v = [en[npe * e], en[npe * e + 1], en[npe * e + 2]];
    if (v.some((n) => touching[n])) continue;
    let need = bound;
    sharp.forEach((c, k) => {
      const sides = new Set(v.flatMap((n) => onSide[n]));
      if (sides.has(2 * k) && sides.has(2 * k + 1)) need = Math.min(need, forcedAngleDeg(c.interiorAngleDeg) - 0.5);
    });
    margin = Math.min(margin, elementMinAngle(xy, v) - need);
  }
  return margin;
}

function elementMinAngle(xy: Float64Array, v: number[]): number {
  let minDeg = 180;
  for (let k = 0; k < 3; k++) {
    const a = v[k], b = v[(k + 1) % 3], c = v[(k + 2) % 3];
    const ux = xy[2 * b] - xy[2 * a], uy = xy[2 * b + 1] - xy[2 * a + 1];
    const wx = xy[2 * c] - xy[2 * a], wy = xy[2 * c + 1] - xy[2 * a + 1];
    minDeg = Math.min(minDeg, (Math.atan2(Math.abs(ux * wy - uy * wx), ux * wx + uy * wy) * 180) / Math.PI);
  }
  return minDeg;
}

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
