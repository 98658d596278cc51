import type { Mesh } from '../mesh/types.js';
import type { Load } from '../model/types.js';
import { axisymmetricGaussStresses } from './axisymmetric.js';
import { elasticityMatrix } from './elasticity.js';
import { expansionOf, temperatureField, thermalStrainPerDegree } from './thermal.js';
import { TRI_3, lstShape } from '../element/index.js';
import { cstGradients, gatherElementXY, lstGradients } from './shape.js';
import type { ElasticSection, GaussStresses } from './types.js';

/**
 * Stresses σ = D·B·u_e at the Gauss points: the centroid for CST (1 point, weight = area),
 * the interior 3-point rule for LST (weight = |J|·w). These are the sampling points of the
 * element's most accurate stresses (Barlow, "Optimal stress locations in finite element models",
 * IJNME 10, 1976) and the ones the patch recovery fits.
 *
 * These are the stresses in the material: with a `temperature` load in `loads` the thermal strain
 * c·ΔT·(1, 1, 0) (c = α in plane stress, (1 + ν)α in plane strain; fem/thermal.ts) is subtracted from
 * the total strain first, ΔT taken at the Gauss point. `szz` is σzz: 0 in plane stress,
 * ν(σxx + σyy) − EαΔT in plane strain (εzz = 0).
 */
export function gaussStresses(
  mesh: Pick<Mesh, 'xy' | 'elemNodes' | 'nodesPerElem'>,
  u: Float64Array,
  section: Pick<ElasticSection, 'E' | 'nu' | 'state' | 'expansion'>,
  loads: readonly Load[] = [],
): GaussStresses {
  // an axisymmetric section: (σr, σz, τrz) in stress, σθ beside them (fem/axisymmetric.ts)
  if (section.state === 'axisymmetric') return axisymmetricGaussStresses(mesh, u, section, loads);
  const D = elasticityMatrix(section);
  const deltaT = temperatureField(loads);
  const firstThermal = loads.findIndex((l) => l.kind === 'temperature');
  const alpha = deltaT ? expansionOf(section, loads[firstThermal].keyPath || `loads[${firstThermal}]`) : 0;
  const strainPerDegree = thermalStrainPerDegree(section, alpha);
  const planeStrain = section.state === 'plane-strain';
  const { nu, E } = section;
  const npe = mesh.nodesPerElem;
  const nElem = mesh.elemNodes.length / npe;
  const nGauss = npe === 3 ? 1 : 3;
  const nPts = nElem * nGauss;
  const xy = new Float64Array(2 * nPts);
  const stress = new Float64Array(3 * nPts);
  const weight = new Float64Array(nPts);
  const szz = new Float64Array(nPts);
  const exy = new Float64Array(2 * npe);
  const dNdx = new Float64Array(6);
  const dNdy = new Float64Array(6);
  const N = new Float64Array(6);
  const ue = new Float64Array(2 * npe);
  const { elemNodes } = mesh;
  for (let e = 0; e < nElem; e++) {
    gatherElementXY(mesh.xy, elemNodes, npe, e, exy);
    for (let i = 0; i < npe; i++) {
      const n = elemNodes[npe * e + i];
      ue[2 * i] = u[2 * n];
      ue[2 * i + 1] = u[2 * n + 1];
    }
    for (let g = 0; g < nGauss; g++) {
      const k = nGauss * e + g;
      let px = 0;
      let py = 0;
      if (npe === 3) {
        const twoA = cstGradients(exy, dNdx, dNdy);
        weight[k] = 0.5 * twoA;
        px = (exy[0] + exy[2] + exy[4]) / 3;
        py = (exy[1] + exy[3] + exy[5]) / 3;
      } else {
        const det = lstGradients(exy, TRI_3.xi[g], TRI_3.eta[g], dNdx, dNdy);
        // weight × |J|/2 (element/rules.ts convention)
        weight[k] = 0.5 * TRI_3.w[g] * det;
        lstShape(TRI_3.xi[g], TRI_3.eta[g], N);
        for (let i = 0; i < 6; i++) {
          px += N[i] * exy[2 * i];
          py += N[i] * exy[2 * i + 1];
        }
      }
      let ex = 0;
      let ey = 0;
      let gxy = 0;
      for (let i = 0; i < npe; i++) {
        const ui = ue[2 * i];
        const vi = ue[2 * i + 1];
        ex += dNdx[i] * ui;
        ey += dNdy[i] * vi;
        gxy += dNdy[i] * ui + dNdx[i] * vi;
      }
      // temperature change at the Gauss point, and the thermal strain taken off the total strain
      const dT = deltaT ? deltaT(px, py) : 0;
      if (dT !== 0) {
        ex -= strainPerDegree * dT;
        ey -= strainPerDegree * dT;
      }
      xy[2 * k] = px;
      xy[2 * k + 1] = py;
      const sxx = D[0] * ex + D[1] * ey + D[2] * gxy;
      const syy = D[3] * ex + D[4] * ey + D[5] * gxy;
      stress[3 * k] = sxx;
      stress[3 * k + 1] = syy;
      stress[3 * k + 2] = D[6] * ex + D[7] * ey + D[8] * gxy;
      if (planeStrain) szz[k] = dT !== 0 ? nu * (sxx + syy) - E * alpha * dT : nu * (sxx + syy);
    }
  }
  return { nGauss, xy, stress, weight, szz };
}
