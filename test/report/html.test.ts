import { describe, it, expect } from 'vitest';
import { CAUTION, reportHtml, stripControl } from '../../src/report/index.js';
import { checkXml, svgFragments } from './xml.js';
import { HOSTILE, cornerField, demoModel, demoReportInput, demoStudy, gridMesh, plateGeometry, smoothDisplacement } from './fixtures.js';

const unescape = (s: string) =>
  s.replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&#39;/g, "'").replace(/&amp;/g, '&');

describe('reportHtml', () => {
  const input = demoReportInput();
  const html = reportHtml(input);

  it('is one well-formed page whose pictures are all well-formed SVG', () => {
    expect(checkXml(html).errors).toEqual([]);
    const svgs = svgFragments(html);
    expect(svgs.length).toBe(1 + 2 * input.study.sites.length); // main contour, per site a plot and an inset
    for (const s of svgs) expect(checkXml(s).errors).toEqual([]);
  });

  it('has the sections an engineer reads: model, mesh, picture, verdicts, sites, verification, caution', () => {
    for (const id of ['model', 'mesh', 'picture', 'verdicts', 'sites', 'verification']) expect(html).toContain(`<section id="${id}">`);
    for (const s of input.study.sites) expect(html).toContain(`<section class="site" id="site-${s.id}">`);
    expect(html.match(/<svg [^>]*class="convergence-plot"/g)?.length).toBe(3);
    expect(html.match(/class="contour contour-inset"/g)?.length).toBe(3);
    expect(html.match(/class="contour contour-main"/g)?.length).toBe(1);
    expect(html.split(CAUTION).length - 1).toBe(2); // top and bottom of the page
    expect(html).toContain('2 of 3 checks passed in the run that made this report');
  });

  it('describes the model in words', () => {
    expect(html).toContain('The boundary on the line x = 0 mm is held in x and y.');
    expect(html).toContain('Traction (0, −20) MPa on the boundary on the line x = 400 mm.');
    expect(html).toContain('Concentrated force (0, −1500) N at the point (400, 75).');
    expect(html).toContain('E = 206000 MPa, ν = 0.3');
    expect(html).toContain('plane stress');
  });

  it('lists the health warnings of the study, escaped', () => {
    const w = reportHtml({ ...input, study: { ...input.study, warnings: ['fewer than 6 elements per quarter circle on <hole>'] } });
    expect(w).toContain('<ul class="warnings"><li>Warning: fewer than 6 elements per quarter circle on &lt;hole&gt;</li></ul>');
    expect(html).not.toContain('class="warnings"');
  });

  it('makes no external references (no scripts, links, images or url() fetches)', () => {
    expect(html).not.toMatch(/<script|<link|<img|<iframe|@import|https?:\/\/(?!www\.w3\.org\/)/i);
    for (const m of html.matchAll(/url\(([^)]*)\)/g)) expect(m[1].startsWith('#')).toBe(true);
  });

  it('escapes hostile text in every model string field', () => {
    const bad = reportHtml(demoReportInput(HOSTILE));
    expect(checkXml(bad).errors).toEqual([]);
    expect(bad).not.toMatch(/<script/i);
    expect(bad).not.toContain('\u001b');
    expect(bad).not.toContain('\u202e');
    const shown = stripControl(HOSTILE);
    const h1 = /<h1>([^<]*)<\/h1>/.exec(bad)?.[1] ?? '';
    expect(unescape(h1)).toBe(`Skid bracket web with a re-entrant notch ${shown}`);
    // title, file, units, opening id, site ids, reasons, advice and check names all reach the page as text
    const text = unescape(bad);
    for (const piece of [
      `models/skid-bracket.yaml ${shown}`, `opening “vent ${shown}”`, `S1 ${shown}`, `MPa ${shown}`,
      `add two refinement levels or spread the force over a short edge ${shown}`, `Kirsch hole, Kt = 3 ${shown}`,
    ]) {
      expect(text).toContain(piece);
    }
    // ids stay attribute-safe
    for (const m of bad.matchAll(/ id="([^"]*)"/g)) expect(m[1]).toMatch(/^[A-Za-z0-9_-]+$/);
  });
});

describe('report size for a 1 000 000-DOF model', () => {
  it('stays under 15 MB because the drawing is decimated', () => {
    // 354 × 354 cells of two LST triangles: (2·354 + 1)² = 502 681 nodes, 1 005 362 DOFs
    const big = { nx: 354, ny: 354, width: 400, height: 300, order: 2 as const, lShape: false };
    const mesh = gridMesh(big);
    expect(2 * (mesh.xy.length / 2)).toBeGreaterThan(1_000_000);
    const study = demoStudy();
    const html = reportHtml({
      model: demoModel(),
      study,
      mesh,
      geometry: plateGeometry(big),
      field: cornerField(mesh, [200, 150], 0.4555, 400),
      u: smoothDisplacement(mesh, 400),
    });
    const bytes = Buffer.byteLength(html, 'utf8');
    console.log(`report of ${2 * (mesh.xy.length / 2)} DOFs: ${(bytes / 1e6).toFixed(2)} MB`);
    expect(bytes).toBeLessThan(15e6);
    expect(html).toContain('regular resampling');
    for (const s of study.sites) expect(html).toContain(`id="site-${s.id}"`);
  });
});

describe('reportHtml for a single solve', () => {
  it('leaves out verdicts and points to the study instead', () => {
    const input = demoReportInput();
    input.study.sites = [];
    const html = reportHtml({ ...input, mode: 'solve' });
    expect(checkXml(html).errors).toEqual([]);
    expect(html).toContain('single solve');
    expect(html).toContain('<code>peakwise study</code>');
    expect(html).not.toContain('class="site"');
    expect(html).toContain('class="contour contour-main"');
    // the field peaks at the plate's 270° corner (200, 150): the page says that maximum is not a stress
    expect(unescape(html)).toContain('Warning: the maximum von Mises stress sits at the re-entrant corner (200, 150) mm, 270°, faces free/free: a singular point of the idealised geometry');
  });
});

describe('words a practising engineer can sign (issue 17)', () => {
  const input = demoReportInput();
  const html = reportHtml(input);
  const text = unescape(html.replace(/<svg[\s\S]*?<\/svg>/g, '').replace(/<[^>]+>/g, ' '));

  it('claims no more than the tool checks', () => {
    expect(text).not.toMatch(/design for it|second opinion|finds every|usable measures|pass in this build/i);
    // the ± is the discretisation band, and the legend says what it leaves out
    expect(text).toContain('value ± discretisation band');
    expect(text).toMatch(/discretisation band \(the estimated error of the mesh alone, not of the model, the loads or the material\)/);
    expect(text).toMatch(/compare it with what the applicable code asks for/);
    // how sites are found, and whose idealisation the model is
    expect(text).toMatch(/Sites are the points theory flags as singular .* above 1\.3 × its median, or the points the model lists/);
    expect(text).toContain('the user’s idealisation of the real detail');
  });

  it('gives every readout with its distance or radius, and K_I with its units in both forms', () => {
    expect(text).toContain('Point: stress at r = 0.5 mm along the inward bisector');
    expect(text).toContain('Area: mean over the disk r ≤ 0.5 mm');
    expect(text).toMatch(/point 118 MPa at r = 0\.5 mm; area mean 131\.2 MPa over r ≤ 0\.5 mm; K_I 812\.5 MPa·mm\^0\.460 \(33\.87 MPa·m\^0\.460\)/);
    expect(text).toContain('K_I: notch stress intensity of the opening mode');
    expect(text).toMatch(/point and line methods of the theory of critical distances \(Taylor 2007\)/);
  });

  it('flags a converged value above the yield stress', () => {
    const study = { ...input.study, yieldStress: 150, sites: input.study.sites.map((s) => (s.verdict === 'converging' ? { ...s, aboveYield: true as const } : s)) };
    const flagged = unescape(reportHtml({ ...input, study }));
    expect(flagged).toContain('182.40 ± 0.90 MPa (above yield)');
    expect(flagged).toContain('Above the yield stress (150 MPa): a linear-elastic result, so local yielding is expected here');
    expect(text).not.toContain('above yield');
  });

  it('says when and with which version a recorded verification ran, and which references are FE values', () => {
    const checks = [
      { name: 'Kirsch', pass: true, detail: '2.99451 against 3', referenceKind: 'published' as const, recorded: { date: '2026-12-01', version: '0.1.0' } },
      { name: 'strip', pass: true, detail: '3.37077 against 3.374', referenceKind: 'independent-fe' as const, recorded: { date: '2026-12-01', version: '0.1.0' } },
    ];
    const page = unescape(reportHtml({ ...input, checks }));
    expect(page).toContain('These are the results recorded on 2026-12-01 with peakwise 0.1.0 (docs/verification.json), not a run made for this report: 2 of 2 checks passed');
    expect(page).toContain('1 against published results');
    expect(page).toContain('1 against reference values of an independent FE computation made for this project');
    expect(page).toContain('(FE reference value)');
  });
});
