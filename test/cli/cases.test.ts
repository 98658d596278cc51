/**
 * `--case NAME` of `study` and `solve` (docs/model-format.md, "Load cases"): one case's own result on
 * stdout, the envelope without it, and a clear usage error for a name the model does not have.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../pipeline/helpers.js';
import { holePlateModel } from '../helpers/hole-plate.js';

const dir = mkdtempSync(join(tmpdir(), 'peakwise-cases-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const file = join(dir, 'plate.yaml');
writeFileSync(file, holePlateModel('plate with a hole in two cases', `
cases:
  pull: [ { where: { x: 100 }, traction: [10, 0] } ]
  lift: [ { where: { y: 60 }, traction: [0, 25] } ]
combinations:
  both: "1.5*pull + lift"
mesh: { size: 10, order: 2 }
study: { levels: 2 }
`));

describe('--case', () => {
  it('study --case NAME --json prints the own result of that case; study.json keeps every case and the envelope', async () => {
    const out = join(dir, 'study');
    const r = await runCli(['study', file, '--case', 'lift', '--json', '--quiet', '--out', out]);
    expect(r.code, r.stderr).toBe(0);
    const shown = JSON.parse(r.stdout) as { sites: { case: string }[]; cases?: unknown; envelope?: unknown; solution: { appliedSum: number[] } };
    expect(shown.cases).toBeUndefined();
    expect(shown.envelope).toBeUndefined();
    expect(shown.sites.length).toBeGreaterThan(0);
    expect(shown.sites.every((s) => s.case === 'lift')).toBe(true);
    // lift: 25 on the top edge, 100 long, thickness 1
    expect(shown.solution.appliedSum[1]).toBeCloseTo(2500, 6);
    const saved = JSON.parse(readFileSync(join(out, 'study.json'), 'utf8')) as { cases: { name: string }[]; envelope: { governing: string }[] };
    expect(saved.cases.map((c) => c.name)).toEqual(['pull', 'lift', 'both']);
    expect(saved.envelope.length).toBe(shown.sites.length);
  });

  it('study without --case prints the envelope with the governing case of each site', async () => {
    const r = await runCli(['study', file, '--quiet', '--out', join(dir, 'study2')]);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toContain('envelope of pull, lift, both = 1.5*pull + lift');
    expect(r.stdout).toMatch(/governs/);
  });

  it('solve --case shows that case and names the others', async () => {
    const r = await runCli(['solve', file, '--case', 'both', '--json', '--out', join(dir, 'solve')]);
    expect(r.code, r.stderr).toBe(0);
    const rec = JSON.parse(r.stdout) as { case: string; cases: string[]; solution: { appliedSum: number[] } };
    expect(rec.case).toBe('both');
    expect(rec.cases).toEqual(['pull', 'lift', 'both']);
    // 1.5 × (10 × 60) in x, 25 × 100 in y
    expect(rec.solution.appliedSum[0]).toBeCloseTo(900, 6);
    expect(rec.solution.appliedSum[1]).toBeCloseTo(2500, 6);
  });

  it('a name the model does not have is a usage error with a hint, exit status 1, no stack trace', async () => {
    const r = await runCli(['study', file, '--case', 'lfit', '--out', join(dir, 'bad')]);
    expect(r.code).toBe(1);
    expect(r.stderr).toContain("--case lfit: no load case or combination of that name (did you mean 'lift'?); the model has pull, lift, both");
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });
});
