/**
 * Issue 15 §4 in a real browser (Debian's Chromium, headless): a study with values reported by another
 * analysis shows the "Reported vs peakwise" table right after the verdict table, and each reported value
 * as its own marker, with a legend entry, on its site's convergence plot, at the reported size and value.
 * Skipped only when /usr/bin/chromium is missing and CI is not set; under CI it must run.
 */
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type Browser } from 'playwright-core';
import { reportHtml } from '../../src/report/index.js';
import { parseModel } from '../../src/model/index.js';
import { runStudy, type BaseSolve } from '../../src/study/index.js';

const CHROMIUM = '/usr/bin/chromium';
const haveChromium = existsSync(CHROMIUM);
const inCi = Boolean(process.env.CI);

describe.skipIf(!haveChromium && !inCi)('reported values in the report, in a real browser', () => {
  let browser: Browser;
  let dir: string;
  let url: string;

  beforeAll(async () => {
    if (!haveChromium) throw new Error(`CI is set but ${CHROMIUM} is missing: install chromium (see .ci/run)`);
    const file = 'models/l-bracket-sharp.yaml';
    const text = readFileSync(join(import.meta.dirname, '..', '..', file), 'utf8')
      + '\nreported:\n  - { at: [40, 40], value: 420, size: 0.5, label: global-run-12 }\n  - { at: [100, 20], value: 16.5, size: 5, label: far-point }\n';
    const model = parseModel(text, file);
    let base: BaseSolve | undefined;
    const study = runStudy(model, { levels: 3, onBase: (b) => { base = b; } });
    if (!base) throw new Error('the study gave no base solve');
    dir = mkdtempSync(join(tmpdir(), 'peakwise-reported-'));
    const out = join(dir, 'report.html');
    writeFileSync(out, reportHtml({ model, study, mesh: base.mesh, geometry: base.geometry, field: base.nodal, u: base.solution.u }));
    url = pathToFileURL(out).href;
    browser = await chromium.launch({ executablePath: CHROMIUM, args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-sync'] });
  });

  afterAll(async () => {
    await browser?.close();
    if (dir) rmSync(dir, { recursive: true, force: true });
  });

  it('the table follows the verdict table; each value is a visible marker with a legend on its site\'s plot', async () => {
    const page = await browser.newPage({ viewport: { width: 1100, height: 900 } });
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(String(e)));
    page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
    await page.goto(url, { waitUntil: 'load' });
    expect(errors).toEqual([]);

    // the section comes right after the verdicts, with one row per reported value
    const order = await page.$$eval('main section, body > section, section', (ss) => ss.map((s) => s.id).filter((id) => id));
    expect(order.indexOf('reported')).toBe(order.indexOf('verdicts') + 1);
    const rows = page.locator('#reported tbody tr');
    await expect(rows.count()).resolves.toBe(2);
    const first = (await rows.nth(0).innerText()).replace(/\s+/g, ' ');
    expect(first).toMatch(/global-run-12/);
    expect(first).toMatch(/mesh-dependent/);
    await expect(page.locator('#reported .caution').innerText()).resolves.toMatch(/not that the part is safe/);

    // the corner's plot carries the marker at h = 0.5 and value 420, inside the plot panel, and the legend
    const cornerSite = await rows.nth(0).getAttribute('data-site');
    const plot = page.locator(`svg.convergence-plot[data-site="${cornerSite}"]`);
    const marker = plot.locator('path.reported-marker');
    await expect(marker.count()).resolves.toBe(1);
    expect(await marker.isVisible()).toBe(true);
    await expect(plot.locator('text.reported-label').textContent()).resolves.toBe('reported by another analysis');
    const box = await marker.boundingBox();
    const panel = await plot.locator('rect').first().boundingBox();
    expect(box && panel).toBeTruthy();
    const cx = box!.x + box!.width / 2, cy = box!.y + box!.height / 2;
    expect(cx).toBeGreaterThan(panel!.x);
    expect(cx).toBeLessThan(panel!.x + panel!.width);
    expect(cy).toBeGreaterThan(panel!.y);
    expect(cy).toBeLessThan(panel!.y + panel!.height);
    // 420 lies between the level peaks the ladder brackets it with (h = 1 → 0.5 → 0.25 at the corner)
    const marks = await plot.locator('circle.level-point').evaluateAll((cs) => cs.map((c) => [Number(c.getAttribute('cx')), Number(c.getAttribute('cy'))]));
    const mx = Number(((await marker.getAttribute('d')) ?? '').match(/^M([\d.]+)/)![1]);
    expect(mx).toBeCloseTo(marks[1][0], 0); // the second level has h = 0.5: the same x
    // the far point was studied as its own site, and its plot has a marker too
    const farSite = await rows.nth(1).getAttribute('data-site');
    await expect(page.locator(`svg.convergence-plot[data-site="${farSite}"] path.reported-marker`).count()).resolves.toBe(1);
    await page.close();
  });
});
