import { describe, it, expect } from 'vitest';
import { convergencePlotSvg } from '../../src/report/index.js';
import { checkXml } from './xml.js';
import { demoStudy } from './fixtures.js';

const study = demoStudy();
const [singular, converging, undecided] = study.sites;

function circles(svg: string): [number, number][] {
  return [...svg.matchAll(/<circle class="level-point" cx="([^"]+)" cy="([^"]+)"/g)].map((m) => [+m[1], +m[2]]);
}

function pathPoints(svg: string, cls: string): [number, number][] {
  const d = new RegExp(`<path class="${cls}" d="([^"]*)"`).exec(svg)?.[1] ?? '';
  return [...d.matchAll(/[ML]([-\d.]+) ([-\d.]+)/g)].map((m) => [+m[1], +m[2]]);
}

describe('convergencePlotSvg', () => {
  it('is well-formed for every verdict', () => {
    for (const s of study.sites) expect(checkXml(convergencePlotSvg(s, { units: 'MPa', lengthUnit: 'mm' })).errors).toEqual([]);
  });

  it('labels the fitted slope of a singular site with the study exponent to 2 decimals', () => {
    const svg = convergencePlotSvg(singular, { units: 'MPa', lengthUnit: 'mm' });
    const label = /class="slope-label" data-value="([^"]+)"[^>]*>([^<]*)</.exec(svg);
    expect(label?.[1]).toBe(singular.growth.exponent.toFixed(2));
    expect(label?.[2]).toBe(`fitted q = ${singular.growth.exponent.toFixed(2)}`);
    expect(svg).toContain(`theory q = ${singular.growth.theory.toFixed(2)}`);
    expect(svg).toContain('class="theory-line"');
  });

  it('labels a converging site with its observed order and draws the extrapolation band', () => {
    const svg = convergencePlotSvg(converging, { units: 'MPa' });
    const label = /class="slope-label" data-value="([^"]+)"/.exec(svg);
    expect(label?.[1]).toBe(converging.estimate.observedOrder.toFixed(2));
    expect(svg.match(/class="uncertainty-band"/g)?.length).toBe(2); // main and DOF panel
    // the band to two significant digits, the value to the same decimal place (issue 17)
    expect(svg).toContain('extrapolated 182.40 ± 0.90 MPa (discretisation band)');
  });

  it('labels an undecided site with its current growth exponent', () => {
    const svg = convergencePlotSvg(undecided, { units: 'MPa' });
    expect(/data-value="([^"]+)"/.exec(svg.slice(svg.indexOf('slope-label')))?.[1]).toBe('0.70');
  });

  it('passes the fitted line through exact power-law levels (peak = c·h^−q)', () => {
    // levels built with q = 0.4555 while the study reports 0.4562: the line with the study slope
    // fitted over the four finest levels (the study's singular window) lies within a pixel of them
    const svg = convergencePlotSvg(singular, { units: 'MPa' });
    const pts = circles(svg);
    const fit = pathPoints(svg, 'fit-line');
    expect(pts.length).toBe(5);
    expect(fit.length).toBe(2);
    // the fit spans the fourth-finest to the finest level
    expect(Math.abs(fit[0][0] - pts[1][0])).toBeLessThan(0.11);
    expect(Math.abs(fit[1][0] - pts[4][0])).toBeLessThan(0.11);
    expect(Math.abs(fit[0][1] - pts[1][1])).toBeLessThan(1);
    expect(Math.abs(fit[1][1] - pts[4][1])).toBeLessThan(1);
    // finer to the right: h halves per level, so x increases level by level in equal steps (log axis)
    const steps = pts.slice(1).map((p, i) => p[0] - pts[i][0]);
    for (const s of steps) expect(Math.abs(s - steps[0])).toBeLessThan(0.21);
    expect(steps[0]).toBeGreaterThan(0);
  });

  it('draws the converging fit through the levels it used (peak = value − 0.8·h^p)', () => {
    const svg = convergencePlotSvg(converging, { units: 'MPa' });
    const pts = circles(svg);
    const fit = pathPoints(svg, 'fit-line');
    expect(Math.abs(fit[0][1] - pts[2][1])).toBeLessThan(1);
    expect(Math.abs(fit[fit.length - 1][1] - pts[4][1])).toBeLessThan(1);
  });

  it('fills exactly the levels the study fits: the finest three when converging, the finest four otherwise', () => {
    // judgeSite: Richardson over the finest triple; the growth exponent over the finest VERDICT_RULES.singularWindow levels
    const filled = (svg: string, cls: string) => [...svg.matchAll(new RegExp(`<circle ${cls}[^>]*fill="([^"]+)"`, 'g'))].filter((m) => m[1] !== '#fff').length;
    for (const [site, n] of [[converging, 3], [singular, 4], [undecided, Math.min(4, undecided.levels.length)]] as const) {
      const svg = convergencePlotSvg(site, { units: 'MPa' });
      expect(svg).toContain('levels (filled: used in the fit)');
      expect(filled(svg, 'class="level-point"'), site.verdict).toBe(n);
      // the degrees-of-freedom panel fills the same levels
      const side = svg.slice(svg.indexOf('class="dofs-panel"'));
      expect(filled(side, 'cx'), site.verdict).toBe(n);
    }
  });

  it('copes with a site without levels', () => {
    const svg = convergencePlotSvg({ ...singular, levels: [] }, { units: 'MPa' });
    expect(checkXml(svg).errors).toEqual([]);
    expect(svg).toContain('No refinement levels');
  });
});

describe('axis ticks', () => {
  it('label a narrow converging range with distinct values', () => {
    // peaks 143.057 … 143.131: 4 significant digits would print every tick as "143.1"
    const narrow = { ...converging, levels: converging.levels.map((l, i) => ({ ...l, peak: 143.131 - 0.074 / 2 ** (2 * i) })) };
    const svg = convergencePlotSvg({ ...narrow, estimate: { value: 143.131, uncertainty: 0.004, observedOrder: 2 } }, { units: 'MPa' });
    const main = svg.slice(0, svg.indexOf('class="dofs-panel"'));
    const yLabels = [...main.matchAll(/text-anchor="end" fill="[^"]+">([^<]+)</g)].map((m) => m[1]);
    expect(yLabels.length).toBeGreaterThanOrEqual(2);
    expect(new Set(yLabels).size).toBe(yLabels.length);
  });
});
