import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { beforeAll, describe, expect, it } from 'vitest';
import { recordedChecks } from '../../src/cli/checks-record.js';
import { CHECK_CASES, checksJson, runChecks, type ChecksJson } from '../../src/check/index.js';
import { VERSION } from '../../src/version.js';

const recordFile = join(import.meta.dirname, '..', '..', 'docs', 'verification.json');

/*
 * docs/verification.json (and .md) are written by `node dist/check/generate-doc.js` and shown in every
 * report's verification strip. The record must be the suite's current output: the same rows, the same
 * values and the same verdicts — regenerate it whenever a case or the pipeline changes a number.
 */
let fresh: ChecksJson['cases'] = [];
beforeAll(() => {
  fresh = checksJson(runChecks()).cases;
}, 300_000);

describe('verification strip of the reports', () => {
  it('reads the record of this version: one row per check case row, all passing', () => {
    const rows = recordedChecks(pathToFileURL(recordFile));
    // every case of the suite has at least one row in the record (regenerate with node dist/check/generate-doc.js)
    expect(rows.length).toBeGreaterThanOrEqual(CHECK_CASES.length);
    expect(rows.every((r) => r.pass)).toBe(true);
  });
  it('the record holds the values the suite computes now (regenerate with node dist/check/generate-doc.js)', () => {
    const rec = JSON.parse(readFileSync(recordFile, 'utf8')) as { version: string } & ChecksJson;
    expect(rec.version).toBe(VERSION);
    expect(rec.cases.map((c) => c.name)).toEqual(fresh.map((c) => c.name));
    // 1e−6 relative: far above the round-off of another platform's libm, far below any change of a
    // mesh, a fit or a tolerance (those move the figures by 1e−5 or more)
    const close = (a: number | null, b: number | null) => (a === null || b === null ? a === b : Math.abs(a - b) <= 1e-6 * Math.max(Math.abs(a), Math.abs(b), 1e-300));
    fresh.forEach((c, i) => {
      const r = rec.cases[i];
      expect(close(r.value, c.value), `${c.name}: recorded ${r.value}, now ${c.value}`).toBe(true);
      expect(close(r.reference, c.reference), `${c.name}: reference`).toBe(true);
      expect(r.tolerance, `${c.name}: tolerance`).toBe(c.tolerance);
      expect(close(r.halfWidth ?? null, c.halfWidth), `${c.name}: band half-width`).toBe(true);
      expect(r.insideBand ?? null, `${c.name}: reference inside band`).toBe(c.insideBand);
      expect(r.pass, `${c.name}: pass`).toBe(c.pass);
    });
  });
  it('ignores a record of another version and a missing file', () => {
    const dir = mkdtempSync(join(tmpdir(), 'pw-rec-'));
    const f = join(dir, 'v.json');
    writeFileSync(f, JSON.stringify({ version: '0.0.0-other', cases: [{ name: 'x', source: 's', pass: true, value: 1, reference: 1 }] }));
    expect(recordedChecks(pathToFileURL(f))).toEqual([]);
    expect(recordedChecks(pathToFileURL(join(dir, 'none.json')))).toEqual([]);
  });
});
