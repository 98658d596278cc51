/**
 * `peakwise study --watch` as a user meets it (issue 16 §4): the built binary watching a model whose
 * outline comes from a CSV file, the served report open in Debian's Chromium (headless). Edit and
 * save the model: the table is printed again and the open page reloads by itself with the new
 * result. A bad edit: one line on stderr, a bar on the page, the watch goes on. Save the imported
 * outline: another run. Meanwhile another run into the folder is refused (the watch holds the
 * lock), and the report file written is byte for byte the one of a plain `peakwise study`.
 *
 * The independent check of the new result is linearity: doubling the end traction doubles every
 * stress of a linear elastic plate on the same meshes (the size fields do not depend on the load),
 * so the first site's value must double, to the 5 significant figures the page shows.
 * Skipped only when /usr/bin/chromium is missing and CI is not set; under CI it must run.
 */
import { spawn, execFile, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync, renameSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chromium, type Browser, type Page } from 'playwright-core';
import { bin, root } from '../helpers/bin.js';

const CHROMIUM = '/usr/bin/chromium';
const haveChromium = existsSync(CHROMIUM);
const inCi = Boolean(process.env.CI);

const OUTLINE = 'x,y\n0,0\n120,0\n120,40\n40,40\n40,120\n0,120\n';
const model = (tau: string) => `title: Shelf hanger under watch
units: { length: mm, force: N }
material: { E: 210000, nu: 0.3 }
thickness: 10
state: plane-stress
plate:
  outline: { points: outline.csv }
supports:
  - { where: { y: 120 }, fix: [x, y] }
loads:
  - { where: { x: 120 }, traction: [0, ${tau}] }
mesh: { size: 8, order: 2 }
study: { measure: von-mises, levels: 3, ratio: 2 }
`;

/** Save the way many editors do: write a new file beside it, rename it over the old one. */
function save(path: string, text: string): void {
  writeFileSync(`${path}.saving`, text);
  renameSync(`${path}.saving`, path);
}

function runOnce(args: string[], cwd: string): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(process.execPath, [bin, ...args], { cwd, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' }, timeout: 120_000 }, (err, stdout, stderr) => {
      resolve({ code: err ? (typeof err.code === 'number' ? err.code : -1) : 0, stdout, stderr });
    });
  });
}

describe.skipIf(!haveChromium && !inCi)('study --watch in a real browser', () => {
  let dir: string;
  let child: ChildProcess;
  let stderr = '';
  let stdout = '';
  let browser: Browser;
  let page: Page;
  let url = '';

  /** resolves once stderr has shown `pattern` `count` times */
  const waitFor = (pattern: RegExp, count: number, ms = 90_000): Promise<void> => new Promise((resolve, reject) => {
    const started = Date.now();
    const look = (): void => {
      const n = stderr.match(new RegExp(pattern.source, 'g'))?.length ?? 0;
      if (n >= count) return resolve();
      if (Date.now() - started > ms) return reject(new Error(`timed out waiting for ${pattern} ×${count}; stderr:\n${stderr}`));
      setTimeout(look, 50);
    };
    look();
  });

  /** the first site's value on the open page (the verdicts table: "85.876 ± 0.049 MPa") */
  const firstValue = async (): Promise<number> => {
    const text = await page.locator('#verdicts').innerText();
    const m = /(-?[0-9.]+) ± [0-9.]+ MPa/.exec(text);
    if (!m) throw new Error(`no value in the verdicts table:\n${text}`);
    return Number(m[1]);
  };
  const runId = (): Promise<string | null> => page.locator('meta[name="peakwise-run"]').getAttribute('content');

  beforeAll(async () => {
    if (!haveChromium) throw new Error(`CI is set but ${CHROMIUM} is missing: install chromium (see .ci/run)`);
    dir = mkdtempSync(join(tmpdir(), 'peakwise-watch-'));
    writeFileSync(join(dir, 'outline.csv'), OUTLINE);
    writeFileSync(join(dir, 'hanger.yaml'), model('-6'));
    child = spawn(process.execPath, [bin, 'study', 'hanger.yaml', '--watch', '--out', 'out', '--jobs', '2'], { cwd: dir, env: { ...process.env, NO_COLOR: '1' } });
    child.stderr!.setEncoding('utf8').on('data', (c: string) => { stderr += c; });
    child.stdout!.setEncoding('utf8').on('data', (c: string) => { stdout += c; });
    await waitFor(/written in/, 1);
    url = /the report is at (http:\/\/127\.0\.0\.1:\d+\/report\.html)/.exec(stderr)![1];
    browser = await chromium.launch({
      executablePath: CHROMIUM,
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-quic', '--no-first-run', '--disable-sync'],
    });
    page = await browser.newPage();
    await page.goto(url, { waitUntil: 'load' });
  });

  afterAll(async () => {
    await browser?.close();
    if (child && child.exitCode === null) {
      child.kill('SIGKILL');
    }
    if (dir) rmSync(dir, { recursive: true, force: true });
  }, 150_000);

  it('edit and save: the table is printed again and the open page reloads with the doubled result', async () => {
    const before = await firstValue();
    const id0 = await runId();
    expect(stdout.match(/Shelf hanger under watch/g)?.length).toBe(1);
    const requests: string[] = [];
    page.on('request', (r) => requests.push(r.url()));
    const reloaded = page.waitForEvent('load', { timeout: 90_000 });
    save(join(dir, 'hanger.yaml'), model('-12'));
    await reloaded;
    await waitFor(/written in/, 2);
    expect(await runId()).not.toBe(id0);
    const after = await firstValue();
    // linearity (see the file note); the page rounds to 5 significant figures: |Δ| ≤ 2 units of the last digit
    expect(Math.abs(after - 2 * before)).toBeLessThanOrEqual(2 * 10 ** (Math.floor(Math.log10(Math.abs(after))) - 4));
    expect(stdout.match(/Shelf hanger under watch/g)?.length).toBe(2);
    // the page asked this server for itself and its event stream, nothing else
    expect(requests.every((r) => r.startsWith(url.replace('report.html', '')))).toBe(true);
  }, 150_000);

  it('meanwhile the folder is locked: another run into it is refused', async () => {
    const other = await runOnce(['study', 'hanger.yaml', '--out', 'out', '--quiet'], dir);
    expect(other.code).toBe(1);
    expect(other.stderr).toMatch(/is writing into this folder/);
  }, 150_000);

  it('a bad edit prints one line, shows it on the page and the watch goes on; fixing it reloads the page', async () => {
    const id1 = await runId();
    save(join(dir, 'hanger.yaml'), model('-12').replace('thickness: 10', 'thickness: [10'));
    await waitFor(/still watching/, 1);
    const line = stderr.split('\n').find((l) => /hanger\.yaml:\d+:\d+/.test(l));
    expect(line).toMatch(/^peakwise: hanger\.yaml:\d+:\d+/);
    await page.locator('#peakwise-watch-error').waitFor({ timeout: 10_000 });
    expect(await page.locator('#peakwise-watch-error').innerText()).toContain('hanger.yaml:');
    expect(await runId()).toBe(id1); // not reloaded: the last good result stays on screen
    const reloaded = page.waitForEvent('load', { timeout: 90_000 });
    save(join(dir, 'hanger.yaml'), model('-6'));
    await reloaded;
    await waitFor(/written in/, 3);
    expect(await page.locator('#peakwise-watch-error').count()).toBe(0);
  }, 150_000);

  it('saving the imported outline starts a run too', async () => {
    const id2 = await runId();
    const reloaded = page.waitForEvent('load', { timeout: 90_000 });
    save(join(dir, 'outline.csv'), OUTLINE.replace('120,40', '120,42'));
    await reloaded;
    await waitFor(/outline\.csv changed/, 1);
    await waitFor(/written in/, 4);
    expect(await runId()).not.toBe(id2);
  }, 150_000);

  it('the report written is the one a plain study writes; Ctrl-C ends the watch and frees the folder', async () => {
    const watched = readFileSync(join(dir, 'out', 'report.html'), 'utf8');
    expect(watched).not.toContain('EventSource');
    child.kill('SIGINT');
    const code = await new Promise<number | null>((resolve) => child.once('exit', (c) => resolve(c)));
    expect(code).toBe(0);
    expect(existsSync(join(dir, 'out', 'run.lock'))).toBe(false);
    const plain = await runOnce(['study', 'hanger.yaml', '--out', 'plain', '--quiet'], dir);
    expect(plain.code).toBe(0);
    expect(readFileSync(join(dir, 'plain', 'report.html'), 'utf8')).toBe(watched);
    expect(readFileSync(join(dir, 'plain', 'study.json'), 'utf8').replace(/"totalS": [0-9.e+-]+/, ''))
      .toBe(readFileSync(join(dir, 'out', 'study.json'), 'utf8').replace(/"totalS": [0-9.e+-]+/, ''));
  }, 150_000);
});
