/**
 * Filled contour picture of a nodal scalar field (SVG, our own drawing code): the drawing.
 * Resampling lives in resample.ts, the colour range and bar in colour-scale.ts.
 *
 * Every linear triangle (CST element, or each of the four sub-triangles of an LST element) is
 * split into iso-band polygons (isobands.ts); the polygons of one band are gathered into one
 * path, so the picture holds one path per band however big the mesh is. Above
 * `maxTriangles` drawn triangles the field is first resampled onto a regular grid of
 * triangles (point location by scanning each mesh triangle's grid nodes), and the picture is
 * clipped to the true plate boundary, so a million-DOF mesh draws at a bounded size. The data
 * files (CSV / JSON) are never decimated.
 */
import type { Mesh } from '../mesh/types.js';
import type { Point } from '../model/types.js';
import { type ColourRange, colourBarSvg, colourRange } from './colour-scale.js';
import {
  type Box, type Frame, boundaryLoops, c1, linearTriangles, loopsPath, makeFrame, meetsBox, meshBox, padBox, px, py,
  triangleMeetsBox,
} from './draw.js';
import { type BandScale, bandColour, bandEdge, bandScale, triangleBands } from './isobands.js';
import { countInWindow, gridForBudget, resampleTriangles } from './resample.js';
import { escapeXml, formatNumber, safeId } from './text.js';

export interface ContourOptions {
  /** label of the colour bar, e.g. "von Mises, MPa" */
  units: string;
  /** heading drawn above the picture */
  title: string;
  /** sites to mark with a ring and their id */
  sites?: { id: string; at: Point }[];
  /** draw the deformed outline: node n moves by scale·(u[2n], u[2n+1]) */
  deformed?: { u: Float64Array; scale: number };
  /** draw the element edges in a `<g class="mesh-overlay">` (the HTML page toggles it) */
  showMesh?: boolean;
  /** window in model coordinates (default: the whole plate plus a small margin) */
  viewBox?: Box;
  /** picture width of the plate area in px (default 640) */
  width?: number;
  /** picture height limit of the plate area in px (default 520) */
  maxHeight?: number;
  /** colour range (default: min … max of the field inside the window, top capped as below) */
  range?: [number, number];
  /**
   * When the largest values cover only a sliver of the plate (a singular point), cap the top of
   * the colour scale at this area quantile so the rest of the field stays readable; values above
   * show in the top colour and the bar says so. `false` never caps. Default 0.995.
   */
  capQuantile?: number | false;
  /** number of colour bands (default 56) */
  levels?: number;
  /** above this many drawn triangles the field is resampled on a grid (default 60 000) */
  maxTriangles?: number;
  /** above this many element edges the mesh overlay is left out (default 150 000) */
  maxMeshEdges?: number;
  /** prefix for ids inside the SVG; make it unique per picture on one page (default: a hash of title and window) */
  idPrefix?: string;
  /** extra class on the root element */
  className?: string;
  /** length unit, for the caption of the deformed shape */
  lengthUnit?: string;
}

const FONT = "system-ui, -apple-system, 'Segoe UI', Roboto, sans-serif";
export const DEFAULT_LEVELS = 56;
export const DEFAULT_MAX_TRIANGLES = 60_000;

/**
 * Without an explicit prefix, ids come from a hash of the title and window, so two different
 * pictures pasted into one page do not share clip paths or gradients (and output stays
 * deterministic).
 */
function defaultPrefix(opts: ContourOptions): string {
  const key = `${opts.title}|${opts.units}|${JSON.stringify(opts.viewBox ?? null)}`;
  let h = 2166136261; // FNV-1a, 32 bit
  for (let i = 0; i < key.length; i++) {
    h ^= key.charCodeAt(i);
    h = Math.imul(h, 16777619);
  }
  return `pw${(h >>> 0).toString(36)}`;
}

/** Accumulates band polygons as compact path data, one string per band. */
class BandPaths {
  readonly d: string[];
  polygons = 0;
  constructor(readonly scale: BandScale, readonly frame: Frame) {
    this.d = new Array<string>(scale.n).fill('');
  }
  readonly sink = (k: number, xs: Float64Array, ys: Float64Array, count: number): void => {
    const f = this.frame;
    let s = `M${c1(px(f, xs[0]))} ${c1(py(f, ys[0]))}`;
    for (let i = 1; i < count; i++) s += ` ${c1(px(f, xs[i]))} ${c1(py(f, ys[i]))}`;
    this.d[k] += s + 'Z';
    this.polygons++;
  };
}

/** Fine drawing: every linear triangle in the window, split into bands. */
function drawTriangles(xy: Float64Array, tri: Uint32Array, values: Float64Array, box: Box, paths: BandPaths): void {
  const nTri = tri.length / 3;
  for (let t = 0; t < nTri; t++) {
    if (!triangleMeetsBox(xy, tri, t, box)) continue;
    const a = tri[3 * t], b = tri[3 * t + 1], c = tri[3 * t + 2];
    const va = values[a], vb = values[b], vc = values[c];
    if (!Number.isFinite(va) || !Number.isFinite(vb) || !Number.isFinite(vc)) continue;
    triangleBands(xy[2 * a], xy[2 * a + 1], va, xy[2 * b], xy[2 * b + 1], vb, xy[2 * c], xy[2 * c + 1], vc, paths.scale, paths.sink);
  }
}

/** Coarse drawing: the field resampled on a regular grid within the budget; returns the triangles drawn. */
function drawGrid(xy: Float64Array, tri: Uint32Array, values: Float64Array, box: Box, budget: number, paths: BandPaths): number {
  const { nx, ny } = gridForBudget(box, budget);
  const { gx, gy, v } = resampleTriangles(xy, tri, values, box, nx, ny);
  const stride = nx + 1;
  let drawn = 0;
  for (let j = 0; j < ny; j++) {
    const y0 = box.minY + j * gy, y1 = y0 + gy;
    for (let i = 0; i < nx; i++) {
      const x0 = box.minX + i * gx, x1 = x0 + gx;
      const v00 = v[j * stride + i], v10 = v[j * stride + i + 1];
      const v01 = v[(j + 1) * stride + i], v11 = v[(j + 1) * stride + i + 1];
      if (!Number.isNaN(v00) && !Number.isNaN(v10) && !Number.isNaN(v11)) {
        triangleBands(x0, y0, v00, x1, y0, v10, x1, y1, v11, paths.scale, paths.sink);
        drawn++;
      }
      if (!Number.isNaN(v00) && !Number.isNaN(v11) && !Number.isNaN(v01)) {
        triangleBands(x0, y0, v00, x1, y1, v11, x0, y1, v01, paths.scale, paths.sink);
        drawn++;
      }
    }
  }
  return drawn;
}

/** Unique element edges inside the window as one path (straight pieces through LST mid nodes). */
function meshOverlayPath(mesh: Mesh, f: Frame, maxEdges: number): string | undefined {
  const nElems = Math.floor(mesh.elemNodes.length / mesh.nodesPerElem);
  const xy = mesh.xy;
  const en = mesh.elemNodes;
  const npe = mesh.nodesPerElem;
  const nNodes = xy.length / 2;
  const seen = new Set<number>();
  let d = '';
  let count = 0;
  // local corner pairs and the mid node on that edge (LST: 3 on 0–1, 4 on 1–2, 5 on 2–0)
  const pairs = [[0, 1, 3], [1, 2, 4], [2, 0, 5]] as const;
  for (let e = 0; e < nElems; e++) {
    for (const [i, j, m] of pairs) {
      const a = en[npe * e + i], b = en[npe * e + j];
      const xa = xy[2 * a], ya = xy[2 * a + 1], xb = xy[2 * b], yb = xy[2 * b + 1];
      // an edge outside the window is never drawn: it need not be remembered either (an inset's
      // window holds a small part of the mesh)
      if (!meetsBox(f.box, Math.min(xa, xb), Math.min(ya, yb), Math.max(xa, xb), Math.max(ya, yb))) continue;
      const key = a < b ? a * nNodes + b : b * nNodes + a;
      if (seen.has(key)) continue;
      seen.add(key);
      if (++count > maxEdges) return undefined;
      d += `M${c1(px(f, xa))} ${c1(py(f, ya))}`;
      if (npe === 6) {
        const c = en[npe * e + m];
        d += `L${c1(px(f, xy[2 * c]))} ${c1(py(f, xy[2 * c + 1]))} `;
      } else d += 'L';
      d += `${c1(px(f, xb))} ${c1(py(f, yb))}`;
    }
  }
  return d;
}

/** Greedy word wrap to lines of at most `width` characters (a longer word gets a line of its own). */
export function wrapWords(text: string, width: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/)) {
    if (word === '') continue;
    if (line && line.length + 1 + word.length > width) {
      lines.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines;
}

/** A site marker: white-and-dark double ring, a short leader and the id in a pill. */
export function siteMarkerSvg(x: number, y: number, id: string, flipLeft: boolean, below = false): string {
  const label = escapeXml(id);
  const textWidth = Math.max(14, 7 * [...id].length + 10);
  const lx = flipLeft ? x - 12 - textWidth : x + 12;
  const ly = below ? y + 7 : y - 24;
  const leaderX = flipLeft ? x - 6 : x + 6;
  const leaderY = below ? y + 6 : y - 6;
  return (
    `<g class="site-marker">` +
    `<circle cx="${c1(x)}" cy="${c1(y)}" r="7" fill="none" stroke="#fff" stroke-width="3.5"/>` +
    `<circle cx="${c1(x)}" cy="${c1(y)}" r="7" fill="none" stroke="#1b1b2f" stroke-width="1.4"/>` +
    `<line x1="${c1(leaderX)}" y1="${c1(leaderY)}" x2="${c1(flipLeft ? lx + textWidth : lx)}" y2="${c1(ly + 9)}" stroke="#1b1b2f" stroke-width="1"/>` +
    `<rect x="${c1(lx)}" y="${c1(ly)}" width="${textWidth}" height="17" rx="8.5" fill="#fff" fill-opacity="0.92" stroke="#1b1b2f" stroke-width="1"/>` +
    `<text x="${c1(lx + textWidth / 2)}" y="${c1(ly + 12.5)}" text-anchor="middle" font-size="11" font-weight="700" fill="#1b1b2f">${label}</text>` +
    `</g>`
  );
}

/** The band paths of the picture, and how they were drawn. */
interface DrawnBands {
  paths: BandPaths;
  /** the picture was resampled on a grid: clip it to the plate outline */
  clipPlate: boolean;
  /** the sentence saying so, when resampled */
  note?: string;
}

/** Step 1: the field as band polygons, triangle by triangle or (above the budget) from a grid. */
function drawBands(
  mesh: Mesh, tri: Uint32Array, values: Float64Array, box: Box, scale: BandScale, frame: Frame,
  budget: number, loops: { closed: boolean }[],
): DrawnBands {
  const paths = new BandPaths(scale, frame);
  const inWindow = countInWindow(mesh.xy, tri, box);
  if (inWindow <= budget) {
    drawTriangles(mesh.xy, tri, values, box, paths);
    return { paths, clipPlate: false };
  }
  const drawn = drawGrid(mesh.xy, tri, values, box, budget, paths);
  return {
    paths,
    clipPlate: loops.length > 0 && loops.every((l) => l.closed),
    note: `Drawn from a regular resampling (${drawn.toLocaleString('en-US')} triangles) of the ${inWindow.toLocaleString('en-US')} mesh triangles in view; the data files hold every node.`,
  };
}

/** Step 2: clip paths, the band group and the outline inside the window clip; legend items for what it drew. */
function windowLayer(
  mesh: Mesh, opts: ContourOptions, prefix: string, frame: Frame, bands: DrawnBands, outline: string,
  loops: { nodes: number[]; closed: boolean }[],
): { svg: string; legend: string[]; notes: string[] } {
  const { paths, clipPlate } = bands;
  const scale = paths.scale;
  const legend: string[] = [];
  const notes: string[] = [];
  const body: string[] = [];
  const clipRect = `${prefix}-window`;
  body.push(
    `<defs><clipPath id="${clipRect}"><rect x="${c1(frame.ox)}" y="${c1(frame.oy)}" width="${c1(frame.width)}" height="${c1(frame.height)}"/></clipPath>` +
      (clipPlate ? `<clipPath id="${prefix}-plate"><path d="${outline}" clip-rule="evenodd"/></clipPath>` : '') +
      `</defs>`,
  );
  body.push(`<g clip-path="url(#${clipRect})">`);
  body.push(`<g class="bands"${clipPlate ? ` clip-path="url(#${prefix}-plate)"` : ''}>`);
  for (let k = 0; k < scale.n; k++) {
    if (paths.d[k] === '') continue;
    const colour = bandColour(scale, k);
    body.push(
      `<path class="band" data-band="${k}" data-lo="${bandEdge(scale, k)}" data-hi="${bandEdge(scale, k + 1)}" ` +
        `fill="${colour}" stroke="${colour}" stroke-width="0.4" stroke-linejoin="round" d="${paths.d[k]}"/>`,
    );
  }
  body.push('</g>');
  if (opts.showMesh) {
    const d = meshOverlayPath(mesh, frame, opts.maxMeshEdges ?? 150_000);
    if (d === undefined) notes.push('The mesh is too dense to draw at this scale; see the mesh statistics.');
    else body.push(`<g class="mesh-overlay"><path d="${d}" fill="none" stroke="#ffffff" stroke-opacity="0.55" stroke-width="0.4"/></g>`);
  }
  body.push(`<path class="outline" d="${outline}" fill="none" stroke="#222" stroke-width="1.1" stroke-linejoin="round"/>`);
  if (opts.deformed) {
    const d = loopsPath(frame, mesh.xy, loops, opts.deformed);
    body.push(
      `<path class="deformed" d="${d}" fill="none" stroke="#ff3d7f" stroke-width="1.6" stroke-dasharray="6 3" stroke-linejoin="round"/>`,
    );
    legend.push(
      `<line x1="0" x2="22" y1="-4" y2="-4" stroke="#ff3d7f" stroke-width="1.6" stroke-dasharray="6 3"/>` +
        `<text x="28" y="0" font-size="11" fill="#333">deformed shape, displacements × ${escapeXml(formatNumber(opts.deformed.scale, 3))}</text>`,
    );
  }
  body.push('</g>');
  return { svg: body.join(''), legend, notes };
}

/** Step 3: site rings, above the window clip so that a label next to the frame edge stays whole. */
function siteMarkers(sites: ContourOptions['sites'], box: Box, frame: Frame): string {
  const out: string[] = [];
  for (const site of sites ?? []) {
    const [x, y] = site.at;
    if (x < box.minX || x > box.maxX || y < box.minY || y > box.maxY) continue;
    const sx = px(frame, x), sy = py(frame, y);
    out.push(siteMarkerSvg(sx, sy, site.id, sx > frame.ox + frame.width - 60, sy < frame.oy + 26));
  }
  return out.join('');
}

/** The sentence under a capped colour scale. */
function cappedNote(range: ColourRange, capQuantile: number | false | undefined): string {
  return `Colour scale capped at ${formatNumber(range.hi)}: the values above it, up to ${formatNumber(range.max)}, cover under ${formatNumber(100 * (1 - (capQuantile || 0.995)), 2)} % of the area in view and show in the top colour.`;
}

/** Step 4: legend items and wrapped notes below the picture, from `top`; returns the markup and the bottom. */
function captionLines(legend: string[], notes: string[], x: number, top: number, perLine: number): { svg: string; bottom: number } {
  const lines: string[] = [];
  let ly = top;
  for (const item of legend) {
    lines.push(`<g transform="translate(${c1(x)} ${c1(ly)})">${item}</g>`);
    ly += 18;
  }
  for (const note of notes) {
    for (const line of wrapWords(note, perLine)) {
      lines.push(`<text class="note" x="${c1(x)}" y="${c1(ly)}" font-size="10.5" fill="#555">${escapeXml(line)}</text>`);
      ly += 14;
    }
    ly += 2;
  }
  return { svg: lines.join(''), bottom: ly };
}

function checkContourInput(mesh: Mesh, values: Float64Array, opts: ContourOptions): void {
  const nNodes = mesh.xy.length / 2;
  if (values.length !== nNodes) {
    throw new TypeError(`contourSvg: field must hold one value per node (${nNodes}), got ${values.length}`);
  }
  if (opts.deformed && opts.deformed.u.length !== 2 * nNodes) {
    throw new TypeError(`contourSvg: displacements must hold 2 values per node (${2 * nNodes}), got ${opts.deformed.u.length}`);
  }
}

/**
 * Filled contour of a nodal field: smooth iso-bands, continuous colour bar with units and the
 * end values, plate outline, optional deformed outline, mesh overlay and site rings.
 */
export function contourSvg(mesh: Mesh, values: Float64Array, opts: ContourOptions): string {
  checkContourInput(mesh, values, opts);
  const prefix = safeId(opts.idPrefix ?? defaultPrefix(opts));
  const box = opts.viewBox ?? padBox(meshBox(mesh.xy, opts.deformed), 0.03);
  const top = 44;
  const frame = makeFrame(box, opts.width ?? 640, opts.maxHeight ?? 520, 12, top);
  const tri = linearTriangles(mesh);
  const range: ColourRange = opts.range
    ? { lo: opts.range[0], hi: opts.range[1], max: opts.range[1], capped: false }
    : colourRange(mesh, values, box, opts.capQuantile ?? 0.995, tri);
  const scale = bandScale(range.lo, range.hi, opts.levels ?? DEFAULT_LEVELS);
  const loops = boundaryLoops(mesh);
  const bands = drawBands(mesh, tri, values, box, scale, frame, opts.maxTriangles ?? DEFAULT_MAX_TRIANGLES, loops);

  const barHeight = Math.max(150, Math.min(frame.height - 20, 340));
  const barX = frame.ox + frame.width + 28;
  const plotBottom = top + Math.max(frame.height, barHeight + 20);
  const outline = loopsPath(frame, mesh.xy, loops);
  const layer = windowLayer(mesh, opts, prefix, frame, bands, outline, loops);
  const notes = [...(bands.note ? [bands.note] : []), ...layer.notes, ...(range.capped ? [cappedNote(range, opts.capQuantile)] : [])];
  const frameRect =
    `<rect x="${c1(frame.ox)}" y="${c1(frame.oy)}" width="${c1(frame.width)}" height="${c1(frame.height)}" fill="none" stroke="#bbb" stroke-width="0.6"/>`;
  const bar = colourBarSvg(barX, top + 20, barHeight, scale, opts.units, `${prefix}-ramp`, range.capped);

  // notes wrap to the picture width (about 5.6 px per character at 10.5 px)
  const perLine = Math.max(30, Math.floor((barX + 90 - frame.ox) / 5.6));
  const caption = captionLines(layer.legend, notes, frame.ox, plotBottom + 20, perLine);
  // room for the bar heading (about 6.2 px per character at 11 px) and the tick labels
  const width = Math.ceil(barX + Math.max(110, 6.2 * [...opts.units].length + 8));
  const height = Math.ceil(caption.bottom);
  const title = escapeXml(opts.title);
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" class="contour${opts.className ? ' ' + escapeXml(opts.className) : ''}" ` +
    `viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" font-family="${FONT}" role="img" aria-label="${title}">` +
    `<title>${title}</title>` +
    `<text class="picture-title" x="${c1(frame.ox)}" y="22" font-size="14" font-weight="600" fill="#111">${title}</text>` +
    layer.svg +
    siteMarkers(opts.sites, box, frame) +
    frameRect +
    bar +
    caption.svg +
    `</svg>`
  );
}
