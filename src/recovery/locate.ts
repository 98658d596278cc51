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

/**
 * A uniform grid of buckets over the mesh's bounding box, each listing the elements whose
 * node bounding box overlaps it (about two elements per bucket). Built once, then each query
 * tests the few elements of one bucket with the inverse isoparametric map, so curved LST edges
 * are honoured.
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
  const cells = Math.max(1, Math.ceil(nElem / 2));
  const cell = Math.sqrt((w * h) / cells) || Math.max(w, h);
  const nx = Math.max(1, Math.min(4096, Math.ceil(w / cell)));
  const ny = Math.max(1, Math.min(4096, Math.ceil(h / cell)));
  const cx = w / nx;
  const cy = h / ny;
  const ix = (x: number) => Math.min(nx - 1, Math.max(0, Math.floor((x - minX) / cx)));
  const iy = (y: number) => Math.min(ny - 1, Math.max(0, Math.floor((y - minY) / cy)));
  const box = new Int32Array(4 * nElem);
  const start = new Int32Array(nx * ny + 1);
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
    const b = [ix(x0), ix(x1), iy(y0), iy(y1)];
    box.set(b, 4 * e);
    for (let j = b[2]; j <= b[3]; j++) for (let i = b[0]; i <= b[1]; i++) start[j * nx + i + 1]++;
  }
  for (let c = 0; c < nx * ny; c++) start[c + 1] += start[c];
  const fill = start.slice(0, nx * ny);
  const items = new Int32Array(start[nx * ny]);
  for (let e = 0; e < nElem; e++) {
    for (let j = box[4 * e + 2]; j <= box[4 * e + 3]; j++) {
      for (let i = box[4 * e]; i <= box[4 * e + 1]; i++) items[fill[j * nx + i]++] = e;
    }
  }
  const scratch = new ElementScratch(npe);
  const ref = new Float64Array(2);
  return {
    locate(x: number, y: number): PointHit | null {
      if (!(x >= minX - 1e-12 * w && x <= maxX + 1e-12 * w && y >= minY - 1e-12 * h && y <= maxY + 1e-12 * h)) return null;
      const c = iy(y) * nx + ix(x);
      let best: PointHit | null = null;
      let bestOut = INSIDE_TOL;
      for (let q = start[c]; q < start[c + 1]; q++) {
        const e = items[q];
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
