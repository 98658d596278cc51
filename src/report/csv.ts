/**
 * CSV for spreadsheets and scripts (RFC 4180: comma separated, CRLF line ends, text cells in
 * double quotes with inner quotes doubled).
 *
 * Formula-injection guard: a TEXT cell that starts with `=`, `+`, `-`, `@`, tab, CR or LF gets
 * a leading apostrophe inside its quotes, so a spreadsheet shows it as text instead of running
 * it. Numbers are never guarded: a negative number stays a bare `-12.5`, written with full
 * round-trip precision (`String(x)`), and a missing or non-finite value is an empty cell.
 * Column names are snake_case with the unit last (`peak_MPa`), in every CSV the tool writes.
 */
import type { Mesh } from '../mesh/types.js';
import type { StudyResult } from '../study/types.js';
import { roundToScale } from '../study/reported.js';

// eslint-disable-next-line no-control-regex
const CSV_CONTROL = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/g;
const FORMULA_START = /^[=+\-@\t\r\n]/;

/** One quoted, guarded text cell. Tabs and line breaks survive (inside quotes); other controls go. */
export function csvText(text: string): string {
  let cell = String(text).replace(CSV_CONTROL, '');
  if (FORMULA_START.test(cell)) cell = `'${cell}`;
  return `"${cell.replace(/"/g, '""')}"`;
}

/** One numeric cell: shortest round-trip decimal, empty when missing or not finite. */
export function csvNumber(value: number | undefined): string {
  return value !== undefined && Number.isFinite(value) ? String(value) : '';
}

const EOL = '\r\n';

/**
 * A column name: snake_case words, then the unit after an underscore when the quantity has one
 * (`peak_MPa`, `x_mm`); the unit is the model's own label, so a header always says what it holds.
 */
export function columnName(name: string, unit?: string): string {
  const u = unit === undefined ? '' : String(unit).trim();
  return u ? `${name}_${u}` : name;
}

/**
 * One row per site and refinement level (level 1 = coarsest). The site-level columns (verdict,
 * yield flag, value, discretisation band, exponents) repeat on every row of that site so that
 * any row stands alone after sorting or filtering. `value` is the converged value (empty for a
 * singular site, whose peak is not a stress; the last peak for an undecided one);
 * `discretisation_band` is the ± of that value: the estimated error of the discretisation alone.
 */
export function sitesCsv(study: StudyResult): string {
  const L = study.units.length, S = study.units.stress;
  const header = [
    'site', columnName('x', L), columnName('y', L), 'feature', 'verdict', 'above_yield', 'level', columnName('h', L), 'dofs',
    columnName('peak', S), columnName('at_distance', S), columnName('readout_distance', L),
    columnName('value', S), columnName('discretisation_band', S), 'growth_exponent', 'theory_exponent',
    // with load cases: the case or combination each row is of (the governing one in the envelope)
    ...(study.sites.some((s) => s.case !== undefined) ? ['case'] : []),
  ];
  const withCase = study.sites.some((s) => s.case !== undefined);
  const out: string[] = [header.map(csvText).join(',')];
  for (const site of study.sites) {
    const value = site.verdict === 'singular' ? undefined : site.estimate.value;
    site.levels.forEach((level, i) => {
      out.push(
        [
          csvText(site.id),
          csvNumber(site.at[0]),
          csvNumber(site.at[1]),
          csvText(site.feature.kind),
          csvText(site.verdict),
          site.aboveYield ? csvText('yes') : '',
          csvNumber(i + 1),
          csvNumber(level.h),
          csvNumber(level.dofs),
          csvNumber(level.peak),
          csvNumber(level.atDistance),
          csvNumber(level.atDistance !== undefined ? site.readouts.distance : undefined),
          csvNumber(value),
          csvNumber(site.verdict === 'singular' ? undefined : site.estimate.uncertainty),
          csvNumber(site.growth.exponent),
          csvNumber(site.growth.theory),
          ...(withCase ? [csvText(site.case ?? '')] : []),
        ].join(','),
      );
    });
  }
  return out.join(EOL) + EOL;
}

/** Units of field.csv: with them the header names units and marks the stresses as recovered. */
export interface FieldCsvUnits {
  length: string;
  stress: string;
}

/**
 * Nodal field table: node, x, y, ux, uy, then one column per entry of `columns` (in insertion
 * order), e.g. `{ sxx, syy, sxy, von_mises: vm }`. Every column must hold one value per node.
 * With `units`, the columns are taken to be recovered nodal stresses and named so
 * (`sxx_recovered_MPa`; the nodal values of the SPR field, not element Gauss-point values), and
 * the coordinates and displacements carry the length unit (`x_mm`, `ux_mm`). Coordinates are
 * rounded to 1e-9 of the mesh's bounding-box diagonal (no binary tail such as 59.999999999999865).
 */
export function fieldCsv(mesh: Pick<Mesh, 'xy'>, u: Float64Array, columns: Record<string, Float64Array>, units?: FieldCsvUnits): string {
  const nNodes = mesh.xy.length / 2;
  if (u.length !== 2 * nNodes) {
    throw new TypeError(`fieldCsv: displacements must hold 2 values per node (${2 * nNodes}), got ${u.length}`);
  }
  const names = Object.keys(columns);
  const arrays = names.map((k) => columns[k]);
  arrays.forEach((a, j) => {
    if (a.length !== nNodes) {
      throw new TypeError(`fieldCsv: column "${names[j]}" must hold one value per node (${nNodes}), got ${a.length}`);
    }
  });
  const L = units?.length;
  const header = [
    'node', columnName('x', L), columnName('y', L), columnName('ux', L), columnName('uy', L),
    ...names.map((n) => (units ? columnName(`${n}_recovered`, units.stress) : n)),
  ];
  const parts: string[] = [header.map(csvText).join(',')];
  const xy = mesh.xy;
  const scale = boxDiagonal(xy);
  for (let n = 0; n < nNodes; n++) {
    let row = `${n},${csvNumber(roundToScale(xy[2 * n], scale))},${csvNumber(roundToScale(xy[2 * n + 1], scale))},${csvNumber(u[2 * n])},${csvNumber(u[2 * n + 1])}`;
    for (let j = 0; j < arrays.length; j++) row += ',' + csvNumber(arrays[j][n]);
    parts.push(row);
  }
  return parts.join(EOL) + EOL;
}

/** Diagonal of the bounding box of flat xy pairs (0 when empty). */
function boxDiagonal(xy: Float64Array): number {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (let n = 0; n < xy.length / 2; n++) {
    minX = Math.min(minX, xy[2 * n]); maxX = Math.max(maxX, xy[2 * n]);
    minY = Math.min(minY, xy[2 * n + 1]); maxY = Math.max(maxY, xy[2 * n + 1]);
  }
  return maxX >= minX ? Math.hypot(maxX - minX, maxY - minY) : 0;
}
