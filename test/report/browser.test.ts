/**
 * Opens the demo report in Debian's Chromium (headless) and checks what an engineer would see:
 * no console errors, no network requests, every site section and plot present, the hostile
 * title shown as text, and a contour picture with real colour variety.
 * Skipped only when /usr/bin/chromium is missing and CI is not set; under CI it must run.
 */
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type Browser } from 'playwright-core';
import { reportHtml, type ReportInput } from '../../src/report/index.js';
import { parseModel } from '../../src/model/index.js';
import { runStudy, type BaseSolve } from '../../src/study/index.js';
import { decodePng, distinctColours } from './png.js';

const CHROMIUM = '/usr/bin/chromium';
const haveChromium = existsSync(CHROMIUM);
const inCi = Boolean(process.env.CI);
const HOSTILE_TITLE = '<script>alert(1)</script> Skid bracket & "web"';

describe.skipIf(!haveChromium && !inCi)('report in a real browser', () => {
  let browser: Browser;
  let dir: string;
  let url: string;
  let input: ReportInput;

  /** the real pipeline on a demo model (3 levels keep it short), with a hostile title */
  function demoStudyReport(): ReportInput {
    const file = 'models/l-bracket-sharp.yaml';
    const model = parseModel(readFileSync(join(import.meta.dirname, '..', '..', file), 'utf8'), file);
    model.title = HOSTILE_TITLE;
    let base: BaseSolve | undefined;
    const study = runStudy(model, { levels: 3, onBase: (b) => { base = b; } });
    if (!base) throw new Error('the study gave no base solve');
    return { model, study, mesh: base.mesh, geometry: base.geometry, field: base.nodal, u: base.solution.u };
  }

  beforeAll(async () => {
    if (!haveChromium) throw new Error(`CI is set but ${CHROMIUM} is missing: install chromium (see .ci/run)`);
    input = demoStudyReport();
    expect(input.study.sites.length).toBeGreaterThanOrEqual(2);
    dir = mkdtempSync(join(tmpdir(), 'peakwise-report-'));
    const file = join(dir, 'report.html');
    writeFileSync(file, reportHtml(input));
    url = pathToFileURL(file).href;
    browser = await chromium.launch({
      executablePath: CHROMIUM,
      args: [
        '--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking',
        '--disable-component-update', '--disable-quic', '--no-first-run', '--disable-sync',
      ],
    });
  });

  afterAll(async () => {
    await browser?.close();
    if (dir) rmSync(dir, { recursive: true, force: true });
  });

  it('renders without console errors or network requests, with every section, plot and the title as text', async () => {
    const page = await browser.newPage({ viewport: { width: 1100, height: 900 } });
    const errors: string[] = [];
    const requests: string[] = [];
    const dialogs: string[] = [];
    page.on('console', (m) => {
      if (m.type() === 'error') errors.push(m.text());
    });
    page.on('pageerror', (e) => errors.push(String(e)));
    page.on('request', (r) => requests.push(r.url()));
    page.on('dialog', async (d) => {
      dialogs.push(d.message());
      await d.dismiss();
    });
    await page.goto(url, { waitUntil: 'load' });

    expect(errors).toEqual([]);
    expect(requests).toEqual([url]);
    expect(dialogs).toEqual([]);
    expect(await page.locator('h1').textContent()).toBe(HOSTILE_TITLE);
    expect(await page.locator('script').count()).toBe(0);
    for (const s of input.study.sites) {
      expect(await page.locator(`section#site-${s.id}`).count()).toBe(1);
      expect(await page.locator(`section#site-${s.id} svg.convergence-plot`).count()).toBe(1);
      expect(await page.locator(`section#site-${s.id} svg.contour-inset`).count()).toBe(1);
    }
    expect(await page.locator('svg.convergence-plot').count()).toBe(input.study.sites.length);

    // the mesh overlay is hidden until the toggle is switched on
    expect(await page.locator('svg.contour-main .mesh-overlay').isVisible()).toBe(false);
    await page.locator('label[for="show-mesh"]').click();
    expect(await page.locator('svg.contour-main .mesh-overlay').isVisible()).toBe(true);
    await page.locator('label[for="show-mesh"]').click();

    const shot = await page.locator('svg.contour-main').screenshot();
    const img = decodePng(shot);
    expect(img.width).toBeGreaterThan(300);
    // 56 colour bands plus anti-aliasing: far more than 20 distinct colours in a real picture
    expect(distinctColours(img)).toBeGreaterThan(20);

    await page.screenshot({ path: '/tmp/peakwise-report.png', fullPage: true });
    if (process.env.PEAKWISE_SHOTS) {
      await page.locator('#picture').screenshot({ path: '/tmp/pw-picture.png' });
      await page.locator('#verdicts').screenshot({ path: '/tmp/pw-verdicts.png' });
      for (const s of input.study.sites) await page.locator(`section#site-${s.id}`).screenshot({ path: `/tmp/pw-${s.id}.png` });
    }
    await page.close();
  });

  it('prints to A4 without errors', async () => {
    const page = await browser.newPage();
    await page.goto(url, { waitUntil: 'load' });
    await page.emulateMedia({ media: 'print' });
    const pdf = await page.pdf({ format: 'A4' });
    expect(pdf.subarray(0, 4).toString('latin1')).toBe('%PDF');
    // the toggle row is hidden in print
    expect(await page.locator('.toggle-row').isVisible()).toBe(false);
    await page.close();
  });
});
