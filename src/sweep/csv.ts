/**
 * sweep.csv: one row per sweep point; the varied parameters first, then eight columns per spot
 * family (F1_id, F1_feature, … as in docs/sweep.md). A family without a spot at a point leaves
 * its cells empty. Cells follow the report stage's CSV rules (quoted text, formula guard).
 */
import { csvNumber, csvText } from '../report/index.js';
import { memberAt } from './match.js';
import type { SweepResult } from './types.js';

const EOL = '\r\n';

/** The per-family column suffixes, in order. */
export const FAMILY_COLUMNS = ['id', 'x', 'y', 'feature', 'verdict', 'value', 'uncertainty', 'exponent', 'theory', 'at_distance'] as const;

export function sweepCsv(sweep: Pick<SweepResult, 'axes' | 'points' | 'families'>): string {
  const header = [...sweep.axes.map((a) => a.name)];
  for (const f of sweep.families) for (const c of FAMILY_COLUMNS) header.push(`${f.id}_${c}`);
  const rows = [header.map(csvText).join(',')];
  for (const point of sweep.points) {
    const cells = sweep.axes.map((a) => csvNumber(point.params[a.name]));
    for (const f of sweep.families) {
      const m = memberAt(f, point.index);
      if (!m) {
        for (let i = 0; i < FAMILY_COLUMNS.length; i++) cells.push('');
        continue;
      }
      const spot = point.study.spots[m.spot];
      cells.push(
        csvText(spot.id),
        csvNumber(spot.at[0]),
        csvNumber(spot.at[1]),
        csvText(spot.feature.kind),
        csvText(spot.verdict),
        csvNumber(spot.estimate.value),
        csvNumber(spot.estimate.uncertainty),
        csvNumber(spot.growth.exponent),
        csvNumber(spot.growth.theory),
        csvNumber(spot.readouts.atDistance),
      );
    }
    rows.push(cells.join(','));
  }
  return rows.join(EOL) + EOL;
}
