import { readFileSync } from 'node:fs';
import type { ReportCheck } from '../report/index.js';
import { VERSION } from '../version.js';

/**
 * The verification strip of a report: the closed-form checks as last recorded for this version
 * in docs/verification.json (written with docs/verification.md by `node dist/check/generate-doc.js`).
 * A record of another version, or none, gives an empty strip — the page then says so and points
 * to `peakwise check`.
 */
export function recordedChecks(file: URL = new URL('../../docs/verification.json', import.meta.url)): ReportCheck[] {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch {
    return [];
  }
  try {
    const rec = JSON.parse(text) as { version?: string; date?: string; cases?: { name: string; source: string; pass: boolean; value: number | null; reference: number | null }[] };
    if (rec.version !== VERSION || !Array.isArray(rec.cases)) return [];
    return rec.cases.map((c) => ({
      name: c.name,
      pass: c.pass === true,
      detail: `${c.value ?? '—'} against ${c.reference ?? '—'} (${c.source}); recorded ${rec.date ?? ''} for peakwise ${rec.version}`,
    }));
  } catch {
    return [];
  }
}
