/**
 * One `<path>` of an SVG drawing → boundary pieces in model coordinates.
 *
 * The `d` attribute follows the W3C grammar (SVG 1.1 §8.3, "Path data"): commands M L H V Z
 * A C S Q T, absolute (upper case) and relative (lower case), implicit repeats, numbers with
 * exponents and without separators (`1.5.5` is 1.5, .5). Elliptical arcs are converted from the
 * endpoint to the centre parameterisation with the W3C implementation notes (SVG 1.1 Appendix
 * F.6.5–F.6.6, including the radius correction of F.6.6); a circular arc (rx = ry) stays an exact
 * circle arc, any other an exact ellipse arc. Bézier curves are flattened to lines.
 *
 * SVG's y axis points down; the model's points up. Model point = scale · (x, −y): the drawing is
 * mirrored about its x axis, so a drawing that looks right on screen looks right in the model.
 */
import type { PathPiece, Point } from './types.js';

export class SvgError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SvgError';
  }
}

/** The `d` attribute of the `<path>` whose id is `id`. */
export function findSvgPath(svgText: string, id: string, file: string): string {
  const ids: string[] = [];
  const tagRe = /<path\b([^>]*)>/gis;
  for (const m of svgText.matchAll(tagRe)) {
    const attrs = m[1];
    const pid = attribute(attrs, 'id');
    if (pid !== undefined) ids.push(pid);
    if (pid !== id) continue;
    if (attribute(attrs, 'transform') !== undefined) {
      throw new SvgError(`${file}: path '${id}' has a transform attribute; apply it to the path data first (peakwise reads the d attribute as it is)`);
    }
    const d = attribute(attrs, 'd');
    if (d === undefined) throw new SvgError(`${file}: path '${id}' has no d attribute`);
    return d;
  }
  const known = ids.length ? `the paths with an id are ${ids.slice(0, 20).map((s) => `'${s}'`).join(', ')}` : 'the file has no <path> with an id';
  throw new SvgError(`${file}: no <path> with id '${id}'; ${known}`);
}

function attribute(attrs: string, name: string): string | undefined {
  const m = new RegExp(`(?:^|\\s)${name}\\s*=\\s*(?:"([^"]*)"|'([^']*)')`, 'i').exec(attrs);
  return m ? (m[1] ?? m[2]) : undefined;
}

/** A path segment before flattening, in model coordinates. */
export type SvgSegment =
  | PathPiece
  | { kind: 'bezier'; control: Point[] };

const ARGS: Record<string, number> = { m: 2, l: 2, h: 1, v: 1, z: 0, a: 7, c: 6, s: 4, q: 4, t: 2 };

function tokenize(d: string, file: string, id: string): (string | number)[] {
  const out: (string | number)[] = [];
  const re = /\s*,?\s*(?:([MmLlHhVvZzAaCcSsQqTt])|([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?))/y;
  let pos = 0;
  while (pos < d.length) {
    if (/^[\s,]*$/.test(d.slice(pos))) break;
    re.lastIndex = pos;
    const m = re.exec(d);
    if (!m) throw new SvgError(`${file}: path '${id}': cannot read the path data at character ${pos + 1}: ${JSON.stringify(d.slice(pos, pos + 12))}`);
    out.push(m[1] ?? Number(m[2]));
    pos = re.lastIndex;
  }
  return out;
}

/**
 * Parse path data into segments in model coordinates (scale·(x, −y)). The path must be one
 * closed subpath: a single M, and it must end where it started (Z closes it with a line).
 */
export function parseSvgPath(d: string, scale: number, file: string, id: string): SvgSegment[] {
  const tokens = tokenize(d, file, id);
  const segs: SvgSegment[] = [];
  const where = `${file}: path '${id}'`;
  // current point and subpath start in SVG coordinates
  let cx = 0, cy = 0, sx = 0, sy = 0;
  let lastCtrl: [number, number] | undefined; // reflected control point for S / T
  let lastCmd = '';
  let moves = 0;
  let closed = false;
  const map = (x: number, y: number): Point => [scale * x, -scale * y];
  const line = (x: number, y: number) => {
    if (x !== cx || y !== cy) segs.push({ kind: 'line', from: map(cx, cy), to: map(x, y) });
    cx = x; cy = y;
  };
  let i = 0;
  let cmd = '';
  while (i < tokens.length) {
    const tk = tokens[i];
    if (typeof tk === 'string') {
      cmd = tk;
      i++;
    } else if (cmd === '') {
      throw new SvgError(`${where}: path data must start with a command (M), got the number ${tk}`);
    } else if (cmd === 'm') {
      cmd = 'l';
    } else if (cmd === 'M') {
      cmd = 'L';
    } else if (cmd === 'z' || cmd === 'Z') {
      throw new SvgError(`${where}: a number follows Z`);
    }
    const lower = cmd.toLowerCase();
    const n = ARGS[lower];
    const args: number[] = [];
    for (let k = 0; k < n; k++) {
      const v = tokens[i + k];
      if (typeof v !== 'number') throw new SvgError(`${where}: command ${cmd} needs ${n} numbers`);
      args.push(v);
    }
    i += n;
    if (closed && lower !== 'z') throw new SvgError(`${where}: the path continues after Z; only one closed outline per path is read`);
    const rel = cmd !== cmd.toUpperCase();
    const ox = rel ? cx : 0, oy = rel ? cy : 0;
    switch (lower) {
      case 'm':
        moves++;
        if (moves > 1) throw new SvgError(`${where}: the path has more than one subpath (a second M); give each loop its own path`);
        cx = ox + args[0]; cy = oy + args[1]; sx = cx; sy = cy;
        lastCtrl = undefined;
        break;
      case 'l': line(ox + args[0], oy + args[1]); lastCtrl = undefined; break;
      case 'h': line(ox + args[0], cy); lastCtrl = undefined; break;
      case 'v': line(cx, (rel ? cy : 0) + args[0]); lastCtrl = undefined; break;
      case 'z': line(sx, sy); closed = true; lastCtrl = undefined; break;
      case 'c': case 's': case 'q': case 't': {
        let pts: [number, number][];
        const reflect = (): [number, number] => {
          const prevOk = lower === 's' ? /[cs]/i.test(lastCmd) : /[qt]/i.test(lastCmd);
          return prevOk && lastCtrl ? [2 * cx - lastCtrl[0], 2 * cy - lastCtrl[1]] : [cx, cy];
        };
        if (lower === 'c') pts = [[cx, cy], [ox + args[0], oy + args[1]], [ox + args[2], oy + args[3]], [ox + args[4], oy + args[5]]];
        else if (lower === 's') pts = [[cx, cy], reflect(), [ox + args[0], oy + args[1]], [ox + args[2], oy + args[3]]];
        else if (lower === 'q') pts = [[cx, cy], [ox + args[0], oy + args[1]], [ox + args[2], oy + args[3]]];
        else pts = [[cx, cy], reflect(), [ox + args[0], oy + args[1]]];
        lastCtrl = pts[pts.length - 2];
        const [ex, ey] = pts[pts.length - 1];
        if (pts.some(([x, y]) => x !== cx || y !== cy)) segs.push({ kind: 'bezier', control: pts.map(([x, y]) => map(x, y)) });
        cx = ex; cy = ey;
        break;
      }
      case 'a': {
        const piece = arcPiece(cx, cy, args[0], args[1], args[2], args[3] !== 0, args[4] !== 0, ox + args[5], oy + args[6], scale);
        if (piece) segs.push(piece);
        else line(ox + args[5], oy + args[6]);
        cx = ox + args[5]; cy = oy + args[6];
        lastCtrl = undefined;
        break;
      }
    }
    lastCmd = cmd;
  }
  if (moves === 0) throw new SvgError(`${where}: the path data is empty`);
  if (cx !== sx || cy !== sy) {
    throw new SvgError(`${where}: the path is not closed: it ends at (${cx}, ${cy}), not at its start (${sx}, ${sy}); end it with Z`);
  }
  // exact end points: every piece starts bitwise where the previous one ends
  return segs;
}

/**
 * SVG 1.1 Appendix F.6.5 (endpoint → centre parameterisation) with the out-of-range radius
 * correction of F.6.6, then mirrored into model coordinates. Null for a degenerate arc
 * (a zero radius means a straight line, per F.6.2).
 */
function arcPiece(
  x1: number, y1: number, rxIn: number, ryIn: number, phiDeg: number, large: boolean, sweepFlag: boolean,
  x2: number, y2: number, scale: number,
): PathPiece | null {
  if (x1 === x2 && y1 === y2) return null;
  let rx = Math.abs(rxIn), ry = Math.abs(ryIn);
  if (rx === 0 || ry === 0) return null;
  const phi = (phiDeg * Math.PI) / 180;
  const cp = Math.cos(phi), sp = Math.sin(phi);
  const dx = (x1 - x2) / 2, dy = (y1 - y2) / 2;
  const x1p = cp * dx + sp * dy;
  const y1p = -sp * dx + cp * dy;
  const lambda = (x1p * x1p) / (rx * rx) + (y1p * y1p) / (ry * ry);
  if (lambda > 1) {
    const k = Math.sqrt(lambda);
    rx *= k; ry *= k;
  }
  const num = rx * rx * ry * ry - rx * rx * y1p * y1p - ry * ry * x1p * x1p;
  const den = rx * rx * y1p * y1p + ry * ry * x1p * x1p;
  let coef = Math.sqrt(Math.max(0, num / den));
  if (large === sweepFlag) coef = -coef;
  const cxp = (coef * rx * y1p) / ry;
  const cyp = (-coef * ry * x1p) / rx;
  const ccx = cp * cxp - sp * cyp + (x1 + x2) / 2;
  const ccy = sp * cxp + cp * cyp + (y1 + y2) / 2;
  const angle = (ux: number, uy: number, vx: number, vy: number) => Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy);
  const theta1 = angle(1, 0, (x1p - cxp) / rx, (y1p - cyp) / ry);
  let dtheta = angle((x1p - cxp) / rx, (y1p - cyp) / ry, (-x1p - cxp) / rx, (-y1p - cyp) / ry);
  if (!sweepFlag && dtheta > 0) dtheta -= 2 * Math.PI;
  else if (sweepFlag && dtheta < 0) dtheta += 2 * Math.PI;
  // mirror y: centre (cx, −cy), rotation −φ, parameter −θ
  const center: Point = [scale * ccx, -scale * ccy];
  const from: Point = [scale * x1, -scale * y1];
  const to: Point = [scale * x2, -scale * y2];
  if (Math.abs(rx - ry) <= 1e-12 * Math.max(rx, ry)) {
    return { kind: 'arc', center, radius: scale * rx, startAngle: -phi - theta1, sweep: -dtheta, from, to };
  }
  return { kind: 'ellipse-arc', center, a: scale * rx, b: scale * ry, rotation: -phi, startParam: -theta1, sweep: -dtheta, from, to };
}

/**
 * Bézier segments → lines: uniform subdivision into n pieces keeps the chord error below
 * max|B''|/(8n²) (the linear-interpolation error bound), with max|B''| bounded by the control
 * polygon's second differences (degree·(degree − 1)·max|Δ²P|).
 */
export function flattenSegments(segs: readonly SvgSegment[], chordTolerance: number): PathPiece[] {
  const out: PathPiece[] = [];
  for (const s of segs) {
    if (s.kind !== 'bezier') {
      out.push(s);
      continue;
    }
    const P = s.control;
    const deg = P.length - 1;
    let m = 0;
    for (let k = 0; k + 2 <= deg; k++) {
      m = Math.max(m, Math.hypot(P[k][0] - 2 * P[k + 1][0] + P[k + 2][0], P[k][1] - 2 * P[k + 1][1] + P[k + 2][1]));
    }
    const bound = deg * (deg - 1) * m;
    const n = Math.min(1000, Math.max(1, Math.ceil(Math.sqrt(bound / (8 * chordTolerance)))));
    let prev = P[0];
    for (let j = 1; j <= n; j++) {
      const next = j === n ? P[deg] : bezierPoint(P, j / n);
      out.push({ kind: 'line', from: prev, to: next });
      prev = next;
    }
  }
  return out;
}

function bezierPoint(P: readonly Point[], t: number): Point {
  // de Casteljau
  const q = P.map((p) => [p[0], p[1]] as Point);
  for (let r = q.length - 1; r > 0; r--) {
    for (let k = 0; k < r; k++) q[k] = [(1 - t) * q[k][0] + t * q[k + 1][0], (1 - t) * q[k][1] + t * q[k + 1][1]];
  }
  return q[0];
}

/** Bounding box of the segments' points and control points. */
export function segmentsExtent(segs: readonly SvgSegment[]): number {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  const add = (p: Point) => {
    minX = Math.min(minX, p[0]); maxX = Math.max(maxX, p[0]);
    minY = Math.min(minY, p[1]); maxY = Math.max(maxY, p[1]);
  };
  for (const s of segs) {
    if (s.kind === 'bezier') s.control.forEach(add);
    else {
      add(s.from); add(s.to);
      if (s.kind === 'arc') add(s.center);
    }
  }
  return Math.min(maxX - minX, maxY - minY);
}
