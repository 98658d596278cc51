/**
 * sweep.csv: one row per sweep point; the varied parameters first, then ten columns per site
 * family (F1_id, F1_x_mm, … as in docs/sweep.md). A family without a site at a point leaves
 * its cells empty. Cells and column names follow the report stage's CSV rules (quoted text,
 * formula guard, snake_case with the unit last).
 */
import { columnName, csvNumber, csvText } from '../report/index.js';
import { memberAt } from './match.js';
import type { SweepResult } from './types.js';

const EOL = '\r\n';

/** The per-family column suffixes, in order, before their units. */
export const FAMILY_COLUMNS = [
  'id', 'x', 'y', 'feature', 'verdict', 'value', 'discretisation_band', 'growth_exponent', 'theory_exponent', 'at_distance',
] as const;

/** The unit of each family column: a length, a stress or none. */
const COLUMN_UNIT: Record<(typeof FAMILY_COLUMNS)[number], 'length' | 'stress' | undefined> = {
  id: undefined, x: 'length', y: 'length', feature: undefined, verdict: undefined, value: 'stress',
  discretisation_band: 'stress', growth_exponent: undefined, theory_exponent: undefined, at_distance: 'stress',
};

/**
 * The table. `value` is the converged value of a converging site and the last peak of an
 * undecided one; a singular site leaves it (and its band) empty, because its peak is not a stress
 * — its growth exponent and the readout at distance are the numbers to use.
 */
export function sweepCsv(sweep: Pick<SweepResult, 'axes' | 'points' | 'families'>): string {
  const units = sweep.points[0]?.study.units;
  const unitOf = (c: (typeof FAMILY_COLUMNS)[number]) => {
    const kind = COLUMN_UNIT[c];
    return kind === undefined || !units ? undefined : units[kind];
  };
  const header = [...sweep.axes.map((a) => a.name)];
  for (const f of sweep.families) for (const c of FAMILY_COLUMNS) header.push(`${f.id}_${columnName(c, unitOf(c))}`);
  const rows = [header.map(csvText).join(',')];
  for (const point of sweep.points) {
    const cells = sweep.axes.map((a) => csvNumber(point.params[a.name]));
    for (const f of sweep.families) {
      const m = memberAt(f, point.index);
      if (!m) {
        for (let i = 0; i < FAMILY_COLUMNS.length; i++) cells.push('');
        continue;
      }
      const site = point.study.sites[m.site];
      const singular = site.verdict === 'singular';
      cells.push(
        csvText(site.id),
        csvNumber(site.at[0]),
        csvNumber(site.at[1]),
        csvText(site.feature.kind),
        csvText(site.verdict),
        csvNumber(singular ? undefined : site.estimate.value),
        csvNumber(singular ? undefined : site.estimate.uncertainty),
        csvNumber(site.growth.exponent),
        csvNumber(site.growth.theory),
        csvNumber(site.readouts.atDistance),
      );
    }
    rows.push(cells.join(','));
  }
  return rows.join(EOL) + EOL;
}
