/**
 * Values another analysis reported (issue 15), as the terminal and the HTML page show them: a short
 * finding per value for the verdict table's column, and the "reported vs peakwise" rows.
 */
import type { ReportedAssessment, StudyResult } from '../study/types.js';
import { escapeXml, formatNumber, formatPoint, stripControl } from './text.js';

/** Under every reported-values table: agreement is not safety. */
export const REPORTED_CAUTION =
  'A match says the two models agree at that spot, not that the part is safe: the design check against the applicable code stays with a qualified engineer.';

/** The finding in a few words: "10 % low", "models differ", "mesh-dependent", … */
export function reportedShort(a: ReportedAssessment): string {
  switch (a.finding) {
    case 'models-differ': return 'models differ';
    case 'low': case 'high': return `${formatNumber(Math.abs(100 * (a.offset ?? NaN)), 2)} % ${a.finding}`;
    case 'converged': return 'converged (inside the band)';
    case 'not-compared': return 'not compared';
    default: return a.finding;
  }
}

/** Name of a reported value: its label, else where it was written. */
export function reportedName(a: ReportedAssessment): string {
  return stripControl(a.label ?? a.keyPath);
}

/** The verdict table's cell for one site: its reported values and their findings. */
export function reportedCell(study: Pick<StudyResult, 'reported'>, siteId: string): string {
  return (study.reported ?? []).filter((a) => a.site === siteId).map((a) => `${formatNumber(a.value)} → ${reportedShort(a)}`).join('; ');
}

/** Terminal lines under the verdict table: one per reported value, in plain words. */
export function reportedLines(study: Pick<StudyResult, 'reported' | 'units'>): string[] {
  const rep = study.reported ?? [];
  if (rep.length === 0) return [];
  const L = study.units.length;
  const lines = ['Reported values (another analysis) against peakwise:'];
  for (const a of rep) {
    lines.push(`  ${reportedName(a)} at ${formatPoint(a.at, L)}, size ${formatNumber(a.size)} ${stripControl(L)} → ${stripControl(a.site)}${a.added ? ' (studied as a listed point)' : ''}: ${stripControl(a.words)}`);
    if (a.warning) lines.push(`    warning: ${stripControl(a.warning)}`);
  }
  lines.push(`  ${REPORTED_CAUTION}`);
  return lines;
}

/** The HTML section "Reported vs peakwise", placed right after the verdict table. */
export function reportedSectionHtml(study: Pick<StudyResult, 'reported' | 'units'>, siteAnchor: (id: string) => string): string {
  const rep = study.reported ?? [];
  if (rep.length === 0) return '';
  const { length: L, stress: S } = study.units;
  const rows = rep.map((a) => {
    const ours = a.ours ? `${formatNumber(a.ours.value)} ± ${formatNumber(a.ours.band)}${a.ours.from === 'ladder' ? '' : ` (${a.ours.from === 'own solve' ? `own solve, order ${a.ours.order}` : 'extrapolated'})`}` : '—';
    return `<tr class="reported-row finding-${escapeXml(a.finding)}" data-site="${escapeXml(a.site)}">` +
      `<td>${escapeXml(reportedName(a))}</td><td>${escapeXml(formatPoint(a.at, L))}</td><td>${escapeXml(formatNumber(a.size))}</td>` +
      `<td>${escapeXml(formatNumber(a.value))}</td><td>${escapeXml(ours)}</td>` +
      `<td><a href="#${siteAnchor(a.site)}">${escapeXml(a.site)}</a>${a.added ? ' (added)' : ''}</td>` +
      `<td><b>${escapeXml(reportedShort(a))}</b></td><td>${escapeXml(a.words)}${a.warning ? `<br/><span class="small">warning: ${escapeXml(a.warning)}</span>` : ''}</td></tr>`;
  }).join('');
  return `<section id="reported"><h2>Reported vs peakwise</h2>
<table class="verdicts reported"><thead><tr><th>reported</th><th>at</th><th>size (${escapeXml(L)})</th><th>value (${escapeXml(S)})</th><th>peakwise at that size (${escapeXml(S)})</th><th>site</th><th>finding</th><th>what it is worth</th></tr></thead><tbody>${rows}</tbody></table>
<p class="legend-text">${escapeXml(`Each value another analysis reported is set beside the site it belongs to. First: does peakwise, at the same element size, give the same number within its band (the change over sizes ×/÷ 1.25) plus ${formatNumber(100 * (rep[0]?.tolerance ?? 0.05))} %? If not, the models differ there. Then, by the site's verdict: how far it is from the converged value and the element size the other mesh needs; or, at a singular site, that the number is set by the mesh.`)}</p>
<p class="caution">${escapeXml(REPORTED_CAUTION)}</p>
</section>`;
}
