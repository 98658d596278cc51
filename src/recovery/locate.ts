import type { Mesh } from '../mesh/types.js';
import { shapeFunctions } from '../element/index.js';
import { ElementScratch, inverseMap } from './element.js';
import type { NodalStress } from './types.js';
import { checkField, checkMesh } from './validate.js';

/** Where a point lies in a mesh: the element and the reference coordinates (ξ, η) inside it. */
export interface PointHit {
  elem: number;
  xi: number;
  eta: number;
}

export interface PointLocator {
  /** the element containing (x, y), or null outside the mesh */
  locate(x: number, y: number): PointHit | null;
}

/** Points this far outside an element (in reference coordinates) still count as inside. */
const INSIDE_TOL = 1e-9;

/** A cell listing more elements than this gets a grid of its own (graded meshes crowd a few cells). */
const CELL_ITEMS = 12;
/** Nesting depth of those grids; each level splits a crowded cell about √(count/2) ways per axis. */
const MAX_DEPTH = 6;

/**
 * Buckets over a rectangle: a uniform nx × ny grid, each cell listing (ascending) the elements whose node
 * bounding box overlaps it, and a crowded cell holding a finer grid of its own over the same elements.
 */
interface BucketGrid {
  x0: number;
  y0: number;
  cx: number;
  cy: number;
  nx: number;
  ny: number;
  start: Int32Array;
  items: Int32Array;
  /** the finer grid of cell c, for crowded cells */
  inner: (BucketGrid | undefined)[] | undefined;
}

function cellOf(v: number, v0: number, c: number, n: number): number {
  return Math.min(n - 1, Math.max(0, Math.floor((v - v0) / c)));
}

/**
 * The grid over [x0, x0 + w] × [y0, y0 + h] of the elements `elems` (ascending), with `box` the node bounding
 * box of every element (x min, x max, y min, y max); about two elements a cell, crowded cells nested.
 */
function bucketGrid(elems: Int32Array, box: Float64Array, x0: number, y0: number, w: number, h: number, depth: number): BucketGrid {
  const cells = Math.max(1, Math.ceil(elems.length / 2));
  const cell = Math.sqrt((w * h) / cells) || Math.max(w, h);
  const nx = Math.max(1, Math.min(4096, Math.ceil(w / cell)));
  const ny = Math.max(1, Math.min(4096, Math.ceil(h / cell)));
  const cx = w / nx;
  const cy = h / ny;
  const span = new Int32Array(4 * elems.length);
  const start = new Int32Array(nx * ny + 1);
  for (let q = 0; q < elems.length; q++) {
    const b = 4 * elems[q];
    const i0 = cellOf(box[b], x0, cx, nx), i1 = cellOf(box[b + 1], x0, cx, nx);
    const j0 = cellOf(box[b + 2], y0, cy, ny), j1 = cellOf(box[b + 3], y0, cy, ny);
    span[4 * q] = i0; span[4 * q + 1] = i1; span[4 * q + 2] = j0; span[4 * q + 3] = j1;
    for (let j = j0; j <= j1; j++) for (let i = i0; i <= i1; i++) start[j * nx + i + 1]++;
  }
  for (let c = 0; c < nx * ny; c++) start[c + 1] += start[c];
  const fill = start.slice(0, nx * ny);
  const items = new Int32Array(start[nx * ny]);
  for (let q = 0; q < elems.length; q++) {
    for (let j = span[4 * q + 2]; j <= span[4 * q + 3]; j++) {
      for (let i = span[4 * q]; i <= span[4 * q + 1]; i++) items[fill[j * nx + i]++] = elems[q];
    }
  }
  let inner: (BucketGrid | undefined)[] | undefined;
  if (depth < MAX_DEPTH) {
    for (let c = 0; c < nx * ny; c++) {
      const count = start[c + 1] - start[c];
      // a cell no larger than its parent's share cannot split its elements further
      if (count <= CELL_ITEMS || count >= elems.length) continue;
      inner ??= new Array<BucketGrid | undefined>(nx * ny);
      const i = c % nx, j = (c - i) / nx;
      inner[c] = bucketGrid(items.subarray(start[c], start[c + 1]), box, x0 + i * cx, y0 + j * cy, cx, cy, depth + 1);
    }
  }
  return { x0, y0, cx, cy, nx, ny, start, items, inner };
}

/**
 * A grid of buckets over the mesh's bounding box, each listing the elements whose node bounding box overlaps
 * it (about two elements per bucket, a crowded bucket nested into a finer grid, so a mesh graded 30-fold
 * towards a corner still leaves a few elements per bucket). Built once, then each query tests the few
 * elements of one bucket with the inverse isoparametric map, so curved LST edges are honoured. The elements
 * of a bucket are tried in ascending order, so the element found is the lowest-numbered one containing the
 * point, whatever the nesting.
 */
export function buildPointLocator(mesh: Mesh): PointLocator {
  const nElem = checkMesh(mesh);
  const npe = mesh.nodesPerElem;
  const { xy, elemNodes } = mesh;
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (let n = 0; n < xy.length; n += 2) {
    minX = Math.min(minX, xy[n]);
    maxX = Math.max(maxX, xy[n]);
    minY = Math.min(minY, xy[n + 1]);
    maxY = Math.max(maxY, xy[n + 1]);
  }
  const w = Math.max(maxX - minX, 1e-300);
  const h = Math.max(maxY - minY, 1e-300);
  const box = new Float64Array(4 * nElem);
  for (let e = 0; e < nElem; e++) {
    let x0 = Infinity;
    let x1 = -Infinity;
    let y0 = Infinity;
    let y1 = -Infinity;
    for (let i = 0; i < npe; i++) {
      const n = elemNodes[npe * e + i];
      x0 = Math.min(x0, xy[2 * n]);
      x1 = Math.max(x1, xy[2 * n]);
      y0 = Math.min(y0, xy[2 * n + 1]);
      y1 = Math.max(y1, xy[2 * n + 1]);
    }
    box[4 * e] = x0; box[4 * e + 1] = x1; box[4 * e + 2] = y0; box[4 * e + 3] = y1;
  }
  const all = new Int32Array(nElem);
  for (let e = 0; e < nElem; e++) all[e] = e;
  const top = bucketGrid(all, box, minX, minY, w, h, 0);
  const scratch = new ElementScratch(npe);
  const ref = new Float64Array(2);
  return {
    locate(x: number, y: number): PointHit | null {
      if (!(x >= minX - 1e-12 * w && x <= maxX + 1e-12 * w && y >= minY - 1e-12 * h && y <= maxY + 1e-12 * h)) return null;
      let g = top;
      let c = cellOf(y, g.y0, g.cy, g.ny) * g.nx + cellOf(x, g.x0, g.cx, g.nx);
      for (let sub = g.inner?.[c]; sub; sub = g.inner?.[c]) {
        g = sub;
        c = cellOf(y, g.y0, g.cy, g.ny) * g.nx + cellOf(x, g.x0, g.cx, g.nx);
      }
      let best: PointHit | null = null;
      let bestOut = INSIDE_TOL;
      for (let q = g.start[c]; q < g.start[c + 1]; q++) {
        const e = g.items[q];
        scratch.load(mesh, e);
        if (!inverseMap(scratch, x, y, ref)) continue;
        const xi = ref[0];
        const eta = ref[1];
        const outside = Math.max(-xi, -eta, xi + eta - 1);
        if (outside <= 0) return { elem: e, xi, eta };
        if (outside <= bestOut) {
          bestOut = outside;
          best = { elem: e, xi: Math.max(0, xi), eta: Math.max(0, eta) };
        }
      }
      return best;
    },
  };
}

const locatorCache = new WeakMap<Mesh, PointLocator>();

/** Recovered stress at a point, interpolated with the shape functions of the element there. */
export interface PointStress {
  sxx: number;
  syy: number;
  sxy: number;
  szz: number;
  elem: number;
}

/**
 * The recovered field at (x, y), or null outside the mesh. Pass a locator from
 * `buildPointLocator` when querying many points; otherwise one is built and cached per mesh.
 */
export function stressAt(
  mesh: Mesh,
  field: Pick<NodalStress, 'stress' | 'szz'>,
  x: number,
  y: number,
  locator?: PointLocator,
): PointStress | null {
  checkField(mesh, field);
  let loc = locator ?? locatorCache.get(mesh);
  if (!loc) {
    loc = buildPointLocator(mesh);
    locatorCache.set(mesh, loc);
  }
  const hit = loc.locate(x, y);
  if (!hit) return null;
  const npe = mesh.nodesPerElem;
  const N = new Float64Array(npe);
  shapeFunctions(npe, hit.xi, hit.eta, N);
  const r: PointStress = { sxx: 0, syy: 0, sxy: 0, szz: 0, elem: hit.elem };
  for (let i = 0; i < npe; i++) {
    const n = mesh.elemNodes[npe * hit.elem + i];
    r.sxx += N[i] * field.stress[3 * n];
    r.syy += N[i] * field.stress[3 * n + 1];
    r.sxy += N[i] * field.stress[3 * n + 2];
    r.szz += N[i] * field.szz[n];
  }
  return r;
}
