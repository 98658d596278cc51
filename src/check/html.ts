/**
 * `peakwise check --report file`: one small self-contained HTML page (no scripts, no external
 * files) with the verification table and the caution. Pure: returns the text.
 */
import { CAUTION, escapeXml } from '../report/index.js';
import { TABLE_HEADER, tableRows } from './run.js';
import type { CheckResult } from './types.js';

const CSS = `
body { margin: 0 auto; max-width: 1180px; padding: 24px 28px 40px; color: #1f2933;
  font: 14px/1.5 system-ui, -apple-system, "Segoe UI", Roboto, sans-serif; }
h1 { font-size: 22px; margin: 0 0 4px; }
p.summary { margin: 0 0 12px; }
table { border-collapse: collapse; width: 100%; font-variant-numeric: tabular-nums; }
th, td { text-align: left; padding: 4px 8px; border-bottom: 1px solid #d9e2ec; vertical-align: top; }
thead th { border-bottom: 2px solid #334e68; }
td.num { text-align: right; white-space: nowrap; }
td.pass { color: #2b6a3a; font-weight: 700; }
td.fail { color: #a61e1e; font-weight: 700; }
.caution { border-left: 4px solid #b7791f; background: #fffaf0; padding: 6px 10px; margin: 16px 0; }
@media print { body { max-width: none; padding: 0; } }
`;

export function checksHtml(results: readonly CheckResult[], meta: { version: string; date?: string } = { version: '' }): string {
  const rows = tableRows(results);
  const failed = results.filter((r) => !r.pass).length;
  const numeric = new Set([3, 4, 5, 6]);
  const body = rows
    .map((cells, i) => {
      const tds = cells.map((cell, j) => {
        if (j === cells.length - 1) return `<td class="${results[i].pass ? 'pass' : 'fail'}">${escapeXml(cell)}</td>`;
        return `<td${numeric.has(j) ? ' class="num"' : ''}>${escapeXml(cell)}</td>`;
      });
      const failure = results[i].failure ? `<tr><td colspan="${cells.length}" class="fail">${escapeXml(results[i].failure!)}</td></tr>` : '';
      return `<tr>${tds.join('')}</tr>${failure}`;
    })
    .join('\n');
  const summary = failed === 0 ? `All ${results.length} checks pass.` : `${failed} of ${results.length} checks fail.`;
  const stamp = [meta.version ? `peakwise ${meta.version}` : 'peakwise', meta.date].filter(Boolean).join(' · ');
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>peakwise verification</title>
<style>${CSS}</style>
</head>
<body>
<h1>Verification against published results and independent FE reference values</h1>
<p class="summary">${escapeXml(summary)} <small>${escapeXml(stamp)}</small></p>
<p>Each case builds its own model, runs the solver and compares one number with a reference value: a published result or, where the source says “independent FE computation”, a value of an independent FE computation made for this project; rows that run a convergence study also show whether the reference lies inside the band. Errors are relative unless the quantity says otherwise.</p>
<table>
<thead><tr>${TABLE_HEADER.map((h) => `<th>${escapeXml(h)}</th>`).join('')}</tr></thead>
<tbody>
${body}
</tbody>
</table>
<p class="caution">${escapeXml(CAUTION)}</p>
</body>
</html>
`;
}
