/**
 * Axisymmetric solids of revolution (issue 18): the plate outline is the meridian section in
 * (r, z) = (x, y), r ≥ 0, the axis of revolution is the line r = 0, and the displacement is
 * (u_r, u_z) = (u_x, u_y) with no circumferential component and no θ dependence.
 *
 * Strains (engineering shear strain), any elasticity text, e.g. Timoshenko & Goodier, "Theory of
 * Elasticity", 3rd ed. (1970), and for the triangular ring element R. W. Clough & Y. Rashid,
 * "Finite element analysis of axi-symmetric solids", J. Eng. Mech. Div. ASCE 91 (1965):
 *
 *     εr = ∂u_r/∂r,  εz = ∂u_z/∂z,  γrz = ∂u_r/∂z + ∂u_z/∂r,  εθ = u_r / r  (the hoop strain)
 *
 * Stiffness and loads are for the **whole revolution** (2π radians): K = 2π ∫ BᵀDB r dA over the
 * section, so reactions and nodal forces are total forces (the axial reaction of a shaft is the
 * axial force it carries). docs/fem.md, "Axisymmetric sections", justifies the quadrature.
 */
import { FemError, SolveError } from '../errors.js';
import type { Mesh } from '../mesh/types.js';
import { TRI_3, TRI_7, type TriangleRule } from '../element/index.js';
import { gatherElementXY, shapeAt } from './shape.js';
import type { Load } from '../model/types.js';
import { expansionOf, temperatureField, type TemperatureField } from './thermal.js';
import type { ElasticSection, GaussStresses } from './types.js';

/** The factor of a whole revolution: integrals over the section are multiplied by 2π r. */
export const REVOLUTION = 2 * Math.PI;

/**
 * Isotropic elasticity of the axisymmetric solid, 4×4 row-major, mapping {εr, εz, γrz, εθ} to
 * {σr, σz, τrz, σθ} (Hooke's law in three dimensions restricted to the torsion-free axisymmetric
 * state): c = E/((1 + ν)(1 − 2ν)),
 *     D = c · [[1 − ν, ν, 0, ν], [ν, 1 − ν, 0, ν], [0, 0, (1 − 2ν)/2, 0], [ν, ν, 0, 1 − ν]].
 */
export function axisymmetricMatrix(section: Pick<ElasticSection, 'E' | 'nu'>): Float64Array {
  const { E, nu } = section;
  const c = E / ((1 + nu) * (1 - 2 * nu));
  const a = c * (1 - nu);
  const b = c * nu;
  return Float64Array.of(
    a, b, 0, b,
    b, a, 0, b,
    0, 0, c * (1 - 2 * nu) * 0.5, 0,
    b, b, 0, a,
  );
}

/**
 * Stiffness integration rules (all points interior, so r > 0 at every point of an element with
 * r ≥ 0 at its nodes and a positive area): CST on the 3-point degree-2 rule, LST on the 7-point
 * degree-5 rule (exact for the polynomial part r·(∂N)², degree 3, of a straight-sided LST; the
 * hoop part N_i N_j / r is rational and integrated approximately, with an error of the element's
 * own order).
 */
export const AXISYMMETRIC_RULE_CST: TriangleRule = TRI_3;
export const AXISYMMETRIC_RULE_LST: TriangleRule = TRI_7;

const scratch = {
  dx: new Float64Array(6),
  dy: new Float64Array(6),
  N: new Float64Array(6),
};

/**
 * Shape functions, their Cartesian derivatives and the radius r at reference point (ξ, η) of an
 * element with 3 or 6 nodes; returns det J. Throws when the point lies at r ≤ 0 (the element
 * reaches across the axis).
 */
function pointOf(npe: number, xy: ArrayLike<number>, xi: number, eta: number): { det: number; r: number } {
  const { dx, dy, N } = scratch;
  const det = shapeAt(npe, xy, xi, eta, N, dx, dy);
  let r = 0;
  for (let i = 0; i < npe; i++) r += N[i] * xy[2 * i];
  if (!(r > 0)) {
    throw new FemError(
      `an element with first node at (${xy[0]}, ${xy[1]}) has an integration point at r = ${r}; in an axisymmetric section the material lies at r = x ≥ 0`,
      'plate.outline',
    );
  }
  return { det, r };
}

/**
 * Adds w·BᵀDB to `ke` ((2n)², dof order u_r0, u_z0, u_r1, …) with the axisymmetric B of one point:
 * unit u_r,j → {∂N_j/∂r, 0, ∂N_j/∂z, N_j/r}; unit u_z,j → {0, ∂N_j/∂z, ∂N_j/∂r, 0}.
 */
function addAxisymmetricBtDB(n: number, r: number, D: Float64Array, w: number, ke: Float64Array): void {
  const { dx, dy, N } = scratch;
  const nd = 2 * n;
  const invR = 1 / r;
  for (let j = 0; j < n; j++) {
    const bx = dx[j];
    const by = dy[j];
    const bt = N[j] * invR;
    // D·B columns of u_r,j (s) and u_z,j (q)
    const s0 = D[0] * bx + D[2] * by + D[3] * bt;
    const s1 = D[4] * bx + D[6] * by + D[7] * bt;
    const s2 = D[8] * bx + D[10] * by + D[11] * bt;
    const s3 = D[12] * bx + D[14] * by + D[15] * bt;
    const q0 = D[1] * by + D[2] * bx;
    const q1 = D[5] * by + D[6] * bx;
    const q2 = D[9] * by + D[10] * bx;
    const q3 = D[13] * by + D[14] * bx;
    for (let i = 0; i < n; i++) {
      const ax = dx[i] * w;
      const ay = dy[i] * w;
      const at = N[i] * invR * w;
      const row = 2 * i * nd;
      ke[row + 2 * j] += ax * s0 + ay * s2 + at * s3;
      ke[row + 2 * j + 1] += ax * q0 + ay * q2 + at * q3;
      ke[row + nd + 2 * j] += ay * s1 + ax * s2;
      ke[row + nd + 2 * j + 1] += ay * q1 + ax * q2;
    }
  }
}

/**
 * Stiffness of the axisymmetric ring element with a 3-node (CST) or 6-node (LST) section,
 * K = 2π ∫ BᵀDB r dA by the rules above (whole revolution). D from axisymmetricMatrix.
 * xy in the local numbering of src/mesh/types.ts. Returns the (2n)² matrix (row-major) in `out`.
 */
export function axisymmetricStiffness(
  xy: ArrayLike<number>,
  nodesPerElem: 3 | 6,
  D: Float64Array,
  out: Float64Array = new Float64Array(4 * nodesPerElem * nodesPerElem),
): Float64Array {
  out.fill(0);
  const rule = nodesPerElem === 3 ? AXISYMMETRIC_RULE_CST : AXISYMMETRIC_RULE_LST;
  for (let g = 0; g < rule.w.length; g++) {
    const { det, r } = pointOf(nodesPerElem, xy, rule.xi[g], rule.eta[g]);
    // weight × |J|/2 (element/rules.ts convention) × 2π r
    addAxisymmetricBtDB(nodesPerElem, r, D, 0.5 * rule.w[g] * det * REVOLUTION * r, out);
  }
  return out;
}

/**
 * Stresses σ = D·B·u_e at the same sampling points as the plane elements (fem/stresses.ts): the
 * centroid for CST, the interior 3-point rule for LST — interior, so u_r/r is evaluated at r > 0.
 * weight = |J|·w/2, the area weight of the section (as for plates). (σr, σz, τrz) go in `stress`
 * (the places of σxx, σyy, τxy) and the hoop stress σθ in `szz`, the out-of-plane normal stress
 * every invariant already includes (contracts §1).
 */
export function axisymmetricGaussStresses(
  mesh: Pick<Mesh, 'xy' | 'elemNodes' | 'nodesPerElem'>,
  u: Float64Array,
  section: Pick<ElasticSection, 'E' | 'nu' | 'expansion'>,
  loads: readonly Load[] = [],
): GaussStresses {
  const D = axisymmetricMatrix(section);
  // a temperature change: σ = D(ε − αΔT(1, 1, 0, 1)), and D·(1, 1, 0, 1) = E/(1 − 2ν) on each normal stress
  const thermal = thermalOf(section, loads);
  const npe = mesh.nodesPerElem;
  const nElem = mesh.elemNodes.length / npe;
  const rule = npe === 3 ? { xi: [1 / 3], eta: [1 / 3], w: [1] } : TRI_3;
  const nGauss = rule.w.length;
  const nPts = nElem * nGauss;
  const xy = new Float64Array(2 * nPts);
  const stress = new Float64Array(3 * nPts);
  const szz = new Float64Array(nPts);
  const weight = new Float64Array(nPts);
  const exy = new Float64Array(2 * npe);
  const ue = new Float64Array(2 * npe);
  const { dx, dy, N } = scratch;
  for (let e = 0; e < nElem; e++) {
    gatherElementXY(mesh.xy, mesh.elemNodes, npe, e, exy);
    for (let i = 0; i < npe; i++) {
      const n = mesh.elemNodes[npe * e + i];
      ue[2 * i] = u[2 * n];
      ue[2 * i + 1] = u[2 * n + 1];
    }
    for (let g = 0; g < nGauss; g++) {
      const k = nGauss * e + g;
      const { det, r } = pointOf(npe, exy, rule.xi[g], rule.eta[g]);
      let z = 0;
      let er = 0, ez = 0, grz = 0, ur = 0;
      for (let i = 0; i < npe; i++) {
        const ui = ue[2 * i];
        const wi = ue[2 * i + 1];
        z += N[i] * exy[2 * i + 1];
        er += dx[i] * ui;
        ez += dy[i] * wi;
        grz += dy[i] * ui + dx[i] * wi;
        ur += N[i] * ui;
      }
      const et = ur / r;
      const s0 = thermal ? thermal.stressPerDegree * thermal.deltaT(r, z) : 0;
      weight[k] = 0.5 * rule.w[g] * det;
      xy[2 * k] = r;
      xy[2 * k + 1] = z;
      stress[3 * k] = D[0] * er + D[1] * ez + D[3] * et - s0;
      stress[3 * k + 1] = D[4] * er + D[5] * ez + D[7] * et - s0;
      stress[3 * k + 2] = D[10] * grz;
      szz[k] = D[12] * er + D[13] * ez + D[15] * et - s0;
    }
  }
  return { nGauss, xy, stress, szz, weight };
}

/** Nodes closer to the axis than this fraction of the model size lie on it. */
export const ON_AXIS_RELATIVE = 1e-9;

/**
 * The axis condition of an axisymmetric section: every node on the axis r = 0 has u_r = 0 (the
 * material of the revolved body is continuous across the axis, so the radial displacement there
 * vanishes by symmetry). Marks dof 2n of those nodes in `fixed` with value 0 in `value`; returns
 * how many nodes it held.
 */
export function holdAxisNodes(xy: Float64Array, scale: number, fixed: Uint8Array, value: Float64Array): number {
  const tol = ON_AXIS_RELATIVE * (scale > 0 ? scale : 1);
  let count = 0;
  for (let n = 0; n < xy.length / 2; n++) {
    if (Math.abs(xy[2 * n]) <= tol) {
      fixed[2 * n] = 1;
      value[2 * n] = 0;
      count++;
    }
  }
  return count;
}

/**
 * The only rigid motion of an axisymmetric body in its own plane is a translation along the axis
 * (a radial shift strains the hoops, a rotation in the section is not axisymmetric): some support
 * must fix u_z. Throws a SolveError in words otherwise.
 */
export function checkAxialRestraint(fixed: Uint8Array): void {
  for (let i = 1; i < fixed.length; i += 2) if (fixed[i]) return;
  throw new SolveError(
    'the section is free to move along the axis (no support fixes z = y); add a support that fixes y, e.g. on a face normal to the axis',
    'supports',
  );
}

/**
 * The temperature change of `loads` in an axisymmetric section, or undefined without one: ΔT(r, z) and
 * the stress a unit ΔT would need to be held, D·α(1, 1, 0, 1) = αE/(1 − 2ν) on each normal stress (the
 * free thermal strain αΔT acts in r, z and θ alike).
 */
function thermalOf(section: Pick<ElasticSection, 'E' | 'nu' | 'expansion'>, loads: readonly Load[]): { deltaT: TemperatureField; stressPerDegree: number } | undefined {
  const deltaT = temperatureField(loads);
  if (!deltaT) return undefined;
  const first = loads.findIndex((l) => l.kind === 'temperature');
  const alpha = expansionOf(section, loads[first].keyPath || `loads[${first}]`);
  return { deltaT, stressPerDegree: (alpha * section.E) / (1 - 2 * section.nu) };
}

/**
 * Consistent nodal forces of the temperature loads in an axisymmetric section, for the whole
 * revolution: f = 2π ∫ Bᵀ D ε₀ r dA with ε₀ = αΔT(1, 1, 0, 1), on the element's stiffness rule
 * (interior points, r > 0). Bᵀσ₀ for node i with σ₀ = s(1, 1, 0, 1): (s(∂N/∂r + N/r), s ∂N/∂z).
 * Adds into `out` and returns it.
 */
export function axisymmetricThermalLoad(
  mesh: Pick<Mesh, 'xy' | 'elemNodes' | 'nodesPerElem'>,
  section: Pick<ElasticSection, 'E' | 'nu' | 'expansion'>,
  loads: readonly Load[],
  out: Float64Array,
): Float64Array {
  const thermal = thermalOf(section, loads);
  if (!thermal) return out;
  const npe = mesh.nodesPerElem;
  const rule = npe === 3 ? AXISYMMETRIC_RULE_CST : AXISYMMETRIC_RULE_LST;
  const exy = new Float64Array(2 * npe);
  const { dx, dy, N } = scratch;
  const nElem = mesh.elemNodes.length / npe;
  for (let e = 0; e < nElem; e++) {
    gatherElementXY(mesh.xy, mesh.elemNodes, npe, e, exy);
    for (let g = 0; g < rule.w.length; g++) {
      const { det, r } = pointOf(npe, exy, rule.xi[g], rule.eta[g]);
      let z = 0;
      for (let i = 0; i < npe; i++) z += N[i] * exy[2 * i + 1];
      const s0 = thermal.stressPerDegree * thermal.deltaT(r, z);
      if (s0 === 0) continue;
      const w = 0.5 * rule.w[g] * det * REVOLUTION * r * s0;
      for (let i = 0; i < npe; i++) {
        const n = mesh.elemNodes[npe * e + i];
        out[2 * n] += w * (dx[i] + N[i] / r);
        out[2 * n + 1] += w * dy[i];
      }
    }
  }
  return out;
}
