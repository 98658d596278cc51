import { readFileSync } from 'node:fs';
import { errorText, formatFigure } from '../check/run.js';
import { referenceKind } from '../check/markdown.js';
import type { ReportCheck } from '../report/index.js';
import { VERSION } from '../version.js';

interface RecordedCase {
  name: string; source: string; quantity?: string; pass: boolean;
  value: number | null; reference: number | null; error?: number | null; tolerance?: number | null;
}

/**
 * The verification strip of a report: the verification checks as last recorded for this version
 * in docs/verification.json (written with docs/verification.md by `node dist/check/generate-doc.js`).
 * Each row carries its figures to 6 significant digits, what they are, and when and by which
 * version they were recorded. A record of another version, or none, gives an empty strip — the
 * page then says so and points to `peakwise check`. The default path is relative to this code's
 * file: tsc's dist/cli/ and the bundle's dist/bundle/ sit at the same depth (DEVELOPERS.md, "Build").
 */
export function recordedChecks(file: URL = new URL('../../docs/verification.json', import.meta.url)): ReportCheck[] {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch {
    return [];
  }
  try {
    const rec = JSON.parse(text) as { version?: string; date?: string; cases?: RecordedCase[] };
    if (rec.version !== VERSION || !Array.isArray(rec.cases)) return [];
    const fig = (v: number | null | undefined) => (v === null || v === undefined ? '—' : formatFigure(v));
    const recorded = { date: rec.date ?? 'an unrecorded date', version: rec.version };
    return rec.cases.map((c) => {
      const q = c.quantity ?? '';
      const err = c.error === null || c.error === undefined ? '' : `; error ${errorText({ quantity: q }, c.error)}`;
      const tol = c.tolerance === null || c.tolerance === undefined ? '' : `, tolerance ${errorText({ quantity: q }, c.tolerance)}`;
      return {
        name: c.name,
        pass: c.pass === true,
        detail: `${fig(c.value)} against ${fig(c.reference)}${q ? ` (${q})` : ''}${err}${tol}; reference: ${c.source}`,
        referenceKind: referenceKind(c.source),
        recorded,
      };
    });
  } catch {
    return [];
  }
}
