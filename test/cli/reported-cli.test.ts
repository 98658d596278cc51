/**
 * Issue 15 from the command line: a model listing reported values (one from a CSV), `peakwise study`
 * with `--cut … --cut-other …`: the terminal column and lines, study.json's `reported` list, cut.csv's
 * other-analysis columns, and a bad reported table as one line with exit status 1.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { root, runCli as run } from '../pipeline/helpers.js';


describe('reported values on the command line', () => {
  const dir = mkdtempSync(join(tmpdir(), 'peakwise-reported-cli-'));
  const demo = readFileSync(join(root, 'models', 'l-bracket-sharp.yaml'), 'utf8');
  writeFileSync(join(dir, 'peaks.csv'), 'label,x,y,value,size\nrun-7 corner,40,40,420,0.5\n');
  writeFileSync(join(dir, 'hanger.yaml'), `${demo}\nreported:\n  - { at: [44.8, 0], value: 80, size: 5, label: run-7 bottom }\n  - { table: peaks.csv }\n`);
  writeFileSync(join(dir, 'line.csv'), 'x,y,von_mises\n40,0,60\n80,0,70\n120,0,20\n');

  it('terminal column and lines, study.json, cut.csv with the other analysis and the difference', async () => {
    const out = join(dir, 'out');
    const r = await run(['study', join(dir, 'hanger.yaml'), '--levels', '3', '--out', out, '--cut', '40,0:120,0:21', '--cut-other', join(dir, 'line.csv')]);
    expect(r.stderr).not.toMatch(/\n\s+at /);
    expect(r.code).toBe(0);
    const header = r.stdout.split('\n').find((l) => l.startsWith('site '))!;
    expect(header).toMatch(/value ± discretisation band\s+reported\s+readouts/);
    expect(r.stdout).toMatch(/420 → mesh-dependent/);
    expect(r.stdout).toMatch(/run-7 bottom at \(44\.8, 0\) mm, size 5 mm → S\d: the models differ at this spot/);
    expect(r.stdout).toMatch(/not that the part is safe/);
    const study = JSON.parse(readFileSync(join(out, 'study.json'), 'utf8')) as { reported: { label: string; finding: string; keyPath: string }[] };
    expect(study.reported.map((a) => [a.label, a.finding, a.keyPath])).toEqual([
      ['run-7 bottom', 'models-differ', 'reported[0]'],
      ['run-7 corner', 'mesh-dependent', 'reported[1] (peaks.csv:2)'],
    ]);
    const cut = readFileSync(join(out, 'cut.csv'), 'utf8').split('\r\n').filter((l) => !l.startsWith('#'));
    const head = cut[0].split(',').map((h) => h.replace(/"/g, ''));
    const col = (name: string) => cut.slice(1, 22).map((l) => Number(l.split(',')[head.indexOf(name)]));
    // the line's samples are 4 mm apart: x = 60 lies halfway between the other points at 40 and 80
    expect(col('other_von_mises_MPa')[5]).toBeCloseTo(65, 9);
    const vm = col('von_mises_MPa'), diff = col('diff_other_von_mises_MPa'), other = col('other_von_mises_MPa');
    for (let k = 0; k < 21; k++) expect(diff[k]).toBeCloseTo(vm[k] - other[k], 9);
    expect(readFileSync(join(out, 'report.html'), 'utf8')).toMatch(/class="other-marker"/);
  }, 120_000);

  it('a bad reported table: one line naming model file, key and the CSV line; exit 1', async () => {
    writeFileSync(join(dir, 'bad.csv'), 'x,y,value,size\n44.8,0,80,-5\n');
    writeFileSync(join(dir, 'bad.yaml'), `${demo}\nreported:\n  - { table: bad.csv }\n`);
    const r = await run(['study', join(dir, 'bad.yaml'), '--out', join(dir, 'o2')]);
    expect(r.code).toBe(1);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/bad\.yaml:\d+:\d+ reported\[0\]\.table: bad\.csv:2: column 'size' must be > 0/);
  });
});
