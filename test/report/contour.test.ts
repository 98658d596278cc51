import { describe, it, expect } from 'vitest';
import { contourSvg, meshSvg, resampleOnGrid } from '../../src/report/index.js';
import { checkXml, luminance } from './xml.js';
import { cornerField, gridMesh, plateGeometry, smoothDisplacement } from './fixtures.js';

const opts = { nx: 24, ny: 18, width: 400, height: 300, order: 2 as const, lShape: true };
const mesh = gridMesh(opts);
const corner: [number, number] = [200, 150];
const field = cornerField(mesh, corner, 0.4555, 400);
const u = smoothDisplacement(mesh, 400);

function bands(svg: string): { k: number; lo: number; hi: number; fill: string; d: string }[] {
  const re = /<path class="band" data-band="(\d+)" data-lo="([^"]+)" data-hi="([^"]+)" fill="(#[0-9a-f]{6})"[^>]* d="([^"]*)"\/>/g;
  return [...svg.matchAll(re)].map((m) => ({ k: +m[1], lo: +m[2], hi: +m[3], fill: m[4], d: m[5] }));
}

describe('contourSvg', () => {
  const svg = contourSvg(mesh, field, {
    units: 'von Mises, MPa',
    title: 'demo',
    sites: [{ id: 'S1', at: corner }],
    deformed: { u, scale: 20 },
    showMesh: true,
  });

  it('is well-formed XML with an <svg> root', () => {
    const r = checkXml(svg);
    expect(r.errors).toEqual([]);
    expect(r.root).toBe('svg');
  });

  it('draws contiguous bands whose levels and colours both increase with the value', () => {
    const b = bands(svg).sort((p, q) => p.k - q.k);
    // a field from about 60 to 300 MPa over 56 bands: nearly all bands are in use
    expect(b.length).toBeGreaterThan(40);
    for (let i = 1; i < b.length; i++) {
      expect(b[i].lo).toBeGreaterThan(b[i - 1].lo);
      expect(b[i].hi).toBeGreaterThan(b[i - 1].hi);
      expect(luminance(b[i].fill)).toBeGreaterThan(luminance(b[i - 1].fill));
      if (b[i].k === b[i - 1].k + 1) expect(b[i].lo).toBeCloseTo(b[i - 1].hi, 9);
    }
  });

  it('spans the colour range from the field minimum to its maximum when not capped', () => {
    let lo = Infinity, hi = -Infinity;
    for (const v of field) {
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
    const b = bands(contourSvg(mesh, field, { units: 'MPa', title: 'uncapped', capQuantile: false }));
    expect(Math.min(...b.map((x) => x.lo))).toBeCloseTo(lo, 9);
    expect(Math.max(...b.map((x) => x.hi))).toBeCloseTo(hi, 9);
  });

  it('caps the scale of a singular field near the 99.5 % area quantile and says so', () => {
    const b = bands(svg);
    const cap = Math.max(...b.map((x) => x.hi));
    expect(svg).toContain('>≥ ');
    expect(svg).toContain('Colour scale capped at');
    // independent check on the analytic field (fixtures.cornerField) sampled on a fine grid:
    // the share of the L-plate above the cap is about 0.5 % (bins and nodal lumping: within 0.2–1.2 %)
    let above = 0, total = 0;
    for (let i = 0; i < 800; i++) {
      for (let j = 0; j < 600; j++) {
        const x = (i + 0.5) / 2, y = (j + 0.5) / 2;
        if (x > 200 && y > 150) continue;
        total++;
        const r = Math.max(Math.hypot(x - 200, y - 150), 1.6);
        if (40 + 25 * (x / 400) + 60 * (r / 400) ** -0.4555 > cap) above++;
      }
    }
    expect(above / total).toBeGreaterThan(0.002);
    expect(above / total).toBeLessThan(0.012);
  });

  it('has a continuous colour bar whose stops brighten from bottom to top', () => {
    const stops = [...svg.matchAll(/<stop offset="([^"]+)" stop-color="(#[0-9a-f]{6})"\/>/g)].map((m) => ({ t: +m[1], c: m[2] }));
    expect(stops.length).toBeGreaterThanOrEqual(11);
    for (let i = 1; i < stops.length; i++) {
      expect(stops[i].t).toBeGreaterThan(stops[i - 1].t);
      expect(luminance(stops[i].c)).toBeGreaterThan(luminance(stops[i - 1].c));
    }
    expect(svg).toContain('von Mises, MPa');
    expect(svg).toMatch(/class="bar-max"/);
    expect(svg).toMatch(/class="bar-min"/);
  });

  it('marks the site, the deformed outline at its magnification and the mesh overlay', () => {
    expect(svg.match(/class="site-marker"/g)?.length).toBe(1);
    expect(svg).toContain('>S1<');
    expect(svg).toContain('class="deformed"');
    expect(svg).toContain('× 20');
    expect(svg).toContain('class="mesh-overlay"');
  });

  it('zooms into a window: only triangles near the site, markers outside left out', () => {
    const inset = contourSvg(mesh, field, {
      units: 'MPa', title: 'inset', sites: [{ id: 'S1', at: corner }, { id: 'far', at: [10, 10] }],
      viewBox: { minX: 170, maxX: 230, minY: 120, maxY: 180 },
    });
    expect(checkXml(inset).errors).toEqual([]);
    expect(inset.match(/class="site-marker"/g)?.length).toBe(1);
    expect(inset.length).toBeLessThan(svg.length);
  });

  it('escapes hostile ids and labels', () => {
    const bad = '<script>alert(1)</script>&"\'';
    const s = contourSvg(mesh, field, { units: bad, title: bad, sites: [{ id: bad, at: corner }], idPrefix: bad, className: bad });
    expect(checkXml(s).errors).toEqual([]);
    expect(s).not.toContain('<script>');
  });

  it('rejects a field of the wrong length', () => {
    expect(() => contourSvg(mesh, new Float64Array(3), { units: '', title: '' })).toThrow(TypeError);
  });
});

describe('decimated drawing of big meshes', () => {
  const big = gridMesh({ nx: 120, ny: 90, width: 400, height: 300, order: 1, lShape: true }); // 16 200 triangles
  const v = cornerField(big, corner, 0.4555, 400);

  it('resamples a linear field exactly (linear interpolation reproduces it)', () => {
    const lin = new Float64Array(big.xy.length / 2);
    for (let n = 0; n < lin.length; n++) lin[n] = 3 * big.xy[2 * n] - 2 * big.xy[2 * n + 1] + 7;
    const box = { minX: 0, minY: 0, maxX: 400, maxY: 300 };
    const { gx, gy, v: g } = resampleOnGrid(big, lin, box, 37, 29);
    let checked = 0;
    for (let j = 0; j <= 29; j++) {
      for (let i = 0; i <= 37; i++) {
        const x = i * gx, y = j * gy;
        const inside = !(x > 200 && y > 150);
        if (!inside) continue;
        expect(Math.abs(g[j * 38 + i] - (3 * x - 2 * y + 7))).toBeLessThan(1e-9);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(700);
  });

  it('draws at most the budget, clips to the plate, and says so', () => {
    const s = contourSvg(big, v, { units: 'MPa', title: 'big', maxTriangles: 4000, idPrefix: 'pw' });
    expect(checkXml(s).errors).toEqual([]);
    expect(s).toContain('regular resampling');
    expect(s).toMatch(/clip-path="url\(#pw-plate\)"/);
    const polygons = s.split('Z').length - 1;
    const full = contourSvg(big, v, { units: 'MPa', title: 'big' });
    expect(full).not.toContain('regular resampling');
    // the budget caps the drawn triangles; each triangle yields at least one polygon
    expect(polygons).toBeLessThan((full.split('Z').length - 1) / 2);
  });
});

describe('meshSvg', () => {
  const geom = plateGeometry(opts);
  const s = meshSvg(mesh, geom, { title: 'L-plate mesh' });
  it('is well-formed and colours each boundary piece with a legend entry', () => {
    expect(checkXml(s).errors).toEqual([]);
    const pieces = [...s.matchAll(/class="piece" data-piece="(\d+)"/g)].map((m) => +m[1]);
    expect(pieces).toEqual([0, 1, 2, 3, 4, 5]); // the L-shape has six straight edges
    for (const p of pieces) expect(s).toContain(`>p${p} outline · edge<`);
  });
  it('draws every unique edge once: E = V + T − 1 for a simply connected triangulation (Euler)', () => {
    const cst = gridMesh({ ...opts, order: 1 });
    const t = cst.elemNodes.length / 3;
    const v = cst.xy.length / 2;
    const drawn = (meshSvg(cst, geom).match(/class="elements" d="([^"]*)"/)?.[1].match(/M/g) ?? []).length;
    expect(drawn).toBe(v + t - 1);
  });
});
