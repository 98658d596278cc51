/**
 * The load dispatcher: the global load vector of a model's loads, each kind handed to its own
 * module (edge-load.ts for tractions and pressures, farfield.ts, pin-force.ts; concentrated
 * forces at their node; body-load.ts for self-weight and rotation, thermal.ts for temperature).
 */
import { FemError } from '../errors.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { Mesh } from '../mesh/types.js';
import type { Load } from '../model/types.js';
import { axisymmetricThermalLoad } from './axisymmetric.js';
import { revolvedBodyLoad, revolvedPressureLoad, revolvedTractionLoad } from './axisymmetric-loads.js';
import { edgeTractionLoad, pressureLoad } from './edge-load.js';
import { farFieldStressLoad } from './farfield.js';
import { pinForceLoad } from './pin-force.js';
import { describeSelector, farFieldEdges, selectBoundary } from './selectors.js';
import { bodyForceLoad } from './body-load.js';
import { expansionOf, temperatureField, thermalLoad, thermalStrainPerDegree } from './thermal.js';
import type { ElasticSection } from './types.js';

/** The material's density, or a FemError naming the load that needs it. */
function densityOf(section: Pick<ElasticSection, 'density'>, kind: string, keyPath: string): number {
  const rho = section.density;
  if (rho === undefined || !Number.isFinite(rho)) {
    throw new FemError(`a ${kind} load needs the material's mass per volume, material.density (in the model's consistent units)`, keyPath);
  }
  return rho;
}

/**
 * Global load vector (whole thickness) of the model loads: tractions and pressures integrated
 * consistently over the selected edges, concentrated forces at the selected node, self-weight ρg and
 * rotation ρω²r as consistent body forces over every element, and the thermal forces ∫Bᵀ D ε₀ dA·t of
 * every temperature load (their ΔT added up first). In an axisymmetric section the loads are for
 * the whole revolution (fem/axisymmetric-loads.ts): a concentrated force is the total force of a
 * ring load at that point.
 */
export function loadVector(
  mesh: Pick<Mesh, 'xy' | 'boundaryEdges' | 'edgeStride' | 'boundaryPiece' | 'elemNodes' | 'nodesPerElem'>,
  geom: Pick<PlateGeometry, 'pieces' | 'loops' | 'scale'>,
  section: Pick<ElasticSection, 'thickness'> & Partial<Pick<ElasticSection, 'E' | 'nu' | 'state' | 'density' | 'expansion'>>,
  loads: readonly Load[],
): Float64Array {
  const f = new Float64Array(mesh.xy.length);
  let thermalAt = -1;
  // an axisymmetric section: loads per area of the revolved surface or per volume, forces for the whole ring
  const axisymmetric = section.state === 'axisymmetric';
  loads.forEach((load, i) => {
    const keyPath = load.keyPath || `loads[${i}]`;
    if (axisymmetric && (load.kind === 'gravity' || load.kind === 'spin')) {
      revolvedBodyLoad(mesh, load, () => densityOf(section, load.kind, keyPath), keyPath, f);
      return;
    }
    if (load.kind === 'gravity') {
      const rho = densityOf(section, 'gravity', keyPath);
      const b: readonly [number, number] = [rho * load.gravity[0], rho * load.gravity[1]];
      bodyForceLoad(mesh, section.thickness, () => b, f);
      return;
    }
    if (load.kind === 'spin') {
      // centrifugal body force ρω²(p − about), r measured from the axis of rotation
      const c = densityOf(section, 'spin', keyPath) * load.omega * load.omega;
      const [ax, ay] = load.about;
      bodyForceLoad(mesh, section.thickness, (x, y) => [c * (x - ax), c * (y - ay)], f);
      return;
    }
    if (load.kind === 'temperature') {
      if (thermalAt < 0) thermalAt = i;
      return;
    }
    const where = `${keyPath}.where`;
    if (load.kind === 'force') {
      if (load.where.kind !== 'point') {
        throw new FemError(
          `a concentrated force acts at a point; ${describeSelector(load.where)} is not one (use { point: [x, y] }, or a traction on an edge)`,
          where,
        );
      }
      const n = selectBoundary(mesh, geom, load.where, where).nodes[0];
      f[2 * n] += load.force[0];
      f[2 * n + 1] += load.force[1];
      return;
    }
    if (load.where.kind === 'point') {
      throw new FemError(`a ${load.kind} acts on boundary edges, not at a point; use a force for a concentrated load`, where);
    }
    const { edges } = selectBoundary(mesh, geom, load.where, where);
    if (axisymmetric) {
      if (load.kind === 'traction') revolvedTractionLoad(mesh, edges, load.traction, f);
      else if (load.kind === 'pressure') revolvedPressureLoad(mesh, edges, load.pressure, f);
      else {
        throw new FemError(
          `a ${load.kind === 'stress' ? 'far-field stress' : 'pin force'} is not available in an axisymmetric section; use a traction or a pressure on the revolved surface`,
          keyPath,
        );
      }
      return;
    }
    if (load.kind === 'stress') {
      farFieldStressLoad(mesh, farFieldEdges(mesh, geom, load.where, edges), section.thickness, load, f);
    } else if (load.kind === 'pinForce') {
      pinForceLoad(mesh, edges, section.thickness, load.force, keyPath, f);
    } else if (load.kind === 'traction') {
      const t: readonly [number, number] = [load.traction[0], load.traction[1]];
      edgeTractionLoad(mesh, edges, section.thickness, () => t, f);
    } else {
      pressureLoad(mesh, edges, section.thickness, load.pressure, f);
    }
  });
  if (thermalAt >= 0 && axisymmetric) {
    const { E, nu } = section;
    if (E === undefined || nu === undefined) throw new TypeError('a temperature load needs the section\'s E and nu');
    axisymmetricThermalLoad(mesh, { E, nu, expansion: expansionOf(section, loads[thermalAt].keyPath || `loads[${thermalAt}]`) }, loads, f);
  } else if (thermalAt >= 0) {
    // every temperature load at once: their ΔT add, so one integration (the Gauss-point stresses do the same)
    const alpha = expansionOf(section, loads[thermalAt].keyPath || `loads[${thermalAt}]`);
    const { E, nu, state, thickness } = section;
    if (E === undefined || nu === undefined || state === undefined) throw new TypeError('a temperature load needs the section\'s E, nu and state');
    const elastic = { E, nu, state, thickness };
    thermalLoad(mesh, elastic, thermalStrainPerDegree(elastic, alpha), temperatureField(loads)!, f);
  }
  return f;
}

/** sum of the nodal forces in x and y */
export function appliedResultant(load: Float64Array): [number, number] {
  let fx = 0;
  let fy = 0;
  for (let i = 0; i < load.length; i += 2) {
    fx += load[i];
    fy += load[i + 1];
  }
  return [fx, fy];
}
