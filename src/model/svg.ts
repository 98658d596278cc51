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

/**
 * Elements whose content is never drawn where it stands (SVG 1.1 §5.3 `defs`, §5.5 `symbol`,
 * §14.3 `clipPath`, §14.4 `mask`, §13.3 `pattern`, §11.6 `marker`, §5.4 `title`/`desc`, §21
 * `metadata`, gradients, filters, fonts, `style`, `script`, `foreignObject`): a path in there is
 * not an outline of the drawing. Compared lower-cased.
 */
const NOT_DRAWN = new Set([
  'defs', 'symbol', 'clippath', 'mask', 'pattern', 'marker', 'title', 'desc', 'metadata', 'lineargradient',
  'radialgradient', 'filter', 'font', 'font-face', 'glyph', 'missing-glyph', 'cursor', 'view', 'style', 'script',
  'foreignobject',
]);

/** Elements whose text content is not markup (skipped up to their end tag). */
const RAW_TEXT = new Set(['style', 'script']);

/** Longest id or fragment of the file quoted in a message. */
const MAX_SHOWN = 40;

interface SvgElement {
  /** local name, lower-cased */
  name: string;
  /** local name as written */
  tag: string;
  attrs: Record<string, string>;
  line: number;
  /** why the element is not drawn where it stands ("lies inside <defs> (line 3)"), if it is not */
  hiddenBy: string | undefined;
  /** an enclosing element that moves its content: a group with a transform, a nested svg */
  movedBy: string | undefined;
}

function shown(text: string): string {
  // eslint-disable-next-line no-control-regex
  const clean = text.replace(/[\u0000-\u001f\u007f-\u009f]/g, '?');
  return `'${clean.length > MAX_SHOWN ? `${clean.slice(0, MAX_SHOWN - 1)}…` : clean}'`;
}

/** XML character and the five predefined entity references in an attribute value. */
function decodeEntities(text: string): string {
  return text.replace(/&(#x[0-9a-f]+|#[0-9]+|lt|gt|amp|quot|apos);/gi, (m, ref: string) => {
    const r = ref.toLowerCase();
    if (r[0] === '#') {
      const code = r[1] === 'x' ? parseInt(r.slice(2), 16) : parseInt(r.slice(1), 10);
      return code > 0 && code <= 0x10ffff ? String.fromCodePoint(code) : m;
    }
    return ({ lt: '<', gt: '>', amp: '&', quot: '"', apos: "'" } as Record<string, string>)[r] ?? m;
  });
}

/**
 * Every start tag of the drawing, in document order, with its attributes and whether it sits in a
 * part that is not drawn. Comments, CDATA sections, processing instructions, the DOCTYPE and the
 * text of `style` and `script` are skipped; attribute values may hold `>` (XML 1.0 §3.1).
 */
function svgElements(text: string, file: string): SvgElement[] {
  const out: SvgElement[] = [];
  const stack: { name: string; hidden: string | undefined; moved: string | undefined }[] = [];
  let line = 1;
  let pos = 0;
  const advance = (to: number): void => {
    for (let k = pos; k < to && k < text.length; k++) if (text.charCodeAt(k) === 10) line++;
    pos = to;
  };
  const skipPast = (end: string, what: string): void => {
    const k = text.indexOf(end, pos);
    if (k < 0) throw new SvgError(`${file}:${line}: ${what} is never closed (no ${end})`);
    advance(k + end.length);
  };
  const attrRe = /\s*([^\s=/>]+)\s*=\s*(?:"([^"]*)"|'([^']*)')|\s*([^\s=/>]+)/y;
  while (pos < text.length) {
    const lt = text.indexOf('<', pos);
    if (lt < 0) break;
    advance(lt);
    if (text.startsWith('<!--', pos)) { skipPast('-->', 'a comment'); continue; }
    if (text.startsWith('<![CDATA[', pos)) { skipPast(']]>', 'a CDATA section'); continue; }
    if (text.startsWith('<?', pos)) { skipPast('?>', 'a processing instruction'); continue; }
    if (text.startsWith('<!', pos)) {
      // DOCTYPE, possibly with an internal subset in [ … ]
      const bracket = text.indexOf('[', pos), close = text.indexOf('>', pos);
      if (bracket >= 0 && close >= 0 && bracket < close) skipPast(']', 'a DOCTYPE');
      skipPast('>', 'a DOCTYPE');
      continue;
    }
    if (text.startsWith('</', pos)) {
      const m = /<\/\s*([^\s>]+)\s*>/y;
      m.lastIndex = pos;
      const e = m.exec(text);
      if (!e) throw new SvgError(`${file}:${line}: cannot read the end tag ${shown(text.slice(pos, pos + 20))}`);
      const name = localName(e[1]);
      // pop to the matching start tag (lenient about unclosed elements inside it)
      for (let k = stack.length - 1; k >= 0; k--) {
        if (stack[k].name === name) { stack.length = k; break; }
      }
      advance(m.lastIndex);
      continue;
    }
    const nameRe = /<([A-Za-z_][^\s/>]*)/y;
    nameRe.lastIndex = pos;
    const nm = nameRe.exec(text);
    if (!nm) { advance(pos + 1); continue; } // a stray '<' in text
    const startLine = line;
    const name = localName(nm[1]);
    // as written, for messages (`clipPath`, not `clippath`)
    const tag = nm[1].slice(nm[1].indexOf(':') + 1);
    let k = nameRe.lastIndex;
    const attrs: Record<string, string> = {};
    let selfClosing = false;
    for (;;) {
      while (k < text.length && /\s/.test(text[k])) k++;
      if (k >= text.length) throw new SvgError(`${file}:${startLine}: the tag <${tag}> is never closed`);
      if (text[k] === '>') { k++; break; }
      if (text.startsWith('/>', k)) { k += 2; selfClosing = true; break; }
      attrRe.lastIndex = k;
      const a = attrRe.exec(text);
      if (!a) throw new SvgError(`${file}:${startLine}: cannot read the attributes of <${tag}>`);
      k = attrRe.lastIndex;
      // an attribute without a value (an HTML habit) is ignored
      if (a[4] === undefined) attrs[localName(a[1])] = decodeEntities(a[2] ?? a[3] ?? '');
    }
    advance(k);
    const parent = stack[stack.length - 1];
    // why the element is not drawn where it stands, completing "… is not drawn: it …"
    const hiddenBy = parent?.hidden ?? (notDisplayed(attrs) ? 'has display: none' : undefined);
    out.push({ name, tag, attrs, line: startLine, hiddenBy, movedBy: parent?.moved });
    if (!selfClosing) {
      const hidden = hiddenBy !== undefined && parent?.hidden === undefined
        ? `lies inside an element with display: none (line ${startLine})`
        : hiddenBy ?? (NOT_DRAWN.has(name) ? `lies inside <${tag}> (line ${startLine})` : undefined);
      const moves = stack.length > 0 && name === 'svg' && ['x', 'y', 'viewbox'].some((n) => attrs[n] !== undefined)
        ? `a nested <svg> (line ${startLine})`
        : attrs.transform !== undefined ? `<${tag}> with a transform (line ${startLine})` : undefined;
      stack.push({ name, hidden, moved: parent?.moved ?? moves });
      if (RAW_TEXT.has(name)) {
        const endRe = new RegExp(`</(?:[^\\s:>]+:)?${name}[\\s>]`, 'ig');
        endRe.lastIndex = pos;
        const end = endRe.exec(text);
        advance(end ? end.index : text.length);
      }
    }
  }
  return out;
}

function localName(qname: string): string {
  const c = qname.indexOf(':');
  return (c >= 0 ? qname.slice(c + 1) : qname).toLowerCase();
}

function notDisplayed(attrs: Record<string, string>): boolean {
  if (attrs.display?.trim() === 'none') return true;
  return /(?:^|;)\s*display\s*:\s*none\s*(?:;|$)/i.test(attrs.style ?? '');
}

/**
 * The `d` attribute of the drawn `<path>` whose id is `id`. An id used twice in the file, a path
 * inside a part that is not drawn (`<defs>`, `<symbol>`, `<clipPath>`, …, or display: none) and a
 * path moved by a transform (its own or an enclosing group's) are errors naming the line.
 */
export function findSvgPath(svgText: string, id: string, file: string): string {
  const elements = svgElements(svgText, file);
  const same = elements.filter((e) => e.attrs.id === id);
  if (same.length > 1) {
    throw new SvgError(`${file}: the id ${shown(id)} is used by ${same.length} elements (lines ${same.map((e) => e.line).join(', ')}); ids must be unique in a drawing, rename all but one`);
  }
  const target = same[0];
  if (target === undefined || target.name !== 'path') {
    const drawn = elements.filter((e) => e.name === 'path' && e.attrs.id !== undefined && e.hiddenBy === undefined).map((e) => e.attrs.id);
    const what = target ? ` (line ${target.line} has id ${shown(id)} on a <${target.tag}>, not on a <path>)` : '';
    const known = drawn.length ? `the drawn paths with an id are ${drawn.slice(0, 20).map(shown).join(', ')}${drawn.length > 20 ? ', …' : ''}` : 'the file has no drawn <path> with an id';
    throw new SvgError(`${file}: no <path> with id ${shown(id)}${what}; ${known}`);
  }
  const at = `${file}:${target.line}: path ${shown(id)}`;
  if (target.hiddenBy !== undefined) {
    throw new SvgError(`${at} is not drawn: it ${target.hiddenBy}; peakwise reads only paths that are drawn where they stand`);
  }
  if (target.attrs.transform !== undefined) {
    throw new SvgError(`${at} has a transform attribute; apply it to the path data first (peakwise reads the d attribute as it is)`);
  }
  if (target.movedBy !== undefined) {
    throw new SvgError(`${at} sits inside ${target.movedBy}, which moves it; apply the transform to the path data first (peakwise reads the d attribute as it is)`);
  }
  const d = target.attrs.d;
  if (d === undefined) throw new SvgError(`${at} has no d attribute`);
  return d;
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
    if (!m) throw new SvgError(`${file}: path ${shown(id)}: cannot read the path data at character ${pos + 1}: ${shown(d.slice(pos, pos + 12))}`);
    if (m[1] !== undefined) out.push(m[1]);
    else {
      const v = Number(m[2]);
      if (!Number.isFinite(v)) {
        throw new SvgError(`${file}: path ${shown(id)}: the number ${shown(m[2])} at character ${re.lastIndex - m[2].length + 1} of the path data is not a finite number`);
      }
      out.push(v);
    }
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
  const where = `${file}: path ${shown(id)}`;
  // current point and subpath start in SVG coordinates
  let cx = 0, cy = 0, sx = 0, sy = 0;
  let lastCtrl: [number, number] | undefined; // reflected control point for S / T
  let lastCmd = '';
  let moves = 0;
  let closed = false;
  const map = (x: number, y: number): Point => {
    const p: Point = [scale * x, -scale * y];
    if (!(Number.isFinite(p[0]) && Number.isFinite(p[1]))) {
      throw new SvgError(`${where}: the point (${x}, ${y}) times the scale ${scale} is not a finite number`);
    }
    return p;
  };
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
  // an arc through finite end points can still overflow (a radius of 1e300 squared)
  for (const sg of segs) {
    const nums = sg.kind === 'bezier' ? sg.control.flat() : sg.kind === 'line' ? [] : sg.kind === 'arc'
      ? [...sg.center, sg.radius, sg.startAngle, sg.sweep] : [...sg.center, sg.a, sg.b, sg.rotation, sg.startParam, sg.sweep];
    if (!nums.every(Number.isFinite)) throw new SvgError(`${where}: an arc of the path is too large to compute (not a finite number)`);
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
