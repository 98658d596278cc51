import { describe, it, expect, beforeAll } from 'vitest';
import { CHECK_CASES, checksHtml, checksJson, checksMarkdown, checksTable, runChecks, tadaCentreCrackK, feddersenCentreCrackK, extrapolateK, type CheckResult } from '../../src/check/index.js';

/*
 * The built-in verification suite of `peakwise check`, run once; every case must pass against its
 * closed form (sources and tolerances are stated in src/check/cases.ts, one per case).
 */
let results: CheckResult[] = [];
beforeAll(() => {
  results = runChecks();
}, 300_000);

describe('peakwise check: every case passes', () => {
  it('runs every case and names a source for each', () => {
    expect(results.length).toBeGreaterThanOrEqual(CHECK_CASES.length);
    for (const r of results) {
      expect(r.failure, r.name).toBeUndefined();
      expect(r.source.length, r.name).toBeGreaterThan(0);
    }
  });
  it.each(CHECK_CASES.map((c) => c.id))('case %s is within its tolerance', (id) => {
    const rows = results.filter((r) => r.caseId === id);
    expect(rows.length).toBeGreaterThan(0);
    for (const r of rows) {
      expect(r.error, `${r.name}: ${r.value} vs ${r.reference}`).toBeLessThanOrEqual(r.tolerance);
      expect(r.pass, r.name).toBe(true);
    }
  });
  it('covers the cases issue 7 asks for', () => {
    const names = results.map((r) => r.name).join('\n');
    for (const w of [/Kirsch.*peak/, /Kirsch.*along the edge/, /strip hole/, /Inglis/, /Lamé/, /cantilever/, /patch test/, /Williams 270°/, /Williams crack/, /centre crack: K_I/]) {
      expect(names).toMatch(w);
    }
    expect(results.filter((r) => r.caseId?.startsWith('strip-')).length).toBe(3);
    expect(results.filter((r) => r.caseId?.startsWith('inglis-')).length).toBe(2);
  });
});

describe('checksJson / checksTable', () => {
  it('JSON has exactly { cases: [ { name, source, quantity, reference, value, error, tolerance, halfWidth, insideBand, pass } ] }', () => {
    const json = JSON.parse(JSON.stringify(checksJson(results)));
    expect(Object.keys(json)).toEqual(['cases']);
    expect(json.cases.length).toBe(results.length);
    for (const c of json.cases) {
      expect(Object.keys(c)).toEqual(['name', 'source', 'quantity', 'reference', 'value', 'error', 'tolerance', 'halfWidth', 'insideBand', 'pass']);
      expect(typeof c.name).toBe('string');
      expect(typeof c.reference).toBe('number');
      expect(typeof c.value).toBe('number');
      expect(typeof c.pass).toBe('boolean');
    }
  });
  it('a failing row shows FAIL and the summary counts it; NaN becomes null in JSON', () => {
    const bad: CheckResult = { name: 'broken', source: 'nobody 2000', quantity: 'q', reference: 1, value: NaN, error: NaN, tolerance: 0.01, pass: false };
    const table = checksTable([results[0], bad], { color: false });
    expect(table).toMatch(/FAIL/);
    expect(table).toMatch(/1 of 2 checks fail/);
    expect(table).toMatch(/engineer/); // the caution line
    expect(checksJson([bad]).cases[0].value).toBeNull();
    // no colour codes unless asked for
    expect(table).not.toMatch(/\u001b\[/);
  });
  it('unknown case ids are refused by name', () => {
    expect(() => runChecks({ only: ['no-such-case'] })).toThrow(/no-such-case/);
  });
});

describe('docs/verification.md and the HTML page', () => {
  it('markdown has one table row per case with the nine columns and escaped pipes', () => {
    const md = checksMarkdown(checksJson(results), { version: '0.1.0', command: 'test' });
    const rows = md.split('\n').filter((l) => l.startsWith('| ') && !l.startsWith('| case') && !l.startsWith('| ---'));
    expect(rows.length).toBe(results.length);
    for (const row of rows) {
      // 9 cells (case, source, quantity, reference, value, error, tolerance, inside band, result) → 10 unescaped bars
      expect(row.replace(/\\\|/g, '').split('|').length - 1).toBe(10);
    }
    expect(md).toMatch(/all \d+ cases passed/);
    // the count says which references are published and which are our own FE values (issue 17)
    const fe = results.filter((r) => r.source.startsWith('independent FE computation')).length;
    expect(fe).toBeGreaterThan(0);
    expect(md).toContain(`${results.length - fe} of the ${results.length} compare with published results`);
    expect(md).toContain(`${fe} with reference values of an **independent FE computation**`);
    expect(md).not.toMatch(/reference notes|\.\.\/shared/);
  });
  it('the HTML page escapes text and has no scripts or external files', () => {
    const bad: CheckResult = { name: '<b>x</b>', source: 'A & B 1999', quantity: 'q', reference: 1, value: 2, error: 1, tolerance: 0.1, pass: false };
    const html = checksHtml([bad], { version: '0.1.0' });
    expect(html).toContain('&lt;b&gt;x&lt;/b&gt;');
    expect(html).toContain('A &amp; B 1999');
    expect(html).toMatch(/1 of 1 checks fail/);
    expect(html).not.toMatch(/<script|<link|src=/);
  });
});

describe('centre-crack closed forms and the extrapolation', () => {
  it('Tada, Paris & Irwin (2000) and Feddersen (1966) centre-crack values (W = 1, a = 0.1: 0.574221, 0.574740)', () => {
    expect(tadaCentreCrackK(1, 0.1, 1)).toBeCloseTo(0.574221, 6);
    expect(feddersenCentreCrackK(1, 0.1, 1)).toBeCloseTo(0.574740, 6);
  });
  it('extrapolation returns K exactly for the Griffith opening linearised in r (K(r) = K(1 − r/4a))', () => {
    // u_y = (4/E)√(r/2π)·K(r) inverted from the extraction formula with a linear K(r)
    const E = 1000, K = 0.7, a = 0.1;
    const r = [0.01, 0.02, 0.03, 0.04, 0.05];
    const uy = r.map((ri) => (4 / E) * Math.sqrt(ri / (2 * Math.PI)) * K * (1 - ri / (4 * a)));
    expect(extrapolateK(r, uy, E, 0.3, 'plane-stress', 0.005, 0.06).K).toBeCloseTo(K, 12);
  });
});

