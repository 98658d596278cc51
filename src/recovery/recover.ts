import type { ElasticSection, GaussStresses } from '../fem/types.js';
import type { Mesh } from '../mesh/types.js';
import { cornerArea } from './element.js';
import { fitElementFields, evalElementField } from './element-fit.js';
import { boundaryNodeFlags, buildNodeElements, type NodeElements } from './topology.js';
import type { NodalStress } from './types.js';
import { checkGauss, checkSection } from './validate.js';

/**
 * Nodal σzz recovered from the Gauss-point σzz (`gauss.szz`) by the same recovery as the in-plane
 * components. The recovery is linear, so it is split: the plane-strain part ν(σxx + σyy) comes from the
 * recovered in-plane stresses (as before there was a Gauss σzz, bit for bit), and the rest of the Gauss
 * σzz — −EαΔT of a temperature load, or the whole σzz of a section whose σzz is not ν(σxx + σyy) —
 * is recovered on its own and added. Without a remainder nothing is added.
 */
function outOfPlane(
  stress: Float64Array, gauss: GaussStresses, section: ElasticSection,
  recover: (g: GaussStresses) => NodalStress,
): Float64Array {
  const n = stress.length / 3;
  const szz = new Float64Array(n);
  const planeStrain = section.state === 'plane-strain';
  if (planeStrain) {
    for (let i = 0; i < n; i++) szz[i] = section.nu * (stress[3 * i] + stress[3 * i + 1]);
  }
  const nPts = gauss.weight.length;
  let rest: Float64Array | undefined;
  for (let k = 0; k < nPts; k++) {
    const base = planeStrain ? section.nu * (gauss.stress[3 * k] + gauss.stress[3 * k + 1]) : 0;
    const r = gauss.szz[k] - base;
    if (r === 0) continue;
    // the remainder as the σxx of a stand-in field, recovered by the same method
    rest ??= new Float64Array(3 * nPts);
    rest[3 * k] = r;
  }
  if (rest) {
    const part = recover({ nGauss: gauss.nGauss, xy: gauss.xy, weight: gauss.weight, stress: rest, szz: new Float64Array(nPts) });
    for (let i = 0; i < n; i++) szz[i] += part.stress[3 * i];
  }
  return szz;
}

/** The section a stand-in field is recovered with: plane stress, so its own σzz stays 0. */
const standIn = (section: ElasticSection): ElasticSection => ({ ...section, state: 'plane-stress' });

/**
 * Nodal stresses by area-weighted averaging of the element values at each node. CST: the
 * element's constant stress. LST: the linear field through the element's Gauss points,
 * extrapolated to its six nodes first (the raw element stress at a node, not the Gauss value).
 */
export function recoverAverage(mesh: Mesh, gauss: GaussStresses, section: ElasticSection): NodalStress {
  const nElem = checkGauss(mesh, gauss);
  checkSection(section);
  const npe = mesh.nodesPerElem;
  const nNodes = mesh.xy.length >> 1;
  const fields = fitElementFields(gauss, nElem);
  const sum = new Float64Array(3 * nNodes);
  const wsum = new Float64Array(nNodes);
  const s = new Float64Array(3);
  for (let e = 0; e < nElem; e++) {
    const area = Math.abs(cornerArea(mesh, e));
    for (let i = 0; i < npe; i++) {
      const n = mesh.elemNodes[npe * e + i];
      evalElementField(fields, e, mesh.xy[2 * n], mesh.xy[2 * n + 1], s);
      sum[3 * n] += area * s[0];
      sum[3 * n + 1] += area * s[1];
      sum[3 * n + 2] += area * s[2];
      wsum[n] += area;
    }
  }
  for (let n = 0; n < nNodes; n++) {
    if (wsum[n] > 0) {
      sum[3 * n] /= wsum[n];
      sum[3 * n + 1] /= wsum[n];
      sum[3 * n + 2] /= wsum[n];
    }
  }
  return { stress: sum, szz: outOfPlane(sum, gauss, section, (g) => recoverAverage(mesh, g, standIn(section))), method: 'average' };
}

/** Relative pivot below which a patch's normal matrix counts as rank-deficient. */
const PIVOT_TOL = 1e-10;
/** How many times a patch may grow by one ring of elements before giving up. */
const MAX_GROWTH = 4;

/** Monomials of degree ≤ p in the scaled patch coordinates (ξ, η). */
function monomials(p: 1 | 2, xi: number, eta: number, P: Float64Array): void {
  P[0] = 1;
  P[1] = xi;
  P[2] = eta;
  if (p === 2) {
    P[3] = xi * xi;
    P[4] = xi * eta;
    P[5] = eta * eta;
  }
}

class PatchFitter {
  readonly nTerms: number;
  private readonly A: Float64Array;
  private readonly B: Float64Array;
  private readonly P: Float64Array;
  private readonly stamp: Int32Array;
  private tick = 0;
  private list: number[] = [];

  constructor(
    private readonly mesh: Mesh,
    private readonly gauss: GaussStresses,
    private readonly n2e: NodeElements,
    readonly p: 1 | 2,
    nElem: number,
  ) {
    this.nTerms = p === 1 ? 3 : 6;
    this.A = new Float64Array(this.nTerms * this.nTerms);
    this.B = new Float64Array(this.nTerms * 3);
    this.P = new Float64Array(this.nTerms);
    this.stamp = new Int32Array(nElem);
  }

  /**
   * Least-squares fit of σ* = P(ξ, η)·a to the sampling points of the elements around `node`,
   * with ξ = (x − x0)/scale, η = (y − y0)/scale centred on the node. Starts from the elements
   * containing the node, grown by rings of neighbours `minGrowth` times and further until the
   * normal matrix has full rank. Writes a (3 components × nTerms) into coef at `offset`;
   * returns the scale, or 0 when no fit was possible.
   */
  fit(node: number, minGrowth: number, coef: Float64Array, offset: number): number {
    const { mesh, n2e, stamp } = this;
    const npe = mesh.nodesPerElem;
    const tick = ++this.tick;
    const list = this.list;
    list.length = 0;
    for (let q = n2e.start[node]; q < n2e.start[node + 1]; q++) {
      const e = n2e.elems[q];
      if (stamp[e] !== tick) {
        stamp[e] = tick;
        list.push(e);
      }
    }
    let grown = true;
    for (let growth = 0; growth <= MAX_GROWTH + minGrowth; growth++) {
      if (growth >= minGrowth || !grown) {
        const scale = this.solve(node, coef, offset, this.nTerms);
        if (scale > 0) return scale;
        if (!grown) break;
      }
      // grow by one ring: every element sharing a node with the current patch
      const before = list.length;
      for (let j = 0; j < before; j++) {
        const e = list[j];
        for (let i = 0; i < npe; i++) {
          const n = mesh.elemNodes[npe * e + i];
          for (let q = n2e.start[n]; q < n2e.start[n + 1]; q++) {
            const f = n2e.elems[q];
            if (stamp[f] !== tick) {
              stamp[f] = tick;
              list.push(f);
            }
          }
        }
      }
      grown = list.length > before;
    }
    // the whole reachable patch cannot determine a quadratic (e.g. a two-element LST mesh):
    // fall back to the linear polynomial, which still reproduces the LST's own stress field
    return this.nTerms > 3 ? this.solve(node, coef, offset, 3) : 0;
  }

  private solve(node: number, coef: Float64Array, offset: number, nTerms: number): number {
    const { gauss, A, B, P, list } = this;
    const stride = this.nTerms;
    for (let i = 0; i < 3 * stride; i++) coef[offset + i] = 0;
    const ng = gauss.nGauss;
    const x0 = this.mesh.xy[2 * node];
    const y0 = this.mesh.xy[2 * node + 1];
    if (list.length * ng < nTerms) return 0;
    let scale = 0;
    for (const e of list) {
      for (let g = 0; g < ng; g++) {
        const k = ng * e + g;
        scale = Math.max(scale, Math.abs(gauss.xy[2 * k] - x0), Math.abs(gauss.xy[2 * k + 1] - y0));
      }
    }
    if (!(scale > 0)) return 0;
    A.fill(0);
    B.fill(0);
    for (const e of list) {
      for (let g = 0; g < ng; g++) {
        const k = ng * e + g;
        monomials(this.p, (gauss.xy[2 * k] - x0) / scale, (gauss.xy[2 * k + 1] - y0) / scale, P);
        const s0 = gauss.stress[3 * k];
        const s1 = gauss.stress[3 * k + 1];
        const s2 = gauss.stress[3 * k + 2];
        for (let i = 0; i < nTerms; i++) {
          const pi = P[i];
          for (let j = 0; j <= i; j++) A[nTerms * i + j] += pi * P[j];
          B[3 * i] += pi * s0;
          B[3 * i + 1] += pi * s1;
          B[3 * i + 2] += pi * s2;
        }
      }
    }
    // Cholesky A = L Lᵀ in the lower triangle; a tiny pivot means the samples cannot
    // determine every coefficient (too few or collinear points): the caller grows the patch.
    for (let j = 0; j < nTerms; j++) {
      const diag0 = A[nTerms * j + j];
      let d = diag0;
      for (let k = 0; k < j; k++) d -= A[nTerms * j + k] * A[nTerms * j + k];
      if (!(d > PIVOT_TOL * diag0)) return 0;
      const ljj = Math.sqrt(d);
      A[nTerms * j + j] = ljj;
      for (let i = j + 1; i < nTerms; i++) {
        let v = A[nTerms * i + j];
        for (let k = 0; k < j; k++) v -= A[nTerms * i + k] * A[nTerms * j + k];
        A[nTerms * i + j] = v / ljj;
      }
    }
    for (let c = 0; c < 3; c++) {
      // forward then back substitution, result into coef
      for (let i = 0; i < nTerms; i++) {
        let v = B[3 * i + c];
        for (let k = 0; k < i; k++) v -= A[nTerms * i + k] * coef[offset + c * stride + k];
        coef[offset + c * stride + i] = v / A[nTerms * i + i];
      }
      for (let i = nTerms - 1; i >= 0; i--) {
        let v = coef[offset + c * stride + i];
        for (let k = i + 1; k < nTerms; k++) v -= A[nTerms * k + i] * coef[offset + c * stride + k];
        coef[offset + c * stride + i] = v / A[nTerms * i + i];
      }
    }
    return scale;
  }
}

/**
 * Superconvergent patch recovery.
 * O. C. Zienkiewicz & J. Z. Zhu, "The superconvergent patch recovery and a posteriori error
 * estimates. Part 1: The recovery technique", IJNME 33 (1992) 1331–1364.
 *
 * For every interior vertex, one polynomial per stress component of the element's degree
 * (CST: 1, x, y sampled at the centroids; LST: complete quadratic sampled at the Gauss points)
 * is fitted by least squares over the patch of elements sharing that vertex. Nodal values:
 * - interior vertex: its own patch polynomial;
 * - boundary vertex: the polynomials of the interior vertices it shares an element with
 *   (averaged), as the paper prescribes, instead of a one-sided fit of its own;
 * - mid-side node (LST): the patches of the edge's interior end vertices; failing that, of the
 *   interior vertices of the elements containing it;
 * - a node with none of these (e.g. a corner whose only element has all vertices on the
 *   boundary): a patch of its own, grown by one ring of neighbouring elements.
 * A patch too small for its polynomial (fewer independent samples than terms) grows by rings
 * of neighbouring elements until the fit is determined; when the whole reachable mesh cannot
 * determine the quadratic (a two-element LST mesh), the patch fits a linear polynomial, and a
 * node no fit reaches at all (a lone element) takes the averaged raw stress.
 */
export function recoverSpr(mesh: Mesh, gauss: GaussStresses, section: ElasticSection): NodalStress {
  const nElem = checkGauss(mesh, gauss);
  checkSection(section);
  const npe = mesh.nodesPerElem;
  const p = mesh.order;
  const nNodes = mesh.xy.length >> 1;
  const nV = mesh.nVertices;
  const n2e = buildNodeElements(mesh);
  const onBoundary = boundaryNodeFlags(mesh);
  const fitter = new PatchFitter(mesh, gauss, n2e, p, nElem);
  const nTerms = fitter.nTerms;
  const stride = 3 * nTerms;

  // 1. patch polynomials of the interior vertices
  const patchCoef = new Float64Array(nV * stride);
  const patchScale = new Float64Array(nV);
  for (let v = 0; v < nV; v++) {
    if (onBoundary[v] || n2e.start[v + 1] === n2e.start[v]) continue;
    patchScale[v] = fitter.fit(v, 0, patchCoef, v * stride);
  }

  const P = new Float64Array(nTerms);
  const sum = new Float64Array(3 * nNodes);
  const count = new Uint32Array(nNodes);
  const addFrom = (coef: Float64Array, off: number, x0: number, y0: number, scale: number, n: number): void => {
    monomials(p, (mesh.xy[2 * n] - x0) / scale, (mesh.xy[2 * n + 1] - y0) / scale, P);
    for (let c = 0; c < 3; c++) {
      let v = 0;
      for (let i = 0; i < nTerms; i++) v += coef[off + c * nTerms + i] * P[i];
      sum[3 * n + c] += v;
    }
    count[n]++;
  };
  const addPatch = (v: number, n: number): boolean => {
    if (!(patchScale[v] > 0)) return false;
    addFrom(patchCoef, v * stride, mesh.xy[2 * v], mesh.xy[2 * v + 1], patchScale[v], n);
    return true;
  };

  // 2. vertex nodes
  const seen = new Int32Array(nV).fill(-1);
  for (let n = 0; n < nV; n++) {
    if (addPatch(n, n)) continue;
    // interior vertices sharing an element with n
    for (let q = n2e.start[n]; q < n2e.start[n + 1]; q++) {
      const e = n2e.elems[q];
      for (let i = 0; i < 3; i++) {
        const v = mesh.elemNodes[npe * e + i];
        if (v === n || seen[v] === n) continue;
        seen[v] = n;
        addPatch(v, n);
      }
    }
  }

  // 3. mid-side nodes (LST)
  if (npe === 6) {
    for (let e = 0; e < nElem; e++) {
      for (let i = 3; i < 6; i++) {
        const m = mesh.elemNodes[6 * e + i];
        if (count[m] > 0) continue;
        const a = mesh.elemNodes[6 * e + (i - 3)];
        const b = mesh.elemNodes[6 * e + ((i - 2) % 3)];
        let got = addPatch(a, m);
        got = addPatch(b, m) || got;
        if (got) continue;
        for (let q = n2e.start[m]; q < n2e.start[m + 1]; q++) {
          const f = n2e.elems[q];
          for (let j = 0; j < 3; j++) addPatch(mesh.elemNodes[6 * f + j], m);
        }
      }
    }
  }

  // 4. nodes no interior patch reaches: a patch of their own, one ring larger
  const own = new Float64Array(stride);
  for (let n = 0; n < nNodes; n++) {
    if (count[n] > 0 || n2e.start[n + 1] === n2e.start[n]) continue;
    const scale = fitter.fit(n, 1, own, 0);
    if (scale > 0) addFrom(own, 0, mesh.xy[2 * n], mesh.xy[2 * n + 1], scale, n);
  }

  // last resort (no patch anywhere can be fitted, e.g. a single element): the averaged raw field
  let fallback: NodalStress | undefined;
  for (let n = 0; n < nNodes; n++) {
    if (count[n] > 0 || n2e.start[n + 1] === n2e.start[n]) continue;
    fallback ??= recoverAverage(mesh, gauss, section);
    sum[3 * n] = fallback.stress[3 * n];
    sum[3 * n + 1] = fallback.stress[3 * n + 1];
    sum[3 * n + 2] = fallback.stress[3 * n + 2];
  }

  for (let n = 0; n < nNodes; n++) {
    const c = count[n];
    if (c > 1) {
      sum[3 * n] /= c;
      sum[3 * n + 1] /= c;
      sum[3 * n + 2] /= c;
    }
  }
  return { stress: sum, szz: outOfPlane(sum, gauss, section, (g) => recoverSpr(mesh, g, standIn(section))), method: 'spr' };
}
