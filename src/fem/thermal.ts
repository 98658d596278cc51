/**
 * Temperature loads: the temperature change ΔT(x, y) of a model's `temperature` loads, the thermal
 * strain it causes, and the consistent nodal forces of that strain (docs/fem.md, "Temperature").
 */
import { FemError } from '../errors.js';
import type { Mesh } from '../mesh/types.js';
import { ExpressionError, evaluateTree, parseExpression } from '../model/expr.js';
import type { Load } from '../model/types.js';
import { TRI_7 } from '../element/index.js';
import { elasticityMatrix } from './elasticity.js';
import { forEachRulePoint } from './shape.js';
import type { ElasticSection } from './types.js';

/** ΔT at a point (temperature units) */
export type TemperatureField = (x: number, y: number) => number;

const fmt = (v: number): string => Number(v.toPrecision(6)).toString();

/**
 * ΔT(x, y) of every `temperature` load in `loads` (several add up), or undefined when there is none.
 * An expression is parsed once and evaluated with the load's params and the point's x, y; a value
 * that is not finite at some point is a FemError on the load's key path.
 */
export function temperatureField(loads: readonly Load[]): TemperatureField | undefined {
  const parts: TemperatureField[] = [];
  loads.forEach((load, i) => {
    if (load.kind !== 'temperature') return;
    const value = load.temperature;
    if (typeof value === 'number') {
      parts.push(() => value);
      return;
    }
    const keyPath = `${load.keyPath || `loads[${i}]`}.temperature`;
    const names: Record<string, number> = { ...value.params, x: 0, y: 0 };
    let tree: ReturnType<typeof parseExpression>;
    try {
      tree = parseExpression(value.expression);
    } catch (e) {
      if (e instanceof ExpressionError) throw new FemError(`temperature '${value.expression}': ${e.message}`, keyPath);
      throw e;
    }
    parts.push((x, y) => {
      names.x = x;
      names.y = y;
      try {
        return evaluateTree(tree, names);
      } catch (e) {
        if (e instanceof ExpressionError) {
          throw new FemError(`temperature '${value.expression}' at (${fmt(x)}, ${fmt(y)}): ${e.message}`, keyPath);
        }
        throw e;
      }
    });
  });
  if (parts.length === 0) return undefined;
  if (parts.length === 1) return parts[0];
  return (x, y) => {
    let sum = 0;
    for (const p of parts) sum += p(x, y);
    return sum;
  };
}

/** The material's expansion coefficient α, or a FemError naming the load that needs it. */
export function expansionOf(section: Pick<ElasticSection, 'expansion'>, keyPath: string): number {
  const alpha = section.expansion;
  if (alpha === undefined || !Number.isFinite(alpha)) {
    throw new FemError('a temperature load needs the thermal expansion coefficient material.expansion (α, strain per unit of temperature)', keyPath);
  }
  return alpha;
}

/**
 * In-plane thermal strain per unit ΔT, the same in x and y (no shear): α in plane stress, (1 + ν)α in
 * plane strain, where holding εzz = 0 turns part of the out-of-plane expansion into in-plane strain
 * (derived in docs/fem.md, "Temperature", from Hooke's law with the free thermal strain αΔT).
 */
export function thermalStrainPerDegree(section: Pick<ElasticSection, 'nu' | 'state'>, alpha: number): number {
  return section.state === 'plane-strain' ? (1 + section.nu) * alpha : alpha;
}

/**
 * Consistent nodal forces of a thermal strain ε₀ = c·ΔT·(1, 1, 0), c = thermalStrainPerDegree:
 * f_e = t ∫ Bᵀ D ε₀ dA over every element, from the stationary potential ½∫(ε − ε₀)ᵀD(ε − ε₀) dV,
 * with the 7-point degree-5 rule through the element's own map (exact for ΔT up to degree 4 on a
 * straight CST, degree 3 on a straight LST). Adds into `out` and returns it.
 */
export function thermalLoad(
  mesh: Pick<Mesh, 'xy' | 'elemNodes' | 'nodesPerElem'>,
  section: Pick<ElasticSection, 'E' | 'nu' | 'state' | 'thickness'>,
  strainPerDegree: number,
  deltaT: TemperatureField,
  out: Float64Array = new Float64Array(mesh.xy.length),
): Float64Array {
  const D = elasticityMatrix(section);
  // D·(1, 1, 0): the stress a unit in-plane strain in both directions would need
  const s0x = D[0] + D[1];
  const s0y = D[3] + D[4];
  const s0s = D[6] + D[7];
  const npe = mesh.nodesPerElem;
  forEachRulePoint(mesh, TRI_7, ({ e, x, y, area, dNdx, dNdy }) => {
    const eps = strainPerDegree * deltaT(x, y);
    if (eps === 0) return;
    // the point's area times the thickness
    const w = area * section.thickness * eps;
    const sx = w * s0x;
    const sy = w * s0y;
    const ss = w * s0s;
    for (let i = 0; i < npe; i++) {
      const n = mesh.elemNodes[npe * e + i];
      // Bᵀσ₀ for node i: (∂N/∂x σx + ∂N/∂y τ, ∂N/∂y σy + ∂N/∂x τ)
      out[2 * n] += dNdx[i] * sx + dNdy[i] * ss;
      out[2 * n + 1] += dNdy[i] * sy + dNdx[i] * ss;
    }
  });
  return out;
}

/**
 * The fields a model's body loads put inside the plate, for integrals over the domain (the study's
 * reciprocal-work K): the body force per volume b(x, y) of every gravity and spin load (summed), and
 * the in-plane thermal strain c·ΔT(x, y) of the temperature loads (c = thermalStrainPerDegree). Each
 * is undefined when no load of that kind is present.
 */
export interface BodyFields {
  force?: (x: number, y: number) => [number, number];
  strain?: (x: number, y: number) => number;
}

export function bodyFields(section: Pick<ElasticSection, 'nu' | 'state' | 'density' | 'expansion'>, loads: readonly Load[]): BodyFields {
  const out: BodyFields = {};
  const axisymmetric = section.state === 'axisymmetric';
  let gx = 0, gy = 0, any = false;
  const spins: { c: number; ax: number; ay: number }[] = [];
  loads.forEach((l, i) => {
    if (l.kind !== 'gravity' && l.kind !== 'spin') return;
    const rho = section.density;
    if (rho === undefined) throw new FemError(`a ${l.kind} load needs the material's mass per volume, material.density`, l.keyPath || `loads[${i}]`);
    any = true;
    if (l.kind === 'gravity') {
      gx += rho * l.gravity[0];
      gy += rho * l.gravity[1];
    } else spins.push({ c: rho * l.omega * l.omega, ax: l.about[0], ay: l.about[1] });
  });
  if (any) {
    out.force = (x, y) => {
      let bx = gx, by = gy;
      for (const s of spins) {
        bx += s.c * (x - s.ax);
        // an axisymmetric section spins about its axis: the centrifugal force is radial only
        if (!axisymmetric) by += s.c * (y - s.ay);
      }
      return [bx, by];
    };
  }
  const deltaT = temperatureField(loads);
  if (deltaT) {
    const k = loads.findIndex((l) => l.kind === 'temperature');
    // a corner of an axisymmetric section is locally in plane strain (docs/study.md): (1 + ν)α
    const c = thermalStrainPerDegree(axisymmetric ? { ...section, state: 'plane-strain' } : section, expansionOf(section, loads[k].keyPath || `loads[${k}]`));
    out.strain = (x, y) => c * deltaT(x, y);
  }
  return out;
}
