/**
 * Picture of the mesh for `peakwise mesh --svg`: element edges in grey, each boundary piece in
 * its own colour, and a legend naming the pieces (loop, role, radius).
 */
import type { PlateGeometry } from '../geometry/types.js';
import type { Mesh } from '../mesh/types.js';
import { boundaryLoops, c1, loopsPath, makeFrame, meshBox, padBox, px, py } from './draw.js';
import { escapeXml, formatNumber } from './text.js';

export interface MeshSvgOptions {
  /** heading (default "Mesh") */
  title?: string;
  /** plate area width in px (default 720) */
  width?: number;
  /** plate area height limit in px (default 560) */
  maxHeight?: number;
  /** above this many element edges only the boundary is drawn (default 300 000) */
  maxEdges?: number;
}

const FONT = "system-ui, -apple-system, 'Segoe UI', Roboto, sans-serif";

/** Ten boundary colours, chosen to stay apart from each other and from the grey edges. */
const PIECE_COLOURS = [
  '#c2185b', '#1565c0', '#2e7d32', '#ef6c00', '#6a1b9a', '#00838f', '#9e9d24', '#5d4037', '#d84315', '#283593',
];

export function pieceColour(pieceId: number): string {
  return PIECE_COLOURS[((pieceId % PIECE_COLOURS.length) + PIECE_COLOURS.length) % PIECE_COLOURS.length];
}

export function meshSvg(mesh: Mesh, geom: PlateGeometry, opts: MeshSvgOptions = {}): string {
  const box = padBox(meshBox(mesh.xy), 0.03);
  const top = 40;
  const f = makeFrame(box, opts.width ?? 720, opts.maxHeight ?? 560, 12, top);
  const xy = mesh.xy;
  const npe = mesh.nodesPerElem;
  const en = mesh.elemNodes;
  const nElems = Math.floor(en.length / npe);
  const nNodes = xy.length / 2;
  const maxEdges = opts.maxEdges ?? 300_000;
  const loops = boundaryLoops(mesh);
  const parts: string[] = [
    `<path class="plate" d="${loopsPath(f, xy, loops)}" fill="#eef2f6" fill-rule="evenodd" stroke="none"/>`,
  ];
  let note = '';
  if (1.6 * nElems <= maxEdges) {
    const seen = new Set<number>();
    let d = '';
    const pairs = [[0, 1, 3], [1, 2, 4], [2, 0, 5]] as const;
    for (let e = 0; e < nElems; e++) {
      for (const [i, j, m] of pairs) {
        const a = en[npe * e + i], b = en[npe * e + j];
        const key = a < b ? a * nNodes + b : b * nNodes + a;
        if (seen.has(key)) continue;
        seen.add(key);
        d += `M${c1(px(f, xy[2 * a]))} ${c1(py(f, xy[2 * a + 1]))}L`;
        if (npe === 6) {
          const c = en[npe * e + m];
          d += `${c1(px(f, xy[2 * c]))} ${c1(py(f, xy[2 * c + 1]))} `;
        }
        d += `${c1(px(f, xy[2 * b]))} ${c1(py(f, xy[2 * b + 1]))}`;
      }
    }
    parts.push(`<path class="elements" d="${d}" fill="none" stroke="#8a9099" stroke-width="0.5"/>`);
  } else {
    note = `${nElems.toLocaleString('en-US')} elements are too many to draw one by one; only the boundary is shown.`;
  }
  // boundary edges grouped by piece
  const stride = mesh.edgeStride;
  const be = mesh.boundaryEdges;
  const byPiece = new Map<number, string>();
  for (let e = 0; e < be.length / stride; e++) {
    const piece = mesh.boundaryPiece[e] ?? -1;
    const a = be[stride * e], b = be[stride * e + 1];
    let d = `M${c1(px(f, xy[2 * a]))} ${c1(py(f, xy[2 * a + 1]))}L`;
    if (stride === 3) {
      const m = be[stride * e + 2];
      d += `${c1(px(f, xy[2 * m]))} ${c1(py(f, xy[2 * m + 1]))} `;
    }
    d += `${c1(px(f, xy[2 * b]))} ${c1(py(f, xy[2 * b + 1]))}`;
    byPiece.set(piece, (byPiece.get(piece) ?? '') + d);
  }
  const pieceIds = [...byPiece.keys()].sort((p, q) => p - q);
  for (const p of pieceIds) {
    parts.push(
      `<path class="piece" data-piece="${p}" d="${byPiece.get(p)}" fill="none" stroke="${pieceColour(p)}" stroke-width="2" stroke-linecap="round"/>`,
    );
  }
  // legend: one entry per piece, in columns under the picture
  const legendTop = top + f.height + 24;
  const colWidth = 230;
  const perRow = Math.max(1, Math.floor((f.width + 12) / colWidth));
  const legend: string[] = [];
  pieceIds.forEach((p, i) => {
    const piece = geom.pieces[p];
    const x = f.ox + (i % perRow) * colWidth;
    const y = legendTop + Math.floor(i / perRow) * 18;
    const words = piece
      ? `${piece.loop} · ${piece.role}${piece.radius > 0 ? ` r ${formatNumber(piece.radius)}` : ''}`
      : 'untagged';
    legend.push(
      `<line x1="${c1(x)}" x2="${c1(x + 20)}" y1="${c1(y - 4)}" y2="${c1(y - 4)}" stroke="${pieceColour(p)}" stroke-width="3" stroke-linecap="round"/>` +
        `<text x="${c1(x + 26)}" y="${c1(y)}" font-size="11" fill="#222">p${p} ${escapeXml(words)}</text>`,
    );
  });
  const rows = Math.ceil(pieceIds.length / perRow);
  let bottom = legendTop + rows * 18;
  if (note) {
    legend.push(`<text class="note" x="${c1(f.ox)}" y="${c1(bottom + 4)}" font-size="10.5" fill="#555">${escapeXml(note)}</text>`);
    bottom += 20;
  }
  const title = escapeXml(opts.title ?? 'Mesh');
  const subtitle = `${nNodes.toLocaleString('en-US')} nodes · ${nElems.toLocaleString('en-US')} ${npe === 6 ? 'LST' : 'CST'} elements · ${pieceIds.length} boundary pieces`;
  const width = Math.ceil(Math.max(f.ox + f.width + 12, 260));
  const height = Math.ceil(bottom + 8);
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" class="mesh-picture" viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" font-family="${FONT}" role="img" aria-label="${title}">` +
    `<title>${title}</title>` +
    `<text x="${c1(f.ox)}" y="18" font-size="14" font-weight="600" fill="#111">${title}</text>` +
    `<text x="${c1(f.ox)}" y="33" font-size="11" fill="#555">${escapeXml(subtitle)}</text>` +
    parts.join('') +
    `<g class="legend">${legend.join('')}</g>` +
    `</svg>`
  );
}
