/**
 * The shape of a model file before evaluation (docs/model-format.md, version 1), as zod schemas.
 * Numbers may still be expressions here; value rules (thickness > 0, …) come after the
 * expressions are evaluated, in build.ts. Every schema carries its own message so that the
 * translation in issues.ts can print them as they are.
 */
import { z } from 'zod';
import { describe, didYouMean, listOr, quote } from './text.js';

/** `expected <what>, got <what the file holds>` for any issue raised by one schema. */
const expected = (what: string) => (issue: { input?: unknown }) => `expected ${what}, got ${describe(issue.input)}`;

/**
 * Keys of earlier versions of the format and their present names: an old key gets a hint to the new
 * one instead of a plain "unknown key" (docs/model-format.md, "Renamed keys").
 */
export const RENAMED_KEYS: Readonly<Record<string, string>> = { spots: 'sites', bearing: 'pinForce' };

/** A strict mapping whose unknown keys are reported with a hint from its own keys. */
function mapping<T extends z.ZodRawShape>(shape: T, what: string) {
  const keys = Object.keys(shape);
  return z.strictObject(shape, {
    error: (issue) => {
      if (issue.code === 'unrecognized_keys') {
        const key = (issue as { keys: string[] }).keys[0];
        const renamed = RENAMED_KEYS[key];
        if (renamed !== undefined && keys.includes(renamed)) return `key ${quote(key)} is now called ${quote(renamed)} (same meaning); rename it`;
        const hint = didYouMean(key, keys);
        return hint ? `unknown key ${quote(key)}${hint}` : `unknown key ${quote(key)}; allowed here: ${keys.join(', ')}`;
      }
      return `expected ${what}, got ${describe(issue.input)}`;
    },
  });
}

/** One of a fixed set of words, with a hint for a near miss. */
function word<const T extends readonly [string, ...string[]]>(values: T) {
  return z.enum(values, {
    error: (issue) => {
      const got = issue.input;
      const hint = typeof got === 'string' ? didYouMean(got, values) : '';
      return `expected one of ${values.join(', ')}, got ${describe(got)}${hint}`;
    },
  });
}

/** Exactly one of `keys` present. Issues go on the second key when there are two. */
function exactlyOne(keys: readonly string[]) {
  return (value: Record<string, unknown>, ctx: z.RefinementCtx): void => {
    const present = keys.filter((k) => value[k] !== undefined);
    if (present.length === 1) return;
    ctx.addIssue({
      code: 'custom',
      message: present.length === 0
        ? `expected one of ${keys.join(', ')}`
        : `expected exactly one of ${keys.join(', ')}, got ${listOr(present).replace(/, | or /g, ' and ')}`,
      path: present.length > 1 ? [present[1]] : [],
    });
  };
}

/** A number, or text holding an expression over params (a bare name is text in YAML). */
export const NumberLike = z.custom<number | string>(
  (v) => typeof v === 'number' || typeof v === 'string',
  { error: expected('a number or an expression') },
);

export const PointLike = z.tuple([NumberLike, NumberLike], { error: expected('a point [x, y]') });

const Name = z.string({ error: expected('a name') }).regex(/^[A-Za-z_][A-Za-z0-9_-]*$/, {
  error: (issue) => `expected a name (letters, digits, _ and -, starting with a letter), got ${describe(issue.input)}`,
});

const Label = z.string({ error: expected('a unit label such as mm or N') }).regex(/^[^\s\u0000-\u001f]{1,12}$/, {
  error: (issue) => `expected a short unit label without spaces, got ${describe(issue.input)}`,
});

const VertexObject = mapping({ at: PointLike, round: NumberLike.optional() }, 'a vertex { at: [x, y], round: r }');
export const VertexLike = z.union([PointLike, VertexObject], {
  error: expected('a vertex [x, y] or { at: [x, y], round: r }'),
});

const PolygonLike = z
  .array(VertexLike, { error: expected('a list of vertices [x, y]') })
  .min(3, { error: (issue) => `a polygon needs at least 3 vertices, got ${describe(issue.input)}` });

const CircleLike = mapping({ center: PointLike, radius: NumberLike }, 'a circle { center: [x, y], radius: r }');
const EllipseLike = mapping(
  { center: PointLike, a: NumberLike, b: NumberLike, angle: NumberLike.optional() },
  'an ellipse { center: [x, y], a, b, angle }',
);
const RectLike = mapping(
  { center: PointLike, width: NumberLike, height: NumberLike, round: NumberLike.optional() },
  'a rectangle { center: [x, y], width, height, round }',
);

export const SHAPE_KINDS = ['circle', 'ellipse', 'rect', 'polygon', 'points', 'svg'] as const;

const FileName = z.string({ error: expected('a file name (relative to the model file)') }).min(1, {
  error: () => 'expected a file name, got an empty text',
});

/** Imported outlines (issue 9): a CSV of points, or one path of an SVG drawing. */
const IMPORT_KEYS = {
  points: FileName.optional(),
  svg: FileName.optional(),
  path: z.string({ error: expected('the id of a <path> element') }).optional(),
  scale: NumberLike.optional(),
  units: word(['mm', 'cm', 'm', 'in', 'pt', 'px']).optional(),
};

/** `path`, `scale` and `units` belong to `svg`. */
function svgKeys(value: { svg?: unknown; path?: unknown; scale?: unknown; units?: unknown }, ctx: z.RefinementCtx): void {
  if (value.svg !== undefined) {
    if (value.path === undefined) ctx.addIssue({ code: 'custom', message: 'an svg outline needs path: the id of the <path> element to read', path: [] });
    return;
  }
  for (const k of ['path', 'scale', 'units'] as const) {
    if (value[k] !== undefined) ctx.addIssue({ code: 'custom', message: `${k} goes with svg: file.svg`, path: [k] });
  }
}

const ShapeLike = mapping(
  {
    circle: CircleLike.optional(), ellipse: EllipseLike.optional(), rect: RectLike.optional(), polygon: PolygonLike.optional(),
    ...IMPORT_KEYS,
  },
  'a shape { circle | ellipse | rect | polygon | points | svg: … }',
).superRefine(exactlyOne(SHAPE_KINDS)).superRefine(svgKeys);

const OutlineLike = z.union([PolygonLike, ShapeLike], {
  error: expected('a list of vertices or one shape { circle | ellipse | rect | points | svg: … }'),
});

const OpeningLike = mapping(
  {
    id: Name,
    circle: CircleLike.optional(),
    ellipse: EllipseLike.optional(),
    rect: RectLike.optional(),
    polygon: PolygonLike.optional(),
    ...IMPORT_KEYS,
  },
  'an opening { id, circle | ellipse | rect | polygon | points | svg }',
).superRefine(exactlyOne(SHAPE_KINDS)).superRefine(svgKeys);

export const SELECTOR_KINDS = ['x', 'y', 'segment', 'opening', 'outline', 'point', 'piece'] as const;

const SelectorLike = mapping(
  {
    x: NumberLike.optional(),
    y: NumberLike.optional(),
    segment: z.tuple([PointLike, PointLike], { error: expected('a segment [[x1, y1], [x2, y2]]') }).optional(),
    opening: Name.optional(),
    outline: z.literal(true, { error: expected('true (the whole outer boundary)') }).optional(),
    point: PointLike.optional(),
    piece: PointLike.optional(),
  },
  `a selector { ${SELECTOR_KINDS.join(' | ')}: … }`,
).superRefine(exactlyOne(SELECTOR_KINDS));

const Component = z.union([NumberLike, z.null()], { error: expected('a number, an expression of x and y, or null (free)') });

const DisplaceLike = z.union([
  z.tuple([Component, Component], { error: expected('[ux, uy]') }),
  mapping({ x: Component.optional(), y: Component.optional() }, 'a displacement { x, y }'),
  mapping({ table: FileName, tolerance: NumberLike.optional() }, 'a displacement table { table: file.csv, tolerance }'),
], { error: expected('a displacement [ux, uy], { x, y } or { table: file.csv }') });

const SupportLike = mapping(
  {
    // names the support for a load case's own displacement values (cases.NAME.displace.ID)
    id: Name.optional(),
    where: SelectorLike,
    fix: z
      .array(word(['x', 'y']), { error: expected('a list of directions such as [x, y] or [y]') })
      .min(1, { error: () => 'expected at least one direction, [x], [y] or [x, y]' })
      .optional(),
    displace: DisplaceLike.optional(),
  },
  'a support { where: …, fix: [x, y] } or { id, where: …, displace: [ux, uy] }',
).superRefine(exactlyOne(['fix', 'displace'])).superRefine((value, ctx) => {
  if (value.fix && value.fix.length === 2 && value.fix[0] === value.fix[1]) {
    ctx.addIssue({ code: 'custom', message: `direction ${value.fix[0]} is listed twice`, path: ['fix', 1] });
  }
});

export const LOAD_KINDS = ['traction', 'pressure', 'force', 'stress', 'pinForce', 'gravity', 'spin', 'temperature'] as const;

/** The load kinds that act over the whole plate (issue 14): they take no `where`. */
export const BODY_LOAD_KINDS = ['gravity', 'spin', 'temperature'] as const;

const SpinLike = mapping({ about: PointLike, omega: NumberLike }, 'a rotation { about: [x, y], omega }');

const LoadLike = mapping(
  {
    where: SelectorLike.optional(),
    traction: PointLike.optional(),
    pressure: NumberLike.optional(),
    force: PointLike.optional(),
    stress: z.tuple([NumberLike, NumberLike, NumberLike], { error: expected('a stress state [sxx, syy, sxy]') }).optional(),
    gradient: mapping(
      { sxx: PointLike.optional(), syy: PointLike.optional(), sxy: PointLike.optional() },
      'a stress gradient { sxx: [d/dx, d/dy], syy: …, sxy: … }',
    ).optional(),
    about: PointLike.optional(),
    pinForce: PointLike.optional(),
    gravity: z.tuple([NumberLike, NumberLike], { error: expected('an acceleration vector [gx, gy]') }).optional(),
    spin: SpinLike.optional(),
    temperature: NumberLike.optional(),
  },
  'a load { where: …, traction | pressure | force | stress | pinForce: … } or { gravity | spin | temperature: … }',
)
  .superRefine(exactlyOne(LOAD_KINDS))
  .superRefine((value, ctx) => {
    const body = BODY_LOAD_KINDS.find((k) => value[k] !== undefined);
    if (body !== undefined) {
      if (value.where !== undefined) {
        ctx.addIssue({ code: 'custom', message: `a ${body} load acts over the whole plate; drop where`, path: ['where'] });
      }
      for (const k of ['gradient', 'about'] as const) {
        if (value[k] !== undefined) {
          const hint = body === 'spin' && k === 'about' ? '; the centre of a rotation goes inside it: spin: { about: [x, y], omega }' : '';
          ctx.addIssue({ code: 'custom', message: `${k} goes with stress: [sxx, syy, sxy]${hint}`, path: [k] });
        }
      }
      return;
    }
    if (value.where === undefined) {
      if (LOAD_KINDS.some((k) => value[k] !== undefined)) {
        ctx.addIssue({ code: 'custom', message: 'expected where: the boundary this load acts on (a selector)', path: [] });
      }
      return;
    }
    const atPoint = value.where.point !== undefined;
    for (const k of ['gradient', 'about'] as const) {
      if (value[k] !== undefined && value.stress === undefined) {
        ctx.addIssue({ code: 'custom', message: `${k} goes with stress: [sxx, syy, sxy]`, path: [k] });
        return;
      }
    }
    if (value.pinForce !== undefined && value.where.opening === undefined) {
      ctx.addIssue({
        code: 'custom',
        message: 'a pin force acts on the edge of a hole; use where: { opening: id }',
        path: ['where'],
      });
    } else if (value.force !== undefined && !atPoint) {
      ctx.addIssue({
        code: 'custom',
        message: 'a concentrated force needs a point selector { point: [x, y] }; for a load spread along an edge use traction or pressure',
        path: ['where'],
      });
    } else if (atPoint && value.force === undefined) {
      const kind = value.traction !== undefined ? 'traction' : value.pressure !== undefined ? 'pressure' : 'stress';
      ctx.addIssue({
        code: 'custom',
        message: `a point selector can carry only a force [fx, fy]; ${kind} acts along an edge`,
        path: ['where'],
      });
    }
  });

// --- load cases and combinations (issue 14 part B; docs/model-format.md, "Load cases") -----------
/** A case: a list of loads, or { loads, displace } with its own values for supports that prescribe displacements (by support id). */
const CaseLike = z.union([
  z.array(LoadLike, { error: expected('a list of loads') }),
  mapping(
    {
      loads: z.array(LoadLike, { error: expected('a list of loads') }).optional(),
      displace: z.record(Name, DisplaceLike, { error: expected('a mapping of support ids to displacements') }).optional(),
    },
    'a load case: a list of loads, or { loads: [...], displace: { support-id: [ux, uy] } }',
  ),
], { error: expected('a load case: a list of loads, or { loads, displace }') });

const CasesLike = z.record(Name, CaseLike, { error: expected('a mapping of case names to load cases') })
  .refine((v) => Object.keys(v).length > 0, { error: () => 'expected at least one load case' });

/** name → linear expression of case names, such as "1.35*dead + 1.5*wind" */
const CombinationsLike = z.record(Name, z.string({ error: expected('an expression of case names such as "1.35*dead + 1.5*wind"') }), {
  error: expected('a mapping of combination names to expressions of case names'),
});
// --- end of load cases ------------------------------------------------------------------------

const LocalSizeLike = mapping(
  { near: PointLike, size: NumberLike, radius: NumberLike },
  'a local size { near: [x, y], size, radius }',
);

const MeshLike = mapping(
  {
    size: NumberLike.optional(),
    order: NumberLike.optional(),
    local: z.array(LocalSizeLike, { error: expected('a list of { near, size, radius }') }).optional(),
  },
  'mesh settings { size, order, local }',
);

export const MEASURES = ['von-mises', 'max-principal', 'tresca', 'sxx', 'syy', 'sxy'] as const;

const StudyLike = mapping(
  {
    measure: word(MEASURES).optional(),
    levels: NumberLike.optional(),
    ratio: NumberLike.optional(),
    sites: z
      .union([
        z.literal('auto'),
        z.array(PointLike, { error: expected('a list of points [x, y]') }).min(1, { error: () => 'expected at least one point, or auto' }),
      ], { error: expected('auto or a list of points [x, y]') })
      .optional(),
    readouts: mapping(
      {
        distance: NumberLike.optional(),
        critical: mapping(
          { length: NumberLike.optional(), deltaKth: NumberLike.optional(), deltaSigma0: NumberLike.optional() },
          'a critical distance { length } or { deltaKth, deltaSigma0 }',
        ).superRefine((value, ctx) => {
          const fromMaterial = value.deltaKth !== undefined || value.deltaSigma0 !== undefined;
          if (value.length !== undefined && fromMaterial) {
            ctx.addIssue({ code: 'custom', message: 'give the critical distance either as length or as deltaKth and deltaSigma0, not both', path: [value.deltaKth !== undefined ? 'deltaKth' : 'deltaSigma0'] });
          } else if (value.length === undefined && !fromMaterial) {
            ctx.addIssue({ code: 'custom', message: 'expected length, or deltaKth and deltaSigma0', path: [] });
          } else if (fromMaterial && (value.deltaKth === undefined || value.deltaSigma0 === undefined)) {
            ctx.addIssue({ code: 'custom', message: `${value.deltaKth === undefined ? 'deltaKth' : 'deltaSigma0'} is missing: L = (1/π)(deltaKth/deltaSigma0)² needs both`, path: [] });
          }
        }).optional(),
      },
      'readouts { distance, critical }',
    ).optional(),
  },
  'study settings { measure, levels, ratio, sites, readouts }',
);

// --- reported values from another analysis (issue 15; docs/model-format.md, "reported") ---

/** Columns of a reported-values CSV (`reported: [ { table: file.csv } ]`); the first four are required. */
export const REPORTED_COLUMNS = ['x', 'y', 'value', 'size', 'measure', 'case', 'label', 'order'] as const;

/**
 * One value another analysis reported at a spot: `{ at, value, size, measure?, case?, label?, order? }`,
 * or `{ table: file.csv }` holding rows of them.
 */
const ReportedLike = mapping(
  {
    at: PointLike.optional(),
    value: NumberLike.optional(),
    size: NumberLike.optional(),
    measure: word(MEASURES).optional(),
    case: z.string({ error: expected('the name of a load case or combination') }).min(1, { error: () => 'expected a case name, got an empty text' }).optional(),
    label: z.string({ error: expected('a label (text, e.g. the run id)') }).optional(),
    order: NumberLike.optional(),
    table: FileName.optional(),
  },
  'a reported value { at: [x, y], value, size, measure, case, label, order } or { table: file.csv }',
).superRefine((value, ctx) => {
  if (value.table !== undefined) {
    const extra = (['at', 'value', 'size', 'measure', 'case', 'label', 'order'] as const).find((k) => value[k] !== undefined);
    if (extra) ctx.addIssue({ code: 'custom', message: `${extra} goes in the table's columns; an entry with table: holds nothing else`, path: [extra] });
    return;
  }
  const missing = (['at', 'value', 'size'] as const).filter((k) => value[k] === undefined);
  if (missing.length > 0) {
    ctx.addIssue({ code: 'custom', message: `a reported value needs ${missing.join(', ')} (at: [x, y], value, size: the element size there), or table: file.csv`, path: [] });
  }
});

const ReportedList = z.array(ReportedLike, { error: expected('a list of reported values { at, value, size } or { table: file.csv }') })
  .min(1, { error: () => 'expected at least one reported value; leave the key out when there is none' });

// --- end of reported values ---

export const STATES = ['plane-stress', 'plane-strain', 'axisymmetric'] as const;

export const ModelFileSchema = mapping(
  {
    version: z.literal(1, { error: expected('1 (the only model file version so far)') }).optional(),
    title: z.string({ error: expected('a title (text)') }).optional(),
    units: mapping({ length: Label.optional(), force: Label.optional() }, 'units { length, force }').optional(),
    params: z.record(z.string(), NumberLike, { error: expected('a mapping of names to numbers') }).optional(),
    material: mapping(
      { E: NumberLike, nu: NumberLike, yield: NumberLike.optional(), density: NumberLike.optional(), expansion: NumberLike.optional() },
      'a material { E, nu, yield, density, expansion }',
    ),
    // optional only in an axisymmetric section (build.ts asks for it otherwise)
    thickness: NumberLike.optional(),
    state: word(STATES).optional(),
    plate: mapping(
      {
        outline: OutlineLike,
        openings: z.array(OpeningLike, { error: expected('a list of openings') }).optional(),
      },
      'a plate { outline, openings }',
    ),
    supports: z.array(SupportLike, { error: expected('a list of supports') }).min(1, {
      error: () => 'expected at least one support; the plate must be held against rigid motion',
    }),
    // may be empty when a support prescribes displacements, absent with cases (checked in build.ts)
    loads: z.array(LoadLike, { error: expected('a list of loads') }).optional(),
    cases: CasesLike.optional(),
    combinations: CombinationsLike.optional(),
    mesh: MeshLike.optional(),
    study: StudyLike.optional(),
    reported: ReportedList.optional(),
  },
  'a model mapping',
);

export type ModelFile = z.infer<typeof ModelFileSchema>;
export type RawVertex = z.infer<typeof VertexLike>;
export type RawPoint = z.infer<typeof PointLike>;
