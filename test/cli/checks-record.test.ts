import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { describe, expect, it } from 'vitest';
import { recordedChecks } from '../../src/cli/checks-record.js';
import { CHECK_CASES } from '../../src/check/index.js';

describe('verification strip of the reports', () => {
  it('reads the record of this version: one row per check case row, all passing', () => {
    const rows = recordedChecks(pathToFileURL(join(import.meta.dirname, '..', '..', 'docs', 'verification.json')));
    // every case of the suite has at least one row in the record (regenerate with node dist/check/generate-doc.js)
    expect(rows.length).toBeGreaterThanOrEqual(CHECK_CASES.length);
    expect(rows.every((r) => r.pass)).toBe(true);
  });
  it('ignores a record of another version and a missing file', () => {
    const dir = mkdtempSync(join(tmpdir(), 'pw-rec-'));
    const f = join(dir, 'v.json');
    writeFileSync(f, JSON.stringify({ version: '0.0.0-other', cases: [{ name: 'x', source: 's', pass: true, value: 1, reference: 1 }] }));
    expect(recordedChecks(pathToFileURL(f))).toEqual([]);
    expect(recordedChecks(pathToFileURL(join(dir, 'none.json')))).toEqual([]);
  });
});
