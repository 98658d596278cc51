/**
 * Files a model refers to (issue 9): outlines from a CSV of points or an SVG path, and
 * displacement tables. The model stage stays free of I/O: the caller hands in `readFile`
 * (paths as written in the model, relative to the model file's folder).
 */
import type { PathPiece, Point, PolygonVertex, Shape } from './types.js';
import { quote } from './text.js';
import { notUtf8Text } from './text-file.js';
import { CsvError, pickColumns, readCsv } from './csv.js';
import { SvgError, findSvgPath, flattenSegments, parseSvgPath, segmentsExtent } from './svg.js';

export type ReadFile = (path: string) => string;

/** Millimetres per drawing unit (CSS absolute units: 1 in = 25.4 mm = 72 pt = 96 px). */
export const MM_PER_UNIT: Readonly<Record<string, number>> = {
  mm: 1, cm: 10, m: 1000, in: 25.4, pt: 25.4 / 72, px: 25.4 / 96,
};

/** Error raised while reading a referenced file; the builder adds the key path and position. */
export class ImportError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ImportError';
  }
}

function read(readFile: ReadFile | undefined, file: string): string {
  if (!readFile) throw new ImportError(`${file}: this model refers to a file, but no file reader was given (parse it with the readFile option)`);
  let text: string;
  try {
    text = readFile(file);
  } catch (e) {
    const why = e instanceof Error ? e.message.replace(/^[A-Z]+: /, '') : String(e);
    throw new ImportError(`${file}: cannot read the file (${why.length > 120 ? `${why.slice(0, 119)}…` : why})`);
  }
  const notText = notUtf8Text(text);
  if (notText) throw new ImportError(`${file}:${notText.line}: not a UTF-8 text file: ${notText.reason}`);
  return text;
}

/** The text of a file the model refers to (its errors as ImportError, naming the file). */
export function readImportedText(readFile: ReadFile | undefined, file: string): string {
  return read(readFile, file);
}

function wrap<T>(f: () => T): T {
  try {
    return f();
  } catch (e) {
    if (e instanceof CsvError || e instanceof SvgError) throw new ImportError(e.message);
    throw e;
  }
}

/** Outline points from a CSV: columns x, y (header optional; with a header, by name). */
export function pointsShape(readFile: ReadFile | undefined, file: string): Shape {
  const text = read(readFile, file);
  return wrap(() => {
    const rows = pickColumns(readCsv(text, file), ['x', 'y'], file, false);
    if (rows.length < 3) throw new CsvError(`${file}: an outline needs at least 3 points, the file has ${rows.length}`);
    // a closing row that repeats the first point is common in exported point lists
    const first = rows[0], last = rows[rows.length - 1];
    if (rows.length > 3 && first[0] === last[0] && first[1] === last[1]) rows.pop();
    return { kind: 'polygon', vertices: rows.map(([x, y]) => ({ at: [x, y] as Point, round: 0 })), source: file };
  });
}

export interface SvgRequest {
  file: string;
  path: string;
  /** model lengths per drawing unit (after the units conversion) */
  scale: number;
  /** chord tolerance for Bézier curves, model lengths; undefined = 1/1000 of the path's smaller extent */
  chordTolerance: number | undefined;
}

/** One SVG path → a polygon shape whose `pieces` keep lines and arcs exact. */
export function svgShape(readFile: ReadFile | undefined, req: SvgRequest): Shape {
  const text = read(readFile, req.file);
  return wrap(() => {
    const d = findSvgPath(text, req.path, req.file);
    const segs = parseSvgPath(d, req.scale, req.file, req.path);
    const extent = segmentsExtent(segs);
    const tol = req.chordTolerance ?? (extent > 0 ? extent / 1000 : 1);
    const pieces = flattenSegments(segs, tol);
    if (pieces.length < 2) throw new SvgError(`${req.file}: path ${quote(req.path)} encloses no area (${pieces.length} piece)`);
    return { kind: 'polygon', vertices: sketch(pieces), pieces, source: `${req.file}#${req.path}` };
  });
}

/** Piece start points and arc midpoints: enough for bounding boxes and area estimates. */
function sketch(pieces: readonly PathPiece[]): PolygonVertex[] {
  const out: PolygonVertex[] = [];
  for (const p of pieces) {
    out.push({ at: p.from, round: 0 });
    if (p.kind === 'arc') {
      const phi = p.startAngle + p.sweep / 2;
      out.push({ at: [p.center[0] + p.radius * Math.cos(phi), p.center[1] + p.radius * Math.sin(phi)], round: 0 });
    } else if (p.kind === 'ellipse-arc') {
      const t = p.startParam + p.sweep / 2;
      const c = Math.cos(p.rotation), s = Math.sin(p.rotation);
      const lx = p.a * Math.cos(t), ly = p.b * Math.sin(t);
      out.push({ at: [p.center[0] + c * lx - s * ly, p.center[1] + s * lx + c * ly], round: 0 });
    }
  }
  return out;
}

/** A displacement table: header naming x, y, ux, uy (any column order), rows in any order. */
export function displacementRows(readFile: ReadFile | undefined, file: string): number[] {
  const text = read(readFile, file);
  return wrap(() => {
    const rows = pickColumns(readCsv(text, file), ['x', 'y', 'ux', 'uy'], file, true);
    return rows.flat();
  });
}
