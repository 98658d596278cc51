/**
 * Units are labels only: lengths, forces and moduli are in one consistent set chosen by
 * the user, and nothing is ever converted. The stress label follows from force/length².
 */
export interface UnitLabels {
  length: string;
  force: string;
}

export const DEFAULT_UNITS: Readonly<UnitLabels> = { length: 'mm', force: 'N' };

const NAMED_STRESS: Record<string, string> = {
  'N/mm': 'MPa',
  'N/m': 'Pa',
  'kN/m': 'kPa',
  'MN/m': 'MPa',
  'kN/mm': 'GPa',
  'lbf/in': 'psi',
  'kip/in': 'ksi',
  'lbf/ft': 'psf',
  'kip/ft': 'ksf',
};

/** The label of a stress (force per area) in these units: mm + N → MPa, else force/length². */
export function stressUnit(units: Readonly<UnitLabels>): string {
  return NAMED_STRESS[`${units.force}/${units.length}`] ?? `${units.force}/${units.length}²`;
}

/**
 * Rough range of Young's modulus for structural metals and polymers, in MPa, used only to
 * warn when E looks like it was written in other units than the labels say (common
 * practice: steel ≈ 2.1e5 MPa, aluminium ≈ 7e4 MPa, rubber-like polymers down to ~1 MPa).
 */
export const PLAUSIBLE_E_MPA: readonly [number, number] = [1, 1.5e6];

/** Factor that turns a stress in these units into MPa, when the units are known. */
export function stressToMPa(units: Readonly<UnitLabels>): number | undefined {
  const length: Record<string, number> = { mm: 1e-3, cm: 1e-2, m: 1, in: 0.0254, ft: 0.3048 };
  const force: Record<string, number> = { N: 1, kN: 1e3, MN: 1e6, lbf: 4.4482216152605, kip: 4448.2216152605 };
  const l = length[units.length];
  const f = force[units.force];
  if (l === undefined || f === undefined) return undefined;
  return f / (l * l) / 1e6;
}

/**
 * Rough range of plate thicknesses, in mm, used only to warn when the thickness looks like it was
 * written in another length unit than the model's (common practice: sheet and foil from about
 * 0.05 mm, rolled plate up to a few hundred mm, a wall or slab section in plane strain up to a few
 * metres).
 */
export const PLAUSIBLE_THICKNESS_MM: readonly [number, number] = [0.05, 5000];

/** Millimetres per length unit, for the known length labels. */
export function lengthToMm(unit: string): number | undefined {
  return ({ mm: 1, cm: 10, m: 1000, in: 25.4, ft: 304.8 } as Record<string, number>)[unit];
}
