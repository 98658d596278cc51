/**
 * The body loads of a model file (issue 14): self-weight `gravity`, rotation `spin` and a temperature
 * change `temperature`, with the material constants they need (`material.density`,
 * `material.expansion`) and the unit hints for them. Units are labels only (units.ts): a density is
 * mass per volume in the model's consistent set, mass = force·time²/length, time in seconds.
 */
import { joinPath } from './keypath.js';
import type { ModelFile, RawPoint } from './schema.js';
import { formatNumber } from './text.js';
import type { FieldValue, Load, ModelWarning, Point } from './types.js';
import type { UnitLabels } from './units.js';

/** The part of the model builder (build.ts) the body loads read values with. */
export interface ValueReader {
  readonly warnings: ModelWarning[];
  num(raw: number | string, keyPath: string, quantity?: string, rule?: { test: (v: number) => boolean; text: string }, unit?: string): number;
  point(raw: RawPoint, keyPath: string): Point;
  fieldValue(raw: number | string, keyPath: string, quantity: string): FieldValue;
  fail(message: string, keyPath: string): never;
}

export interface PhysicalConstants {
  /** mass per volume, consistent units */
  density?: number;
  /** thermal expansion coefficient α */
  expansion?: number;
}

const POSITIVE = { test: (v: number) => v > 0, text: 'must be > 0' };

/** Length labels in metres and force labels in newtons (the labels units.ts knows). */
const METRES: Readonly<Record<string, number>> = { mm: 1e-3, cm: 1e-2, m: 1, in: 0.0254, ft: 0.3048 };
const NEWTONS: Readonly<Record<string, number>> = { N: 1, kN: 1e3, MN: 1e6, lbf: 4.4482216152605, kip: 4448.2216152605 };

/** Names of the consistent mass unit force·s²/length, where it has one. */
const MASS_UNITS: Readonly<Record<string, string>> = { 'N/mm': 'tonne', 'N/m': 'kg', 'kN/m': 'tonne' };

/**
 * kg/m³ per unit of density in these units (mass unit force·s²/length over length³: f/l⁴ with the
 * force f in N and the length l in m), when both labels are known.
 */
export function densityToKgPerM3(units: Readonly<UnitLabels>): number | undefined {
  const l = METRES[units.length];
  const f = NEWTONS[units.force];
  return l === undefined || f === undefined ? undefined : f / l ** 4;
}

/**
 * Densities of engineering solids, kg/m³, used only to warn when a density looks like it was given in
 * other units (common practice: timber and polymer foams from about 100, metals up to tungsten and
 * platinum near 21 500).
 */
export const PLAUSIBLE_DENSITY_KG_M3: readonly [number, number] = [100, 25000];

/** standard gravity, m/s² (CGPM 1901) */
const STANDARD_GRAVITY = 9.80665;

/** `material.density` and `material.expansion`, with a warning for a density in other units. */
export function physicalConstants(b: ValueReader, raw: ModelFile['material'], units: Readonly<UnitLabels>): PhysicalConstants {
  const out: PhysicalConstants = {};
  if (raw.density !== undefined) {
    const rho = b.num(raw.density, 'material.density', 'density', POSITIVE);
    out.density = rho;
    const toKg = densityToKgPerM3(units);
    if (toKg !== undefined) {
      const kg = rho * toKg;
      const [lo, hi] = PLAUSIBLE_DENSITY_KG_M3;
      if (kg < lo || kg > hi) {
        const mass = MASS_UNITS[`${units.force}/${units.length}`] ?? `${units.force}·s²/${units.length}`;
        const steel = formatNumber(7850 / toKg);
        const looks = rho >= 500 && rho <= 25000 ? ' It looks like kg/m³.' : rho >= 0.5 && rho <= 30 ? ' It looks like g/cm³.' : '';
        b.warnings.push({
          keyPath: 'material.density',
          message: `density ${formatNumber(rho)} ${mass}/${units.length}³ is ${formatNumber(kg)} kg/m³, outside the range of solids.${looks} `
            + `Units are not converted: give the density in ${mass}/${units.length}³ (mass = force·s²/length); steel is about ${steel}`,
        });
      }
    }
  }
  if (raw.expansion !== undefined) out.expansion = b.num(raw.expansion, 'material.expansion', 'thermal expansion coefficient');
  return out;
}

/** The load of `raw` when it is a body load (gravity, spin, temperature), else undefined. */
export function bodyLoad(
  b: ValueReader, raw: ModelFile['loads'][number], keyPath: string, physical: PhysicalConstants, units: Readonly<UnitLabels>,
): Load | undefined {
  const needDensity = (kind: string, key: string): void => {
    if (physical.density === undefined) {
      b.fail(`a ${kind} load needs the material's density: add material.density (mass per volume in the model's consistent units, e.g. 7.85e-9 for steel in N and mm)`, key);
    }
  };
  if (raw.gravity !== undefined) {
    const key = joinPath(keyPath, 'gravity');
    needDensity('gravity', key);
    const gravity = b.point(raw.gravity, key);
    const metres = METRES[units.length];
    const g = Math.hypot(gravity[0], gravity[1]);
    if (g === 0) b.fail('gravity [0, 0] has no direction; give the acceleration vector [gx, gy], e.g. [0, -9810] in mm/s²', key);
    // an acceleration of about 9.8 with lengths in mm (or cm, in, ft) was almost always meant as m/s²
    if (metres !== undefined && metres !== 1 && Math.abs(g - STANDARD_GRAVITY) < 0.05) {
      b.warnings.push({
        keyPath: key,
        message: `gravity of magnitude ${formatNumber(g)} looks like m/s²; accelerations are in ${units.length}/s² here (standard gravity is ${formatNumber(STANDARD_GRAVITY / metres)} ${units.length}/s²)`,
      });
    }
    return { kind: 'gravity', gravity, keyPath };
  }
  if (raw.spin !== undefined) {
    const key = joinPath(keyPath, 'spin');
    needDensity('spin', key);
    return {
      kind: 'spin',
      about: b.point(raw.spin.about, joinPath(key, 'about')),
      omega: b.num(raw.spin.omega, joinPath(key, 'omega'), 'angular velocity omega (rad/time)'),
      keyPath,
    };
  }
  if (raw.temperature !== undefined) {
    const key = joinPath(keyPath, 'temperature');
    if (physical.expansion === undefined) {
      b.fail('a temperature load needs the thermal expansion coefficient: add material.expansion (α, e.g. 1.2e-5 per kelvin for steel)', key);
    }
    return { kind: 'temperature', temperature: b.fieldValue(raw.temperature, key, 'temperature'), keyPath };
  }
  return undefined;
}
