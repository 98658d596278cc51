/**
 * Resampling a nodal field for drawing: how many mesh triangles a window holds, and the field
 * sampled on a regular grid of triangles when the mesh is too fine to draw triangle by triangle.
 * Pure arithmetic on the mesh arrays; nothing here writes SVG.
 */
import type { Mesh } from '../mesh/types.js';
import { type Box, linearTriangles, triangleMeetsBox } from './draw.js';

/** Linear triangles (of `tri`) whose bounding box meets the window. */
export function countInWindow(xy: Float64Array, tri: Uint32Array, box: Box): number {
  const nTri = tri.length / 3;
  let count = 0;
  for (let t = 0; t < nTri; t++) if (triangleMeetsBox(xy, tri, t, box)) count++;
  return count;
}

/** A field sampled on the nodes of a regular (nx + 1) × (ny + 1) grid; NaN where no value. */
export interface GridSamples {
  nx: number;
  ny: number;
  /** grid spacing in x and y (model length units) */
  gx: number;
  gy: number;
  /** value at grid node (i, j) is v[j·(nx + 1) + i] */
  v: Float64Array;
}

/** Grid node values by linear interpolation in the linear triangle that holds them (NaN outside). */
function sampleInTriangles(xy: Float64Array, tri: Uint32Array, values: Float64Array, box: Box, nx: number, ny: number): GridSamples {
  const gx = (box.maxX - box.minX) / nx, gy = (box.maxY - box.minY) / ny;
  const stride = nx + 1;
  const v = new Float64Array((nx + 1) * (ny + 1)).fill(NaN);
  const nTri = tri.length / 3;
  for (let t = 0; t < nTri; t++) {
    const a = tri[3 * t], b = tri[3 * t + 1], c = tri[3 * t + 2];
    const xa = xy[2 * a], xb = xy[2 * b], xc = xy[2 * c], ya = xy[2 * a + 1], yb = xy[2 * b + 1], yc = xy[2 * c + 1];
    const i0 = Math.max(0, Math.ceil((Math.min(xa, xb, xc) - box.minX) / gx));
    const i1 = Math.min(nx, Math.floor((Math.max(xa, xb, xc) - box.minX) / gx));
    if (i0 > i1) continue;
    const j0 = Math.max(0, Math.ceil((Math.min(ya, yb, yc) - box.minY) / gy));
    const j1 = Math.min(ny, Math.floor((Math.max(ya, yb, yc) - box.minY) / gy));
    if (j0 > j1) continue;
    const det = (xb - xa) * (yc - ya) - (xc - xa) * (yb - ya);
    if (det === 0) continue;
    const va = values[a], vb = values[b], vc = values[c];
    const tol = -1e-9;
    for (let j = j0; j <= j1; j++) {
      const y = box.minY + j * gy;
      for (let i = i0; i <= i1; i++) {
        const x = box.minX + i * gx;
        const la = ((xb - x) * (yc - y) - (xc - x) * (yb - y)) / det;
        const lb = ((xc - x) * (ya - y) - (xa - x) * (yc - y)) / det;
        const lc = 1 - la - lb;
        if (la < tol || lb < tol || lc < tol) continue;
        v[j * stride + i] = la * va + lb * vb + lc * vc;
      }
    }
  }
  return { nx, ny, gx, gy, v };
}

/**
 * One pass that gives each empty grid node next to sampled ones the mean of its sampled
 * neighbours; returns the filled copy.
 */
function fillBorderOnce(g: GridSamples): Float64Array {
  const { nx, ny, v } = g;
  const stride = nx + 1;
  const filled = v.slice();
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      if (!Number.isNaN(v[j * stride + i])) continue;
      let sum = 0, count = 0;
      for (let dj = -1; dj <= 1; dj++) {
        for (let di = -1; di <= 1; di++) {
          const ii = i + di, jj = j + dj;
          if (ii < 0 || jj < 0 || ii > nx || jj > ny) continue;
          const w = v[jj * stride + ii];
          if (!Number.isNaN(w)) {
            sum += w;
            count++;
          }
        }
      }
      if (count > 0) filled[j * stride + i] = sum / count;
    }
  }
  return filled;
}

/**
 * The field sampled on a regular grid over the window: grid node values by linear
 * interpolation in the mesh triangle that holds them (NaN outside the plate), then two
 * passes that give nodes just outside the plate the mean of their sampled neighbours, so grid
 * cells cut by the boundary are filled up to the boundary clip.
 */
export function resampleTriangles(
  xy: Float64Array, tri: Uint32Array, values: Float64Array, box: Box, nx: number, ny: number,
): GridSamples {
  const g = sampleInTriangles(xy, tri, values, box, nx, ny);
  for (let pass = 0; pass < 2; pass++) g.v.set(fillBorderOnce(g));
  return g;
}

/** `resampleTriangles` over the linear triangles of a mesh. */
export function resampleOnGrid(
  mesh: Mesh, values: Float64Array, box: Box, nx: number, ny: number,
): { gx: number; gy: number; v: Float64Array } {
  const { gx, gy, v } = resampleTriangles(mesh.xy, linearTriangles(mesh), values, box, nx, ny);
  return { gx, gy, v };
}

/** Grid cells for a budget of drawn triangles (two per cell), shaped like the window. */
export function gridForBudget(box: Box, budget: number): { nx: number; ny: number } {
  const dx = box.maxX - box.minX, dy = box.maxY - box.minY;
  const cells = Math.max(1, Math.floor(budget / 2));
  const nx = Math.max(1, Math.round(Math.sqrt((cells * dx) / dy)));
  const ny = Math.max(1, Math.floor(cells / nx));
  return { nx, ny };
}
