/**
 * Cut readout: the recovered stress sampled along a straight line or around an opening's edge,
 * with its invariants, and optionally a closed-form solution beside it (Kirsch, Lamé, Inglis).
 * Pure functions on the mesh and the nodal field; the CLI writes the table as cut.csv.
 */
import { PeakwiseError } from '../errors.js';
import type { Mesh } from '../mesh/types.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { Model, PlaneState, Point, Selector } from '../model/types.js';
import type { NodalStress } from '../recovery/types.js';
import { boundaryTangentialStress, buildPointLocator, principal, stressAt, tresca, vonMises } from '../recovery/index.js';
import { kirschCartesian, lameRing } from '../reference/index.js';
import { columnName, csvNumber, csvText } from '../report/index.js';

/** Samples on a line cut when `:n` is not given. */
export const DEFAULT_PATH_SAMPLES = 101;
export const MAX_CUT_SAMPLES = 100000;

export type CutSpec =
  | { kind: 'line'; from: Point; to: Point; samples: number }
  | { kind: 'opening'; id: string };

function usage(message: string): PeakwiseError {
  return new PeakwiseError('usage', message);
}

/** `x1,y1:x2,y2[:n]` or `opening:<id>`. */
export function parseCutSpec(text: string): CutSpec {
  const t = text.trim();
  if (t.startsWith('opening:')) {
    const id = t.slice('opening:'.length).trim();
    if (id === '') throw usage('--cut opening:<id> needs the id of an opening');
    return { kind: 'opening', id };
  }
  const parts = t.split(':');
  if (parts.length < 2 || parts.length > 3) throw usage(`--cut "${text}": expected x1,y1:x2,y2[:n] or opening:<id>`);
  const point = (p: string): Point => {
    const xy = p.split(',').map((v) => (v.trim() === '' ? NaN : Number(v)));
    if (xy.length !== 2 || !xy.every(Number.isFinite)) throw usage(`--cut "${text}": "${p}" is not a point x,y`);
    return [xy[0], xy[1]];
  };
  const from = point(parts[0]);
  const to = point(parts[1]);
  if (from[0] === to[0] && from[1] === to[1]) throw usage(`--cut "${text}": the two ends are the same point`);
  let samples = DEFAULT_PATH_SAMPLES;
  if (parts.length === 3) {
    samples = Number(parts[2]);
    if (!(Number.isInteger(samples) && samples >= 2 && samples <= MAX_CUT_SAMPLES)) {
      throw usage(`--cut "${text}": the sample count must be an integer from 2 to ${MAX_CUT_SAMPLES}, got "${parts[2]}"`);
    }
  }
  return { kind: 'line', from, to, samples };
}

/** One stress sample of a cut; stresses are NaN where the point is outside the plate. */
export interface CutSample {
  s: number;
  x: number;
  y: number;
  sxx: number;
  syy: number;
  sxy: number;
  szz: number;
  s1: number;
  s2: number;
  vonMises: number;
  tresca: number;
  /** tangential normal stress on a boundary cut; NaN on a line cut */
  tangential: number;
}

export interface CutTable {
  kind: 'line' | 'opening';
  samples: CutSample[];
  /** closed-form columns (name → values, one per sample), e.g. ref_tangential, diff_tangential */
  extra: Record<string, number[]>;
}

function sample(s: number, x: number, y: number, st: { sxx: number; syy: number; sxy: number; szz: number } | null, tangential = NaN): CutSample {
  if (!st) return { s, x, y, sxx: NaN, syy: NaN, sxy: NaN, szz: NaN, s1: NaN, s2: NaN, vonMises: NaN, tresca: NaN, tangential };
  const p = principal(st.sxx, st.syy, st.sxy);
  return {
    s, x, y, sxx: st.sxx, syy: st.syy, sxy: st.sxy, szz: st.szz, s1: p.s1, s2: p.s2,
    vonMises: vonMises(st.sxx, st.syy, st.sxy, st.szz), tresca: tresca(st.sxx, st.syy, st.sxy, st.szz), tangential,
  };
}

/** `samples` equally spaced points from `from` to `to` (both included), interpolated in the element that holds each. */
export function sampleCut(mesh: Mesh, field: Pick<NodalStress, 'stress' | 'szz'>, from: Point, to: Point, samples = DEFAULT_PATH_SAMPLES): CutTable {
  const locator = buildPointLocator(mesh);
  const L = Math.hypot(to[0] - from[0], to[1] - from[1]);
  const out: CutSample[] = [];
  for (let k = 0; k < samples; k++) {
    const t = k / (samples - 1);
    const x = from[0] + t * (to[0] - from[0]);
    const y = from[1] + t * (to[1] - from[1]);
    out.push(sample(t * L, x, y, stressAt(mesh, field, x, y, locator)));
  }
  // a cut that misses the plate would be a table of blanks: say so instead (issue 19)
  if (!out.some((p) => Number.isFinite(p.sxx))) {
    const p = (q: Point) => `(${Number(q[0].toPrecision(6))}, ${Number(q[1].toPrecision(6))})`;
    throw usage(`--cut ${p(from)} to ${p(to)}: none of its ${samples} sample points lies in the plate; the line misses it (or crosses only an opening)`);
  }
  return { kind: 'line', samples: out, extra: {} };
}

/**
 * Around an opening's edge: the boundary nodes in travel order (mid-side nodes included for
 * LST), their recovered stress and the tangential stress along the exact edge curve.
 */
export function openingCut(mesh: Mesh, geometry: PlateGeometry, field: Pick<NodalStress, 'stress' | 'szz'>, id: string): CutTable {
  const loop = geometry.loops.find((l) => l.id === id && l.hole);
  if (!loop) {
    const have = geometry.loops.filter((l) => l.hole).map((l) => l.id);
    throw usage(`--cut opening:${id}: no opening "${id}"${have.length ? ` (the model has ${have.join(', ')})` : ' (the model has no openings)'}`);
  }
  const b = boundaryTangentialStress(mesh, geometry, field, id);
  const out: CutSample[] = [];
  for (let k = 0; k < b.s.length; k++) {
    const n = b.node[k];
    const st = { sxx: field.stress[3 * n], syy: field.stress[3 * n + 1], sxy: field.stress[3 * n + 2], szz: field.szz[n] };
    out.push(sample(b.s[k], b.x[k], b.y[k], st, b.st[k]));
  }
  return { kind: 'opening', samples: out, extra: {} };
}

/** Closed forms a cut can be compared with, and the constants each needs. */
export type CutCompare =
  | { kind: 'kirsch'; center: Point; radius: number; remote: number; angleDeg: number }
  | { kind: 'lame'; center: Point; inner: number; outer: number; innerPressure: number; outerPressure: number; E: number; nu: number; state: PlaneState }
  | { kind: 'inglis'; center: Point; a: number; b: number; axisDeg: number; remote: number; angleDeg: number };

/** Cartesian stress of a polar state (σr, σθ, τrθ) at angle θ. */
function polarToCartesian(sr: number, st: number, srt: number, theta: number): { sxx: number; syy: number; sxy: number } {
  const c = Math.cos(theta);
  const s = Math.sin(theta);
  return {
    sxx: sr * c * c + st * s * s - 2 * srt * s * c,
    syy: sr * s * s + st * c * c + 2 * srt * s * c,
    sxy: (sr - st) * s * c + srt * (c * c - s * s),
  };
}

/** Kirsch field with the remote tension turned by `angleDeg` from x: rotate in, evaluate, rotate back. */
function kirschTurned(c: Extract<CutCompare, { kind: 'kirsch' }>, x: number, y: number): { sxx: number; syy: number; sxy: number } {
  const b = (c.angleDeg * Math.PI) / 180;
  const cb = Math.cos(b);
  const sb = Math.sin(b);
  const dx = x - c.center[0];
  const dy = y - c.center[1];
  const u = cb * dx + sb * dy;
  const v = -sb * dx + cb * dy;
  const k = kirschCartesian(c.remote, c.radius, u, v);
  // back to global axes: σ = R σ' Rᵀ with R the rotation by b
  return {
    sxx: k.sxx * cb * cb + k.syy * sb * sb - 2 * k.sxy * sb * cb,
    syy: k.sxx * sb * sb + k.syy * cb * cb + 2 * k.sxy * sb * cb,
    sxy: (k.sxx - k.syy) * sb * cb + k.sxy * (cb * cb - sb * sb),
  };
}

/**
 * Tangential stress on the edge of an elliptical hole (semi-axes a along its own axis, b across)
 * in an infinite plate under remote uniaxial tension S at angle β from the a axis, at the point of
 * eccentric angle η (x = a cos η, y = b sin η): with m = (a − b)/(a + b),
 *   σt = S [1 − m² + 2m cos 2β − 2 cos 2(β − η)] / (1 − 2m cos 2η + m²).
 * C. E. Inglis, Trans. Inst. Naval Architects 55 (1913) 219–241, in the form of
 * N. I. Muskhelishvili, Some Basic Problems of the Mathematical Theory of Elasticity (1953), §82.
 * It gives Kirsch's 1 − 2 cos 2(β − η) for a circle and Kt = 1 + 2a/b at η = 0 when β = 90°.
 */
export function ellipseEdgeStress(S: number, a: number, b: number, betaRad: number, eta: number): number {
  const m = (a - b) / (a + b);
  return (S * (1 - m * m + 2 * m * Math.cos(2 * betaRad) - 2 * Math.cos(2 * (betaRad - eta)))) / (1 - 2 * m * Math.cos(2 * eta) + m * m);
}

/** Adds ref_* and diff_* (peakwise − reference) columns for the chosen closed form. */
export function compareCut(table: CutTable, c: CutCompare): CutTable {
  const n = table.samples.length;
  const cols: Record<string, number[]> = {};
  const put = (name: string, k: number, v: number) => { (cols[name] ??= new Array<number>(n).fill(NaN))[k] = v; };
  table.samples.forEach((p, k) => {
    const dx = p.x - c.center[0];
    const dy = p.y - c.center[1];
    const r = Math.hypot(dx, dy);
    const theta = Math.atan2(dy, dx);
    let ref: { sxx: number; syy: number; sxy: number; szz: number } | undefined;
    let tangential = NaN;
    if (c.kind === 'kirsch') {
      const k3 = kirschTurned(c, p.x, p.y);
      ref = { ...k3, szz: 0 };
      // tangential = hoop stress σθ (meaningful where the sample lies on the hole edge)
      const t = [-Math.sin(theta), Math.cos(theta)];
      tangential = k3.sxx * t[0] * t[0] + 2 * k3.sxy * t[0] * t[1] + k3.syy * t[1] * t[1];
    } else if (c.kind === 'lame') {
      const l = lameRing({ a: c.inner, b: c.outer, p: c.innerPressure, q: c.outerPressure }, r, c.E, c.nu, c.state);
      ref = { ...polarToCartesian(l.sr, l.st, 0, theta), szz: l.sz };
      tangential = l.st;
    } else {
      const axis = (c.axisDeg * Math.PI) / 180;
      const u = Math.cos(axis) * dx + Math.sin(axis) * dy;
      const v = -Math.sin(axis) * dx + Math.cos(axis) * dy;
      const eta = Math.atan2(v / c.b, u / c.a);
      tangential = ellipseEdgeStress(c.remote, c.a, c.b, ((c.angleDeg - c.axisDeg) * Math.PI) / 180, eta);
    }
    if (ref) {
      put('ref_sxx', k, ref.sxx);
      put('ref_syy', k, ref.syy);
      put('ref_sxy', k, ref.sxy);
      const vm = vonMises(ref.sxx, ref.syy, ref.sxy, ref.szz);
      put('ref_von_mises', k, vm);
      put('diff_von_mises', k, p.vonMises - vm);
    }
    if (table.kind === 'opening') {
      put('ref_tangential', k, tangential);
      put('diff_tangential', k, p.tangential - tangential);
    }
  });
  return { ...table, extra: { ...table.extra, ...cols } };
}

/** cut.csv columns before the closed-form ones. */
export const PATH_COLUMNS = ['s', 'x', 'y', 'sxx', 'syy', 'sxy', 'szz', 's1', 's2', 'von_mises', 'tresca', 'tangential'] as const;

/**
 * cut.csv text (RFC 4180, CRLF, empty cells where a value is undefined). With `units`, every
 * column name carries its unit last, as in the other CSV files (`s_mm`, `sxx_MPa`).
 */
export function cutCsv(table: CutTable, units?: { length: string; stress: string }): string {
  const extra = Object.keys(table.extra);
  const lengthColumns = new Set(['s', 'x', 'y']);
  const name = (c: string) => (units ? columnName(c, lengthColumns.has(c) ? units.length : units.stress) : c);
  const rows = [[...PATH_COLUMNS, ...extra].map((c) => csvText(name(c))).join(',')];
  table.samples.forEach((p, k) => {
    const v = [p.s, p.x, p.y, p.sxx, p.syy, p.sxy, p.szz, p.s1, p.s2, p.vonMises, p.tresca, p.tangential, ...extra.map((e) => table.extra[e][k])];
    rows.push(v.map(csvNumber).join(','));
  });
  return rows.join('\r\n') + '\r\n';
}

/** Stress columns a line of results from another analysis may hold (cut.csv's own names). */
export { OTHER_CUT_COLUMNS, type OtherCutColumn } from './cut-columns.js';
import type { OtherCutColumn } from './cut-columns.js';

const SAMPLE_KEY: Record<OtherCutColumn, keyof CutSample> = {
  sxx: 'sxx', syy: 'syy', sxy: 'sxy', szz: 'szz', s1: 's1', s2: 's2', von_mises: 'vonMises', tresca: 'tresca', tangential: 'tangential',
};

/** The cut's value of one of OTHER_CUT_COLUMNS at every sample. */
export function cutColumn(table: CutTable, column: OtherCutColumn): number[] {
  return table.samples.map((p) => p[SAMPLE_KEY[column]] as number);
}

/**
 * Results along the cut from another analysis (issue 15 §5): each point (x, y, value) goes to the arc
 * length of the nearest point of the cut (the polyline through its samples), no farther from it than
 * `tolerance`; the values are interpolated linearly in s onto the cut's samples (blank outside the span
 * the points cover; round an opening the span closes on itself) as `other_<column>`, with `diff_other_<column>` = peakwise − other.
 */
export function overlayOtherCut(table: CutTable, points: readonly { x: number; y: number; value: number; line: number }[], column: OtherCutColumn, file: string, tolerance: number): CutTable {
  const smp = table.samples;
  const located = points.map((p) => {
    let best = Infinity, s = NaN;
    for (let k = 0; k + 1 < smp.length; k++) {
      const a = smp[k], b = smp[k + 1];
      const dx = b.x - a.x, dy = b.y - a.y, l2 = dx * dx + dy * dy;
      const t = l2 > 0 ? Math.min(1, Math.max(0, ((p.x - a.x) * dx + (p.y - a.y) * dy) / l2)) : 0;
      const d = Math.hypot(p.x - a.x - t * dx, p.y - a.y - t * dy);
      if (d < best) { best = d; s = a.s + t * (b.s - a.s); }
    }
    if (!(best <= tolerance)) {
      throw usage(`${file}:${p.line}: point (${p.x}, ${p.y}) is ${Number(best.toPrecision(3))} from the cut (at most ${Number(tolerance.toPrecision(3))}); the other analysis's points must lie along the same line or edge`);
    }
    return { s, value: p.value };
  });
  // round an opening the cut is closed: the points repeat one loop length before and after
  if (table.kind === 'opening' && smp.length > 1) {
    const loop = smp[smp.length - 1].s - smp[0].s;
    for (const q of [...located]) located.push({ s: q.s - loop, value: q.value }, { s: q.s + loop, value: q.value });
  }
  located.sort((a, b) => a.s - b.s);
  const other = smp.map((q) => {
    if (located.length === 0 || q.s < located[0].s - 1e-12 || q.s > located[located.length - 1].s + 1e-12) return NaN;
    let k = 0;
    while (k < located.length - 2 && located[k + 1].s < q.s) k++;
    const a = located[k], b = located[Math.min(k + 1, located.length - 1)];
    if (b.s === a.s) return a.value;
    const t = Math.min(1, Math.max(0, (q.s - a.s) / (b.s - a.s)));
    return a.value + t * (b.value - a.value);
  });
  const ours = cutColumn(table, column);
  return {
    ...table,
    extra: { ...table.extra, [`other_${column}`]: other, [`diff_other_${column}`]: other.map((v, k) => ours[k] - v) },
  };
}

/** Constants a comparison may take from the command line; missing ones come from the model. */
export interface CompareInputs {
  kind: string;
  /** remote tension (Kirsch, Inglis) */
  remote?: number;
  /** direction of the remote tension from x, degrees (default 0) */
  angleDeg?: number;
  /** hole radius (Kirsch) or inner radius (Lamé) */
  radius?: number;
  /** outer radius (Lamé) */
  outerRadius?: number;
  center?: Point;
  innerPressure?: number;
  outerPressure?: number;
  /** the opening of an opening cut */
  opening?: string;
}

function need(v: number | undefined, option: string, kind: string): number {
  if (v === undefined || !Number.isFinite(v)) throw usage(`--compare ${kind} needs ${option}`);
  return v;
}

/**
 * Fill the constants of a comparison from the options and the model: the hole's centre and radius
 * from a circular opening (the cut's, else the only circle), Lamé's outer radius from a circular
 * outline, Lamé's pressures from the model's pressure loads on that opening and on the outline,
 * the ellipse's semi-axes and axis angle from an elliptical opening.
 */
export function resolveCompare(input: CompareInputs, model: Pick<Model, 'plate' | 'material' | 'state' | 'loads'>): CutCompare {
  const kind = input.kind;
  // the closed forms here are plane solutions; a body of revolution has its own (docs/fem.md)
  if (model.state === 'axisymmetric') throw usage(`--compare ${kind} is a plane closed form; it does not describe an axisymmetric section`);
  const openings = model.plate.openings;
  const pick = (shape: 'circle' | 'ellipse') => {
    const named = input.opening ? openings.find((o) => o.id === input.opening) : undefined;
    if (named && named.shape.kind === shape) return named.shape;
    const all = openings.filter((o) => o.shape.kind === shape);
    return all.length === 1 ? all[0].shape : undefined;
  };
  if (kind === 'kirsch') {
    const hole = pick('circle') as Extract<Model['plate']['outline'], { kind: 'circle' }> | undefined;
    const center = input.center ?? hole?.center;
    const radius = input.radius ?? hole?.radius;
    if (!center) throw usage('--compare kirsch needs --centre x,y (no single circular opening to take it from)');
    return { kind, center, radius: need(radius, '--radius', kind), remote: need(input.remote, '--remote <S>', kind), angleDeg: input.angleDeg ?? 0 };
  }
  if (kind === 'lame') {
    const hole = pick('circle') as Extract<Model['plate']['outline'], { kind: 'circle' }> | undefined;
    const outline = model.plate.outline.kind === 'circle' ? model.plate.outline : undefined;
    const center = input.center ?? hole?.center ?? outline?.center;
    if (!center) throw usage('--compare lame needs --centre x,y');
    // pressures default to the model's own pressure loads on the bore and on the outline
    const holeId = input.opening ?? openings.find((o) => o.shape === hole)?.id;
    const pressureOn = (test: (w: Selector) => boolean) =>
      model.loads.reduce((s, l) => s + (l.kind === 'pressure' && test(l.where) ? l.pressure : 0), 0);
    return {
      kind, center,
      inner: need(input.radius ?? hole?.radius, '--radius (inner radius)', kind),
      outer: need(input.outerRadius ?? outline?.radius, '--outer-radius', kind),
      innerPressure: input.innerPressure ?? pressureOn((w) => w.kind === 'opening' && w.id === holeId),
      outerPressure: input.outerPressure ?? pressureOn((w) => w.kind === 'outline'),
      E: model.material.E, nu: model.material.nu, state: model.state,
    };
  }
  if (kind === 'inglis') {
    const e = pick('ellipse') as Extract<Model['plate']['outline'], { kind: 'ellipse' }> | undefined;
    if (!e) throw usage('--compare inglis needs an elliptical opening (give it with --cut opening:<id>)');
    return { kind, center: input.center ?? e.center, a: e.a, b: e.b, axisDeg: e.angleDeg, remote: need(input.remote, '--remote <S>', kind), angleDeg: input.angleDeg ?? 0 };
  }
  throw usage(`--compare must be kirsch, lame or inglis, got "${kind}"`);
}
