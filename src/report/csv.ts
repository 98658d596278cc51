/**
 * CSV for spreadsheets and scripts (RFC 4180: comma separated, CRLF line ends, text cells in
 * double quotes with inner quotes doubled).
 *
 * Formula-injection guard: a TEXT cell that starts with `=`, `+`, `-`, `@`, tab, CR or LF gets
 * a leading apostrophe inside its quotes, so a spreadsheet shows it as text instead of running
 * it. Numbers are never guarded: a negative number stays a bare `-12.5`, written with full
 * round-trip precision (`String(x)`), and a missing or non-finite value is an empty cell.
 */
import type { Mesh } from '../mesh/types.js';
import type { StudyResult } from '../study/types.js';

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
 * One row per site and refinement level (level 1 = coarsest). The site-level columns
 * (verdict, estimate, uncertainty, exponent, theory) repeat on every row of that site so that
 * any row stands alone after sorting or filtering.
 */
export function sitesCsv(study: StudyResult): string {
  const header = [
    'site', 'x', 'y', 'feature', 'verdict', 'level', 'h', 'dofs', 'peak', 'atDistance',
    'estimate', 'uncertainty', 'exponent', 'theory',
  ];
  const out: string[] = [header.map(csvText).join(',')];
  for (const site of study.sites) {
    site.levels.forEach((level, i) => {
      out.push(
        [
          csvText(site.id),
          csvNumber(site.at[0]),
          csvNumber(site.at[1]),
          csvText(site.feature.kind),
          csvText(site.verdict),
          csvNumber(i + 1),
          csvNumber(level.h),
          csvNumber(level.dofs),
          csvNumber(level.peak),
          csvNumber(level.atDistance),
          csvNumber(site.estimate.value),
          csvNumber(site.estimate.uncertainty),
          csvNumber(site.growth.exponent),
          csvNumber(site.growth.theory),
        ].join(','),
      );
    });
  }
  return out.join(EOL) + EOL;
}

/**
 * Nodal field table: node, x, y, ux, uy, then one column per entry of `columns` (in insertion
 * order), e.g. `{ sxx, syy, sxy, 'von Mises': vm }`. Every column must hold one value per node.
 */
export function fieldCsv(mesh: Pick<Mesh, 'xy'>, u: Float64Array, columns: Record<string, Float64Array>): string {
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
  const parts: string[] = [['node', 'x', 'y', 'ux', 'uy', ...names].map(csvText).join(',')];
  const xy = mesh.xy;
  for (let n = 0; n < nNodes; n++) {
    let row = `${n},${csvNumber(xy[2 * n])},${csvNumber(xy[2 * n + 1])},${csvNumber(u[2 * n])},${csvNumber(u[2 * n + 1])}`;
    for (let j = 0; j < arrays.length; j++) row += ',' + csvNumber(arrays[j][n]);
    parts.push(row);
  }
  return parts.join(EOL) + EOL;
}
