import { FemError } from '../errors.js';
import type { Mesh } from '../mesh/types.js';
import { edgeTractionLoad } from './edge-load.js';

/**
 * Pin force on a hole (issue 9), the usual idealisation of a pin-loaded lug (common practice,
 * no single source): the pin presses on the half of the hole facing the force with a cosine
 * distribution p(θ) = p₀ cos(θ − θ_F) for |θ − θ_F| ≤ 90°, zero elsewhere, θ measured at the
 * hole's centroid and θ_F the direction of the force F the pin applies to the plate.
 *
 * The nodal forces are the consistent ones of the traction −p·n (n the outward normal of the
 * material, pointing into the hole), for p₀ = 1; they are then scaled by |F|/|R| and turned by
 * the small angle between R and F, where R is their sum, so that their resultant is exactly F
 * (to round-off) whatever the mesh — the discrete chords of a coarse hole would otherwise lose a
 * few per cent. For a circle of radius a, p₀ = 2|F|/(π a t) in the limit.
 */
export function pinForceLoad(
  mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride'>,
  edges: ArrayLike<number>,
  thickness: number,
  force: readonly [number, number],
  keyPath = 'loads',
  out: Float64Array = new Float64Array(mesh.xy.length),
): Float64Array {
  const F = Math.hypot(force[0], force[1]);
  if (!(F > 0)) throw new FemError('a pin force needs a direction; got [0, 0]', keyPath);
  const [cx, cy] = edgeCentroid(mesh, edges);
  const ux = force[0] / F;
  const uy = force[1] / F;
  const own = edgeTractionLoad(mesh, edges, thickness, (x, y, nx, ny) => {
    const rx = x - cx;
    const ry = y - cy;
    const r = Math.hypot(rx, ry);
    const c = r > 0 ? (rx * ux + ry * uy) / r : 0; // cos(θ − θ_F)
    const p = c > 0 ? c : 0;
    return [-p * nx, -p * ny];
  });
  let Rx = 0;
  let Ry = 0;
  for (let i = 0; i < own.length; i += 2) {
    Rx += own[i];
    Ry += own[i + 1];
  }
  const R = Math.hypot(Rx, Ry);
  if (!(R > 1e-12 * thickness * Math.sqrt(edgeLengthSquared(mesh, edges)))) {
    throw new FemError('the pin pressure on this opening sums to no force (is the opening a closed hole?)', keyPath);
  }
  // rotation taking R onto F, and scale |F|/|R|: the complex factor F/R
  const k = F / R;
  const cos = k * (Rx * force[0] + Ry * force[1]) / (R * F);
  const sin = k * (Rx * force[1] - Ry * force[0]) / (R * F);
  for (let i = 0; i < own.length; i += 2) {
    const fx = own[i];
    const fy = own[i + 1];
    if (fx === 0 && fy === 0) continue;
    out[i] += cos * fx - sin * fy;
    out[i + 1] += sin * fx + cos * fy;
  }
  return out;
}

/** Area centroid of the region bounded by the edges' chords (Green's theorem; edges in travel order or not). */
function edgeCentroid(mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride'>, edges: ArrayLike<number>): [number, number] {
  const { xy, boundaryEdges } = mesh;
  const stride = mesh.edgeStride;
  let a2 = 0, sx = 0, sy = 0, mx = 0, my = 0, n = 0;
  for (let k = 0; k < edges.length; k++) {
    const a = boundaryEdges[stride * edges[k]];
    const b = boundaryEdges[stride * edges[k] + 1];
    mx += xy[2 * a];
    my += xy[2 * a + 1];
    n++;
  }
  mx /= n;
  my /= n;
  for (let k = 0; k < edges.length; k++) {
    const a = boundaryEdges[stride * edges[k]];
    const b = boundaryEdges[stride * edges[k] + 1];
    const xa = xy[2 * a] - mx, ya = xy[2 * a + 1] - my;
    const xb = xy[2 * b] - mx, yb = xy[2 * b + 1] - my;
    const c = xa * yb - xb * ya;
    a2 += c;
    sx += (xa + xb) * c;
    sy += (ya + yb) * c;
  }
  if (a2 === 0) return [mx, my];
  return [mx + sx / (3 * a2), my + sy / (3 * a2)];
}

function edgeLengthSquared(mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride'>, edges: ArrayLike<number>): number {
  let L = 0;
  for (let k = 0; k < edges.length; k++) {
    const a = mesh.boundaryEdges[mesh.edgeStride * edges[k]];
    const b = mesh.boundaryEdges[mesh.edgeStride * edges[k] + 1];
    L += Math.hypot(mesh.xy[2 * b] - mesh.xy[2 * a], mesh.xy[2 * b + 1] - mesh.xy[2 * a + 1]);
  }
  return L * L;
}
