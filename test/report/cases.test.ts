/**
 * The report of a study with load cases: the envelope table (every case's value per site, the
 * governing one marked), a section per case, the loads listed per case — and none of it for a
 * model without cases.
 */
import { describe, expect, it } from 'vitest';
import { reportHtml, sitesCsv, studyTable } from '../../src/report/index.js';
import { parseModel } from '../../src/model/index.js';
import { runStudy, type BaseSolve } from '../../src/study/index.js';
import { holePlateModel } from '../helpers/hole-plate.js';

const HEAD = holePlateModel('plate with a hole', `
mesh: { size: 10, order: 2 }
study: { levels: 2 }
`);

function report(text: string) {
  const model = parseModel(text, 'plate.yaml');
  let base: BaseSolve | undefined;
  const study = runStudy(model, { onBase: (b) => { base = b; } });
  const html = reportHtml({ model, study, mesh: base!.mesh, geometry: base!.geometry, field: base!.nodal, u: base!.solution.u });
  return { study, html };
}

describe('report with load cases', () => {
  const { study, html } = report(HEAD + 'cases:\n  pull: [ { where: { x: 100 }, traction: [10, 0] } ]\n  lift: [ { where: { y: 60 }, traction: [0, 25] } ]\ncombinations:\n  both: "pull + lift"\n');

  it('shows the envelope with every case and the governing one marked, and a section per case', () => {
    const env = html.slice(html.indexOf('<section id="envelope">'), html.indexOf('</section>', html.indexOf('<section id="envelope">')));
    expect(env).toContain('<th>pull</th>');
    expect(env).toContain('<th>lift</th>');
    expect(env).toContain('both<br/><small>pull + lift</small>');
    // one marked cell per site, naming the envelope's choice
    expect(env.match(/class="governs"/g)?.length).toBe(study.sites.length);
    for (const e of study.envelope!) expect(env).toContain(`<b>${e.governing}</b> (${e.basis})`);
    expect(html).toContain('<section id="cases">');
    expect(html.match(/<details class="case">/g)?.length).toBe(3);
    expect(html).toContain('Load case pull');
    expect(html).toContain('<th>governs</th>');
  });

  it('the terminal table and sites.csv name the governing case', () => {
    expect(studyTable(study, { color: false })).toContain('envelope of pull, lift, both = pull + lift');
    const csv = sitesCsv(study).split(/\r?\n/);
    expect(csv[0].endsWith(',"case"')).toBe(true);
    expect(csv[1].endsWith(`,"${study.sites[0].case}"`)).toBe(true);
  });

  it('a model without cases has none of it', () => {
    const one = report(HEAD + 'loads: [ { where: { x: 100 }, traction: [10, 0] } ]\n');
    expect(one.html).not.toContain('id="envelope"');
    expect(one.html).not.toContain('id="cases"');
    expect(one.html).not.toContain('<th>governs</th>');
    expect(sitesCsv(one.study).split('\n')[0]).not.toContain('case');
    expect(one.study.cases).toBeUndefined();
    expect(one.study.sites.every((s) => s.case === undefined)).toBe(true);
  });
});
