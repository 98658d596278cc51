/**
 * Validated model file → Model: evaluate every expression, apply the value rules,
 * fill defaults, check cross references (opening ids). Geometry checks (crossings,
 * fillets that do not fit) are the geometry stage's.
 */
import { ModelError } from '../errors.js';
import { ExpressionError, evaluateExpression } from './expr.js';
import { joinPath, parsePath } from './keypath.js';
import { nearest } from './issues.js';
import type { ModelFile, RawPoint, RawVertex } from './schema.js';
import { didYouMean, formatNumber, quote } from './text.js';
import type {
  PlaneState,
  CriticalDistance, DisplacementValue, FieldValue, Load, LocalSize, Model, ModelWarning, Opening, Point, PolygonVertex, PrescribedMotion, Selector, Shape,
  SourcePosition, StudySettings, Support,
} from './types.js';
import { ImportError, MM_PER_UNIT, displacementRows, pointsShape, svgShape, type ReadFile } from './imports.js';
import { parseExpression, namesIn, CONSTANTS } from './expr.js';
import { DEFAULT_UNITS, PLAUSIBLE_E_MPA, PLAUSIBLE_THICKNESS_MM, lengthToMm, stressToMPa, stressUnit } from './units.js';
import { bodyLoad, physicalConstants, type PhysicalConstants } from './body-loads.js';
import { levelsRule, ratioRule } from './study-rules.js';
import { buildCases, buildCombinations } from './cases.js';
import { buildReported } from './reported-values.js';

/** Largest number accepted anywhere: beyond it the value is a slip, not a plate. */
export const MAX_MAGNITUDE = 1e15;

/**
 * Estimated triangle count above which a mesh request is refused before any work: far
 * beyond what the solver's default DOF limit admits, so only absurd sizes trip it.
 */
export const MAX_ESTIMATED_TRIANGLES = 2e7;

/** Area of an equilateral triangle of edge h is √3/4·h² (used for element estimates). */
const EQUILATERAL = Math.sqrt(3) / 4;

export const DEFAULT_STUDY: Readonly<Omit<StudySettings, 'readouts'>> = {
  measure: 'von-mises', levels: 6, ratio: 2, sites: 'auto',
};

interface Rule {
  test: (v: number) => boolean;
  text: string;
}
const POSITIVE: Rule = { test: (v) => v > 0, text: 'must be > 0' };
const NON_NEGATIVE: Rule = { test: (v) => v >= 0, text: 'must be >= 0 (0 = sharp)' };
const ANY: Rule = { test: () => true, text: '' };
/** a rule of study-rules.ts (shared with the CLI and the study) as a loader rule */
const studyRule = (rule: (v: number) => string | undefined): Rule => ({ test: (v) => rule(v) === undefined, text: rule(NaN) ?? '' });

export class Builder {
  readonly warnings: ModelWarning[] = [];
  /** reads files the model refers to (issue 9); undefined when parsing text alone */
  readFile: ReadFile | undefined;
  /** Bézier chord tolerance for SVG outlines (mesh.size / 100), when mesh.size is given */
  chordTolerance: number | undefined;
  constructor(
    private readonly params: Readonly<Record<string, number>>,
    private readonly valueAt: Record<string, SourcePosition>,
    private readonly lengthUnit: string,
  ) {}

  /** Run a file import; its errors (which name the file) are reported at `keyPath`. */
  imported<T>(keyPath: string, f: () => T): T {
    try {
      return f();
    } catch (e) {
      if (e instanceof ImportError) this.fail(e.message, keyPath);
      throw e;
    }
  }

  /** A displacement component: number, expression of x, y and params (checked now, evaluated per node later). */
  displacementValue(raw: number | string, keyPath: string): DisplacementValue {
    return this.fieldValue(raw, keyPath, 'displacement');
  }

  /** A value over the plate (displacement, temperature): number, or expression of x, y and params evaluated per point later. */
  fieldValue(raw: number | string, keyPath: string, quantity: string): FieldValue {
    if (typeof raw === 'number' || !/[A-Za-z_]/.test(raw)) return this.num(raw, keyPath, quantity);
    let names: string[];
    try {
      names = namesIn(parseExpression(raw));
    } catch (e) {
      if (e instanceof ExpressionError) this.fail(`expression ${quote(raw)}: ${e.message}`, keyPath);
      throw e;
    }
    const usesXY = names.includes('x') || names.includes('y');
    if (!usesXY) return this.num(raw, keyPath, quantity);
    const known = new Set([...Object.keys(this.params), 'x', 'y', ...Object.keys(CONSTANTS)]);
    const unknown = names.find((n) => !known.has(n));
    if (unknown !== undefined) {
      this.fail(`expression ${quote(raw)}: unknown name ${quote(unknown)}${didYouMean(unknown, [...known])}; a ${quantity} may use x, y and the params`, keyPath);
    }
    return { expression: raw, params: { ...this.params } };
  }

  fail(message: string, keyPath: string): never {
    const pos = nearest(this.valueAt, parsePath(keyPath));
    throw new ModelError(message, keyPath, pos.line, pos.col);
  }

  /** A number or an expression, evaluated, finite, within MAX_MAGNITUDE, obeying `rule`. */
  num(raw: number | string, keyPath: string, quantity = '', rule: Rule = ANY, unit = ''): number {
    let value: number;
    if (typeof raw === 'number') {
      if (!Number.isFinite(raw)) this.fail(`expected a finite number, got ${raw}`, keyPath);
      value = raw;
    } else {
      try {
        value = evaluateExpression(raw, this.params);
      } catch (e) {
        if (e instanceof ExpressionError) this.fail(`expression ${quote(raw)}: ${e.message}`, keyPath);
        throw e;
      }
    }
    const from = typeof raw === 'string' ? ` (from ${quote(raw)})` : '';
    const got = `${formatNumber(value)}${unit ? ` ${unit}` : ''}${from}`;
    if (Math.abs(value) > MAX_MAGNITUDE) {
      this.fail(`${quantity || 'value'} ${got} is absurdly large (limit ±${formatNumber(MAX_MAGNITUDE)})`, keyPath);
    }
    if (!rule.test(value)) this.fail(`${quantity} ${rule.text}, got ${got}`, keyPath);
    return value;
  }

  length(raw: number | string, keyPath: string, quantity: string, rule: Rule = POSITIVE): number {
    return this.num(raw, keyPath, quantity, rule, this.lengthUnit);
  }

  point(raw: RawPoint, keyPath: string): Point {
    return [this.num(raw[0], joinPath(keyPath, 0), 'x'), this.num(raw[1], joinPath(keyPath, 1), 'y')];
  }

  vertex(raw: RawVertex, keyPath: string): PolygonVertex {
    if (Array.isArray(raw)) return { at: this.point(raw, keyPath), round: 0 };
    const round = raw.round === undefined ? 0 : this.length(raw.round, joinPath(keyPath, 'round'), 'corner radius round', NON_NEGATIVE);
    return { at: this.point(raw.at, joinPath(keyPath, 'at')), round };
  }

  shape(raw: NonNullable<ModelFile['plate']['openings']>[number] | Exclude<ModelFile['plate']['outline'], unknown[]>, keyPath: string): Shape {
    if (raw.circle) {
      const p = joinPath(keyPath, 'circle');
      return {
        kind: 'circle',
        center: this.point(raw.circle.center, joinPath(p, 'center')),
        radius: this.length(raw.circle.radius, joinPath(p, 'radius'), 'circle radius'),
      };
    }
    if (raw.ellipse) {
      const p = joinPath(keyPath, 'ellipse');
      const e = raw.ellipse;
      return {
        kind: 'ellipse',
        center: this.point(e.center, joinPath(p, 'center')),
        a: this.length(e.a, joinPath(p, 'a'), 'ellipse semi-axis a'),
        b: this.length(e.b, joinPath(p, 'b'), 'ellipse semi-axis b'),
        angleDeg: e.angle === undefined ? 0 : this.num(e.angle, joinPath(p, 'angle'), 'ellipse angle'),
      };
    }
    if (raw.rect) {
      const p = joinPath(keyPath, 'rect');
      const r = raw.rect;
      return {
        kind: 'rect',
        center: this.point(r.center, joinPath(p, 'center')),
        width: this.length(r.width, joinPath(p, 'width'), 'rectangle width'),
        height: this.length(r.height, joinPath(p, 'height'), 'rectangle height'),
        round: r.round === undefined ? 0 : this.length(r.round, joinPath(p, 'round'), 'corner radius round', NON_NEGATIVE),
      };
    }
    if (raw.points !== undefined) {
      const file = raw.points;
      return this.imported(joinPath(keyPath, 'points'), () => pointsShape(this.readFile, file));
    }
    if (raw.svg !== undefined) {
      const file = raw.svg;
      let scale = raw.scale === undefined ? 1 : this.num(raw.scale, joinPath(keyPath, 'scale'), 'drawing scale', POSITIVE);
      if (raw.units !== undefined) {
        const model = MM_PER_UNIT[this.lengthUnit];
        if (model === undefined) {
          this.fail(`drawing units ${raw.units} cannot be converted to the model's length unit ${quote(this.lengthUnit)}; `
            + `give units.length as one of ${Object.keys(MM_PER_UNIT).join(', ')}, or drop units and use scale`, joinPath(keyPath, 'units'));
        }
        scale *= MM_PER_UNIT[raw.units] / model;
      }
      const req = { file, path: raw.path ?? '', scale, chordTolerance: this.chordTolerance };
      return this.imported(joinPath(keyPath, 'svg'), () => svgShape(this.readFile, req));
    }
    const p = joinPath(keyPath, 'polygon');
    return { kind: 'polygon', vertices: (raw.polygon ?? []).map((v, i) => this.vertex(v, joinPath(p, i))) };
  }

  selector(raw: NonNullable<NonNullable<ModelFile['loads']>[number]['where']>, keyPath: string, openingIds: readonly string[]): Selector {
    if (raw.x !== undefined) return { kind: 'x', value: this.num(raw.x, joinPath(keyPath, 'x'), 'x') };
    if (raw.y !== undefined) return { kind: 'y', value: this.num(raw.y, joinPath(keyPath, 'y'), 'y') };
    if (raw.segment !== undefined) {
      const p = joinPath(keyPath, 'segment');
      const from = this.point(raw.segment[0], joinPath(p, 0));
      const to = this.point(raw.segment[1], joinPath(p, 1));
      if (from[0] === to[0] && from[1] === to[1]) this.fail(`segment has zero length: both ends at [${from.join(', ')}]`, p);
      return { kind: 'segment', from, to };
    }
    if (raw.opening !== undefined) {
      const id = raw.opening;
      if (!openingIds.includes(id)) {
        const known = openingIds.length ? `the openings are ${openingIds.join(', ')}` : 'the plate has no openings';
        this.fail(`no opening has id ${quote(id)}${didYouMean(id, openingIds)}; ${known}`, joinPath(keyPath, 'opening'));
      }
      return { kind: 'opening', id };
    }
    if (raw.outline !== undefined) return { kind: 'outline' };
    if (raw.piece !== undefined) return { kind: 'piece', at: this.point(raw.piece, joinPath(keyPath, 'piece')) };
    return { kind: 'point', at: this.point(raw.point!, joinPath(keyPath, 'point')) };
  }
}

/**
 * `study.readouts.critical`: L given, or L = (1/π)(ΔK_th/Δσ₀)² (Taylor 2007). An L longer than the plate is
 * refused: it almost always means ΔK_th was given in other units (stress·√length in the model's own units).
 */
function criticalDistance(
  b: Builder, raw: { length?: number | string; deltaKth?: number | string; deltaSigma0?: number | string }, plateSize: number, stress: string,
): CriticalDistance {
  const p = 'study.readouts.critical';
  let out: CriticalDistance;
  if (raw.length !== undefined) out = { length: b.length(raw.length, joinPath(p, 'length'), 'critical distance') };
  else {
    const deltaKth = b.num(raw.deltaKth!, joinPath(p, 'deltaKth'), 'threshold stress-intensity range deltaKth', POSITIVE);
    const deltaSigma0 = b.num(raw.deltaSigma0!, joinPath(p, 'deltaSigma0'), 'fatigue limit range deltaSigma0', POSITIVE, stress);
    out = { length: (deltaKth / deltaSigma0) ** 2 / Math.PI, deltaKth, deltaSigma0 };
  }
  if (Number.isFinite(plateSize) && plateSize > 0 && out.length > plateSize) {
    const key = raw.length !== undefined ? joinPath(p, 'length') : joinPath(p, 'deltaKth');
    b.fail(`critical distance L = ${formatNumber(out.length)} is longer than the plate (${formatNumber(plateSize)}); `
      + (raw.length !== undefined ? 'check the units' : `check that deltaKth is in ${stress}·√length with lengths in the model's units`), key);
  }
  return out;
}

export function buildModel(
  raw: ModelFile,
  file: string,
  params: Readonly<Record<string, number>>,
  valueAt: Record<string, SourcePosition>,
  readFile?: ReadFile,
): Model {
  const units = { length: raw.units?.length ?? DEFAULT_UNITS.length, force: raw.units?.force ?? DEFAULT_UNITS.force };
  const stress = stressUnit(units);
  const b = new Builder(params, valueAt, units.length);
  b.readFile = readFile;
  if (raw.mesh?.size !== undefined) b.chordTolerance = b.length(raw.mesh.size, 'mesh.size', 'mesh size') / 100;

  const E = b.num(raw.material.E, 'material.E', "Young's modulus E", POSITIVE, stress);
  const nu = b.num(raw.material.nu, 'material.nu', "Poisson's ratio nu", {
    test: (v) => v > -1 && v < 0.5, text: 'must lie strictly between -1 and 0.5',
  });
  const yieldStress = raw.material.yield === undefined ? undefined : b.num(raw.material.yield, 'material.yield', 'yield stress', POSITIVE, stress);
  // yield strains of solids stay well below 5 % (steel 0.2 %, polymers a few %): above it the units are likely mixed
  if (yieldStress !== undefined && yieldStress > 0.05 * E) {
    b.warnings.push({
      keyPath: 'material.yield',
      message: `yield = ${formatNumber(yieldStress)} ${stress} is more than 5 % of E = ${formatNumber(E)} ${stress}; check that both are in ${stress}`,
    });
  }
  const toMPa = stressToMPa(units);
  if (toMPa !== undefined) {
    const eMPa = E * toMPa;
    if (eMPa < PLAUSIBLE_E_MPA[0] || eMPa > PLAUSIBLE_E_MPA[1]) {
      b.warnings.push({
        keyPath: 'material.E',
        message: `E = ${formatNumber(E)} ${stress} is ${formatNumber(eMPa)} MPa, outside the usual range of solids; `
          + `check that E is in ${stress} (lengths in ${units.length}, forces in ${units.force}); steel is about ${formatNumber(2.1e5 / toMPa)} ${stress}`,
      });
    }
  }
  const physical: PhysicalConstants = physicalConstants(b, raw.material, units);
  const state = raw.state ?? 'plane-stress';
  const thickness = axisymmetricThickness(b, raw.thickness, state) ?? b.length(raw.thickness!, 'thickness', 'plate thickness');
  const mmPer = lengthToMm(units.length);
  if (mmPer !== undefined && state !== 'axisymmetric') {
    const tMm = thickness * mmPer;
    const [lo, hi] = PLAUSIBLE_THICKNESS_MM;
    if (tMm < lo || tMm > hi) {
      b.warnings.push({
        keyPath: 'thickness',
        message: `thickness ${formatNumber(thickness)} ${units.length} is ${formatNumber(tMm)} mm, outside the usual range of plates (${lo} mm to ${hi / 1000} m); `
          + `check that it is in ${units.length}, the model's length unit`,
      });
    }
  }

  const outline: Shape = Array.isArray(raw.plate.outline)
    ? { kind: 'polygon', vertices: raw.plate.outline.map((v, i) => b.vertex(v, joinPath('plate.outline', i))) }
    : b.shape(raw.plate.outline, 'plate.outline');
  if (state === 'axisymmetric') checkMeridianSection(b, outline, units.length);

  const openings: Opening[] = [];
  const firstUse = new Map<string, string>();
  (raw.plate.openings ?? []).forEach((o, i) => {
    const keyPath = joinPath('plate.openings', i);
    const earlier = firstUse.get(o.id);
    if (earlier !== undefined) b.fail(`opening id ${quote(o.id)} is already used by ${earlier}; ids must be unique`, joinPath(keyPath, 'id'));
    firstUse.set(o.id, keyPath);
    openings.push({ id: o.id, shape: b.shape(o, keyPath), keyPath });
  });
  const ids = openings.map((o) => o.id);

  const supports: Support[] = raw.supports.map((s, i) => {
    const keyPath = joinPath('supports', i);
    const where = b.selector(s.where, joinPath(keyPath, 'where'), ids);
    const id = s.id === undefined ? {} : { id: s.id };
    if (s.fix) return { ...id, where, fix: { x: s.fix.includes('x'), y: s.fix.includes('y') }, keyPath };
    const motion = prescribedMotion(b, s.displace!, joinPath(keyPath, 'displace'));
    const fix = motion.kind === 'table' ? { x: true, y: true } : { x: motion.x !== undefined, y: motion.y !== undefined };
    if (!fix.x && !fix.y) b.fail('both displacement components are free (null); prescribe at least one, or drop the entry', joinPath(keyPath, 'displace'));
    if (where.kind === 'point' && motion.kind === 'table') b.fail('a displacement table is interpolated along an edge; use a line or loop selector', joinPath(keyPath, 'where'));
    return { ...id, where, fix, keyPath, displace: motion };
  });
  supports.forEach((s, i) => {
    const j = s.id === undefined ? -1 : supports.findIndex((t) => t.id === s.id);
    if (j >= 0 && j < i) b.fail(`support id ${quote(s.id!)} is already used by ${supports[j].keyPath}; ids must be unique`, joinPath(s.keyPath, 'id'));
  });

  // the model's loads, then every case's (docs/model-format.md, "Load cases"), built alike
  const rawLoads: { l: NonNullable<ModelFile['loads']>[number]; keyPath: string }[] = [];
  const addRawLoads = (list: readonly NonNullable<ModelFile['loads']>[number][], prefix: string): void => {
    list.forEach((l, i) => rawLoads.push({ l, keyPath: joinPath(prefix, i) }));
  };
  if (raw.cases !== undefined && (raw.loads?.length ?? 0) > 0) {
    b.fail('with cases, every load belongs to a case: move these loads into a case (top-level loads would count once per case in every combination)', 'loads');
  }
  if (raw.cases === undefined && raw.combinations !== undefined) b.fail('combinations combine load cases; add cases: first', 'combinations');
  if (raw.cases === undefined && raw.loads === undefined) b.fail('required key \'loads\' is missing (expected a list of loads, or cases:)', 'loads');
  if (raw.cases === undefined && raw.loads!.length === 0 && !supports.some((s) => s.displace !== undefined)) {
    b.fail('expected at least one load (or a support that prescribes a displacement with displace:)', 'loads');
  }
  addRawLoads(raw.loads ?? [], 'loads');
  const cases = raw.cases === undefined ? undefined : buildCases(b, raw.cases, supports, params, addRawLoads, (d, keyPath) => prescribedMotion(b, d, keyPath));
  const loads: Load[] = [];
  rawLoads.forEach(({ l, keyPath }) => {
    const body = bodyLoad(b, l, keyPath, physical, units);
    if (body) {
      loads.push(body);
      return;
    }
    // the schema holds where on every load that acts on the boundary
    const where = b.selector(l.where!, joinPath(keyPath, 'where'), ids);
    if (l.traction !== undefined) loads.push({ kind: 'traction', where, traction: b.point(l.traction, joinPath(keyPath, 'traction')), keyPath });
    else if (l.pressure !== undefined) loads.push({ kind: 'pressure', where, pressure: b.num(l.pressure, joinPath(keyPath, 'pressure'), 'pressure'), keyPath });
    else if (l.force !== undefined) loads.push({ kind: 'force', where, force: b.point(l.force, joinPath(keyPath, 'force')), keyPath });
    else if (l.stress !== undefined) {
      const p = joinPath(keyPath, 'stress');
      const g = l.gradient;
      const gp = joinPath(keyPath, 'gradient');
      const grad = (k: 'sxx' | 'syy' | 'sxy'): Point => (g?.[k] === undefined ? [0, 0] : b.point(g[k]!, joinPath(gp, k)));
      loads.push({
        kind: 'stress',
        where,
        stress: [b.num(l.stress[0], joinPath(p, 0), 'sxx'), b.num(l.stress[1], joinPath(p, 1), 'syy'), b.num(l.stress[2], joinPath(p, 2), 'sxy')],
        gradient: { sxx: grad('sxx'), syy: grad('syy'), sxy: grad('sxy') },
        about: l.about === undefined ? [0, 0] : b.point(l.about, joinPath(keyPath, 'about')),
        keyPath,
      });
    } else {
      const force = b.point(l.pinForce!, joinPath(keyPath, 'pinForce'));
      if (force[0] === 0 && force[1] === 0) b.fail('a pin force of [0, 0] has no direction; give the pin force [Fx, Fy]', joinPath(keyPath, 'pinForce'));
      loads.push({ kind: 'pinForce', where: where as Selector & { kind: 'opening' }, force, keyPath });
    }
  });

  const box = boundingBox(outline);
  const plateArea = Math.max(shapeArea(outline), 0);
  // default: a tenth of the plate's smaller extent (degenerate outlines are left for the
  // geometry stage to report, so never fail here)
  const extent = Math.min(box.width, box.height) > 0 ? Math.min(box.width, box.height) : Math.max(box.width, box.height);
  const defaultSize = Number.isFinite(extent) && extent > 0 ? extent / 10 : 1;
  const size = raw.mesh?.size === undefined ? defaultSize : b.length(raw.mesh.size, 'mesh.size', 'mesh size');
  checkTriangleCount(b, plateArea / (EQUILATERAL * size * size), size, 'mesh.size', units.length);
  const order = raw.mesh?.order === undefined ? 2 : b.num(raw.mesh.order, 'mesh.order', 'element order', {
    test: (v) => v === 1 || v === 2, text: 'must be 1 (3-node CST) or 2 (6-node LST)',
  }) as 1 | 2;
  const local: LocalSize[] = (raw.mesh?.local ?? []).map((l, i) => {
    const keyPath = joinPath('mesh.local', i);
    const entry = {
      near: b.point(l.near, joinPath(keyPath, 'near')),
      size: b.length(l.size, joinPath(keyPath, 'size'), 'local mesh size'),
      radius: b.length(l.radius, joinPath(keyPath, 'radius'), 'local radius'),
    };
    const disk = Math.min(Math.PI * entry.radius ** 2, plateArea);
    checkTriangleCount(b, disk / (EQUILATERAL * entry.size ** 2), entry.size, joinPath(keyPath, 'size'), units.length);
    return entry;
  });

  const s = raw.study;
  const study: StudySettings = {
    measure: s?.measure ?? DEFAULT_STUDY.measure,
    levels: s?.levels === undefined ? DEFAULT_STUDY.levels : b.num(s.levels, 'study.levels', 'refinement levels', studyRule(levelsRule)),
    ratio: s?.ratio === undefined ? DEFAULT_STUDY.ratio : b.num(s.ratio, 'study.ratio', 'refinement ratio', studyRule(ratioRule)),
    sites: s?.sites === undefined || s.sites === 'auto'
      ? 'auto'
      : s.sites.map((p, i) => b.point(p, joinPath('study.sites', i))),
    readouts: {
      distance: s?.readouts?.distance === undefined
        ? undefined
        : b.length(s.readouts.distance, 'study.readouts.distance', 'readout distance'),
      ...(s?.readouts?.critical ? { critical: criticalDistance(b, s.readouts.critical, Math.hypot(box.width, box.height), stress) } : {}),
    },
  };
  // a readout point farther from its site than the plate is across lies outside the plate for
  // every site; it would be dropped without a word
  const across = Math.hypot(box.width, box.height);
  if (study.readouts.distance !== undefined && Number.isFinite(across) && across > 0 && study.readouts.distance >= across) {
    b.fail(
      `readout distance ${formatNumber(study.readouts.distance)} ${units.length} is larger than the plate `
        + `(${formatNumber(box.width)} × ${formatNumber(box.height)} ${units.length}, ${formatNumber(across)} ${units.length} across); `
        + 'a readout point that far from a site lies outside it for every site',
      'study.readouts.distance',
    );
  }

  const model: Model = {
    title: raw.title?.trim() || defaultTitle(file),
    file,
    units,
    params: { ...params },
    material: {
      E, nu, ...(yieldStress !== undefined ? { yield: yieldStress } : {}),
      ...(physical.density !== undefined ? { density: physical.density } : {}),
      ...(physical.expansion !== undefined ? { expansion: physical.expansion } : {}),
    },
    thickness,
    state,
    plate: { outline, openings },
    supports,
    loads,
    ...(cases ? {
      cases: cases.map((c) => ({ name: c.name, keyPath: c.keyPath, supports: c.supports, loads: loads.filter((l) => isUnder(l.keyPath, c.loadsPath)) })),
      combinations: buildCombinations(b, raw.combinations ?? {}, cases.map((c) => c.name), params),
    } : {}),
    mesh: { size, order, local },
    study,
    sourceMap: valueAt,
  };
  // a reported value's case names a case or combination of the model (IMPLICIT_CASE without cases)
  const reported = buildReported(b, raw.reported, study.measure, model.cases ? [...model.cases.map((c) => c.name), ...(model.combinations ?? []).map((c) => c.name)] : []);
  if (reported) model.reported = reported;
  if (b.warnings.length > 0) model.warnings = b.warnings;
  return model;
}

/** Is `keyPath` an item of the list at `list` (`cases.lift[2]` under `cases.lift`)? */
function isUnder(keyPath: string, list: string): boolean {
  return keyPath.startsWith(`${list}[`) && /^\[\d+\]$/.test(keyPath.slice(list.length));
}

/**
 * Thickness in an axisymmetric section (issue 18): not used (the section is revolved about the
 * axis), so it may be left out (then 1, a placeholder nothing reads); when given it is checked
 * like any length and a warning says it is ignored. Undefined for the plane states.
 */
function axisymmetricThickness(b: Builder, raw: ModelFile['thickness'], state: PlaneState): number | undefined {
  if (raw === undefined) {
    if (state === 'axisymmetric') return 1;
    b.fail('required key "thickness" is missing (expected the plate thickness, a positive length)', 'thickness');
  }
  if (state !== 'axisymmetric') return undefined;
  const t = b.length(raw, 'thickness', 'plate thickness');
  b.warnings.push({ keyPath: 'thickness', message: 'thickness is not used in an axisymmetric section (the section is revolved about the axis r = x = 0); leave it out' });
  return t;
}

/**
 * An axisymmetric section is the meridian section in (r, z) = (x, y): its material lies at r ≥ 0.
 * A vertex (or a shape) reaching r < 0 is an error naming it; a tolerance of 1e-9 of the
 * section's size lets a vertex written as a rounded 0 sit on the axis.
 */
function checkMeridianSection(b: Builder, outline: Shape, unit: string): void {
  const box = boundingBox(outline);
  const tol = 1e-9 * Math.max(box.width, box.height, Math.abs(box.minX));
  if (!(box.minX < -tol)) return;
  const where = outline.kind === 'polygon'
    ? joinPath(joinPath('plate.outline', outline.vertices.findIndex((v) => v.at[0] < -tol)), 0)
    : 'plate.outline';
  b.fail(
    `an axisymmetric section lies at r = x ≥ 0 (the axis is x = 0); this reaches x = ${formatNumber(box.minX)} ${unit}`,
    where,
  );
}

function checkTriangleCount(b: Builder, estimate: number, size: number, keyPath: string, unit: string): void {
  if (estimate > MAX_ESTIMATED_TRIANGLES) {
    b.fail(
      `mesh size ${formatNumber(size)} ${unit} would need about ${formatNumber(estimate)} triangles `
        + `(limit ${formatNumber(MAX_ESTIMATED_TRIANGLES)}); use a larger size and refine locally with mesh.local`,
      keyPath,
    );
  }
}

function defaultTitle(file: string): string {
  const base = file.split(/[\\/]/).pop() ?? '';
  return base.replace(/\.(ya?ml|json)$/i, '') || 'untitled model';
}

/** Axis-aligned bounds of a shape (fillets ignored: they only cut corners off). */
export function boundingBox(shape: Shape): { minX: number; minY: number; width: number; height: number } {
  switch (shape.kind) {
    case 'circle':
      return { minX: shape.center[0] - shape.radius, minY: shape.center[1] - shape.radius, width: 2 * shape.radius, height: 2 * shape.radius };
    case 'ellipse': {
      const t = (shape.angleDeg * Math.PI) / 180;
      const hx = Math.hypot(shape.a * Math.cos(t), shape.b * Math.sin(t));
      const hy = Math.hypot(shape.a * Math.sin(t), shape.b * Math.cos(t));
      return { minX: shape.center[0] - hx, minY: shape.center[1] - hy, width: 2 * hx, height: 2 * hy };
    }
    case 'rect':
      return { minX: shape.center[0] - shape.width / 2, minY: shape.center[1] - shape.height / 2, width: shape.width, height: shape.height };
    case 'polygon': {
      // a loop, not Math.min(...xs): an imported outline can have more points than the call
      // stack takes arguments
      let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
      for (const v of shape.vertices) {
        if (v.at[0] < minX) minX = v.at[0];
        if (v.at[0] > maxX) maxX = v.at[0];
        if (v.at[1] < minY) minY = v.at[1];
        if (v.at[1] > maxY) maxY = v.at[1];
      }
      return { minX, minY, width: maxX - minX, height: maxY - minY };
    }
  }
}

/** Area enclosed by a shape, sharp corners (fillets ignored), polygon by the shoelace formula. */
export function shapeArea(shape: Shape): number {
  switch (shape.kind) {
    case 'circle': return Math.PI * shape.radius ** 2;
    case 'ellipse': return Math.PI * shape.a * shape.b;
    case 'rect': return shape.width * shape.height;
    case 'polygon': {
      // about the first vertex: the products of coordinates far from 0 would cancel
      let twice = 0;
      const v = shape.vertices;
      if (v.length === 0) return 0;
      const [ox, oy] = v[0].at;
      for (let i = 1; i + 1 < v.length; i++) {
        const x0 = v[i].at[0] - ox, y0 = v[i].at[1] - oy;
        const x1 = v[i + 1].at[0] - ox, y1 = v[i + 1].at[1] - oy;
        twice += x0 * y1 - x1 * y0;
      }
      return Math.abs(twice) / 2;
    }
  }
}

function prescribedMotion(b: Builder, raw: NonNullable<ModelFile['supports'][number]['displace']>, keyPath: string): PrescribedMotion {
  if (Array.isArray(raw)) {
    const [ux, uy] = raw;
    return {
      kind: 'values',
      ...(ux === null ? {} : { x: b.displacementValue(ux, joinPath(keyPath, 0)) }),
      ...(uy === null ? {} : { y: b.displacementValue(uy, joinPath(keyPath, 1)) }),
    };
  }
  if ('table' in raw) {
    const file = raw.table;
    const rows = b.imported(joinPath(keyPath, 'table'), () => displacementRows(b.readFile, file));
    if (raw.tolerance === undefined) return { kind: 'table', file, rows };
    return { kind: 'table', file, rows, tolerance: b.length(raw.tolerance, joinPath(keyPath, 'tolerance'), 'table tolerance') };
  }
  const m = raw as { x?: number | string | null; y?: number | string | null };
  return {
    kind: 'values',
    ...(m.x === undefined || m.x === null ? {} : { x: b.displacementValue(m.x, joinPath(keyPath, 'x')) }),
    ...(m.y === undefined || m.y === null ? {} : { y: b.displacementValue(m.y, joinPath(keyPath, 'y')) }),
  };
}
