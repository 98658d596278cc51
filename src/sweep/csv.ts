/**
 * sweep.csv: one row per sweep point; the varied parameters first, then eight columns per site
 * family (F1_id, F1_feature, … as in docs/sweep.md). A family without a site at a point leaves
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
      const site = point.study.sites[m.site];
      cells.push(
        csvText(site.id),
        csvNumber(site.at[0]),
        csvNumber(site.at[1]),
        csvText(site.feature.kind),
        csvText(site.verdict),
        csvNumber(site.estimate.value),
        csvNumber(site.estimate.uncertainty),
        csvNumber(site.growth.exponent),
        csvNumber(site.growth.theory),
        csvNumber(site.readouts.atDistance),
      );
    }
    rows.push(cells.join(','));
  }
  return rows.join(EOL) + EOL;
}
