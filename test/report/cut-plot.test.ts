import { describe, expect, it } from 'vitest';
import { cutPlotSvg, reportHtml } from '../../src/report/index.js';
import { checkXml } from './xml.js';
import { demoReportInput } from './fixtures.js';

// Kirsch (1898): hoop stress on the hole edge σθ = S(1 − 2 cos 2θ), here S = 1, against arc length aθ (a = 1)
const s = Array.from({ length: 91 }, (_, i) => (i * Math.PI) / 90);
const kirsch = s.map((t) => 1 - 2 * Math.cos(2 * t));
const fe = kirsch.map((v, i) => v * (1 + 0.01 * Math.sin(i)));

describe('path plot', () => {
  const svg = cutPlotSvg({ title: 'Tangential stress along opening:<hole>', s, series: [{ label: 'peakwise', values: fe }, { label: 'Kirsch 1898', values: kirsch, reference: true }], xLabel: 'arc length s (mm)', yLabel: 'σt (MPa)' });
  it('is well-formed SVG with one curve per series, the reference dashed, text escaped', () => {
    expect(checkXml(svg).errors).toEqual([]);
    expect(svg.match(/<path d="M/g)?.length).toBe(2);
    expect(svg.match(/stroke-dasharray="5 3"/g)?.length).toBe(2); // the dashed curve and its legend sample
    expect(svg).toContain('opening:&lt;hole&gt;');
  });
  it('keeps every point of both curves inside the plot panel (the axes span −S … 3S)', () => {
    // panel of cutPlotSvg: x 72 … 542, y 30 … 222 (viewBox 560 × 300)
    for (const m of svg.matchAll(/<path d="([^"]+)"/g)) {
      for (const p of m[1].matchAll(/[ML]([\d.]+) ([\d.]+)/g)) {
        const X = Number(p[1]), Y = Number(p[2]);
        expect(X).toBeGreaterThanOrEqual(72);
        expect(X).toBeLessThanOrEqual(542);
        expect(Y).toBeGreaterThanOrEqual(30);
        expect(Y).toBeLessThanOrEqual(222);
      }
    }
  });
  it('a NaN sample breaks the curve instead of joining across it', () => {
    const gap = cutPlotSvg({ title: 't', s: [0, 1, 2, 3], series: [{ label: 'x', values: [1, NaN, 2, 3] }], xLabel: 'x', yLabel: 'y' });
    expect(gap.match(/M[\d.]+ [\d.]+/g)?.length).toBe(2);
  });
  it('appears in the report as its own section only when given', () => {
    const input = demoReportInput();
    expect(reportHtml(input)).not.toContain('id="path"');
    const html = reportHtml({ ...input, cut: { title: 'p', s, series: [{ label: 'peakwise', values: fe }], xLabel: 'x', yLabel: 'y' } });
    expect(html).toContain('<section id="cut"><h2>Along the cut</h2><svg');
    expect(checkXml(html).errors).toEqual([]);
  });
});
